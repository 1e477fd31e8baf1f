/**
 * Dimensionless groups and derived per-segment quantities. One formula per
 * function, SI inputs, each with its source. The force scalings behind them:
 * viscous ∝ μUL, inertial ∝ ρU²L², surface ∝ σL, gravity ∝ ρgL³.
 */
import { STANDARD_GRAVITY_M_PER_S2 } from "./constants";

/** Reynolds number Re = ρ U D_h / μ (inertial / viscous). */
export function reynoldsNumber(densityKgPerM3: number, speedMPerS: number, hydraulicDiameterM: number, viscosityPaS: number): number {
  return (densityKgPerM3 * speedMPerS * hydraulicDiameterM) / viscosityPaS;
}

/** Capillary number Ca = μ U / σ (viscous / surface), continuous-phase viscosity. */
export function capillaryNumber(viscosityPaS: number, speedMPerS: number, tensionNPerM: number): number {
  return (viscosityPaS * speedMPerS) / tensionNPerM;
}

/** Weber number We = ρ U² D_h / σ (inertial / surface). */
export function weberNumber(densityKgPerM3: number, speedMPerS: number, hydraulicDiameterM: number, tensionNPerM: number): number {
  return (densityKgPerM3 * speedMPerS * speedMPerS * hydraulicDiameterM) / tensionNPerM;
}

/** Péclet number Pe = U w / D, w the width across which the solute must diffuse (Squires & Quake, Rev. Mod. Phys. 77, 977 (2005)). */
export function pecletNumber(speedMPerS: number, widthM: number, diffusivityM2PerS: number): number {
  return (speedMPerS * widthM) / diffusivityM2PerS;
}

/** Dean number De = Re √(D_h / (2 R_c)), R_c the bend radius of the centreline (Dean 1927/28). */
export function deanNumber(reynolds: number, hydraulicDiameterM: number, bendRadiusM: number): number {
  return reynolds * Math.sqrt(hydraulicDiameterM / (2 * bendRadiusM));
}

/** Bond number Bo = Δρ g L² / σ with g_n = 9.80665 m/s² (gravity / surface). */
export function bondNumber(densityDifferenceKgPerM3: number, lengthM: number, tensionNPerM: number): number {
  return (Math.abs(densityDifferenceKgPerM3) * STANDARD_GRAVITY_M_PER_S2 * lengthM * lengthM) / tensionNPerM;
}

/** Hydrostatic pressure of a liquid column, p = ρ g h, Pa. */
export function hydrostaticPressurePa(densityKgPerM3: number, headM: number): number {
  return densityKgPerM3 * STANDARD_GRAVITY_M_PER_S2 * headM;
}

/** Time to diffuse across a width, t = w² / D, s (Squires & Quake 2005, §III). */
export function diffusionTimeS(widthM: number, diffusivityM2PerS: number): number {
  return (widthM * widthM) / diffusivityM2PerS;
}

/** Length the flow travels while the solute diffuses across the width: Z ≈ Pe·w = U w² / D, m (Squires & Quake 2005, §III). */
export function mixingLengthM(speedMPerS: number, widthM: number, diffusivityM2PerS: number): number {
  return pecletNumber(speedMPerS, widthM, diffusivityM2PerS) * widthM;
}

/**
 * Hydrodynamic entrance length, m. Durst, Ray, Ünsal & Bayoumi, J. Fluids Eng. 127, 1154 (2005)
 * (correlations from memory, REFERENCES §5): pipe L/D = [0.619^1.6 + (0.0567 Re_D)^1.6]^(1/1.6);
 * plane channel L/H = [0.631^1.6 + (0.0442 Re_H)^1.6]^(1/1.6), H the gap between the plates and Re_H on it.
 * Inputs: the Reynolds number on `scaleM` (D for a pipe, H for a channel) and that scale.
 */
export function entranceLengthM(reynoldsOnScale: number, scaleM: number, kind: "pipe" | "channel"): number {
  const [a, b] = kind === "pipe" ? [0.619, 0.0567] : [0.631, 0.0442];
  return scaleM * (a ** 1.6 + (b * Math.abs(reynoldsOnScale)) ** 1.6) ** (1 / 1.6);
}
