/**
 * The quantity catalogue: unit conversions against exact definitions
 * (REFERENCES §8: NIST SP 811 for psi = 6894.757293168 Pa; 1 dyn/cm² = 0.1 Pa;
 * 1 mbar = 100 Pa, SI Brochure; 1 µL = 1e-9 m³ by definition of the litre,
 * so 1 µL/min = 1e-9/60 = 1.6667e-11 m³/s), the log-scale rule (max/min > 100
 * with all values positive; common practice, as the colour scales use) and
 * engineering formatting (common practice: 3 significant figures, exponents in
 * multiples of 3).
 */
import { describe, expect, it } from "vitest";
import type { AnalyzeSegmentJson } from "@/lib/analysis/serialize";
import {
  COLOUR_QUANTITIES,
  DEFAULT_UNIT_PREFERENCES,
  DISPLAY_UNITS,
  QUANTITIES,
  createQuantityReader,
  displayFactor,
  formatEngineering,
  formatQuantity,
  getQuantity,
  quantityHeader,
  resolveUnit,
  suggestScale,
  toDisplayValue,
} from "@/lib/analysis/quantities";
import { unitPreferencesSchema } from "@/lib/analysis/unit-preferences";
import { convertFromSI, type Dimension } from "@/lib/units/quantity";

describe("the display-factor table agrees with mathjs's unit system", () => {
  // The table is written from the units' definitions; mathjs (an independent implementation of the
  // same definitions) must give the same factor. mathjs's psi is 6894.75729276 Pa, 6e-11 from NIST's
  // exact 6894.757293168 Pa, hence the 1e-9 relative tolerance.
  const DIMENSION: Record<string, Dimension> = { length: "length", pressure: "pressure", flow: "flow", velocity: "velocity", stress: "pressure", time: "time" };
  for (const [family, units] of Object.entries(DISPLAY_UNITS)) {
    if (!(family in DIMENSION)) continue;
    for (const u of units) {
      it(`${family}: ${u.id}`, () => {
        const fromMathjs = convertFromSI(1, DIMENSION[family], u.id);
        expect(Math.abs(displayFactor(family as never, u.id) / fromMathjs - 1)).toBeLessThan(1e-9);
      });
    }
  }
  it("resistance: mbar/(uL/min) is (1 µL/min in m³/s) × (Pa → mbar), both from mathjs", () => {
    const f = convertFromSI(1 / convertFromSI(1, "flow", "uL/min"), "pressure", "mbar");
    expect(Math.abs(displayFactor("resistance", "mbar/(uL/min)") / f - 1)).toBeLessThan(1e-12);
  });
  it("refuses a unit the catalogue does not list", () => {
    expect(() => displayFactor("pressure", "furlong")).toThrow(/No display unit/);
  });
});

describe("display units convert exactly (REFERENCES §8)", () => {
  const cases: [string, Parameters<typeof displayFactor>[0], string, number, number][] = [
    // [what, family, unit, SI value, value in that unit]
    ["1 psi = 6894.757293168 Pa (NIST SP 811)", "pressure", "psi", 6894.757293168, 1],
    ["1 mbar = 100 Pa", "pressure", "mbar", 100, 1],
    ["1 kPa = 1000 Pa", "pressure", "kPa", 1000, 1],
    ["1 dyn/cm² = 0.1 Pa", "stress", "dyn/cm^2", 0.1, 1],
    ["1 µL/min = 1e-9/60 m³/s", "flow", "uL/min", 1e-9 / 60, 1],
    ["1 µL/h = 1e-9/3600 m³/s", "flow", "uL/h", 1e-9 / 3600, 1],
    ["1 nL/s = 1e-12 m³/s", "flow", "nL/s", 1e-12, 1],
    ["1 nL/min = 1e-12/60 m³/s", "flow", "nL/min", 1e-12 / 60, 1],
    ["1 µm = 1e-6 m", "length", "um", 1e-6, 1],
    ["1 mm/s = 1e-3 m/s", "velocity", "mm/s", 1e-3, 1],
    ["1 min = 60 s", "time", "min", 60, 1],
    ["1 ms = 1e-3 s", "time", "ms", 1e-3, 1],
  ];
  for (const [what, family, unit, si, shown] of cases) {
    // 1e-9 relative: mathjs's psi constant (6894.75729276459 Pa) differs from the exact 6894.757293168 Pa by 6e-11 relative.
    it(what, () => expect(si * displayFactor(family, unit)).toBeCloseTo(shown, 9));
  }

  it("the rounded figure 1 µL/min = 1.6667e-11 m³/s agrees to its 5 digits", () => {
    expect(1 / displayFactor("flow", "uL/min")).toBeCloseTo(1.6667e-11, 15);
  });

  it("hydraulic resistance: 6e12 Pa·s/m³ is 1 mbar/(µL/min) (100 Pa ÷ 1.6667e-11 m³/s)", () => {
    expect(6e12 * displayFactor("resistance", "mbar/(uL/min)")).toBeCloseTo(1, 10);
    expect(displayFactor("resistance", "Pa s/m^3")).toBe(1);
  });

  it("every listed unit converts (mathjs knows each spelling)", () => {
    for (const [family, units] of Object.entries(DISPLAY_UNITS)) {
      for (const u of units) expect(Number.isFinite(displayFactor(family as never, u.id)), `${family} ${u.id}`).toBe(true);
    }
  });
});

describe("unit preferences", () => {
  it("take the member's choice, fall back to the defaults (µm, mbar, µL/min) and refuse unknown units", () => {
    expect(resolveUnit("pressure", { pressure: "psi" }).label).toBe("psi");
    expect(resolveUnit("length").label).toBe("µm");
    expect(resolveUnit("flow", {}).label).toBe("µL/min");
    expect(DEFAULT_UNIT_PREFERENCES.pressure).toBe("mbar");
    expect(unitPreferencesSchema.safeParse({ pressure: "kPa", length: "mm" }).success).toBe(true);
    expect(unitPreferencesSchema.safeParse({ pressure: "atm" }).success).toBe(false);
  });

  it("change the header and the number: 250 µm wide is 0.250 mm", () => {
    const width = getQuantity("width");
    expect(quantityHeader(width)).toBe("Width (µm)");
    expect(quantityHeader(width, { length: "mm" })).toBe("Width (mm)");
    expect(formatQuantity(width, 250e-6)).toBe("250");
    expect(formatQuantity(width, 250e-6, { length: "mm" })).toBe("0.250");
    expect(quantityHeader(getQuantity("reynolds"))).toBe("Reynolds number Re");
    // 1.5 Pa wall shear is 15 dyn/cm², the atheroprotective threshold of Malek et al. 1999 (REFERENCES §7).
    expect(toDisplayValue(getQuantity("wall_shear"), 1.5, { stress: "dyn/cm^2" })).toBeCloseTo(15, 12);
  });
});

describe("the catalogue", () => {
  it("offers the colours issue 6 names: pressure, flow, mean velocity, Re, Ca, Pe, wall shear, residence time", () => {
    expect(COLOUR_QUANTITIES.map((d) => d.key)).toEqual(["pressure", "flow", "mean_velocity", "reynolds", "capillary", "peclet", "wall_shear", "residence"]);
  });

  it("has unique keys, and every geometric quantity is present without an operating point", () => {
    expect(new Set(QUANTITIES.map((d) => d.key)).size).toBe(QUANTITIES.length);
    const geometryOnly = QUANTITIES.filter((d) => !d.needsOperatingPoint).map((d) => d.key);
    expect(geometryOnly).toEqual(["length", "width", "end_width", "depth", "min_bend_radius"]);
  });

  it("reads SI values: pressure is the mean of the end nodes, flow a magnitude, a straight segment's Dean number empty", () => {
    const seg = {
      id: "s1", layer: "CH", from: "a", to: "b", length_m: 0.01, width_m: 1e-4, end_width_m: 1e-4, min_width_m: 1e-4, max_width_m: 1e-4,
      depth_m: 5e-5, section: "rectangular", min_bend_radius_m: null, path_m: [[0, 0], [0.01, 0]],
      flow_m3_per_s: -2e-11, reynolds: 0.4, dean: null,
    } as AnalyzeSegmentJson;
    const read = createQuantityReader({ nodes: [{ id: "a", x_m: 0, y_m: 0, kind: "port", port: "IN", pressure_Pa: 1000 }, { id: "b", x_m: 0.01, y_m: 0, kind: "junction", port: null, pressure_Pa: 600 }] });
    expect(read("pressure", seg)).toBe(800);
    expect(read("flow", seg)).toBe(2e-11);
    expect(read("reynolds", seg)).toBe(0.4);
    expect(read("dean", seg)).toBeNull();
    expect(read("wall_shear", seg)).toBeNull();
    expect(read("length", seg)).toBe(0.01);
  });
});

describe("suggestScale: log when all positive and max/min > 100", () => {
  it.each([
    ["1 … 50 (under two decades)", [1, 20, 50], "linear"],
    ["1 … 200", [1, 200], "log"],
    ["exactly 100× is still linear", [2, 200], "linear"],
    ["1e-6 … 1e-3 (Ca across a chip)", [1e-6, 3e-5, 1e-3], "log"],
    ["a zero forbids log", [0, 1, 1000], "linear"],
    ["a negative forbids log", [-1, 10, 1e4], "linear"],
    ["missing values are ignored", [null, 1, undefined, 1e3], "log"],
    ["no values", [], "linear"],
  ] as [string, (number | null | undefined)[], string][])("%s", (_what, values, expected) => {
    expect(suggestScale(values)).toBe(expected);
  });
});

describe("formatEngineering: three significant figures, exponents in steps of three", () => {
  it.each([
    [12, "12.0"],
    [0.0012345, "0.00123"],
    [123.456, "123"],
    [1234.5, "1235"],
    [999999, "999999"],
    [1e6, "1.00e6"],
    [2.5e7, "25.0e6"],
    [1.2345e-5, "12.3e-6"],
    [0.00099996, "1.00e-3"],
    [6.02e-11, "60.2e-12"],
    [-4.56e-8, "-45.6e-9"],
    [-0.5, "-0.500"],
    [0, "0"],
    [Number.NaN, ""],
    [null, ""],
  ] as [number | null, string][])("%s → %s", (value, expected) => {
    expect(formatEngineering(value)).toBe(expected);
  });

  it("takes other precisions", () => {
    expect(formatEngineering(Math.PI, 5)).toBe("3.1416");
    expect(formatEngineering(1.23456e-7, 2)).toBe("120e-9");
  });
});
