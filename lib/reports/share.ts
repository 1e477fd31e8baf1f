import "server-only";
/**
 * Read-only share links to one revision's brief. The token (256 random bits)
 * is shown once, at creation; only its SHA-256 is stored (lib/auth/tokens). A
 * link opens that one brief and nothing else of the workspace, until it
 * expires or is revoked. Creating, revoking and each view write an audit event.
 */
import { z } from "zod";
import { getWorkspaceById } from "@/db/queries/workspaces";
import * as q from "@/db/queries/reports";
import { getRevisionById } from "@/db/queries/chips";
import { scopeForTrustedCode, type WorkspaceScope } from "@/db/queries/scope";
import { recordAuditEvent } from "@/lib/audit";
import type { MemberContext } from "@/lib/auth/require";
import { createSecretToken, hashSecretToken } from "@/lib/auth/tokens";
import { DomainError, NotFoundError } from "@/lib/errors";

/** Longest life of a share link, days (common practice for partner links: about a quarter). */
export const MAX_SHARE_DAYS = 90;
export const DEFAULT_SHARE_DAYS = 14;
const DAY_MS = 24 * 60 * 60 * 1000;

/** The create-link body: an expiry in days (1…90) or an ISO date, and an optional label. */
export const createShareLinkSchema = z
  .object({
    expiresInDays: z.coerce.number().int().min(1, "Choose at least 1 day.").max(MAX_SHARE_DAYS, `A share link can last at most ${MAX_SHARE_DAYS} days.`).optional(),
    expiresAt: z.iso.datetime({ offset: true }).or(z.iso.date()).optional(),
    label: z.string().trim().max(120, "Keep the label under 120 characters.").optional(),
  })
  .strict();
export type CreateShareLinkInput = z.infer<typeof createShareLinkSchema>;

export type ShareLinkView = {
  id: number;
  revision_id: number;
  label: string;
  prefix: string;
  created_by: string | null;
  created_at: string;
  expires_at: string;
  revoked_at: string | null;
  status: "active" | "expired" | "revoked";
};

export function shareLinkStatus(link: { expiresAt: Date; revokedAt: Date | null }, now: Date): ShareLinkView["status"] {
  if (link.revokedAt) return "revoked";
  return link.expiresAt.getTime() <= now.getTime() ? "expired" : "active";
}

export function shareLinkView(link: q.ShareLinkListItem, now: Date): ShareLinkView {
  return {
    id: link.id,
    revision_id: link.revisionId,
    label: link.label,
    prefix: link.prefix,
    created_by: link.createdByName,
    created_at: link.createdAt.toISOString(),
    expires_at: link.expiresAt.toISOString(),
    revoked_at: link.revokedAt?.toISOString() ?? null,
    status: shareLinkStatus(link, now),
  };
}

/**
 * The expiry of a new link: `expiresAt` (a date means the end of that UTC day)
 * or now + `expiresInDays` (default DEFAULT_SHARE_DAYS).
 * @throws DomainError (400) when it is in the past or more than MAX_SHARE_DAYS ahead.
 */
export function resolveExpiry(input: CreateShareLinkInput, now: Date): Date {
  let at: Date;
  if (input.expiresAt) {
    const dateOnly = /^\d{4}-\d{2}-\d{2}$/.test(input.expiresAt);
    at = new Date(dateOnly ? `${input.expiresAt}T23:59:59.999Z` : input.expiresAt);
  } else at = new Date(now.getTime() + (input.expiresInDays ?? DEFAULT_SHARE_DAYS) * DAY_MS);
  if (!(at.getTime() > now.getTime())) {
    throw new DomainError("invalid_expiry", "The expiry date has passed; choose a date after today.", 400, { fields: { expiresAt: "in the past" } });
  }
  if (at.getTime() > now.getTime() + MAX_SHARE_DAYS * DAY_MS) {
    throw new DomainError("invalid_expiry", `A share link can last at most ${MAX_SHARE_DAYS} days; choose an earlier expiry.`, 400, { fields: { expiresAt: "too far" } });
  }
  return at;
}

/**
 * Creates a share link for one revision. The caller holds "report.share".
 * @returns the stored link and the one-time token (put it in the URL /share/<token>)
 * @throws NotFoundError when the revision is not in the workspace; DomainError (400) for a bad expiry.
 */
export async function createShareLink(ctx: MemberContext, revisionId: number, input: CreateShareLinkInput, now = new Date()): Promise<{ link: ShareLinkView; token: string }> {
  const revision = await getRevisionById(ctx.scope, revisionId);
  if (!revision) throw new NotFoundError("That revision does not exist in this workspace.");
  const expiresAt = resolveExpiry(input, now);
  const { token, tokenHash } = createSecretToken();
  const row = await q.insertShareLink(ctx.scope, { revisionId, tokenHash, prefix: token.slice(0, 6), label: input.label ?? "", expiresAt, createdAt: now });
  await recordAuditEvent({
    workspaceId: ctx.workspace.id,
    actorUserId: ctx.user.id,
    action: "report.share_created",
    objectType: "revision",
    objectId: revisionId,
    details: { shareLinkId: row.id, prefix: row.prefix, label: row.label, expiresAt: expiresAt.toISOString() },
    at: now,
  });
  return { link: shareLinkView({ ...row, createdByName: ctx.user.name }, now), token };
}

export async function listRevisionShareLinks(ctx: MemberContext, revisionId: number, now = new Date()): Promise<ShareLinkView[]> {
  const revision = await getRevisionById(ctx.scope, revisionId);
  if (!revision) throw new NotFoundError("That revision does not exist in this workspace.");
  return (await q.listShareLinks(ctx.scope, revisionId)).map((l) => shareLinkView(l, now));
}

/**
 * Revokes a link (idempotent: revoking a revoked link changes nothing and records nothing).
 * @throws NotFoundError when the link is not in the workspace.
 */
export async function revokeShareLink(ctx: MemberContext, id: number, now = new Date()): Promise<ShareLinkView> {
  const link = await q.getShareLink(ctx.scope, id);
  if (!link) throw new NotFoundError("That share link does not exist in this workspace.");
  const changed = await q.revokeShareLinkRow(ctx.scope, id, now);
  if (changed) {
    await recordAuditEvent({
      workspaceId: ctx.workspace.id,
      actorUserId: ctx.user.id,
      action: "report.share_revoked",
      objectType: "revision",
      objectId: link.revisionId,
      details: { shareLinkId: id, prefix: link.prefix },
      at: now,
    });
  }
  const fresh = (await q.listShareLinks(ctx.scope, link.revisionId)).find((l) => l.id === id)!;
  return shareLinkView(fresh, now);
}

/** The link is gone (revoked or expired): 410 where the edge can say so. */
export class ShareLinkGoneError extends DomainError {
  constructor(reason: "revoked" | "expired") {
    super(
      "share_link_gone",
      reason === "revoked" ? "This share link was withdrawn by the team that sent it. Ask them for a new one." : "This share link has expired. Ask the team that sent it for a new one.",
      410,
      { reason },
    );
  }
}

export type OpenedShare = { scope: WorkspaceScope; workspaceName: string; revisionId: number; linkId: number };

/**
 * Opens a share link by its token: the scope of the link's workspace (minted
 * here, after the token matched, with no roles) and the one revision it shows.
 * Records a view in the audit trail.
 * @throws NotFoundError (404) for an unknown token; ShareLinkGoneError (410) when revoked or expired.
 */
export async function openShareLink(token: string, now = new Date(), how: "html" | "pdf" = "html"): Promise<OpenedShare> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) throw new NotFoundError("This share link does not exist. Check that the whole address was copied.");
  const link = await q.findShareLinkByTokenHash(hashSecretToken(token));
  if (!link) throw new NotFoundError("This share link does not exist. Check that the whole address was copied.");
  const status = shareLinkStatus(link, now);
  if (status !== "active") throw new ShareLinkGoneError(status);
  const workspace = await getWorkspaceById(link.workspaceId);
  if (!workspace) throw new NotFoundError("This share link does not exist.");
  await recordAuditEvent({
    workspaceId: link.workspaceId,
    actorUserId: null,
    action: "report.share_viewed",
    objectType: "revision",
    objectId: link.revisionId,
    details: { shareLinkId: link.id, prefix: link.prefix, as: how },
    at: now,
  });
  // Trusted: the token matched this link, which reads exactly one revision of this workspace.
  const scope = scopeForTrustedCode({ userId: 0, workspaceId: link.workspaceId, roles: [] });
  return { scope, workspaceName: workspace.name, revisionId: link.revisionId, linkId: link.id };
}
