/**
 * Input shapes of the review steps, comments and notification settings,
 * declared once for the REST API, the server actions and the forms. Pure.
 * Length limits and the waiver minimum come from the machine, which checks
 * them again with its own words.
 */
import { z } from "zod";
import { NOTIFICATION_KINDS } from "@/lib/notifications/kinds";
import { MAX_NAME_CHARS, MAX_NOTE_CHARS } from "./machine";
import { MAX_COMMENT_CHARS } from "./mentions";

const version = z.coerce.number({ message: "Send the review version you loaded (expectedVersion)." }).int().min(0);
const note = z.string().max(MAX_NOTE_CHARS, `Keep it under ${MAX_NOTE_CHARS} characters.`);
const optionalId = z.coerce.number().int().positive().nullish();

export const submitSchema = z.object({ expectedVersion: version, note, analysisId: optionalId });
export const updateAnalysisSchema = z.object({
  expectedVersion: version,
  analysisId: z.coerce.number({ message: "Choose the analysis to put under review." }).int().positive(),
  note: note.nullish(),
});
export const disposeFlagSchema = z.object({
  expectedVersion: version,
  flagKey: z.string().min(1, "Say which flag (flagKey).").max(300),
  decision: z.enum(["waived", "must_fix"], { message: "Choose a decision: waived or must_fix." }),
  justification: note.nullish(),
});
export const passFluidicsSchema = z.object({ expectedVersion: version, note: note.nullish() });
export const requestChangesSchema = z.object({ expectedVersion: version, note });
export const clearSchema = z.object({
  expectedVersion: version,
  fabName: z.string().max(MAX_NAME_CHARS),
  process: z.string().max(MAX_NAME_CHARS),
  password: z.string({ message: "Re-enter your password to sign the clearance." }).max(200),
});
export const withdrawSchema = z.object({ expectedVersion: version, reason: note.nullish() });

export const commentSchema = z
  .object({
    body: z.string().max(MAX_COMMENT_CHARS + 1000),
    parentId: optionalId,
    segmentId: z.string().max(100).nullish(),
    x_m: z.coerce.number().finite().nullish(),
    y_m: z.coerce.number().finite().nullish(),
  })
  .refine((c) => (c.x_m === null || c.x_m === undefined) === (c.y_m === null || c.y_m === undefined), {
    message: "A pinned point needs both x_m and y_m.",
    path: ["x_m"],
  });

export const resolveCommentSchema = z.object({ resolved: z.boolean({ message: "Send resolved: true or false." }) });

export const notificationKindSchema = z.enum(NOTIFICATION_KINDS);
export const emailPreferencesSchema = z.partialRecord(notificationKindSchema, z.boolean());
export const markReadSchema = z.object({ ids: z.array(z.number().int().positive()).max(1000).nullish() });
