import { disposeFlagSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/flags — a fluidics reviewer waives a flag (with a justification) or marks it must-fix. */
export const POST = stepRoute("dispose_flag", "revision.review", disposeFlagSchema);
