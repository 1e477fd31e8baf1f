import { listComments } from "@/db/queries/review";
import { requireAccessTo } from "@/lib/auth/require";
import { route } from "@/lib/http/route";
import { locateFor, revisionParams } from "@/lib/review/routes";
import { commentSchema } from "@/lib/review/schemas";
import { addComment } from "@/lib/review/service";
import { commentView } from "@/lib/review/views";

/** GET …/review/comments — the revision's comments, oldest first (replies carry parent_id). */
export const GET = route({ params: revisionParams }, async ({ params }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "chip.view");
  return { comments: (await listComments(ctx.scope, params.revisionId)).map(commentView) };
});

/** POST …/review/comments — add a comment or reply, optionally pinned to a segment or a point (metres); @mentions notify. */
export const POST = route({ params: revisionParams, body: commentSchema }, async ({ params, body }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "comment.create");
  const point = body.x_m !== null && body.x_m !== undefined && body.y_m !== null && body.y_m !== undefined ? { x_m: body.x_m, y_m: body.y_m } : null;
  const created = await addComment(ctx, params.revisionId, { body: body.body, parentId: body.parentId ?? null, segmentId: body.segmentId ?? null, point });
  return Response.json({ comment_id: created.id, mentioned: created.mentioned }, { status: 201 });
});
