"use client";
import { resetPasswordAction } from "@/app/(auth)/actions";
import { Field } from "@/components/ui/field";
import { ActionForm } from "./action-form";

export function ResetPasswordForm({ token, email }: { token: string; email: string }) {
  return (
    <ActionForm action={resetPasswordAction} submitLabel="Set new password" busyLabel="Saving…">
      {(errors) => (
        <>
          <input type="hidden" name="token" value={token} />
          <input type="text" name="username" autoComplete="username" value={email} readOnly hidden />
          <Field label="New password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={errors.password} />
          <Field label="Type it again" name="confirm" type="password" autoComplete="new-password" required error={errors.confirm} />
        </>
      )}
    </ActionForm>
  );
}
