import { updateAnalysisSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/analysis — the designer puts a newer analysis (the fix) under fluidics review. */
export const POST = stepRoute("update_analysis", "revision.submit", updateAnalysisSchema);
