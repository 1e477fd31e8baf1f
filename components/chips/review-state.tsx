import { STATUS_LABELS, type ReviewStatus } from "@/lib/review/machine";

const TONE: Record<ReviewStatus, string> = {
  draft: "border-ink-300 bg-ink-100 text-ink-800",
  with_fluidics: "border-note-600 bg-note-100 text-note-800",
  with_fab: "border-note-600 bg-note-100 text-note-800",
  changes_requested: "border-heed-600 bg-heed-100 text-heed-800",
  cleared: "border-stream-600 bg-stream-50 text-stream-800",
  withdrawn: "border-ink-300 bg-white text-ink-600 line-through",
};

export function reviewStateLabel(state: string | null | undefined): string {
  return state && state in STATUS_LABELS ? STATUS_LABELS[state as ReviewStatus] : "—";
}

/** A revision's review state as a small label. */
export function ReviewStateBadge({ state }: { state: string | null | undefined }) {
  if (!state || !(state in STATUS_LABELS)) return <span className="text-sm text-ink-500">No revision yet</span>;
  return (
    <span className={`inline-block rounded border px-2 py-0.5 text-xs font-medium ${TONE[state as ReviewStatus]}`} data-review-state={state}>
      {STATUS_LABELS[state as ReviewStatus]}
    </span>
  );
}
