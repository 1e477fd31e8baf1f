/**
 * Comparing two analyze documents. Every document here is built by hand so the
 * answer is plain from its construction (stated beside each check); the
 * matching rule itself (by position, not id) is issue 6's requirement.
 */
import { describe, expect, it } from "vitest";
import { compareAnalyses } from "@/lib/analysis/compare";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";

type P = [number, number];
const um = (v: number) => v * 1e-6;
const pathLength = (path: P[]) => path.slice(1).reduce((sum, p, i) => sum + Math.hypot(p[0] - path[i][0], p[1] - path[i][1]), 0);

function seg(id: string, path: P[], opts: Partial<AnalyzeSegmentJson> = {}): AnalyzeSegmentJson {
  const width = opts.width_m ?? um(100);
  return {
    id,
    layer: "CHANNELS",
    from: `${id}a`,
    to: `${id}b`,
    length_m: pathLength(path),
    width_m: width,
    end_width_m: opts.end_width_m ?? width,
    min_width_m: width,
    max_width_m: width,
    depth_m: um(50),
    section: "rectangular",
    min_bend_radius_m: null,
    path_m: path,
    ...opts,
  };
}

function doc(parts: Partial<Pick<AnalyzeJson, "segments" | "ports" | "flags" | "nodes">>): AnalyzeJson {
  return {
    ok: true,
    format: 1,
    units: { drawing: "um", source: "$INSUNITS" },
    mapping_proposed: false,
    nodes: parts.nodes ?? [],
    segments: parts.segments ?? [],
    ports: parts.ports ?? [],
    warnings: [],
    layers: [],
    outline_m: [],
    bounds_m: { min_x: 0, min_y: 0, max_x: 0.01, max_y: 0.01 },
    fluid: null,
    totals: null,
    flags: parts.flags ?? [],
    solver: null,
    cautions: [],
  };
}

const flag = (code: string, kind: string, id: string | null, value: number | null = null): AnalyzeJson["flags"][number] => ({
  code,
  severity: "warn",
  family: "regime",
  target: { kind, id },
  title: code,
  message: code,
  value,
  threshold: null,
  source: "test",
});

// A T: inlet leg (0,0)→(5 mm,0), outlet leg (5 mm,0)→(10 mm,0), side leg (5 mm,0)→(5 mm,3 mm).
const mm = (v: number) => v * 1e-3;
const inletLeg: P[] = [[0, 0], [mm(5), 0]];
const outletLeg: P[] = [[mm(5), 0], [mm(10), 0]];
const sideLeg: P[] = [[mm(5), 0], [mm(5), mm(3)]];
const before = doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg), seg("s3", sideLeg)] });

describe("segments are matched by position, not id", () => {
  it("renamed, reordered and reversed segments are the same segments: nothing added, removed or changed", () => {
    const after = doc({ segments: [seg("x9", sideLeg), seg("x7", [...outletLeg].reverse() as P[]), seg("x8", inletLeg)] });
    const c = compareAnalyses(before, after);
    expect(c.segments.added).toEqual([]);
    expect(c.segments.removed).toEqual([]);
    expect(c.segments.changed).toEqual([]);
    const pairs = Object.fromEntries(c.segments.matched.map((m) => [m.a, [m.b, m.reversed]]));
    expect(pairs).toEqual({ s1: ["x8", false], s2: ["x7", true], s3: ["x9", false] });
  });

  it("a widened outlet leg (100 → 150 µm) is changed, with the width deltas stated", () => {
    const after = doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg, { width_m: um(150) }), seg("s3", sideLeg)] });
    const c = compareAnalyses(before, after);
    expect(c.segments.changed).toHaveLength(1);
    const m = c.segments.changed[0];
    expect(m.a).toBe("s2");
    expect(m.deltas.width_m?.delta).toBeCloseTo(um(50), 12);
    expect(m.deltas.end_width_m?.delta).toBeCloseTo(um(50), 12);
    expect(m.deltas.length_m).toBeUndefined();
    expect(m.routeChanged).toBe(false);
  });

  it("a deeper layer (50 → 80 µm) is a depth change on every segment", () => {
    const after = doc({ segments: [inletLeg, outletLeg, sideLeg].map((p, i) => seg(`n${i}`, p, { depth_m: um(80) })) });
    const c = compareAnalyses(before, after);
    expect(c.segments.changed.map((m) => m.deltas.depth_m?.delta)).toEqual([um(30), um(30), um(30)].map((v) => expect.closeTo(v, 12)));
  });

  it("a reversed taper (100→50 µm drawn the other way as 50→100 µm) is not a width change", () => {
    const a = doc({ segments: [seg("t", inletLeg, { width_m: um(100), end_width_m: um(50) })] });
    const b = doc({ segments: [seg("u", [...inletLeg].reverse() as P[], { width_m: um(50), end_width_m: um(100) })] });
    const c = compareAnalyses(a, b);
    expect(c.segments.matched).toHaveLength(1);
    expect(c.segments.matched[0].reversed).toBe(true);
    expect(c.segments.changed).toEqual([]);
  });

  it("a new branch is added and a deleted one removed", () => {
    const branch: P[] = [[mm(5), mm(3)], [mm(8), mm(3)]];
    const after = doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg), seg("s3", sideLeg), seg("s4", branch)] });
    expect(compareAnalyses(before, after).segments.added).toEqual(["s4"]);
    expect(compareAnalyses(after, before).segments.removed).toEqual(["s4"]);
  });

  it("end-point noise below the 1 µm tolerance is ignored; a 5 µm move breaks the match", () => {
    const jitter: P[] = [[mm(5) + um(0.3), um(-0.2)], [mm(5), mm(3) + um(0.4)]];
    const c1 = compareAnalyses(before, doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg), seg("s3", jitter, { length_m: pathLength(sideLeg) })] }));
    expect(c1.segments.changed).toEqual([]);
    expect(c1.segments.added).toEqual([]);
    const moved: P[] = [[mm(5), 0], [mm(5) + um(5), mm(3)]];
    const c2 = compareAnalyses(before, doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg), seg("s3b", moved)] }));
    expect(c2.segments.removed).toEqual(["s3"]);
    expect(c2.segments.added).toEqual(["s3b"]);
  });

  it("a longer route between the same ends (a 1 mm detour) is a length change and a new route", () => {
    const detour: P[] = [[0, 0], [mm(2), 0], [mm(2), mm(0.5)], [mm(3), mm(0.5)], [mm(3), 0], [mm(5), 0]];
    const c = compareAnalyses(before, doc({ segments: [seg("s1", detour), seg("s2", outletLeg), seg("s3", sideLeg)] }));
    expect(c.segments.changed).toHaveLength(1);
    expect(c.segments.changed[0].deltas.length_m?.delta).toBeCloseTo(mm(1), 12);
    expect(c.segments.changed[0].routeChanged).toBe(true);
  });

  it("two parallel channels between the same two junctions are told apart by their mid-points", () => {
    const upper: P[] = [[0, 0], [0, mm(1)], [mm(4), mm(1)], [mm(4), 0]];
    const lower: P[] = [[0, 0], [0, mm(-1)], [mm(4), mm(-1)], [mm(4), 0]];
    const a = doc({ segments: [seg("up", upper), seg("down", lower, { width_m: um(60) })] });
    const b = doc({ segments: [seg("p", lower, { width_m: um(60) }), seg("q", upper)] });
    const c = compareAnalyses(a, b);
    expect(Object.fromEntries(c.segments.matched.map((m) => [m.a, m.b]))).toEqual({ up: "q", down: "p" });
    expect(c.segments.changed).toEqual([]);
  });

  it("a 30 × 30 grid (1,740 segments) renumbered at random with sub-µm noise matches every segment to its own counterpart", () => {
    // The construction gives the true pairing; the comparison must recover it exactly.
    const pitch = mm(0.5);
    const a: AnalyzeSegmentJson[] = [];
    for (let i = 0; i < 30; i++) for (let j = 0; j < 30; j++) {
      if (i < 29) a.push(seg(`h${i}_${j}`, [[i * pitch, j * pitch], [(i + 1) * pitch, j * pitch]]));
      if (j < 29) a.push(seg(`v${i}_${j}`, [[i * pitch, j * pitch], [i * pitch, (j + 1) * pitch]]));
    }
    let s = 12345; // deterministic LCG (Numerical Recipes constants) so the test is repeatable
    const rand = () => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32);
    const noise = () => (rand() - 0.5) * um(0.4);
    const truth = new Map<string, string>();
    const b = a
      .map((sa, k) => {
        const id = `r${k}`;
        truth.set(sa.id, id);
        const path = sa.path_m.map(([x, y]) => [x + noise(), y + noise()] as P);
        return seg(id, rand() < 0.5 ? path : ([...path].reverse() as P[]), { length_m: sa.length_m });
      })
      .sort(() => rand() - 0.5);
    const c = compareAnalyses(doc({ segments: a }), doc({ segments: b }));
    expect(a).toHaveLength(1740);
    expect(c.segments.matched).toHaveLength(1740);
    for (const m of c.segments.matched) expect(m.b).toBe(truth.get(m.a));
    expect(c.segments.changed).toEqual([]);
  });
});

describe("ports are compared by name", () => {
  const port = (name: string, x: number, pressure: number, flow: number) => ({ name, node: name, x_m: x, y_m: 0, radius_m: um(500), drive: "pressure", pressure_Pa: pressure, flow_m3_per_s: flow });
  it("reports a pressure raised 1000 → 1200 Pa, a new port and a removed one; an equal flow is no change", () => {
    const a = doc({ ports: [port("IN", 0, 1000, 1e-11), port("OUT", mm(10), 0, -1e-11), port("AUX", mm(5), 0, 0)] });
    const b = doc({ ports: [port("IN", 0, 1200, 1e-11), port("OUT", mm(10), 0, -1e-11), port("WASTE", mm(7), 0, 0)] });
    const c = compareAnalyses(a, b);
    expect(c.ports.added).toEqual(["WASTE"]);
    expect(c.ports.removed).toEqual(["AUX"]);
    expect(c.ports.changed).toEqual([{ name: "IN", pressurePa: { a: 1000, b: 1200, delta: 200 }, flowM3PerS: null, movedM: null, drive: null }]);
  });

  it("a flow that doubles (10 → 20 nL/s) and a port moved 2 mm are reported", () => {
    const a = doc({ ports: [port("IN", 0, 500, 1e-11)] });
    const b = doc({ ports: [port("IN", mm(2), 500, 2e-11)] });
    const [ch] = compareAnalyses(a, b).ports.changed;
    expect(ch.flowM3PerS?.delta).toBeCloseTo(1e-11, 20);
    expect(ch.movedM).toBeCloseTo(mm(2), 12);
    expect(ch.pressurePa).toBeNull();
  });
});

describe("flags are compared by code and the position of what they concern", () => {
  it("a flag on a renamed segment is unchanged; one on a removed segment is removed; a new chip flag is added", () => {
    const a = doc({
      segments: [seg("s1", inletLeg), seg("s2", outletLeg), seg("s3", sideLeg)],
      nodes: [{ id: "j1", x_m: mm(5), y_m: 0, kind: "junction", port: null }],
      flags: [flag("re_inertial", "segment", "s1", 12), flag("dean_vortices", "segment", "s3"), flag("port_bond", "port", "IN"), flag("junction_sharp", "node", "j1")],
    });
    const b = doc({
      segments: [seg("k1", inletLeg), seg("k2", outletLeg)],
      nodes: [{ id: "n77", x_m: mm(5), y_m: 0, kind: "junction", port: null }],
      flags: [flag("re_inertial", "segment", "k1", 15), flag("port_bond", "port", "IN"), flag("junction_sharp", "node", "n77"), flag("fab_footprint", "chip", null)],
    });
    const c = compareAnalyses(a, b);
    expect(c.flags.unchanged.map((p) => `${p.code}:${p.a.target.id}->${p.b.target.id}`)).toEqual(["re_inertial:s1->k1", "port_bond:IN->IN", "junction_sharp:j1->n77"]);
    expect(c.flags.unchanged[0].a.value).toBe(12);
    expect(c.flags.unchanged[0].b.value).toBe(15);
    expect(c.flags.removed.map((f) => f.code)).toEqual(["dean_vortices"]);
    expect(c.flags.added.map((f) => f.code)).toEqual(["fab_footprint"]);
  });

  it("the same code on a different segment is one removed and one added", () => {
    const a = doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg)], flags: [flag("re_inertial", "segment", "s1")] });
    const b = doc({ segments: [seg("s1", inletLeg), seg("s2", outletLeg)], flags: [flag("re_inertial", "segment", "s2")] });
    const c = compareAnalyses(a, b);
    expect(c.flags.removed.map((f) => f.target.id)).toEqual(["s1"]);
    expect(c.flags.added.map((f) => f.target.id)).toEqual(["s2"]);
    expect(c.flags.unchanged).toEqual([]);
  });
});
