/**
 * Outline layouts against their centreline originals. The outline fixtures are
 * Shapely buffers (flat caps, mitred joins) of the centreline fixtures in
 * tests/fixtures/layouts/, written with ezdxf by tests/fixtures/outlines/generate.py;
 * the expected lengths, junctions and port pressures are those of the centreline
 * originals (their own expected.json, from Shapely noding) or Shapely measurements
 * of the written polygons.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { extractNetwork } from "@/lib/network/extract";
import { analyzeLayout } from "@/lib/analysis/analyze";
import { readDxf } from "@/lib/dxf/read";
import { readOutlineLayer, ringsOf } from "@/lib/outline/read";
import { LayoutError } from "@/lib/errors";
import type { ChannelNetwork, NetworkSegment } from "@/lib/network/types";
import type { CircleEntity, PathEntity } from "@/lib/dxf/types";

const outDir = new URL("../../fixtures/outlines/", import.meta.url);
const lineDir = new URL("../../fixtures/layouts/", import.meta.url);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const outlines: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", outDir), "utf8")).fixtures;
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const originals: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", lineDir), "utf8")).fixtures;

const outlineNet = (name: string): ChannelNetwork => extractNetwork(readFileSync(new URL(outlines[name].file, outDir)), outlines[name].conditions);
const centrelineNet = (name: string): ChannelNetwork => extractNetwork(readFileSync(new URL(originals[name].file, lineDir)), originals[name].conditions);
const sorted = (xs: number[]) => xs.slice().sort((a, b) => a - b);
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

function flowShapes(name: string): (PathEntity | CircleEntity)[] {
  const d = readDxf(readFileSync(new URL(outlines[name].file, outDir)), { chordToleranceM: 1e-7 });
  return d.entities.filter((e): e is PathEntity | CircleEntity => e.layer === "FLOW" && e.kind !== "text");
}

/** Width at distance sM along a segment, from its profile or its two end widths. */
function widthAt(s: NetworkSegment, sM: number): number {
  const prof = s.widthProfile ?? { sM: [0, s.lengthM], widthM: [s.widthM, s.endWidthM] };
  for (let i = 1; i < prof.sM.length; i++) {
    if (sM <= prof.sM[i]) {
      const sa = prof.sM[i - 1], sb = prof.sM[i], wa = prof.widthM[i - 1], wb = prof.widthM[i];
      return sb === sa ? wb : wa + ((wb - wa) * (sM - sa)) / (sb - sa);
    }
  }
  return prof.widthM.at(-1)!;
}

describe("outline versions of straight and serpentine channels", () => {
  for (const name of ["straight-r2000", "serpentine-r12"]) {
    it(`${name}: one segment, length and width within 1 % of the centreline original`, () => {
      const net = outlineNet(`${name}-outline`);
      const lengths = originals[name].segment_lengths_m as number[];
      expect(net.segments).toHaveLength(lengths.length);
      // Length: Shapely length of the centreline less the port discs (layouts/expected.json); 1 % (issue 9).
      expect(rel(net.segments[0].lengthM, lengths[0])).toBeLessThan(0.01);
      // Width: the buffer distance × 2 = 100 µm, everywhere along the channel (min, mean and max) within 1 %.
      const s = net.segments[0];
      for (const w of [s.widthM, s.endWidthM, s.minWidthM ?? s.widthM, s.maxWidthM ?? s.widthM]) expect(rel(w, outlines[`${name}-outline`].width_m)).toBeLessThan(0.01);
      expect(net.layers.find((l) => l.name === "FLOW")!.style).toBe("outline");
      expect(net.warnings.map((w) => w.code)).toContain("outline_read");
      expect(net.warnings.map((w) => w.code)).not.toContain("outline_shapes_not_read");
    });
  }

  it("the serpentine's outline length also matches the closed form 22 mm + 4·π·0.3 mm less the port radii within 1 %", () => {
    // Closed form from tests/fixtures/layouts/generate.py: 1 + 5 × 4 + 4π × 0.3 + 1 mm between the port circles.
    const net = outlineNet("serpentine-r12-outline");
    expect(rel(net.segments[0].lengthM, originals["serpentine-r12"].closed_form_length_m)).toBeLessThan(0.01);
  });
});

describe("bend radius from the outline's centreline", () => {
  it("the serpentine's U-turns are found at 300 µm within 2 %; straight channels and T arms have none", () => {
    // min_bend_radius_m of the centreline original (layouts/expected.json, the drawn ARC radius).
    const serp = outlineNet("serpentine-r12-outline").segments[0];
    expect(rel(serp.minBendRadiusM!, originals["serpentine-r12"].min_bend_radius_m)).toBeLessThan(0.02);
    expect(outlineNet("straight-r2000-outline").segments[0].minBendRadiusM).toBeNull();
    for (const s of outlineNet("tee-um-r2000-outline").segments) expect(s.minBendRadiusM).toBeNull();
  });
});

describe("T and cross junctions from outlines", () => {
  for (const name of ["tee-um-r2000", "cross-r2000"]) {
    it(`${name}: same segments as the centreline original, junction at the crossing of the centrelines`, () => {
      const net = outlineNet(`${name}-outline`);
      const expected = sorted(originals[name].segment_lengths_m);
      const got = sorted(net.segments.map((s) => s.lengthM));
      expect(got).toHaveLength(expected.length);
      // Lengths within 1 % of Shapely's noded centrelines (layouts/expected.json).
      got.forEach((g, i) => expect(rel(g, expected[i])).toBeLessThan(0.01));
      // Mean widths within 1 % of 100 µm (the junction's wider inscribed circle affects only its last radius or so).
      for (const s of net.segments) expect(rel(s.widthM, 100e-6)).toBeLessThan(0.01);
      const junctions = net.nodes.filter((n) => n.kind === "junction");
      expect(junctions).toHaveLength(1);
      // The medial axis of a T meets at the centre of the largest inscribed circle, 5w/8 − w/2 = 12.5 µm off the
      // straight channel's centreline (plane geometry); allow a quarter width.
      const [jx, jy] = originals[name].junction_m;
      expect(Math.hypot(junctions[0].xM - jx, junctions[0].yM - jy)).toBeLessThan(25e-6);
      // Every port of the original is reached.
      expect(net.ports.map((p) => p.name).sort()).toEqual(centrelineNet(name).ports.map((p) => p.name).sort());
    });
  }
});

describe("tapered channel from a trapezoid outline", () => {
  it("width profile within 2 % of Shapely's cross-section widths", () => {
    const f = outlines["tapered-outline"];
    const net = outlineNet("tapered-outline");
    expect(net.segments).toHaveLength(1);
    const s = net.segments[0];
    expect(rel(s.lengthM, f.length_m)).toBeLessThan(0.01);
    // The segment runs from T_IN (x = 0 µm, port radius 500 µm) towards T_OUT; sM = x − 500 µm.
    const fromIn = net.nodes.find((n) => n.id === s.from)!.port === "T_IN";
    for (const [xM, wM] of f.widths_at_x_m as [number, number][]) {
      const sM = fromIn ? xM - 500e-6 : 5500e-6 - xM;
      expect(rel(widthAt(s, sM), wM)).toBeLessThan(0.02);
    }
  });
});

describe("chamber with pillars", () => {
  for (const name of ["chamber-pillars-outline", "chamber-pieces-outline"]) {
    it(`${name} (${outlines[name].drawn_as}): one connected region with its 10 holes, one network from IN to OUT`, () => {
      const read = readOutlineLayer(ringsOf(flowShapes(name)));
      // Shapely: unary_union(chamber, leads) − posts is one polygon with 10 interiors (outlines/expected.json).
      expect(read.axis.regions).toBe(outlines[name].shapely_polygons);
      expect(read.axis.holes).toBe(outlines[name].shapely_holes);
      const net = outlineNet(name);
      expect(net.warnings.map((w) => w.code)).not.toContain("unconnected_channels");
      expect(net.ports.map((p) => p.name).sort()).toEqual(["IN", "OUT"]);
      // Connected: every node reached from IN through the segments.
      const seen = new Set([net.ports.find((p) => p.name === "IN")!.node]);
      for (let grown = true; grown; ) {
        grown = false;
        for (const s of net.segments) {
          if (seen.has(s.from) !== seen.has(s.to)) {
            seen.add(s.from);
            seen.add(s.to);
            grown = true;
          }
        }
      }
      expect(seen.size).toBe(net.nodes.length);
      // The leads: 3 mm from the port centre to the chamber wall less the 0.5 mm port radius = 2.5 mm of 100 µm
      // channel (closed form), plus the part of the chamber the axis crosses before its first junction.
      const lead = net.segments.filter((s) => net.nodes.find((n) => n.id === s.from)!.kind === "port" || net.nodes.find((n) => n.id === s.to)!.kind === "port");
      expect(lead).toHaveLength(2);
      for (const s of lead) {
        expect(s.lengthM).toBeGreaterThan(outlines[name].lead_length_m);
        expect(rel(s.minWidthM ?? s.widthM, 100e-6)).toBeLessThan(0.01);
      }
    });
  }

  it("the chamber drawn as one polygon with holes and as overlapping pieces gives the same network", () => {
    const a = outlineNet("chamber-pillars-outline");
    const b = outlineNet("chamber-pieces-outline");
    expect(b.segments).toHaveLength(a.segments.length);
    const la = sorted(a.segments.map((s) => s.lengthM));
    const lb = sorted(b.segments.map((s) => s.lengthM));
    la.forEach((l, i) => expect(rel(lb[i], l)).toBeLessThan(0.01));
  });
});

describe("same chip as centrelines and as outlines through analyzeLayout", () => {
  const water25 = { preset: "water", temperature: "25 degC" };
  const cases: [string, Record<string, unknown>][] = [
    ["straight-r2000", { IN: { flow: "10 uL/min" }, OUT: { pressure: "0 Pa" } }],
    ["serpentine-r12", { IN: { flow: "10 uL/min" }, OUT: { pressure: "0 Pa" } }],
    ["tee-um-r2000", { A: { flow: "5 uL/min" }, B: { flow: "10 uL/min" }, C: { pressure: "0 Pa" } }],
    ["cross-r2000", { W: { flow: "5 uL/min" }, S: { flow: "5 uL/min" }, N: { flow: "2 uL/min" }, E: { pressure: "0 Pa" } }],
  ];
  for (const [name, ports] of cases) {
    it(`${name}: same segment count and port pressures within 2 %`, () => {
      const line = analyzeLayout(readFileSync(new URL(originals[name].file, lineDir)), { ...originals[name].conditions, fluid: water25, ports });
      const mask = analyzeLayout(readFileSync(new URL(outlines[`${name}-outline`].file, outDir)), { ...outlines[`${name}-outline`].conditions, fluid: water25, ports });
      expect(mask.segments).toHaveLength(line.segments.length);
      for (const p of line.ports) {
        const q = mask.ports.find((x) => x.name === p.name)!;
        // The centreline original solved by the same engine is the reference (issue 9: within 2 %).
        if (Math.abs(p.pressure_Pa!) > 0) expect(rel(q.pressure_Pa!, p.pressure_Pa!)).toBeLessThan(0.02);
      }
    });
  }
});

describe("the mask shapes travel with the result, for the drawing's overlay", () => {
  it("a straight outline carries its one ring in metres; a centreline layout carries none", () => {
    const water25 = { preset: "water", temperature: "25 degC" };
    const ports = { IN: { flow: "10 uL/min" }, OUT: { pressure: "0 Pa" } };
    const mask = analyzeLayout(readFileSync(new URL(outlines["straight-r2000-outline"].file, outDir)), { ...outlines["straight-r2000-outline"].conditions, fluid: water25, ports });
    expect(mask.mask_m).toHaveLength(1);
    expect(mask.mask_m![0].layer).toBe("FLOW");
    expect(mask.mask_m![0].rings).toHaveLength(1);
    // Shapely's flat-capped buffer of the 9 mm × 100 µm channel (tests/fixtures/outlines/generate.py): every
    // ring point lies within the channel's bounds, and the ring spans the channel's width.
    const ys = mask.mask_m![0].rings[0].map(([, y]) => y);
    expect(Math.max(...ys) - Math.min(...ys)).toBeCloseTo(100e-6, 9);
    const line = analyzeLayout(readFileSync(new URL(originals["straight-r2000"].file, lineDir)), { ...originals["straight-r2000"].conditions, fluid: water25, ports });
    expect(line.mask_m).toBeUndefined();
  });
});

describe("bad outline input", () => {
  it("an outline layer without depth names the layer and what to add", () => {
    const f = outlines["straight-r2000-outline"];
    let err: unknown;
    try {
      extractNetwork(readFileSync(new URL(f.file, outDir)), { layers: { FLOW: { role: "channel" }, PORTS: { role: "port" } } });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(LayoutError);
    expect((err as LayoutError).code).toBe("depth_missing");
    expect((err as LayoutError).message).toContain('"FLOW"');
  });
});
