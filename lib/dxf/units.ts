/**
 * Drawing units: the DXF header's $INSUNITS codes and metres per unit.
 * Codes from the DXF reference's $INSUNITS table (checked against
 * ezdxf.units.decode in tests/lib/dxf/units.test.ts).
 */
import type { DrawingUnits } from "../network/types";

export type DrawingUnit = DrawingUnits["drawing"];

/** Metres per drawing unit (exact by definition of each unit; 1 in = 25.4 mm, 1 mil = 0.001 in). */
export const METRES_PER_UNIT: Record<DrawingUnit, number> = {
  nm: 1e-9,
  um: 1e-6,
  mm: 1e-3,
  cm: 1e-2,
  m: 1,
  in: 0.0254,
  mil: 0.0000254,
};

/** $INSUNITS code → Stokeline drawing unit, for the codes a chip layout may use. */
export const INSUNITS_TO_UNIT: Record<number, DrawingUnit> = {
  1: "in",
  4: "mm",
  5: "cm",
  6: "m",
  9: "mil",
  12: "nm",
  13: "um",
};

/** Names of the other $INSUNITS codes, to say what a file declared when Stokeline does not take it. */
export const INSUNITS_OTHER_NAMES: Record<number, string> = {
  0: "unitless",
  2: "feet",
  3: "miles",
  7: "kilometres",
  8: "microinches",
  10: "yards",
  11: "ångströms",
  14: "decimetres",
  15: "decametres",
  16: "hectometres",
  17: "gigametres",
  18: "astronomical units",
  19: "light years",
  20: "parsecs",
};
