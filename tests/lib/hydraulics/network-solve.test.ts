import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { solveGraph, type GraphInput } from "@/lib/hydraulics/network-solve";
import { solveHydraulics } from "@/lib/hydraulics/solve-hydraulics";
import { rectangleResistanceFactor } from "@/lib/hydraulics/cross-section";
import { waterViscosityPaS } from "@/lib/hydraulics/water";
import { ConditionsError, DomainError, SolveError } from "@/lib/errors";
import { buildNetwork } from "@/tests/support/network-builders";
import type { Conditions } from "@/lib/analysis/conditions";

interface Case {
  name: string;
  nodes: number;
  edges: [number, number, number][];
  pressurePorts: Record<string, [number, number]>;
  flowPorts: Record<string, [number, number]>;
  expectedPressurePa: number[];
}
const fixture = JSON.parse(readFileSync(fileURLToPath(new URL("../../fixtures/networks/scipy-networks.json", import.meta.url)), "utf8")) as { cases: Case[] };

function toGraph(c: Case): GraphInput {
  return {
    nodeIds: Array.from({ length: c.nodes }, (_, i) => `n${i}`),
    segments: c.edges.map(([a, b, g], k) => ({ id: `e${k}`, from: a, to: b, conductanceM3PerPaS: g })),
    ports: [
      ...Object.entries(c.pressurePorts).map(([name, [node, p]]) => ({ name, node, drive: { kind: "pressure" as const, pressurePa: p, as: "pressure" as const } })),
      ...Object.entries(c.flowPorts).map(([name, [node, q]]) => ({ name, node, drive: { kind: "flow" as const, flowM3PerS: q } })),
    ],
  };
}

describe("network solve vs SciPy spsolve (tests/fixtures/networks/generate.py)", () => {
  it.each(fixture.cases.map((c) => [c.name, c] as const))("%s: node pressures within 1e-9 of SciPy (relative to the largest pressure)", (_name, c) => {
    const sol = solveGraph(toGraph(c));
    const scale = Math.max(...c.expectedPressurePa.map(Math.abs));
    let worst = 0;
    c.expectedPressurePa.forEach((p, i) => (worst = Math.max(worst, Math.abs(sol.nodePressurePa[i] - p) / scale)));
    expect(worst).toBeLessThan(1e-9);
    expect(sol.residualRel).toBeLessThan(1e-10);
  });

  it("satisfies Kirchhoff's current law at every node without a port on the SciPy random mesh", () => {
    const c = fixture.cases.find((x) => x.name.startsWith("random_mesh"))!;
    const sol = solveGraph(toGraph(c));
    const net = new Float64Array(c.nodes);
    c.edges.forEach(([a, b], k) => {
      net[a] -= sol.segmentFlowM3PerS[k];
      net[b] += sol.segmentFlowM3PerS[k];
    });
    const portNodes = new Set([...Object.values(c.pressurePorts), ...Object.values(c.flowPorts)].map(([n]) => n));
    const qMax = Math.max(...Array.from(sol.segmentFlowM3PerS).map(Math.abs));
    for (let i = 0; i < c.nodes; i++) if (!portNodes.has(i)) expect(Math.abs(net[i])).toBeLessThan(1e-9 * qMax);
  });

  it("conserves flow: port flows sum to zero on the SciPy grid case (Kirchhoff)", () => {
    const c = fixture.cases[0];
    const sol = solveGraph(toGraph(c));
    const sum = Array.from(sol.portFlowM3PerS).reduce((a, b) => a + b, 0);
    const scale = Math.max(...Array.from(sol.portFlowM3PerS).map(Math.abs));
    expect(Math.abs(sum) / scale).toBeLessThan(1e-9);
  });
});

const W = 100e-6;
const H = 50e-6;
const water25 = { preset: "water", temperature: "25 degC" };

describe("closed-form networks", () => {
  const mu = waterViscosityPaS(298.15);
  const r = (L: number) => mu * L * rectangleResistanceFactor(W, H);

  it("series: Q = Δp / (R₁ + R₂), and the middle pressure divides in proportion", () => {
    const net = buildNetwork({
      nodes: { a: [0, 0], m: [1e-2, 0], b: [3e-2, 0] },
      ports: { IN: "a", OUT: "b" },
      segments: [
        { from: "a", to: "m", lengthM: 1e-2, widthM: W, depthM: H },
        { from: "m", to: "b", lengthM: 2e-2, widthM: W, depthM: H },
      ],
    });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { pressure: "100 mbar" }, OUT: { pressure: 0 } } } as Conditions);
    const q = 1e4 / (r(1e-2) + r(2e-2));
    expect(h.segments[0].flowM3PerS / q).toBeCloseTo(1, 12);
    expect(h.nodes[1].pressurePa / (1e4 * (2 / 3))).toBeCloseTo(1, 12);
    expect(h.ports[0].flowM3PerS / q).toBeCloseTo(1, 12); // into the chip at IN
    expect(h.ports[1].flowM3PerS / -q).toBeCloseTo(1, 12); // out of the chip at OUT
  });

  it("parallel: a flow-driven inlet splits in the ratio of conductances; the pump pressure is Q·(R₁∥R₂)", () => {
    const net = buildNetwork({
      nodes: { a: [0, 0], b: [1e-2, 0] },
      ports: { IN: "a", OUT: "b" },
      segments: [
        { from: "a", to: "b", lengthM: 1e-2, widthM: W, depthM: H },
        { from: "a", to: "b", lengthM: 3e-2, widthM: W, depthM: H },
      ],
    });
    const q = (10e-9) / 60; // 10 µL/min
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { flow: "10 uL/min" }, OUT: { pressure: "0 Pa" } } } as Conditions);
    expect(h.segments[0].flowM3PerS / (q * 0.75)).toBeCloseTo(1, 12);
    expect(h.segments[1].flowM3PerS / (q * 0.25)).toBeCloseTo(1, 12);
    const rPar = 1 / (1 / r(1e-2) + 1 / r(3e-2));
    expect(h.ports[0].pressurePa / (q * rPar)).toBeCloseTo(1, 12);
  });

  it("ladder: the input resistance follows the recurrence R_k = R_rung ∥ (2 R_rail + R_{k−1})", () => {
    const N = 40;
    const nodes: Record<string, [number, number]> = {};
    const segments = [];
    for (let k = 0; k < N; k++) {
      nodes[`t${k}`] = [k * 1e-3, 1e-3];
      nodes[`b${k}`] = [k * 1e-3, 0];
      segments.push({ from: `t${k}`, to: `b${k}`, lengthM: 1e-2, widthM: W, depthM: H });
      if (k > 0) {
        segments.push({ from: `t${k - 1}`, to: `t${k}`, lengthM: 1e-3, widthM: W, depthM: H });
        segments.push({ from: `b${k - 1}`, to: `b${k}`, lengthM: 1e-3, widthM: W, depthM: H });
      }
    }
    // Drive across the first rung: IN at t0, OUT at b0; the far end is rung N−1.
    const net = buildNetwork({ nodes, ports: { IN: "t0", OUT: "b0" }, segments });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { pressure: "50 mbar" }, OUT: { pressure: 0 } } } as Conditions);
    const rung = r(1e-2);
    const rail = r(1e-3);
    let rk = rung;
    for (let k = 1; k < N; k++) rk = 1 / (1 / rung + 1 / (2 * rail + rk));
    expect(h.ports[0].flowM3PerS / (5e3 / rk)).toBeCloseTo(1, 10);
  });

  it("a balanced bridge carries no flow through its middle segment", () => {
    const net = buildNetwork({
      nodes: { a: [0, 0], u: [1e-2, 1e-2], d: [1e-2, -1e-2], b: [2e-2, 0] },
      ports: { IN: "a", OUT: "b" },
      segments: [
        { from: "a", to: "u", lengthM: 1e-2, widthM: W, depthM: H },
        { from: "a", to: "d", lengthM: 2e-2, widthM: W, depthM: H },
        { from: "u", to: "b", lengthM: 1e-2, widthM: W, depthM: H },
        { from: "d", to: "b", lengthM: 2e-2, widthM: W, depthM: H },
        { id: "bridge", from: "u", to: "d", lengthM: 2e-2, widthM: W, depthM: H },
      ],
    });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { pressure: "100 mbar" }, OUT: { pressure: 0 } } } as Conditions);
    expect(Math.abs(h.segments[4].flowM3PerS)).toBeLessThan(1e-12 * Math.abs(h.segments[0].flowM3PerS));
    expect(h.segments[4].residenceS).toBe(Infinity);
  });

  // p = ρ g h with g_n = 9.80665 m/s² (REFERENCES §8) and ρ(25 °C) = 997.047 kg/m³ (REFERENCES §3).
  it("a head-driven port sits at ρ g h", () => {
    const net = buildNetwork({ nodes: { a: [0, 0], b: [1e-2, 0] }, ports: { IN: "a", OUT: "b" }, segments: [{ from: "a", to: "b", lengthM: 1e-2, widthM: W, depthM: H }] });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { head: "4 cm" }, OUT: { pressure: 0 } } } as Conditions);
    expect(h.ports[0].drive).toBe("head");
    expect(h.ports[0].pressurePa).toBeCloseTo(997.047 * 9.80665 * 0.04, 2);
  });

  it("treats a port the conditions do not name as open to the atmosphere (0 Pa)", () => {
    const net = buildNetwork({ nodes: { a: [0, 0], b: [1e-2, 0] }, ports: { IN: "a", OUT: "b" }, segments: [{ from: "a", to: "b", lengthM: 1e-2, widthM: W, depthM: H }] });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { flow: "1 uL/min" } } } as Conditions);
    expect(h.ports[1].drive).toBe("open");
    expect(h.ports[1].pressurePa).toBe(0);
    expect(h.ports[0].pressurePa / ((1e-9 / 60) * r(1e-2))).toBeCloseTo(1, 12);
  });
});

describe("tapered segments", () => {
  it("a taper's resistance is the integral along it and its peak wall shear is at the narrow end", () => {
    const net = buildNetwork({
      nodes: { a: [0, 0], b: [1e-2, 0] },
      ports: { IN: "a", OUT: "b" },
      segments: [{ from: "a", to: "b", lengthM: 1e-2, widthM: 200e-6, endWidthM: 100e-6, depthM: H }],
    });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { flow: "5 uL/min" }, OUT: { pressure: 0 } } } as Conditions);
    const mu = waterViscosityPaS(298.15);
    // Simpson's rule with 2000 panels on R' = μ·r(w(s)) as an independent quadrature of the same integrand.
    const n = 2000;
    let sum = 0;
    for (let k = 0; k <= n; k++) {
      const w = 200e-6 - (100e-6 * k) / n;
      const wt = k === 0 || k === n ? 1 : k % 2 ? 4 : 2;
      sum += wt * rectangleResistanceFactor(w, H);
    }
    const simpson = (mu * sum * (1e-2 / n)) / 3;
    expect(h.segments[0].resistancePaSPerM3 / simpson).toBeCloseTo(1, 9);
    // Peak shear at the 100 µm end: series factor × μQ (REFERENCES §7 ratio 1.3557 at h/w = 0.5).
    const q = 5e-9 / 60;
    expect(h.segments[0].wallShearPa / (1.3557 * (6 * mu * q) / (100e-6 * H * H))).toBeCloseTo(1, 3);
  });
});

describe("totals", () => {
  it("path residence follows the flow to each outlet and adds segment residences; totals add volumes and inflows", () => {
    // IN → J (1 cm), J → OUT1 (1 cm), J → OUT2 (3 cm), all 100 × 50 µm, both outlets at 0 Pa.
    const net = buildNetwork({
      nodes: { i: [0, 0], j: [1e-2, 0], a: [2e-2, 0], b: [1e-2, 3e-2] },
      ports: { IN: "i", OUT1: "a", OUT2: "b" },
      segments: [
        { from: "i", to: "j", lengthM: 1e-2, widthM: W, depthM: H },
        { from: "j", to: "a", lengthM: 1e-2, widthM: W, depthM: H },
        { from: "j", to: "b", lengthM: 3e-2, widthM: W, depthM: H },
      ],
    });
    const h = solveHydraulics(net, { fluid: water25, ports: { IN: { flow: "8 uL/min" }, OUT1: { pressure: 0 }, OUT2: { pressure: 0 } } } as Conditions);
    const [s0, s1, s2] = h.segments;
    // Equal outlet pressures: the split is inverse to length, 3:1 (closed form for parallel resistances).
    expect(s1.flowM3PerS / s2.flowM3PerS).toBeCloseTo(3, 10);
    const byOutlet = Object.fromEntries(h.totals.pathResidence.map((p) => [p.to, p.residenceS]));
    expect(byOutlet.OUT1).toBeCloseTo(s0.residenceS + s1.residenceS, 12);
    expect(byOutlet.OUT2).toBeCloseTo(s0.residenceS + s2.residenceS, 12);
    expect(h.totals.totalFlowM3PerS).toBeCloseTo(8e-9 / 60, 20);
    expect(h.totals.totalVolumeM3).toBeCloseTo(W * H * 5e-2, 20);
    expect(h.totals.meanResidenceS).toBeCloseTo((W * H * 5e-2) / (8e-9 / 60), 9);
    expect(h.totals.maxReynolds.segment).toBe(s0.id);
  });
});

describe("worked example: 100 µm × 50 µm channel, water at 25 °C, 10 µL/min, fluorescein", () => {
  const net = buildNetwork({
    nodes: { a: [0, 0], b: [2e-2, 0] },
    ports: { IN: "a", OUT: "b" },
    segments: [{ from: "a", to: "b", lengthM: 2e-2, widthM: W, depthM: H, minBendRadiusM: 1e-3 }],
  });
  const h = solveHydraulics(net, { fluid: water25, solute: { preset: "fluorescein" }, ports: { IN: { flow: "10 uL/min" }, OUT: { pressure: 0 } } } as Conditions);
  const s = h.segments[0];
  // Hand arithmetic with REFERENCES §3 water at 25 °C: ρ = 997.047 kg/m³, μ = 0.89002 mPa·s, σ = 71.972 mN/m;
  // fluorescein D = 4.25e-10 m²/s (REFERENCES §4, Culbertson et al. 2002, from memory).
  // Q = 10e-9/60 = 1.66667e-10 m³/s; A = 100e-6 × 50e-6 = 5e-9 m²; U = Q/A = 0.0333333 m/s.
  // P = 2(100 + 50) µm = 300e-6 m; D_h = 4A/P = 2e-8/3e-4 = 6.66667e-5 m.
  it("U = Q/A = 0.033333 m/s and D_h = 66.667 µm", () => {
    expect(s.meanVelocityMPerS).toBeCloseTo(0.0333333, 6);
    expect(s.hydraulicDiameterM).toBeCloseTo(6.66667e-5, 9);
  });
  // Re = ρUD_h/μ = 997.047 × 0.0333333 × 6.66667e-5 / 8.9002e-4 = 2.21566e-3 / 8.9002e-4 = 2.48945.
  it("Re = 2.4894", () => expect(s.reynolds / 2.48945).toBeCloseTo(1, 4));
  // Ca = μU/σ = 8.9002e-4 × 0.0333333 / 0.071972 = 2.96673e-5 / 0.071972 = 4.12206e-4.
  it("Ca = 4.1221e-4", () => expect(s.capillary / 4.12206e-4).toBeCloseTo(1, 4));
  // Pe = U w / D = 0.0333333 × 100e-6 / 4.25e-10 = 3.33333e-6 / 4.25e-10 = 7843.14; mixing length Pe·w = 0.784314 m.
  it("Pe = 7843 and the mixing length Pe·w = 0.784 m", () => {
    expect(s.peclet / 7843.14).toBeCloseTo(1, 4);
    expect(s.mixingLengthM / 0.784314).toBeCloseTo(1, 4);
  });
  // De = Re √(D_h/(2R_c)) = 2.48945 × √(6.66667e-5 / 2e-3) = 2.48945 × 0.182574 = 0.454510.
  it("De = 0.4545 at a 1 mm bend", () => expect(s.dean! / 0.45451).toBeCloseTo(1, 4));
  // We = ρU²D_h/σ = 997.047 × 1.11111e-3 × 6.66667e-5 / 0.071972 = 7.38553e-5 / 0.071972 = 1.02617e-3.
  it("We = 1.0262e-3", () => expect(s.weber / 1.02617e-3).toBeCloseTo(1, 4));
  // Residence = V/Q = 5e-9 × 0.02 / 1.66667e-10 = 0.6 s; diffusion time w²/D = 1e-8/4.25e-10 = 23.53 s.
  it("residence 0.6 s and diffusion time 23.53 s", () => {
    expect(s.residenceS).toBeCloseTo(0.6, 9);
    expect(s.diffusionTimeS).toBeCloseTo(23.5294, 3);
    expect(h.totals.pathResidence).toEqual([{ from: "IN", to: "OUT", residenceS: s.residenceS }]);
  });
  // Durst et al. (2005) plane-channel correlation (REFERENCES §5, from memory) on the gap H = depth = 50 µm:
  // Re_H = 997.047 × 0.0333333 × 5e-5 / 8.9002e-4 = 1.86709; L/H = [0.631^1.6 + (0.0442 × 1.86709)^1.6]^(1/1.6)
  // = [0.478682 + 0.018473]^0.625 = 0.497155^0.625 = 0.646111, so L_e = 0.646111 × 50 µm = 32.306 µm.
  it("entrance length 32.31 µm (Durst et al. 2005, from memory)", () => expect(s.entranceLengthM / 32.3056e-6).toBeCloseTo(1, 4));
  // Bond number at a port of radius 0.5 mm: Bo = (997.047 − 1.204) × 9.80665 × (0.5e-3)² / 0.071972 = 2.44143e-3 / 0.071972 = 0.0339225.
  it("Bond number at a 0.5 mm port = 0.0339", () => expect(h.ports[0].bond / 0.0339225).toBeCloseTo(1, 4));
});

describe("bad settings give clear errors, never NaN", () => {
  const line = () =>
    buildNetwork({
      nodes: { a: [0, 0], b: [1e-2, 0], c: [5e-2, 5e-2], d: [6e-2, 5e-2] },
      ports: { IN: "a", OUT: "b" },
      segments: [
        { from: "a", to: "b", lengthM: 1e-2, widthM: W, depthM: H },
        { id: "stray", from: "c", to: "d", lengthM: 1e-2, widthM: W, depthM: H },
      ],
    });

  it("a floating part is named with its segments and place", () => {
    const run = () => solveHydraulics(line(), { ports: { IN: { flow: "1 uL/min" }, OUT: { pressure: 0 } } } as Conditions);
    expect(run).toThrow(SolveError);
    expect(run).toThrow(/stray.*not connected to any port/);
  });

  const simple = () => buildNetwork({ nodes: { a: [0, 0], b: [1e-2, 0] }, ports: { IN: "a", OUT: "b" }, segments: [{ from: "a", to: "b", lengthM: 1e-2, widthM: W, depthM: H }] });

  it("all ports flow-driven and unbalanced: contradictory, naming the ports", () => {
    const run = () => solveHydraulics(simple(), { ports: { IN: { flow: "1 uL/min" }, OUT: { flow: "-2 uL/min" } } } as Conditions);
    expect(run).toThrow(/IN, OUT.*do not balance/);
  });

  it("all ports flow-driven and balanced: no pressure reference", () => {
    const run = () => solveHydraulics(simple(), { ports: { IN: { flow: "1 uL/min" }, OUT: { flow: "-1 uL/min" } } } as Conditions);
    expect(run).toThrow(expect.objectContaining({ code: "no_pressure_reference" }));
  });

  it("a driven port that is not in the layout is a ConditionsError naming it and the real ports", () => {
    const run = () => solveHydraulics(simple(), { ports: { INLET_A: { flow: "1 uL/min" } } } as Conditions);
    expect(run).toThrow(ConditionsError);
    expect(run).toThrow(/"INLET_A".*IN, OUT/);
  });

  it("a port given both a flow and a pressure is refused", () => {
    const run = () => solveHydraulics(simple(), { ports: { IN: { flow: "1 uL/min", pressure: "1 bar" }, OUT: { pressure: 0 } } } as unknown as Conditions);
    expect(run).toThrow(/exactly one of flow, pressure or head/);
  });

  it("two ports on one node with different pressures are contradictory", () => {
    const net = simple();
    net.ports.push({ name: "IN2", node: "a", xM: 0, yM: 0, radiusM: 5e-4 });
    const run = () => solveHydraulics(net, { ports: { IN: { pressure: "1 bar" }, IN2: { pressure: "2 bar" }, OUT: { pressure: 0 } } } as Conditions);
    expect(run).toThrow(/IN and IN2 share a node/);
  });

  it("every error is a DomainError with a 4xx status", () => {
    try {
      solveHydraulics(line(), { ports: { IN: { flow: "1 uL/min" }, OUT: { pressure: 0 } } } as Conditions);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DomainError);
      expect((e as DomainError).status).toBeGreaterThanOrEqual(400);
      expect((e as DomainError).status).toBeLessThan(500);
    }
  });

  it("a result never contains NaN", () => {
    const h = solveHydraulics(simple(), { ports: { IN: { pressure: "10 mbar" } } } as Conditions);
    const json = JSON.stringify(h, (_k, v) => (typeof v === "number" && Number.isNaN(v) ? "NaN!" : v));
    expect(json).not.toContain("NaN!");
  });
});
