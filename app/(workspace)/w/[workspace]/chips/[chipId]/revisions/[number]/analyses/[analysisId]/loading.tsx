export default function Loading() {
  return (
    <div aria-busy="true" className="space-y-3">
      <p className="sr-only">Loading the analysis…</p>
      <div className="h-8 w-80 animate-pulse rounded bg-ink-100" />
      <div className="grid gap-4 lg:grid-cols-[3fr_2fr]">
        <div className="panel h-[480px] animate-pulse bg-ink-50" />
        <div className="panel h-[480px] animate-pulse bg-ink-50" />
      </div>
      <div className="panel h-64 animate-pulse bg-ink-50" />
    </div>
  );
}
