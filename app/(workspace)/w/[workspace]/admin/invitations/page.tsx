import type { Metadata } from "next";
import { AdminTabs } from "@/components/admin/admin-tabs";
import { InviteForm } from "@/components/admin/invite-form";
import { RevokeInvitationForm } from "@/components/admin/member-row-forms";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { RoleBadge } from "@/components/ui/role-badge";
import { listInvitations } from "@/db/queries/invitations";
import { getPageAccess } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Invitations" };

const STATUS_STYLE = {
  pending: "bg-note-100 text-note-800",
  accepted: "bg-stream-50 text-stream-800",
  revoked: "bg-ink-100 text-ink-700",
  expired: "bg-heed-100 text-heed-800",
} as const;

export default async function InvitationsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "workspace.manage", `/w/${slug}/admin/invitations`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}`} />;
  const invitations = await listInvitations(access.scope);
  return (
    <>
      <PageHeader title="Admin" lead="Invite people by e-mail. The link in the message lets them set a password and join with the roles you choose." />
      <AdminTabs slug={slug} current="invitations" />
      <section aria-labelledby="invite-heading" className="panel mb-8 p-6">
        <h2 id="invite-heading" className="mb-4 text-lg font-semibold">
          Invite a member
        </h2>
        <InviteForm slug={slug} />
      </section>
      <section aria-labelledby="sent-heading">
        <h2 id="sent-heading" className="mb-3 text-lg font-semibold">
          Sent invitations
        </h2>
        {invitations.length === 0 ? (
          <EmptyState title="No invitations yet">
            <p>Invite your first colleague with the form above. While no mail server is configured, the message lands in the Mail outbox tab.</p>
          </EmptyState>
        ) : (
          <div className="panel overflow-x-auto">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">Invitations, newest first</caption>
              <thead className="border-b border-ink-200 bg-ink-50 text-ink-700">
                <tr>
                  <th scope="col" className="px-4 py-2 font-semibold">E-mail</th>
                  <th scope="col" className="px-4 py-2 font-semibold">Roles</th>
                  <th scope="col" className="px-4 py-2 font-semibold">Status</th>
                  <th scope="col" className="px-4 py-2 font-semibold">Expires (UTC)</th>
                  <th scope="col" className="px-4 py-2 font-semibold"><span className="sr-only">Actions</span></th>
                </tr>
              </thead>
              <tbody>
                {invitations.map((i) => (
                  <tr key={i.id} className="border-b border-ink-100 last:border-0" data-testid="invitation-row">
                    <td className="px-4 py-2">{i.email}</td>
                    <td className="px-4 py-2">
                      <span className="flex flex-wrap gap-1">
                        {i.roles.map((r) => (
                          <RoleBadge key={r} role={r} />
                        ))}
                      </span>
                    </td>
                    <td className="px-4 py-2">
                      <span className={`rounded px-2 py-0.5 text-xs font-semibold ${STATUS_STYLE[i.status]}`}>{i.status}</span>
                    </td>
                    <td className="px-4 py-2 font-mono text-xs">{i.expiresAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                    <td className="px-4 py-2">{i.status === "pending" ? <RevokeInvitationForm slug={slug} invitationId={i.id} email={i.email} /> : null}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </>
  );
}
