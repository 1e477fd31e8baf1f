/**
 * The catalogue of per-segment quantities the analysis view can show or colour
 * by: where each lives in the analyze JSON, its label, SI unit and display
 * units, whether a log scale suits the data, and engineering-precision
 * formatting. Shared by the segment table, the drawing's legend and the CSV
 * export, so all three say the same thing. Pure.
 */
import { spansDecades } from "./colour-scales";
import type { AnalyzeJson, AnalyzeSegmentJson } from "./serialize";

/** Display-unit families; each quantity belongs to one. */
export type UnitFamily = "length" | "pressure" | "flow" | "velocity" | "stress" | "time" | "resistance" | "none";

export interface DisplayUnit {
  /** Stable id stored in preferences, mathjs spelling ("um", "uL/min", "dyn/cm^2"). */
  id: string;
  /** As printed ("µm", "µL/min", "dyn/cm²"). */
  label: string;
}

/**
 * SI → display factors, written from the units' definitions (SI Brochure; psi per NIST SP 811,
 * 1 psi = 6894.757293168 Pa). A table rather than mathjs calls so the analysis view's browser
 * bundle carries no unit library; tests/lib/analysis/quantities.test.ts checks every entry
 * against mathjs (lib/units/quantity.ts), so the two cannot drift.
 */
const PER_SI: Record<UnitFamily, Record<string, number>> = {
  length: { um: 1e6, mm: 1e3, m: 1 },
  pressure: { mbar: 1e-2, kPa: 1e-3, psi: 1 / 6894.757293168, Pa: 1 },
  // 1 µL/min = 1e-9 m³ / 60 s.
  flow: { "uL/min": 6e10, "uL/h": 3.6e12, "nL/s": 1e12, "nL/min": 6e13 },
  velocity: { "mm/s": 1e3, "um/s": 1e6, "m/s": 1 },
  stress: { Pa: 1, "dyn/cm^2": 10, mPa: 1e3 },
  time: { s: 1, ms: 1e3, min: 1 / 60 },
  // Pa·s/m³ × (m³/s per µL/min) = Pa per µL/min; × 1e-2 → mbar per µL/min.
  resistance: { "Pa s/m^3": 1, "mbar/(uL/min)": (1e-9 / 60) * 1e-2 },
  none: { "": 1 },
};

/** Display units per family, default first. Factors in PER_SI; exact definitions in REFERENCES §8. */
export const DISPLAY_UNITS: Record<UnitFamily, readonly DisplayUnit[]> = {
  length: [
    { id: "um", label: "µm" },
    { id: "mm", label: "mm" },
    { id: "m", label: "m" },
  ],
  pressure: [
    { id: "mbar", label: "mbar" },
    { id: "kPa", label: "kPa" },
    { id: "psi", label: "psi" },
    { id: "Pa", label: "Pa" },
  ],
  flow: [
    { id: "uL/min", label: "µL/min" },
    { id: "uL/h", label: "µL/h" },
    { id: "nL/s", label: "nL/s" },
    { id: "nL/min", label: "nL/min" },
  ],
  velocity: [
    { id: "mm/s", label: "mm/s" },
    { id: "um/s", label: "µm/s" },
    { id: "m/s", label: "m/s" },
  ],
  stress: [
    { id: "Pa", label: "Pa" },
    { id: "dyn/cm^2", label: "dyn/cm²" },
    { id: "mPa", label: "mPa" },
  ],
  time: [
    { id: "s", label: "s" },
    { id: "ms", label: "ms" },
    { id: "min", label: "min" },
  ],
  resistance: [
    { id: "Pa s/m^3", label: "Pa·s/m³" },
    { id: "mbar/(uL/min)", label: "mbar/(µL/min)" },
  ],
  none: [{ id: "", label: "" }],
};

/** The SI unit each family is stored in, as printed. */
export const SI_UNIT_LABEL: Record<UnitFamily, string> = {
  length: "m",
  pressure: "Pa",
  flow: "m³/s",
  velocity: "m/s",
  stress: "Pa",
  time: "s",
  resistance: "Pa·s/m³",
  none: "",
};

/** A member's unit choices, stored per user (validated by lib/analysis/unit-preferences.ts). Missing families take the default. */
export type UnitPreferences = Partial<Record<Exclude<UnitFamily, "none">, string>>;

export const DEFAULT_UNIT_PREFERENCES: Required<UnitPreferences> = {
  length: "um",
  pressure: "mbar",
  flow: "uL/min",
  velocity: "mm/s",
  stress: "Pa",
  time: "s",
  resistance: "mbar/(uL/min)",
};

/**
 * SI → display factor. Every unit here is proportional to SI (none affine, unlike °C), so a
 * 10,000-row table multiplies instead of parsing.
 * @throws Error for a unit the catalogue does not list (a programming error: preferences are validated).
 */
export function displayFactor(family: UnitFamily, unitId: string): number {
  const f = PER_SI[family]?.[unitId];
  if (f === undefined) throw new Error(`No display unit "${unitId}" for ${family}.`);
  return f;
}

/** The unit a member sees for a family: their preference if it is a known unit, else the default. */
export function resolveUnit(family: UnitFamily, prefs: UnitPreferences = {}): DisplayUnit {
  const units = DISPLAY_UNITS[family];
  if (family === "none") return units[0];
  const wanted = prefs[family] ?? DEFAULT_UNIT_PREFERENCES[family];
  return units.find((u) => u.id === wanted) ?? units[0];
}

export type QuantityKey =
  | "pressure"
  | "flow"
  | "mean_velocity"
  | "pressure_drop"
  | "reynolds"
  | "capillary"
  | "peclet"
  | "weber"
  | "dean"
  | "wall_shear"
  | "residence"
  | "diffusion_time"
  | "length"
  | "width"
  | "end_width"
  | "depth"
  | "hydraulic_diameter"
  | "min_bend_radius"
  | "resistance"
  | "mixing_length"
  | "entrance_length";

export interface QuantityDef {
  key: QuantityKey;
  /** Field of AnalyzeSegmentJson it reads; "pressure" reads the end nodes' pressure_Pa instead. */
  jsonKey: keyof AnalyzeSegmentJson | "nodes.pressure_Pa";
  label: string;
  /** Short symbol for headers and legends ("Re", "τw"). */
  symbol: string;
  family: UnitFamily;
  /** Offered as a colour for the drawing. */
  colourable: boolean;
  /** Only present when the analysis solved an operating point. */
  needsOperatingPoint: boolean;
  /** Shown as a magnitude: the sign only says which way the segment was drawn. */
  magnitude: boolean;
  description: string;
}

const q = (
  key: QuantityKey,
  jsonKey: QuantityDef["jsonKey"],
  label: string,
  symbol: string,
  family: UnitFamily,
  opts: { colourable?: boolean; hydraulic?: boolean; magnitude?: boolean; description: string },
): QuantityDef => ({
  key,
  jsonKey,
  label,
  symbol,
  family,
  colourable: opts.colourable ?? false,
  needsOperatingPoint: opts.hydraulic ?? true,
  magnitude: opts.magnitude ?? false,
  description: opts.description,
});

/** Every quantity, in table order. */
export const QUANTITIES: readonly QuantityDef[] = [
  q("pressure", "nodes.pressure_Pa", "Pressure", "p", "pressure", { colourable: true, description: "Mean of the pressures at the segment's two ends, gauge." }),
  q("flow", "flow_m3_per_s", "Flow rate", "Q", "flow", { colourable: true, magnitude: true, description: "Volume flow through the segment." }),
  q("mean_velocity", "mean_velocity_m_per_s", "Mean velocity", "ū", "velocity", { colourable: true, magnitude: true, description: "Flow divided by cross-section area." }),
  q("pressure_drop", "pressure_drop_Pa", "Pressure drop", "Δp", "pressure", { magnitude: true, description: "Pressure lost along the segment." }),
  q("reynolds", "reynolds", "Reynolds number", "Re", "none", { colourable: true, description: "Inertia against viscosity, on the hydraulic diameter." }),
  q("capillary", "capillary", "Capillary number", "Ca", "none", { colourable: true, description: "Viscous stress against interfacial tension." }),
  q("peclet", "peclet", "Péclet number", "Pe", "none", { colourable: true, description: "Advection against diffusion across the width." }),
  q("weber", "weber", "Weber number", "We", "none", { description: "Inertia against interfacial tension." }),
  q("dean", "dean", "Dean number", "De", "none", { description: "Strength of curvature-driven secondary flow; empty for straight segments." }),
  q("wall_shear", "wall_shear_Pa", "Wall shear stress", "τw", "stress", { colourable: true, magnitude: true, description: "Mean shear stress on the channel wall." }),
  q("residence", "residence_s", "Residence time", "t_res", "time", { colourable: true, description: "Time the fluid spends in the segment." }),
  q("diffusion_time", "diffusion_time_s", "Diffusion time across", "t_D", "time", { description: "Time for the solute to diffuse across the width, w²/D." }),
  q("length", "length_m", "Length", "L", "length", { hydraulic: false, description: "Along the centreline, node to node." }),
  q("width", "width_m", "Width", "w", "length", { hydraulic: false, description: "Width at the segment's start." }),
  q("end_width", "end_width_m", "End width", "w_end", "length", { hydraulic: false, description: "Width at the segment's end (differs on tapers)." }),
  q("depth", "depth_m", "Depth", "h", "length", { hydraulic: false, description: "Channel depth." }),
  q("hydraulic_diameter", "hydraulic_diameter_m", "Hydraulic diameter", "Dh", "length", { description: "4 × area / wetted perimeter." }),
  q("min_bend_radius", "min_bend_radius_m", "Smallest bend radius", "Rc", "length", { hydraulic: false, description: "Tightest centreline bend; empty when straight." }),
  q("resistance", "resistance_Pa_s_per_m3", "Hydraulic resistance", "R", "resistance", { description: "Pressure drop per unit flow." }),
  q("mixing_length", "mixing_length_m", "Mixing length", "L_mix", "length", { description: "Distance to mix across the width by diffusion." }),
  q("entrance_length", "entrance_length_m", "Entrance length", "L_e", "length", { description: "Distance for the velocity profile to develop." }),
];

const BY_KEY = new Map(QUANTITIES.map((d) => [d.key, d]));

/** The colour-by choices for the drawing, in menu order. */
export const COLOUR_QUANTITIES: readonly QuantityDef[] = QUANTITIES.filter((d) => d.colourable);

/** @throws Error for a key that is not in the catalogue (a programming error, not user input). */
export function getQuantity(key: QuantityKey): QuantityDef {
  const d = BY_KEY.get(key);
  if (!d) throw new Error(`Unknown quantity "${key}".`);
  return d;
}

/**
 * A reader of SI values per segment for one document. Missing values (geometry
 * only, straight segments' Dean number) are null; magnitudes drop the sign.
 */
export function createQuantityReader(doc: Pick<AnalyzeJson, "nodes">): (key: QuantityKey, seg: AnalyzeSegmentJson) => number | null {
  const nodeP = new Map<string, number>();
  for (const n of doc.nodes) if (typeof n.pressure_Pa === "number" && Number.isFinite(n.pressure_Pa)) nodeP.set(n.id, n.pressure_Pa);
  return (key, seg) => {
    const d = getQuantity(key);
    if (d.jsonKey === "nodes.pressure_Pa") {
      const a = nodeP.get(seg.from);
      const b = nodeP.get(seg.to);
      return a === undefined || b === undefined ? null : (a + b) / 2;
    }
    const v = seg[d.jsonKey];
    if (typeof v !== "number" || !Number.isFinite(v)) return null;
    return d.magnitude ? Math.abs(v) : v;
  };
}

/** SI value → number in the member's display unit for this quantity. */
export function toDisplayValue(def: QuantityDef, valueSI: number, prefs: UnitPreferences = {}): number {
  return valueSI * displayFactor(def.family, resolveUnit(def.family, prefs).id);
}

/** Column header with the unit: "Width (µm)", "Reynolds number Re". */
export function quantityHeader(def: QuantityDef, prefs: UnitPreferences = {}): string {
  const unit = resolveUnit(def.family, prefs).label;
  return unit ? `${def.label} (${unit})` : `${def.label} ${def.symbol}`;
}

/**
 * Whether a log scale suits these values: all positive and spanning more than
 * `ratio` (default 100, two decades; common practice). Same rule as the colour scales.
 */
export function suggestScale(values: Iterable<number | null | undefined>, ratio = 100): "log" | "linear" {
  return spansDecades(values, ratio) ? "log" : "linear";
}

/**
 * Engineering precision: `significant` figures (default 3); plain decimals for
 * 0.001 ≤ |x| < 10⁶ (integers keep all their digits above 10^significant),
 * otherwise a mantissa in [1, 1000) with an exponent that is a multiple of 3
 * ("12.3e-6"). Hand-written: d3-format has scientific and SI-prefix forms but no
 * engineering exponent, and an SI prefix would clash with the unit ("m" milli vs metre).
 * Non-finite or null → "" (the table shows an empty cell).
 */
export function formatEngineering(value: number | null | undefined, significant = 3): string {
  if (typeof value !== "number" || !Number.isFinite(value)) return "";
  if (value === 0) return "0";
  const sign = value < 0 ? "-" : "";
  const a = Math.abs(value);
  if (a >= 1e-3 && a < 1e6) {
    if (a >= 10 ** significant) return sign + String(Math.round(a));
    const text = Number(a.toPrecision(significant));
    // Keep trailing zeros that are significant ("12.0"), never an exponent in this range.
    const digitsAfter = Math.max(0, significant - 1 - Math.floor(Math.log10(text)));
    return sign + text.toFixed(digitsAfter);
  }
  let exp = Math.floor(Math.log10(a) / 3) * 3;
  let mantissa = a / 10 ** exp;
  let rounded = Number(mantissa.toPrecision(significant));
  if (rounded >= 1000) {
    exp += 3;
    mantissa = a / 10 ** exp;
    rounded = Number(mantissa.toPrecision(significant));
  }
  const digitsAfter = Math.max(0, significant - 1 - Math.floor(Math.log10(rounded)));
  return `${sign}${rounded.toFixed(digitsAfter)}e${exp}`;
}

/** Format an SI value of a quantity in the member's unit: "125 µm" style number only (the unit goes in the header). */
export function formatQuantity(def: QuantityDef, valueSI: number | null | undefined, prefs: UnitPreferences = {}, significant = 3): string {
  if (typeof valueSI !== "number" || !Number.isFinite(valueSI)) return "";
  return formatEngineering(toDisplayValue(def, valueSI, prefs), significant);
}
