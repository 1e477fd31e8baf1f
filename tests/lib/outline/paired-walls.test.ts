/**
 * The paired-wall reading (lib/outline/paired-walls.ts): masks drawn here by plane geometry (rectangles, mitred
 * bends: the offset lines of a centreline, met pairwise) whose centreline lengths and widths are closed forms; the
 * Shapely-buffer fixtures (tests/fixtures/outlines/generate.py) read both ways, paired and Voronoi, which must
 * agree; and the shapes the pairing must leave to the Voronoi reader.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { extractMedialAxis, pathArrays, type CentrelinePath, type MedialAxisResult } from "@/lib/outline/medial-axis";
import { ringsOf } from "@/lib/outline/read";
import { readDxf } from "@/lib/dxf/read";
import type { Ring } from "@/lib/outline/region";
import type { CircleEntity, PathEntity } from "@/lib/dxf/types";

const outDir = new URL("../../fixtures/outlines/", import.meta.url);
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
/** A path's points as [x, y] pairs (CentrelinePath keeps them flat, in buffers its result's paths may share). */
const pointsOf = (p: CentrelinePath): [number, number][] => Array.from({ length: p.end - p.start }, (_, i) => [p.xy[2 * (p.start + i)], p.xy[2 * (p.start + i) + 1]]);
/** A path's half-widths, one per point. */
const radiiOf = (p: CentrelinePath) => pathArrays(p).radii;
const lengthOf = (p: CentrelinePath) => pointsOf(p).reduce((s, q, i, pts) => (i === 0 ? 0 : s + Math.hypot(q[0] - pts[i - 1][0], q[1] - pts[i - 1][1])), 0);
const rect = (x0: number, y0: number, x1: number, y1: number): Ring => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
const near = (a: [number, number], b: [number, number], tol = 1e-6) => Math.hypot(a[0] - b[0], a[1] - b[1]) <= tol;

/**
 * The mitred outline of a polyline centreline of half-width h (flat ends): each side's offset lines met pairwise
 * (plane geometry), the left side forward and the right side back.
 */
function mitred(line: [number, number][], h: number): Ring {
  const side = (sign: number) => {
    const pts: [number, number][] = [];
    for (let i = 0; i < line.length; i++) {
      const off = (k: number): [number, number, number, number] => {
        const [ax, ay] = line[k], [bx, by] = line[k + 1];
        const l = Math.hypot(bx - ax, by - ay);
        const nx = (-(by - ay) / l) * h * sign, ny = ((bx - ax) / l) * h * sign;
        return [ax + nx, ay + ny, (bx - ax) / l, (by - ay) / l];
      };
      if (i === 0) {
        const [x, y] = off(0);
        pts.push([x, y]);
      } else if (i === line.length - 1) {
        const [x, y, dx, dy] = off(i - 1);
        const l = Math.hypot(line[i][0] - line[i - 1][0], line[i][1] - line[i - 1][1]);
        pts.push([x + dx * l, y + dy * l]);
      } else {
        // Where the two offset lines meet: p + t·d = q + s·e.
        const [px, py, dx, dy] = off(i - 1), [qx, qy, ex, ey] = off(i);
        const t = ((qx - px) * ey - (qy - py) * ex) / (dx * ey - dy * ex);
        pts.push([px + dx * t, py + dy * t]);
      }
    }
    return pts;
  };
  return [...side(1), ...side(-1).reverse()];
}

describe("closed forms read from paired walls", () => {
  it("a straight channel whose walls carry a collinear vertex at one place: one path, 1000 long, no point twice", () => {
    // Both walls split at x = 400: two stretches end to end, their ends on the joint's centre (an arm of no length).
    const ring: Ring = [[0, -25], [400, -25], [1000, -25], [1000, 25], [400, 25], [0, 25]];
    const axis = extractMedialAxis([ring]);
    expect(axis.method).toBe("paired walls");
    expect(axis.paths).toHaveLength(1);
    const pts = pointsOf(axis.paths[0]);
    expect(rel(lengthOf(axis.paths[0]), 1000)).toBeLessThan(1e-12);
    for (let i = 1; i < pts.length; i++) expect(near(pts[i], pts[i - 1], 0)).toBe(false);
    for (const r of radiiOf(axis.paths[0])) expect(r).toBeCloseTo(25, 12);
  });

  it("an L bend from 50 to 100 wide: one path through the corner, the centreline's 2000 long, each arm its width", () => {
    // Centreline (0,0) → (1000,0) → (1000,1000); flat ends. Widths 50 along the first arm, 100 along the second.
    const ring: Ring = [[0, -25], [1050, -25], [1050, 1000], [950, 1000], [950, 25], [0, 25]];
    const axis = extractMedialAxis([ring]);
    expect(axis.method).toBe("paired walls");
    expect(axis.paths).toHaveLength(1);
    const p = axis.paths[0];
    expect(rel(lengthOf(p), 2000)).toBeLessThan(1e-9);
    expect(pointsOf(p).some((q) => near(q, [1000, 0]))).toBe(true);
    // Half-widths: 25 up to the first arm's end at x = 950, 50 from the second arm's start at y = 25.
    pointsOf(p).forEach((q, i) => {
      if (q[1] === 0 && q[0] <= 950) expect(radiiOf(p)[i]).toBeCloseTo(25, 9);
      if (q[0] === 1000 && q[1] >= 25) expect(radiiOf(p)[i]).toBeCloseTo(50, 9);
    });
    // A sharp corner has no bend radius (as a polyline centreline's vertex has none).
    expect(p.bendRadius).toBeNull();
    expect(axis.minWidthUnits).toBeCloseTo(50, 9);
  });

  it("a T whose branch is half as wide: the three paths meet on the through channel's centreline", () => {
    // Through channel 100 wide on y = 0 from x = 0 to 2000; branch 50 wide on x = 1000 from y = −1000 up.
    const ring: Ring = [[0, -50], [975, -50], [975, -1000], [1025, -1000], [1025, -50], [2000, -50], [2000, 50], [0, 50]];
    const axis = extractMedialAxis([ring]);
    expect(axis.method).toBe("paired walls");
    expect(axis.paths).toHaveLength(3);
    for (const p of axis.paths) {
      expect(near(pointsOf(p)[0], [1000, 0]) || near(pointsOf(p).at(-1)!, [1000, 0])).toBe(true);
      expect(rel(lengthOf(p), 1000)).toBeLessThan(1e-9);
    }
    const radii = axis.paths.map((p) => Math.min(...radiiOf(p))).sort((a, b) => a - b);
    expect(radii[0]).toBeCloseTo(25, 9);
    expect(radii[1]).toBeCloseTo(50, 9);
    expect(radii[2]).toBeCloseTo(50, 9);
  });

  it("a 45° mitred bend: one path the centreline's length, 100 wide, no bend radius", () => {
    const s = Math.SQRT1_2;
    const line: [number, number][] = [[0, 0], [1000, 0], [1000 + 1000 * s, 1000 * s]];
    const axis = extractMedialAxis([mitred(line, 50)]);
    expect(axis.method).toBe("paired walls");
    expect(axis.paths).toHaveLength(1);
    expect(rel(lengthOf(axis.paths[0]), 2000)).toBeLessThan(1e-9);
    expect(rel(Math.min(...radiiOf(axis.paths[0])), 50)).toBeLessThan(1e-9);
    expect(axis.paths[0].bendRadius).toBeNull();
  });

  it("a square loop channel: one closed path round the hole, four sides of 1000", () => {
    const axis = extractMedialAxis([rect(-25, -25, 1025, 1025), rect(25, 25, 975, 975)]);
    expect(axis.method).toBe("paired walls");
    expect(axis.paths).toHaveLength(1);
    const p = axis.paths[0];
    expect(near(pointsOf(p)[0], pointsOf(p).at(-1)!)).toBe(true);
    expect(rel(lengthOf(p), 4000)).toBeLessThan(1e-9);
    expect(axis.regions).toBe(1);
    expect(axis.holes).toBe(1);
  });

  it("two separate channels: two regions, each from end wall to end wall", () => {
    const axis = extractMedialAxis([rect(0, 0, 5000, 100), rect(0, 300, 3000, 350)]);
    expect(axis.method).toBe("paired walls");
    expect(axis.regions).toBe(2);
    expect(axis.paths.map(lengthOf).sort((a, b) => a - b)).toEqual([3000, 5000]);
  });
});

/**
 * A round chamber of radius R with channels (half-width h, reaching out to radius R + L) at the given angles,
 * as one ring: the circle's arcs between the channels sampled every ≤ 5°, each channel out and back.
 */
function chamberWithArms(R: number, h: number, L: number, angles: number[]): Ring {
  const ring: Ring = [];
  const da = Math.asin(h / R);
  const at = (a: number, r: number): [number, number] => [r * Math.cos(a), r * Math.sin(a)];
  angles.forEach((a, k) => {
    const next = angles[(k + 1) % angles.length] + (k + 1 === angles.length ? 2 * Math.PI : 0);
    const ux = Math.cos(a), uy = Math.sin(a), nx = -uy, ny = ux;
    const foot = R * Math.cos(da);
    // Right wall out, cap, left wall back (the channel's walls meet the circle at a ± asin(h/R)).
    ring.push([ux * foot + nx * -h, uy * foot + ny * -h], [ux * (R + L) + nx * -h, uy * (R + L) + ny * -h], [ux * (R + L) + nx * h, uy * (R + L) + ny * h], [ux * foot + nx * h, uy * foot + ny * h]);
    const a0 = a + da, a1 = next - da;
    const steps = Math.ceil((a1 - a0) / ((5 * Math.PI) / 180));
    for (let i = 1; i < steps; i++) ring.push(at(a0 + ((a1 - a0) * i) / steps, R));
  });
  return ring;
}

describe("irregular grids with a width per line", () => {
  // n × n lines at irregular spacing, each line its own width (30–100): crossings of unequal widths, and wide
  // channels ending on narrow ones at the border. Closed form: the centrelines are the n vertical and n horizontal
  // lines, n·(X + Y) long in all. Seeded (Park–Miller minimal standard generator), so every run draws the same grids.
  let seed = 7;
  const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  for (let trial = 0; trial < 6; trial++) {
    const n = 3 + Math.floor(rnd() * 4);
    const xs = [0], ys = [0], wx: number[] = [], wy: number[] = [];
    for (let i = 1; i < n; i++) {
      xs.push(xs[i - 1] + 300 + rnd() * 500);
      ys.push(ys[i - 1] + 300 + rnd() * 500);
    }
    for (let i = 0; i < n; i++) {
      wx.push(30 + Math.round(rnd() * 70));
      wy.push(30 + Math.round(rnd() * 70));
    }
    const X = xs[n - 1], Y = ys[n - 1];
    const rings: Ring[] = [rect(-wx[0] / 2, -wy[0] / 2, X + wx[n - 1] / 2, Y + wy[n - 1] / 2)];
    for (let i = 0; i + 1 < n; i++) for (let j = 0; j + 1 < n; j++) rings.push(rect(xs[i] + wx[i] / 2, ys[j] + wy[j] / 2, xs[i + 1] - wx[i + 1] / 2, ys[j + 1] - wy[j + 1] / 2));
    it(`grid ${trial + 1} (${n} × ${n}): paired walls, the lines' length to 1e-9, as many paths as the Voronoi reader finds`, () => {
      const paired = extractMedialAxis(rings), voronoi = extractMedialAxis(rings, undefined, { pairedWalls: false });
      expect(paired.method).toBe("paired walls");
      const total = paired.paths.reduce((acc, p) => acc + lengthOf(p), 0);
      expect(rel(total, n * (X + Y))).toBeLessThan(1e-9);
      expect(paired.paths).toHaveLength(voronoi.paths.length);
      expect(paired.minWidthUnits).toBeCloseTo(Math.min(...wx, ...wy), 9);
      expect(rel(voronoi.minWidthUnits, paired.minWidthUnits)).toBeLessThan(0.005);
    });
  }
});

describe("drawings rounded to a grid", () => {
  // The narrow-branch T of above turned by 0.3 rad and π/4 with its coordinates rounded to 1 nm (1e-3 drawing
  // units of 1 µm, a common mask database grid): the walls stay parallel to well within the widths' tolerance.
  const tee: Ring = [[0, -50], [975, -50], [975, -1000], [1025, -1000], [1025, -50], [2000, -50], [2000, 50], [0, 50]];
  const turned = (a: number): Ring => tee.map(([x, y]) => [Math.round((x * Math.cos(a) - y * Math.sin(a)) * 1e3) / 1e3, Math.round((x * Math.sin(a) + y * Math.cos(a)) * 1e3) / 1e3]);
  for (const a of [0.3, Math.PI / 4]) {
    it(`a T turned by ${a.toFixed(2)} rad on a 1 nm grid: still paired, three arms of 1000 within 1e-5`, () => {
      const axis = extractMedialAxis([turned(a)]);
      expect(axis.method).toBe("paired walls");
      expect(axis.paths).toHaveLength(3);
      for (const p of axis.paths) expect(rel(lengthOf(p), 1000)).toBeLessThan(1e-5);
    });
  }

  it("a channel narrowing by 1 % over its length is a taper, not parallel walls", () => {
    expect(extractMedialAxis([[[0, -50], [5000, -49.5], [5000, 49.5], [0, 50]]]).method).toBe("medial axis");
  });
});

describe("shapes left to the Voronoi reader", () => {
  const cases: [string, Ring[]][] = [
    ["a round chamber fed by three radial channels (their centrelines meet, but far beyond the channels' reach)", [chamberWithArms(500, 50, 1000, [Math.PI / 2, (7 * Math.PI) / 6, (11 * Math.PI) / 6])]],
    ["a square chamber (no direction is the channel's)", [rect(0, 0, 1000, 1000)]],
    ["a rectangular chamber fed by a channel at each end", [[[0, -25], [1000, -25], [1000, -250], [2000, -250], [2000, -25], [3000, -25], [3000, 25], [2000, 25], [2000, 250], [1000, 250], [1000, 25], [0, 25]]]],
    ["a chamber 1200 × 500 fed through its long sides (its halves would read as squat dead-end arms)", [[[0, 0], [550, 0], [550, -1000], [650, -1000], [650, 0], [1200, 0], [1200, 500], [650, 500], [650, 1500], [550, 1500], [550, 500], [0, 500]]]],
    ["a tapered channel (its walls not parallel)", [[[0, -50], [5000, -25], [5000, 25], [0, 50]]]],
    ["a post in a channel", [rect(0, -100, 2000, 100), rect(900, -20, 1100, 20)]],
    ["a jog: a cross whose arms do not line up", [[[0, -25], [975, -25], [975, -1000], [1025, -1000], [1025, -25], [2000, -25], [2000, 25], [1075, 25], [1075, 1000], [1025, 1000], [1025, 25], [0, 25]]]],
    ["overlapping shapes (two bars drawn across each other)", [rect(0, -25, 2000, 25), rect(975, -1000, 1025, 1000)]],
  ];
  for (const [name, rings] of cases) {
    it(name, () => {
      const axis = extractMedialAxis(rings);
      expect(axis.method).toBe("medial axis");
      expect(axis.paths.length).toBeGreaterThan(0);
    });
  }
});

describe("Shapely-buffer fixtures read both ways agree", () => {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  const outlines: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", outDir), "utf8")).fixtures;
  const read = (file: string, pairedWalls: boolean): MedialAxisResult => {
    const d = readDxf(readFileSync(new URL(file, outDir)), { chordToleranceM: 1e-7 });
    const shapes = d.entities.filter((e): e is PathEntity | CircleEntity => e.layer === "FLOW" && e.kind !== "text");
    return extractMedialAxis(ringsOf(shapes), undefined, { pairedWalls });
  };
  const files: Record<string, string> = {
    "straight-r2000-outline": outlines["straight-r2000-outline"].file,
    "serpentine-r12-outline": outlines["serpentine-r12-outline"].file,
    "tee-um-r2000-outline": outlines["tee-um-r2000-outline"].file,
    "cross-r2000-outline": outlines["cross-r2000-outline"].file,
    "stadium-hatch-edges": "stadium-hatch-edges.dxf",
  };
  for (const [name, file] of Object.entries(files)) {
    it(`${name}: same paths, total length within 1 %, narrowest width within 0.5 %`, () => {
      const paired = read(file, true), voronoi = read(file, false);
      expect(paired.method).toBe("paired walls");
      expect(voronoi.method).toBe("medial axis");
      expect(paired.paths).toHaveLength(voronoi.paths.length);
      const total = (a: MedialAxisResult) => a.paths.reduce((s, p) => s + lengthOf(p), 0);
      expect(rel(total(paired), total(voronoi))).toBeLessThan(0.01);
      expect(rel(paired.minWidthUnits, voronoi.minWidthUnits)).toBeLessThan(0.005);
    });
  }
});
