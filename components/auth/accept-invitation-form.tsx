"use client";
import { acceptInvitationAction } from "@/app/(auth)/actions";
import { Field } from "@/components/ui/field";
import { ActionForm } from "./action-form";

export function AcceptInvitationForm({ token, email, existingAccount }: { token: string; email: string; existingAccount: boolean }) {
  return (
    <ActionForm action={acceptInvitationAction} submitLabel={existingAccount ? "Join the workspace" : "Set password and join"} busyLabel="Joining…">
      {(errors, values) => (
        <>
          <input type="hidden" name="token" value={token} />
          <input type="hidden" name="existing" value={existingAccount ? "yes" : "no"} />
          <input type="text" name="username" autoComplete="username" value={email} readOnly hidden />
          {existingAccount ? (
            <Field label="Your current password" name="password" type="password" autoComplete="current-password" required error={errors.password} />
          ) : (
            <>
              <Field label="Your name" name="name" autoComplete="name" required maxLength={120} error={errors.name} defaultValue={typeof values.name === "string" ? values.name : undefined} />
              <Field label="Choose a password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={errors.password} />
              <Field label="Type it again" name="confirm" type="password" autoComplete="new-password" required error={errors.confirm} />
            </>
          )}
        </>
      )}
    </ActionForm>
  );
}
