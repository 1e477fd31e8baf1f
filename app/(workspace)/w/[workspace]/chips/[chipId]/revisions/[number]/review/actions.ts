"use server";
/**
 * Server actions of the review screen. Each reads the form with the step's
 * shared schema, checks the member's role for the step, takes one step through
 * lib/review/service (which applies four-eyes, state and version rules) and
 * refreshes the review pages.
 */
import { revalidatePath } from "next/cache";
import { z } from "zod";
import type { Permission } from "@/lib/auth/permissions";
import { requireMembershipBySlug } from "@/lib/auth/require";
import { formAction } from "@/lib/http/action";
import { idParam } from "@/lib/http/route";
import {
  clearSchema,
  commentSchema,
  disposeFlagSchema,
  passFluidicsSchema,
  requestChangesSchema,
  submitSchema,
  updateAnalysisSchema,
  withdrawSchema,
} from "@/lib/review/schemas";
import { addComment, setCommentResolved, takeReviewStep, type StepInput } from "@/lib/review/service";

const where = z.object({ workspace: z.string().min(1).max(64), revisionId: idParam, chipId: idParam, number: idParam });

function refresh(w: z.infer<typeof where>) {
  const base = `/w/${w.workspace}/chips/${w.chipId}/revisions/${w.number}`;
  revalidatePath(`${base}/review`);
  revalidatePath(`${base}/history`);
  revalidatePath(`/w/${w.workspace}/review`);
}

function stepAction<S extends z.ZodObject>(type: StepInput["type"], permission: Permission, schema: S, done: (label: string) => string) {
  return formAction(where.extend(schema.shape), async (raw) => {
    const input = raw as z.infer<typeof where> & Record<string, unknown>;
    const ctx = await requireMembershipBySlug(input.workspace, permission);
    const { workspace: _w, revisionId, chipId: _c, number: _n, ...rest } = input;
    const outcome = await takeReviewStep(ctx, revisionId, { type, ...rest } as unknown as StepInput);
    refresh(input);
    return done(outcome.statusLabel);
  });
}

export const submitAction = stepAction("submit", "revision.submit", submitSchema, (s) => `Submitted. The revision is now ${s.toLowerCase()}; the fluidics reviewers were told.`);
export const updateAnalysisAction = stepAction("update_analysis", "revision.submit", updateAnalysisSchema, () => "The newer analysis is now under review; the reviewers were told.");
export const disposeFlagAction = stepAction("dispose_flag", "revision.review", disposeFlagSchema, () => "Decision recorded.");
export const passFluidicsAction = stepAction("pass_fluidics", "revision.review", passFluidicsSchema, () => "Fluidics review passed; the fab liaisons were told.");
export const requestChangesAction = stepAction("request_changes", "chip.view", requestChangesSchema, () => "Sent back to the designer with your note.");
export const clearAction = stepAction("clear", "revision.clear", clearSchema, () => "Cleared for tape-out and signed. The revision is now frozen.");
export const withdrawAction = stepAction("withdraw", "revision.withdraw", withdrawSchema, () => "Withdrawn.");

export const commentAction = formAction(
  where.extend({
    body: z.string().max(9000),
    parentId: z.coerce.number().int().positive().optional().or(z.literal("").transform(() => undefined)),
    segmentId: z.string().max(100).optional(),
    xMm: z.string().max(40).optional(),
    yMm: z.string().max(40).optional(),
  }),
  async (input) => {
    const ctx = await requireMembershipBySlug(input.workspace, "comment.create");
    // The form takes a pinned point in millimetres (drawing scale); stored in metres.
    const x = input.xMm?.trim() ? Number(input.xMm) / 1000 : null;
    const y = input.yMm?.trim() ? Number(input.yMm) / 1000 : null;
    const parsed = commentSchema.parse({ body: input.body, parentId: input.parentId ?? null, segmentId: input.segmentId || null, x_m: x, y_m: y });
    const point = parsed.x_m != null && parsed.y_m != null ? { x_m: parsed.x_m, y_m: parsed.y_m } : null;
    const created = await addComment(ctx, input.revisionId, { body: parsed.body, parentId: parsed.parentId ?? null, segmentId: parsed.segmentId ?? null, point });
    refresh(input);
    return created.mentioned.length > 0 ? `Posted; ${created.mentioned.length} mentioned member(s) were told.` : "Posted.";
  },
);

export const resolveCommentAction = formAction(where.extend({ commentId: idParam, resolved: z.enum(["true", "false"]) }), async (input) => {
  const ctx = await requireMembershipBySlug(input.workspace, "comment.create");
  await setCommentResolved(ctx, input.revisionId, input.commentId, input.resolved === "true");
  refresh(input);
  return input.resolved === "true" ? "Marked resolved." : "Opened again.";
});
