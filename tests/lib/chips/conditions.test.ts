/**
 * From the operating-point form to the engine's conditions, with workspace
 * overrides. Limits come from lib/rules (processes.ts cites its sources); the
 * checks here are that an override reaches the rule that reads it.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { analyzeLayout } from "@/lib/analysis/analyze";
import { thresholdsFor, toConditions, PROCESS_LIMIT_FIELDS } from "@/lib/chips/conditions";
import { operatingPointFormSchema, type LayerMapInput } from "@/lib/chips/schemas";
import { PROCESS_PROFILES, RULES } from "@/lib/rules";

const TEE = readFileSync(new URL("../../fixtures/layouts/tee-um-r2000.dxf", import.meta.url));
const MAP: LayerMapInput = {
  layers: { FLOW: { role: "channel", depth: "50 um", width: "100 um" }, PORTS: { role: "port" }, DIE: { role: "outline" }, TEXT: { role: "ignore" } },
};
const FORM = operatingPointFormSchema.parse({
  name: "nominal",
  fluid: "preset:water",
  temperature: "25 degC",
  process: "pdms_soft_lithography",
  ports: [
    { name: "A", drive: "flow", value: "10 uL/min" },
    { name: "B", drive: "pressure", value: "0 mbar" },
    { name: "C", drive: "pressure", value: "0 mbar" },
  ],
});

describe("thresholdsFor", () => {
  it("is undefined when nothing is overridden", () => {
    expect(thresholdsFor("pdms_soft_lithography", {})).toBeUndefined();
  });
  it("maps each process limit to the rule code that reads it, and the process limit wins over a general override", () => {
    const t = thresholdsFor("pdms_soft_lithography", {
      thresholds: { re_inertial: 5, pressure_bond: 1e6 },
      processes: { pdms_soft_lithography: { maxWorkingPressurePa: 150e3, edgeMarginM: 1e-3 }, glass_wet_etch: { maxWorkingPressurePa: 9 } },
    });
    expect(t).toEqual({ re_inertial: 5, pressure_bond: 150e3, fab_edge_margin: 1e-3 });
  });
  it("names only rule codes the registry knows", () => {
    const codes = new Set(RULES.map((r) => r.code));
    for (const f of PROCESS_LIMIT_FIELDS) expect(codes.has(f.ruleCode)).toBe(true);
    // and only profile fields that exist (processes.ts)
    const profile = PROCESS_PROFILES.pdms_soft_lithography as unknown as Record<string, unknown>;
    for (const f of PROCESS_LIMIT_FIELDS) expect(f.key in profile).toBe(true);
  });
});

describe("overrides reach the analysis", () => {
  const flagCodes = (overrides: Parameters<typeof toConditions>[3]) =>
    analyzeLayout(TEE, toConditions(MAP, FORM, [], overrides)).flags.map((f) => f.code);

  it("a lowered bond limit for the chosen process raises the bond flag", () => {
    // Default PDMS–glass limit 200 kPa (processes.ts, Bhattacharya et al. 2005): 10 µL/min in a 100×50 µm tee is far below it.
    const result = analyzeLayout(TEE, toConditions(MAP, FORM));
    const inlet = result.ports.find((p) => p.name === "A")!;
    expect(inlet.pressure_Pa!).toBeGreaterThan(10);
    expect(inlet.pressure_Pa!).toBeLessThan(200e3);
    expect(flagCodes({})).not.toContain("pressure_bond");
    // A fab liaison's override below the inlet pressure: the flag appears.
    expect(flagCodes({ processes: { pdms_soft_lithography: { maxWorkingPressurePa: inlet.pressure_Pa! / 2 } } })).toContain("pressure_bond");
    // An override for another process does not apply.
    expect(flagCodes({ processes: { glass_wet_etch: { maxWorkingPressurePa: 1 } } })).not.toContain("pressure_bond");
  });

  it("a reviewer's raised Reynolds threshold clears the inertia note", () => {
    const result = analyzeLayout(TEE, toConditions(MAP, FORM));
    const maxRe = result.totals!.max_reynolds.value;
    // Default threshold Re = 1 (registry: Di Carlo 2009); 10 µL/min into half the tee's 100×50 µm channels gives Re ≈ 2.5.
    expect(maxRe).toBeGreaterThan(1);
    expect(flagCodes({})).toContain("re_inertial");
    expect(flagCodes({ thresholds: { re_inertial: maxRe * 2 } })).not.toContain("re_inertial");
  });
});
