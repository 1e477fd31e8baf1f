import "server-only";
/**
 * Builds the REST handlers of the review steps: parse the body, check the
 * member's role for the step (requireAccessTo; the machine then applies
 * four-eyes, uploader-only and state rules), take the step, answer with the
 * new state. Shared so every step reads the same way.
 */
import { z } from "zod";
import { locateRevision } from "@/db/queries/review";
import type { Permission } from "@/lib/auth/permissions";
import { requireAccessTo } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";
import { takeReviewStep, type StepInput } from "./service";

export const revisionParams = z.object({ revisionId: idParam });

/** Locates a revision for requireAccessTo; `withUploader` adds the uploader for author-only permissions. */
export function locateFor(revisionId: number, withUploader: boolean) {
  return async () => {
    const found = await locateRevision(revisionId);
    if (!found) return null;
    // Without the uploader, `can` checks the role only and the machine answers four-eyes with its own code.
    return withUploader ? found : { workspaceId: found.workspaceId };
  };
}

export function stepRoute<S extends z.ZodType<Record<string, unknown>>>(type: StepInput["type"], permission: Permission, body: S) {
  return route({ params: revisionParams, body }, async ({ params, body }) => {
    const ctx = await requireAccessTo(locateFor(params.revisionId, permission === "revision.withdraw"), permission);
    const outcome = await takeReviewStep(ctx, params.revisionId, { type, ...body } as unknown as StepInput);
    return {
      review: { state: outcome.status, label: outcome.statusLabel, version: outcome.version },
      audit: outcome.audit,
      notified: outcome.notified,
      emailed: outcome.emailed,
    };
  });
}
