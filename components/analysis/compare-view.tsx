"use client";
/**
 * What changed between the revision (or operating point) being viewed and
 * another: geometry matched by position (lib/analysis/compare.ts), port
 * pressures and flows by name, flags raised and cleared. A table here and an
 * overlay on the drawing (toggled by the workbench).
 */
import { useId } from "react";
import type { AnalysisComparison, ValueDelta } from "@/lib/analysis/compare";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import type { DrawingOverlay } from "./chip-drawing";
import { formatNumber, type FieldView } from "./fields";
import { FlagIcon } from "./flag-marker";
import { asSeverity, type AnalysisLabels } from "./types";

/** The drawing overlay for a comparison of `other` (A, before) against the shown analysis (B). */
export function overlayFromComparison(cmp: AnalysisComparison, other: AnalyzeJson): DrawingOverlay {
  const otherById = new Map(other.segments.map((s) => [s.id, s]));
  return {
    removed: cmp.segments.removed.flatMap((id) => {
      const s = otherById.get(id);
      return s ? [{ key: `rm-${id}`, path_m: s.path_m, width_m: (s.width_m + s.end_width_m) / 2 }] : [];
    }),
    added: new Set(cmp.segments.added),
    changed: new Set(cmp.segments.changed.map((m) => m.b)),
  };
}

export interface CompareViewProps {
  comparison: AnalysisComparison;
  labels: AnalysisLabels;
  otherLabels: AnalysisLabels;
  lengthField: FieldView;
  widthField: FieldView;
  pressure: { unitLabel: string; toDisplay: (pa: number) => number };
  flow: { unitLabel: string; toDisplay: (si: number) => number };
  showOverlay: boolean;
  onShowOverlay: (on: boolean) => void;
  onSelect: (segmentId: string) => void;
  closeHref?: string;
}

function delta(d: ValueDelta | undefined | null, toDisplay: (x: number) => number): string {
  if (!d) return "—";
  const sign = d.delta > 0 ? "+" : "";
  return `${formatNumber(toDisplay(d.a))} → ${formatNumber(toDisplay(d.b))} (${sign}${formatNumber(toDisplay(d.delta))})`;
}

export function CompareView(props: CompareViewProps) {
  const { comparison: c, labels, otherLabels, lengthField, widthField, pressure, flow, showOverlay, onShowOverlay, onSelect, closeHref } = props;
  const titleId = useId();
  const other = `${otherLabels.chip} ${otherLabels.revision}${otherLabels.operatingPoint ? ` · ${otherLabels.operatingPoint}` : ""}`;
  const here = `${labels.revision}${labels.operatingPoint ? ` · ${labels.operatingPoint}` : ""}`;
  const nothing = c.segments.added.length + c.segments.removed.length + c.segments.changed.length + c.ports.changed.length + c.ports.added.length + c.ports.removed.length + c.flags.added.length + c.flags.removed.length === 0;

  return (
    <section aria-labelledby={titleId} className="rounded-md border border-ink-200 bg-white p-3" data-testid="compare-view">
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <h2 id={titleId} className="mr-auto text-sm font-semibold text-ink-900">
          Changes from {other} to {here}
        </h2>
        <label className="flex items-center gap-1.5 text-xs text-ink-800">
          <input type="checkbox" checked={showOverlay} onChange={(e) => onShowOverlay(e.target.checked)} className="accent-stream-600" />
          Show on the drawing
        </label>
        {closeHref && <a href={closeHref} className="text-xs text-stream-700 underline hover:text-stream-800">Close comparison</a>}
      </div>
      <p className="mb-2 text-xs text-ink-700">
        <OverlayKey colour="#0c6a5c" dash={false} /> {c.segments.added.length} added · <OverlayKey colour="#b8321a" dash /> {c.segments.removed.length} removed ·{" "}
        <OverlayKey colour="#a86400" dash /> {c.segments.changed.length} changed · {c.segments.matched.length - c.segments.changed.length} unchanged (segments matched by position, not by id)
      </p>
      {nothing && <p className="text-sm text-ink-700">No difference in geometry, ports or flags within the comparison tolerances.</p>}

      {c.segments.changed.length > 0 && (
        <div className="relative mb-3 max-h-64 overflow-auto">
          <table className="w-full text-xs tabular-nums">
            <caption className="mb-1 text-left font-medium text-ink-800">Changed segments</caption>
            <thead className="bg-ink-50 text-left text-ink-800">
              <tr>
                <th scope="col" className="px-2 py-1">Segment (now / before)</th>
                <th scope="col" className="px-2 py-1">{lengthField.short} ({lengthField.unitLabel})</th>
                <th scope="col" className="px-2 py-1">Width ({widthField.unitLabel})</th>
                <th scope="col" className="px-2 py-1">Depth ({widthField.unitLabel})</th>
                <th scope="col" className="px-2 py-1">Other</th>
              </tr>
            </thead>
            <tbody>
              {c.segments.changed.map((m) => (
                <tr key={`${m.a}-${m.b}`} className="border-b border-ink-100">
                  <td className="px-2 py-1">
                    <button type="button" onClick={() => onSelect(m.b)} className="font-mono text-stream-700 underline decoration-dotted">{m.b}</button> / <span className="font-mono">{m.a}</span>
                  </td>
                  <td className="px-2 py-1">{delta(m.deltas.length_m, lengthField.toDisplay)}</td>
                  <td className="px-2 py-1">{delta(m.deltas.width_m ?? m.deltas.end_width_m, widthField.toDisplay)}</td>
                  <td className="px-2 py-1">{delta(m.deltas.depth_m, widthField.toDisplay)}</td>
                  <td className="px-2 py-1">
                    {[m.routeChanged && "route", m.layer && `layer ${m.layer.a} → ${m.layer.b}`, m.section && `section ${m.section.a} → ${m.section.b}`].filter(Boolean).join(", ") || "—"}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {(c.segments.added.length > 0 || c.segments.removed.length > 0) && (
        <p className="mb-3 text-xs text-ink-800">
          {c.segments.added.length > 0 && (
            <>
              Added:{" "}
              {c.segments.added.slice(0, 40).map((id) => (
                <button key={id} type="button" onClick={() => onSelect(id)} className="mr-1 font-mono text-stream-700 underline decoration-dotted">{id}</button>
              ))}
              {c.segments.added.length > 40 && `and ${c.segments.added.length - 40} more`}
            </>
          )}
          {c.segments.removed.length > 0 && <span className="ml-2">Removed (ids from {other}): <span className="font-mono">{c.segments.removed.slice(0, 40).join(", ")}</span>{c.segments.removed.length > 40 && ` and ${c.segments.removed.length - 40} more`}</span>}
        </p>
      )}

      {(c.ports.changed.length > 0 || c.ports.added.length > 0 || c.ports.removed.length > 0) && (
        <table className="mb-3 w-full text-xs tabular-nums">
          <caption className="mb-1 text-left font-medium text-ink-800">Ports</caption>
          <thead className="bg-ink-50 text-left text-ink-800">
            <tr>
              <th scope="col" className="px-2 py-1">Port</th>
              <th scope="col" className="px-2 py-1">Pressure ({pressure.unitLabel})</th>
              <th scope="col" className="px-2 py-1">Flow into chip ({flow.unitLabel})</th>
              <th scope="col" className="px-2 py-1">Other</th>
            </tr>
          </thead>
          <tbody>
            {c.ports.changed.map((p) => (
              <tr key={p.name} className="border-b border-ink-100">
                <td className="px-2 py-1 font-mono">{p.name}</td>
                <td className="px-2 py-1">{delta(p.pressurePa, pressure.toDisplay)}</td>
                <td className="px-2 py-1">{delta(p.flowM3PerS, flow.toDisplay)}</td>
                <td className="px-2 py-1">{[p.movedM !== null && `moved ${formatNumber(p.movedM * 1e6)} µm`, p.drive && `drive ${p.drive.a ?? "none"} → ${p.drive.b ?? "none"}`].filter(Boolean).join(", ") || "—"}</td>
              </tr>
            ))}
            {c.ports.added.map((n) => <tr key={`a${n}`}><td className="px-2 py-1 font-mono">{n}</td><td colSpan={3} className="px-2 py-1">new port</td></tr>)}
            {c.ports.removed.map((n) => <tr key={`r${n}`}><td className="px-2 py-1 font-mono">{n}</td><td colSpan={3} className="px-2 py-1">port removed</td></tr>)}
          </tbody>
        </table>
      )}

      {(c.flags.added.length > 0 || c.flags.removed.length > 0) && (
        <div className="grid gap-3 text-xs sm:grid-cols-2">
          <FlagChanges title="Newly raised" flags={c.flags.added} onSelect={onSelect} selectable />
          <FlagChanges title={`Cleared since ${otherLabels.revision}`} flags={c.flags.removed} onSelect={onSelect} selectable={false} />
        </div>
      )}
      <p className="mt-2 text-xs text-ink-600">{c.flags.unchanged.length} flag{c.flags.unchanged.length === 1 ? "" : "s"} raised in both.</p>
    </section>
  );
}

function FlagChanges({ title, flags, onSelect, selectable }: { title: string; flags: AnalysisComparison["flags"]["added"]; onSelect: (id: string) => void; selectable: boolean }) {
  return (
    <div>
      <h3 className="mb-1 font-medium text-ink-800">{title} ({flags.length})</h3>
      <ul className="space-y-0.5">
        {flags.map((f, i) => (
          <li key={`${f.code}-${i}`} className="flex items-start gap-1.5">
            <FlagIcon severity={asSeverity(f.severity)} size={11} />
            <span>
              {f.title}
              {f.target.kind === "segment" && f.target.id && (selectable ? (
                <button type="button" onClick={() => onSelect(f.target.id!)} className="ml-1 font-mono text-stream-700 underline decoration-dotted">{f.target.id}</button>
              ) : <span className="ml-1 font-mono">{f.target.id}</span>)}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}

function OverlayKey({ colour, dash }: { colour: string; dash: boolean }) {
  return (
    <svg width="22" height="8" aria-hidden="true" className="inline-block align-middle">
      <line x1="1" y1="4" x2="21" y2="4" stroke={colour} strokeWidth="4" strokeDasharray={dash ? "4 3" : undefined} />
    </svg>
  );
}
