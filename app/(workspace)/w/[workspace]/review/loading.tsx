export default function Loading() {
  return (
    <div aria-busy="true" aria-live="polite" className="space-y-3">
      <p className="sr-only">Loading…</p>
      <div className="h-8 w-48 animate-pulse rounded bg-ink-100" />
      <div className="h-4 w-96 animate-pulse rounded bg-ink-100" />
      <div className="panel h-64 animate-pulse bg-ink-50" />
    </div>
  );
}
