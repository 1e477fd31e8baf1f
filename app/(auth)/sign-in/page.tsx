import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { Notice } from "@/components/ui/notice";
import { getUserById } from "@/db/queries/users";
import { getSessionUserId } from "@/lib/auth/session";
import { safeCallbackPath } from "@/lib/http/safe-redirect";

export const metadata: Metadata = { title: "Sign in" };

const NOTICES: Record<string, string> = {
  "signed-out": "You are signed out.",
  joined: "You have joined the workspace. Sign in with the password you just set.",
  "password-reset": "Your password has been changed. Sign in with the new one.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const sp = await searchParams;
  // Already signed in (and the account still exists): go where the visitor was heading.
  const sessionUserId = await getSessionUserId();
  if (sessionUserId !== null && (await getUserById(sessionUserId))) redirect(safeCallbackPath(sp.callbackUrl));
  const notice = typeof sp.notice === "string" ? NOTICES[sp.notice] : undefined;
  const email = typeof sp.email === "string" ? sp.email.slice(0, 254) : undefined;
  const urlError = typeof sp.error === "string" ? sp.error.slice(0, 300) : undefined;
  return (
    <>
      <h1 className="text-xl font-semibold text-ink-900">Sign in</h1>
      <p className="mb-6 mt-1 text-sm text-ink-600">Use the e-mail address your workspace admin invited.</p>
      {notice ? (
        <div className="mb-4">
          <Notice tone="success">{notice}</Notice>
        </div>
      ) : null}
      {urlError && urlError !== "CredentialsSignin" && !notice ? (
        <div className="mb-4">
          <Notice tone="error">{urlError}</Notice>
        </div>
      ) : null}
      <SignInForm callbackPath={safeCallbackPath(sp.callbackUrl)} initialEmail={email} />
      <p className="mt-6 text-sm">
        <Link href="/forgot-password">Forgot your password?</Link>
      </p>
    </>
  );
}
