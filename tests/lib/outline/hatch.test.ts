/**
 * HATCH boundaries read as mask outlines. Fixtures written by ezdxf (tests/fixtures/outlines/generate.py):
 * the T mask (Shapely buffer of the centreline fixture) as a polyline path, a stadium as an edge path of
 * lines and counter-clockwise arcs, and (generate_curved_hatch.py) edge paths with tilted elliptic caps walked
 * both ways and a rational spline edge; expected values from the centreline original, ezdxf's own reading
 * of the boundaries and Shapely.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { extractNetwork } from "@/lib/network/extract";
import { readDxf } from "@/lib/dxf/read";
import type { Piece } from "@/lib/dxf/types";

const outDir = new URL("../../fixtures/outlines/", import.meta.url);
const lineDir = new URL("../../fixtures/layouts/", import.meta.url);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const outlines: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", outDir), "utf8")).fixtures;
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const originals: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", lineDir), "utf8")).fixtures;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/** Signed area enclosed by a closed chain of line and arc pieces (Green's theorem, ∮ x dy − y dx / 2). */
function enclosedArea(pieces: Piece[]): number {
  let area = 0;
  for (const q of pieces) {
    if (q.kind === "line") area += (q.x0 * q.y1 - q.x1 * q.y0) / 2;
    else {
      const a1 = q.a0 + q.sweep;
      area += (q.r * q.r * q.sweep + q.cx * q.r * (Math.sin(a1) - Math.sin(q.a0)) - q.cy * q.r * (Math.cos(a1) - Math.cos(q.a0))) / 2;
    }
  }
  return area;
}

const ends = (q: Piece) =>
  q.kind === "line"
    ? { x0: q.x0, y0: q.y0, x1: q.x1, y1: q.y1 }
    : { x0: q.cx + q.r * Math.cos(q.a0), y0: q.cy + q.r * Math.sin(q.a0), x1: q.cx + q.r * Math.cos(q.a0 + q.sweep), y1: q.cy + q.r * Math.sin(q.a0 + q.sweep) };

describe("HATCH boundary paths", () => {
  it("a polyline-path hatch of the T mask gives the centreline original's three segments within 1 %", () => {
    const f = outlines["tee-hatch"];
    const net = extractNetwork(readFileSync(new URL(f.file, outDir)), f.conditions);
    const flow = net.layers.find((l) => l.name === "FLOW")!;
    expect(flow.byType).toEqual({ HATCH: 1 });
    expect(flow.style).toBe("outline");
    expect(net.warnings.map((w) => w.code)).not.toContain("entities_not_read");
    // Shapely noding of the centreline original (layouts/expected.json).
    const expected = (originals[f.original].segment_lengths_m as number[]).slice().sort((a, b) => a - b);
    const got = net.segments.map((s) => s.lengthM).sort((a, b) => a - b);
    expect(got).toHaveLength(expected.length);
    got.forEach((g, i) => expect(rel(g, expected[i])).toBeLessThan(0.01));
    for (const s of net.segments) expect(rel(s.widthM, f.width_m)).toBeLessThan(0.01);
  });

  it("an edge-path hatch (lines and arcs) is one closed path whose area is Shapely's, read as a 9 mm channel", () => {
    const f = outlines["stadium-hatch-edges"];
    const bytes = readFileSync(new URL(f.file, outDir));
    const d = readDxf(bytes, { chordToleranceM: 1e-7 });
    const paths = d.entities.filter((e) => e.kind === "path" && e.type === "HATCH");
    expect(paths).toHaveLength(1);
    const p = paths[0];
    expect(p.kind === "path" && p.closed).toBe(true);
    if (p.kind !== "path") return;
    expect(p.pieces.map((q) => q.kind)).toEqual(["line", "arc", "line", "arc"]);
    // Area of lines + half-discs (Green's theorem over the pieces): Shapely's round-capped buffer area within 0.1 %.
    expect(rel(Math.abs(enclosedArea(p.pieces)), f.mask_area_um2)).toBeLessThan(1e-3);
    const net = extractNetwork(bytes, f.conditions);
    expect(net.segments).toHaveLength(1);
    // Shapely: centreline minus the port discs.
    expect(rel(net.segments[0].lengthM, f.segment_length_m)).toBeLessThan(0.01);
    expect(rel(net.segments[0].widthM, f.width_m)).toBeLessThan(0.01);
  });

  it("elliptic-arc edges (angles from a tilted major axis, walked both ways) and a rational spline edge close their loops and enclose ezdxf's areas", () => {
    const f = outlines["curved-hatch-edges"];
    const bytes = readFileSync(new URL(f.file, outDir));
    const d = readDxf(bytes, { chordToleranceM: 1e-8 });
    expect(d.notes.map((n) => n.code)).toEqual([]);
    const byLayer = new Map(d.entities.filter((e) => e.kind === "path" && e.type === "HATCH").map((e) => [e.layer, e]));
    expect([...byLayer.keys()].sort()).toEqual(["BULGE", "FLOW", "FLOW_CW"]);
    for (const [layer, e] of byLayer) {
      if (e.kind !== "path") continue;
      expect(e.closed).toBe(true);
      // Each piece starts where the one before ends (1 nm in a µm drawing): angles read as parameters would leave gaps of microns.
      for (let k = 0; k < e.pieces.length; k++) {
        const a = ends(e.pieces[k]);
        const b = ends(e.pieces[(k + 1) % e.pieces.length]);
        expect(Math.hypot(b.x0 - a.x1, b.y0 - a.y1), `${layer} piece ${k}`).toBeLessThan(1e-3);
      }
      // ezdxf.path.from_hatch flattened to 1e-4 µm, Shapely Polygon.area (generate_curved_hatch.py).
      expect(rel(Math.abs(enclosedArea(e.pieces)), f.mask_area_um2_by_layer[layer]), layer).toBeLessThan(1e-4);
    }
    // The counter-clockwise and clockwise stadiums enclose the same area with opposite signs.
    const ccw = byLayer.get("FLOW")!;
    const cw = byLayer.get("FLOW_CW")!;
    if (ccw.kind === "path" && cw.kind === "path") {
      expect(enclosedArea(ccw.pieces)).toBeGreaterThan(0);
      expect(enclosedArea(cw.pieces)).toBeLessThan(0);
    }
    // Read as a channel: one 9 mm segment (Shapely: centreline minus port discs), 100 µm wide.
    const net = extractNetwork(bytes, f.conditions);
    expect(net.layers.find((l) => l.name === "FLOW")?.style).toBe("outline");
    expect(net.segments).toHaveLength(1);
    expect(rel(net.segments[0].lengthM, f.segment_length_m)).toBeLessThan(0.01);
    expect(rel(net.segments[0].widthM, f.width_m)).toBeLessThan(0.01);
    expect(net.warnings.map((w) => w.code)).not.toContain("hatch_edge_skipped");
  });
});
