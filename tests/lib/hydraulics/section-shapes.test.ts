import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { sectionProperties } from "@/lib/hydraulics/cross-section";
import type { SectionShape } from "@/lib/network/types";

// Independent numerical references: finite-difference Poiseuille solves with SciPy's spsolve, Richardson-extrapolated
// (tests/fixtures/networks/generate-sections.py). The same procedure reproduces the exact semicircle (α = 33.1688,
// REFERENCES §2) to 0.015 %, so the references are good to about that level.
const ref = JSON.parse(readFileSync(fileURLToPath(new URL("../../fixtures/networks/section-references.json", import.meta.url)), "utf8")) as {
  cases: { shape: SectionShape; widthM: number; depthM: number; alpha: number; exact?: number }[];
};
const alphaOf = (shape: SectionShape, w: number, d: number) => {
  const p = sectionProperties(shape, w, d);
  return p.resistanceFactorPerM4 * p.areaM2 ** 2;
};

describe("non-rectangular sections vs a numerical Poiseuille solve (SciPy)", () => {
  it("the numerical reference itself reproduces the exact semicircle within 0.05 %", () => {
    const semi = ref.cases.find((c) => c.shape === "semicircular")!;
    expect(Math.abs(semi.alpha / semi.exact! - 1)).toBeLessThan(5e-4);
    expect(Math.abs(alphaOf("semicircular", 2, 1) / semi.alpha - 1)).toBeLessThan(5e-4);
  });

  // Mortensen, Okkels & Bruus (2005) shape-factor fits: measured here at 1–5 % for the D profile and up to 11 %
  // for KOH trapezoids with a floor (the rectangle fit is a poor match for 54.7° walls); 0.5 % for the V-groove (triangle fit).
  // These bounds document the method's accuracy; they are not a design target.
  it.each(ref.cases.filter((c) => c.shape === "isotropic_etch").map((c) => [c.widthM / c.depthM, c] as const))(
    "isotropic etch, w/d = %f: shape-factor resistance within 5 % of the numerical value",
    (_r, c) => {
      expect(Math.abs(alphaOf(c.shape, c.widthM, c.depthM) / c.alpha - 1)).toBeLessThan(0.05);
    },
  );
  it.each(ref.cases.filter((c) => c.shape === "trapezoid_koh").map((c) => [c.widthM / c.depthM, c] as const))(
    "KOH trapezoid, w/d = %f: shape-factor resistance within 12 % of the numerical value",
    (_r, c) => {
      expect(Math.abs(alphaOf(c.shape, c.widthM, c.depthM) / c.alpha - 1)).toBeLessThan(0.12);
    },
  );
  it("KOH V-groove (triangle fit) within 1 % of the numerical value", () => {
    const v = ref.cases.find((c) => c.shape === "trapezoid_koh" && c.widthM / c.depthM < 1.5)!;
    expect(Math.abs(alphaOf(v.shape, v.widthM, v.depthM) / v.alpha - 1)).toBeLessThan(0.01);
  });
});
