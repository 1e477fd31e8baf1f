"use client";
/**
 * Every computed field of every segment, in the user's units, with sorting,
 * filters (flagged only, one layer, id search), a column chooser and a CSV
 * export of exactly the rows and columns shown (all pages). Selecting a row
 * selects the segment on the drawing; a selection made elsewhere brings its
 * row into view. This table is also the drawing's text alternative.
 */
import { useEffect, useMemo, useRef, useState } from "react";
import {
  flexRender,
  getCoreRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
  type VisibilityState,
} from "@tanstack/react-table";
import { formatCsv } from "@/lib/analysis/csv";
import { formatEngineering } from "@/lib/analysis/quantities";
import type { AnalyzeSegmentJson } from "@/lib/analysis/serialize";
import { formatNumber, type FieldView } from "./fields";
import { FlagIcon } from "./flag-marker";
import { SEVERITY_LABEL, SEVERITY_ORDER, type Severity } from "./types";

const PAGE_SIZE = 50;

/** Columns hidden until chosen: the secondary ones, to keep the first view readable. */
const HIDDEN_BY_DEFAULT = ["end_width", "from", "to", "section", "weber", "diffusion_time", "entrance_length", "min_bend_radius", "hydraulic_diameter", "pressure"];

export interface SegmentTableProps {
  id: string;
  segments: AnalyzeSegmentJson[];
  fields: FieldView[];
  flagsBySegment: Map<string, Severity[]>;
  selectedId: string | null;
  onSelect: (segmentId: string | null) => void;
  exportName: string;
}

/** Short on-screen header; the long one (the catalogue's) is its title and the CSV's header. */
function header(f: FieldView): string {
  return f.unitLabel ? `${f.short} (${f.unitLabel})` : f.short;
}

export function SegmentTable({ id, segments, fields, flagsBySegment, selectedId, onSelect, exportName }: SegmentTableProps) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [visibility, setVisibility] = useState<VisibilityState>(() => Object.fromEntries(HIDDEN_BY_DEFAULT.map((k) => [k, false])));
  const [onlyFlagged, setOnlyFlagged] = useState(false);
  const [layer, setLayer] = useState("");
  const [search, setSearch] = useState("");
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize: PAGE_SIZE });
  const selectedRowRef = useRef<HTMLTableRowElement>(null);
  const scrollRef = useRef<HTMLDivElement>(null);

  const layers = useMemo(() => [...new Set(segments.map((s) => s.layer))].sort(), [segments]);

  const data = useMemo(() => {
    const q = search.trim().toLowerCase();
    return segments.filter(
      (s) => (!onlyFlagged || flagsBySegment.has(s.id)) && (!layer || s.layer === layer) && (!q || s.id.toLowerCase().includes(q)),
    );
  }, [segments, onlyFlagged, layer, search, flagsBySegment]);

  const columns = useMemo<ColumnDef<AnalyzeSegmentJson>[]>(() => {
    const cols: ColumnDef<AnalyzeSegmentJson>[] = fields.map((f) => ({
      id: f.key,
      header: header(f),
      meta: { field: f },
      accessorFn: (s: AnalyzeSegmentJson) => {
        const v = f.value(s);
        return typeof v === "number" ? f.toDisplay(v) : v;
      },
      sortUndefined: "last",
      sortingFn: f.kind === "text" ? "alphanumeric" : "basic",
      cell: (ctx) => {
        const v = ctx.getValue() as number | string | null;
        if (f.key === "id") {
          const selected = ctx.row.original.id === selectedId;
          return (
            <button
              type="button"
              aria-pressed={selected}
              onClick={(e) => {
                e.stopPropagation();
                onSelect(selected ? null : ctx.row.original.id);
              }}
              className="rounded px-1 font-mono font-semibold text-stream-700 underline decoration-dotted underline-offset-2 hover:text-stream-800 focus-visible:outline-2 focus-visible:outline-stream-600"
            >
              {String(v)}
            </button>
          );
        }
        return typeof v === "number" ? formatNumber(v) : v === null ? "—" : String(v);
      },
    }));
    cols.push({
      id: "flags",
      header: "Flags",
      accessorFn: (s) => rank(flagsBySegment.get(s.id)),
      cell: (ctx) => <FlagCell severities={flagsBySegment.get(ctx.row.original.id)} />,
    });
    return cols;
  }, [fields, flagsBySegment, selectedId, onSelect]);

  const table = useReactTable({
    data,
    columns,
    state: { sorting, columnVisibility: visibility, pagination },
    onSortingChange: setSorting,
    onColumnVisibilityChange: setVisibility,
    onPaginationChange: setPagination,
    getRowId: (s) => s.id,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    autoResetPageIndex: true,
  });

  // Bring the selected segment's row into view: turn to its page, then scroll to it.
  const sortedRows = table.getSortedRowModel().rows;
  useEffect(() => {
    if (!selectedId) return;
    const at = sortedRows.findIndex((r) => r.id === selectedId);
    if (at < 0) return;
    const page = Math.floor(at / PAGE_SIZE);
    setPagination((p) => (p.pageIndex === page ? p : { ...p, pageIndex: page }));
  }, [selectedId, sortedRows]);
  // Scroll the table's own box only: moving the window would carry the drawing out of sight.
  useEffect(() => {
    const box = scrollRef.current;
    const row = selectedRowRef.current;
    if (!box || !row) return;
    const b = box.getBoundingClientRect();
    const r = row.getBoundingClientRect();
    const head = box.querySelector("thead")?.getBoundingClientRect().height ?? 0;
    if (r.top < b.top + head) box.scrollTop -= b.top + head - r.top;
    else if (r.bottom > b.bottom) box.scrollTop += r.bottom - b.bottom;
  }, [selectedId, pagination.pageIndex]);

  const exportCsv = () => {
    const cols = table.getVisibleLeafColumns();
    const head = cols.map((c) => (c.id === "flags" ? "Flags" : (c.columnDef.meta as { field: FieldView }).field.header));
    // The digits shown on screen (engineering precision), in the units shown, rows in the order shown.
    const rows = sortedRows.map((r) =>
      cols.map((c) => {
        if (c.id === "flags") return (flagsBySegment.get(r.original.id) ?? []).join(" ");
        const v = r.getValue(c.id) as number | string | null;
        return typeof v === "number" ? formatEngineering(v) : v;
      }),
    );
    const text = formatCsv([head, ...rows]);
    const url = URL.createObjectURL(new Blob([text], { type: "text/csv;charset=utf-8" }));
    const a = document.createElement("a");
    a.href = url;
    a.download = `${exportName}-segments.csv`;
    document.body.appendChild(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  const pageCount = table.getPageCount();

  return (
    <section aria-labelledby={`${id}-title`} className="rounded-md border border-ink-200 bg-white">
      <div className="flex flex-wrap items-end gap-3 border-b border-ink-100 px-3 py-2">
        <h2 id={`${id}-title`} className="mr-auto text-sm font-semibold text-ink-900">
          Segments <span className="font-normal text-ink-600">({data.length} of {segments.length} shown)</span>
        </h2>
        <label className="flex items-center gap-1.5 text-xs text-ink-800">
          <input type="checkbox" checked={onlyFlagged} onChange={(e) => setOnlyFlagged(e.target.checked)} className="accent-stream-600" />
          Only flagged
        </label>
        <label className="flex items-center gap-1.5 text-xs text-ink-800">
          Layer
          <select value={layer} onChange={(e) => setLayer(e.target.value)} className="rounded border border-ink-300 bg-white px-1.5 py-1 text-xs">
            <option value="">All layers</option>
            {layers.map((l) => (
              <option key={l} value={l}>{l}</option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-1.5 text-xs text-ink-800">
          Find segment
          <input type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="id" className="w-24 rounded border border-ink-300 px-1.5 py-1 text-xs" />
        </label>
        <details className="relative text-xs">
          <summary className="cursor-pointer list-none rounded border border-ink-300 px-2 py-1 text-ink-800 hover:bg-ink-50 focus-visible:outline-2 focus-visible:outline-stream-600">Columns…</summary>
          <fieldset className="absolute right-0 z-20 mt-1 grid max-h-72 w-64 grid-cols-1 gap-0.5 overflow-auto rounded border border-ink-200 bg-white p-2 shadow-lg">
            <legend className="sr-only">Columns to show</legend>
            {table.getAllLeafColumns().filter((c) => c.id !== "id").map((c) => {
              const f = (c.columnDef.meta as { field?: FieldView } | undefined)?.field;
              return (
                <label key={c.id} className="flex items-center gap-1.5">
                  <input type="checkbox" checked={c.getIsVisible()} onChange={c.getToggleVisibilityHandler()} className="accent-stream-600" />
                  {f ? `${f.label}${f.unitLabel ? ` (${f.unitLabel})` : ""}` : "Flags"}
                </label>
              );
            })}
          </fieldset>
        </details>
        <button type="button" onClick={exportCsv} className="rounded bg-stream-600 px-2.5 py-1 text-xs font-medium text-white hover:bg-stream-700 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-stream-600">
          Export CSV
        </button>
      </div>
      <div ref={scrollRef} className="relative max-h-[28rem] overflow-auto">
        <table id={id} className="w-full border-collapse text-xs tabular-nums">
          <caption className="sr-only">Segment values in engineering units; sortable by the column buttons; the drawing shows the same segments.</caption>
          <thead className="sticky top-0 z-10 bg-ink-50">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th key={h.id} scope="col" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"} className="whitespace-nowrap border-b border-ink-200 px-2 py-1.5 text-left font-semibold text-ink-800">
                      <button type="button" title={(h.column.columnDef.meta as { field?: FieldView } | undefined)?.field?.header} onClick={h.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 rounded hover:text-stream-700 focus-visible:outline-2 focus-visible:outline-stream-600">
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true" className="text-ink-400">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => {
              const selected = row.id === selectedId;
              return (
                <tr
                  key={row.id}
                  ref={selected ? selectedRowRef : undefined}
                  data-segment={row.id}
                  data-selected={selected || undefined}
                  onClick={() => onSelect(row.id)}
                  className={`cursor-pointer border-b border-ink-100 ${selected ? "bg-stream-100 outline outline-2 -outline-offset-2 outline-stream-600" : "hover:bg-ink-50"}`}
                >
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="whitespace-nowrap px-2 py-1 text-ink-900">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
            {data.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-6 text-center text-ink-600">No segment matches these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      {pageCount > 1 && (
        <nav aria-label="Table pages" className="flex items-center gap-2 border-t border-ink-100 px-3 py-1.5 text-xs text-ink-800">
          <button type="button" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()} className="rounded border border-ink-300 px-2 py-0.5 disabled:opacity-40">Previous</button>
          <span>Page {pagination.pageIndex + 1} of {pageCount}</span>
          <button type="button" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()} className="rounded border border-ink-300 px-2 py-0.5 disabled:opacity-40">Next</button>
        </nav>
      )}
    </section>
  );
}

function rank(sev: Severity[] | undefined): number {
  if (!sev || sev.length === 0) return 0;
  return sev.includes("block") ? 3 : sev.includes("warn") ? 2 : 1;
}

function FlagCell({ severities }: { severities?: Severity[] }) {
  if (!severities || severities.length === 0) return <span className="text-ink-400">—</span>;
  return (
    <span className="inline-flex items-center gap-1.5">
      {SEVERITY_ORDER.filter((s) => severities.includes(s)).map((s) => {
        const n = severities.filter((x) => x === s).length;
        return (
          <span key={s} className="inline-flex items-center gap-0.5" title={SEVERITY_LABEL[s]}>
            <FlagIcon severity={s} size={11} />
            <span>{n}</span>
            <span className="sr-only">{SEVERITY_LABEL[s]}</span>
          </span>
        );
      })}
    </span>
  );
}
