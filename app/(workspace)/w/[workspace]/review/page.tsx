import type { Metadata } from "next";
import { formatWhen } from "@/components/chips/format";
import Link from "next/link";
import { ReviewStatusBadge } from "@/components/review/status-badge";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { listRevisionsInStates, type QueueItem } from "@/db/queries/review";
import { getPageAccess } from "@/lib/auth/page";
import { formatWaited } from "@/lib/review/describe";

export const metadata: Metadata = { title: "Review queue" };

type Section = { key: string; title: string; explain: string; items: QueueItem[] };


export default async function ReviewQueuePage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "review.queue.view", `/w/${slug}/review`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}`} />;
  const roles = access.scope.roles;
  const me = access.user.id;
  const all = await listRevisionsInStates(access.scope, ["with_fluidics", "with_fab", "changes_requested"]);
  const sections: Section[] = [];
  // Four-eyes: a member's own uploads never wait for their own review.
  if (roles.includes("fluidics_reviewer")) {
    sections.push({
      key: "fluidics",
      title: "Waiting for your fluidics review",
      explain: "Dispose of every flag, then pass the review or send it back.",
      items: all.filter((r) => r.state === "with_fluidics" && r.uploadedByUserId !== me),
    });
  }
  if (roles.includes("fab_liaison")) {
    sections.push({
      key: "fab",
      title: "Waiting for your fab review",
      explain: "Check the fabrication findings against the fab's rules, then clear it for tape-out or send it back.",
      items: all.filter((r) => r.state === "with_fab" && r.uploadedByUserId !== me),
    });
  }
  if (roles.includes("designer")) {
    sections.push({
      key: "changes",
      title: "Sent back to you",
      explain: "A reviewer requested changes; read their note, fix, and resubmit.",
      items: all.filter((r) => r.state === "changes_requested" && r.uploadedByUserId === me),
    });
    sections.push({
      key: "mine",
      title: "Your revisions in review",
      explain: "Nothing to do but answer comments.",
      items: all.filter((r) => (r.state === "with_fluidics" || r.state === "with_fab") && r.uploadedByUserId === me),
    });
  }
  const now = Date.now();
  const waiting = sections.filter((s) => s.key !== "mine").reduce((n, s) => n + s.items.length, 0);
  return (
    <>
      <PageHeader
        title="Review queue"
        lead={waiting === 0 ? "Nothing waits for you right now." : `${waiting} revision${waiting === 1 ? "" : "s"} wait${waiting === 1 ? "s" : ""} for you, oldest first.`}
        actions={
          <Link className="btn-quiet" href={`/w/${slug}/inbox`}>
            Inbox
          </Link>
        }
      />
      <div className="space-y-8">
        {sections.map((s) => (
          <section key={s.key} aria-labelledby={`q-${s.key}`} data-testid={`queue-${s.key}`}>
            <h2 id={`q-${s.key}`} className="text-lg font-semibold text-ink-900">
              {s.title} <span className="font-normal text-ink-600">({s.items.length})</span>
            </h2>
            <p className="mb-3 text-sm text-ink-600">{s.explain}</p>
            {s.items.length === 0 ? (
              <EmptyState title="Nothing here">When a revision reaches this step it appears here, oldest first.</EmptyState>
            ) : (
              <div className="panel overflow-x-auto">
                <table className="w-full text-left text-sm">
                  <thead className="border-b border-ink-200 bg-ink-50 text-xs uppercase tracking-wide text-ink-600">
                    <tr>
                      <th scope="col" className="px-3 py-2">Revision</th>
                      <th scope="col" className="px-3 py-2">State</th>
                      <th scope="col" className="px-3 py-2">Uploaded by</th>
                      <th scope="col" className="px-3 py-2">Waiting since</th>
                      <th scope="col" className="px-3 py-2 text-right">Waited</th>
                    </tr>
                  </thead>
                  <tbody>
                    {s.items.map((r) => (
                      <tr key={r.revisionId} className="border-b border-ink-100 last:border-0" data-testid="queue-row">
                        <td className="px-3 py-2">
                          <Link href={`/w/${slug}/chips/${r.chipId}/revisions/${r.number}/review`} className="font-semibold">
                            {r.chipName}, revision {r.number}
                          </Link>
                          <span className="block text-xs text-ink-600">{r.fileName}</span>
                        </td>
                        <td className="px-3 py-2">
                          <ReviewStatusBadge status={r.state} />
                        </td>
                        <td className="px-3 py-2 text-ink-800">{r.uploaderName ?? "Former member"}</td>
                        <td className="px-3 py-2 text-ink-700">{formatWhen(r.since)}</td>
                        <td className="px-3 py-2 text-right font-mono text-ink-900">{formatWaited(r.since.getTime(), now)}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </section>
        ))}
      </div>
    </>
  );
}
