/**
 * The filled region's inside test against Shapely's Polygon.contains on probe points
 * (tests/fixtures/outlines/generate.py): the chamber with pillars drawn as one polygon with
 * holes, and as overlapping pieces with circles for the posts (union and holes by nesting); and the rings'
 * cleaning, nesting and orientation on a square with a hole (plane geometry).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDxf } from "@/lib/dxf/read";
import { ringsOf } from "@/lib/outline/read";
import { filledArea, orientRings, Region, type Ring } from "@/lib/outline/region";
import type { CircleEntity, PathEntity } from "@/lib/dxf/types";

const outDir = new URL("../../fixtures/outlines/", import.meta.url);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const outlines: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", outDir), "utf8")).fixtures;

function rings(name: string) {
  const d = readDxf(readFileSync(new URL(outlines[name].file, outDir)), { chordToleranceM: 1e-7 });
  return ringsOf(d.entities.filter((e): e is PathEntity | CircleEntity => e.layer === "FLOW" && e.kind !== "text"));
}

describe("Region inside test", () => {
  for (const name of ["chamber-pillars-outline", "chamber-pieces-outline"]) {
    it(`${name}: every probe point agrees with Shapely's contains`, () => {
      const region = new Region(rings(name), 50);
      const probes = outlines[name].probes as [number, number, boolean][];
      const wrong = probes.filter(([x, y, inside]) => region.contains(x, y) !== inside);
      expect(probes.filter((p) => p[2]).length).toBeGreaterThan(100);
      expect(wrong).toEqual([]);
      // Ten holes found by nesting (Shapely: 10 interiors).
      expect(region.depth.filter((d) => d % 2 === 1)).toHaveLength(outlines[name].shapely_holes);
    });
  }

  it("filled area subtracts holes: the one-polygon chamber's area equals its rings' outer minus holes", () => {
    // Closed form: 3000 × 1200 chamber + 2 × 2500 × 100 leads − posts (Shapely's 16-segment quarter circles are
    // polygons of 64 sides: area 64/2 · r² · sin(2π/64)).
    const post = 32 * 100 * 100 * Math.sin((2 * Math.PI) / 64);
    const expected = 3000 * 1200 + 2 * 3000 * 100 - 10 * post;
    expect(Math.abs(filledArea(rings("chamber-pillars-outline")) - expected) / expected).toBeLessThan(1e-9);
  });
});

describe("rings cleaned, nested and oriented", () => {
  // Plane geometry: a 100 × 100 square drawn clockwise with its first point repeated at the end and one vertex
  // twice, a 20 × 20 hole inside it drawn counter-clockwise, a collinear "ring" of no area and a two-point ring.
  const outer: Ring = [[0, 0], [0, 100], [0, 100], [100, 100], [100, 0], [0, 0]];
  const hole: Ring = [[40, 40], [60, 40], [60, 60], [40, 60]];
  const flat: Ring = [[200, 0], [300, 0], [250, 0]];
  const pair: Ring = [[400, 0], [500, 0]];
  /** Signed area by the shoelace formula, positive counter-clockwise. */
  const shoelace = (r: Ring) => r.reduce((a, [x, y], i) => a + (x * r[(i + 1) % r.length][1] - r[(i + 1) % r.length][0] * y) / 2, 0);

  it("drops repeated points (the closing one too) and rings of no area; outer rings end counter-clockwise, holes clockwise", () => {
    const o = orientRings([outer, flat, hole, pair]);
    expect(o.rings).toHaveLength(2);
    expect(o.depth).toEqual([0, 1]);
    expect(o.rings[0]).toHaveLength(4);
    for (let i = 0; i < 4; i++) expect(o.rings[0][i]).not.toEqual(o.rings[0][(i + 1) % 4]);
    expect(shoelace(o.rings[0])).toBeCloseTo(10000, 9);
    expect(shoelace(o.rings[1])).toBeCloseTo(-400, 9);
  });

  it("filled area: the square less its hole, whatever the drawing order and orientation", () => {
    expect(filledArea([outer, hole])).toBeCloseTo(9600, 9);
    expect(filledArea([hole.slice().reverse(), flat, outer.slice().reverse()])).toBeCloseTo(9600, 9);
  });
});
