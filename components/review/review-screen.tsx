"use client";
/**
 * The working part of the review screen: the chip drawing (shared selection),
 * the flags of the analysis under review with their disposition controls, and
 * the comments thread with segment and point pins. Forms post to the review
 * server actions; the server decides (roles, four-eyes, state, version).
 */
import { useId, useMemo, useState } from "react";
import { formatWhen } from "@/components/chips/format";
import {
  commentAction,
  disposeFlagAction,
  resolveCommentAction,
} from "@/app/(workspace)/w/[workspace]/chips/[chipId]/revisions/[number]/review/actions";
import { ChipDrawing, flagMarkers } from "@/components/analysis/chip-drawing";
import { ActionForm } from "@/components/auth/action-form";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { MIN_WAIVER_JUSTIFICATION_CHARS } from "@/lib/review/machine";

export type ReviewWhere = { workspace: string; revisionId: number; chipId: number; number: number };

export type ReviewFlagItem = {
  flagKey: string;
  code: string;
  title: string;
  message: string;
  severity: string;
  family: string;
  value: number | null;
  threshold: number | null;
  target: string;
  segmentId: string | null;
  status: "open" | "waived" | "must_fix" | "fixed";
  decision: "waived" | "must_fix" | null;
  justification: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
};

export type ReviewCommentItem = {
  id: number;
  parentId: number | null;
  author: string;
  body: string;
  segmentId: string | null;
  pointMm: { x: number; y: number } | null;
  createdAt: string;
  resolved: boolean;
};

const STATUS_WORDS: Record<ReviewFlagItem["status"], string> = { open: "Open", waived: "Waived", must_fix: "Must fix", fixed: "Fixed" };
const STATUS_TONE: Record<ReviewFlagItem["status"], string> = {
  open: "border-heed-600 bg-heed-100 text-heed-800",
  waived: "border-note-600 bg-note-100 text-note-800",
  must_fix: "border-halt-600 bg-halt-100 text-halt-800",
  fixed: "border-stream-600 bg-stream-50 text-stream-800",
};
const SEVERITY_WORDS: Record<string, string> = { block: "Blocks", warn: "Warning", info: "Note", earlier: "Earlier flag" };

function Hidden({ where, extra = {} }: { where: ReviewWhere; extra?: Record<string, string | number> }) {
  return (
    <>
      <input type="hidden" name="workspace" value={where.workspace} />
      <input type="hidden" name="revisionId" value={where.revisionId} />
      <input type="hidden" name="chipId" value={where.chipId} />
      <input type="hidden" name="number" value={where.number} />
      {Object.entries(extra).map(([k, v]) => (
        <input key={k} type="hidden" name={k} value={v} />
      ))}
    </>
  );
}

const fmt = (v: number | null) => (v === null ? "—" : Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-2 && v !== 0) ? v.toExponential(3) : v.toPrecision(4));

function DispositionForm({ flag, where, version }: { flag: ReviewFlagItem; where: ReviewWhere; version: number }) {
  const id = useId();
  return (
    <ActionForm action={disposeFlagAction} submitLabel="Record decision" busyLabel="Recording…" className="mt-2 space-y-2" submitClassName="btn-quiet px-3 py-1.5">
      {(errors) => (
        <>
          <Hidden where={where} extra={{ expectedVersion: version, flagKey: flag.flagKey }} />
          <fieldset>
            <legend className="sr-only">Decision on {flag.title}</legend>
            <div className="flex flex-wrap gap-4 text-sm">
              <label className="inline-flex items-center gap-1.5">
                <input type="radio" name="decision" value="waived" defaultChecked={flag.decision === "waived"} required /> Waive (accept with a justification)
              </label>
              <label className="inline-flex items-center gap-1.5">
                <input type="radio" name="decision" value="must_fix" defaultChecked={flag.decision === "must_fix"} /> Must fix
              </label>
            </div>
          </fieldset>
          <div>
            <label htmlFor={`${id}-j`} className="block text-sm font-medium text-ink-800">
              Justification
            </label>
            <textarea
              id={`${id}-j`}
              name="justification"
              rows={2}
              className="field-input text-sm"
              aria-describedby={`${id}-h`}
              aria-invalid={errors.justification ? true : undefined}
              defaultValue=""
            />
            <p id={`${id}-h`} className="mt-1 text-xs text-ink-600">
              Required for a waiver: at least {MIN_WAIVER_JUSTIFICATION_CHARS} characters on why this is acceptable for this design. Optional note for must-fix.
            </p>
          </div>
        </>
      )}
    </ActionForm>
  );
}

function FlagRow({ flag, where, version, canDispose, selected, onSelect }: { flag: ReviewFlagItem; where: ReviewWhere; version: number; canDispose: boolean; selected: boolean; onSelect: (id: string) => void }) {
  return (
    <li className={`rounded-md border p-3 ${selected ? "border-stream-600 bg-stream-50" : "border-ink-200 bg-white"}`} data-testid="review-flag" data-flag-key={flag.flagKey} data-flag-status={flag.status}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <p className="text-sm font-semibold text-ink-900">
            <span className="mr-1.5 text-xs font-semibold uppercase tracking-wide text-ink-600">{SEVERITY_WORDS[flag.severity] ?? flag.severity}</span>
            {flag.title}
          </p>
          <p className="text-xs text-ink-700">
            {flag.segmentId ? (
              <button type="button" className="font-mono text-stream-700 underline decoration-dotted" onClick={() => onSelect(flag.segmentId!)} aria-label={`Show segment ${flag.segmentId} on the drawing`}>
                {flag.target}
              </button>
            ) : (
              <span className="font-mono">{flag.target}</span>
            )}{" "}
            · value {fmt(flag.value)}
            {flag.threshold !== null ? ` · threshold ${fmt(flag.threshold)}` : ""}
          </p>
          {flag.message ? <p className="mt-1 text-xs text-ink-700">{flag.message}</p> : null}
        </div>
        {flag.status === "open" && flag.severity !== "block" ? (
          <span className="shrink-0 rounded border border-ink-300 bg-ink-50 px-2 py-0.5 text-xs font-semibold text-ink-700">No decision needed</span>
        ) : (
          <span className={`shrink-0 rounded border px-2 py-0.5 text-xs font-semibold ${STATUS_TONE[flag.status]}`}>{STATUS_WORDS[flag.status]}</span>
        )}
      </div>
      {flag.decision ? (
        <p className="mt-2 rounded bg-ink-50 px-2 py-1 text-xs text-ink-800">
          {flag.decision === "waived" ? "Waived" : "Marked must-fix"} by {flag.decidedBy ?? "?"} {flag.decidedAt ? `on ${formatWhen(flag.decidedAt)}` : ""}
          {flag.justification ? <>: “{flag.justification}”</> : null}
        </p>
      ) : null}
      {canDispose && flag.status !== "fixed" ? (
        <details className="mt-1 text-sm" open={flag.status === "open" && flag.severity === "block"}>
          <summary className="cursor-pointer text-stream-700">{flag.decision ? "Change the decision" : "Decide"}</summary>
          <DispositionForm flag={flag} where={where} version={version} />
        </details>
      ) : null}
    </li>
  );
}

function CommentForm({ where, parentId, segmentId, label, compact = false }: { where: ReviewWhere; parentId?: number; segmentId?: string | null; label: string; compact?: boolean }) {
  const id = useId();
  return (
    <ActionForm action={commentAction} submitLabel={label} busyLabel="Posting…" className="space-y-2" submitClassName="btn-quiet px-3 py-1.5">
      {(errors) => (
        <>
          <Hidden where={where} extra={parentId ? { parentId } : {}} />
          {!parentId ? <input type="hidden" name="segmentId" value={segmentId ?? ""} /> : null}
          <div>
            <label htmlFor={`${id}-b`} className={compact ? "sr-only" : "block text-sm font-medium text-ink-800"}>
              {parentId ? "Reply" : "Comment"}
            </label>
            <textarea id={`${id}-b`} name="body" rows={compact ? 2 : 3} className="field-input text-sm" aria-invalid={errors.body ? true : undefined} placeholder={parentId ? "Reply…" : "Write a comment; @Name or @e-mail notifies a member."} />
          </div>
          {!parentId ? (
            <fieldset className="text-xs text-ink-700">
              <legend className="mb-1">
                Pin: {segmentId ? <>segment <span className="font-mono font-semibold">{segmentId}</span> (selected on the drawing)</> : "select a segment on the drawing, or give a point"}
              </legend>
              {!segmentId ? (
                <div className="flex gap-2">
                  <label className="inline-flex items-center gap-1">
                    x <input name="xMm" inputMode="decimal" className="field-input w-24 px-2 py-1 text-xs" aria-label="Pin x in millimetres" /> mm
                  </label>
                  <label className="inline-flex items-center gap-1">
                    y <input name="yMm" inputMode="decimal" className="field-input w-24 px-2 py-1 text-xs" aria-label="Pin y in millimetres" /> mm
                  </label>
                </div>
              ) : null}
            </fieldset>
          ) : null}
        </>
      )}
    </ActionForm>
  );
}

function ResolveButton({ where, comment }: { where: ReviewWhere; comment: ReviewCommentItem }) {
  return (
    <ActionForm
      action={resolveCommentAction}
      submitLabel={comment.resolved ? "Open again" : "Resolve"}
      busyLabel="Saving…"
      className="inline"
      submitClassName="text-xs font-semibold text-stream-700 underline"
    >
      {() => <Hidden where={where} extra={{ commentId: comment.id, resolved: comment.resolved ? "false" : "true" }} />}
    </ActionForm>
  );
}

function Comments({ where, comments, canComment, selectedId, onSelect }: { where: ReviewWhere; comments: ReviewCommentItem[]; canComment: boolean; selectedId: string | null; onSelect: (id: string | null) => void }) {
  const [showResolved, setShowResolved] = useState(false);
  const threads = comments.filter((c) => c.parentId === null);
  const replies = (id: number) => comments.filter((c) => c.parentId === id);
  const visible = threads.filter((t) => showResolved || !t.resolved);
  const resolvedCount = threads.filter((t) => t.resolved).length;
  return (
    <section aria-labelledby="comments-title" className="panel p-4">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="comments-title" className="text-base font-semibold text-ink-900">
          Comments <span className="font-normal text-ink-600">({threads.length - resolvedCount} open, {resolvedCount} resolved)</span>
        </h2>
        {resolvedCount > 0 ? (
          <label className="inline-flex items-center gap-1.5 text-xs text-ink-700">
            <input type="checkbox" checked={showResolved} onChange={(e) => setShowResolved(e.target.checked)} /> Show resolved
          </label>
        ) : null}
      </div>
      {visible.length === 0 ? <p className="mb-3 text-sm text-ink-600">No open comments.</p> : null}
      <ol className="space-y-3">
        {visible.map((t) => (
          <li key={t.id} className={`rounded-md border p-3 ${t.segmentId && t.segmentId === selectedId ? "border-stream-600" : "border-ink-200"} ${t.resolved ? "bg-ink-50" : "bg-white"}`} data-testid="review-comment">
            <div className="flex flex-wrap items-baseline justify-between gap-2 text-xs text-ink-600">
              <span>
                <span className="font-semibold text-ink-900">{t.author}</span> · {formatWhen(t.createdAt)}
                {t.segmentId ? (
                  <>
                    {" "}
                    · on{" "}
                    <button type="button" className="font-mono text-stream-700 underline decoration-dotted" onClick={() => onSelect(t.segmentId)} aria-label={`Show segment ${t.segmentId} on the drawing`}>
                      {t.segmentId}
                    </button>
                  </>
                ) : null}
                {t.pointMm ? ` · at (${t.pointMm.x.toFixed(3)}, ${t.pointMm.y.toFixed(3)}) mm` : null}
                {t.resolved ? <span className="ml-1 font-semibold text-stream-800">· Resolved</span> : null}
              </span>
              {canComment ? <ResolveButton where={where} comment={t} /> : null}
            </div>
            <p className="mt-1 whitespace-pre-wrap text-sm text-ink-900">{t.body}</p>
            {replies(t.id).length > 0 ? (
              <ol className="mt-2 space-y-2 border-l-2 border-ink-200 pl-3">
                {replies(t.id).map((r) => (
                  <li key={r.id} className="text-sm">
                    <p className="text-xs text-ink-600">
                      <span className="font-semibold text-ink-900">{r.author}</span> · {formatWhen(r.createdAt)}
                    </p>
                    <p className="whitespace-pre-wrap text-ink-900">{r.body}</p>
                  </li>
                ))}
              </ol>
            ) : null}
            {canComment ? (
              <details className="mt-2 text-sm">
                <summary className="cursor-pointer text-stream-700">Reply</summary>
                <div className="mt-2">
                  <CommentForm where={where} parentId={t.id} label="Post reply" compact />
                </div>
              </details>
            ) : null}
          </li>
        ))}
      </ol>
      {canComment ? (
        <div className="mt-4 border-t border-ink-200 pt-3">
          <CommentForm where={where} segmentId={selectedId} label="Post comment" />
        </div>
      ) : (
        <p className="mt-3 text-xs text-ink-600">Leads read comments; a member with a working role writes them.</p>
      )}
    </section>
  );
}

export function ReviewScreen(props: {
  where: ReviewWhere;
  version: number;
  analysis: AnalyzeJson | null;
  title: string;
  flags: ReviewFlagItem[];
  canDispose: boolean;
  canComment: boolean;
  comments: ReviewCommentItem[];
  flagsHeading: string;
}) {
  const { where, version, analysis, flags, canDispose, canComment, comments, title, flagsHeading } = props;
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const markers = useMemo(() => (analysis ? flagMarkers(analysis) : []), [analysis]);
  const pinned = useMemo(() => new Set(comments.filter((c) => c.segmentId && !c.resolved).map((c) => c.segmentId!)), [comments]);
  // The fab liaison's findings: the process profile's fabrication rules and pressure against bond strength.
  const isFab = (f: ReviewFlagItem) => f.family === "fabrication" || f.code === "pressure_bond";
  const fluidics = flags.filter((f) => !isFab(f));
  const fab = flags.filter(isFab);
  const open = flags.filter((f) => f.status === "open" && f.severity === "block").length;
  const section = (heading: string, list: ReviewFlagItem[], testId: string, empty: string) => (
    <section aria-label={heading} data-testid={testId}>
      <h3 className="mb-2 text-sm font-semibold text-ink-900">
        {heading} <span className="font-normal text-ink-600">({list.length})</span>
      </h3>
      {list.length === 0 ? <p className="text-sm text-ink-600">{empty}</p> : null}
      <ul className="space-y-2">
        {list.map((f) => (
          <FlagRow key={f.flagKey} flag={f} where={where} version={version} canDispose={canDispose} selected={f.segmentId !== null && f.segmentId === selectedId} onSelect={setSelectedId} />
        ))}
      </ul>
    </section>
  );
  return (
    <div className="space-y-4">
      {analysis ? (
        <div className="space-y-1">
          <ChipDrawing
            analysis={analysis}
            colourOf={(id) => (pinned.has(id) ? "#a86400" : "#3b6f9e")}
            colourKey={[...pinned].join(",")}
            selectedId={selectedId}
            onSelect={setSelectedId}
            markers={markers}
            describe={(id) => <span className="font-mono">{id}</span>}
            label={`Drawing of ${title} with its flags; segments with open comments in amber`}
          />
          <p aria-live="polite" className="min-h-[1.25rem] text-xs text-ink-800" data-testid="review-selection">
            {selectedId ? (
              <>
                Selected <span className="font-mono font-semibold">{selectedId}</span>; a new comment is pinned to it.{" "}
                <button type="button" onClick={() => setSelectedId(null)} className="text-stream-700 underline">
                  Clear selection
                </button>
              </>
            ) : (
              "Click a segment to pin a comment to it. Amber segments carry open comments."
            )}
          </p>
        </div>
      ) : null}
      <section aria-labelledby="flags-title" className="panel space-y-4 p-4">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="flags-title" className="text-base font-semibold text-ink-900">
            {flagsHeading}
          </h2>
          <p className="text-xs text-ink-700" data-testid="open-blocks">
            {open === 0 ? "No blocking flag is open." : `${open} blocking flag(s) still open.`}
          </p>
        </div>
        {section("Regime and pressure", fluidics, "flags-fluidics", "No regime or pressure rule raised a flag.")}
        {section("Fabrication rules and bond strength (process profile)", fab, "flags-fab", "No fabrication rule raised a flag for this process.")}
      </section>
      <Comments where={where} comments={comments} canComment={canComment} selectedId={selectedId} onSelect={setSelectedId} />
    </div>
  );
}
