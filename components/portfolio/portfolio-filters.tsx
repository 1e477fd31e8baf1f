import { STATUS_LABELS, type ReviewStatus } from "@/lib/review/machine";
import { PORTFOLIO_STATE_FILTERS } from "@/lib/reports/figures";

/** Filter by state and search by name; a plain GET form, so the filter lives in the URL and works without script. */
export function PortfolioFilters({ action, state, query }: { action: string; state: string; query: string }) {
  return (
    <form action={action} method="get" role="search" className="mb-6 flex flex-wrap items-end gap-3" aria-label="Filter the portfolio">
      <label className="text-sm">
        <span className="block font-medium text-ink-800">Search by name</span>
        <input type="search" name="q" defaultValue={query} className="mt-1 w-64 rounded border border-ink-300 px-2 py-1.5" placeholder="e.g. mixer" />
      </label>
      <label className="text-sm">
        <span className="block font-medium text-ink-800">Review state</span>
        <select name="state" defaultValue={state} className="mt-1 rounded border border-ink-300 px-2 py-1.5">
          <option value="">Any state</option>
          {PORTFOLIO_STATE_FILTERS.map((s) => (
            <option key={s} value={s}>
              {s === "none" ? "No revision yet" : STATUS_LABELS[s as ReviewStatus]}
            </option>
          ))}
        </select>
      </label>
      <button type="submit" className="btn-primary">
        Apply
      </button>
      {state || query ? (
        <a className="btn-quiet" href={action}>
          Clear
        </a>
      ) : null}
    </form>
  );
}
