/**
 * What the analysis view shows for a segment: the table's columns and the
 * drawing's colour quantities, each with its display unit. Conversions go
 * through lib/units (mathjs) once per unit to get a factor, so a 10,000-row
 * table does not parse a unit per cell.
 */
import { format as d3format } from "d3-format";
import { convertFromSI, type Dimension } from "@/lib/units/quantity";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";
import type { UnitPreferences } from "./types";

export interface FieldView {
  key: string;
  /** Long label, e.g. "Reynolds number". */
  label: string;
  /** Short header, e.g. "Re". */
  short: string;
  /** Display unit as shown ("µm", "mbar"); "" for a dimensionless group. */
  unitLabel: string;
  kind: "number" | "text";
  /** SI value (or text) for a segment. */
  value(seg: AnalyzeSegmentJson): number | string | null;
  /** SI value → display-unit number. */
  toDisplay(si: number): number;
  /** Colour by the magnitude (flows and velocities carry a sign for direction). */
  magnitude?: boolean;
}

const UNIT_LABEL: Record<string, string> = { um: "µm", "uL/min": "µL/min", "uL/h": "µL/h", "nL/s": "nL/s" };
const shown = (u: string) => UNIT_LABEL[u] ?? u;

const factorCache = new Map<string, number>();
/** SI → display factor (all units here are proportional, none affine). */
function factor(dimension: Dimension, unit: string): number {
  const key = `${dimension}|${unit}`;
  let f = factorCache.get(key);
  if (f === undefined) {
    f = convertFromSI(1, dimension, unit);
    factorCache.set(key, f);
  }
  return f;
}

function num(key: keyof AnalyzeSegmentJson) {
  return (seg: AnalyzeSegmentJson) => {
    const v = seg[key];
    return typeof v === "number" && Number.isFinite(v) ? v : null;
  };
}

function field(
  key: keyof AnalyzeSegmentJson,
  label: string,
  short: string,
  dimension: Dimension | null,
  unit: string,
  extra: Partial<FieldView> = {},
): FieldView {
  const f = dimension ? factor(dimension, unit) : 1;
  return { key, label, short, unitLabel: shown(unit), kind: "number", value: num(key), toDisplay: (si) => si * f, ...extra };
}

function text(key: keyof AnalyzeSegmentJson, label: string): FieldView {
  return { key, label, short: label, unitLabel: "", kind: "text", value: (s) => String(s[key] ?? ""), toDisplay: (x) => x };
}

/** Every segment field, in table order, in the user's units. */
export function segmentFields(units: UnitPreferences): FieldView[] {
  const len = units.length;
  return [
    text("id", "Segment"),
    text("layer", "Layer"),
    text("from", "From"),
    text("to", "To"),
    field("length_m", "Length", "Length", "length", "mm"),
    field("width_m", "Width", "Width", "length", len),
    field("end_width_m", "End width", "End width", "length", len),
    field("depth_m", "Depth", "Depth", "length", len),
    text("section", "Section"),
    field("min_bend_radius_m", "Smallest bend radius", "Bend radius", "length", len),
    field("hydraulic_diameter_m", "Hydraulic diameter", "Dₕ", "length", len),
    { ...field("resistance_Pa_s_per_m3", "Hydraulic resistance", "Resistance", null, ""), unitLabel: `${shown(units.pressure)}/(${shown(units.flow)})`, toDisplay: (si) => (si * factor("pressure", units.pressure)) / factor("flow", units.flow) },
    field("flow_m3_per_s", "Flow (from → to)", "Flow", "flow", units.flow, { magnitude: true }),
    field("mean_velocity_m_per_s", "Mean velocity", "Velocity", "velocity", "mm/s", { magnitude: true }),
    field("pressure_drop_Pa", "Pressure drop", "Δp", "pressure", units.pressure, { magnitude: true }),
    field("reynolds", "Reynolds number", "Re", null, ""),
    field("capillary", "Capillary number", "Ca", null, ""),
    field("weber", "Weber number", "We", null, ""),
    field("peclet", "Péclet number", "Pe", null, ""),
    field("dean", "Dean number", "De", null, ""),
    field("wall_shear_Pa", "Wall shear stress", "τw", "pressure", "Pa"),
    field("residence_s", "Residence time", "Residence", "time", "s"),
    field("diffusion_time_s", "Diffusion time across", "Diffusion", "time", "s"),
    field("mixing_length_m", "Mixing length", "Mixing L", "length", "mm"),
    field("entrance_length_m", "Entrance length", "Entrance L", "length", len),
  ];
}

/** Segment pressure for colouring: the mean of its end nodes' pressures, Pa. */
export function segmentPressures(analysis: AnalyzeJson): Map<string, number> {
  const p = new Map<string, number>();
  for (const n of analysis.nodes) if (typeof n.pressure_Pa === "number") p.set(n.id, n.pressure_Pa);
  const out = new Map<string, number>();
  for (const s of analysis.segments) {
    const a = p.get(s.from);
    const b = p.get(s.to);
    if (a !== undefined && b !== undefined) out.set(s.id, (a + b) / 2);
  }
  return out;
}

export type ColourKey = "pressure" | "flow" | "velocity" | "reynolds" | "capillary" | "peclet" | "wall_shear" | "residence";

export interface ColourQuantity {
  key: ColourKey;
  label: string;
  unitLabel: string;
  toDisplay(si: number): number;
  /** SI value per segment id (missing when the analysis has no value). */
  values(analysis: AnalyzeJson): Map<string, number>;
}

/** The quantities the drawing can be coloured by, in the user's units. */
export function colourQuantities(units: UnitPreferences): ColourQuantity[] {
  const bySeg = (pick: (s: AnalyzeSegmentJson) => number | null | undefined, magnitude = false) => (a: AnalyzeJson) => {
    const m = new Map<string, number>();
    for (const s of a.segments) {
      const v = pick(s);
      if (typeof v === "number" && Number.isFinite(v)) m.set(s.id, magnitude ? Math.abs(v) : v);
    }
    return m;
  };
  const pf = factor("pressure", units.pressure);
  const ff = factor("flow", units.flow);
  const vf = factor("velocity", "mm/s");
  return [
    { key: "pressure", label: "Pressure", unitLabel: shown(units.pressure), toDisplay: (x) => x * pf, values: segmentPressures },
    { key: "flow", label: "Flow (magnitude)", unitLabel: shown(units.flow), toDisplay: (x) => x * ff, values: bySeg((s) => s.flow_m3_per_s, true) },
    { key: "velocity", label: "Mean velocity", unitLabel: "mm/s", toDisplay: (x) => x * vf, values: bySeg((s) => s.mean_velocity_m_per_s, true) },
    { key: "reynolds", label: "Reynolds number Re", unitLabel: "", toDisplay: (x) => x, values: bySeg((s) => s.reynolds) },
    { key: "capillary", label: "Capillary number Ca", unitLabel: "", toDisplay: (x) => x, values: bySeg((s) => s.capillary) },
    { key: "peclet", label: "Péclet number Pe", unitLabel: "", toDisplay: (x) => x, values: bySeg((s) => s.peclet) },
    { key: "wall_shear", label: "Wall shear stress", unitLabel: "Pa", toDisplay: (x) => x, values: bySeg((s) => s.wall_shear_Pa) },
    { key: "residence", label: "Residence time", unitLabel: "s", toDisplay: (x) => x, values: bySeg((s) => s.residence_s) },
  ];
}

const fixed = d3format(".3~r");
const expo = d3format(".3~e");
/** Three significant figures; exponent form outside 0.001…99,999. */
export function formatNumber(x: number | null | undefined): string {
  if (typeof x !== "number" || !Number.isFinite(x)) return "—";
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e5) return fixed(x);
  const [mant, exp] = expo(x).split("e");
  return `${mant}×10${[...exp.replace("+", "")].map((c) => SUPERSCRIPT[c] ?? c).join("")}`;
}

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

/** Plain-text variant for CSV (a number a spreadsheet reads). */
export function formatPlain(x: number | null | undefined): string {
  if (typeof x !== "number" || !Number.isFinite(x)) return "";
  return Number(x.toPrecision(6)).toString();
}
