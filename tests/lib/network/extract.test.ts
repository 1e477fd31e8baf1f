/**
 * The layout reader against layouts authored with ezdxf, whose expected values
 * come from independent libraries (Shapely noding/lengths, ezdxf's flattening
 * and block explosion) or closed forms — see tests/fixtures/layouts/generate.py,
 * which writes each value's source into expected.json.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { extractNetwork } from "@/lib/network/extract";
import type { ChannelNetwork, LayerSummary } from "@/lib/network/types";
import { LayoutError } from "@/lib/errors";
import type { GeometryConditions } from "@/lib/analysis/conditions";

const dir = new URL("../../fixtures/layouts/", import.meta.url);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const fixtures: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", dir), "utf8")).fixtures;

function load(name: string, conditions?: GeometryConditions): { f: (typeof fixtures)[string]; net: ChannelNetwork } {
  const f = fixtures[name];
  return { f, net: extractNetwork(readFileSync(new URL(f.file, dir)), conditions ?? f.conditions) };
}

const sortedLengths = (net: ChannelNetwork) => net.segments.map((s) => s.lengthM).sort((a, b) => a - b);

function expectClose(actual: number, expected: number, rel: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected));
}

function expectLengths(net: ChannelNetwork, expected: number[], rel: number) {
  const got = sortedLengths(net);
  expect(got.length).toBe(expected.length);
  got.forEach((g, i) => expectClose(g, expected[i], rel));
}

describe("straight channel in three DXF versions", () => {
  for (const name of ["straight-r12", "straight-r2000", "straight-r2018"]) {
    it(`${name}: one 9 mm segment between IN and OUT`, () => {
      const { f, net } = load(name);
      // Shapely: LineString minus buffered port discs; closed form 10 mm − 2 × 0.5 mm.
      expectLengths(net, f.segment_lengths_m, 1e-9);
      expectClose(net.segments[0].lengthM, 9e-3, 1e-12);
      expect(net.ports.map((p) => p.name)).toEqual(f.ports);
      expect(net.nodes.every((n) => n.kind === "port")).toBe(true);
      const s = net.segments[0];
      // Width and depth from the layer mapping (conditions), 100 µm and 50 µm.
      expectClose(s.widthM, 100e-6, 1e-12);
      expectClose(s.endWidthM, 100e-6, 1e-12);
      expectClose(s.depthM, 50e-6, 1e-12);
      expect(s.section).toBe("rectangular");
      expect(s.minBendRadiusM).toBeNull();
      // Trimmed at the port circles: the path starts and ends on the circle edges.
      expect(s.path[0][0]).toBeCloseTo(0.5e-3, 12);
      expect(s.path.at(-1)![0]).toBeCloseTo(9.5e-3, 12);
      expect(net.units.source).toBe(name === "straight-r12" ? "conditions" : "$INSUNITS");
      expect(net.units.drawing).toBe("um");
    });
  }
});

describe("curved channels", () => {
  it("serpentine of LINEs and ARCs has the length of its straights plus four half-turns", () => {
    const { f, net } = load("serpentine-r12");
    expect(net.segments).toHaveLength(1);
    // Closed form: 22 mm of straights + 4·π·0.3 mm; Shapely on ezdxf's 1 nm flattening within 1e-6.
    expectClose(net.segments[0].lengthM, f.closed_form_length_m, 1e-12);
    expectLengths(net, f.segment_lengths_m, 1e-6);
    expectClose(net.segments[0].minBendRadiusM!, f.min_bend_radius_m, 1e-9);
  });

  it("bulged polyline: a semicircle of length π·r", () => {
    const { f, net } = load("bulge-semicircle-r2000");
    expect(net.segments).toHaveLength(1);
    expectClose(net.segments[0].lengthM, f.closed_form_length_m, 1e-12);
    expectLengths(net, f.segment_lengths_m, 1e-6);
    expectClose(net.segments[0].minBendRadiusM!, 1e-3, 1e-9);
    // The drawn path samples the arc: every point between the leads lies on the 1 mm circle about (1 mm, 0).
    const onArc = net.segments[0].path.filter(([x]) => x > 1e-9 && x < 2e-3 - 1e-9);
    expect(onArc.length).toBeGreaterThan(20);
    for (const [x, y] of onArc) expectClose(Math.hypot(x - 1e-3, y), 1e-3, 1e-9);
  });

  it("splines: a cubic against ezdxf's flattening, a rational (weighted) arc against π·R", () => {
    const { f, net } = load("spline-r2000");
    const byPort = (p: string) => net.segments.find((s) => [s.from, s.to].includes(net.ports.find((q) => q.name === p)!.node))!;
    // Chord tolerance 5 nm in the conditions: the flattened length is short by about L·tol/R (< 1e-5 relative).
    expectClose(byPort("S_IN").lengthM, f.spline_length_m, 1e-5);
    expectClose(byPort("A_IN").lengthM, f.rational_arc_closed_form_m, 1e-5);
    expectClose(byPort("A_IN").lengthM, f.rational_arc_length_m, 1e-5);
    // Smallest radius of curvature of the NURBS arc (circumradius of flattened points) ≈ R = 2 mm.
    expectClose(byPort("A_IN").minBendRadiusM!, f.rational_arc_radius_m, 1e-3);
  });

  it("ellipse arc against ezdxf's flattening; its smallest radius is b²/a; paper space is ignored", () => {
    const { f, net } = load("ellipse-paperspace-r2000");
    expectLengths(net, f.segment_lengths_m, 2e-5);
    expectClose(net.segments[0].minBendRadiusM!, f.min_bend_radius_m, 1e-2);
    expect(net.layers.find((l) => l.name === "FLOW")!.byType).toEqual({ ELLIPSE: 1 });
  });
});

describe("blocks", () => {
  it("inserted blocks (translated, rotated, mirrored, scaled, nested, arrays) land where ezdxf puts them", () => {
    const { f, net } = load("block-array-r2018");
    // ezdxf virtual_entities()/multi_insert() explosion; Shapely noding and lengths.
    expectLengths(net, f.segment_lengths_m, 1e-6);
    const got = net.ports.map((p) => [p.xM, p.yM]).sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    const want = [...f.port_centres_m].sort((a: number[], b: number[]) => a[0] - b[0] || a[1] - b[1]);
    expect(got.length).toBe(want.length);
    got.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(want[i][0], 9);
      expect(p[1]).toBeCloseTo(want[i][1], 9);
    });
    // Unnamed ports are P1, P2 … by x then y: P1 is the leftmost (the mirrored insert's first port).
    const p1 = net.ports.find((p) => p.name === "P1")!;
    expect(p1.xM).toBeCloseTo(Math.min(...want.map((w: number[]) => w[0])), 9);
  });
});

describe("topology", () => {
  it("the same T junction drawn in mm and in µm gives the same metres", () => {
    const mm = load("tee-mm-r2000");
    const um = load("tee-um-r2000");
    expect(mm.net.units.drawing).toBe("mm");
    expect(um.net.units.drawing).toBe("um");
    expectLengths(mm.net, um.f.segment_lengths_m, 1e-9);
    expectLengths(um.net, um.f.segment_lengths_m, 1e-9);
    const junctions = um.net.nodes.filter((n) => n.kind === "junction");
    expect(junctions).toHaveLength(1);
    expect(junctions[0].xM).toBeCloseTo(um.f.junction_m[0], 12);
    expect(junctions[0].yM).toBeCloseTo(um.f.junction_m[1], 12);
  });

  it("crossing channels form one junction; a control-layer line crossing them does not", () => {
    const { f, net } = load("cross-r2000");
    expectLengths(net, f.segment_lengths_m, 1e-9);
    const j = net.nodes.filter((n) => n.kind === "junction");
    expect(j).toHaveLength(1);
    expect([j[0].xM, j[0].yM]).toEqual([expect.closeTo(f.junction_m[0], 12), expect.closeTo(f.junction_m[1], 12)]);
    expect(net.layers.find((l) => l.name === "CTRL")!.role).toBe("control");
  });

  it("an arc crossing a line twice gives two junctions where Shapely finds the crossings", () => {
    const { f, net } = load("arc-cross-r2018");
    expectLengths(net, f.segment_lengths_m, 1e-6);
    const j = net.nodes.filter((n) => n.kind === "junction").map((n) => [n.xM, n.yM]).sort((a, b) => a[0] - b[0]);
    expect(j).toHaveLength(2);
    j.forEach((p, i) => {
      expect(Math.hypot(p[0] - f.junctions_m[i][0], p[1] - f.junctions_m[i][1])).toBeLessThan(1e-9);
    });
  });

  it("a duplicated line and an overlapping polyline are counted once, with a warning", () => {
    const { f, net } = load("duplicate-r2000");
    // Shapely unary_union merges the overlaps into one line.
    expectLengths(net, f.segment_lengths_m, 1e-9);
    expect(net.warnings.some((w) => w.code === "duplicate_merged")).toBe(true);
  });

  it("width change, dead end, unconnected channel and unconnected port are reported", () => {
    const { f, net } = load("change-deadend-r2000");
    expectLengths(net, f.segment_lengths_m, 1e-9);
    const change = net.nodes.find((n) => n.kind === "change")!;
    expect([change.xM, change.yM]).toEqual([expect.closeTo(f.change_m[0], 12), expect.closeTo(f.change_m[1], 12)]);
    const dead = net.nodes.find((n) => n.kind === "dead_end")!;
    expect([dead.xM, dead.yM]).toEqual([expect.closeTo(f.dead_end_m[0], 12), expect.closeTo(f.dead_end_m[1], 12)]);
    expect(net.nodes.filter((n) => n.kind === "junction")).toHaveLength(1);
    const codes = net.warnings.map((w) => w.code);
    expect(codes).toContain("unconnected_channels");
    expect(codes).toContain("port_unconnected");
    expect(net.ports.map((p) => p.name).sort()).toEqual(["IN", "OUT"]);
    // Drawn widths (LWPOLYLINE 43): 100 µm before the change, 200 µm after; the stub takes the layer's 100 µm.
    const widths = net.segments.map((s) => Math.round(s.widthM * 1e7) / 10).sort((a, b) => a - b);
    expect(widths).toEqual([100, 100, 200, 200]);
  });
});

describe("widths", () => {
  it("tapered LWPOLYLINE: start/end widths interpolated at the trimmed ends; constant width 43", () => {
    const { f, net } = load("tapered-r2000");
    const port = (n: string) => net.ports.find((p) => p.name === n)!.node;
    const taper = net.segments.find((s) => s.from === port("T_IN") || s.to === port("T_IN"))!;
    const fwd = taper.from === port("T_IN");
    expectClose(taper.lengthM, f.taper.length_m, 1e-12);
    // ezdxf get_points('xyse') widths 200 → 100 µm, linear in length, cut at 0.5 mm from each end.
    expectClose(fwd ? taper.widthM : taper.endWidthM, f.taper.start_width_m, 1e-9);
    expectClose(fwd ? taper.endWidthM : taper.widthM, f.taper.end_width_m, 1e-9);
    expect(taper.widthProfile).toBeUndefined();
    const cw = net.segments.find((s) => s !== taper)!;
    expectClose(cw.widthM, f.constant_width_m, 1e-9);
    expectClose(cw.endWidthM, f.constant_width_m, 1e-9);
  });

  it("POLYLINE (R12) per-vertex widths give one segment with a width profile and its mean", () => {
    const { f, net } = load("tapered-polyline-r12");
    expect(net.segments).toHaveLength(1);
    const s = net.segments[0];
    expectClose(s.lengthM, f.length_m, 1e-12);
    const [[a0, a1], [b0, b1]] = f.vertex_widths_m as number[][];
    // Linear interpolation of ezdxf's vertex widths over each 3 mm piece, trimmed 0.5 mm at both ends (closed form).
    const wStart = a0 + ((a1 - a0) * 0.5) / 3;
    const wEnd = b0 + ((b1 - b0) * 2.5) / 3;
    const mean = (((wStart + a1) / 2) * 2.5 + ((b0 + wEnd) / 2) * 2.5) / 5;
    const prof = s.widthProfile!;
    const forward = s.path[0][0] < s.path.at(-1)![0];
    expectClose(forward ? prof.widthM[0] : prof.widthM.at(-1)!, wStart, 1e-9);
    expectClose(forward ? s.endWidthM : prof.widthM[0], wEnd, 1e-9);
    expectClose(s.widthM, mean, 1e-9);
    expectClose(s.minWidthM!, wEnd, 1e-9);
    expectClose(s.maxWidthM!, wStart, 1e-9);
  });
});

describe("ports and outline", () => {
  it("port names from TEXT inside, MTEXT within two radii, else P1", () => {
    const { f, net } = load("named-ports-r2018");
    expect(net.ports.map((p) => p.name).sort()).toEqual(f.ports);
  });

  for (const name of ["die-poly-r2000", "die-lines-r2000"]) {
    it(`${name}: die outline polygon with Shapely's area and bounds`, () => {
      const { f, net } = load(name);
      expect(net.outline).toHaveLength(1);
      const ring = net.outline[0];
      let area2 = 0;
      for (let i = 0; i + 1 < ring.length; i++) area2 += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
      expectClose(Math.abs(area2) / 2, f.outline_area_m2, 1e-9);
      const b = net.bounds;
      [b.minXM, b.minYM, b.maxXM, b.maxYM].forEach((v, i) => expect(v).toBeCloseTo(f.bounds_m[i], 12));
    });
  }

  it("with no layer mapping, proposes one (circles → port, paths → channel) and says so, asking for the depth it cannot guess", () => {
    const t = fixtures["tapered-r2000"];
    let err: LayoutError | null = null;
    try {
      extractNetwork(readFileSync(new URL(t.file, dir)), {});
    } catch (e) {
      err = e as LayoutError;
    }
    expect(err).toBeInstanceOf(LayoutError);
    expect(err!.code).toBe("depth_missing");
    expect(err!.message).toContain("FLOW → channel");
    const layers = (err!.details as { layers: LayerSummary[] }).layers;
    expect(Object.fromEntries(layers.map((l) => [l.name, l.role]))).toMatchObject({ FLOW: "channel", PORTS: "port", TEXT: "ignore" });
  });

  it("a mapping that names only some layers lists the others as unmapped with a proposed role", () => {
    const t = fixtures["cross-r2000"];
    const net = extractNetwork(readFileSync(new URL(t.file, dir)), { layers: { FLOW: { role: "channel", width: "100 um", depth: "50 um" }, PORTS: { role: "port" } } });
    expect(net.mappingProposed).toBe(false);
    const ctrl = net.layers.find((l) => l.name === "CTRL")!;
    expect(ctrl).toMatchObject({ role: "unmapped", entities: 1, byType: { LINE: 1 }, proposedRole: "channel" });
    expect(net.warnings.map((w) => w.code)).toContain("layers_unmapped");
  });
});
