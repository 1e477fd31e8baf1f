"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { inviteMember, revokeInvitation } from "@/lib/auth/invitations";
import { changeMemberRoles, removeMember } from "@/lib/auth/members";
import { requireMembershipBySlug } from "@/lib/auth/require";
import { emailSchema, rolesSchema } from "@/lib/auth/schemas";
import { formAction } from "@/lib/http/action";
import { idParam } from "@/lib/http/route";

const slugSchema = z.string().min(1).max(64);

export const inviteAction = formAction(z.object({ workspace: slugSchema, email: emailSchema, roles: rolesSchema }), async (input) => {
  const { scope, user, workspace } = await requireMembershipBySlug(input.workspace, "workspace.manage");
  await inviteMember(scope, { inviterName: user.name, workspaceName: workspace.name }, { email: input.email, roles: input.roles });
  revalidatePath(`/w/${workspace.slug}/admin`, "layout");
  return `Invitation sent to ${input.email}.`;
});

export const revokeInvitationAction = formAction(z.object({ workspace: slugSchema, invitationId: idParam }), async (input) => {
  const { scope, workspace } = await requireMembershipBySlug(input.workspace, "workspace.manage");
  await revokeInvitation(scope, input.invitationId);
  revalidatePath(`/w/${workspace.slug}/admin`, "layout");
  return "Invitation revoked; its link no longer works.";
});

export const changeRolesAction = formAction(z.object({ workspace: slugSchema, userId: idParam, roles: rolesSchema }), async (input) => {
  const { scope, workspace } = await requireMembershipBySlug(input.workspace, "workspace.manage");
  await changeMemberRoles(scope, input.userId, input.roles);
  revalidatePath(`/w/${workspace.slug}`, "layout");
  return "Roles saved.";
});

export const removeMemberAction = formAction(z.object({ workspace: slugSchema, userId: idParam }), async (input) => {
  const { scope, workspace } = await requireMembershipBySlug(input.workspace, "workspace.manage");
  await removeMember(scope, input.userId);
  revalidatePath(`/w/${workspace.slug}`, "layout");
  return "Member removed.";
});
