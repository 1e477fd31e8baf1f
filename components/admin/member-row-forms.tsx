"use client";
import { changeRolesAction, removeMemberAction, revokeInvitationAction } from "@/app/(workspace)/w/[workspace]/admin/actions";
import { ActionForm } from "@/components/auth/action-form";
import type { Role } from "@/lib/auth/roles";
import { RoleCheckboxes } from "./role-checkboxes";

export function MemberRolesForm({ slug, userId, roles, name }: { slug: string; userId: number; roles: Role[]; name: string }) {
  return (
    <ActionForm action={changeRolesAction} submitLabel="Save roles" busyLabel="Saving…" className="space-y-2" submitClassName="btn-quiet px-3 py-1.5">
      {(errors) => (
        <>
          <input type="hidden" name="workspace" value={slug} />
          <input type="hidden" name="userId" value={userId} />
          <RoleCheckboxes idPrefix={`member-${userId}`} selected={roles} legend={`Roles of ${name}`} error={errors.roles} />
        </>
      )}
    </ActionForm>
  );
}

export function RemoveMemberForm({ slug, userId, name }: { slug: string; userId: number; name: string }) {
  return (
    <ActionForm action={removeMemberAction} submitLabel={`Remove ${name}`} busyLabel="Removing…" className="space-y-2" submitClassName="btn-danger px-3 py-1.5">
      {() => (
        <>
          <input type="hidden" name="workspace" value={slug} />
          <input type="hidden" name="userId" value={userId} />
        </>
      )}
    </ActionForm>
  );
}

export function RevokeInvitationForm({ slug, invitationId, email }: { slug: string; invitationId: number; email: string }) {
  return (
    <ActionForm action={revokeInvitationAction} submitLabel={`Revoke invitation for ${email}`} busyLabel="Revoking…" className="space-y-2" submitClassName="btn-danger px-3 py-1.5">
      {() => (
        <>
          <input type="hidden" name="workspace" value={slug} />
          <input type="hidden" name="invitationId" value={invitationId} />
        </>
      )}
    </ActionForm>
  );
}

