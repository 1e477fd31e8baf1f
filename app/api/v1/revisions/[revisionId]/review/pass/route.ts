import { passFluidicsSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/pass — a fluidics reviewer passes the fluidics review (every block flag fixed or waived). */
export const POST = stepRoute("pass_fluidics", "revision.review", passFluidicsSchema);
