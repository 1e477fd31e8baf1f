"use client";
import { inviteAction } from "@/app/(workspace)/w/[workspace]/admin/actions";
import { ActionForm } from "@/components/auth/action-form";
import { Field } from "@/components/ui/field";
import { isRole } from "@/lib/auth/roles";
import { RoleCheckboxes } from "./role-checkboxes";

export function InviteForm({ slug }: { slug: string }) {
  return (
    <ActionForm action={inviteAction} submitLabel="Send invitation" busyLabel="Sending…" submitClassName="btn-primary">
      {(errors, values) => (
        <>
          <input type="hidden" name="workspace" value={slug} />
          <Field label="E-mail address" name="email" type="email" required maxLength={254} error={errors.email} className="max-w-md" defaultValue={typeof values.email === "string" ? values.email : undefined} />
          <RoleCheckboxes idPrefix="invite" error={errors.roles} selected={Array.isArray(values.roles) ? values.roles.filter(isRole) : []} />
        </>
      )}
    </ActionForm>
  );
}
