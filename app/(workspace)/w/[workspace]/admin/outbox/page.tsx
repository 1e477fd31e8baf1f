import type { Metadata } from "next";
import { AdminTabs } from "@/components/admin/admin-tabs";
import { LinkifiedText } from "@/components/admin/linkified-text";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { listOutbox } from "@/db/queries/outbox";
import { getPageAccess } from "@/lib/auth/page";
import { getEnv } from "@/lib/env";

export const metadata: Metadata = { title: "Mail outbox" };
export const dynamic = "force-dynamic";

export default async function OutboxPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "mail.outbox.view", `/w/${slug}/admin/outbox`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}`} />;
  const messages = await listOutbox(access.scope);
  const smtp = Boolean(getEnv().smtpUrl);
  return (
    <>
      <PageHeader title="Admin" lead="Mail Stokeline has stored instead of sending, because no mail server is configured (SMTP_URL)." />
      <AdminTabs slug={slug} current="outbox" />
      {smtp ? (
        <div className="mb-4">
          <Notice tone="info">A mail server is configured, so new messages are sent over SMTP and no longer appear here.</Notice>
        </div>
      ) : null}
      {messages.length === 0 ? (
        <EmptyState title="The outbox is empty">
          <p>Invitations and password-reset e-mails for this workspace&apos;s members will appear here, with their links ready to open.</p>
        </EmptyState>
      ) : (
        <ol className="space-y-4" aria-label="Stored messages, newest first">
          {messages.map((m) => (
            <li key={m.id} className="panel p-5" data-testid="outbox-message">
              <article aria-labelledby={`mail-${m.id}-subject`}>
                <header className="mb-3 border-b border-ink-100 pb-2">
                  <h2 id={`mail-${m.id}-subject`} className="font-semibold text-ink-900">
                    {m.subject}
                  </h2>
                  <p className="text-xs text-ink-600">
                    To <span data-testid="outbox-to">{m.toAddress}</span> · from {m.fromAddress} ·{" "}
                    <time dateTime={m.createdAt.toISOString()}>{m.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC</time>
                  </p>
                </header>
                <LinkifiedText text={m.text} />
              </article>
            </li>
          ))}
        </ol>
      )}
    </>
  );
}
