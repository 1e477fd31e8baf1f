import { requireAccessTo } from "@/lib/auth/require";
import { route } from "@/lib/http/route";
import { briefPdfResponse } from "@/lib/reports/http";
import { loadBrief } from "@/lib/reports/load";
import { locateFor, revisionParams } from "@/lib/review/routes";

/** GET /api/v1/revisions/{revisionId}/brief.pdf — the revision's brief, generated now, as a PDF download. */
export const GET = route({ params: revisionParams }, async ({ params }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "report.view");
  const brief = await loadBrief(ctx.scope, ctx.workspace.name, params.revisionId);
  return briefPdfResponse(brief);
});
