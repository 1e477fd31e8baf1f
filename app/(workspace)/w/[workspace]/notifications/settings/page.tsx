import type { Metadata } from "next";
import Link from "next/link";
import { EmailPreferencesForm } from "@/components/review/inbox-forms";
import { AccessDenied } from "@/components/ui/access-denied";
import { PageHeader } from "@/components/ui/page-header";
import { getPageAccess } from "@/lib/auth/page";
import { getMyEmailPreferences } from "@/lib/notifications/service";

export const metadata: Metadata = { title: "E-mail settings" };

export default async function NotificationSettingsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "workspace.view", `/w/${slug}/notifications/settings`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}`} />;
  const prefs = await getMyEmailPreferences(access.scope);
  return (
    <>
      <PageHeader
        title="E-mail settings"
        lead={`Which review events reach ${access.user.email} by e-mail, for ${access.workspace.name}. The in-app inbox always shows them all.`}
        actions={
          <Link className="btn-quiet" href={`/w/${slug}/inbox`}>
            Inbox
          </Link>
        }
      />
      <div className="panel max-w-xl p-5">
        <EmailPreferencesForm slug={slug} prefs={prefs} />
      </div>
    </>
  );
}
