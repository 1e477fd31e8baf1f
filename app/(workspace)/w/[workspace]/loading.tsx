/** Skeleton while a workspace page loads on the server. */
export default function Loading() {
  return (
    <div aria-busy="true" aria-live="polite" className="animate-pulse">
      <span className="sr-only">Loading…</span>
      <div className="mb-6 border-b border-ink-200 pb-4">
        <div className="h-7 w-64 rounded bg-ink-200" />
        <div className="mt-3 h-4 w-96 max-w-full rounded bg-ink-100" />
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        <div className="h-36 rounded-lg bg-white" />
        <div className="h-36 rounded-lg bg-white" />
      </div>
    </div>
  );
}
