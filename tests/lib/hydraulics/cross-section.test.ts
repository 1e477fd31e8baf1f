import { describe, expect, it } from "vitest";
import {
  circleSection,
  integrateSegmentSection,
  isotropicEtchSection,
  kohMaxDepthM,
  kohTrapezoidSection,
  rectangleResistanceFactor,
  rectangleSection,
  semicircleSection,
  shapeFactorResistanceFactor,
} from "@/lib/hydraulics/cross-section";
import { buildNetwork } from "@/tests/support/network-builders";

// Po = f_Fanning·Re_Dh linked to R by R = 2·Po·μL/(A·Dh²) (REFERENCES §1), so Po = R/(μL)·A·Dh²/2.
function poiseuilleNumber(alpha: number): number {
  const w = 1e-3;
  const h = alpha * w;
  const A = w * h;
  const dh = (2 * w * h) / (w + h);
  return (rectangleResistanceFactor(w, h) * A * dh * dh) / 2;
}

describe("rectangular cross-section, exact series", () => {
  // Shah & London (1978), rectangular-duct table ("Table 45" per public code quoting it): REFERENCES §1, basis `code`.
  it.each([
    [1, 14.22708],
    [0.5, 15.54806],
    [0.25, 18.23278],
  ])("f·Re at α = %f matches Shah & London %f within 0.1 %%", (alpha, po) => {
    expect(Math.abs(poiseuilleNumber(alpha) / po - 1)).toBeLessThan(1e-3);
  });

  // Series values computed with SciPy in REFERENCES §1 (basis `calc`), to ~1e-6 relative.
  it.each([
    [1, 14.22708],
    [0.75, 14.4757],
    [0.5, 15.54806],
    [1 / 3, 17.08967],
    [0.25, 18.23278],
    [0.2, 19.0705],
    [0.125, 20.58464],
    [0.1, 21.16888],
    [0.05, 22.47701],
  ])("f·Re at α = %f equals the series value %f to ~1e-6", (alpha, po) => {
    expect(Math.abs(poiseuilleNumber(alpha) / po - 1)).toBeLessThan(1e-6);
  });

  // Shah & London 3-decimal values recalled from memory (REFERENCES §1, `mem`), tolerance 5e-5 as the table advises.
  it.each([
    [0.125, 20.585],
    [0.1, 21.169],
  ])("f·Re at α = %f agrees with the 3-decimal S&L value %f (from memory) within 5e-5", (alpha, po) => {
    expect(Math.abs(poiseuilleNumber(alpha) / po - 1)).toBeLessThan(5e-5);
  });

  // R·wh³/(μL) column of REFERENCES §1 (`calc`): 28.45415 for the square … 12.39045 at α = 0.05.
  it.each([
    [1, 28.45415],
    [0.5, 17.49156],
    [0.25, 14.24436],
    [0.05, 12.39045],
  ])("R·w·h³/(μL) at α = %f is %f", (alpha, value) => {
    const w = 200e-6;
    const h = alpha * w;
    expect(rectangleResistanceFactor(w, h) * w * h ** 3).toBeCloseTo(value, 4);
  });

  it("tends to the parallel-plate limit 12μL/(wh³) as h/w → 0 (REFERENCES §1: Po → 24)", () => {
    expect(poiseuilleNumber(1e-4)).toBeCloseTo(23.9967, 3);
  });

  it("is symmetric in width and depth (the section is the same rectangle turned)", () => {
    expect(rectangleResistanceFactor(100e-6, 30e-6)).toBeCloseTo(rectangleResistanceFactor(30e-6, 100e-6), 20);
  });

  // 1 − 0.63 h/w approximation (Bruus 2008 Table 4.1, from memory): REFERENCES §1 lists its error +13.98 % for the square.
  it("differs from the 1 − 0.63 h/w approximation by the tabulated 13.98 % for a square", () => {
    const h = 50e-6;
    const approx = 12 / (h * h ** 3 * (1 - 0.63));
    expect(approx / rectangleResistanceFactor(h, h) - 1).toBeCloseTo(0.1398, 3);
  });

  // REFERENCES §7 (`calc` from the series): centre-line τ on the wide wall over 6μQ/(wh²).
  it.each([
    [1, 1.6012],
    [0.5, 1.3557],
    [0.25, 1.1834],
    [0.1, 1.0672],
    [0.01, 1.0063],
  ])("peak wall shear at h/w = %f is %f × 6μQ/(wh²)", (alpha, ratio) => {
    const w = 400e-6;
    const h = alpha * w;
    const s = rectangleSection(w, h);
    expect(s.wallShearFactorPerM3 / (6 / (w * h * h))).toBeCloseTo(ratio, 3);
  });
});

describe("other cross-sections", () => {
  // Hagen–Poiseuille R = 8μL/(πa⁴) (REFERENCES §2, page) and Fanning fRe = 16.
  it("circle: Hagen–Poiseuille resistance, τ = 4μQ/(πa³), fRe = 16", () => {
    const d = 100e-6;
    const a = d / 2;
    const s = circleSection(d);
    expect(s.resistanceFactorPerM4).toBeCloseTo(8 / (Math.PI * a ** 4), -5);
    expect((s.resistanceFactorPerM4 * s.areaM2 * s.hydraulicDiameterM ** 2) / 2).toBeCloseTo(16, 10);
    expect(s.wallShearFactorPerM3 / (4 / (Math.PI * a ** 3))).toBeCloseTo(1, 12);
  });

  // REFERENCES §2: semicircle R = 13.4428 μL/a⁴, α = RA²/(μL) = 33.1688, fRe 15.7668 (S&L 15.767 from memory).
  it("semicircle: R·a⁴/(μL) = 13.4428 and fRe = 15.767", () => {
    const a = 40e-6;
    const s = semicircleSection(a);
    expect(s.resistanceFactorPerM4 * a ** 4).toBeCloseTo(13.4428, 3);
    expect(s.resistanceFactorPerM4 * s.areaM2 ** 2).toBeCloseTo(33.1688, 3);
    expect((s.resistanceFactorPerM4 * s.areaM2 * s.hydraulicDiameterM ** 2) / 2).toBeCloseTo(15.767, 2);
  });

  // Exact V-groove depth w·tan(54.74°)/2 = 0.7071 w (REFERENCES §6, Petersen 1982). Mortensen, Okkels & Bruus (2005)
  // triangle fit (exact for the equilateral triangle, REFERENCES §2) agrees with the tabulated numerical V-groove within 1 %.
  it("KOH: V-groove depth limit is 0.7071 × the mask width; tabulated resistance agrees with Mortensen's triangle fit", () => {
    const w = 100e-6;
    expect(kohMaxDepthM(w) / w).toBeCloseTo(Math.SQRT1_2, 10);
    const v = kohTrapezoidSection(w, kohMaxDepthM(w));
    expect(v.areaM2).toBeCloseTo((w * kohMaxDepthM(w)) / 2, 18);
    const c = v.perimeterM ** 2 / v.areaM2;
    const fit = (25 / 17) * c + (40 * Math.sqrt(3)) / 17;
    expect(shapeFactorResistanceFactor("trapezoid_koh", w, kohMaxDepthM(w)) * v.areaM2 ** 2).toBeCloseTo(fit, 8);
    expect(Math.abs((v.resistanceFactorPerM4 * v.areaM2 ** 2) / fit - 1)).toBeLessThan(0.01);
  });

  it("KOH trapezoid: floor = w − √2·d and sidewall length d/sin(54.74°)", () => {
    const w = 200e-6;
    const d = 30e-6;
    const s = kohTrapezoidSection(w, d);
    const floor = w - Math.SQRT2 * d;
    expect(s.areaM2).toBeCloseTo(((w + floor) / 2) * d, 18);
    expect(s.perimeterM).toBeCloseTo(w + floor + 2 * d * Math.sqrt(1.5), 15);
  });

  // Isotropic etch geometry (Iliescu et al. 2012, REFERENCES §6): floor w − 2d, quarter-circle walls of radius d.
  it("isotropic etch at w = 2d is the exact semicircle (REFERENCES §2: 13.4428 μL/a⁴)", () => {
    const a = 30e-6;
    expect(isotropicEtchSection(2 * a, a).resistanceFactorPerM4 * a ** 4).toBeCloseTo(13.4428, 3);
  });

  it("isotropic etch: area and perimeter of the D profile; resistance between the rectangle of the same depth and a narrower one", () => {
    const w = 150e-6;
    const d = 25e-6;
    const s = isotropicEtchSection(w, d);
    expect(s.areaM2).toBeCloseTo((w - 2 * d) * d + (Math.PI * d * d) / 2, 18);
    expect(s.perimeterM).toBeCloseTo(w + (w - 2 * d) + Math.PI * d, 15);
    // The D lies inside the w × d rectangle and contains the (w − 2d) × d one, so its resistance lies between theirs
    // (resistance falls as a section grows: Poiseuille flow is monotone in the domain).
    expect(s.resistanceFactorPerM4).toBeGreaterThan(rectangleResistanceFactor(w, d));
    expect(s.resistanceFactorPerM4).toBeLessThan(rectangleResistanceFactor(w - 2 * d, d));
  });
});

describe("segments along their length", () => {
  it("a uniform segment's resistance is R'·L", () => {
    const net = buildNetwork({ nodes: { a: [0, 0], b: [1e-2, 0] }, segments: [{ from: "a", to: "b", lengthM: 1e-2, widthM: 100e-6, depthM: 50e-6 }] });
    const s = integrateSegmentSection(net.segments[0]);
    expect(s.resistancePerViscosityPerM3).toBeCloseTo(rectangleResistanceFactor(100e-6, 50e-6) * 1e-2, -3);
  });

  // Closed form for a linearly tapered circular channel: ∫ 8/(π a(s)⁴) ds = (8L/(3π)) (a₀⁻³ − a₁⁻³)/(a₁ − a₀) · … derived by hand:
  // with a(s) = a₀ + (a₁ − a₀)s/L, ∫₀ᴸ a⁻⁴ ds = L (a₀⁻³ − a₁⁻³) / (3 (a₁ − a₀)).
  it("a tapered round channel integrates to the closed form within 1e-8", () => {
    const L = 5e-3;
    const d0 = 200e-6;
    const d1 = 100e-6;
    const net = buildNetwork({ nodes: { a: [0, 0], b: [L, 0] }, segments: [{ from: "a", to: "b", lengthM: L, widthM: d0, endWidthM: d1, depthM: d0, section: "circular" }] });
    const s = integrateSegmentSection(net.segments[0]);
    const a0 = d0 / 2;
    const a1 = d1 / 2;
    const exact = (8 / Math.PI) * ((L * (a0 ** -3 - a1 ** -3)) / (3 * (a1 - a0)));
    expect(Math.abs(s.resistancePerViscosityPerM3 / exact - 1)).toBeLessThan(1e-8);
  });

  it("rejects a zero-length segment with a message naming it", () => {
    const net = buildNetwork({ nodes: { a: [0, 0], b: [0, 0] }, segments: [{ id: "S9", from: "a", to: "b", lengthM: 0, widthM: 1e-4, depthM: 5e-5 }] });
    expect(() => integrateSegmentSection(net.segments[0])).toThrow(/Segment S9 has length 0/);
  });

  it("rejects a missing depth with a message saying what to set", () => {
    const net = buildNetwork({ nodes: { a: [0, 0], b: [1e-3, 0] }, segments: [{ id: "S2", from: "a", to: "b", lengthM: 1e-3, widthM: 1e-4, depthM: 0 }] });
    expect(() => integrateSegmentSection(net.segments[0])).toThrow(/depth/);
  });
});
