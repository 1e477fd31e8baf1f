import { scaleBand, scaleLinear } from "d3-scale";
import { line } from "d3-shape";
import { formatEngineering } from "@/lib/analysis/quantities";
import { toMillibar, type TrendPoint } from "@/lib/reports/figures";

const W = 640;
const H = 230;
const M = { top: 16, right: 96, bottom: 34, left: 64 };
const SEVERITY = [
  { key: "flagsBlock", label: "Must change", colour: "#b8321a" },
  { key: "flagsWarn", label: "Check", colour: "#a86400" },
  { key: "flagsInfo", label: "Note", colour: "#0b62b0" },
] as const;

function xScale(points: TrendPoint[]) {
  return scaleBand<number>()
    .domain(points.map((p) => p.revisionNumber))
    .range([M.left, W - M.right])
    .padding(0.35);
}

function Axes({ x, y, yLabel, ticks }: { x: ReturnType<typeof xScale>; y: ReturnType<typeof scaleLinear<number, number>>; yLabel: string; ticks: number[] }) {
  // Axis ticks are round numbers: plain digits with thousands separators read best ("2,000", "0.5").
  const format = (t: number) => Number(t.toPrecision(6)).toLocaleString("en-US", { maximumFractionDigits: 6 });
  return (
    <g fontSize="11" fill="#37506c">
      {ticks.map((t) => (
        <g key={t} transform={`translate(0,${y(t)})`}>
          <line x1={M.left} x2={W - M.right} stroke="#e3e9f0" />
          <text x={M.left - 6} dy="0.32em" textAnchor="end">
            {format(t)}
          </text>
        </g>
      ))}
      {x.domain().map((n) => (
        <text key={n} x={(x(n) ?? 0) + x.bandwidth() / 2} y={H - M.bottom + 16} textAnchor="middle">
          rev {n}
        </text>
      ))}
      <line x1={M.left} x2={W - M.right} y1={H - M.bottom} y2={H - M.bottom} stroke="#9aaec4" />
      <text transform={`translate(14,${(M.top + H - M.bottom) / 2}) rotate(-90)`} textAnchor="middle" fontSize="11">
        {yLabel}
      </text>
    </g>
  );
}

/** A line of one figure across revisions, with optional dashed limit lines; missing values break the line. */
function LineChart({
  points,
  values,
  yLabel,
  title,
  limits = [],
  testId,
}: {
  points: TrendPoint[];
  values: (number | null)[];
  yLabel: string;
  title: string;
  limits?: { label: string; values: (number | null)[]; colour: string }[];
  testId: string;
}) {
  const x = xScale(points);
  const all = [...values, ...limits.flatMap((l) => l.values)].filter((v): v is number => v !== null && Number.isFinite(v));
  const y = scaleLinear()
    .domain([0, Math.max(1e-12, ...all) * 1.1])
    .nice()
    .range([H - M.bottom, M.top]);
  const cx = (i: number) => (x(points[i].revisionNumber) ?? 0) + x.bandwidth() / 2;
  const path = line<number | null>()
    .defined((v) => v !== null && Number.isFinite(v))
    .x((_, i) => cx(i))
    .y((v) => y(v ?? 0));
  return (
    <figure className="panel p-4" data-testid={testId}>
      <figcaption className="mb-1 text-sm font-semibold text-ink-900">{title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={title}>
        <Axes x={x} y={y} yLabel={yLabel} ticks={y.ticks(5)} />
        {limits.map((l, k) => {
          const d = path(l.values);
          const lastIndex = l.values.map((v, i) => (v === null ? -1 : i)).filter((i) => i >= 0).pop();
          // Labels of limits that end within 12 px of an earlier one are stacked below it.
          const labelY = lastIndex === undefined ? 0 : y(l.values[lastIndex]!);
          const clash = limits.slice(0, k).some((o) => {
            const oi = o.values.map((v, i) => (v === null ? -1 : i)).filter((i) => i >= 0).pop();
            return oi !== undefined && Math.abs(y(o.values[oi]!) - labelY) < 12;
          });
          return d ? (
            <g key={l.label}>
              <path d={d} fill="none" stroke={l.colour} strokeWidth="1.5" strokeDasharray={k === 0 ? "5 4" : "2 3"} />
              {lastIndex !== undefined ? (
                <text x={cx(lastIndex) + 8} y={labelY + (clash ? 13 : 0)} dy="0.32em" fontSize="11" fill={l.colour}>
                  {l.label} limit
                </text>
              ) : null}
            </g>
          ) : null;
        })}
        <path d={path(values) ?? ""} fill="none" stroke="#0c6a5c" strokeWidth="2.5" />
        {values.map((v, i) =>
          v === null ? null : (
            <g key={i}>
              <circle cx={cx(i)} cy={y(v)} r="4.5" fill="#0c6a5c" />
              <text x={cx(i)} y={y(v) - 9} textAnchor="middle" fontSize="11" fill="#111c29">
                {formatEngineering(v)}
              </text>
            </g>
          ),
        )}
      </svg>
    </figure>
  );
}

/** Flags per revision, stacked by severity, with the number still open above each bar. */
function FlagsChart({ points }: { points: TrendPoint[] }) {
  const x = xScale(points);
  const totals = points.map((p) => p.flagsBlock + p.flagsWarn + p.flagsInfo);
  const y = scaleLinear()
    .domain([0, Math.max(1, ...totals)])
    .nice()
    .range([H - M.bottom, M.top + 10]);
  const ticks = y.ticks(Math.min(5, Math.max(1, ...totals))).filter((t) => Number.isInteger(t));
  return (
    <figure className="panel p-4" data-testid="trend-flags">
      <figcaption className="mb-1 text-sm font-semibold text-ink-900">Flags by severity (number still open above each bar)</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label="Flags by severity per revision">
        <Axes x={x} y={y} yLabel="flags" ticks={ticks} />
        {points.map((p, i) => {
          let base = 0;
          const x0 = x(p.revisionNumber) ?? 0;
          return (
            <g key={p.revisionId}>
              {SEVERITY.map((s) => {
                const n = p[s.key];
                if (n === 0) return null;
                const top = y(base + n);
                const rect = <rect key={s.key} x={x0} width={x.bandwidth()} y={top} height={y(base) - top} fill={s.colour} />;
                base += n;
                return rect;
              })}
              <text x={x0 + x.bandwidth() / 2} y={y(totals[i]) - 5} textAnchor="middle" fontSize="11" fill="#111c29">
                {p.analysisId === null ? "not analysed" : `${p.openFlags} open`}
              </text>
            </g>
          );
        })}
        <g transform={`translate(${W - M.right + 10},${M.top})`} fontSize="11" fill="#37506c">
          {SEVERITY.map((s, i) => (
            <g key={s.key} transform={`translate(0,${i * 18})`}>
              <rect width="10" height="10" fill={s.colour} />
              <text x="14" y="9">
                {s.label}
              </text>
            </g>
          ))}
        </g>
      </svg>
    </figure>
  );
}

/** The chip's progress across revisions, drawn with d3 scales and line generators as server-rendered SVG. */
export function TrendCharts({ points }: { points: TrendPoint[] }) {
  const mbar = (v: number | null) => (v === null ? null : toMillibar(v));
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <LineChart
        testId="trend-pressure"
        title="Required inlet pressure against the pump and bond limits"
        yLabel="mbar"
        points={points}
        values={points.map((p) => mbar(p.requiredPressurePa))}
        limits={[
          { label: "pump", values: points.map((p) => mbar(p.pumpMaxPa)), colour: "#a86400" },
          { label: "bond", values: points.map((p) => mbar(p.bondLimitPa)), colour: "#b8321a" },
        ]}
      />
      <FlagsChart points={points} />
      <LineChart testId="trend-footprint" title="Footprint (bounding box of the layout)" yLabel="mm²" points={points} values={points.map((p) => (p.footprintM2 === null ? null : p.footprintM2 * 1e6))} />
    </div>
  );
}
