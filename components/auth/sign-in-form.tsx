"use client";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";

export function SignInForm({ callbackPath, initialEmail }: { callbackPath: string; initialEmail?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setBusy(true);
    setError(null);
    const result = await signIn("credentials", {
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      redirect: false,
    });
    setBusy(false);
    if (!result || result.error) {
      setError(
        result?.error && result.error !== "CredentialsSignin" ? result.error : "That e-mail and password do not match. Check both and try again.",
      );
      return;
    }
    router.push(callbackPath);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate aria-describedby={error ? "sign-in-error" : undefined}>
      {error ? (
        <div id="sign-in-error" data-testid="sign-in-error">
          <Notice tone="error">{error}</Notice>
        </div>
      ) : null}
      <Field label="E-mail" name="email" type="email" autoComplete="username" required defaultValue={initialEmail} maxLength={254} />
      <Field label="Password" name="password" type="password" autoComplete="current-password" required maxLength={200} />
      <button type="submit" className="btn-primary w-full" disabled={busy}>
        {busy ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
