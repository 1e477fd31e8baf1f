import { withdrawSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/withdraw — the uploader withdraws the revision before clearance. */
export const POST = stepRoute("withdraw", "revision.withdraw", withdrawSchema);
