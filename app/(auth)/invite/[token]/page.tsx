import type { Metadata } from "next";
import Link from "next/link";
import { AcceptInvitationForm } from "@/components/auth/accept-invitation-form";
import { Notice } from "@/components/ui/notice";
import { RoleBadge } from "@/components/ui/role-badge";
import { getOpenInvitation, type OpenInvitation } from "@/lib/auth/invitations";
import { DomainError } from "@/lib/errors";

export const metadata: Metadata = { title: "Join a workspace" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let invitation: OpenInvitation;
  try {
    invitation = await getOpenInvitation(token.slice(0, 200));
  } catch (err) {
    if (!(err instanceof DomainError)) throw err;
    return (
      <>
        <h1 className="mb-4 text-xl font-semibold text-ink-900">This invitation cannot be used</h1>
        <Notice tone="error">{err.message}</Notice>
        <p className="mt-6 text-sm">
          <Link href="/sign-in">Go to sign-in</Link>
        </p>
      </>
    );
  }
  return (
    <>
      <h1 className="text-xl font-semibold text-ink-900">Join {invitation.workspaceName}</h1>
      <p className="mt-1 text-sm text-ink-600">
        Invitation for <strong className="text-ink-900">{invitation.email}</strong>
      </p>
      <p className="mb-6 mt-2 flex flex-wrap gap-1" aria-label="Roles you will hold">
        {invitation.roles.map((r) => (
          <RoleBadge key={r} role={r} />
        ))}
      </p>
      {invitation.existingAccount ? (
        <p className="mb-4 text-sm text-ink-700">You already have a Stokeline account; confirm it with your password to join.</p>
      ) : null}
      <AcceptInvitationForm token={token} email={invitation.email} existingAccount={invitation.existingAccount} />
    </>
  );
}
