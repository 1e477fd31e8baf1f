"use client";
import { requestResetAction } from "@/app/(auth)/actions";
import { Field } from "@/components/ui/field";
import { ActionForm } from "./action-form";

export function RequestResetForm() {
  return (
    <ActionForm action={requestResetAction} submitLabel="Send reset link" busyLabel="Sending…">
      {(errors, values) => (
        <Field label="E-mail" name="email" type="email" autoComplete="username" required maxLength={254} error={errors.email} defaultValue={typeof values.email === "string" ? values.email : undefined} />
      )}
    </ActionForm>
  );
}
