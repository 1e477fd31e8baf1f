import { describe, expect, it } from "vitest";
import { waterDensityKgPerM3, waterSurfaceTensionNPerM, waterViscosityIapws2008PaS, waterViscosityPaS } from "@/lib/hydraulics/water";
import { glycerolWaterViscosityPaS, listFluidPresets, resolveFluid, resolveSoluteDiffusivity, stokesEinsteinDiffusivity } from "@/lib/hydraulics/fluids";
import { ConditionsError } from "@/lib/errors";

// REFERENCES §3: water at 0.1 MPa, IAPWS-95 density, IAPWS 2008 viscosity, IAPWS R1-76(2014) surface tension.
const TABLE: [number, number, number, number][] = [
  // T °C, ρ kg/m³, μ mPa·s, σ mN/m
  [0, 999.8424, 1.79176, 75.648],
  [10, 999.7018, 1.3059, 74.221],
  [20, 998.2065, 1.0016, 72.736],
  [25, 997.047, 0.89002, 71.972],
  [30, 995.6489, 0.79722, 71.194],
  [37, 993.3292, 0.6913, 70.081],
  [40, 992.2158, 0.65273, 69.596],
  [50, 988.0345, 0.54652, 67.944],
];

describe("water (IAPWS)", () => {
  it.each(TABLE)("at %f °C: density within 5 ppm of IAPWS-95 (%f)", (t, rho) => {
    expect(Math.abs(waterDensityKgPerM3(t + 273.15) / rho - 1)).toBeLessThan(5e-6);
  });
  it.each(TABLE)("at %f °C: viscosity within 2e-5 of the IAPWS 2008 table (%f mPa·s)", (t, _rho, mu) => {
    expect(Math.abs((waterViscosityPaS(t + 273.15) * 1e3) / mu - 1)).toBeLessThan(2e-5);
  });
  it.each(TABLE)("at %f °C: surface tension within 0.005 mN/m of IAPWS R1-76 (%f)", (t, _rho, _mu, sigma) => {
    expect(Math.abs(waterSurfaceTensionNPerM(t + 273.15) * 1e3 - sigma)).toBeLessThan(0.005);
  });

  // IAPWS 2008 viscosity check values (REFERENCES §3; release Table 4 from memory, values `page` and `code`), μ in μPa·s.
  it.each([
    [298.15, 998, 889.7351],
    [298.15, 1200, 1437.649467],
    [373.15, 1000, 307.883622],
    [433.15, 1, 14.538324],
    [433.15, 1000, 217.685358],
    [873.15, 1, 32.619287],
    [873.15, 100, 35.802262],
    [873.15, 600, 77.430195],
    [1173.15, 1, 44.217245],
    [1173.15, 100, 47.640433],
    [1173.15, 400, 64.154608],
  ])("IAPWS 2008 check value μ(%f K, %f kg/m³) = %f μPa·s to the table's last digit", (T, rho, mu) => {
    expect(Math.abs(waterViscosityIapws2008PaS(T, rho) * 1e6 - mu)).toBeLessThan(1e-6);
  });

  // ISO/TR 3666:1998 reference datum, 20 °C → 1.0016 mPa·s (REFERENCES §3, from memory).
  it("reproduces the 20 °C viscosity datum 1.0016 mPa·s", () => {
    expect(waterViscosityPaS(293.15) * 1e3).toBeCloseTo(1.0016, 4);
  });

  it("refuses temperatures where water is not liquid at 0.1 MPa", () => {
    expect(() => waterDensityKgPerM3(400)).toThrow(ConditionsError);
  });
});

describe("fluid resolution", () => {
  it("defaults to water at 25 °C with its sources named", () => {
    const f = resolveFluid(undefined);
    expect(f.temperatureK).toBe(298.15);
    expect(f.viscosityPaS * 1e3).toBeCloseTo(0.89002, 4); // REFERENCES §3
    expect(f.sources.viscosity).toMatch(/IAPWS/);
  });
  it("lets explicit properties override a preset and marks them as given", () => {
    const f = resolveFluid({ preset: "water", temperature: "37 degC", viscosity: "1.2 mPa s" });
    expect(f.viscosityPaS).toBeCloseTo(1.2e-3, 12);
    expect(f.densityKgPerM3).toBeCloseTo(993.3292, 2); // REFERENCES §3 at 37 °C
    expect(f.sources.viscosity).toBe("given in the conditions");
  });
  it("names the known presets when one is unknown", () => {
    expect(() => resolveFluid({ preset: "honey" })).toThrow(/not a fluid Stokeline knows.*water/);
  });
  it("refuses a viscosity typed in the wrong dimension", () => {
    expect(() => resolveFluid({ viscosity: "3 mbar", density: 1000, surface_tension: 0.07 })).toThrow(/fluid.viscosity/);
  });

  // Glycerol–water: handbook viscosity of 50 wt% glycerol at 20 °C ≈ 6.0 mPa·s (from memory, CRC/Segur-type tables);
  // Cheng (2008) reports his correlation within a few per cent of such data, so the tolerance is 5 %.
  it("glycerol–water 50 wt% at 20 °C is about 6.0 mPa·s (Cheng 2008 vs handbook, from memory)", () => {
    expect(glycerolWaterViscosityPaS(0.5, 20) * 1e3).toBeGreaterThan(5.7);
    expect(glycerolWaterViscosityPaS(0.5, 20) * 1e3).toBeLessThan(6.3);
  });
  it("glycerol–water at 0 wt% reduces to Cheng's water term (1.0 mPa·s at 20 °C, IAPWS 1.0016 within 0.5 %)", () => {
    expect(Math.abs(glycerolWaterViscosityPaS(0, 20) / 1.0016e-3 - 1)).toBeLessThan(5e-3);
  });
  // Pure glycerol at 20 °C ≈ 1412 mPa·s and 80 wt% ≈ 60.1 mPa·s (handbook values, from memory); Cheng's end-member
  // and mixing terms should land within 2 %.
  it("glycerol–water end member and 80 wt% agree with handbook viscosities (from memory) within 2 %", () => {
    expect(Math.abs(glycerolWaterViscosityPaS(1, 20) / 1.412 - 1)).toBeLessThan(0.02);
    expect(Math.abs(glycerolWaterViscosityPaS(0.8, 20) / 0.0601 - 1)).toBeLessThan(0.02);
  });
  it("every preset resolves to positive finite properties with a source for each, at 10 and 60 °C", () => {
    for (const p of listFluidPresets()) {
      for (const t of ["10 degC", "60 degC"]) {
        const f = resolveFluid({ preset: p.name, temperature: t });
        for (const v of [f.viscosityPaS, f.densityKgPerM3, f.surfaceTensionNPerM]) expect(v > 0 && Number.isFinite(v)).toBe(true);
        expect(Object.keys(f.sources).sort()).toEqual(["density", "surface_tension", "viscosity"]);
      }
    }
  });
  it("viscosity falls with temperature for every preset (liquids)", () => {
    for (const p of listFluidPresets()) {
      expect(resolveFluid({ preset: p.name, temperature: "40 degC" }).viscosityPaS).toBeLessThan(resolveFluid({ preset: p.name, temperature: "20 degC" }).viscosityPaS);
    }
  });
  it("accepts glycerol_water_NN presets", () => {
    const f = resolveFluid({ preset: "glycerol_water_60", temperature: "20 degC" });
    expect(f.viscosityPaS).toBeCloseTo(glycerolWaterViscosityPaS(0.6, 20), 12);
  });
});

describe("solutes", () => {
  // REFERENCES §4 (`calc`): Stokes–Einstein, 25 °C water, d = 1 µm → 4.907e-13 m²/s; d = 100 nm → 4.907e-12.
  it("Stokes–Einstein matches the REFERENCES values at 25 °C", () => {
    const mu = waterViscosityPaS(298.15);
    expect(stokesEinsteinDiffusivity(298.15, mu, 0.5e-6)).toBeCloseTo(4.907e-13, 15);
    expect(stokesEinsteinDiffusivity(298.15, mu, 50e-9)).toBeCloseTo(4.907e-12, 14);
  });
  // REFERENCES §4: BSA 5.92e-11 at 20 °C scales to 6.78e-11 at 25 °C by T/μ.
  it("scales BSA from 20 °C to 25 °C by T/μ to 6.78e-11 m²/s", () => {
    const d = resolveSoluteDiffusivity({ preset: "protein_bsa" }, undefined, 298.15, waterViscosityPaS(298.15));
    expect(d.diffusivityM2PerS).toBeCloseTo(6.78e-11, 13);
  });
  it("uses fluorescein's 4.25e-10 m²/s at 25 °C (Culbertson et al. 2002, from memory)", () => {
    const d = resolveSoluteDiffusivity({ preset: "fluorescein" }, undefined, 298.15, waterViscosityPaS(298.15));
    expect(d.diffusivityM2PerS).toBeCloseTo(4.25e-10, 14);
  });
  it("takes an explicit diffusivity over any preset", () => {
    expect(resolveSoluteDiffusivity({ preset: "glucose", diffusivity: "1e-9 m^2/s" }, undefined, 298.15, 1e-3).diffusivityM2PerS).toBe(1e-9);
  });
});

describe("second phase", () => {
  it("uses the given interfacial tension for Ca and marks its source", async () => {
    const { resolvePhases } = await import("@/lib/hydraulics/solve-hydraulics");
    const p = resolvePhases({ fluid: { preset: "water" }, second_phase: { preset: "fluorinated_oil", interfacial_tension: "5 mN/m" } });
    expect(p.interfacialTensionNPerM).toBeCloseTo(5e-3, 12);
    expect(p.secondPhase?.sources.interfacial_tension).toBe("given in the conditions");
  });
  it("falls back to Antonow's rule |σ₁ − σ₂| and says it is an estimate", async () => {
    const { resolvePhases } = await import("@/lib/hydraulics/solve-hydraulics");
    const p = resolvePhases({ fluid: { preset: "water", temperature: "25 degC" }, second_phase: { preset: "fluorinated_oil" } });
    // IAPWS σ(25 °C) = 71.972 mN/m (REFERENCES §3) minus the oil's typical 16.2 mN/m.
    expect(p.interfacialTensionNPerM * 1e3).toBeCloseTo(71.972 - 16.2, 2);
    expect(p.secondPhase?.sources.interfacial_tension).toMatch(/estimate/);
  });
});
