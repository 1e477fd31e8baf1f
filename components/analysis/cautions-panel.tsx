/** The lumped model's limits and the usual safety cautions: always shown beside the numbers, never folded away. */
export function CautionsPanel({ cautions, className = "" }: { cautions: readonly string[]; className?: string }) {
  return (
    <aside aria-label="Limits of these figures" className={`rounded-md border border-heed-600/40 bg-heed-100/60 p-3 text-xs text-ink-900 ${className}`}>
      <h2 className="mb-1 text-sm font-semibold text-heed-800">Before you rely on these figures</h2>
      <ul className="list-disc space-y-1 pl-4">
        {cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </aside>
  );
}
