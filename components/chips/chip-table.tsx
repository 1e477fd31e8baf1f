"use client";
/**
 * The chip list: a @tanstack/react-table table fed by TanStack Query from
 * GET /api/v1/workspaces/:id/chips (the server renders the first page with the
 * same rows). Search text and sort live in the URL (?q=, ?sort=, ?dir=).
 */
import { useQuery } from "@tanstack/react-query";
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from "@tanstack/react-table";
import Link from "next/link";
import { usePathname, useSearchParams } from "next/navigation";
import { useMemo, useState } from "react";
import { Notice } from "@/components/ui/notice";
import { chipHref, formatWhen, revisionHref } from "./format";
import { reviewStateLabel, ReviewStateBadge } from "./review-state";
import { SEVERITY_RANK, SeverityBadge } from "./severity-badge";

/** One row as GET /api/v1/workspaces/:id/chips returns it (lib/chips/views.ts chipListView). */
export interface ChipListRow {
  id: number;
  name: string;
  purpose: string;
  last_activity_at: string;
  latest_revision: number | null;
  latest_state: string | null;
  worst_flag: string | null;
  revisions: number;
}

export const SORTABLE = ["name", "purpose", "latest_revision", "latest_state", "worst_flag", "last_activity_at"] as const;

export function chipsQueryKey(workspaceId: number) {
  return ["chips", workspaceId] as const;
}

async function fetchChips(workspaceId: number): Promise<ChipListRow[]> {
  const res = await fetch(`/api/v1/workspaces/${workspaceId}/chips`, { headers: { accept: "application/json" } });
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new Error(body?.error?.message ?? `The chip list could not be loaded (HTTP ${res.status}).`);
  return body.chips as ChipListRow[];
}

export function ChipTable({ workspaceId, slug, initialRows }: { workspaceId: number; slug: string; initialRows: ChipListRow[] }) {
  const pathname = usePathname();
  const params = useSearchParams();
  const query = useQuery({ queryKey: chipsQueryKey(workspaceId), queryFn: () => fetchChips(workspaceId), initialData: initialRows });
  const [search, setSearch] = useState(params.get("q") ?? "");
  const sortParam = params.get("sort");
  const descending = params.get("dir") === "desc";
  // Memoised: a fresh array each render makes the table recompute and re-render without end.
  const sorting: SortingState = useMemo(
    () => (SORTABLE.includes(sortParam as (typeof SORTABLE)[number]) ? [{ id: sortParam!, desc: descending }] : [{ id: "last_activity_at", desc: true }]),
    [sortParam, descending],
  );

  const writeParams = (next: Record<string, string | null>) => {
    const sp = new URLSearchParams(params.toString());
    for (const [k, v] of Object.entries(next)) {
      if (v === null || v === "") sp.delete(k);
      else sp.set(k, v);
    }
    const qs = sp.toString();
    // Search and sort run in the browser: update the address without a server round trip (Next keeps useSearchParams in step).
    window.history.replaceState(null, "", qs ? `${pathname}?${qs}` : pathname);
  };

  const columns = useMemo<ColumnDef<ChipListRow>[]>(
    () => [
      {
        id: "name",
        accessorKey: "name",
        header: "Chip",
        cell: ({ row }) => (
          <Link href={chipHref(slug, row.original.id)} className="font-semibold" data-testid="chip-link">
            {row.original.name}
          </Link>
        ),
      },
      { id: "purpose", accessorKey: "purpose", header: "Purpose", cell: ({ getValue }) => <span className="text-ink-700">{String(getValue() || "—")}</span> },
      {
        id: "latest_revision",
        accessorFn: (r) => r.latest_revision ?? -1,
        header: "Latest revision",
        cell: ({ row }) =>
          row.original.latest_revision === null ? (
            <span className="text-ink-500">None yet</span>
          ) : (
            <Link href={revisionHref(slug, row.original.id, row.original.latest_revision)}>
              Rev {row.original.latest_revision}
              <span className="text-ink-500"> of {row.original.revisions}</span>
            </Link>
          ),
      },
      {
        id: "latest_state",
        accessorFn: (r) => reviewStateLabel(r.latest_state),
        header: "Review state",
        cell: ({ row }) => <ReviewStateBadge state={row.original.latest_state} />,
      },
      {
        id: "worst_flag",
        accessorFn: (r) => SEVERITY_RANK[r.worst_flag ?? ""] ?? 9,
        header: "Worst flag",
        cell: ({ row }) => <SeverityBadge severity={row.original.worst_flag} />,
      },
      {
        id: "last_activity_at",
        accessorKey: "last_activity_at",
        header: "Last activity",
        cell: ({ getValue }) => <time dateTime={String(getValue())} className="whitespace-nowrap text-ink-700">{formatWhen(String(getValue()))}</time>,
      },
    ],
    [slug],
  );

  const table = useReactTable({
    data: query.data ?? [],
    columns,
    state: { sorting, globalFilter: params.get("q") ?? "" },
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const first = next[0];
      writeParams(first ? { sort: first.id, dir: first.desc ? "desc" : "asc" } : { sort: null, dir: null });
    },
    globalFilterFn: (row, _id, value: string) => {
      const needle = value.trim().toLowerCase();
      if (!needle) return true;
      return `${row.original.name} ${row.original.purpose}`.toLowerCase().includes(needle);
    },
    autoResetPageIndex: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const rows = table.getRowModel().rows;

  return (
    <div className="space-y-3">
      <form
        role="search"
        className="flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          writeParams({ q: search.trim() || null });
        }}
      >
        <div className="w-72">
          <label htmlFor="chip-search" className="mb-1 block text-sm font-medium text-ink-800">
            Search chips
          </label>
          <input
            id="chip-search"
            type="search"
            className="field-input"
            placeholder="Name or purpose"
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              writeParams({ q: e.target.value.trim() || null });
            }}
          />
        </div>
        <button type="button" className="btn-quiet" onClick={() => query.refetch()} disabled={query.isFetching}>
          {query.isFetching ? "Refreshing…" : "Refresh"}
        </button>
      </form>
      {query.isError ? <Notice tone="error" title="Could not refresh the list">{query.error.message} The rows below may be out of date.</Notice> : null}
      <div className="panel overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="chip-table">
          <caption className="sr-only">Chips in this workspace; column headers sort the list.</caption>
          <thead className="border-b border-ink-200 bg-ink-50 text-xs uppercase tracking-wide text-ink-600">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const dir = h.column.getIsSorted();
                  return (
                    <th key={h.id} scope="col" className="px-4 py-2 font-semibold" aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : "none"}>
                      <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink-900" onClick={h.column.getToggleSortingHandler()}>
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true" className="text-ink-400">
                          {dir === "asc" ? "▲" : dir === "desc" ? "▼" : "↕"}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-ink-100 last:border-0 hover:bg-ink-50" data-testid="chip-row">
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-4 py-3 align-top">
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-4 py-6 text-center text-ink-600">
                  No chip matches “{params.get("q")}”. Clear the search to see every chip.
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
    </div>
  );
}
