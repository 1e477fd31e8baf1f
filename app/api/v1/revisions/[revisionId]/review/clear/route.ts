import { clearSchema } from "@/lib/review/schemas";
import { stepRoute } from "@/lib/review/routes";

/** POST /api/v1/revisions/{revisionId}/review/clear — a fab liaison clears the revision for tape-out, signing with their password. */
export const POST = stepRoute("clear", "revision.clear", clearSchema);
