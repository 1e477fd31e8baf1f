"use client";
/**
 * The regime map: every segment placed on log–log axes of two dimensionless
 * groups, with the regime rules' thresholds (lib/rules/registry.ts) drawn as
 * lines and the regions between them named. Clicking a point selects its segment (nearest point found with a
 * d3-quadtree, so ten thousand points stay responsive).
 */
import { useEffect, useId, useMemo, useRef, useState } from "react";
import { scaleLog } from "d3-scale";
import { quadtree } from "d3-quadtree";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";
import { RULES } from "@/lib/rules/registry";
import { FlagShape } from "./flag-marker";
import { formatTick } from "./fields";
import type { Severity } from "./types";

export type GroupKey = "reynolds" | "capillary" | "peclet" | "dean" | "weber";

export interface Threshold {
  value: number;
  label: string;
  source: string;
  /** Name of the region above this threshold (up to the next one). */
  above: string;
}

interface GroupDef {
  key: GroupKey;
  name: string;
  symbol: string;
  /** Name of the region below the first threshold. */
  below: string;
  /** Region names above each rule's threshold, by rule code (the thresholds themselves come from lib/rules). */
  aboveByCode: Record<string, string>;
  /** Lines for groups no rule watches: definitions, with their source. */
  fixed: Threshold[];
}

export const GROUPS: GroupDef[] = [
  {
    key: "reynolds",
    name: "Reynolds number",
    symbol: "Re",
    below: "creeping",
    aboveByCode: { re_inertial: "inertial focusing", re_strongly_inertial: "strong inertia", re_turbulent: "transition" },
    fixed: [],
  },
  {
    key: "capillary",
    name: "Capillary number",
    symbol: "Ca",
    below: "squeezing",
    aboveByCode: { droplet_squeezing: "", droplet_dripping: "dripping", droplet_jetting: "jetting" },
    fixed: [],
  },
  {
    key: "peclet",
    name: "Péclet number",
    symbol: "Pe",
    below: "diffusion-led",
    aboveByCode: {},
    fixed: [{ value: 1, label: "Pe = 1", source: "advection equals diffusion across the width (definition; Squires & Quake, Rev. Mod. Phys. 77, 977, 2005)", above: "advection-led" }],
  },
  {
    key: "dean",
    name: "Dean number",
    symbol: "De",
    below: "weak secondary flow",
    aboveByCode: { dean_secondary_flow: "Dean vortices" },
    fixed: [],
  },
  {
    key: "weber",
    name: "Weber number",
    symbol: "We",
    below: "tension-held",
    aboveByCode: {},
    fixed: [{ value: 1, label: "We = 1", source: "inertia equals interfacial tension (definition)", above: "inertia deforms interfaces" }],
  },
];

/**
 * Threshold lines of one axis: the rule registry's regime rules on that group
 * (default threshold, or the value this analysis's flags carry when a
 * workspace overrode it), else the group's defining value. Ascending.
 */
export function axisThresholds(g: GroupDef, flags: AnalyzeJson["flags"]): Threshold[] {
  const lines: Threshold[] = [...g.fixed];
  for (const rule of RULES) {
    if (rule.family !== "regime" || !(rule.code in g.aboveByCode)) continue;
    const carried = flags.find((f) => f.code === rule.code && typeof f.threshold === "number" && f.threshold > 0)?.threshold;
    const value = carried ?? rule.defaultThreshold;
    if (typeof value !== "number" || !(value > 0)) continue;
    lines.push({ value, label: `${g.symbol} = ${formatTick(value)}`, source: `${rule.title} (${rule.code}): ${rule.source}`, above: g.aboveByCode[rule.code] });
  }
  return lines.sort((a, b) => a.value - b.value);
}

const W = 620;
const CANVAS_POINTS = 2000;
const H = 400;
const M = { top: 30, right: 120, bottom: 44, left: 60 };

export interface RegimeChartProps {
  analysis: AnalyzeJson;
  flagsBySegment: Map<string, Severity[]>;
  selectedId: string | null;
  onSelect: (segmentId: string | null) => void;
}

function groupValue(s: AnalyzeSegmentJson, key: GroupKey): number | null {
  const v = s[key];
  return typeof v === "number" && Number.isFinite(v) && v > 0 ? v : null;
}

function decadeDomain(values: number[], thresholds: Threshold[]): [number, number] {
  let lo = Math.min(...values, ...thresholds.map((t) => t.value));
  let hi = Math.max(...values, ...thresholds.map((t) => t.value));
  if (!Number.isFinite(lo)) return [1e-3, 1e3];
  lo = 10 ** Math.floor(Math.log10(lo));
  hi = 10 ** Math.ceil(Math.log10(hi));
  if (hi <= lo) hi = lo * 10;
  return [lo, hi];
}

function worst(sev?: Severity[]): Severity | null {
  if (!sev || sev.length === 0) return null;
  return sev.includes("block") ? "block" : sev.includes("warn") ? "warn" : "info";
}

export function RegimeChart({ analysis, flagsBySegment, selectedId, onSelect }: RegimeChartProps) {
  const [xKey, setXKey] = useState<GroupKey>("reynolds");
  const [yKey, setYKey] = useState<GroupKey>("peclet");
  const titleId = useId();
  const gx = GROUPS.find((g) => g.key === xKey)!;
  const gy = GROUPS.find((g) => g.key === yKey)!;

  const points = useMemo(() => {
    const out: { id: string; x: number; y: number; sev: Severity | null }[] = [];
    for (const s of analysis.segments) {
      const x = groupValue(s, xKey);
      const y = groupValue(s, yKey);
      if (x !== null && y !== null) out.push({ id: s.id, x, y, sev: worst(flagsBySegment.get(s.id)) });
    }
    return out;
  }, [analysis.segments, xKey, yKey, flagsBySegment]);
  const omitted = analysis.segments.length - points.length;

  const { xT, yT, xs, ys } = useMemo(() => {
    const xT = axisThresholds(gx, analysis.flags);
    const yT = axisThresholds(gy, analysis.flags);
    const xs = scaleLog().domain(decadeDomain(points.map((p) => p.x), xT)).range([M.left, W - M.right]);
    const ys = scaleLog().domain(decadeDomain(points.map((p) => p.y), yT)).range([H - M.bottom, M.top]);
    return { xT, yT, xs, ys };
  }, [gx, gy, analysis.flags, points]);
  const tree = useMemo(() => quadtree(points, (p) => xs(p.x), (p) => ys(p.y)), [points, xs, ys]);

  // Many points: the unflagged ones are painted on a canvas (thousands of SVG circles are slow to lay out).
  const many = points.length > CANVAS_POINTS;
  const wrapRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    const wrap = wrapRef.current;
    const canvas = canvasRef.current;
    if (!many || !wrap || !canvas) return;
    const draw = () => {
      const w = wrap.clientWidth;
      const h = (w * H) / W;
      const dpr = window.devicePixelRatio || 1;
      canvas.width = Math.round(w * dpr);
      canvas.height = Math.round(h * dpr);
      canvas.style.width = `${w}px`;
      canvas.style.height = `${h}px`;
      const ctx = canvas.getContext("2d");
      if (!ctx) return;
      ctx.setTransform((dpr * w) / W, 0, 0, (dpr * w) / W, 0, 0);
      ctx.fillStyle = "rgba(14,133,114,0.55)";
      ctx.beginPath();
      for (const p of points) {
        if (p.sev) continue;
        ctx.moveTo(xs(p.x) + 2.6, ys(p.y));
        ctx.arc(xs(p.x), ys(p.y), 2.6, 0, 2 * Math.PI);
      }
      ctx.fill();
    };
    draw();
    const ro = new ResizeObserver(draw);
    ro.observe(wrap);
    return () => ro.disconnect();
  }, [many, points, xs, ys]);

  const onClick = (e: React.MouseEvent<HTMLDivElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const px = ((e.clientX - r.left) / r.width) * W;
    const py = ((e.clientY - r.top) / r.height) * H;
    const hit = tree.find(px, py, 10);
    onSelect(hit ? hit.id : null);
  };

  const selected = points.find((p) => p.id === selectedId);
  const decades = (s: typeof xs) => s.ticks().filter((t) => Math.abs(Math.log10(t) - Math.round(Math.log10(t))) < 1e-9);
  const regionsX = bands(gx, xT, xs.domain() as [number, number]);
  const regionsY = bands(gy, yT, ys.domain() as [number, number]);

  return (
    <section aria-labelledby={titleId} className="rounded-md border border-ink-200 bg-white p-3">
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <h2 id={titleId} className="mr-auto text-sm font-semibold text-ink-900">Regime map</h2>
        <AxisPicker label="Horizontal axis" value={xKey} onChange={setXKey} />
        <AxisPicker label="Vertical axis" value={yKey} onChange={setYKey} />
      </div>
      <div ref={wrapRef} className="relative cursor-pointer select-none" onClick={onClick}>
      <svg viewBox={`0 0 ${W} ${H}`} className="block h-auto w-full" role="img" aria-label={`${gy.name} against ${gx.name} for ${points.length} segments, log–log; thresholds ${[...xT, ...yT].map((t) => t.label).join(", ")}`} data-testid="regime-chart">
        {regionsX.map((b, i) => (
          <g key={`rx${i}`}>
            <rect x={xs(b.lo)} y={M.top} width={xs(b.hi) - xs(b.lo)} height={H - M.top - M.bottom} fill={i % 2 ? "#f3f6f9" : "#ffffff"} />
            {b.name && <text x={(xs(b.lo) + xs(b.hi)) / 2} y={M.top - 8} textAnchor="middle" className="fill-ink-600 text-[10px] italic">{b.name}</text>}
          </g>
        ))}
        {regionsY.map((b, i) =>
          b.name ? <text key={`ry${i}`} x={W - M.right + 6} y={(ys(b.lo) + ys(b.hi)) / 2} dominantBaseline="middle" className="fill-ink-600 text-[10px] italic">{b.name}</text> : null,
        )}
        {decades(xs).map((t) => (
          <g key={`x${t}`} transform={`translate(${xs(t)},0)`}>
            <line y1={M.top} y2={H - M.bottom} stroke="#e3e9f0" />
            <text y={H - M.bottom + 14} textAnchor="middle" className="fill-ink-700 font-mono text-[10px]">{formatTick(t)}</text>
          </g>
        ))}
        {decades(ys).map((t) => (
          <g key={`y${t}`} transform={`translate(0,${ys(t)})`}>
            <line x1={M.left} x2={W - M.right} stroke="#e3e9f0" />
            <text x={M.left - 6} dominantBaseline="middle" textAnchor="end" className="fill-ink-700 font-mono text-[10px]">{formatTick(t)}</text>
          </g>
        ))}
        {xT.map((t) => (
          <g key={`tx${t.label}`}>
            <line x1={xs(t.value)} x2={xs(t.value)} y1={M.top} y2={H - M.bottom} stroke="#37506c" strokeDasharray="5 3" />
            <title>{`${t.label}: ${t.source}`}</title>
            <text x={xs(t.value) + 3} y={H - M.bottom - 4} dominantBaseline="hanging" stroke="#ffffff" strokeWidth={3} paintOrder="stroke" className="fill-ink-700 text-[10px]" transform={`rotate(-90 ${xs(t.value) + 3} ${H - M.bottom - 4})`}>{t.label}</text>
          </g>
        ))}
        {yT.map((t) => (
          <g key={`ty${t.label}`}>
            <line x1={M.left} x2={W - M.right} y1={ys(t.value)} y2={ys(t.value)} stroke="#37506c" strokeDasharray="2 3" />
            <title>{`${t.label}: ${t.source}`}</title>
            <text x={M.left + 4} y={ys(t.value) - 3} stroke="#ffffff" strokeWidth={3} paintOrder="stroke" className="fill-ink-700 text-[10px]">{t.label}</text>
          </g>
        ))}
        <rect x={M.left} y={M.top} width={W - M.left - M.right} height={H - M.top - M.bottom} fill="none" stroke="#9aaec4" />
        {!many && (
          <g>
            {points.map((p) =>
              p.sev ? null : <circle key={p.id} cx={xs(p.x)} cy={ys(p.y)} r={2.6} fill="#0e8572" fillOpacity={0.55} stroke="#0b5249" strokeWidth={0.5} />,
            )}
          </g>
        )}
        <text x={(M.left + W - M.right) / 2} y={H - 8} textAnchor="middle" className="fill-ink-900 text-[11px] font-medium">{gx.name}, {gx.symbol}</text>
        <text transform={`translate(14,${(M.top + H - M.bottom) / 2}) rotate(-90)`} textAnchor="middle" className="fill-ink-900 text-[11px] font-medium">{gy.name}, {gy.symbol}</text>
      </svg>
      {many && <canvas ref={canvasRef} className="pointer-events-none absolute left-0 top-0" aria-hidden="true" />}
      <svg viewBox={`0 0 ${W} ${H}`} className="pointer-events-none absolute inset-0 h-full w-full" aria-hidden="true">
        {points.map((p) => (p.sev ? <g key={p.id} transform={`translate(${xs(p.x)},${ys(p.y)})`}><FlagShape severity={p.sev} size={7} /></g> : null))}
        {selected && <circle cx={xs(selected.x)} cy={ys(selected.y)} r={8} fill="none" stroke="#111c29" strokeWidth={2} data-testid="regime-selected" />}
      </svg>
      </div>
      <p className="mt-1 text-xs text-ink-600">
        Dashed lines: the thresholds of Stokeline&apos;s regime rules (hover a line for its rule and source). Points with a shape carry flags. Click a point to select its segment.
        {omitted > 0 && ` ${omitted} segment${omitted === 1 ? " has" : "s have"} no positive value on one of these axes and ${omitted === 1 ? "is" : "are"} not plotted.`}
      </p>
    </section>
  );
}

function bands(g: GroupDef, lines: Threshold[], domain: [number, number]): { lo: number; hi: number; name: string }[] {
  const edges = [domain[0], ...lines.map((t) => t.value), domain[1]];
  const names = [g.below, ...lines.map((t) => t.above)];
  const out: { lo: number; hi: number; name: string }[] = [];
  for (let i = 0; i < edges.length - 1; i++) {
    const lo = Math.max(edges[i], domain[0]);
    const hi = Math.min(edges[i + 1], domain[1]);
    if (hi > lo) out.push({ lo, hi, name: names[i] ?? "" });
  }
  return out;
}

function AxisPicker({ label, value, onChange }: { label: string; value: GroupKey; onChange: (k: GroupKey) => void }) {
  return (
    <label className="flex items-center gap-1.5 text-xs text-ink-800">
      {label}
      <select value={value} onChange={(e) => onChange(e.target.value as GroupKey)} className="rounded border border-ink-300 bg-white px-1.5 py-1 text-xs">
        {GROUPS.map((g) => (
          <option key={g.key} value={g.key}>{g.symbol} — {g.name}</option>
        ))}
      </select>
    </label>
  );
}
