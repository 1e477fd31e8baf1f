import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { analyzeLayout } from "@/lib/analysis/analyze";
import { ConditionsError } from "@/lib/errors";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";

// Layout fixtures and their conditions come from tests/fixtures/layouts (generated with ezdxf and Shapely by the layout reader's owner).
const dir = new URL("../../fixtures/layouts/", import.meta.url);
const expected = JSON.parse(readFileSync(fileURLToPath(new URL("expected.json", dir)), "utf8")) as { fixtures: Record<string, { file: string; conditions: Record<string, unknown> }> };
const load = (name: string) => ({ dxf: readFileSync(fileURLToPath(new URL(expected.fixtures[name].file, dir)), "utf8"), conditions: expected.fixtures[name].conditions });
const water25 = { preset: "water", temperature: "25 degC" };

describe("analyzeLayout end to end", () => {
  it("straight channel: pump pressure from the exact rectangle series, every output field present", () => {
    const { dxf, conditions } = load("straight-r2000");
    const out = analyzeLayout(dxf, { ...conditions, fluid: water25, ports: { IN: { flow: "10 uL/min" }, OUT: { pressure: "0 Pa" } } });
    expect(out.segments).toHaveLength(1);
    const s = out.segments[0];
    // 9 mm of 100 µm × 50 µm (fixture: 10 mm minus two 0.5 mm port radii). REFERENCES §1: R·wh³/(μL) = 17.49156 at α = 0.5;
    // REFERENCES §3: μ(25 °C) = 0.89002 mPa·s. R = 17.49156 × 8.9002e-4 × 0.009 / (1e-4 × (5e-5)³) = 1.12088e13 Pa·s/m³;
    // Q = 10 µL/min = 1.66667e-10 m³/s, so the pump at IN supplies Q·R = 1868.1 Pa.
    expect(s.resistance_Pa_s_per_m3! / 1.12088e13).toBeCloseTo(1, 4);
    const inlet = out.ports.find((p) => p.name === "IN")!;
    expect(inlet.pressure_Pa! / 1868.14).toBeCloseTo(1, 4);
    expect(inlet.flow_m3_per_s!).toBeCloseTo(1.66667e-10, 15);
    expect(out.ports.find((p) => p.name === "OUT")!.flow_m3_per_s! / -1.66667e-10).toBeCloseTo(1, 5);
    for (const key of ["flow_m3_per_s", "mean_velocity_m_per_s", "pressure_drop_Pa", "hydraulic_diameter_m", "reynolds", "capillary", "weber", "peclet", "wall_shear_Pa", "residence_s", "mixing_length_m", "entrance_length_m"] as const) {
      expect(Number.isFinite(s[key] as number)).toBe(true);
    }
    expect(s.dean).toBeNull();
    expect(out.nodes.every((n) => Number.isFinite(n.pressure_Pa))).toBe(true);
    expect(out.fluid?.viscosity_Pa_s).toBeCloseTo(8.9002e-4, 8);
    expect(out.totals?.path_residence).toHaveLength(1);
    expect(out.solver?.residual_rel).toBeLessThan(1e-12);
    expect(out.cautions).toEqual(MODEL_CAUTIONS);
  });

  it("serpentine: Dean number at the 300 µm U-turns", () => {
    const { dxf, conditions } = load("serpentine-r12");
    const out = analyzeLayout(dxf, { ...conditions, fluid: water25, ports: { IN: { flow: "10 uL/min" }, OUT: { pressure: 0 } } });
    const s = out.segments[0];
    // Re = 2.48945 (worked example in tests/lib/hydraulics/network-solve.test.ts); De = Re √(D_h/(2R_c)) = 2.48945 × √(6.6667e-5/6e-4) = 0.82982.
    expect(s.min_bend_radius_m).toBeCloseTo(3e-4, 9);
    expect(s.dean! / 0.82982).toBeCloseTo(1, 4);
  });

  it("T-junction: two pressure-driven inlets meet and the short outlet channel leaves them unmixed", () => {
    const { dxf, conditions } = load("tee-um-r2000");
    const out = analyzeLayout(dxf, { ...conditions, fluid: water25, ports: { A: { pressure: "20 mbar" }, B: { pressure: "20 mbar" }, C: { pressure: 0 } } });
    // Symmetric inlets: each carries half of what leaves through C (Kirchhoff at the junction).
    const qa = out.ports.find((p) => p.name === "A")!.flow_m3_per_s!;
    const qc = out.ports.find((p) => p.name === "C")!.flow_m3_per_s!;
    expect(qa / (-qc / 2)).toBeCloseTo(1, 10);
    expect(out.flags.map((f) => f.code)).toContain("mixing_incomplete");
  });

  it("geometry only when no port is driven, with fabrication flags when a process is named", () => {
    const { dxf, conditions } = load("tee-um-r2000");
    const out = analyzeLayout(dxf, { ...conditions, process: "pdms_soft_lithography" });
    expect(out.fluid).toBeNull();
    expect(out.totals).toBeNull();
    expect(out.segments[0].reynolds).toBeUndefined();
    expect(out.flags.every((f) => f.family === "fabrication")).toBe(true);
  });

  it("a driven port missing from the layout is a ConditionsError naming it", () => {
    const { dxf, conditions } = load("straight-r2000");
    expect(() => analyzeLayout(dxf, { ...conditions, ports: { INLET: { flow: "1 uL/min" } } })).toThrow(ConditionsError);
    expect(() => analyzeLayout(dxf, { ...conditions, ports: { INLET: { flow: "1 uL/min" } } })).toThrow(/"INLET".*IN, OUT/);
  });

  it("a port tagged with a phase passes the conditions schema", () => {
    const { dxf, conditions } = load("straight-r2000");
    expect(() => analyzeLayout(dxf, { ...conditions, ports: { IN: { flow: "1 uL/min", phase: "dispersed" }, OUT: { pressure: 0 } } })).not.toThrow();
  });
});
