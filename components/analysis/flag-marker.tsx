"use client";
/**
 * Stokeline's flag markers: a shape per severity so they are told apart
 * without colour — a ring for a note, a triangle for "check", a diamond with
 * a bar for "must change". Drawn centred on (0,0) in screen pixels.
 */
import type { Severity } from "./types";

export const SEVERITY_FILL: Record<Severity, string> = { info: "#0b62b0", warn: "#a86400", block: "#b8321a" };

export function FlagShape({ severity, size = 12 }: { severity: Severity; size?: number }) {
  const r = size / 2;
  const fill = SEVERITY_FILL[severity];
  if (severity === "block") {
    return (
      <g>
        <path d={`M0,${-r - 1}L${r + 1},0L0,${r + 1}L${-r - 1},0Z`} fill={fill} stroke="#fff" strokeWidth={1.5} />
        <path d={`M0,${-r * 0.5}V${r * 0.15}M0,${r * 0.4}V${r * 0.5}`} stroke="#fff" strokeWidth={1.8} strokeLinecap="round" />
      </g>
    );
  }
  if (severity === "warn") {
    return <path d={`M0,${-r - 1}L${r + 1},${r}L${-r - 1},${r}Z`} fill={fill} stroke="#fff" strokeWidth={1.5} strokeLinejoin="round" />;
  }
  return <circle r={r * 0.75} fill="#fff" stroke={fill} strokeWidth={2.5} />;
}

/** A small inline marker for lists and legends. */
export function FlagIcon({ severity, size = 14 }: { severity: Severity; size?: number }) {
  const box = size + 4;
  return (
    <svg width={box} height={box} viewBox={`${-box / 2} ${-box / 2} ${box} ${box}`} aria-hidden="true" className="inline-block shrink-0 align-[-3px]">
      <FlagShape severity={severity} size={size - 2} />
    </svg>
  );
}
