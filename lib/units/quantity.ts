/**
 * Quantities at the edges: strings with units ("50 um", "10 uL/min", "200 mbar")
 * or plain numbers already in SI. Parsing is mathjs's unit system; this module
 * only adds the spellings engineers type that mathjs lacks (µ, cP, cSt) and a
 * dimension check so "50 mbar" is refused where a length is expected.
 */
import { create, all, type Unit } from "mathjs";
import { ConditionsError } from "../errors";

const math = create(all, {});
// Viscosity and kinematic viscosity in the units fluid tables use.
math.createUnit("cP", "0.001 Pa s", { override: true });
math.createUnit("cSt", "1e-6 m^2/s", { override: true });

export type Dimension =
  | "length"
  | "pressure"
  | "flow"
  | "temperature"
  | "viscosity"
  | "density"
  | "surface_tension"
  | "diffusivity"
  | "velocity"
  | "time";

/** A reference unit per dimension: a parsed unit must be convertible to it. */
const SI_UNIT: Record<Dimension, string> = {
  length: "m",
  pressure: "Pa",
  flow: "m^3/s",
  temperature: "K",
  viscosity: "Pa s",
  density: "kg/m^3",
  surface_tension: "N/m",
  diffusivity: "m^2/s",
  velocity: "m/s",
  time: "s",
};

export type QuantityInput = string | number;

function normaliseSpelling(text: string): string {
  return text
    .trim()
    .replace(/[µμ]/g, "u")
    .replace(/°\s*C\b/g, "degC")
    .replace(/°\s*F\b/g, "degF")
    .replace(/·/g, " ");
}

/**
 * Parse a quantity to its SI value for the given dimension.
 * Numbers are taken as SI already (kelvin for temperature).
 * @throws ConditionsError naming `field` when the text is not a quantity of that dimension.
 */
export function parseQuantity(value: QuantityInput, dimension: Dimension, field: string): number {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) {
      throw new ConditionsError("invalid_quantity", `${field}: ${value} is not a finite number.`);
    }
    return value;
  }
  const text = normaliseSpelling(value);
  if (text === "") throw new ConditionsError("invalid_quantity", `${field} is empty; give a value with a unit, e.g. "${example(dimension)}".`);
  let parsed: Unit;
  try {
    // A bare number in a string is SI, like a bare number.
    if (/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(text)) return checkedNumber(Number(text), field);
    // math.unit, not math.evaluate: user text is parsed as a quantity, never run as an expression.
    parsed = math.unit(text);
  } catch {
    throw new ConditionsError(
      "invalid_quantity",
      `${field}: "${value}" is not a quantity Stokeline can read; write a number and a unit, e.g. "${example(dimension)}".`,
    );
  }
  if (!parsed.equalBase(math.unit(SI_UNIT[dimension]))) {
    throw new ConditionsError(
      "wrong_dimension",
      `${field}: "${value}" is not a ${dimension.replace("_", " ")}; expected something like "${example(dimension)}".`,
    );
  }
  return checkedNumber(parsed.toNumber(SI_UNIT[dimension]), field);
}

function checkedNumber(n: number, field: string): number {
  if (!Number.isFinite(n)) throw new ConditionsError("invalid_quantity", `${field} is not a finite value.`);
  return n;
}

function example(dimension: Dimension): string {
  switch (dimension) {
    case "length": return "50 um";
    case "pressure": return "200 mbar";
    case "flow": return "10 uL/min";
    case "temperature": return "25 degC";
    case "viscosity": return "1 mPa s";
    case "density": return "1000 kg/m^3";
    case "surface_tension": return "72 mN/m";
    case "diffusivity": return "4e-10 m^2/s";
    case "velocity": return "1 mm/s";
    case "time": return "10 s";
  }
}

/** Convert an SI value to a display unit ("uL/min", "mbar", "um"). */
export function convertFromSI(valueSI: number, dimension: Dimension, toUnit: string): number {
  return math.unit(valueSI, SI_UNIT[dimension]).toNumber(normaliseSpelling(toUnit));
}
