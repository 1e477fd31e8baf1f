"use server";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { saveUserUnitPreferences } from "@/db/queries/chips";
import { type UnitPreferences } from "@/lib/analysis/quantities";
import { unitPreferencesSchema } from "@/lib/analysis/unit-preferences";
import { requireMembershipBySlug, requireUser } from "@/lib/auth/require";
import { chipCreateSchema } from "@/lib/chips/schemas";
import { createChip } from "@/lib/chips/service";
import { formAction } from "@/lib/http/action";

const slugSchema = z.string().min(1).max(64);

/** New chip (designers): created, then the designer lands on its page to upload the first revision. */
export const createChipAction = formAction(chipCreateSchema.extend({ workspace: slugSchema }), async (input) => {
  const ctx = await requireMembershipBySlug(input.workspace, "chip.create");
  const chip = await createChip(ctx, { name: input.name, purpose: input.purpose });
  revalidatePath(`/w/${ctx.workspace.slug}/chips`);
  redirect(`/w/${ctx.workspace.slug}/chips/${chip.id}/upload?first=1`);
});

/** Stores the signed-in member's display units (the analysis view's unit picker). */
export async function saveUnitPreferencesAction(units: UnitPreferences): Promise<void> {
  const user = await requireUser();
  const parsed = unitPreferencesSchema.parse(units);
  await saveUserUnitPreferences(user.id, parsed as Record<string, string>);
}
