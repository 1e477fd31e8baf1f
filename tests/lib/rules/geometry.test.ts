import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { candidatePairs, pointInPolygon, polylineDistance, polylineToRingDistance, type Pt } from "@/lib/rules/geometry";

const ref = JSON.parse(readFileSync(fileURLToPath(new URL("../../fixtures/networks/shapely-geometry.json", import.meta.url)), "utf8")) as {
  pairs: { p: Pt[]; q: Pt[]; distance: number }[];
  ring: Pt[];
  points: { p: Pt; inside: boolean; boundaryDistance: number }[];
};

describe("plane geometry vs Shapely (tests/fixtures/networks/generate-geometry.py)", () => {
  it("polyline–polyline distances match Shapely's LineString.distance to 1e-15 m", () => {
    for (const c of ref.pairs) expect(Math.abs(polylineDistance(c.p, c.q) - c.distance)).toBeLessThan(1e-15);
  });
  it("point-in-polygon matches Shapely's contains() on a concave polygon", () => {
    for (const c of ref.points) expect(pointInPolygon(c.p, ref.ring)).toBe(c.inside);
  });
  it("point-to-boundary distances match Shapely", () => {
    for (const c of ref.points) expect(Math.abs(polylineToRingDistance([c.p], ref.ring) - c.boundaryDistance)).toBeLessThan(1e-15);
  });
  it("the neighbour grid finds every pair of boxes within reach (brute force as the reference)", () => {
    const boxes = ref.pairs.map((c) => {
      const xs = c.p.map((p) => p[0]);
      const ys = c.p.map((p) => p[1]);
      return { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) };
    });
    const reach = 5e-5;
    const found = new Set(candidatePairs(boxes, reach, 2e-4).map(([i, j]) => `${i},${j}`));
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const A = boxes[i];
        const B = boxes[j];
        const near = !(A.minX - reach > B.maxX || B.minX - reach > A.maxX || A.minY - reach > B.maxY || B.minY - reach > A.maxY);
        expect(found.has(`${i},${j}`)).toBe(near);
      }
    }
  });
});
