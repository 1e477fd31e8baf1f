/**
 * Liquid water at 0.1 MPa: density, viscosity and surface tension from the
 * international formulations. Pure functions of temperature (and density for
 * the viscosity correlation), SI in and out.
 */
import { ConditionsError } from "../errors";

/** Critical temperature of water, K (IAPWS-95). */
export const WATER_CRITICAL_TEMPERATURE_K = 647.096;
/** Critical density of water, kg/m³ (IAPWS-95). */
export const WATER_CRITICAL_DENSITY_KG_PER_M3 = 322.0;

/** Range over which the liquid-water presets are offered at 0.1 MPa (melting to boiling). */
export const WATER_LIQUID_RANGE_K = { minK: 273.15, maxK: 373.12 } as const;

function checkLiquidRange(temperatureK: number): void {
  if (!(temperatureK >= WATER_LIQUID_RANGE_K.minK - 0.01 && temperatureK <= WATER_LIQUID_RANGE_K.maxK)) {
    throw new ConditionsError(
      "temperature_out_of_range",
      `Water is not liquid at ${(temperatureK - 273.15).toFixed(2)} °C and 0.1 MPa; give a temperature between 0 and 99.9 °C.`,
    );
  }
}

/**
 * Density of air-free water at 0.1 MPa, kg/m³, for 0–100 °C.
 * Kell (1975) fit, J. Chem. Eng. Data 20, 97 (from memory); agrees with IAPWS-95 at 0.1 MPa within 3 ppm (checked in the tests).
 * @throws ConditionsError outside the liquid range.
 */
export function waterDensityKgPerM3(temperatureK: number): number {
  checkLiquidRange(temperatureK);
  const t = temperatureK - 273.15;
  // Kell 1975, eq. for ρ(t) at 1 atm.
  return (
    (999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3 + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5) /
    (1 + 16.87985e-3 * t)
  );
}

// IAPWS R12-08 (2008) viscosity, Table 1 (dilute gas) and Table 2 (residual) coefficients H_i, H_ij.
const H0 = [1.67752, 2.20462, 0.6366564, -0.241605];
const H1: [number, number, number][] = [
  [0, 0, 5.20094e-1], [1, 0, 8.50895e-2], [2, 0, -1.08374], [3, 0, -2.89555e-1],
  [0, 1, 2.22531e-1], [1, 1, 9.99115e-1], [2, 1, 1.88797], [3, 1, 1.26613], [5, 1, 1.20573e-1],
  [0, 2, -2.81378e-1], [1, 2, -9.06851e-1], [2, 2, -7.72479e-1], [3, 2, -4.89837e-1], [4, 2, -2.5704e-1],
  [0, 3, 1.61913e-1], [1, 3, 2.57399e-1],
  [0, 4, -3.25372e-2], [3, 4, 6.98452e-2],
  [4, 5, 8.72102e-3],
  [3, 6, -4.35673e-3], [5, 6, -5.93264e-4],
];

/**
 * Viscosity of water substance μ(T, ρ), Pa·s, by the IAPWS 2008 formulation
 * (IAPWS R12-08, Huber et al., J. Phys. Chem. Ref. Data 38, 101 (2009)) without the
 * critical enhancement μ̄₂ (= 1 outside a small region around the critical point).
 * Inputs: temperature K, density kg/m³. Valid wherever IAPWS-95 is.
 */
export function waterViscosityIapws2008PaS(temperatureK: number, densityKgPerM3: number): number {
  const tBar = temperatureK / WATER_CRITICAL_TEMPERATURE_K;
  const rhoBar = densityKgPerM3 / WATER_CRITICAL_DENSITY_KG_PER_M3;
  // IAPWS 2008 eq. (11): dilute-gas limit μ̄₀.
  let denom = 0;
  for (let i = 0; i < 4; i++) denom += H0[i] / tBar ** i;
  const mu0 = (100 * Math.sqrt(tBar)) / denom;
  // IAPWS 2008 eq. (12): residual contribution μ̄₁.
  const x = 1 / tBar - 1;
  const y = rhoBar - 1;
  let sum = 0;
  for (const [i, j, h] of H1) sum += h * x ** i * y ** j;
  const mu1 = Math.exp(rhoBar * sum);
  return mu0 * mu1 * 1e-6; // μ* = 1 μPa·s
}

/**
 * Viscosity of liquid water at 0.1 MPa, Pa·s: IAPWS 2008 evaluated at the 0.1 MPa density.
 * @throws ConditionsError outside the liquid range.
 */
export function waterViscosityPaS(temperatureK: number): number {
  return waterViscosityIapws2008PaS(temperatureK, waterDensityKgPerM3(temperatureK));
}

/**
 * Surface tension of water against its vapour (and, within ≈0.1 mN/m, against air), N/m.
 * IAPWS R1-76(2014): σ = B τ^μ (1 + b τ), τ = 1 − T/Tc.
 * @throws ConditionsError outside the liquid range.
 */
export function waterSurfaceTensionNPerM(temperatureK: number): number {
  checkLiquidRange(temperatureK);
  const tau = 1 - temperatureK / WATER_CRITICAL_TEMPERATURE_K;
  return 235.8e-3 * tau ** 1.256 * (1 - 0.625 * tau);
}
