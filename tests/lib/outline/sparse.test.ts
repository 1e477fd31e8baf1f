/**
 * Centrelines from sparsely sampled straight walls, against closed forms of the drawn geometry: a square grid of
 * channels (an outer square with square holes), two flat-ended channels side by side, and the T junction fixture
 * (Shapely buffer, tests/fixtures/outlines/generate.py).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { extractMedialAxis, pathArrays, type CentrelinePath } from "@/lib/outline/medial-axis";
import { extractNetwork } from "@/lib/network/extract";
import type { Ring } from "@/lib/outline/region";
import { readDxf } from "@/lib/dxf/read";
import { ringsOf } from "@/lib/outline/read";
import type { CircleEntity, PathEntity } from "@/lib/dxf/types";

const outDir = new URL("../../fixtures/outlines/", import.meta.url);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const outlines: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", outDir), "utf8")).fixtures;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
/** A path's points as [x, y] pairs (CentrelinePath keeps them flat, in buffers its result's paths may share). */
const pointsOf = (p: CentrelinePath): [number, number][] => Array.from({ length: p.end - p.start }, (_, i) => [p.xy[2 * (p.start + i)], p.xy[2 * (p.start + i) + 1]]);
/** A path's half-widths, one per point. */
const radiiOf = (p: CentrelinePath) => pathArrays(p).radii;
const lengthOf = (p: CentrelinePath) => pointsOf(p).reduce((s, q, i, pts) => (i === 0 ? 0 : s + Math.hypot(q[0] - pts[i - 1][0], q[1] - pts[i - 1][1])), 0);
const rect = (x0: number, y0: number, x1: number, y1: number): Ring => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];

// Both readers: the walls paired (the default for this mask) and the Voronoi diagram of sparse wall samples.
for (const pairedWalls of [true, false]) describe(`square grid of channels drawn as its mask (${pairedWalls ? "paired walls" : "Voronoi"})`, () => {
  // n × n junctions at pitch 400, channels 50 wide: the outer square grown by half a width, each cell's opening a hole.
  const n = 5, pitch = 400, w = 50, far = (n - 1) * pitch;
  const rings: Ring[] = [rect(-w / 2, -w / 2, far + w / 2, far + w / 2)];
  for (let i = 0; i + 1 < n; i++) for (let j = 0; j + 1 < n; j++) rings.push(rect(i * pitch + w / 2, j * pitch + w / 2, (i + 1) * pitch - w / 2, (j + 1) * pitch - w / 2));
  const axis = extractMedialAxis(rings, undefined, { pairedWalls });

  it("is read by the reader asked for", () => {
    expect(axis.method).toBe(pairedWalls ? "paired walls" : "medial axis");
  });
  const inner = (x: number, y: number) => [x, y].every((c) => Math.abs(c / pitch - Math.round(c / pitch)) < 1e-6 && c > 0 && c < far);
  const between = axis.paths.filter((p) => inner(...pointsOf(p)[0]) && inner(...pointsOf(p).at(-1)!));

  it("one path per channel between two crossings, each the pitch long", () => {
    // Closed form: 2·(n−2)·(n−3) channels join two inner crossings; centre to centre is the pitch.
    expect(between).toHaveLength(2 * (n - 2) * (n - 3));
    for (const p of between) expect(rel(lengthOf(p), pitch)).toBeLessThan(1e-3);
  });

  it("half-widths: the drawn half-width along the channel, w/√2 at a crossing (distance to the four wall corners)", () => {
    for (const p of between) {
      expect(rel(Math.min(...radiiOf(p)), w / 2)).toBeLessThan(0.005);
      expect(rel(radiiOf(p)[0], w / Math.SQRT2)).toBeLessThan(0.005);
      expect(rel(radiiOf(p)[radiiOf(p).length - 1], w / Math.SQRT2)).toBeLessThan(0.005);
    }
    expect(rel(axis.minWidthUnits, w)).toBeLessThan(0.005);
    expect(axis.regions).toBe(1);
    expect(axis.holes).toBe((n - 1) ** 2);
  });

  it("mean width over a channel, crossings included, matches the closed form within 0.5 %", () => {
    // Within a = w/2 of a crossing the width is 2·√((a − x)² + a²) (twice the distance to the corner), so over the
    // pitch p: mean = w + (4/p)·∫₀ᵃ (√(u² + a²) − a) du = w + (4a²/p)·(√2/2 + asinh(1)/2 − 1) (integral tables).
    const a = w / 2;
    const mean = w + ((4 * a * a) / pitch) * (Math.SQRT2 / 2 + Math.asinh(1) / 2 - 1);
    for (const p of between) {
      let area = 0;
      const pts = pointsOf(p);
      for (let i = 1; i < pts.length; i++) area += (radiiOf(p)[i - 1] + radiiOf(p)[i]) * Math.hypot(pts[i][0] - pts[i - 1][0], pts[i][1] - pts[i - 1][1]);
      expect(rel(area / lengthOf(p), mean)).toBeLessThan(0.005);
    }
  });
});

describe("flat-ended channels", () => {
  for (const gap of [10, 300]) {
    it(`two 5000 × 100 channels ${gap} apart: two centrelines from end wall to end wall, 100 wide`, () => {
      // Closed form: a flat-ended rectangle's centreline runs the rectangle's length, at its half-width from both sides.
      const axis = extractMedialAxis([rect(0, 0, 5000, 100), rect(0, 100 + gap, 5000, 200 + gap)]);
      expect(axis.paths).toHaveLength(2);
      for (const p of axis.paths) {
        expect(rel(lengthOf(p), 5000)).toBeLessThan(1e-3);
        for (const r of radiiOf(p)) expect(rel(r, 50)).toBeLessThan(0.005);
      }
      expect(axis.regions).toBe(2);
    });
  }
});

describe("T junction from its outline", () => {
  it("widest at the junction: the circle touching the far wall and the branch's two corners, radius 5w/8", () => {
    // Plane geometry for a T of equal widths w = 100 µm: the circle through both branch corners tangent to the far
    // wall has radius 5w/8 (its centre 5w/8 − w/2 off the straight channel's centreline, as in outline.test.ts).
    const f = outlines["tee-um-r2000-outline"];
    const net = extractNetwork(readFileSync(new URL(f.file, outDir)), f.conditions);
    const widest = Math.max(...net.segments.map((s) => s.maxWidthM ?? s.widthM));
    expect(rel(widest, (2 * 5 * 100e-6) / 8)).toBeLessThan(0.01);
    // Everywhere else the channel is its drawn 100 µm (Shapely buffer distance × 2).
    for (const s of net.segments) expect(rel(s.minWidthM ?? s.widthM, f.width_m)).toBeLessThan(0.005);
    // The same from the Voronoi reader (the default reads this mask's walls as pairs): its widest half-width.
    const d = readDxf(readFileSync(new URL(f.file, outDir)), { chordToleranceM: 1e-7 });
    const shapes = d.entities.filter((e): e is PathEntity | CircleEntity => e.layer === "FLOW" && e.kind !== "text");
    const voronoi = extractMedialAxis(ringsOf(shapes), undefined, { pairedWalls: false });
    expect(voronoi.method).toBe("medial axis");
    const widestR = Math.max(...voronoi.paths.flatMap((p) => Array.from(radiiOf(p))));
    expect(rel(widestR * 1e-6, (5 * 100e-6) / 8)).toBeLessThan(0.01);
  });
});
