import type { Metadata } from "next";
import { AdminTabs } from "@/components/admin/admin-tabs";
import { MemberRolesForm, RemoveMemberForm } from "@/components/admin/member-row-forms";
import { AccessDenied } from "@/components/ui/access-denied";
import { PageHeader } from "@/components/ui/page-header";
import { listMembers } from "@/db/queries/members";
import { getPageAccess } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "workspace.manage", `/w/${slug}/admin/members`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}`} />;
  const members = await listMembers(access.scope);
  return (
    <>
      <PageHeader title="Admin" lead={`Who belongs to ${access.workspace.name} and what each person may do.`} />
      <AdminTabs slug={slug} current="members" />
      <ul className="space-y-3" aria-label="Members">
        {members.map((m) => (
          <li key={m.userId} className="panel p-4" data-testid="member-row">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <div>
                <p className="font-semibold text-ink-900">{m.name}</p>
                <p className="text-sm text-ink-600">{m.email}</p>
              </div>
              <p className="text-xs text-ink-500">Member since {m.joinedAt.toISOString().slice(0, 10)}</p>
            </div>
            <div className="mt-3 grid gap-3 md:grid-cols-[1fr_auto] md:items-end">
              <MemberRolesForm slug={slug} userId={m.userId} roles={m.roles} name={m.name} />
              {m.userId !== access.user.id ? (
                <details className="text-sm">
                  <summary className="cursor-pointer text-halt-800">Remove from workspace…</summary>
                  <div className="mt-2">
                    <RemoveMemberForm slug={slug} userId={m.userId} name={m.name} />
                  </div>
                </details>
              ) : null}
            </div>
          </li>
        ))}
      </ul>
    </>
  );
}
