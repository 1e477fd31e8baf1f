/**
 * Colour scales for the analysis view: a quantity's values (SI) → colours on a
 * perceptually uniform ramp whose lightness rises monotonically, so it still
 * reads when printed in greyscale and for colour-blind viewers. The ramps are
 * d3-scale-chromatic's viridis (van der Walt & Smith, matplotlib 2.0 default,
 * 2015) and cividis (Nuñez, Anderton & Renslow, PLoS ONE 13, e0199239, 2018);
 * the mapping is a d3-scale linear or log scale. Pure: no React, no DOM.
 */
import { interpolateCividis, interpolateViridis } from "d3-scale-chromatic";
import { scaleLinear, scaleLog } from "d3-scale";
import { rgb } from "d3-color";

export type ColourScheme = "viridis" | "cividis";

/** Colour for a segment with no value for the quantity (geometry-only analysis, null Dean number). */
export const NO_DATA_COLOUR = "#9aaec4";

/** Ratio max/min above which a positive quantity is shown on a log scale (two decades; common practice). */
export const LOG_SPAN_RATIO = 100;

const INTERPOLATORS: Record<ColourScheme, (t: number) => string> = {
  viridis: interpolateViridis,
  cividis: interpolateCividis,
};

export interface ColourScale {
  scheme: ColourScheme;
  kind: "linear" | "log";
  /** Smallest and largest finite value used for the mapping, SI (for log: smallest positive). */
  domain: [number, number];
  /** Position 0…1 on the ramp; values outside the domain are clamped; NaN for a missing value. */
  position(valueSI: number | null | undefined): number;
  /** Hex colour; NO_DATA_COLOUR for a missing or non-finite value. */
  colour(valueSI: number | null | undefined): string;
  /** About `count` round tick values inside the domain, SI, for a legend. */
  ticks(count?: number): number[];
  /** `n` evenly spaced gradient stops (offset 0…1, hex colour) for a legend bar. */
  stops(n?: number): { offset: number; colour: string }[];
}

function finiteValues(values: Iterable<number | null | undefined>): number[] {
  const out: number[] = [];
  for (const v of values) if (typeof v === "number" && Number.isFinite(v)) out.push(v);
  return out;
}

/**
 * True when every finite value is positive and they span more than `minRatio`
 * (default two decades), i.e. a log scale reads better than a linear one.
 */
export function spansDecades(values: Iterable<number | null | undefined>, minRatio = LOG_SPAN_RATIO): boolean {
  const v = finiteValues(values);
  if (v.length < 2) return false;
  let min = Infinity;
  let max = -Infinity;
  for (const x of v) {
    if (x <= 0) return false;
    if (x < min) min = x;
    if (x > max) max = x;
  }
  return max / min > minRatio;
}

/** The ramp itself: t in 0…1 → hex colour (t clamped). */
export function rampColour(scheme: ColourScheme, t: number): string {
  const clamped = Math.min(1, Math.max(0, t));
  return rgb(INTERPOLATORS[scheme](clamped)).formatHex();
}

/**
 * Build a colour scale for a quantity's values (SI units).
 * `log`: force a log (true) or linear (false) mapping; when omitted it is
 * decided by spansDecades. A log scale needs positive values: non-positive ones
 * are clamped to the low end. Missing values get NO_DATA_COLOUR.
 * Never throws: an empty or constant set gives a scale whose every value sits mid-ramp.
 */
export function createColourScale(
  values: Iterable<number | null | undefined>,
  options: { scheme?: ColourScheme; log?: boolean } = {},
): ColourScale {
  const scheme = options.scheme ?? "viridis";
  const all = finiteValues(values);
  const positive = all.filter((v) => v > 0);
  const wantLog = options.log ?? spansDecades(all);
  const useLog = wantLog && positive.length > 0;
  const pool = useLog ? positive : all;
  let min = Infinity;
  let max = -Infinity;
  for (const x of pool) {
    if (x < min) min = x;
    if (x > max) max = x;
  }
  if (!Number.isFinite(min)) {
    min = useLog ? 1 : 0;
    max = useLog ? 1 : 0;
  }
  const domain: [number, number] = [min, max];
  const degenerate = !(max > min);
  const mapper = useLog ? scaleLog().domain(domain).range([0, 1]).clamp(true) : scaleLinear().domain(domain).range([0, 1]).clamp(true);

  const position = (valueSI: number | null | undefined): number => {
    if (typeof valueSI !== "number" || !Number.isFinite(valueSI)) return Number.NaN;
    if (degenerate) return 0.5;
    if (useLog && valueSI <= 0) return 0;
    return mapper(valueSI);
  };

  return {
    scheme,
    kind: useLog ? "log" : "linear",
    domain,
    position,
    colour(valueSI) {
      const t = position(valueSI);
      return Number.isNaN(t) ? NO_DATA_COLOUR : rampColour(scheme, t);
    },
    ticks(count = 5) {
      if (degenerate) return [min];
      return mapper.ticks(count).filter((t) => t >= min && t <= max);
    },
    stops(n = 11) {
      const k = Math.max(2, Math.floor(n));
      return Array.from({ length: k }, (_, i) => {
        const offset = i / (k - 1);
        return { offset, colour: rampColour(scheme, offset) };
      });
    },
  };
}
