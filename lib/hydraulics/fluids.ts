/**
 * Fluid and solute presets, and the resolution of a conditions fluid (preset,
 * temperature, explicit overrides) to SI properties with a source for each value.
 */
import type { ResolvedFluid } from "./types";
import { ConditionsError } from "../errors";
import { parseQuantity, type QuantityInput } from "../units/quantity";
import { waterDensityKgPerM3, waterSurfaceTensionNPerM, waterViscosityPaS } from "./water";
import { BOLTZMANN_J_PER_K } from "./constants";

export interface FluidSpec {
  preset?: string;
  temperature?: QuantityInput;
  viscosity?: QuantityInput;
  density?: QuantityInput;
  surface_tension?: QuantityInput;
  diffusivity?: QuantityInput;
  name?: string;
}

interface FluidPreset {
  label: string;
  /** Properties at a temperature (K); the sources say how each was obtained. */
  at(temperatureK: number): { viscosityPaS: number; densityKgPerM3: number; surfaceTensionNPerM: number };
  sources: { viscosity: string; density: string; surface_tension: string };
  description: string;
}

const IAPWS_SOURCES = {
  viscosity: "IAPWS R12-08 (2008) viscosity formulation at the 0.1 MPa density",
  density: "Kell (1975) fit to liquid water at 0.1 MPa, within 3 ppm of IAPWS-95",
  surface_tension: "IAPWS R1-76(2014) surface tension of water",
};

/** Cheng (2008) glycerol–water viscosity; inputs mass fraction of glycerol and °C; mPa·s out. */
// Cheng, Ind. Eng. Chem. Res. 47, 3285 (2008), eqs. for μ_w, μ_g, a, b, α (from memory; checked against handbook values in the tests).
export function glycerolWaterViscosityPaS(massFraction: number, temperatureC: number): number {
  const T = temperatureC;
  const cm = massFraction;
  const muW = 1.79 * Math.exp(((-1230 - T) * T) / (36100 + 360 * T));
  const muG = 12100 * Math.exp(((-1233 + T) * T) / (9900 + 70 * T));
  const a = 0.705 - 0.0017 * T;
  const b = (4.9 + 0.036 * T) * a ** 2.5;
  const alpha = 1 - cm + (a * b * cm * (1 - cm)) / (a * cm + b * (1 - cm));
  return muW ** alpha * muG ** (1 - alpha) * 1e-3;
}

/** Glycerol density, kg/m³ (typical value: 1261 at 20 °C, −0.65 kg/m³ per K; handbook order, from memory). */
function glycerolDensityKgPerM3(temperatureK: number): number {
  return 1261 - 0.65 * (temperatureK - 293.15);
}

function glycerolWater(massFraction: number): FluidPreset {
  return {
    label: `Glycerol–water, ${Math.round(massFraction * 100)} wt% glycerol`,
    at(tK) {
      const rhoW = waterDensityKgPerM3(tK);
      const rhoG = glycerolDensityKgPerM3(tK);
      // Ideal mixing by volume (no contraction, ≈1 % low at 50 wt%): typical value.
      const rho = 1 / (massFraction / rhoG + (1 - massFraction) / rhoW);
      // Surface tension: linear in mass fraction between water and glycerol (63.4 mN/m): typical value.
      const sigma = (1 - massFraction) * waterSurfaceTensionNPerM(tK) + massFraction * 63.4e-3;
      return { viscosityPaS: glycerolWaterViscosityPaS(massFraction, tK - 273.15), densityKgPerM3: rho, surfaceTensionNPerM: sigma };
    },
    sources: {
      viscosity: "Cheng (2008), Ind. Eng. Chem. Res. 47, 3285, glycerol–water correlation",
      density: "ideal volume mixing of water (Kell 1975) and glycerol (typical value)",
      surface_tension: "linear in mass fraction between water (IAPWS) and glycerol (typical value)",
    },
    description: "Glycerol–water mixture; give the glycerol mass percentage in the preset name, e.g. glycerol_water_60.",
  };
}

/** Built-in fluids. Values marked "typical" are representative, not a standard: give explicit properties for your batch. */
export const FLUID_PRESETS: Record<string, FluidPreset> = {
  water: {
    label: "Water",
    at: (tK) => ({ viscosityPaS: waterViscosityPaS(tK), densityKgPerM3: waterDensityKgPerM3(tK), surfaceTensionNPerM: waterSurfaceTensionNPerM(tK) }),
    sources: IAPWS_SOURCES,
    description: "Pure water at 0.1 MPa, 0–100 °C, from the IAPWS formulations.",
  },
  aqueous_buffer: {
    label: "Aqueous buffer (PBS-like)",
    at: (tK) => ({
      viscosityPaS: 1.02 * waterViscosityPaS(tK),
      densityKgPerM3: waterDensityKgPerM3(tK) + 5,
      surfaceTensionNPerM: waterSurfaceTensionNPerM(tK),
    }),
    sources: {
      viscosity: "water (IAPWS 2008) × 1.02, typical value for a dilute saline buffer",
      density: "water (Kell 1975) + 5 kg/m³, typical value for a dilute saline buffer",
      surface_tension: "water (IAPWS R1-76), typical value; surfactants lower it",
    },
    description: "Dilute saline buffer; typical values scaled from water.",
  },
  mineral_oil_light: {
    label: "Light mineral oil",
    // Typical light mineral oil: 27 mPa·s at 25 °C with an Andrade-type temperature slope; 840 kg/m³; 30 mN/m.
    at: (tK) => ({
      viscosityPaS: 27e-3 * Math.exp(2900 * (1 / tK - 1 / 298.15)),
      densityKgPerM3: 840 - 0.6 * (tK - 298.15),
      surfaceTensionNPerM: 30e-3,
    }),
    sources: { viscosity: "typical value (27 mPa·s at 25 °C, Andrade-type T dependence)", density: "typical value", surface_tension: "typical value" },
    description: "Light mineral oil; grades vary widely, so give the supplier's viscosity for real work.",
  },
  fluorinated_oil: {
    label: "Fluorinated oil (HFE-type)",
    at: (tK) => ({
      viscosityPaS: 1.24e-3 * Math.exp(1600 * (1 / tK - 1 / 298.15)),
      densityKgPerM3: 1614 - 2.3 * (tK - 298.15),
      surfaceTensionNPerM: 16.2e-3,
    }),
    sources: {
      viscosity: "typical value for a hydrofluoroether droplet oil (1.24 mPa·s at 25 °C, from memory)",
      density: "typical value (1614 kg/m³ at 25 °C, from memory)",
      surface_tension: "typical value (16.2 mN/m, from memory)",
    },
    description: "Hydrofluoroether-type oil used as the carrier in droplet chips; typical values.",
  },
  ethanol: {
    label: "Ethanol",
    at: (tK) => ({
      viscosityPaS: 1.074e-3 * Math.exp(1660 * (1 / tK - 1 / 298.15)),
      densityKgPerM3: 785.1 - 0.85 * (tK - 298.15),
      surfaceTensionNPerM: 21.97e-3 - 0.0832e-3 * (tK - 298.15),
    }),
    sources: {
      viscosity: "typical handbook value (1.074 mPa·s at 25 °C, from memory) with an Arrhenius-type T slope",
      density: "typical handbook value (785.1 kg/m³ at 25 °C, from memory)",
      surface_tension: "typical handbook value (21.97 mN/m at 25 °C, from memory)",
    },
    description: "Absolute ethanol; typical handbook values.",
  },
  glycerol_water: glycerolWater(0.5),
};

const GLYCEROL_PATTERN = /^glycerol_water_(\d{1,3}(?:\.\d+)?)$/;

function findPreset(name: string): FluidPreset | null {
  if (FLUID_PRESETS[name]) return FLUID_PRESETS[name];
  const m = GLYCEROL_PATTERN.exec(name);
  if (m) {
    const pct = Number(m[1]);
    if (pct >= 0 && pct <= 100) return glycerolWater(pct / 100);
  }
  return null;
}

/** Default analysis temperature when the conditions give none: 25 °C (common practice for bench-top chips). */
export const DEFAULT_TEMPERATURE_K = 298.15;

/**
 * Resolve a fluid spec to SI. Explicit properties override the preset's; a spec with no preset and no
 * explicit viscosity and density is water. `field` names the place in the conditions for error messages.
 * @throws ConditionsError for an unknown preset, a wrong unit or a non-positive property.
 */
export function resolveFluid(spec: FluidSpec | undefined, field = "fluid", fallbackTemperatureK = DEFAULT_TEMPERATURE_K): ResolvedFluid {
  const s = spec ?? {};
  const temperatureK = s.temperature !== undefined ? parseQuantity(s.temperature, "temperature", `${field}.temperature`) : fallbackTemperatureK;
  if (!(temperatureK > 0)) throw new ConditionsError("invalid_temperature", `${field}.temperature must be above absolute zero.`);
  const explicitAll = s.viscosity !== undefined && s.density !== undefined && s.surface_tension !== undefined;
  const presetName = s.preset ?? (explicitAll ? null : "water");
  let base: { viscosityPaS: number; densityKgPerM3: number; surfaceTensionNPerM: number } | null = null;
  let sources: Record<string, string> = {};
  let label = s.name ?? "User fluid";
  if (presetName) {
    const preset = findPreset(presetName);
    if (!preset) {
      throw new ConditionsError(
        "unknown_fluid",
        `${field}.preset "${presetName}" is not a fluid Stokeline knows; use one of ${Object.keys(FLUID_PRESETS).join(", ")} (or glycerol_water_NN for NN wt% glycerol), or give viscosity, density and surface_tension yourself.`,
      );
    }
    base = preset.at(temperatureK);
    sources = { ...preset.sources };
    label = s.name ?? preset.label;
  }
  const pick = (key: "viscosity" | "density" | "surface_tension", dim: "viscosity" | "density" | "surface_tension", presetValue: number | undefined) => {
    const raw = s[key];
    if (raw !== undefined) {
      const v = parseQuantity(raw, dim, `${field}.${key}`);
      if (!(v > 0)) throw new ConditionsError("invalid_property", `${field}.${key} must be positive.`);
      sources[key] = "given in the conditions";
      return v;
    }
    if (presetValue === undefined) {
      throw new ConditionsError("missing_property", `${field}.${key} is missing; give it or pick a preset.`);
    }
    return presetValue;
  };
  return {
    name: label,
    temperatureK,
    viscosityPaS: pick("viscosity", "viscosity", base?.viscosityPaS),
    densityKgPerM3: pick("density", "density", base?.densityKgPerM3),
    surfaceTensionNPerM: pick("surface_tension", "surface_tension", base?.surfaceTensionNPerM),
    sources,
  };
}

/** List the fluid presets for the app: name, label, description, sources. */
export function listFluidPresets(): { name: string; label: string; description: string; sources: Record<string, string> }[] {
  return Object.entries(FLUID_PRESETS).map(([name, p]) => ({ name, label: p.label, description: p.description, sources: p.sources }));
}

interface SolutePreset {
  label: string;
  /** Diffusivity in water at the reference temperature, m²/s, or a Stokes–Einstein radius. */
  diffusivityM2PerS?: number;
  referenceK?: number;
  stokesRadiusM?: number;
  source: string;
}

/** Solutes in water (REFERENCES §4); diffusivities scale to the analysis temperature and viscosity by D ∝ T/μ (Stokes–Einstein). */
export const SOLUTE_PRESETS: Record<string, SolutePreset> = {
  small_molecule: { label: "Small molecule", diffusivityM2PerS: 5e-10, referenceK: 298.15, source: "typical value for a small organic molecule in water (order of magnitude)" },
  fluorescein: { label: "Fluorescein", diffusivityM2PerS: 4.25e-10, referenceK: 298.15, source: "Culbertson, Jacobson & Ramsey, Talanta 56, 365 (2002) (from memory)" },
  glucose: { label: "D-glucose", diffusivityM2PerS: 6.79e-10, referenceK: 298.15, source: "Ribeiro et al., J. Chem. Eng. Data 51, 1836 (2006), Table 5" },
  protein_bsa: { label: "Bovine serum albumin", diffusivityM2PerS: 5.92e-11, referenceK: 293.15, source: "photon-correlation spectroscopy of BSA in water, 20 °C (REFERENCES §4)" },
  igg: { label: "Immunoglobulin G", stokesRadiusM: 5.3e-9, source: "Stokes–Einstein with R_h ≈ 5.3 nm (typical value)" },
  cell: { label: "Cell (10 µm)", stokesRadiusM: 5e-6, source: "Stokes–Einstein for a 10 µm sphere (typical cell size)" },
};

/** Stokes–Einstein: D = k_B T / (6π μ r); temperature K, viscosity Pa·s, radius m → m²/s. */
export function stokesEinsteinDiffusivity(temperatureK: number, viscosityPaS: number, radiusM: number): number {
  return (BOLTZMANN_J_PER_K * temperatureK) / (6 * Math.PI * viscosityPaS * radiusM);
}

/**
 * Solute diffusivity at the analysis temperature in the given carrier viscosity, m²/s.
 * Explicit `diffusivity` wins. Tabulated values are scaled from water at their reference temperature by D ∝ T/μ.
 * @throws ConditionsError for an unknown preset or a bad quantity.
 */
export function resolveSoluteDiffusivity(
  solute: { preset?: string; diffusivity?: QuantityInput } | undefined,
  fluidDiffusivity: QuantityInput | undefined,
  temperatureK: number,
  viscosityPaS: number,
): { diffusivityM2PerS: number; source: string } {
  const explicit = solute?.diffusivity ?? fluidDiffusivity;
  if (explicit !== undefined) {
    const d = parseQuantity(explicit, "diffusivity", solute?.diffusivity !== undefined ? "solute.diffusivity" : "fluid.diffusivity");
    if (!(d > 0)) throw new ConditionsError("invalid_property", "The solute diffusivity must be positive.");
    return { diffusivityM2PerS: d, source: "given in the conditions" };
  }
  const name = solute?.preset ?? "small_molecule";
  const p = SOLUTE_PRESETS[name];
  if (!p) {
    throw new ConditionsError("unknown_solute", `solute.preset "${name}" is not known; use one of ${Object.keys(SOLUTE_PRESETS).join(", ")} or give "diffusivity".`);
  }
  if (p.stokesRadiusM !== undefined) {
    return { diffusivityM2PerS: stokesEinsteinDiffusivity(temperatureK, viscosityPaS, p.stokesRadiusM), source: p.source };
  }
  const refK = p.referenceK ?? 298.15;
  // REFERENCES §4: D₂ = D₁ (T₂/T₁)(μ₁/μ₂), μ₁ water at the reference temperature.
  const d = p.diffusivityM2PerS! * (temperatureK / refK) * (waterViscosityPaS(refK) / viscosityPaS);
  return { diffusivityM2PerS: d, source: `${p.source}; scaled by T/μ to the analysis conditions` };
}
