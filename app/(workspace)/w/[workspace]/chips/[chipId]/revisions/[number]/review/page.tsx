import type { Metadata } from "next";
import { formatWhen } from "@/components/chips/format";
import Link from "next/link";
import { ReviewScreen, type ReviewCommentItem, type ReviewFlagItem } from "@/components/review/review-screen";
import { ReviewStatusBadge } from "@/components/review/status-badge";
import { StepPanel } from "@/components/review/step-panel";
import { AccessDenied } from "@/components/ui/access-denied";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { getAnalysis } from "@/db/queries/chips";
import { listAuditEvents } from "@/db/queries/audit";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { loadRevisionPage } from "@/lib/chips/page";
import { listProcesses } from "@/lib/rules";
import { can } from "@/lib/auth/permissions";
import { describeAuditEvent, describeFlagKey, formatWaited } from "@/lib/review/describe";
import { getReviewOverview } from "@/lib/review/service";

export const metadata: Metadata = { title: "Review" };


export default async function ReviewPage({ params }: { params: Promise<{ workspace: string; chipId: string; number: string }> }) {
  const page = await loadRevisionPage(await params, "chip.view", "/review");
  if (!page.ok) return <AccessDenied message={page.message} />;
  const { access, slug, chip, revision, number } = page;

  const o = await getReviewOverview(access, revision.id);
  const { base } = page;
  const doc = o.analysisDoc;
  const latestAnalysisId = o.candidates[0]?.id ?? null;
  const shownAnalysisId = o.revision.reviewAnalysisId ?? latestAnalysisId;
  // Before submission the screen shows the newest analysed operating point, so the designer sees what they will submit.
  const shownRow = shownAnalysisId !== null ? await getAnalysis(access.scope, shownAnalysisId) : null;
  const shown = doc ?? shownRow?.result ?? null;
  const processKey = typeof shownRow?.conditions.process === "string" ? shownRow.conditions.process : "";
  const process = listProcesses().find((p) => p.id === processKey)?.label ?? processKey;
  const byKey = new Map(o.checklist.map((i) => [i.flagKey, i]));
  const flagSource = (doc ?? shown) as typeof doc;
  const flags: ReviewFlagItem[] = flagSource
    ? flagSource.flags.map((f) => {
        const key = `${f.code}|${f.target.kind}|${f.target.id ?? "*"}`;
        const item = byKey.get(key);
        const d = item?.disposition ?? null;
        const by = d ? (o.members.find((m) => String(m.userId) === d.byMemberId)?.name ?? null) : null;
        return {
          flagKey: key,
          code: f.code,
          title: f.title,
          message: f.message,
          severity: f.severity,
          family: f.family,
          value: f.value,
          threshold: f.threshold,
          target: f.target.id ? `${f.target.kind} ${f.target.id}` : f.target.kind,
          segmentId: f.target.kind === "segment" ? f.target.id : null,
          status: item?.status ?? "open",
          decision: d?.decision ?? null,
          justification: d?.justification ?? null,
          decidedBy: by,
          decidedAt: d?.atIso ?? null,
        };
      })
    : [];
  // Dispositions of flags the current analysis no longer raises: fixed.
  for (const item of o.checklist.filter((i) => i.status === "fixed")) {
    const d = item.disposition!;
    flags.push({
      flagKey: item.flagKey,
      code: item.code ?? "",
      title: `${describeFlagKey(item.flagKey)} — no longer raised`,
      message: "The analysis now under review does not raise this flag.",
      severity: "earlier",
      family: item.code?.startsWith("fab_") ? "fabrication" : "regime",
      value: d.value,
      threshold: null,
      target: item.flagKey.split("|").slice(1).join(" "),
      segmentId: null,
      status: "fixed",
      decision: d.decision,
      justification: d.justification,
      decidedBy: o.members.find((m) => String(m.userId) === d.byMemberId)?.name ?? null,
      decidedAt: d.atIso,
    });
  }
  const comments: ReviewCommentItem[] = o.comments.map((c) => ({
    id: c.id,
    parentId: c.parentId,
    author: c.authorName ?? "Former member",
    body: c.body,
    segmentId: c.segmentId,
    pointMm: c.xM !== null && c.yM !== null ? { x: c.xM * 1000, y: c.yM * 1000 } : null,
    createdAt: c.createdAt.toISOString(),
    resolved: c.resolvedAt !== null,
  }));
  const events = (await listAuditEvents(access.scope, { objectType: "revision", objectId: revision.id, limit: 12 })).filter((e) => e.action.startsWith("review."));
  const where = { workspace: slug, revisionId: revision.id, chipId: chip.id, number };
  const waited = formatWaited(o.revision.reviewStateSince.getTime(), Date.now());

  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <Link href={`/w/${slug}/chips/${chip.id}`}>{chip.name}</Link>{" "}
        <span aria-hidden="true">/</span> <Link href={base}>Revision {number}</Link> <span aria-hidden="true">/</span> <span className="text-ink-600">Review</span>
      </nav>
      <PageHeader
        title={`Review of ${chip.name}, revision ${number}`}
        lead={
          <span className="inline-flex flex-wrap items-center gap-2">
            <ReviewStatusBadge status={o.state.status} />
            <span className="text-sm text-ink-600">
              since {formatWhen(o.revision.reviewStateSince)} ({waited}) · file {o.revision.fileName} · SHA-256 <span className="font-mono">{o.revision.sha256.slice(0, 12)}…</span>
            </span>
          </span>
        }
        actions={
          <>
            <Link className="btn-quiet" href={`${base}/history`}>
              History
            </Link>
            {shownAnalysisId !== null ? (
              <Link className="btn-quiet" href={`${base}/analyses/${shownAnalysisId}`}>
                Full analysis
              </Link>
            ) : null}
          </>
        }
      />
      {o.state.status === "cleared" && o.clearance ? (
        <div className="mb-4">
          <Notice tone="success" title="Cleared for tape-out — this revision is frozen">
            Signed by {o.clearance.byName ?? "?"} on {formatWhen(o.clearance.at)} for {o.clearance.fabName}, process {o.clearance.process}; file SHA-256{" "}
            <span className="font-mono break-all">{o.clearance.fileSha256}</span>, analysis {o.clearance.analysisId}. A changed layout becomes a new revision; this clearance stays on
            record.
          </Notice>
        </div>
      ) : null}
      {o.state.status === "draft" && !doc ? (
        <div className="mb-4">
          <Notice tone="info" title="Not submitted yet">
            {shown ? "The drawing shows the newest analysed operating point; the designer submits it with a note." : "This revision has no analysed operating point yet."}
          </Notice>
        </div>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-12">
        <div className="lg:col-span-8">
          <ReviewScreen
            where={where}
            version={o.state.version}
            analysis={shown as never}
            title={`${chip.name} revision ${number}`}
            flags={flags}
            canDispose={o.allowed.includes("dispose_flag")}
            canComment={can(access.scope, "comment.create") && access.scope.roles.some((r) => r !== "lead")}
            comments={comments}
            flagsHeading={doc ? "Flags of the analysis under review" : "Flags of the newest analysis (not under review yet)"}
          />
        </div>
        <aside className="space-y-4 lg:col-span-4">
          <StepPanel
            where={where}
            version={o.state.version}
            allowed={o.allowed}
            candidates={o.candidates.filter((c) => c.hasOperatingPoint).map((c) => ({ id: c.id, name: c.name, createdAt: c.createdAt.toISOString(), flagsBlock: c.flagsBlock, flagsWarn: c.flagsWarn }))}
            underReviewId={o.revision.reviewAnalysisId}
            defaultProcess={process}
            cautions={MODEL_CAUTIONS}
          />
          <section aria-labelledby="recent-title" className="panel p-4">
            <h2 id="recent-title" className="mb-2 text-base font-semibold text-ink-900">
              Review history
            </h2>
            {events.length === 0 ? <p className="text-sm text-ink-600">No review step yet.</p> : null}
            <ol className="space-y-2 text-sm" data-testid="review-history">
              {events.map((e) => (
                <li key={e.id} className="border-l-2 border-ink-200 pl-2">
                  <p className="text-xs text-ink-600">
                    {formatWhen(e.at)} · <span className="font-semibold text-ink-800">{e.actor ?? "system"}</span>
                  </p>
                  <p className="text-ink-900">{describeAuditEvent(e.action, e.details)}</p>
                </li>
              ))}
            </ol>
            <p className="mt-3 text-sm">
              <Link href={`${base}/history`}>Every event of this revision, with CSV and JSON export</Link>
            </p>
          </section>
        </aside>
      </div>
    </>
  );
}
