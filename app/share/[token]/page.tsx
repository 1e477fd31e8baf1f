import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { BriefView } from "@/components/brief/brief-view";
import { PrintButton } from "@/components/brief/print-button";
import { Wordmark } from "@/components/ui/logo";
import { DomainError } from "@/lib/errors";
import { loadBrief } from "@/lib/reports/load";
import { openShareLink } from "@/lib/reports/share";

export const metadata: Metadata = { title: "Shared brief", robots: { index: false, follow: false } };
export const dynamic = "force-dynamic";

/** The public, read-only brief behind a share link: this one brief and nothing else of the workspace. */
export default async function SharedBriefPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let opened;
  try {
    opened = await openShareLink(token);
  } catch (err) {
    // Unknown, revoked and expired links all answer 404 with the same plain page (not-found.tsx).
    if (err instanceof DomainError) notFound();
    throw err;
  }
  const brief = await loadBrief(opened.scope, opened.workspaceName, opened.revisionId);
  return (
    <main id="main" className="mx-auto max-w-5xl px-4 py-8">
      <div className="no-print mb-6 flex flex-wrap items-center justify-between gap-3 border-b border-ink-200 pb-4">
        <Wordmark />
        <div className="flex gap-3">
          <a className="btn-primary" href={`/share/${token}/brief.pdf`} download>
            Download PDF
          </a>
          <PrintButton />
        </div>
      </div>
      <p className="no-print mb-6 text-sm text-ink-600">Shared with you read-only by {brief.workspaceName}. This page shows only this brief.</p>
      <BriefView brief={brief} />
    </main>
  );
}
