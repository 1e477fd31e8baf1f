"use client";
/** The flags raised, grouped by severity; each one concerning a segment selects it. */
import { useId } from "react";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { RULES } from "@/lib/rules/registry";
import { formatNumber } from "./fields";
import { FlagIcon } from "./flag-marker";
import { asSeverity, SEVERITY_LABEL, SEVERITY_ORDER } from "./types";

const TONE = { block: "border-halt-600 bg-halt-100 text-halt-800", warn: "border-heed-600 bg-heed-100 text-heed-800", info: "border-note-600 bg-note-100 text-note-800" } as const;

type UnitView = { unitLabel: string; toDisplay: (si: number) => number };

const RULE_UNIT = new Map(RULES.map((r) => [r.code, r.thresholdUnit]));

/** A flag's value or threshold in the member's unit: pascals and metres are converted, other units are printed as the rule names them. */
function withUnit(x: number, code: string, pressure: UnitView, length: UnitView): string {
  const unit = RULE_UNIT.get(code) ?? "";
  if (/^Pa\b/.test(unit)) return `${formatNumber(pressure.toDisplay(x))} ${pressure.unitLabel}`;
  if (/^m\b/.test(unit)) return `${formatNumber(length.toDisplay(x))} ${length.unitLabel}`;
  return formatNumber(x);
}

export function FlagsList({ analysis, selectedId, onSelect, pressure, length }: { analysis: AnalyzeJson; selectedId: string | null; onSelect: (segmentId: string) => void; pressure: UnitView; length: UnitView }) {
  const titleId = useId();
  const groups = SEVERITY_ORDER.map((s) => ({ severity: s, flags: analysis.flags.map((f, i) => ({ f, i })).filter(({ f }) => asSeverity(f.severity) === s) }));
  return (
    <section aria-labelledby={titleId} className="rounded-md border border-ink-200 bg-white p-3">
      <h2 id={titleId} className="mb-2 text-sm font-semibold text-ink-900">
        Flags <span className="font-normal text-ink-600">({analysis.flags.length})</span>
      </h2>
      {analysis.flags.length === 0 && <p className="text-xs text-ink-700">No rule raised a flag for this operating point.</p>}
      <div className="relative max-h-[26rem] space-y-3 overflow-auto pr-1">
        {groups.filter((g) => g.flags.length > 0).map((g) => (
          <div key={g.severity} data-severity={g.severity}>
            <h3 className={`mb-1 inline-flex items-center gap-1.5 rounded border px-1.5 py-0.5 text-xs font-semibold ${TONE[g.severity]}`}>
              <FlagIcon severity={g.severity} size={12} /> {SEVERITY_LABEL[g.severity]} ({g.flags.length})
            </h3>
            <ul className="space-y-1.5">
              {g.flags.map(({ f, i }) => {
                const seg = f.target.kind === "segment" ? f.target.id : null;
                const active = seg !== null && seg === selectedId;
                return (
                  <li key={`${f.code}-${i}`} className={`rounded border px-2 py-1.5 text-xs ${active ? "border-stream-600 bg-stream-50" : "border-ink-100"}`}>
                    <div className="flex items-start gap-1.5">
                      <FlagIcon severity={g.severity} size={11} />
                      <div className="min-w-0">
                        <p className="font-medium text-ink-900">
                          {f.title}
                          {seg && (
                            <button type="button" onClick={() => onSelect(seg)} className="ml-1.5 rounded font-mono text-stream-700 underline decoration-dotted hover:text-stream-800 focus-visible:outline-2 focus-visible:outline-stream-600" aria-label={`Select segment ${seg} on the drawing`}>
                              {seg}
                            </button>
                          )}
                          {!seg && f.target.id && <span className="ml-1.5 font-mono text-ink-600">{f.target.kind} {f.target.id}</span>}
                        </p>
                        <p className="text-ink-700">{f.message}</p>
                        {(f.value !== null || f.threshold !== null) && (
                          <p className="text-ink-600">
                            {f.value !== null && <>value {withUnit(f.value, f.code, pressure, length)}</>}
                            {f.value !== null && f.threshold !== null && " · "}
                            {f.threshold !== null && <>threshold {withUnit(f.threshold, f.code, pressure, length)}</>}
                            {f.source && <> · {f.source}</>}
                          </p>
                        )}
                      </div>
                    </div>
                  </li>
                );
              })}
            </ul>
          </div>
        ))}
      </div>
    </section>
  );
}
