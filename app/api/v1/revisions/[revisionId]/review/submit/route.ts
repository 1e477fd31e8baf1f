import { submitSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/submit — the designer submits the revision with an analysed operating point and a note. */
export const POST = stepRoute("submit", "revision.submit", submitSchema);
