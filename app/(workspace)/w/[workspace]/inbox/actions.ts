"use server";
/** Server actions of the inbox and the notification settings: the member's own rows only. */
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { requireMembershipBySlug } from "@/lib/auth/require";
import { formAction } from "@/lib/http/action";
import { idParam } from "@/lib/http/route";
import { NOTIFICATION_KINDS, type NotificationKind } from "@/lib/notifications/kinds";
import { markRead, saveMyEmailPreferences } from "@/lib/notifications/service";

const slug = z.string().min(1).max(64);

export const markReadAction = formAction(z.object({ workspace: slug, id: idParam.optional() }), async (input) => {
  const ctx = await requireMembershipBySlug(input.workspace, "workspace.view");
  const n = await markRead(ctx.scope, input.id ? [input.id] : null);
  revalidatePath(`/w/${input.workspace}/inbox`);
  return input.id ? "Marked read." : `${n} notification${n === 1 ? "" : "s"} marked read.`;
});

const checkbox = z.literal("on").optional();
export const savePreferencesAction = formAction(
  z.object({ workspace: slug, ...Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, checkbox])) }) as z.ZodType<{ workspace: string } & Partial<Record<NotificationKind, "on">>>,
  async (input) => {
    const ctx = await requireMembershipBySlug(input.workspace, "workspace.view");
    // Unchecked boxes are absent from the form: every kind is saved, so "absent" means e-mail off.
    await saveMyEmailPreferences(ctx.scope, Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, input[k] === "on"])) as Record<NotificationKind, boolean>);
    revalidatePath(`/w/${input.workspace}/notifications/settings`);
    return "Saved. In-app notifications stay on; e-mail follows these switches.";
  },
);
