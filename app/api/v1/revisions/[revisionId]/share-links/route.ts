import { getEnv } from "@/lib/env";
import { requireAccessTo } from "@/lib/auth/require";
import { route } from "@/lib/http/route";
import { createShareLink, createShareLinkSchema, listRevisionShareLinks } from "@/lib/reports/share";
import { locateFor, revisionParams } from "@/lib/review/routes";

/** GET /api/v1/revisions/{revisionId}/share-links — the revision's share links (leads and admins). */
export const GET = route({ params: revisionParams }, async ({ params }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "report.share");
  return { share_links: await listRevisionShareLinks(ctx, params.revisionId) };
});

/** POST /api/v1/revisions/{revisionId}/share-links {expiresInDays?|expiresAt?, label?} — 201 with the link's address (shown once). */
export const POST = route({ params: revisionParams, body: createShareLinkSchema }, async ({ params, body }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "report.share");
  const { link, token } = await createShareLink(ctx, params.revisionId, body);
  const path = `/share/${token}`;
  return Response.json({ share_link: link, path, url: `${getEnv().appUrl}${path}` }, { status: 201 });
});
