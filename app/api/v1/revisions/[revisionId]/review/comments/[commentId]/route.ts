import { z } from "zod";
import { requireAccessTo } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";
import { locateFor } from "@/lib/review/routes";
import { resolveCommentSchema } from "@/lib/review/schemas";
import { setCommentResolved } from "@/lib/review/service";

const params = z.object({ revisionId: idParam, commentId: idParam });

/** PATCH …/review/comments/{commentId} — {resolved: true|false}: resolve a comment or open it again. Comments are never edited or deleted. */
export const PATCH = route({ params, body: resolveCommentSchema }, async ({ params, body }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "comment.create");
  await setCommentResolved(ctx, params.revisionId, params.commentId, body.resolved);
  return { ok: true, resolved: body.resolved };
});
