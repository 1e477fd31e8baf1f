"use client";
/** Legend of the drawing's colours: the ramp, ticks in the quantity's display unit, and whether it is log or linear. */
import { useId } from "react";
import type { ColourScale } from "@/lib/analysis/colour-scales";
import { NO_DATA_COLOUR } from "@/lib/analysis/colour-scales";
import { formatNumber, formatTick } from "./fields";

export function ColourLegend({ scale, label, unitLabel, toDisplay, missing }: { scale: ColourScale; label: string; unitLabel: string; toDisplay: (si: number) => number; missing: number }) {
  const gid = useId().replace(/:/g, "");
  const width = 260;
  const ticks = scale.ticks(scale.kind === "log" ? 6 : 5);
  const shownTicks = ticks.length > 7 ? ticks.filter((_, i) => i % Math.ceil(ticks.length / 6) === 0) : ticks;
  const unit = unitLabel ? ` (${unitLabel})` : "";
  return (
    <figure className="text-xs text-ink-800" aria-label={`Colour legend: ${label}${unit}, ${scale.kind} scale from ${formatNumber(toDisplay(scale.domain[0]))} to ${formatNumber(toDisplay(scale.domain[1]))}`}>
      <figcaption className="mb-1 font-medium">
        {label}
        {unit} · <span className="text-ink-600">{scale.kind === "log" ? "log scale" : "linear scale"}</span>
      </figcaption>
      <svg width={width + 20} height={38} aria-hidden="true" className="overflow-visible">
        <defs>
          <linearGradient id={gid}>
            {scale.stops(16).map((s) => (
              <stop key={s.offset} offset={s.offset} stopColor={s.colour} />
            ))}
          </linearGradient>
        </defs>
        <rect x={10} y={0} width={width} height={12} fill={`url(#${gid})`} stroke="#9aaec4" strokeWidth={0.5} />
        {shownTicks.map((v) => {
          const x = 10 + scale.position(v) * width;
          return (
            <g key={v} transform={`translate(${x},12)`}>
              <line y2={5} stroke="#293d54" />
              <text y={16} textAnchor="middle" className="fill-ink-800 font-mono text-[10px]">{formatTick(toDisplay(v))}</text>
            </g>
          );
        })}
      </svg>
      {missing > 0 && (
        <p className="mt-0.5 flex items-center gap-1 text-ink-600">
          <span className="inline-block h-2.5 w-4 rounded-sm" style={{ background: NO_DATA_COLOUR }} /> no value ({missing} segment{missing === 1 ? "" : "s"})
        </p>
      )}
    </figure>
  );
}
