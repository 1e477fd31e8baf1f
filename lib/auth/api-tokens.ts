import "server-only";
/**
 * Personal API tokens: a designer's scripts authenticate with
 * `Authorization: Bearer stk_…`. Only the SHA-256 of a token is stored; the
 * token itself is shown once, at creation. A token acts as its owner, with the
 * owner's current roles, and stops working the moment it is revoked.
 */
import { and, desc, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db";
import { apiTokens } from "@/db/schema-chips";
import { recordAuditEvent } from "@/lib/audit";
import { ConflictError, NotFoundError, UnauthenticatedError } from "@/lib/errors";
import type { MemberContext } from "./require";
import { createSecretToken, hashSecretToken } from "./tokens";

export const TOKEN_PREFIX = "stk_";
const MAX_ACTIVE_TOKENS = 20;

export type ApiTokenView = { id: number; name: string; prefix: string; createdAt: Date; lastUsedAt: Date | null; revokedAt: Date | null };

/** Creates a token for the signed-in member; returns the secret once. */
export async function createApiToken(ctx: MemberContext, name: string): Promise<{ token: string; view: ApiTokenView }> {
  const active = await getDb()
    .select({ id: apiTokens.id })
    .from(apiTokens)
    .where(and(eq(apiTokens.userId, ctx.user.id), isNull(apiTokens.revokedAt)));
  if (active.length >= MAX_ACTIVE_TOKENS) {
    throw new ConflictError("too_many_tokens", `You already have ${MAX_ACTIVE_TOKENS} active tokens; revoke one you no longer use first.`);
  }
  const secret = createSecretToken();
  const token = `${TOKEN_PREFIX}${secret.token}`;
  const [row] = await getDb()
    .insert(apiTokens)
    .values({ workspaceId: ctx.workspace.id, userId: ctx.user.id, name, prefix: token.slice(0, 10), tokenHash: hashSecretToken(token) })
    .returning();
  await recordAuditEvent({ workspaceId: ctx.workspace.id, actorUserId: ctx.user.id, action: "api_token.created", objectType: "api_token", objectId: row.id, details: { name } });
  return { token, view: toView(row) };
}

function toView(row: typeof apiTokens.$inferSelect): ApiTokenView {
  return { id: row.id, name: row.name, prefix: row.prefix, createdAt: row.createdAt, lastUsedAt: row.lastUsedAt, revokedAt: row.revokedAt };
}

/** The member's own tokens, newest first (never the secrets). */
export async function listApiTokens(userId: number): Promise<ApiTokenView[]> {
  const rows = await getDb().select().from(apiTokens).where(eq(apiTokens.userId, userId)).orderBy(desc(apiTokens.id));
  return rows.map(toView);
}

/** Revokes one of the user's own tokens. @throws NotFoundError for someone else's or an unknown token. */
export async function revokeApiToken(userId: number, tokenId: number): Promise<void> {
  const rows = await getDb()
    .update(apiTokens)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
    .returning({ id: apiTokens.id, workspaceId: apiTokens.workspaceId });
  if (rows.length === 0) throw new NotFoundError("No active token of yours has that id.");
  await recordAuditEvent({ workspaceId: rows[0].workspaceId, actorUserId: userId, action: "api_token.revoked", objectType: "api_token", objectId: tokenId });
}

/**
 * The user id a bearer token authenticates, or throws 401 for an unknown or
 * revoked token (a request that presents a token is never treated as anonymous).
 */
export async function resolveApiToken(token: string): Promise<number> {
  if (!token.startsWith(TOKEN_PREFIX)) throw new UnauthenticatedError("That API token is not valid. Create a new one under Settings → API tokens.");
  const rows = await getDb().select().from(apiTokens).where(eq(apiTokens.tokenHash, hashSecretToken(token))).limit(1);
  const row = rows[0];
  if (!row) throw new UnauthenticatedError("That API token is not valid. Create a new one under Settings → API tokens.");
  if (row.revokedAt) throw new UnauthenticatedError("That API token was revoked. Create a new one under Settings → API tokens.");
  await getDb().update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.id));
  return row.userId;
}
