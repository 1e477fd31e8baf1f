import { STATUS_LABELS, type ReviewStatus } from "@/lib/review/machine";

const TONE: Record<ReviewStatus, string> = {
  draft: "border-ink-300 bg-ink-50 text-ink-800",
  with_fluidics: "border-note-600 bg-note-100 text-note-800",
  with_fab: "border-note-600 bg-note-100 text-note-800",
  changes_requested: "border-heed-600 bg-heed-100 text-heed-800",
  cleared: "border-stream-600 bg-stream-50 text-stream-800",
  withdrawn: "border-ink-300 bg-ink-100 text-ink-600",
};

/** The review state in our words, as a small badge. */
export function ReviewStatusBadge({ status }: { status: string }) {
  const s = (status in STATUS_LABELS ? status : "draft") as ReviewStatus;
  return (
    <span className={`inline-flex items-center rounded border px-2 py-0.5 text-xs font-semibold ${TONE[s]}`} data-testid="review-status" data-status={s}>
      {STATUS_LABELS[s]}
    </span>
  );
}
