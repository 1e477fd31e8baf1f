"use client";
/**
 * Per port: how it is driven, the pressure it needs (or gets) and the flow it
 * takes (or gives), with each pressure shown against the pump's and the
 * process's limits as a bar.
 */
import { useId } from "react";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { formatNumber } from "./fields";
import type { PressureLimits } from "./types";

export interface PortSummaryProps {
  analysis: AnalyzeJson;
  limits: PressureLimits;
  pressure: { unitLabel: string; toDisplay: (pa: number) => number };
  flow: { unitLabel: string; toDisplay: (si: number) => number };
}

const DRIVE_WORDS: Record<string, string> = { flow: "set flow", pressure: "set pressure", head: "liquid head", open: "open" };

export function PortSummary({ analysis, limits, pressure, flow }: PortSummaryProps) {
  const titleId = useId();
  // Limits given by the page win; otherwise the pressure rules' flags carry them (lib/rules: pump_pressure_max, pressure_bond).
  const carried = (code: string) => analysis.flags.find((f) => f.code === code && typeof f.threshold === "number")?.threshold ?? undefined;
  const pumpMax = limits.pumpMaxPa ?? carried("pump_pressure_max");
  const processMax = limits.processMaxPa ?? carried("pressure_bond");
  const scaleMax = Math.max(1, pumpMax ?? 0, processMax ?? 0, ...analysis.ports.map((p) => Math.abs(p.pressure_Pa ?? 0))) * 1.05;

  return (
    <section aria-labelledby={titleId} className="rounded-md border border-ink-200 bg-white p-3">
      <h2 id={titleId} className="mb-1 text-sm font-semibold text-ink-900">Ports</h2>
      <p className="mb-2 text-xs text-ink-700">
        {pumpMax !== undefined ? <>Pump limit {formatNumber(pressure.toDisplay(pumpMax))} {pressure.unitLabel}</> : "No pump limit given"}
        {" · "}
        {processMax !== undefined ? <>{limits.processName ? `${limits.processName} ` : "Process "}working limit {formatNumber(pressure.toDisplay(processMax))} {pressure.unitLabel}</> : "no process limit given"}
      </p>
      <table className="w-full text-xs tabular-nums">
        <thead className="text-left text-ink-800">
          <tr className="border-b border-ink-200">
            <th scope="col" className="py-1 pr-2">Port</th>
            <th scope="col" className="py-1 pr-2">Drive</th>
            <th scope="col" className="py-1 pr-2 text-right">Pressure ({pressure.unitLabel})</th>
            <th scope="col" className="py-1 pr-2 text-right">Flow in ({flow.unitLabel})</th>
            <th scope="col" className="py-1"><span className="sr-only">Pressure against the limits</span></th>
          </tr>
        </thead>
        <tbody>
          {analysis.ports.map((p) => {
            const pa = p.pressure_Pa;
            const over = pa !== undefined && ((pumpMax !== undefined && pa > pumpMax) || (processMax !== undefined && pa > processMax));
            return (
              <tr key={p.name} className="border-b border-ink-100" data-port={p.name}>
                <th scope="row" className="py-1 pr-2 text-left font-mono font-semibold text-ink-900">{p.name}</th>
                <td className="py-1 pr-2 text-ink-800">{p.drive ? (DRIVE_WORDS[p.drive] ?? p.drive) : "—"}</td>
                <td className={`py-1 pr-2 text-right ${over ? "font-semibold text-halt-800" : "text-ink-900"}`}>
                  {pa === undefined ? "—" : formatNumber(pressure.toDisplay(pa))}
                  {over && <span className="ml-1">▲ over limit</span>}
                </td>
                <td className="py-1 pr-2 text-right text-ink-900">{p.flow_m3_per_s === undefined ? "—" : formatNumber(flow.toDisplay(p.flow_m3_per_s))}</td>
                <td className="w-28 py-1">
                  {pa !== undefined && <LimitBar valuePa={pa} pumpMaxPa={pumpMax} processMaxPa={processMax} scaleMaxPa={scaleMax} over={over} />}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-1.5 text-[11px] text-ink-600">Flow in is positive into the chip. Bar marks: solid line the pump limit, dashed line the process limit.</p>
    </section>
  );
}

function LimitBar({ valuePa, pumpMaxPa, processMaxPa, scaleMaxPa, over }: { valuePa: number; pumpMaxPa?: number; processMaxPa?: number; scaleMaxPa: number; over: boolean }) {
  const w = 110;
  const x = (v: number) => (Math.max(0, v) / scaleMaxPa) * w;
  return (
    <svg width={w} height={12} aria-hidden="true">
      <rect width={w} height={12} fill="#f3f6f9" />
      <rect width={x(valuePa)} height={12} fill={over ? "#b8321a" : "#14a38b"} />
      {pumpMaxPa !== undefined && <line x1={x(pumpMaxPa)} x2={x(pumpMaxPa)} y1={0} y2={12} stroke="#111c29" strokeWidth={2} />}
      {processMaxPa !== undefined && <line x1={x(processMaxPa)} x2={x(processMaxPa)} y1={0} y2={12} stroke="#111c29" strokeWidth={2} strokeDasharray="2 2" />}
    </svg>
  );
}
