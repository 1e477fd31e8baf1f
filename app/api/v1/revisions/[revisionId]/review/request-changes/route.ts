import { requestChangesSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/request-changes — the reviewer at the current stage sends the revision back with a note (the machine checks the stage's role). */
export const POST = stepRoute("request_changes", "chip.view", requestChangesSchema);
