/**
 * The filled region's inside test against Shapely's Polygon.contains on probe points
 * (tests/fixtures/outlines/generate.py): the chamber with pillars drawn as one polygon with
 * holes, and as overlapping pieces with circles for the posts (union and holes by nesting).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDxf } from "@/lib/dxf/read";
import { ringsOf } from "@/lib/outline/read";
import { filledArea, Region } from "@/lib/outline/region";
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
