import { requireAccessTo } from "@/lib/auth/require";
import { route } from "@/lib/http/route";
import { locateFor, revisionParams } from "@/lib/review/routes";
import { getReviewOverview } from "@/lib/review/service";
import { reviewOverviewView } from "@/lib/review/views";

/** GET /api/v1/revisions/{revisionId}/review — state, version, the steps you may take, flags with dispositions, clearance, comments. */
export const GET = route({ params: revisionParams }, async ({ params }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "chip.view");
  return reviewOverviewView(await getReviewOverview(ctx, params.revisionId));
});
