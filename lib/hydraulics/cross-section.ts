/**
 * Channel cross-sections: area, wetted perimeter, hydraulic diameter, the
 * hydraulic resistance per unit length and viscosity, and the wall shear per
 * unit flow and viscosity. Fully developed laminar (Poiseuille) flow; SI units.
 */
import type { NetworkSegment, SectionShape, WidthSample } from "../network/types";
import { ConditionsError } from "../errors";
import { SECTION_TABLE_ALPHA, SECTION_TABLE_SHEAR, SECTION_TABLE_X } from "./section-table";

export interface SectionProperties {
  areaM2: number;
  /** Wetted perimeter, lid included. */
  perimeterM: number;
  /** 4A/P. */
  hydraulicDiameterM: number;
  /** R/(μL), 1/m⁴: multiply by viscosity and length for the resistance in Pa·s/m³. */
  resistanceFactorPerM4: number;
  /** τ_w,max/(μQ), 1/m³: multiply by viscosity and flow for the wall shear in Pa. */
  wallShearFactorPerM3: number;
  /** How the resistance was obtained. */
  method: "exact_series" | "exact" | "numerical_table" | "shape_factor";
  /** How the wall shear was obtained. */
  wallShearMethod: "exact_series" | "exact" | "numerical_table";
}

/** ζ(5), Apéry-type constant, for the closed tail of Σ 1/n⁵ (DLMF 25.6, value from memory to 16 digits; the rectangle series values in the tests confirm it). */
const ZETA_5 = 1.03692775514337;
/** Σ over odd n of 1/n⁵ = (1 − 2⁻⁵) ζ(5). */
const ODD_INV_FIFTH = (31 / 32) * ZETA_5;

/** tanh(x) − 1 without cancellation: −2/(e^{2x} + 1). */
function tanhMinusOne(x: number): number {
  return -2 / (Math.exp(2 * x) + 1);
}

/**
 * Σ_{n odd} tanh(nπ/(2α))/n⁵ for α = h/w ≤ 1, to machine precision: the tanh → 1 tail is
 * summed in closed form through ζ(5), and the remaining terms decay like e^{−nπ/α}.
 */
function rectangleTanhSum(alpha: number): number {
  let correction = 0;
  for (let n = 1; ; n += 2) {
    const x = (n * Math.PI) / (2 * alpha);
    const term = tanhMinusOne(x) / n ** 5;
    correction += term;
    if (x > 40) break; // e^{−80}: below double precision
  }
  return ODD_INV_FIFTH + correction;
}

/**
 * Resistance factor R/(μL) of a rectangle w × h, 1/m⁴.
 * Bruus, Theoretical Microfluidics (2008) ch. 4, exact Fourier series:
 * R = 12μL/(w h³) · [1 − (h/w)(192/π⁵) Σ_{n odd} tanh(nπw/2h)/n⁵]⁻¹, with h ≤ w (the section is symmetric in w, h).
 */
export function rectangleResistanceFactor(widthM: number, depthM: number): number {
  const w = Math.max(widthM, depthM);
  const h = Math.min(widthM, depthM);
  const alpha = h / w;
  const bracket = 1 - alpha * (192 / Math.PI ** 5) * rectangleTanhSum(alpha);
  return 12 / (w * h ** 3 * bracket);
}

/**
 * Largest wall shear per unit pressure gradient of a rectangle, at the middle of its longer side, m.
 * From the series velocity field (Bruus 2008 ch. 4): u(y,z) = (4h²G/(π³μ)) Σ_{n odd} n⁻³[1 − cosh(nπy/h)/cosh(nπw/2h)] sin(nπz/h),
 * so μ ∂u/∂z at z = 0, y = 0 is (4hG/π²) Σ_{n odd} n⁻²[1 − sech(nπw/2h)].
 */
function rectangleMaxShearPerGradient(widthM: number, depthM: number): number {
  const w = Math.max(widthM, depthM);
  const h = Math.min(widthM, depthM);
  // Σ_{n odd} 1/n² = π²/8; subtract the sech terms, which decay like e^{−nπw/2h}.
  let sech = 0;
  for (let n = 1; ; n += 2) {
    const x = (n * Math.PI * w) / (2 * h);
    sech += 2 / (Math.exp(x) + Math.exp(-x)) / n ** 2;
    if (x > 40) break;
  }
  return ((4 * h) / Math.PI ** 2) * (Math.PI ** 2 / 8 - sech);
}

/** Rectangle, w × h: exact series for resistance and peak wall shear. */
export function rectangleSection(widthM: number, depthM: number): SectionProperties {
  const areaM2 = widthM * depthM;
  const perimeterM = 2 * (widthM + depthM);
  const r = rectangleResistanceFactor(widthM, depthM);
  // τ = (τ/G)·G and G = Δp/L = R·Q/L = μ r Q, so τ/(μQ) = (τ/G)·r.
  return {
    areaM2,
    perimeterM,
    hydraulicDiameterM: (4 * areaM2) / perimeterM,
    resistanceFactorPerM4: r,
    wallShearFactorPerM3: rectangleMaxShearPerGradient(widthM, depthM) * r,
    method: "exact_series",
    wallShearMethod: "exact_series",
  };
}

/** Circle of diameter d: Hagen–Poiseuille R = 8μL/(πa⁴), τ_w = 4μQ/(πa³). */
export function circleSection(diameterM: number): SectionProperties {
  const a = diameterM / 2;
  return {
    areaM2: Math.PI * a * a,
    perimeterM: 2 * Math.PI * a,
    hydraulicDiameterM: diameterM,
    resistanceFactorPerM4: 8 / (Math.PI * a ** 4), // Hagen–Poiseuille
    wallShearFactorPerM3: 4 / (Math.PI * a ** 3), // τ_w = 4μQ/(πa³)
    method: "exact",
    wallShearMethod: "exact",
  };
}

/**
 * Q·μ/(G a⁴) for a half-disc of radius a, exact: particular solution −(G/2μ)r² sin²θ plus
 * Σ_{n odd} b_n rⁿ sin nθ fitted to the arc (separation of variables in polar coordinates; derived
 * here, and checked in the tests against the 13.4428 μL/a⁴ of REFERENCES §2, itself an independent series).
 * Written out because no library gives this constant.
 */
function semicircleFlowConstant(): number {
  let s = -Math.PI / 16;
  for (let n = 1; n < 20001; n += 2) s += -8 / (Math.PI * n * n * (n - 2) * (n + 2) ** 2);
  return s;
}
const SEMICIRCLE_K = semicircleFlowConstant();

/**
 * Mortensen, Okkels & Bruus, Phys. Rev. E 71, 057301 (2005): R ≈ α(C) μL/A² with C = P²/A,
 * linear fits α ≈ (22/7)C − 65/3 (rectangle-like sections) and α ≈ (25/17)C + 40√3/17 (triangles).
 * Measured against a numerical Poiseuille solve (tests/fixtures/networks/generate-sections.py): D profiles off by
 * up to 5 %, KOH trapezoids with a floor by 6–25 % (too high), V-grooves within 0.5 %. Kept as a cross-check
 * (shapeFactorResistanceFactor); the engine uses the tabulated numerical solution below (≤ 0.05 %).
 */
function mortensenAlpha(perimeterM: number, areaM2: number, family: "rectangle" | "triangle"): number {
  const c = (perimeterM * perimeterM) / areaM2;
  return family === "rectangle" ? (22 / 7) * c - 65 / 3 : (25 / 17) * c + (40 * Math.sqrt(3)) / 17;
}

/** Mortensen et al. (2005) shape-factor estimate R/(μL), 1/m⁴, for comparison with the tabulated values. */
export function shapeFactorResistanceFactor(shape: "isotropic_etch" | "trapezoid_koh", topWidthM: number, depthM: number): number {
  const s = shape === "isotropic_etch" ? isotropicEtchSection(topWidthM, depthM) : kohTrapezoidSection(topWidthM, depthM);
  const floorless = shape === "trapezoid_koh" && depthM >= kohMaxDepthM(topWidthM) * (1 - 1e-9);
  return mortensenAlpha(s.perimeterM, s.areaM2, floorless ? "triangle" : "rectangle") / (s.areaM2 * s.areaM2);
}

/** 4-point Lagrange interpolation in a table, clamped to its ends (below the first node the value is held). */
function interpolateTable(xs: readonly number[], ys: readonly number[], xIn: number): number {
  const x = Math.min(Math.max(xIn, xs[0]), xs[xs.length - 1]);
  if (x <= xs[0]) return ys[0];
  let j = 0;
  while (j + 1 < xs.length - 1 && xs[j + 1] < x) j++;
  const lo = Math.max(0, Math.min(j - 1, xs.length - 4));
  let y = 0;
  for (let a = lo; a < lo + 4; a++) {
    let l = 1;
    for (let b = lo; b < lo + 4; b++) if (b !== a) l *= (x - xs[b]) / (xs[a] - xs[b]);
    y += l * ys[a];
  }
  return y;
}

/**
 * Peak wall shear per unit pressure gradient of a D profile or KOH trapezoid, m: depth × the tabulated value
 * (same numerical solve as the resistance; wide sections tend to the plane-Poiseuille d/2).
 */
function tabulatedShearPerGradient(shape: "isotropic_etch" | "trapezoid_koh", topWidthM: number, depthM: number): number {
  return depthM * interpolateTable(SECTION_TABLE_X[shape], SECTION_TABLE_SHEAR[shape], depthM / topWidthM);
}

/**
 * R/(μL) of a D profile or KOH trapezoid from the tabulated numerical solution (lib/hydraulics/section-table.ts).
 * Written as 1/R' = (d³/12)(w − k·d): k, the "end loss" of the two sidewalls in depths, is interpolated in
 * x = d/w (4-point Lagrange); below the first node (w > 10 d) the sidewalls no longer interact and k is constant
 * (as in the rectangle series, where the remaining terms fall like e^{−πw/d}). Area in m² of the section at depth d.
 */
function tabulatedResistanceFactor(shape: "isotropic_etch" | "trapezoid_koh", topWidthM: number, depthM: number): number {
  const xs = SECTION_TABLE_X[shape];
  const as = SECTION_TABLE_ALPHA[shape];
  // End loss at each node, in units of the depth (depth 1, width 1/x): k = w − 12 A²/α.
  const unitArea = (x: number) => {
    const w = 1 / x;
    if (shape === "isotropic_etch") return (w - 2) + Math.PI / 2;
    const floor = Math.max(0, w - 2 / Math.tan(KOH_SIDEWALL_RAD));
    return ((w + floor) / 2) * 1;
  };
  const ks = xs.map((x, i) => 1 / x - (12 * unitArea(x) ** 2) / as[i]);
  const k = interpolateTable(xs, ks, depthM / topWidthM);
  return 12 / (depthM ** 3 * (topWidthM - k * depthM));
}

/** Half-disc of radius a (= depth), flat side on the lid: exact series resistance, tabulated peak shear. */
export function semicircleSection(radiusM: number): SectionProperties {
  const a = radiusM;
  const areaM2 = (Math.PI * a * a) / 2;
  const perimeterM = (Math.PI + 2) * a;
  const r = 1 / (SEMICIRCLE_K * a ** 4);
  return {
    areaM2,
    perimeterM,
    hydraulicDiameterM: (4 * areaM2) / perimeterM,
    resistanceFactorPerM4: r,
    // The D table's last node (w = 2d) is this half-disc.
    wallShearFactorPerM3: tabulatedShearPerGradient("isotropic_etch", 2 * a, a) * r,
    method: "exact",
    wallShearMethod: "numerical_table",
  };
}

/**
 * Isotropic wet etch ("D" profile): top width w, depth d, flat floor w − 2d, quarter-circle walls of
 * radius d (Iliescu et al., Biomicrofluidics 6, 016505 (2012), geometry). A top narrower than 2d is
 * taken as floor 0 with walls of radius w/2 (the fabrication rules flag it). Resistance from the tabulated
 * numerical solution (exact semicircle at w = 2d).
 */
export function isotropicEtchSection(topWidthM: number, depthM: number): SectionProperties {
  const d = Math.min(depthM, topWidthM / 2);
  const floor = topWidthM - 2 * d;
  const areaM2 = floor * d + (Math.PI * d * d) / 2;
  const perimeterM = topWidthM + floor + Math.PI * d;
  const r = tabulatedResistanceFactor("isotropic_etch", topWidthM, d);
  return {
    areaM2,
    perimeterM,
    hydraulicDiameterM: (4 * areaM2) / perimeterM,
    resistanceFactorPerM4: r,
    wallShearFactorPerM3: tabulatedShearPerGradient("isotropic_etch", topWidthM, d) * r,
    method: "numerical_table",
    wallShearMethod: "numerical_table",
  };
}

/** KOH sidewall angle on Si(100): arccos(1/√3) = 54.7356° ({111} planes; Petersen, Proc. IEEE 70, 420 (1982)). */
export const KOH_SIDEWALL_RAD = Math.acos(1 / Math.sqrt(3));

/** Deepest a KOH groove of top width w can be before the walls meet (V-groove): w·tan(54.74°)/2 = w/√2. */
export function kohMaxDepthM(topWidthM: number): number {
  return (topWidthM * Math.tan(KOH_SIDEWALL_RAD)) / 2;
}

/**
 * KOH trapezoid: top (mask) width w, depth d, floor w − 2d/tan(54.74°); a groove deeper than the
 * V-groove limit is taken as the V-groove. Resistance from the tabulated numerical solution.
 */
export function kohTrapezoidSection(topWidthM: number, depthM: number): SectionProperties {
  const d = Math.min(depthM, kohMaxDepthM(topWidthM));
  const floor = Math.max(0, topWidthM - (2 * d) / Math.tan(KOH_SIDEWALL_RAD));
  const areaM2 = ((topWidthM + floor) / 2) * d;
  const side = d / Math.sin(KOH_SIDEWALL_RAD);
  const perimeterM = topWidthM + floor + 2 * side;
  const r = tabulatedResistanceFactor("trapezoid_koh", topWidthM, d);
  return {
    areaM2,
    perimeterM,
    hydraulicDiameterM: (4 * areaM2) / perimeterM,
    resistanceFactorPerM4: r,
    wallShearFactorPerM3: tabulatedShearPerGradient("trapezoid_koh", topWidthM, d) * r,
    method: "numerical_table",
    wallShearMethod: "numerical_table",
  };
}

/**
 * Section properties for a shape at a local width and the segment depth.
 * Circular: the width is the diameter. Semicircular: the radius is the depth.
 * @throws ConditionsError when a dimension is not a positive finite length.
 */
export function sectionProperties(shape: SectionShape, widthM: number, depthM: number, where = "a channel"): SectionProperties {
  if (!(widthM > 0) || !Number.isFinite(widthM)) {
    throw new ConditionsError("invalid_section", `${where} has width ${widthM} m; every channel needs a positive width (set the layer's width or draw the channel wider).`);
  }
  if (shape !== "circular" && (!(depthM > 0) || !Number.isFinite(depthM))) {
    throw new ConditionsError("invalid_section", `${where} has no positive depth; give the channel layer a depth in the conditions (e.g. "depth": "50 um").`);
  }
  switch (shape) {
    case "rectangular":
      return rectangleSection(widthM, depthM);
    case "circular":
      return circleSection(widthM);
    case "semicircular":
      return semicircleSection(depthM);
    case "isotropic_etch":
      return isotropicEtchSection(widthM, depthM);
    case "trapezoid_koh":
      return kohTrapezoidSection(widthM, depthM);
  }
}

// Gauss–Legendre 5-point nodes and weights on [−1, 1] (Abramowitz & Stegun, Table 25.4).
const GL_X = [0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664];
const GL_W = [0.5688888888888889, 0.4786286704993665, 0.4786286704993665, 0.2369268850591679, 0.2369268850591679];

export interface SegmentSection {
  /** R/μ: integral of the resistance factor along the length, 1/m³. */
  resistancePerViscosityPerM3: number;
  volumeM3: number;
  /** Length-averaged area, volume / length. */
  meanAreaM2: number;
  /** At the length-averaged width. */
  hydraulicDiameterM: number;
  /** Mean width (volume-weighted for the mixing length), m. */
  meanWidthM: number;
  /** Largest peak-shear factor along the segment (the narrowest place), 1/m³. */
  maxWallShearFactorPerM3: number;
  method: SectionProperties["method"];
  wallShearMethod: SectionProperties["wallShearMethod"];
}

/** The width profile of a segment as (s, w) breakpoints from 0 to L, linear in between. */
export function widthBreakpoints(segment: NetworkSegment): WidthSample[] {
  const L = segment.lengthM;
  const prof = segment.widthProfile;
  if (prof && prof.sM.length >= 2) {
    const pts = prof.sM
      .map((sM, k) => ({ sM, widthM: prof.widthM[k] }))
      .filter((p) => Number.isFinite(p.sM) && Number.isFinite(p.widthM))
      .sort((a, b) => a.sM - b.sM);
    if (pts.length >= 2) {
      const out = pts.map((p) => ({ sM: Math.min(Math.max(p.sM, 0), L), widthM: p.widthM }));
      if (out[0].sM > 0) out.unshift({ sM: 0, widthM: out[0].widthM });
      if (out[out.length - 1].sM < L) out.push({ sM: L, widthM: out[out.length - 1].widthM });
      return out;
    }
  }
  return [
    { sM: 0, widthM: segment.widthM },
    { sM: L, widthM: segment.endWidthM > 0 ? segment.endWidthM : segment.widthM },
  ];
}

/**
 * Integrate a segment's cross-section along its length: R/μ = ∫ r(w(s)) ds by 5-point Gauss–Legendre on each
 * linear piece of the width profile, split so each part spans a small width ratio (~1e-12 on a 2:1 round taper).
 * @throws ConditionsError for a non-positive length, width or depth, naming the segment.
 */
export function integrateSegmentSection(segment: NetworkSegment): SegmentSection {
  const where = `Segment ${segment.id}`;
  if (!(segment.lengthM > 0) || !Number.isFinite(segment.lengthM)) {
    throw new ConditionsError("invalid_segment", `${where} has length ${segment.lengthM} m; a channel piece must be longer than zero (check for overlapping nodes in the drawing).`);
  }
  const pts = widthBreakpoints(segment);
  const uniform = pts.every((p) => Math.abs(p.widthM - pts[0].widthM) <= 1e-12 * pts[0].widthM);
  if (uniform) {
    const p = sectionProperties(segment.section, pts[0].widthM, segment.depthM, where);
    return {
      resistancePerViscosityPerM3: p.resistanceFactorPerM4 * segment.lengthM,
      volumeM3: p.areaM2 * segment.lengthM,
      meanAreaM2: p.areaM2,
      hydraulicDiameterM: p.hydraulicDiameterM,
      meanWidthM: pts[0].widthM,
      maxWallShearFactorPerM3: p.wallShearFactorPerM3,
      method: p.method,
      wallShearMethod: p.wallShearMethod,
    };
  }
  let r = 0;
  let vol = 0;
  let widthIntegral = 0;
  let maxShear = 0;
  let method: SectionProperties["method"] = "exact";
  let shearMethod: SectionProperties["wallShearMethod"] = "exact";
  for (let k = 0; k + 1 < pts.length; k++) {
    const a = pts[k];
    const b = pts[k + 1];
    const ds = b.sM - a.sM;
    if (ds <= 0) continue;
    // Sub-pieces so each spans a width ratio of at most ~e^(1/6): the 5-point rule is then good to ~1e-12 on r ∝ w⁻⁴.
    const ratio = a.widthM > 0 && b.widthM > 0 ? Math.abs(Math.log(b.widthM / a.widthM)) : 1;
    const pieces = 1 + Math.ceil(6 * ratio);
    for (let sub = 0; sub < pieces; sub++) {
      const w0 = a.widthM + ((b.widthM - a.widthM) * sub) / pieces;
      const w1 = a.widthM + ((b.widthM - a.widthM) * (sub + 1)) / pieces;
      for (let g = 0; g < GL_X.length; g++) {
        const t = (GL_X[g] + 1) / 2;
        const w = w0 + t * (w1 - w0);
        const p = sectionProperties(segment.section, w, segment.depthM, where);
        const wt = (GL_W[g] / 2) * (ds / pieces);
        r += p.resistanceFactorPerM4 * wt;
        vol += p.areaM2 * wt;
        widthIntegral += w * wt;
        method = p.method;
        shearMethod = p.wallShearMethod;
      }
    }
    for (const w of [a.widthM, b.widthM]) {
      maxShear = Math.max(maxShear, sectionProperties(segment.section, w, segment.depthM, where).wallShearFactorPerM3);
    }
  }
  const meanWidthM = widthIntegral / segment.lengthM;
  const mean = sectionProperties(segment.section, meanWidthM, segment.depthM, where);
  return {
    resistancePerViscosityPerM3: r,
    volumeM3: vol,
    meanAreaM2: vol / segment.lengthM,
    hydraulicDiameterM: mean.hydraulicDiameterM,
    meanWidthM,
    maxWallShearFactorPerM3: maxShear,
    method,
    wallShearMethod: shearMethod,
  };
}
