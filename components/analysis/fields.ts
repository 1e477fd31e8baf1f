/**
 * What the analysis view shows for a segment: the table's columns (the
 * quantity catalogue of lib/analysis/quantities.ts plus a few text columns)
 * and the drawing's colour quantities, each in the user's display unit.
 */
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";
import {
  COLOUR_QUANTITIES,
  createQuantityReader,
  formatEngineering,
  getQuantity,
  quantityHeader,
  resolveUnit,
  toDisplayValue,
  type QuantityDef,
  type QuantityKey,
  type UnitPreferences,
} from "@/lib/analysis/quantities";

export interface FieldView {
  key: string;
  /** Long label, e.g. "Reynolds number". */
  label: string;
  /** Short header, e.g. "Re". */
  short: string;
  /** Display unit as printed ("µm", "mbar"); "" for a dimensionless group or text. */
  unitLabel: string;
  /** Full header with the unit, as the catalogue writes it ("Width (µm)"). */
  header: string;
  kind: "number" | "text";
  /** SI value (magnitude where the catalogue says so) or text. */
  value(seg: AnalyzeSegmentJson): number | string | null;
  /** SI value → display-unit number. */
  toDisplay(si: number): number;
  /** The catalogue entry, for numbers. */
  def?: QuantityDef;
}

/** Table column order: geometry first, then the operating point. A view choice; the catalogue holds the facts. */
const TABLE_ORDER: QuantityKey[] = [
  "length",
  "width",
  "end_width",
  "depth",
  "hydraulic_diameter",
  "min_bend_radius",
  "resistance",
  "flow",
  "mean_velocity",
  "pressure",
  "pressure_drop",
  "reynolds",
  "capillary",
  "weber",
  "peclet",
  "dean",
  "wall_shear",
  "residence",
  "diffusion_time",
  "mixing_length",
  "entrance_length",
];

function text(key: keyof AnalyzeSegmentJson, label: string): FieldView {
  return { key, label, short: label, unitLabel: "", header: label, kind: "text", value: (s) => String(s[key] ?? ""), toDisplay: (x) => x };
}

/** Short table headers where the catalogue's label is long; dimensionless groups use their symbol. A view choice. */
const SHORT_HEADER: Partial<Record<QuantityKey, string>> = {
  resistance: "Resistance",
  flow: "Flow",
  mean_velocity: "Velocity",
  pressure_drop: "Δp",
  hydraulic_diameter: "Dₕ",
  min_bend_radius: "Bend radius",
  wall_shear: "τw",
  residence: "Residence",
  diffusion_time: "Diffusion time",
  mixing_length: "Mixing length",
  entrance_length: "Entrance length",
};

function quantityField(def: QuantityDef, read: ReturnType<typeof createQuantityReader>, prefs: UnitPreferences): FieldView {
  const unitLabel = resolveUnit(def.family, prefs).label;
  return {
    key: def.key,
    label: def.label,
    short: SHORT_HEADER[def.key] ?? (def.family === "none" ? def.symbol : def.label),
    unitLabel,
    header: quantityHeader(def, prefs),
    kind: "number",
    value: (s) => read(def.key, s),
    toDisplay: (si) => toDisplayValue(def, si, prefs),
    def,
  };
}

/** Every segment column, in table order, in the user's units. */
export function segmentFields(analysis: AnalyzeJson, prefs: UnitPreferences): FieldView[] {
  const read = createQuantityReader(analysis);
  return [
    text("id", "Segment"),
    text("layer", "Layer"),
    text("from", "From node"),
    text("to", "To node"),
    text("section", "Section"),
    ...TABLE_ORDER.map((k) => quantityField(getQuantity(k), read, prefs)),
  ];
}

export interface ColourQuantity {
  key: QuantityKey;
  label: string;
  unitLabel: string;
  toDisplay(si: number): number;
  /** SI value per segment id (absent when the analysis has none). */
  values: Map<string, number>;
}

/** The quantities the drawing can be coloured by (the catalogue's colourable ones), with their values. */
export function colourQuantities(analysis: AnalyzeJson, prefs: UnitPreferences): ColourQuantity[] {
  const read = createQuantityReader(analysis);
  return COLOUR_QUANTITIES.map((def) => {
    const values = new Map<string, number>();
    for (const s of analysis.segments) {
      const v = read(def.key, s);
      if (v !== null) values.set(s.id, v);
    }
    return { key: def.key, label: `${def.label}${def.family === "none" ? ` ${def.symbol}` : ""}`, unitLabel: resolveUnit(def.family, prefs).label, toDisplay: (si: number) => toDisplayValue(def, si, prefs), values };
  });
}

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

/**
 * A display-unit number at engineering precision (lib/analysis/quantities
 * formatEngineering, the same digits the CSV carries), with the exponent set
 * as "×10⁻⁶" for the screen; "—" when there is no value.
 */
export function formatNumber(x: number | null | undefined): string {
  const s = formatEngineering(x);
  if (s === "") return "—";
  const m = /^(-?[\d.]+)e(-?\d+)$/.exec(s);
  if (!m) return s;
  return `${m[1]}×10${[...m[2]].map((c) => SUPERSCRIPT[c] ?? c).join("")}`;
}

/** An axis or legend tick: shortest plain form ("0.001", "20", "1500"), or "10⁻⁶" / "2×10⁶" outside 0.001…99,999. */
export function formatTick(x: number): string {
  if (!Number.isFinite(x)) return "";
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e5) return String(Number(x.toPrecision(3)));
  const exp = Math.floor(Math.log10(a));
  const mant = Number((x / 10 ** exp).toPrecision(3));
  const power = `10${[...String(exp)].map((c) => SUPERSCRIPT[c] ?? c).join("")}`;
  return mant === 1 ? power : mant === -1 ? `−${power}` : `${mant}×${power}`;
}
