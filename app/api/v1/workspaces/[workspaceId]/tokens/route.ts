import { z } from "zod";
import { createApiToken, listApiTokens } from "@/lib/auth/api-tokens";
import { requireMembership } from "@/lib/auth/require";
import { apiTokenCreateSchema } from "@/lib/chips/schemas";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam });

const view = (t: Awaited<ReturnType<typeof listApiTokens>>[number]) => ({
  id: t.id,
  name: t.name,
  prefix: t.prefix,
  created_at: t.createdAt.toISOString(),
  last_used_at: t.lastUsedAt?.toISOString() ?? null,
  revoked_at: t.revokedAt?.toISOString() ?? null,
});

/** GET /api/v1/workspaces/:workspaceId/tokens — your own API tokens (never the secrets). */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireMembership(params.workspaceId, "token.manage");
  return { tokens: (await listApiTokens(ctx.user.id)).map(view) };
});

/** POST /api/v1/workspaces/:workspaceId/tokens — create a token; the secret is in this answer only. */
export const POST = route({ params, body: apiTokenCreateSchema }, async ({ params, body }) => {
  const ctx = await requireMembership(params.workspaceId, "token.manage");
  const { token, view: created } = await createApiToken(ctx, body.name);
  return Response.json({ token, ...view(created) }, { status: 201 });
});
