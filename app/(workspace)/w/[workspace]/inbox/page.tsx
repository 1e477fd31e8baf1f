import type { Metadata } from "next";
import { formatWhen } from "@/components/chips/format";
import Link from "next/link";
import { MarkReadButton } from "@/components/review/inbox-forms";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getPageAccess } from "@/lib/auth/page";
import { NOTIFICATION_LABELS } from "@/lib/notifications/kinds";
import { listInbox } from "@/lib/notifications/service";

export const metadata: Metadata = { title: "Inbox" };


export default async function InboxPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "workspace.view", `/w/${slug}/inbox`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}`} />;
  const items = await listInbox(access.scope);
  const unread = items.filter((i) => i.readAt === null).length;
  return (
    <>
      <PageHeader
        title="Inbox"
        lead={`Review events for you in ${access.workspace.name}: ${unread} unread.`}
        actions={
          <>
            {unread > 0 ? <MarkReadButton slug={slug} label="Mark all read" /> : null}
            <Link className="btn-quiet" href={`/w/${slug}/notifications/settings`}>
              E-mail settings
            </Link>
          </>
        }
      />
      {items.length === 0 ? (
        <EmptyState title="No notifications yet">Review requests, changes requested, clearances and mentions of you appear here.</EmptyState>
      ) : (
        <ul className="space-y-2" aria-label="Notifications">
          {items.map((n) => (
            <li key={n.id} className={`panel flex flex-wrap items-start justify-between gap-3 p-3 ${n.readAt ? "opacity-75" : "border-l-4 border-l-stream-600"}`} data-testid="inbox-item" data-kind={n.kind}>
              <div className="min-w-0">
                <p className="text-xs font-semibold uppercase tracking-wide text-ink-600">
                  {NOTIFICATION_LABELS[n.kind].title}
                  {n.readAt ? "" : " · unread"}
                </p>
                <p className="text-sm text-ink-900">
                  {n.chipId !== null && n.revisionNumber !== null ? (
                    <Link href={`/w/${slug}/chips/${n.chipId}/revisions/${n.revisionNumber}/review`}>{n.summary}</Link>
                  ) : (
                    n.summary
                  )}
                </p>
                <p className="text-xs text-ink-600">{formatWhen(n.createdAt)}</p>
              </div>
              {n.readAt ? null : <MarkReadButton slug={slug} id={n.id} label="Mark read" />}
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
