/**
 * Pressure profiles on hand-built networks whose pressures follow in closed
 * form. Each segment is a rectangular channel with the resistance
 * R = 12 μ L / (w h³ (1 − 0.630 h/w)) (Bruus, Theoretical Microfluidics 2008,
 * Table 4.1; REFERENCES §1), series resistances add and parallel conductances
 * add (Kirchhoff's laws, the hydraulic–electric analogy, Bruus ch. 4). With one
 * cross-section the pressure falls linearly with distance along a series path.
 */
import { describe, expect, it } from "vitest";
import { DomainError } from "@/lib/errors";
import { pressureProfile } from "@/lib/analysis/profile";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";

const MU = 1.0016e-3; // water at 20 °C, Pa s (IAPWS 2008; REFERENCES §3)
const W = 100e-6;
const H = 50e-6;
/** Bruus 2008 Table 4.1 approximation, Pa s / m³. */
const resistance = (lengthM: number, w = W) => (12 * MU * lengthM) / (w * H ** 3 * (1 - 0.63 * (H / w)));

interface S {
  id: string;
  from: string;
  to: string;
  lengthM: number;
  flow: number;
  widthM?: number;
}

function doc(nodes: Record<string, [number, number, number]>, segs: S[], ports: Record<string, string>): AnalyzeJson {
  const segments: AnalyzeSegmentJson[] = segs.map((s) => ({
    id: s.id,
    layer: "CH",
    from: s.from,
    to: s.to,
    length_m: s.lengthM,
    width_m: s.widthM ?? W,
    end_width_m: s.widthM ?? W,
    min_width_m: s.widthM ?? W,
    max_width_m: s.widthM ?? W,
    depth_m: H,
    section: "rectangular",
    min_bend_radius_m: null,
    path_m: [nodes[s.from].slice(0, 2) as [number, number], nodes[s.to].slice(0, 2) as [number, number]],
    flow_m3_per_s: s.flow,
  }));
  const portOf = Object.fromEntries(Object.entries(ports).map(([name, node]) => [node, name]));
  return {
    ok: true,
    format: 1,
    units: { drawing: "mm", source: "$INSUNITS" },
    mapping_proposed: false,
    nodes: Object.entries(nodes).map(([id, [x, y, p]]) => ({ id, x_m: x, y_m: y, kind: portOf[id] ? "port" : "junction", port: portOf[id] ?? null, pressure_Pa: p })),
    segments,
    ports: Object.entries(ports).map(([name, node]) => ({ name, node, x_m: nodes[node][0], y_m: nodes[node][1], radius_m: 5e-4 })),
    warnings: [],
    layers: [],
    outline_m: [],
    bounds_m: { min_x: 0, min_y: 0, max_x: 0.02, max_y: 0.01 },
    fluid: null,
    totals: null,
    flags: [],
    solver: null,
    cautions: [],
  };
}

const code = (fn: () => unknown) => {
  try {
    fn();
  } catch (e) {
    return { code: (e as DomainError).code, status: (e as DomainError).status, message: (e as Error).message };
  }
  throw new Error("expected a DomainError");
};

describe("series channels: the pressure falls linearly with distance", () => {
  // IN —2 mm— a —3 mm— b —5 mm— OUT, 1000 Pa at IN, 0 at OUT. Segment s2 is drawn from b to a, so its flow is negative.
  const P = 1000;
  const lengths = [2e-3, 3e-3, 5e-3];
  const rTotal = lengths.reduce((sum, l) => sum + resistance(l), 0);
  const q = P / rTotal;
  const pA = P - q * resistance(lengths[0]);
  const pB = pA - q * resistance(lengths[1]);
  const net = doc(
    { i: [0, 0, P], a: [2e-3, 0, pA], b: [5e-3, 0, pB], o: [10e-3, 0, 0] },
    [
      { id: "s1", from: "i", to: "a", lengthM: lengths[0], flow: q },
      { id: "s2", from: "b", to: "a", lengthM: lengths[1], flow: -q },
      { id: "s3", from: "b", to: "o", lengthM: lengths[2], flow: q },
    ],
    { IN: "i", OUT: "o" },
  );

  it("visits s1, s2, s3 in order and puts the nodes at 0, 2, 5, 10 mm with p = P(1 − x/L): 1000, 800, 500, 0 Pa", () => {
    const prof = pressureProfile(net, "IN", "OUT");
    expect(prof.steps.map((s) => s.segmentId)).toEqual(["s1", "s2", "s3"]);
    expect(prof.steps.map((s) => s.againstDrawnDirection)).toEqual([false, true, false]);
    const expected = [[0, 1000], [2e-3, 800], [5e-3, 500], [10e-3, 0]];
    prof.points.forEach((pt, k) => {
      expect(pt.distanceM).toBeCloseTo(expected[k][0], 12);
      expect(pt.pressurePa).toBeCloseTo(expected[k][1], 9);
    });
    expect(prof.lengthM).toBeCloseTo(10e-3, 12);
    expect(prof.pressureDropPa).toBeCloseTo(1000, 9);
    expect(prof.bottleneckFlowM3PerS).toBeCloseTo(q, 20);
  });

  it("refuses the reversed request and says which way the flow runs (422)", () => {
    const e = code(() => pressureProfile(net, "OUT", "IN"));
    expect(e).toMatchObject({ code: "no_flow_path", status: 422 });
    expect(e.message).toMatch(/flow runs from IN to OUT/);
  });

  it("refuses unknown and repeated ports (400), naming the chip's ports", () => {
    expect(code(() => pressureProfile(net, "IN", "OUTLET"))).toMatchObject({ code: "unknown_port", status: 400, message: expect.stringMatching(/IN, OUT/) });
    expect(code(() => pressureProfile(net, "IN", "IN"))).toMatchObject({ code: "same_port", status: 400 });
  });

  it("refuses a geometry-only analysis (no node pressures) with a clear message", () => {
    const geometryOnly: AnalyzeJson = {
      ...net,
      nodes: net.nodes.map(({ pressure_Pa: _p, ...n }) => n),
      segments: net.segments.map(({ flow_m3_per_s: _q, ...s }) => s),
    };
    expect(code(() => pressureProfile(geometryOnly, "IN", "OUT"))).toMatchObject({ code: "no_operating_point", status: 422 });
  });
});

describe("branching networks", () => {
  it("where the flow splits 3 : 1 between parallel branches, the path keeps to the main stream", () => {
    // IN —1 mm— j, then j→k by a 4 mm branch (s_a) or a 12 mm branch (s_b), then k —1 mm— OUT.
    // Parallel: conductances add, so the 4 mm branch carries 3/4 of the flow.
    const P = 2000;
    const rPar = 1 / (1 / resistance(4e-3) + 1 / resistance(12e-3));
    const rTot = resistance(1e-3) + rPar + resistance(1e-3);
    const q = P / rTot;
    const pJ = P - q * resistance(1e-3);
    const pK = pJ - q * rPar;
    const net = doc(
      { i: [0, 0, P], j: [1e-3, 0, pJ], k: [5e-3, 0, pK], o: [6e-3, 0, 0] },
      [
        { id: "in", from: "i", to: "j", lengthM: 1e-3, flow: q },
        { id: "s_b", from: "j", to: "k", lengthM: 12e-3, flow: (pJ - pK) / resistance(12e-3) },
        { id: "s_a", from: "j", to: "k", lengthM: 4e-3, flow: (pJ - pK) / resistance(4e-3) },
        { id: "out", from: "k", to: "o", lengthM: 1e-3, flow: q },
      ],
      { IN: "i", OUT: "o" },
    );
    const prof = pressureProfile(net, "IN", "OUT");
    expect(prof.steps.map((s) => s.segmentId)).toEqual(["in", "s_a", "out"]);
    expect(prof.bottleneckFlowM3PerS / q).toBeCloseTo(0.75, 12);
    expect(prof.lengthM).toBeCloseTo(6e-3, 12);
  });

  it("two outlets: the profile to each follows its own branch; a balanced Wheatstone bridge (no flow) is never crossed", () => {
    // Balanced bridge: IN → a → OUT1 and IN → b → OUT2 with equal legs, a–b bridge at equal pressure so it carries no flow.
    const P = 500;
    const r = resistance(5e-3);
    const q = P / (2 * r);
    const mid = P / 2;
    const net = doc(
      { i: [0, 0, P], a: [5e-3, 1e-3, mid], b: [5e-3, -1e-3, mid], o1: [10e-3, 1e-3, 0], o2: [10e-3, -1e-3, 0] },
      [
        { id: "ia", from: "i", to: "a", lengthM: 5e-3, flow: q },
        { id: "ib", from: "i", to: "b", lengthM: 5e-3, flow: q },
        { id: "bridge", from: "a", to: "b", lengthM: 2e-3, flow: 0 },
        { id: "a1", from: "a", to: "o1", lengthM: 5e-3, flow: q },
        { id: "b2", from: "b", to: "o2", lengthM: 5e-3, flow: q },
      ],
      { IN: "i", OUT1: "o1", OUT2: "o2" },
    );
    expect(pressureProfile(net, "IN", "OUT1").steps.map((s) => s.segmentId)).toEqual(["ia", "a1"]);
    expect(pressureProfile(net, "IN", "OUT2").steps.map((s) => s.segmentId)).toEqual(["ib", "b2"]);
    // Between the two outlets no flow path exists (both are sinks).
    expect(code(() => pressureProfile(net, "OUT1", "OUT2"))).toMatchObject({ code: "no_flow_path" });
  });

  it("a port on a dead-end branch with no flow is named in the refusal", () => {
    const net = doc(
      { i: [0, 0, 100], o: [1e-3, 0, 0], d: [0, 1e-3, 100] },
      [
        { id: "io", from: "i", to: "o", lengthM: 1e-3, flow: 100 / resistance(1e-3) },
        { id: "id", from: "i", to: "d", lengthM: 1e-3, flow: 0 },
      ],
      { IN: "i", OUT: "o", PLUG: "d" },
    );
    expect(code(() => pressureProfile(net, "IN", "PLUG")).message).toMatch(/No flow passes through PLUG/);
  });
});
