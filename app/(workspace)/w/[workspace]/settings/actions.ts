"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireMembershipBySlug } from "@/lib/auth/require";
import { PROCESS_LIMIT_FIELDS } from "@/lib/chips/conditions";
import { processOverrideSchema, thresholdOverrideSchema, workspaceFluidSchema } from "@/lib/chips/schemas";
import { saveProcessOverride, saveThresholdOverride, saveWorkspaceFluid } from "@/lib/chips/settings";
import { DomainError } from "@/lib/errors";
import { formAction } from "@/lib/http/action";
import { PROCESS_PROFILES, RULES } from "@/lib/rules";

const slugSchema = z.string().min(1).max(64);

/** Add or replace a workspace fluid (designers and admins). */
export const saveFluidAction = formAction(workspaceFluidSchema.extend({ workspace: slugSchema }), async ({ workspace, ...fluid }) => {
  const ctx = await requireMembershipBySlug(workspace, "settings.fluids.edit");
  await saveWorkspaceFluid(ctx, fluid);
  revalidatePath(`/w/${ctx.workspace.slug}/settings`);
  return `Saved “${fluid.name}”. New operating points can use it; existing analyses keep the values they ran with.`;
});

/** Override or reset (empty value) a flag threshold (fluidics reviewers). */
export const saveThresholdAction = formAction(
  z.object({ workspace: slugSchema, ruleCode: z.string().min(1).max(64), value: z.string().trim().max(32).default(""), note: z.string().trim().max(500).default(""), reset: z.string().optional() }),
  async (input) => {
    const ctx = await requireMembershipBySlug(input.workspace, "settings.thresholds.edit");
    const rule = RULES.find((r) => r.code === input.ruleCode && r.defaultThreshold !== null && r.defaultThreshold > 0);
    if (!rule) throw new DomainError("unknown_rule", "That rule has no threshold to override here (process limits are set under Process profiles).", 400);
    if (input.reset || input.value === "") {
      await saveThresholdOverride(ctx, rule.code, null, input.note);
      revalidatePath(`/w/${ctx.workspace.slug}/settings`);
      return `“${rule.title}” is back to its default of ${rule.defaultThreshold}.`;
    }
    const parsed = thresholdOverrideSchema.safeParse({ ruleCode: rule.code, value: input.value, note: input.note });
    if (!parsed.success) throw new DomainError("invalid_input", parsed.error.issues[0]?.message ?? "Enter a positive number.", 400);
    if (!parsed.data.note) throw new DomainError("invalid_input", "Say why the threshold differs from the published default (the note is kept on record).", 400);
    await saveThresholdOverride(ctx, rule.code, parsed.data.value, parsed.data.note);
    revalidatePath(`/w/${ctx.workspace.slug}/settings`);
    return `“${rule.title}” now uses ${parsed.data.value} ${rule.thresholdUnit} in this workspace's new analyses.`;
  },
);

const processFormSchema = z.object({
  workspace: slugSchema,
  processKey: z.string().min(1).max(64),
  note: z.string().trim().max(500).default(""),
  ...Object.fromEntries(PROCESS_LIMIT_FIELDS.map((f) => [f.key, z.string().trim().max(32).default("")])),
}) as z.ZodType<{ workspace: string; processKey: string; note: string } & Record<string, string>>;

/** Override a process profile's limits for this workspace (fab liaisons); values typed in the display units shown, stored SI. */
export const saveProcessAction = formAction(processFormSchema, async (input) => {
  const ctx = await requireMembershipBySlug(input.workspace, "settings.process.edit");
  const profile = PROCESS_PROFILES[input.processKey];
  if (!profile) throw new DomainError("unknown_process", "That process profile does not exist.", 400);
  const values: Record<string, number> = {};
  for (const f of PROCESS_LIMIT_FIELDS) {
    const raw = input[f.key];
    if (!raw) continue;
    const n = Number(raw.replace(",", "."));
    if (!Number.isFinite(n) || n <= 0) throw new DomainError("invalid_input", `${f.label}: enter a positive number${f.unit ? ` in ${f.unit}` : ""}, or leave it empty for the default.`, 400);
    values[f.key] = n * f.toSi;
  }
  const parsed = processOverrideSchema.parse({ processKey: profile.id, values, note: input.note });
  if (Object.keys(values).length > 0 && !parsed.note) throw new DomainError("invalid_input", "Say where your fab's numbers come from (the note is kept on record).", 400);
  await saveProcessOverride(ctx, profile.id, parsed.values, parsed.note);
  revalidatePath(`/w/${ctx.workspace.slug}/settings`);
  return Object.keys(values).length > 0 ? `Saved your fab's limits for ${profile.label}.` : `${profile.label} is back to the published defaults.`;
});
