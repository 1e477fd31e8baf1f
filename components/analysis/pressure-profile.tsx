"use client";
/**
 * Pressure along the flow from one port to another (lib/analysis/profile.ts):
 * distance along the centreline on x, pressure in the user's unit on y, one
 * span per segment; clicking a span selects its segment.
 */
import { useId, useMemo, useState } from "react";
import { scaleLinear } from "d3-scale";
import { DomainError } from "@/lib/errors";
import { pressureProfile, type PressureProfile } from "@/lib/analysis/profile";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { formatNumber, formatTick } from "./fields";

const W = 620;
const H = 300;
const M = { top: 16, right: 20, bottom: 42, left: 64 };

export interface PressureProfileProps {
  analysis: AnalyzeJson;
  pressure: { unitLabel: string; toDisplay: (pa: number) => number };
  selectedId: string | null;
  onSelect: (segmentId: string) => void;
}

function defaultPorts(a: AnalyzeJson): [string, string] {
  const withFlow = a.ports.filter((p) => typeof p.flow_m3_per_s === "number");
  const inlet = [...withFlow].sort((x, y) => (y.flow_m3_per_s ?? 0) - (x.flow_m3_per_s ?? 0))[0] ?? a.ports[0];
  const outlet = [...withFlow].sort((x, y) => (x.flow_m3_per_s ?? 0) - (y.flow_m3_per_s ?? 0))[0] ?? a.ports[1] ?? a.ports[0];
  return [inlet?.name ?? "", outlet?.name ?? ""];
}

export function PressureProfileChart({ analysis, pressure, selectedId, onSelect }: PressureProfileProps) {
  const titleId = useId();
  const [initialFrom, initialTo] = useMemo(() => defaultPorts(analysis), [analysis]);
  const [fromPort, setFrom] = useState(initialFrom);
  const [toPort, setTo] = useState(initialTo);
  const [drawn, setDrawn] = useState<{ from: string; to: string } | null>(null);

  const result = useMemo((): { profile: PressureProfile } | { error: string } | null => {
    if (!drawn) return null;
    try {
      return { profile: pressureProfile(analysis, drawn.from, drawn.to) };
    } catch (e) {
      if (e instanceof DomainError) return { error: e.message };
      throw e;
    }
  }, [analysis, drawn]);

  const hasPressures = analysis.nodes.some((n) => typeof n.pressure_Pa === "number");

  return (
    <section aria-labelledby={titleId} className="rounded-md border border-ink-200 bg-white p-3">
      <form
        className="mb-2 flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          setDrawn({ from: fromPort, to: toPort });
        }}
      >
        <h2 id={titleId} className="mr-auto text-sm font-semibold text-ink-900">Pressure along a path</h2>
        <PortPicker label="From port" value={fromPort} onChange={setFrom} ports={analysis.ports.map((p) => p.name)} />
        <PortPicker label="To port" value={toPort} onChange={setTo} ports={analysis.ports.map((p) => p.name)} />
        <button type="submit" disabled={!hasPressures} className="rounded bg-stream-600 px-2.5 py-1 text-xs font-medium text-white hover:bg-stream-700 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-stream-600 disabled:opacity-40">
          Draw profile
        </button>
      </form>
      {!hasPressures && <p className="text-xs text-ink-700">This analysis has geometry only; give the ports a flow or pressure to see pressures.</p>}
      {result && "error" in result && (
        <p role="alert" className="rounded border border-heed-600 bg-heed-100 px-2 py-1.5 text-xs text-heed-800">{result.error}</p>
      )}
      {result && "profile" in result && <ProfilePlot profile={result.profile} pressure={pressure} selectedId={selectedId} onSelect={onSelect} />}
      {!result && hasPressures && <p className="text-xs text-ink-600">Pick an inlet and an outlet and draw the profile; the path follows the flow.</p>}
    </section>
  );
}

function ProfilePlot({ profile, pressure, selectedId, onSelect }: { profile: PressureProfile; pressure: PressureProfileProps["pressure"]; selectedId: string | null; onSelect: (id: string) => void }) {
  const maxD = Math.max(profile.lengthM, 1e-9) * 1e3;
  const ps = profile.points.map((p) => pressure.toDisplay(p.pressurePa));
  const lo = Math.min(0, ...ps);
  const hi = Math.max(...ps, lo + 1e-9);
  const x = scaleLinear().domain([0, maxD]).range([M.left, W - M.right]).nice();
  const y = scaleLinear().domain([lo, hi]).range([H - M.bottom, M.top]).nice();
  const line = profile.points.map((p, i) => `${i ? "L" : "M"}${x(p.distanceM * 1e3)},${y(pressure.toDisplay(p.pressurePa))}`).join("");
  return (
    <>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={`Pressure from ${profile.fromPort} to ${profile.toPort}: falls by ${formatNumber(pressure.toDisplay(profile.pressureDropPa))} ${pressure.unitLabel} over ${formatNumber(maxD)} mm through ${profile.steps.length} segments`} data-testid="pressure-profile">
        {x.ticks(6).map((t) => (
          <g key={`x${t}`} transform={`translate(${x(t)},0)`}>
            <line y1={M.top} y2={H - M.bottom} stroke="#e3e9f0" />
            <text y={H - M.bottom + 14} textAnchor="middle" className="fill-ink-700 font-mono text-[10px]">{formatTick(t)}</text>
          </g>
        ))}
        {y.ticks(5).map((t) => (
          <g key={`y${t}`} transform={`translate(0,${y(t)})`}>
            <line x1={M.left} x2={W - M.right} stroke="#e3e9f0" />
            <text x={M.left - 6} dominantBaseline="middle" textAnchor="end" className="fill-ink-700 font-mono text-[10px]">{formatTick(t)}</text>
          </g>
        ))}
        {profile.steps.map((s) => {
          const x0 = x(s.startDistanceM * 1e3);
          const x1 = x(s.endDistanceM * 1e3);
          const sel = s.segmentId === selectedId;
          return (
            <rect key={s.segmentId} x={x0} y={M.top} width={Math.max(x1 - x0, 1)} height={H - M.top - M.bottom} fill={sel ? "#cff5ee" : "transparent"} stroke={sel ? "#0e8572" : "none"} className="cursor-pointer hover:fill-ink-100" onClick={() => onSelect(s.segmentId)}>
              <title>{`${s.segmentId}: ${formatNumber(pressure.toDisplay(s.startPressurePa))} → ${formatNumber(pressure.toDisplay(s.endPressurePa))} ${pressure.unitLabel}`}</title>
            </rect>
          );
        })}
        <path d={line} fill="none" stroke="#0c6a5c" strokeWidth={2} pointerEvents="none" />
        {profile.points.map((p) => (
          <circle key={p.nodeId} cx={x(p.distanceM * 1e3)} cy={y(pressure.toDisplay(p.pressurePa))} r={2.5} fill="#0b5249" pointerEvents="none" />
        ))}
        <rect x={M.left} y={M.top} width={W - M.left - M.right} height={H - M.top - M.bottom} fill="none" stroke="#9aaec4" pointerEvents="none" />
        <text x={(M.left + W - M.right) / 2} y={H - 8} textAnchor="middle" className="fill-ink-900 text-[11px] font-medium">Distance along the path (mm)</text>
        <text transform={`translate(14,${(M.top + H - M.bottom) / 2}) rotate(-90)`} textAnchor="middle" className="fill-ink-900 text-[11px] font-medium">Pressure ({pressure.unitLabel})</text>
      </svg>
      <p className="mt-1 text-xs text-ink-700">
        {profile.fromPort} → {profile.toPort}: {profile.steps.length} segments, {formatNumber(maxD)} mm, drop {formatNumber(pressure.toDisplay(profile.pressureDropPa))} {pressure.unitLabel}. Click a span to select its segment.
      </p>
    </>
  );
}

function PortPicker({ label, value, onChange, ports }: { label: string; value: string; onChange: (v: string) => void; ports: string[] }) {
  return (
    <label className="flex items-center gap-1.5 text-xs text-ink-800">
      {label}
      <select value={value} onChange={(e) => onChange(e.target.value)} className="rounded border border-ink-300 bg-white px-1.5 py-1 text-xs">
        {ports.map((p) => (
          <option key={p} value={p}>{p}</option>
        ))}
      </select>
    </label>
  );
}
