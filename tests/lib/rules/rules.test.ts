import { describe, expect, it } from "vitest";
import { evaluateFlags, RULES, PROCESS_PROFILES, MAX_FLAGS_PER_CODE } from "@/lib/rules";
import { solveHydraulics } from "@/lib/hydraulics/solve-hydraulics";
import { buildNetwork, type SegSpec } from "@/tests/support/network-builders";
import type { Conditions } from "@/lib/analysis/conditions";
import type { ChannelNetwork } from "@/lib/network/types";

// A fluid with round numbers so the hand arithmetic is short: μ = 1 mPa·s, ρ = 1000 kg/m³, σ = 0.05 N/m.
const FLUID = { viscosity: "1 mPa s", density: "1000 kg/m^3", surface_tension: "50 mN/m", name: "test liquid" };

function line(seg: Partial<SegSpec> = {}): ChannelNetwork {
  return buildNetwork({
    nodes: { a: [0, 0], b: [1e-2, 0] },
    ports: { IN: "a", OUT: "b" },
    segments: [{ id: "S", from: "a", to: "b", lengthM: 1e-2, widthM: 100e-6, depthM: 100e-6, ...seg }],
  });
}

function run(net: ChannelNetwork, c: Conditions) {
  const h = c.ports ? solveHydraulics(net, c) : null;
  return evaluateFlags(net, h, c);
}
const codes = (flags: { code: string }[]) => flags.map((f) => f.code);

describe("Reynolds bands", () => {
  // 100 µm square: A = 1e-8 m², D_h = 100 µm; Re = ρ U D_h/μ = 1000 · U · 1e-4 / 1e-3 = 100 U (U in m/s), U = Q/A.
  // Bands from Zhang et al. 2016 / Di Carlo 2009 (1, 100) and Reynolds 1883 (2000), REFERENCES §5.
  it.each([
    [5e-11, []], // U = 5e-3 m/s → Re = 0.5
    [5e-10, ["re_inertial"]], // U = 0.05 → Re = 5
    [2e-8, ["re_strongly_inertial"]], // U = 2 → Re = 200
    [3e-7, ["re_turbulent"]], // U = 30 → Re = 3000
  ])("Q = %f m³/s gives %j (only the highest band)", (flow, expected) => {
    const flags = run(line(), { fluid: FLUID, ports: { IN: { flow }, OUT: { pressure: 0 } } } as Conditions).filter((f) => f.code.startsWith("re_"));
    expect(codes(flags)).toEqual(expected);
  });

  it("a threshold override moves the band edge", () => {
    const c = { fluid: FLUID, ports: { IN: { flow: 5e-10 }, OUT: { pressure: 0 } }, thresholds: { re_inertial: 10 } } as Conditions;
    expect(codes(run(line(), c))).not.toContain("re_inertial");
  });

  it("the turbulent flag says it is likely an input error and blocks", () => {
    const f = run(line(), { fluid: FLUID, ports: { IN: { flow: 3e-7 }, OUT: { pressure: 0 } } } as Conditions).find((x) => x.code === "re_turbulent")!;
    expect(f.severity).toBe("block");
    expect(f.message).toMatch(/unit typed wrong/);
    expect(f.value).toBeCloseTo(3000, 6);
  });
});

describe("Dean, entrance length and wall shear", () => {
  // Re = 5 (U = 0.05 m/s) and R_c = 100 µm: De = 5 √(1e-4 / 2e-4) = 3.536 > 1 (common-practice threshold).
  it("flags Dean flow in a tight bend and not in a gentle one", () => {
    const c = { fluid: FLUID, ports: { IN: { flow: 5e-10 }, OUT: { pressure: 0 } } } as Conditions;
    const tight = run(line({ minBendRadiusM: 100e-6 }), c).find((f) => f.code === "dean_secondary_flow");
    expect(tight?.value).toBeCloseTo(3.5355, 3);
    // R_c = 5 cm: De = 5 √(1e-4/0.1) = 0.158, below 1.
    expect(codes(run(line({ minBendRadiusM: 5e-2 }), c))).not.toContain("dean_secondary_flow");
  });

  // Re = 200: Durst channel L/D_h = [0.631^1.6 + (0.0442·200)^1.6]^(1/1.6) ≈ 8.86, L_e ≈ 0.886 mm, 8.9 % of 1 cm — below 10 %;
  // on a 2 mm segment it is 44 % — flagged. (Durst et al. 2005, from memory.)
  it("flags an entrance length that is a large share of the segment", () => {
    const c = { fluid: FLUID, ports: { IN: { flow: 2e-8 }, OUT: { pressure: 0 } } } as Conditions;
    expect(codes(run(line(), c))).not.toContain("entrance_length_share");
    const f = run(line({ lengthM: 2e-3 }), c).find((x) => x.code === "entrance_length_share");
    expect(f?.value).toBeCloseTo(0.443, 2);
  });

  // Square 100 µm at Q = 5e-10: τ = 1.6012 × 6μQ/(wh²) (REFERENCES §7) = 1.6012 × 6e-3·5e-10/1e-12 = 4.80 Pa > 1.5 Pa (Malek et al. 1999).
  it("flags wall shear above 1.5 Pa only when cells are present", () => {
    const c = { fluid: FLUID, ports: { IN: { flow: 5e-10 }, OUT: { pressure: 0 } } } as Conditions;
    expect(codes(run(line(), c))).not.toContain("wall_shear_cells");
    const f = run(line(), { ...c, cells: true }).find((x) => x.code === "wall_shear_cells");
    expect(f?.value).toBeCloseTo(4.8036, 2);
    expect(f?.severity).toBe("warn");
  });
});

describe("droplet regime at a T-junction", () => {
  // Continuous inlet C → J → OUT, dispersed inlet D → J. Channels 100 × 50 µm (A = 5e-9 m²).
  // Ca = μ U_c/γ with γ = 5 mN/m, μ = 1 mPa·s: U_c = Q_c/A, so Ca = 1e-3 · (Q_c/5e-9) / 5e-3 = 4e7 · Q_c.
  const tee = () =>
    buildNetwork({
      nodes: { c: [0, 0], d: [5e-3, 5e-3], j: [5e-3, 0], o: [2e-2, 0] },
      ports: { C: "c", D: "d", OUT: "o" },
      segments: [
        { id: "cont", from: "c", to: "j", lengthM: 5e-3, widthM: 100e-6, depthM: 50e-6 },
        { id: "disp", from: "d", to: "j", lengthM: 5e-3, widthM: 100e-6, depthM: 50e-6 },
        { id: "out", from: "j", to: "o", lengthM: 1.5e-2, widthM: 100e-6, depthM: 50e-6 },
      ],
    });
  const cond = (qc: number, tag = true): Conditions =>
    ({
      fluid: FLUID,
      second_phase: { preset: "fluorinated_oil", interfacial_tension: "5 mN/m" },
      ports: { C: { flow: qc }, D: tag ? { flow: qc / 4, phase: "dispersed" } : { flow: qc / 4 }, OUT: { pressure: 0 } },
    }) as Conditions;

  // Bands: squeezing Ca < 0.01 (Garstecki et al. 2006), dripping from there with the 0.015 transition (De Menech et al. 2008),
  // jetting from 0.1 (common practice).
  it.each([
    [1e-10, "droplet_squeezing", 0.004],
    [1e-9, "droplet_dripping", 0.04],
    [5e-9, "droplet_jetting", 0.2],
  ])("Q_c = %f m³/s gives %s with Ca = %f", (qc, code, ca) => {
    const flags = run(tee(), cond(qc)).filter((f) => f.code.startsWith("droplet_"));
    expect(codes(flags)).toEqual([code]);
    expect(flags[0].value).toBeCloseTo(ca, 9);
    expect(flags[0].target).toEqual({ kind: "node", id: "j" });
  });

  it("asks which ports carry the second phase when none is tagged", () => {
    expect(codes(run(tee(), cond(1e-9, false)))).toContain("droplet_phases_untagged");
  });

  it("does not raise a mixing flag where two phases meet", () => {
    expect(codes(run(tee(), cond(1e-9)))).not.toContain("mixing_incomplete");
  });
});

describe("mixing where two streams meet", () => {
  const y = (outLengthM: number) =>
    buildNetwork({
      nodes: { a: [0, 1e-3], b: [0, -1e-3], j: [2e-3, 0], o: [2e-3 + outLengthM, 0] },
      ports: { A: "a", B: "b", OUT: "o" },
      segments: [
        { id: "ina", from: "a", to: "j", lengthM: 2e-3, widthM: 100e-6, depthM: 50e-6 },
        { id: "inb", from: "b", to: "j", lengthM: 2e-3, widthM: 100e-6, depthM: 50e-6 },
        { id: "mix", from: "j", to: "o", lengthM: outLengthM, widthM: 100e-6, depthM: 50e-6 },
      ],
    });
  // Two inlets of 1 µL/min each; downstream Q = 3.3333e-11 m³/s, U = Q/A = 3.3333e-11/5e-9 = 6.6667e-3 m/s;
  // D = 4e-10 m²/s; mixing length Pe·w = U w²/D = 6.6667e-3 · 1e-8 / 4e-10 = 0.16667 m (Squires & Quake 2005).
  const c = { fluid: FLUID, solute: { diffusivity: "4e-10 m^2/s" }, ports: { A: { flow: "1 uL/min" }, B: { flow: "1 uL/min" }, OUT: { pressure: 0 } } } as Conditions;
  it("flags a 2 cm channel as 12 % of the 16.7 cm mixing length", () => {
    const f = run(y(2e-2), c).find((x) => x.code === "mixing_incomplete");
    expect(f?.value).toBeCloseTo(0.02 / 0.166667, 4);
    expect(f?.target).toEqual({ kind: "node", id: "j" });
  });
  it("does not flag a 20 cm channel", () => {
    expect(codes(run(y(0.2), c))).not.toContain("mixing_incomplete");
  });
});

describe("pressure: pump limit and bond burst risk", () => {
  it("flags a pump that must exceed its maximum, and a port above the PDMS bond limit (burst risk, plainly)", () => {
    // 1 cm of 20 µm × 20 µm: R = 28.454 μL/h⁴ (REFERENCES §2) = 28.454e-3·1e-2/1.6e-19 = 1.778e15 Pa·s/m³;
    // 10 µL/min = 1.6667e-10 m³/s needs 2.96e5 Pa = 2.96 bar.
    const net = line({ widthM: 20e-6, depthM: 20e-6 });
    const flags = run(net, { fluid: FLUID, process: "pdms_soft_lithography", mask: "film", pump: { max_pressure: "2 bar" }, ports: { IN: { flow: "10 uL/min" }, OUT: { pressure: 0 } } } as Conditions);
    const pump = flags.find((f) => f.code === "pump_pressure_max")!;
    expect(pump.value! / 2.9639e5).toBeCloseTo(1, 3);
    expect(pump.threshold).toBe(2e5);
    const bond = flags.find((f) => f.code === "pressure_bond")!;
    expect(bond.severity).toBe("block");
    expect(bond.threshold).toBe(PROCESS_PROFILES.pdms_soft_lithography.maxWorkingPressurePa);
    expect(bond.message).toMatch(/burst/);
  });
  it("raises nothing when pressures are low", () => {
    const flags = run(line(), { fluid: FLUID, process: "pdms_soft_lithography", pump: { max_pressure: "2 bar" }, ports: { IN: { flow: "1 uL/min" }, OUT: { pressure: 0 } } } as Conditions);
    expect(codes(flags).filter((c) => c.startsWith("p"))).toEqual([]);
  });
});

describe("fabrication rules", () => {
  const fab = (net: ChannelNetwork, process: string, extra: Partial<Conditions> = {}) => evaluateFlags(net, null, { process, ...extra } as Conditions);

  // Qin, Xia & Whitesides 1996: transparency masks ≥ ~20 µm; chrome ~1 µm (REFERENCES §6).
  it("min width depends on the mask", () => {
    const net = line({ widthM: 15e-6, depthM: 10e-6 });
    expect(codes(fab(net, "pdms_soft_lithography"))).toContain("fab_min_width");
    expect(codes(fab(net, "pdms_soft_lithography", { mask: "chrome" }))).not.toContain("fab_min_width");
  });

  // PDMS roof: depth/width below 0.1 (Delamarche et al. 1997's 0.2 for stamps, halved for bonded roofs: common practice).
  it("flags a wide shallow PDMS channel for roof collapse", () => {
    const f = fab(line({ widthM: 1e-3, depthM: 20e-6 }), "pdms_soft_lithography").find((x) => x.code === "fab_roof_collapse");
    expect(f?.value).toBeCloseTo(0.02, 12);
  });

  // KOH V-groove limit 0.7071·W (REFERENCES §6, Petersen 1982): 100 µm wide, 80 µm deep is impossible → block.
  it("blocks a KOH channel deeper than the V-groove limit", () => {
    const f = fab(line({ widthM: 100e-6, depthM: 80e-6, section: "trapezoid_koh" }), "silicon_koh").find((x) => x.code === "fab_aspect_max");
    expect(f?.severity).toBe("block");
    expect(f?.threshold).toBeCloseTo(Math.SQRT1_2, 10);
  });

  // Isotropic etch W = W_mask + 2d (REFERENCES §6): a 40 µm-wide, 30 µm-deep D channel cannot exist.
  it("blocks a wet-etched glass channel deeper than half its width", () => {
    expect(fab(line({ widthM: 40e-6, depthM: 30e-6, section: "isotropic_etch" }), "glass_wet_etch").find((x) => x.code === "fab_aspect_max")?.severity).toBe("block");
  });

  // Isotropic etch: mask line = top width − 2·depth (REFERENCES §6); 60 µm top at 25 µm depth needs a 10 µm line,
  // which a chrome mask (~1 µm) resolves and a transparency (≥ 20 µm) does not.
  it("checks a wet-etched channel's mask line, not its etched width", () => {
    const net = line({ widthM: 60e-6, depthM: 25e-6, section: "isotropic_etch" });
    expect(codes(fab(net, "glass_wet_etch"))).not.toContain("fab_min_width");
    const f = fab(net, "glass_wet_etch", { mask: "transparency" }).find((x) => x.code === "fab_min_width");
    expect(f?.value).toBeCloseTo(10e-6, 12);
  });

  it("warns when the drawn section is not what the process makes", () => {
    expect(codes(fab(line({ widthM: 100e-6, depthM: 20e-6 }), "glass_wet_etch"))).toContain("fab_profile");
    expect(codes(fab(line({ widthM: 100e-6, depthM: 20e-6, section: "isotropic_etch" }), "glass_wet_etch"))).not.toContain("fab_profile");
  });

  const parallel = (gapM: number, depthM: number) => {
    const w = 100e-6;
    const dy = w + gapM;
    return buildNetwork({
      nodes: { a: [0, 0], b: [1e-2, 0], c: [0, dy], d: [1e-2, dy] },
      ports: { A: "a", B: "b", C: "c", D: "d" },
      segments: [
        { id: "lower", from: "a", to: "b", lengthM: 1e-2, widthM: w, depthM },
        { id: "upper", from: "c", to: "d", lengthM: 1e-2, widthM: w, depthM },
      ],
    });
  };
  it("flags two channels closer than the mask's minimum gap", () => {
    const f = fab(parallel(10e-6, 50e-6), "pdms_soft_lithography").find((x) => x.code === "fab_min_spacing");
    expect(f?.value).toBeCloseTo(10e-6, 12);
    expect(f?.message).toMatch(/lower and upper/);
  });
  // Roca-Cusachs et al. 2005: PDMS structures collapse at aspect 2–4; 125 µm tall, 25 µm thick wall = 5 > 4.
  it("flags a tall thin PDMS wall between channels", () => {
    const f = fab(parallel(25e-6, 125e-6), "pdms_soft_lithography").find((x) => x.code === "fab_tall_wall");
    expect(f?.value).toBeCloseTo(5, 9);
    expect(codes(fab(parallel(200e-6, 100e-6), "pdms_soft_lithography"))).not.toContain("fab_tall_wall");
  });
  it("does not treat channels meeting at a junction as neighbours", () => {
    const net = buildNetwork({
      nodes: { a: [0, 0], j: [5e-3, 0], b: [1e-2, 0], c: [5e-3, 5e-3] },
      ports: { A: "a", B: "b", C: "c" },
      segments: [
        { from: "a", to: "j", lengthM: 5e-3, widthM: 100e-6, depthM: 50e-6 },
        { from: "j", to: "b", lengthM: 5e-3, widthM: 100e-6, depthM: 50e-6 },
        { from: "j", to: "c", lengthM: 5e-3, widthM: 100e-6, depthM: 50e-6 },
      ],
    });
    expect(codes(fab(net, "pdms_soft_lithography"))).not.toContain("fab_min_spacing");
  });

  it("checks margins to the die outline and anything outside it", () => {
    const net = line();
    net.outline = [[[-1e-3, -3e-3], [1.05e-2, -3e-3], [1.05e-2, 3e-3], [-1e-3, 3e-3]]];
    const flags = fab(net, "pdms_soft_lithography");
    // Port IN at x = 0 with radius 0.5 mm: rim 0.5 mm from the left edge at x = −1 mm, under the 2 mm margin (common practice).
    const portIn = flags.find((f) => f.code === "fab_edge_margin" && f.target.id === "IN");
    expect(portIn?.value).toBeCloseTo(0.5e-3, 12);
    net.outline = [[[1e-3, -3e-3], [2e-2, -3e-3], [2e-2, 3e-3], [1e-3, 3e-3]]];
    expect(codes(fab(net, "pdms_soft_lithography"))).toContain("fab_outside_outline");
  });

  it("refuses an unknown process by naming the known ones", () => {
    expect(() => fab(line(), "laser_sintering")).toThrow(/pdms_soft_lithography/);
  });
});

describe("the registry", () => {
  it("lists every code raised, each with a title, description and source", () => {
    const known = new Set(RULES.map((r) => r.code));
    for (const r of RULES) {
      expect(r.title.length).toBeGreaterThan(5);
      expect(r.description.length).toBeGreaterThan(20);
      expect(r.source.length).toBeGreaterThan(3);
    }
    const net = line({ widthM: 15e-6, depthM: 1e-6, minBendRadiusM: 1e-5 });
    const flags = run(net, { fluid: FLUID, process: "pdms_soft_lithography", cells: true, ports: { IN: { flow: 3e-9 }, OUT: { pressure: 0 } } } as Conditions);
    expect(flags.length).toBeGreaterThan(2);
    for (const f of flags) expect(known.has(f.code)).toBe(true);
  });

  it("every process value has a source", () => {
    for (const p of Object.values(PROCESS_PROFILES)) for (const v of Object.values(p.sources)) expect(v.length).toBeGreaterThan(5);
  });

  it("caps a flood of one code and summarises the rest at chip level", () => {
    const nodes: Record<string, [number, number]> = {};
    const segments: SegSpec[] = [];
    for (let k = 0; k <= MAX_FLAGS_PER_CODE + 20; k++) nodes[`n${k}`] = [k * 1e-3, 0];
    for (let k = 0; k < MAX_FLAGS_PER_CODE + 20; k++) segments.push({ from: `n${k}`, to: `n${k + 1}`, lengthM: 1e-3, widthM: 10e-6, depthM: 10e-6 });
    const net = buildNetwork({ nodes, segments });
    const flags = evaluateFlags(net, null, { process: "pdms_soft_lithography" } as Conditions).filter((f) => f.code === "fab_min_width");
    expect(flags).toHaveLength(MAX_FLAGS_PER_CODE + 1);
    expect(flags.at(-1)!.target.kind).toBe("chip");
    expect(flags.at(-1)!.value).toBe(MAX_FLAGS_PER_CODE + 20);
  });
});
