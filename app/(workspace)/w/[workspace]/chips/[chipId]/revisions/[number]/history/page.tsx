import type { Metadata } from "next";
import { formatWhen } from "@/components/chips/format";
import Link from "next/link";
import { ReviewStatusBadge } from "@/components/review/status-badge";
import { AccessDenied } from "@/components/ui/access-denied";
import { PageHeader } from "@/components/ui/page-header";
import { loadRevisionPage } from "@/lib/chips/page";
import { describeAuditEvent } from "@/lib/review/describe";
import { listRevisionAudit } from "@/lib/review/service";

export const metadata: Metadata = { title: "Revision history" };

const when = (d: Date) => formatWhen(d, { seconds: true });

export default async function RevisionHistoryPage({ params }: { params: Promise<{ workspace: string; chipId: string; number: string }> }) {
  const page = await loadRevisionPage(await params, "chip.view", "/history");
  if (!page.ok) return <AccessDenied message={page.message} />;
  const { access, slug, chip, revision, number } = page;
  const events = await listRevisionAudit(access, revision.id);
  const { base } = page;
  const api = `/api/v1/revisions/${revision.id}/audit`;
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <Link href={`/w/${slug}/chips/${chip.id}`}>{chip.name}</Link>{" "}
        <span aria-hidden="true">/</span> <Link href={base}>Revision {number}</Link> <span aria-hidden="true">/</span> <span className="text-ink-600">History</span>
      </nav>
      <PageHeader
        title={`History of ${chip.name}, revision ${number}`}
        lead={
          <span className="inline-flex flex-wrap items-center gap-2">
            <ReviewStatusBadge status={revision.reviewState} />
            <span className="text-sm text-ink-600">
              Every recorded event, oldest first. The trail is append-only: nothing here can be edited or deleted.
            </span>
          </span>
        }
        actions={
          <>
            <Link className="btn-quiet" href={`${base}/review`}>
              Review
            </Link>
            <a className="btn-quiet" href={`${api}?format=csv`} download>
              Export CSV
            </a>
            <a className="btn-quiet" href={`${api}?format=json`}>
              Export JSON
            </a>
          </>
        }
      />
      <div className="panel overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="history-table">
          <caption className="sr-only">Audit events of revision {number}</caption>
          <thead className="border-b border-ink-200 bg-ink-50 text-xs uppercase tracking-wide text-ink-600">
            <tr>
              <th scope="col" className="px-3 py-2">When (UTC)</th>
              <th scope="col" className="px-3 py-2">Who</th>
              <th scope="col" className="px-3 py-2">Event</th>
              <th scope="col" className="px-3 py-2">What happened</th>
            </tr>
          </thead>
          <tbody>
            {events.map((e) => (
              <tr key={e.id} className="border-b border-ink-100 align-top last:border-0" data-testid="history-row" data-action={e.action}>
                <td className="whitespace-nowrap px-3 py-2 font-mono text-xs text-ink-700">{when(e.at)}</td>
                <td className="whitespace-nowrap px-3 py-2 text-ink-900">{e.actor ?? "system"}</td>
                <td className="whitespace-nowrap px-3 py-2 font-mono text-xs text-ink-700">{e.action}</td>
                <td className="px-3 py-2 text-ink-900">{describeAuditEvent(e.action, e.details)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
