import type { Metadata } from "next";
import Link from "next/link";
import { ResetPasswordForm } from "@/components/auth/reset-password-form";
import { Notice } from "@/components/ui/notice";
import { checkResetToken } from "@/lib/auth/password-reset";
import { DomainError } from "@/lib/errors";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let email: string;
  try {
    ({ email } = await checkResetToken(token.slice(0, 200)));
  } catch (err) {
    if (!(err instanceof DomainError)) throw err;
    return (
      <>
        <h1 className="mb-4 text-xl font-semibold text-ink-900">This link cannot be used</h1>
        <Notice tone="error">{err.message}</Notice>
        <p className="mt-6 text-sm">
          <Link href="/forgot-password">Ask for a new link</Link>
        </p>
      </>
    );
  }
  return (
    <>
      <h1 className="text-xl font-semibold text-ink-900">Choose a new password</h1>
      <p className="mb-6 mt-1 text-sm text-ink-600">For {email}.</p>
      <ResetPasswordForm token={token} email={email} />
    </>
  );
}
