/**
 * A chip's revisions as a timeline, newest first: who uploaded what and why,
 * the file's name, size and short SHA-256, its review state, and its analyses
 * with their status and links.
 */
import Link from "next/link";
import { analysisHref, formatBytes, formatWhen, revisionHref, shortSha } from "./format";
import { ReviewStateBadge } from "./review-state";
import { SeverityBadge } from "./severity-badge";

export interface TimelineAnalysis {
  id: number;
  name: string;
  status: "ok" | "failed";
  worst: string | null;
  flags: number;
  errorMessage: string | null;
  createdAt: string;
}

export interface TimelineRevision {
  number: number;
  uploadedAt: string;
  uploaderName: string | null;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  note: string;
  reviewState: string;
  mapped: boolean;
  analyses: TimelineAnalysis[];
}

export function RevisionTimeline({ slug, chipId, revisions, canEdit }: { slug: string; chipId: number; revisions: TimelineRevision[]; canEdit: boolean }) {
  return (
    <ol className="relative space-y-6 border-l-2 border-ink-200 pl-6" aria-label="Revision history" data-testid="revision-timeline">
      {revisions.map((r) => (
        <li key={r.number} className="relative" data-testid="revision-entry" data-revision={r.number}>
          <span aria-hidden="true" className="absolute -left-[33px] top-1 flex h-4 w-4 items-center justify-center rounded-full border-2 border-stream-600 bg-white" />
          <div className="panel p-4">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h3 className="text-base font-semibold text-ink-900">
                <Link href={revisionHref(slug, chipId, r.number)}>Revision {r.number}</Link>
              </h3>
              <ReviewStateBadge state={r.reviewState} />
            </div>
            <p className="mt-1 text-sm text-ink-600">
              Uploaded by <span className="font-medium text-ink-800">{r.uploaderName ?? "a former member"}</span> on{" "}
              <time dateTime={r.uploadedAt}>{formatWhen(r.uploadedAt)}</time>
            </p>
            {r.note ? (
              <blockquote className="mt-2 border-l-4 border-stream-300 bg-stream-50 px-3 py-2 text-sm text-ink-800" data-testid="revision-note">
                {r.note}
              </blockquote>
            ) : (
              <p className="mt-2 text-sm italic text-ink-500">No note on what changed.</p>
            )}
            <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
              <dt className="text-ink-600">File</dt>
              <dd className="font-mono text-ink-800">
                {r.fileName} · {formatBytes(r.sizeBytes)}
              </dd>
              <dt className="text-ink-600">SHA-256</dt>
              <dd className="font-mono text-ink-800" title={r.sha256}>
                {shortSha(r.sha256)}…
              </dd>
            </dl>
            <div className="mt-3">
              {!r.mapped ? (
                <p className="text-sm text-heed-800">
                  Layers not mapped yet.{" "}
                  {canEdit ? <Link href={`${revisionHref(slug, chipId, r.number)}/layers`}>Map the layers</Link> : "A designer maps them before analysing."}
                </p>
              ) : r.analyses.length === 0 ? (
                <p className="text-sm text-ink-600">
                  Not analysed yet.{" "}
                  {canEdit ? <Link href={revisionHref(slug, chipId, r.number)}>Set an operating point</Link> : null}
                </p>
              ) : (
                <ul className="space-y-1 text-sm" aria-label={`Analyses of revision ${r.number}`}>
                  {r.analyses.map((a) => (
                    <li key={a.id} className="flex flex-wrap items-center gap-2">
                      <Link href={analysisHref(slug, chipId, r.number, a.id)} data-testid="analysis-link">
                        {a.name}
                      </Link>
                      {a.status === "ok" ? (
                        <SeverityBadge severity={a.worst} count={a.flags} />
                      ) : (
                        <span className="inline-flex items-center gap-1 rounded border border-halt-600 bg-halt-100 px-2 py-0.5 text-xs font-semibold text-halt-800">
                          Analysis failed
                        </span>
                      )}
                      <span className="text-ink-500">{formatWhen(a.createdAt)}</span>
                    </li>
                  ))}
                </ul>
              )}
            </div>
          </div>
        </li>
      ))}
    </ol>
  );
}
