import type { Metadata } from "next";
import Link from "next/link";
import { RequestResetForm } from "@/components/auth/request-reset-form";

export const metadata: Metadata = { title: "Reset password" };

export default function ForgotPasswordPage() {
  return (
    <>
      <h1 className="text-xl font-semibold text-ink-900">Reset your password</h1>
      <p className="mb-6 mt-1 text-sm text-ink-600">We will e-mail you a link to choose a new password.</p>
      <RequestResetForm />
      <p className="mt-6 text-sm">
        <Link href="/sign-in">Back to sign-in</Link>
      </p>
    </>
  );
}
