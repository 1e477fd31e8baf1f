/**
 * Piece geometry against independent libraries: line–line crossings from
 * Shapely (exact), line–circle crossings from Shapely on a finely segmented
 * circle, bulge → arc from ezdxf.math.bulge_to_arc (cases written by
 * tests/fixtures/layouts/generate.py).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { polylinePieces } from "@/lib/dxf/read";
import type { ArcPiece, LinePiece } from "@/lib/dxf/types";
import { bboxOf, circleCrossings, intersect, pieceLength, pointAt, project } from "@/lib/network/geometry";

const g = JSON.parse(readFileSync(new URL("../../fixtures/layouts/expected.json", import.meta.url), "utf8")).geometry;
interface LineLineCase { a: number[][]; b: number[][]; hit: number[] | null }
interface LineCircleCase { a: number[][]; c: number[]; r: number; hits: number[][] }
interface BulgeCase { p0: number[]; p1: number[]; bulge: number; centre: number[]; radius: number; length: number }
const line = (a: number[][]): LinePiece => ({ kind: "line", x0: a[0][0], y0: a[0][1], x1: a[1][0], y1: a[1][1], w0: null, w1: null });

describe("line–line crossings (Shapely intersection)", () => {
  (g.line_line as LineLineCase[]).forEach((c, i) => it(`case ${i}`, () => {
    const hits = intersect(line(c.a), line(c.b));
    if (c.hit === null) {
      expect(hits).toHaveLength(0);
      return;
    }
    expect(hits).toHaveLength(1);
    expect(hits[0].x).toBeCloseTo(c.hit[0], 9);
    expect(hits[0].y).toBeCloseTo(c.hit[1], 9);
    const p = pointAt(line(c.b), hits[0].u);
    expect(p.x).toBeCloseTo(c.hit[0], 9);
  }));
});

describe("line–circle crossings (Shapely on a 4096-gon)", () => {
  (g.line_circle as LineCircleCase[]).forEach((c, i) => it(`case ${i}`, () => {
    const l = line(c.a);
    const ts = circleCrossings(l, c.c[0], c.c[1], c.r);
    expect(ts.length).toBe(c.hits.length);
    // The polygon's chords sit at most r·(1 − cos(π/4096)) ≈ 3e-7·r inside the circle; along a steep line that is a few 1e-5.
    const got = ts.map((t) => pointAt(l, t)).sort((p, q) => p.x - q.x);
    const want = [...c.hits].sort((p, q) => p[0] - q[0]);
    got.forEach((p, k) => expect(Math.hypot(p.x - want[k][0], p.y - want[k][1])).toBeLessThan(1e-3));
  }));
});

describe("bulge → arc (ezdxf.math.bulge_to_arc)", () => {
  (g.bulge as BulgeCase[]).forEach((c, i) => it(`case ${i}`, () => {
    const [arc] = polylinePieces(
      [
        { x: c.p0[0], y: c.p0[1], bulge: c.bulge, sw: null, ew: null },
        { x: c.p1[0], y: c.p1[1], bulge: 0, sw: null, ew: null },
      ],
      false,
    ) as ArcPiece[];
    expect(arc.kind).toBe("arc");
    expect(arc.cx).toBeCloseTo(c.centre[0], 9);
    expect(arc.cy).toBeCloseTo(c.centre[1], 9);
    expect(arc.r).toBeCloseTo(c.radius, 9);
    // Arc length r·4·atan|b| (DXF bulge definition) with ezdxf's radius.
    expect(pieceLength(arc)).toBeCloseTo(c.length, 9);
    // The arc runs from p0 to p1, and its bounding box contains every sampled point.
    const end = pointAt(arc, 1);
    expect(end.x).toBeCloseTo(c.p1[0], 9);
    expect(end.y).toBeCloseTo(c.p1[1], 9);
    const [x0, y0, x1, y1] = bboxOf(arc);
    for (let k = 0; k <= 64; k++) {
      const p = pointAt(arc, k / 64);
      expect(p.x).toBeGreaterThanOrEqual(x0 - 1e-9);
      expect(p.x).toBeLessThanOrEqual(x1 + 1e-9);
      expect(p.y).toBeGreaterThanOrEqual(y0 - 1e-9);
      expect(p.y).toBeLessThanOrEqual(y1 + 1e-9);
      // Every point of the arc projects onto it at distance 0.
      expect(project(arc, p.x, p.y).dist).toBeLessThan(1e-9);
    }
  }));
});
