/**
 * Centrelines of a filled mask region: the medial axis from the Voronoi
 * diagram of boundary samples (d3-delaunay), pruned of the spurs that corners
 * create, split at junctions, with the local width from the exact distance to
 * the walls. Drawing units throughout (the caller converts to SI).
 *
 * Where the shapes do not overlap, the boundary is sampled sparsely along
 * straight walls (a wall is a line, not its samples): each Voronoi vertex is
 * moved onto the exact bisector of the walls its samples lie on, and the
 * triangles inside the region are found by flooding the triangulation from
 * its wall edges. Where shapes overlap, or the sparse triangulation does not
 * follow the walls, the boundary is sampled densely and each Voronoi vertex
 * is tested against the region.
 */
import { Delaunay } from "d3-delaunay";
import { grownCopy } from "../typed-arrays";
import { readPairedWalls } from "./paired-walls";
import { douglasPeucker } from "./simplify";
import { flatten, orientFlat, orientedArea, Region, unflatten, WallGrid, type FlatRings, type OrientedFlat, type OrientedRings, type Ring } from "./region";

/** Samples per smallest width (common practice for Voronoi medial axes: a few samples across the narrowest gap). */
export const SAMPLES_PER_WIDTH = 6;
/** A leaf branch shorter than this many local radii of its junction is a corner spur (common practice; a 90° corner's spur is √2 ≈ 1.41 radii). */
export const PRUNE_FACTOR = 2;
/** Most boundary samples one layer may use (keeps memory bounded); beyond it the step grows and a note says so. */
export const MAX_SAMPLES = 3_000_000;
/**
 * Widest sample spacing along a straight wall, in smallest widths. Voronoi vertices between two walls sampled
 * at spacing s stray s²/8w from the midline of a channel w wide (plane geometry); they are moved back onto the
 * walls' exact bisector, so the spacing only has to keep the triangulation along the walls.
 */
export const WALL_SPACING_WIDTHS = 2;
/** Width profile: a point is added where straight interpolation of the radius would be off by more than this fraction. */
export const WIDTH_TOLERANCE = 0.005;

export interface CentrelinePath {
  /**
   * Points along the centreline, x y interleaved, drawing units: this path's are points start .. end − 1 (flat,
   * and the buffer may hold every path of the result: 20k+ [x, y] pairs, or a view per path, were mostly GC).
   */
  xy: Float64Array;
  /** Local half-width at each point (distance to the nearest wall), drawing units; indexed as the points. */
  radii: Float64Array;
  start: number;
  end: number;
  /** Smallest bend radius where the reader knows it (null: no bend), drawing units; else found from the points. */
  bendRadius?: number | null;
}

/** A path's own points and half-widths as arrays of their own length (views into its buffers). */
export function pathArrays(p: CentrelinePath): { xy: Float64Array; radii: Float64Array } {
  return { xy: p.xy.subarray(2 * p.start, 2 * p.end), radii: p.radii.subarray(p.start, p.end) };
}

/** A path as the Voronoi reader builds and extends it, before it is handed out flat. */
interface TuplePath {
  points: [number, number][];
  radii: number[];
}

/** A tuple path in the flat form of CentrelinePath. */
function flatPath(p: TuplePath): CentrelinePath {
  const xy = new Float64Array(2 * p.points.length);
  p.points.forEach(([x, y], i) => {
    xy[2 * i] = x;
    xy[2 * i + 1] = y;
  });
  return { xy, radii: Float64Array.from(p.radii), start: 0, end: p.radii.length };
}

export interface MedialAxisResult {
  /**
   * How the centrelines were found: "paired walls" where every wall faces a parallel one (paired-walls.ts,
   * exact, no sampling), else "medial axis" (the Voronoi diagram of wall samples).
   */
  method: "paired walls" | "medial axis";
  paths: CentrelinePath[];
  /** Boundary sampling: every polygon vertex, and points along each edge at most this far apart, drawing units. */
  stepUnits: number;
  /**
   * Step the axis tolerances scale with (a sixth of the smallest width): spurs, junction merging, shape within
   * a quarter of it; equal to stepUnits where the boundary is sampled that densely. Drawing units.
   */
  toleranceStepUnits: number;
  /** Spur pruning: leaf branches shorter than PRUNE_FACTOR × the junction radius, this at the narrowest junction, drawing units. */
  pruneLengthUnits: number;
  /** Smallest channel width found (twice the smallest inner radius), drawing units. */
  minWidthUnits: number;
  /** Number of connected filled regions (overlapping shapes counted once, holes not splitting a region). */
  regions: number;
  /** Number of holes (rings inside a filled ring). */
  holes: number;
  notes: string[];
}

/**
 * Find the centrelines of the area filled by `rings`: read from facing wall pairs where every wall has one
 * (paired-walls.ts, exact), else the Voronoi medial axis of wall samples.
 * @param rings closed rings in drawing units (outer boundaries and holes, any orientation).
 * @param stepUnits boundary sampling step; when omitted it derives from the smallest feature (two passes).
 * @param options pairedWalls: false to skip the paired-wall reading and always sample (for comparisons).
 * @returns centreline paths split at junctions and dead ends, with half-widths, and the tolerances used.
 */
export function extractMedialAxis(rings: Ring[] | FlatRings, stepUnits?: number, options: { pairedWalls?: boolean } = {}): MedialAxisResult {
  const notes: string[] = [];
  const flat = Array.isArray(rings) ? flatten(rings) : rings;
  // The drawn perimeter (rings dropped as degenerate included), for the first sampling step and its floor.
  const perimeter = perimeterOf(flat);
  const prep = orientFlat(flat);
  let step = stepUnits;
  if (step === undefined) {
    // First guess from the shapes' hydraulic-width-like ratio 2·area/perimeter (a thin band's width), refined below.
    const area = Math.max(0, orientedArea(prep));
    step = (2 * area) / Math.max(perimeter, 1e-300) / SAMPLES_PER_WIDTH;
  }
  const floor = perimeter / MAX_SAMPLES;
  if (step < floor) {
    notes.push(`The outline is too long for its smallest feature; the boundary was sampled every ${floor.toPrecision(3)} drawing units instead of ${step.toPrecision(3)}.`);
    step = floor;
  }
  let result = medialAxisAt(prep, step, stepUnits === undefined && options.pairedWalls !== false);
  if (result.method === "medial axis" && stepUnits === undefined && result.minWidthUnits / SAMPLES_PER_WIDTH < step / 1.5 && result.minWidthUnits > 0) {
    // A narrower channel than the first guess: sample again at the step its width asks for.
    const finer = Math.max(result.minWidthUnits / SAMPLES_PER_WIDTH, floor);
    if (finer < step) result = medialAxisAt(prep, finer);
  }
  result.notes.unshift(...notes);
  return result;
}

/** Boundary samples in ring order, with the ring edges they lie on (typed arrays: tens of thousands of them). */
interface Samples {
  n: number;
  x: Float64Array;
  y: Float64Array;
  ring: Int32Array;
  /** Position in its ring's run of samples. */
  k: Int32Array;
  /** Distance along its ring from the ring's first vertex. */
  pos: Float64Array;
  /** Ring edge the sample lies on; at a polygon vertex, the edge ending there (e1 the one starting there, else -1). */
  e0: Int32Array;
  e1: Int32Array;
  ringStart: Int32Array;
  ringCount: Int32Array;
  perim: Float64Array;
  /** The next sample along its ring. */
  succ: Int32Array;
}

/** Samples appended in ring order into typed arrays that grow by doubling. */
class SampleBuilder {
  private n = 0;
  private x: Float64Array;
  private y: Float64Array;
  private ring: Int32Array;
  private k: Int32Array;
  private pos: Float64Array;
  private e0: Int32Array;
  private e1: Int32Array;
  ringStart: number[] = [];
  ringCount: number[] = [];
  perim: number[] = [];

  constructor(capacity: number) {
    const c = Math.max(16, capacity);
    this.x = new Float64Array(c);
    this.y = new Float64Array(c);
    this.ring = new Int32Array(c);
    this.k = new Int32Array(c);
    this.pos = new Float64Array(c);
    this.e0 = new Int32Array(c);
    this.e1 = new Int32Array(c);
  }

  get length(): number {
    return this.n;
  }

  private grow(): void {
    const c = this.x.length * 2;
    this.x = grownCopy(this.x, c);
    this.y = grownCopy(this.y, c);
    this.pos = grownCopy(this.pos, c);
    this.ring = grownCopy(this.ring, c);
    this.k = grownCopy(this.k, c);
    this.e0 = grownCopy(this.e0, c);
    this.e1 = grownCopy(this.e1, c);
  }

  push(x: number, y: number, ring: number, pos: number, e0: number, e1: number): void {
    if (this.n === this.x.length) this.grow();
    const j = this.n++;
    this.k[j] = j - this.ringStart[ring];
    this.x[j] = x;
    this.y[j] = y;
    this.ring[j] = ring;
    this.pos[j] = pos;
    this.e0[j] = e0;
    this.e1[j] = e1;
  }

  build(): Samples {
    const n = this.n;
    const ringStart = Int32Array.from(this.ringStart);
    const ringCount = Int32Array.from(this.ringCount);
    const succ = new Int32Array(n);
    for (let p = 0; p < n; p++) {
      const r = this.ring[p];
      succ[p] = this.k[p] + 1 === ringCount[r] ? ringStart[r] : p + 1;
    }
    return {
      succ,
      n,
      x: this.x.subarray(0, n),
      y: this.y.subarray(0, n),
      ring: this.ring.subarray(0, n),
      k: this.k.subarray(0, n),
      pos: this.pos.subarray(0, n),
      e0: this.e0.subarray(0, n),
      e1: this.e1.subarray(0, n),
      ringStart,
      ringCount,
      perim: Float64Array.from(this.perim),
    };
  }
}

/** Ring edges as x0 y0 x1 y1, in ring order; edge i of ring r has id ringEdgeStart[r] + i. */
interface RingEdges {
  edges: Float64Array;
  ringEdgeStart: Int32Array;
  ringOfEdge: Int32Array;
  /** Total length of the edges. */
  perimeter: number;
}

/** Total length of the rings' edges (each ring closed back to its first point). */
function perimeterOf(f: FlatRings): number {
  let perimeter = 0;
  for (let k = 0; k + 1 < f.start.length; k++) {
    const i0 = f.start[k], i1 = f.start[k + 1];
    for (let e = i0; e < i1; e++) {
      const nx = e + 1 === i1 ? i0 : e + 1;
      perimeter += norm(f.xy[2 * nx] - f.xy[2 * e], f.xy[2 * nx + 1] - f.xy[2 * e + 1]);
    }
  }
  return perimeter;
}

/** The rings' edges, ring by ring (ring k's from its point k: edge e runs from point e to the next, wrapping). */
function edgesOf(f: FlatRings): RingEdges {
  const n = f.start.length - 1;
  const nE = f.start[n];
  const edges = new Float64Array(4 * nE);
  const ringOfEdge = new Int32Array(nE);
  const xy = f.xy;
  for (let k = 0; k < n; k++) {
    const i0 = f.start[k], i1 = f.start[k + 1];
    for (let e = i0; e < i1; e++) {
      const nx = e + 1 === i1 ? i0 : e + 1;
      edges[4 * e] = xy[2 * e];
      edges[4 * e + 1] = xy[2 * e + 1];
      edges[4 * e + 2] = xy[2 * nx];
      edges[4 * e + 3] = xy[2 * nx + 1];
      ringOfEdge[e] = k;
    }
  }
  return { edges, ringEdgeStart: f.start, ringOfEdge, perimeter: perimeterOf(f) };
}

/** Distances from an edge's start at which it is sampled inside (0 < d < len): evenly, at most `spacing` apart. */
function spacingAlong(len: number, spacing: number, out: number[]): void {
  out.length = 0;
  const n = Math.max(1, Math.ceil(len / spacing));
  for (let k = 1; k < n; k++) out.push((len * k) / n);
}

/** Every polygon vertex, and points along each edge at most `spacing` apart. */
function sampleWalls(prep: OrientedRings, ringEdgeStart: Int32Array, spacing: number, perimeter: number): Samples {
  const b = new SampleBuilder(ringEdgeStart[prep.rings.length] + Math.ceil(perimeter / spacing));
  const along: number[] = [];
  prep.rings.forEach((ring, ri) => {
    b.ringStart.push(b.length);
    const base = ringEdgeStart[ri];
    const m = ring.length;
    let s = 0;
    for (let i = 0; i < m; i++) {
      const [ax, ay] = ring[i];
      const [bx, by] = ring[(i + 1) % m];
      const len = norm(bx - ax, by - ay);
      b.push(ax, ay, ri, s, base + ((i + m - 1) % m), base + i);
      spacingAlong(len, spacing, along);
      for (const d of along) b.push(ax + ((bx - ax) * d) / len, ay + ((by - ay) * d) / len, ri, s + d, base + i, -1);
      s += len;
    }
    b.ringCount.push(b.length - b.ringStart[ri]);
    b.perim.push(s);
  });
  return b.build();
}

/**
 * Even samples every ≤ step, dropping those inside the filled area (where shapes overlap, a wall is not a wall);
 * the walls for widths are whole edges where no sample fell inside the filled area, else the runs between kept samples.
 */
function sampleOverlapping(region: Region, ringEdgeStart: Int32Array, step: number): { samples: Samples; walls: Float64Array } {
  const eps = step * 1e-3;
  const b = new SampleBuilder(1024);
  const walls: number[] = [];
  region.rings.forEach((ring, ri) => {
    b.ringStart.push(b.length);
    let s = 0;
    for (let i = 0; i < ring.length; i++) {
      const [ax, ay] = ring[i];
      const [bx, by] = ring[(i + 1) % ring.length];
      const len = norm(bx - ax, by - ay);
      const n = Math.max(1, Math.ceil(len / step));
      // Filled side is on the left; the probe goes a hair to the right.
      const nx = (by - ay) / len, ny = -(bx - ax) / len;
      let dropped = 0;
      let prevKept = false;
      for (let k = 0; k <= n; k++) {
        const x = ax + ((bx - ax) * k) / n;
        const y = ay + ((by - ay) * k) / n;
        // k = n is the next edge's first sample: probed here only to close this edge's last wall run.
        const kept = !region.contains(x + nx * eps, y + ny * eps);
        if (!kept && k < n) dropped++;
        if (kept && prevKept && dropped > 0) walls.push(ax + ((bx - ax) * (k - 1)) / n, ay + ((by - ay) * (k - 1)) / n, x, y);
        prevKept = kept;
        if (!kept || k === n) continue;
        b.push(x, y, ri, s + (len * k) / n, ringEdgeStart[ri] + i, -1);
      }
      if (dropped === 0) walls.push(ax, ay, bx, by);
      s += len;
    }
    b.ringCount.push(b.length - b.ringStart[ri]);
    b.perim.push(s);
  });
  return { samples: b.build(), walls: Float64Array.from(walls) };
}

type Mode = "sparse" | "dense" | "overlapping";

function medialAxisAt(flat: OrientedFlat, step: number, tryPairedWalls = false): MedialAxisResult {
  const ed = edgesOf(flat);
  // The Voronoi reader's sampling and inside tests take [x, y] rings (made only when it runs).
  let tuples: OrientedRings | undefined;
  const prepared = () => (tuples ??= { rings: unflatten(flat), depth: flat.depth });
  const { edges, ringEdgeStart, ringOfEdge } = ed;
  // Cells of about two smallest widths: a wall-distance query then looks at a few cells at most.
  const wallGrid = new WallGrid(edges, step * 2 * SAMPLES_PER_WIDTH);
  const ringLen = (r: number) => ringEdgeStart[r + 1] - ringEdgeStart[r];
  // Consecutive edges of one ring share their vertex; any other contact means shapes overlap or touch.
  const overlapping = wallGrid.anyMeeting((a, b) => {
    const r = ringOfEdge[a];
    if (ringOfEdge[b] !== r) return false;
    const d = Math.abs(a - b);
    return d === 1 || d === ringLen(r) - 1;
  });
  let regionCache: Region | undefined;
  // Cells about as many as edges: the region answers only a few inside tests per dead end here.
  const region = (cell: number) => (regionCache ??= new Region([], cell, prepared()));
  if (overlapping) {
    const reg = region(step * 4);
    const { samples, walls } = sampleOverlapping(reg, ringEdgeStart, step);
    return axisFromSamples(prepared(), step, step, samples, ed, new WallGrid(walls, step * 4), "overlapping", () => reg)!;
  }
  if (tryPairedWalls) {
    // Straight channels between parallel walls are read exactly from the walls; anything else is sampled.
    const paired = readPairedWalls(flat, edges, ringEdgeStart, wallGrid, { samplesPerWidth: SAMPLES_PER_WIDTH });
    if (paired) return paired;
  }
  const maxSpacing = WALL_SPACING_WIDTHS * SAMPLES_PER_WIDTH * step;
  const coarseCell = Math.max(step * 4, Math.sqrt(Math.max(1e-300, (wallGrid.width * wallGrid.height) / Math.max(1, edges.length / 4))));
  const prep = prepared();
  const sparse = axisFromSamples(prep, step, maxSpacing, sampleWalls(prep, ringEdgeStart, maxSpacing, ed.perimeter), ed, wallGrid, "sparse", () => region(coarseCell));
  if (sparse) return sparse;
  const reg = region(step * 4);
  return axisFromSamples(prep, step, step, sampleWalls(prep, ringEdgeStart, step, ed.perimeter), ed, wallGrid, "dense", () => reg)!;
}

/** Length of (dx, dy): Math.hypot guards against overflow we cannot meet here, at several times the cost. */
function norm(dx: number, dy: number): number {
  return Math.sqrt(dx * dx + dy * dy);
}

const nextHalfedge = (e: number) => (e % 3 === 2 ? e - 2 : e + 1);

/**
 * Triangles inside the filled area, by flooding the triangulation from the boundary steps (consecutive samples
 * of a ring: the filled side is on the ring's left, and d3-delaunay's triangles turn clockwise). Null when a ring
 * step is missing from the triangulation or the flood meets both sides (the triangulation does not follow the walls).
 * Own code: a flood over d3-delaunay's halfedges, a few lines.
 */
function floodInside(S: Samples, triangles: Uint32Array, halfedges: Int32Array): Uint8Array | null {
  const nT = triangles.length / 3;
  const label = new Uint8Array(nT); // 0 unknown, 1 inside, 2 outside
  const wall = new Uint8Array(halfedges.length);
  const stepFound = new Uint8Array(S.n);
  const succ = S.succ;
  const stack: number[] = [];
  for (let e = 0; e < halfedges.length; e++) {
    const p = triangles[e], q = triangles[nextHalfedge(e)];
    let lab = 0;
    if (succ[p] === q) {
      lab = 2;
      stepFound[p] = 1;
    } else if (succ[q] === p) {
      lab = 1;
      stepFound[q] = 1;
    }
    if (lab === 0) continue;
    wall[e] = 1;
    const t = (e / 3) | 0;
    if (label[t] === 0) {
      label[t] = lab;
      stack.push(t);
    } else if (label[t] !== lab) return null;
  }
  for (let p = 0; p < S.n; p++) if (!stepFound[p]) return null;
  while (stack.length) {
    const t = stack.pop()!;
    for (let e = 3 * t; e < 3 * t + 3; e++) {
      if (wall[e]) continue;
      const o = halfedges[e];
      if (o < 0) continue;
      const u = (o / 3) | 0;
      if (label[u] === 0) {
        label[u] = label[t];
        stack.push(u);
      } else if (label[u] !== label[t]) return null;
    }
  }
  const inside = new Uint8Array(nT);
  for (let t = 0; t < nT; t++) {
    if (label[t] === 0) return null;
    inside[t] = label[t] === 1 ? 1 : 0;
  }
  return inside;
}

/** Edges (ids) a sample's wall consists of, into out; returns how many. */
function wallEdges(S: Samples, p: number, out: Int32Array, at: number): number {
  out[at] = S.e0[p];
  if (S.e1[p] < 0) return 1;
  out[at + 1] = S.e1[p];
  return 2;
}

const shareEdge = (S: Samples, p: number, q: number) => {
  const a0 = S.e0[p], a1 = S.e1[p], b0 = S.e0[q], b1 = S.e1[q];
  return a0 === b0 || a0 === b1 || (a1 >= 0 && (a1 === b0 || a1 === b1));
};

/**
 * Moves points onto the exact medial axis of walls: Newton steps on the differences of distances to two walls
 * (or three, at a junction), each distance to the nearest of a wall's edges. The walls come from the samples
 * of a Delaunay triangle (its Voronoi vertex), or are those two neighbouring vertices have in common.
 * Own code: no package we use projects onto a polygon's medial axis, and it is a few Newton steps.
 */
class Projector {
  private readonly sites = new Int32Array(24);
  private readonly siteStart = new Int32Array(4);
  private nSites = 0;
  private readonly near = new Float64Array(3);
  private readonly ux = new Float64Array(3);
  private readonly uy = new Float64Array(3);
  x = 0;
  y = 0;
  r = 0;

  constructor(
    private readonly S: Samples,
    private readonly E: Float64Array,
    private readonly ringOfEdge: Int32Array,
    private readonly ringEdgeStart: Int32Array,
  ) {}

  /**
   * Signed distance from (x, y) to site j (positive on the filled side) and its gradient: the nearest of the
   * site's edges decides; where the nearest point is an edge's end, the side comes from the sum of the two
   * edges' normals there (the angle-weighted pseudo-normal, which is exact for the nearest point of a polygon).
   */
  private measure(j: number, x: number, y: number): void {
    const E = this.E;
    let best = Infinity, bx = 0, by = 0, be = -1, bt = 0;
    for (let k = this.siteStart[j]; k < this.siteStart[j + 1]; k++) {
      const e = this.sites[k];
      const ax = E[4 * e], ay = E[4 * e + 1], dx = E[4 * e + 2] - ax, dy = E[4 * e + 3] - ay;
      const l2 = dx * dx + dy * dy;
      let t = l2 === 0 ? 0 : ((x - ax) * dx + (y - ay) * dy) / l2;
      t = t < 0 ? 0 : t > 1 ? 1 : t;
      const px = ax + t * dx, py = ay + t * dy;
      const d2 = (x - px) * (x - px) + (y - py) * (y - py);
      if (d2 < best) {
        best = d2;
        bx = px;
        by = py;
        be = e;
        bt = t;
      }
    }
    const d = Math.sqrt(best);
    let ox = x - bx, oy = y - by;
    if (d > 0) {
      ox /= d;
      oy /= d;
    }
    // Inward (left) normal of edge be, and at an end the neighbouring edge's too.
    let sx = E[4 * be + 1] - E[4 * be + 3], sy = E[4 * be + 2] - E[4 * be];
    if (bt === 0 || bt === 1) {
      const f = bt === 0 ? this.prevEdge(be) : this.nextEdge(be);
      const fx = E[4 * f + 1] - E[4 * f + 3], fy = E[4 * f + 2] - E[4 * f];
      const l1 = norm(sx, sy), l2 = norm(fx, fy);
      sx = sx / l1 + fx / l2;
      sy = sy / l1 + fy / l2;
    }
    const sign = ox * sx + oy * sy < 0 ? -1 : 1;
    this.near[j] = sign * d;
    this.ux[j] = sign * ox;
    this.uy[j] = sign * oy;
  }

  private prevEdge(e: number): number {
    const r = this.ringOfEdge[e], a = this.ringEdgeStart[r], m = this.ringEdgeStart[r + 1] - a;
    return a + ((e - a + m - 1) % m);
  }
  private nextEdge(e: number): number {
    const r = this.ringOfEdge[e], a = this.ringEdgeStart[r], m = this.ringEdgeStart[r + 1] - a;
    return a + ((e - a + 1) % m);
  }

  private addSite(p: number, q = -1): void {
    let k = this.siteStart[this.nSites];
    k += wallEdges(this.S, p, this.sites, k);
    if (q >= 0) k += wallEdges(this.S, q, this.sites, k);
    this.nSites++;
    this.siteStart[this.nSites] = k;
  }

  /** The walls of samples a, b, c: samples sharing an edge are one wall; returns how many walls (1 to 3). */
  wallsOf(a: number, b: number, c: number): number {
    const S = this.S;
    this.nSites = 0;
    this.siteStart[0] = 0;
    const sab = shareEdge(S, a, b), sbc = shareEdge(S, b, c), sac = shareEdge(S, a, c);
    const same = (sab ? 1 : 0) + (sbc ? 1 : 0) + (sac ? 1 : 0);
    // Which samples make up which wall, by how many sample pairs share an edge.
    let p1 = a, q1 = -1, p2 = c, p3 = -1;
    if (same === 3) q1 = b;
    else if (same === 2) {
      // One sample sits at the vertex joining the other two's edges: the bisector of those two edges.
      if (!sab) p2 = b;
      else if (!sbc) {
        p1 = b;
        p2 = c;
      }
    } else if (same === 1) {
      if (sab) q1 = b;
      else if (sbc) {
        p1 = b;
        q1 = c;
        p2 = a;
      } else {
        q1 = c;
        p2 = b;
      }
    } else {
      p2 = b;
      p3 = c;
    }
    this.addSite(p1, q1);
    this.addSite(p2);
    if (p3 >= 0) this.addSite(p3);
    return same === 3 ? 1 : this.nSites;
  }

  private readonly keptSites = new Int32Array(24);
  private readonly keptStart = new Int32Array(4);
  private readonly otherSites = new Int32Array(24);
  private readonly otherStart = new Int32Array(4);

  /** The walls two Voronoi vertices (triangles of samples a, b, c) share, each pair merged; returns how many (0 to 2). */
  sharedWalls(a0: number, b0: number, c0: number, a1: number, b1: number, c1: number): number {
    if (this.wallsOf(a0, b0, c0) < 2) return 0;
    const n0 = this.nSites;
    const A = this.keptSites, As = this.keptStart;
    A.set(this.sites.subarray(0, this.siteStart[n0]));
    As.set(this.siteStart.subarray(0, n0 + 1));
    if (this.wallsOf(a1, b1, c1) < 2) return 0;
    const n1 = this.nSites;
    const B = this.otherSites, Bs = this.otherStart;
    B.set(this.sites.subarray(0, this.siteStart[n1]));
    Bs.set(this.siteStart.subarray(0, n1 + 1));
    let nOut = 0, k = 0;
    this.siteStart[0] = 0;
    for (let g = 0; g < n0 && nOut < 2; g++) {
      let match = -1;
      for (let h = 0; h < n1 && match < 0; h++) {
        for (let i = As[g]; i < As[g + 1] && match < 0; i++) for (let j = Bs[h]; j < Bs[h + 1]; j++) if (A[i] === B[j]) { match = h; break; }
      }
      if (match < 0) continue;
      const from = k;
      for (let i = As[g]; i < As[g + 1]; i++) this.sites[k++] = A[i];
      for (let j = Bs[match]; j < Bs[match + 1]; j++) {
        let dup = false;
        for (let i = from; i < k; i++) if (this.sites[i] === B[j]) { dup = true; break; }
        if (!dup) this.sites[k++] = B[j];
      }
      nOut++;
      this.siteStart[nOut] = k;
    }
    this.nSites = nOut;
    return nOut;
  }

  /** Distance from (x, y) to the nearest of the current walls. */
  nearest(x: number, y: number): number {
    let best = Infinity;
    for (let j = 0; j < this.nSites; j++) {
      this.measure(j, x, y);
      best = Math.min(best, this.near[j]);
    }
    return best;
  }

  /**
   * Newton from (sx, sy), a point inside the region, onto the current walls' bisector (or their common point,
   * for three); sets x, y, r. False when it does not settle within 2·cr of (cx, cy) (the empty circle's centre
   * and radius, which bound where the axis point can be).
   */
  solve(sx: number, sy: number, cx: number, cy: number, cr: number): boolean {
    const nSites = this.nSites;
    if (nSites < 2) return false;
    let x = sx, y = sy;
    const tol = cr * 1e-12;
    let settled = false;
    for (let it = 0; it < 8; it++) {
      for (let j = 0; j < nSites; j++) this.measure(j, x, y);
      const f1 = this.near[0] - this.near[1];
      const g1x = this.ux[0] - this.ux[1], g1y = this.uy[0] - this.uy[1];
      if (nSites === 2) {
        if (Math.abs(f1) <= tol) {
          settled = true;
          break;
        }
        const gg = g1x * g1x + g1y * g1y;
        if (!(gg > 1e-12)) return false;
        x -= (f1 * g1x) / gg;
        y -= (f1 * g1y) / gg;
      } else {
        const f2 = this.near[0] - this.near[2];
        if (Math.abs(f1) <= tol && Math.abs(f2) <= tol) {
          settled = true;
          break;
        }
        const g2x = this.ux[0] - this.ux[2], g2y = this.uy[0] - this.uy[2];
        const det = g1x * g2y - g1y * g2x;
        if (!(Math.abs(det) > 1e-9)) return false;
        x -= (f1 * g2y - f2 * g1y) / det;
        y -= (g1x * f2 - g2x * f1) / det;
      }
    }
    if (!settled) for (let j = 0; j < nSites; j++) this.measure(j, x, y);
    const r = this.near[0];
    let spread = 0;
    for (let j = 1; j < nSites; j++) spread = Math.max(spread, Math.abs(this.near[j] - r));
    if (!(r > 0) || !(spread <= 1e-6 * r) || !(norm(x - cx, y - cy) <= 2 * cr)) return false;
    this.x = x;
    this.y = y;
    this.r = r;
    return true;
  }
}

/** Circumcentres and radii of the triangles (inside ones only where `inside` is given); degenerate ones are not inside. */
function circumcentres(S: Samples, triangles: Uint32Array, inside: Uint8Array, onlyInside: boolean, gx: Float64Array, gy: Float64Array, gr: Float64Array): void {
  const X = S.x, Y = S.y;
  const nT = triangles.length / 3;
  for (let t = 0; t < nT; t++) {
    if (onlyInside && !inside[t]) continue;
    const a = triangles[3 * t], b = triangles[3 * t + 1], c = triangles[3 * t + 2];
    const ax = X[a], ay = Y[a];
    const bx = X[b] - ax, by = Y[b] - ay, cx = X[c] - ax, cy = Y[c] - ay;
    const d = 2 * (bx * cy - by * cx);
    if (Math.abs(d) < 1e-300) {
      inside[t] = 0;
      continue;
    }
    const b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
    const ux = (cy * b2 - by * c2) / d, uy = (bx * c2 - cx * b2) / d;
    gx[t] = ax + ux;
    gy[t] = ay + uy;
    gr[t] = Math.sqrt(ux * ux + uy * uy);
  }
}

/**
 * Voronoi edges between inside vertices whose generating samples are on different walls (neighbouring samples
 * on one wall give the spokes towards that wall, not the axis): marks both halfedges, counts each vertex's edges.
 */
function axisEdges(S: Samples, triangles: Uint32Array, halfedges: Int32Array, inside: Uint8Array, minGap: number, byIndex: boolean, axis: Uint8Array, deg: Uint8Array): void {
  const ring = S.ring, k = S.k, pos = S.pos;
  for (let e = 0; e < halfedges.length; e++) {
    const o = halfedges[e];
    if (o < e) continue;
    const t1 = (e / 3) | 0, t2 = (o / 3) | 0;
    if (!inside[t1] || !inside[t2]) continue;
    const p = triangles[e], q = triangles[nextHalfedge(e)];
    const r = ring[p];
    if (r === ring[q]) {
      const dk = Math.abs(k[p] - k[q]);
      if (byIndex && (dk === 1 || dk === S.ringCount[r] - 1)) continue;
      const per = S.perim[r];
      const d = Math.abs(pos[p] - pos[q]);
      if (Math.min(d, per - d) < minGap) continue;
    }
    axis[e] = axis[o] = 1;
    deg[t1]++;
    deg[t2]++;
  }
}

/**
 * Moves every axis vertex onto its walls' exact bisector, starting from its circumcentre; with sparse samples that
 * may lie beyond a wall (it strays s²/8w from the midline), which signed distances handle. Also records the two
 * edges a vertex lies between when its samples are on just two edges (sigLo/sigHi, else -1).
 */
function projectVertices(pr: Projector, S: Samples, triangles: Uint32Array, deg: Uint8Array, sparse: boolean, gx: Float64Array, gy: Float64Array, gr: Float64Array, sigLo: Int32Array, sigHi: Int32Array): void {
  const nT = deg.length;
  const e0 = S.e0, e1 = S.e1;
  for (let t = 0; t < nT; t++) {
    if (!deg[t]) continue;
    const a = triangles[3 * t], b = triangles[3 * t + 1], c = triangles[3 * t + 2];
    if (e1[a] < 0 && e1[b] < 0 && e1[c] < 0) {
      const ea = e0[a], eb = e0[b], ec = e0[c];
      const lo = Math.min(ea, eb, ec), hi = Math.max(ea, eb, ec);
      if (lo !== hi && (ea === lo || ea === hi) && (eb === lo || eb === hi) && (ec === lo || ec === hi)) {
        sigLo[t] = lo;
        sigHi[t] = hi;
      }
    }
    pr.wallsOf(a, b, c);
    if (pr.solve(gx[t], gy[t], gx[t], gy[t], gr[t])) {
      gx[t] = pr.x;
      gy[t] = pr.y;
      gr[t] = pr.r;
    } else if (sparse) {
      // Not settled: the triangle's centroid, which is inside the region (its circumcentre may not be).
      gx[t] = (S.x[a] + S.x[b] + S.x[c]) / 3;
      gy[t] = (S.y[a] + S.y[b] + S.y[c]) / 3;
      gr[t] = Math.abs(pr.nearest(gx[t], gy[t]));
    }
  }
}

/** The axis after pruning: chains of Voronoi vertices (triangle ids) between nodes. */
interface Branch {
  v: number[];
  a: number;
  b: number;
  len: number;
  alive: boolean;
}

/** The axis as branches between nodes (its vertices of degree ≠ 2), pruned and with split junctions merged. */
class Skeleton {
  readonly branches: Branch[] = [];
  readonly nodeTri: number[] = [];
  readonly nodeDeg: number[] = [];
  private readonly nodeBr: number[][] = [];
  private readonly nodeOf: Int32Array;
  /** Smallest junction radius that pruned a spur. */
  pruneMin = Infinity;
  /** Vertices moved off their Voronoi position (merged junctions): their radius no longer bounds the wall distance. */
  readonly moved: Uint8Array;

  constructor(
    private readonly gx: Float64Array,
    private readonly gy: Float64Array,
    private readonly gr: Float64Array,
    halfedges: Int32Array,
    axis: Uint8Array,
    deg: Uint8Array,
  ) {
    const nT = deg.length;
    this.nodeOf = new Int32Array(nT).fill(-1);
    this.moved = new Uint8Array(nT);
    const used = new Uint8Array(halfedges.length);
    for (let pass = 0; pass < 2; pass++) {
      // First from vertices of degree ≠ 2, then around loops that have none.
      for (let t = 0; t < nT; t++) {
        const d = deg[t];
        if (d === 0 || (pass === 0 ? d === 2 : d !== 2)) continue;
        for (let e = 3 * t; e < 3 * t + 3; e++) if (axis[e] && !used[e]) this.walk(t, e, halfedges, axis, deg, used);
      }
    }
  }

  private dist(t: number, u: number): number {
    const dx = this.gx[u] - this.gx[t], dy = this.gy[u] - this.gy[t];
    return Math.sqrt(dx * dx + dy * dy);
  }

  private nodeFor(t: number): number {
    if (this.nodeOf[t] < 0) {
      this.nodeOf[t] = this.nodeTri.length;
      this.nodeTri.push(t);
      this.nodeDeg.push(0);
      this.nodeBr.push([]);
    }
    return this.nodeOf[t];
  }

  private add(v: number[], len: number): void {
    const a = this.nodeFor(v[0]), b = this.nodeFor(v[v.length - 1]);
    const i = this.branches.length;
    this.branches.push({ v, a, b, len, alive: true });
    this.nodeBr[a].push(i);
    this.nodeBr[b].push(i);
    this.nodeDeg[a]++;
    this.nodeDeg[b]++;
  }

  /** From vertex t out through halfedge e0 along vertices of degree 2, to the next node (or back to t). */
  private walk(t: number, e0: number, halfedges: Int32Array, axis: Uint8Array, deg: Uint8Array, used: Uint8Array): void {
    const v = [t];
    let len = 0;
    let e = e0;
    for (;;) {
      used[e] = 1;
      const o = halfedges[e];
      used[o] = 1;
      const u = (o / 3) | 0;
      len += this.dist(v[v.length - 1], u);
      v.push(u);
      if (deg[u] !== 2 || u === t) break;
      e = -1;
      for (let f = 3 * u; f < 3 * u + 3; f++) if (f !== o && axis[f]) { e = f; break; }
    }
    this.add(v, len);
  }

  /** Connected pieces: nodes joined by branches (union-find; a loop without a node has its own). */
  components(): number {
    const n = this.nodeTri.length;
    const parent = new Int32Array(n);
    for (let i = 0; i < n; i++) parent[i] = i;
    const find = (i: number): number => {
      while (parent[i] !== i) i = parent[i] = parent[parent[i]];
      return i;
    };
    for (const br of this.branches) parent[find(br.a)] = find(br.b);
    let count = 0;
    for (let i = 0; i < n; i++) if (find(i) === i) count++;
    return count;
  }

  private other(br: Branch, nd: number): number {
    return br.a === nd ? br.b : br.a;
  }

  private kill(i: number): void {
    const br = this.branches[i];
    br.alive = false;
    this.nodeDeg[br.a]--;
    this.nodeDeg[br.b]--;
  }

  /** A node left with two branches is no junction: join them into one. */
  fuse(nd: number): void {
    if (this.nodeDeg[nd] !== 2) return;
    const { branches, nodeBr } = this;
    let i1 = -1, i2 = -1;
    for (const i of nodeBr[nd]) {
      if (!branches[i].alive) continue;
      if (i1 < 0) i1 = i;
      else i2 = i;
    }
    if (i1 < 0 || i2 < 0 || i1 === i2) return;
    const b1 = branches[i1], b2 = branches[i2];
    const v1 = b1.b === nd ? b1.v : b1.v.slice().reverse();
    const v2 = b2.a === nd ? b2.v : b2.v.slice().reverse();
    const from = this.other(b1, nd), to = this.other(b2, nd);
    b1.alive = b2.alive = false;
    this.nodeDeg[nd] = 0;
    nodeBr[nd] = [];
    const i = branches.length;
    v1.pop();
    for (const x of v2) v1.push(x);
    branches.push({ v: v1, a: from, b: to, len: b1.len + b2.len, alive: true });
    for (const end of [from, to]) {
      const list = nodeBr[end];
      for (let k = 0; k < list.length; k++) if (list[k] === i1 || list[k] === i2) { list[k] = i; break; }
    }
  }

  /**
   * Spurs: leaf branches shorter than PRUNE_FACTOR × their junction's radius (+ step), until none is left. Every
   * spur of a round is decided first and removed together: removing one at a time would let its sibling spur
   * merge into the channel before being looked at.
   */
  prune(step: number): void {
    const { branches, nodeDeg, nodeTri, gr } = this;
    for (let round = 0; round < 50; round++) {
      const doomed: number[] = [];
      for (let i = 0; i < branches.length; i++) {
        const br = branches[i];
        if (!br.alive || br.a === br.b) continue;
        const da = nodeDeg[br.a], db = nodeDeg[br.b];
        const end = da === 1 && db >= 3 ? br.b : db === 1 && da >= 3 ? br.a : -1;
        if (end < 0) continue;
        const rEnd = gr[nodeTri[end]];
        if (br.len < PRUNE_FACTOR * rEnd + step) {
          doomed.push(i);
          this.pruneMin = Math.min(this.pruneMin, rEnd);
        }
      }
      if (doomed.length === 0) break;
      for (const i of doomed) this.kill(i);
      for (const i of doomed) {
        this.fuse(branches[i].a);
        this.fuse(branches[i].b);
      }
    }
  }

  private chainLength(v: number[]): number {
    let s = 0;
    for (let k = 1; k < v.length; k++) s += this.dist(v[k - 1], v[k]);
    return s;
  }

  /**
   * Junctions joined by a branch shorter than two steps are one junction the Voronoi diagram split: the first
   * moves to the branch's middle and takes over the other's branches.
   */
  mergeSplitJunctions(step: number): void {
    const { branches, nodeDeg, nodeBr, nodeTri, gx, gy, gr } = this;
    const order = nodeTri.map((_, i) => i).sort((p, q) => nodeTri[p] - nodeTri[q]);
    for (let round = 0; round < 10; round++) {
      let merged = 0;
      for (const nd of order) {
        if (nodeDeg[nd] < 3) continue;
        for (const i of nodeBr[nd]) {
          const br = branches[i];
          if (!br.alive) continue;
          const u = this.other(br, nd);
          if (u === nd || nodeDeg[u] < 3 || br.len >= 2 * step) continue;
          const vs = br.a === nd ? br.v : br.v.slice().reverse();
          const mid = vs[(vs.length / 2) | 0];
          const tn = nodeTri[nd], tu = nodeTri[u];
          gx[tn] = gx[mid];
          gy[tn] = gy[mid];
          gr[tn] = Math.max(gr[tn], gr[tu]);
          this.moved[tn] = 1;
          this.kill(i);
          for (const j of nodeBr[u]) {
            const bj = branches[j];
            if (!bj.alive) continue;
            if (bj.a === u) {
              bj.a = nd;
              bj.v[0] = tn;
              nodeDeg[nd]++;
              nodeBr[nd].push(j);
            }
            if (bj.b === u) {
              bj.b = nd;
              bj.v[bj.v.length - 1] = tn;
              nodeDeg[nd]++;
              nodeBr[nd].push(j);
            }
          }
          nodeDeg[u] = 0;
          nodeBr[u] = [];
          for (const j of nodeBr[nd]) if (branches[j].alive) branches[j].len = this.chainLength(branches[j].v);
          merged++;
          break;
        }
      }
      if (merged === 0) break;
    }
    for (let nd = 0; nd < nodeTri.length; nd++) this.fuse(nd);
  }
}

function axisFromSamples(
  prep: OrientedRings,
  step: number,
  maxSpacing: number,
  S: Samples,
  ed: RingEdges,
  walls: WallGrid,
  mode: Mode,
  region: () => Region,
): MedialAxisResult | null {
  const n = S.n;
  const coords = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    coords[2 * i] = S.x[i];
    coords[2 * i + 1] = S.y[i];
  }
  const del = new Delaunay(coords);
  const triangles = del.triangles as Uint32Array, halfedges = del.halfedges;
  const nT = triangles.length / 3;
  const gx = new Float64Array(nT), gy = new Float64Array(nT), gr = new Float64Array(nT);
  let inside: Uint8Array;
  if (mode === "sparse") {
    const flood = floodInside(S, triangles, halfedges);
    if (!flood) return null;
    inside = flood;
    circumcentres(S, triangles, inside, true, gx, gy, gr);
  } else {
    inside = new Uint8Array(nT).fill(1);
    circumcentres(S, triangles, inside, false, gx, gy, gr);
    const probe = region();
    for (let t = 0; t < nT; t++) if (inside[t]) inside[t] = probe.contains(gx[t], gy[t]) ? 1 : 0;
  }
  const axis = new Uint8Array(halfedges.length);
  const deg = new Uint8Array(nT);
  axisEdges(S, triangles, halfedges, inside, 2.5 * step, mode !== "overlapping", axis, deg);
  let projector: Projector | null = null;
  const sigLo = new Int32Array(nT).fill(-1), sigHi = new Int32Array(nT).fill(-1);
  if (mode !== "overlapping") {
    projector = new Projector(S, ed.edges, ed.ringOfEdge, ed.ringEdgeStart);
    projectVertices(projector, S, triangles, deg, mode === "sparse", gx, gy, gr, sigLo, sigHi);
  }
  const sk = new Skeleton(gx, gy, gr, halfedges, axis, deg);
  const regions = sk.components();
  sk.prune(step);
  sk.mergeSplitJunctions(step);

  const builder = new PathBuilder(gx, gy, gr, walls, step, projector, sigLo, sigHi, triangles, sk.moved);
  const paths: TuplePath[] = [];
  const leafEnds: [boolean, boolean][] = [];
  let minR = Infinity;
  for (const br of sk.branches) {
    if (!br.alive) continue;
    const leafA = sk.nodeDeg[br.a] === 1, leafB = sk.nodeDeg[br.b] === 1;
    const path = builder.build(br.v, leafA, leafB);
    for (const r of path.radii) minR = Math.min(minR, r);
    paths.push(path);
    leafEnds.push([leafA, leafB]);
  }
  extendLeaves(paths, leafEnds, region, step, maxSpacing);
  const holes = prep.depth.filter((d) => d % 2 === 1).length;
  const notes: string[] = [];
  if (mode === "sparse") {
    const shape = Number.isFinite(minR) && minR > 0 ? ` (shape within 1/${Math.round((8 * minR) / step)} of the smallest width, widths within ${WIDTH_TOLERANCE * 100} %)` : "";
    notes.push(`Every polygon vertex sampled, and walls at most ${fmt(maxSpacing / step / SAMPLES_PER_WIDTH)} smallest widths apart; centreline points put on the walls' exact bisectors${shape}.`);
  }
  const pruneMin = sk.pruneMin;
  return {
    method: "medial axis",
    paths: paths.map(flatPath),
    stepUnits: maxSpacing,
    toleranceStepUnits: step,
    pruneLengthUnits: PRUNE_FACTOR * (Number.isFinite(pruneMin) ? pruneMin : minR),
    minWidthUnits: Number.isFinite(minR) ? 2 * minR : 0,
    regions,
    holes,
    notes,
  };
}

const fmt = (x: number) => String(Number(x.toPrecision(6)));

/**
 * Branches as centreline paths: the chain's shape within a quarter step and its width within WIDTH_TOLERANCE,
 * both decided together (Douglas–Peucker on position and radius, simplify.ts) on candidate points:
 * the chain's vertices, and midpoints of chain edges along which the axis or its radius bends. With sparse samples (a projector) the
 * midpoints are put on the walls' exact bisector; the radii of the points kept come from the exact wall distance.
 */
class PathBuilder {
  private readonly cx: number[] = [];
  private readonly cy: number[] = [];
  private readonly cr: number[] = [];
  private readonly cs: number[] = [];
  private keep = new Uint8Array(64);
  private readonly stack: number[] = [];
  private t0 = 0;
  private t1 = 0;
  /** Walls the current chain edge's two vertices share, set up in the projector: -1 not yet looked at. */
  private shared = -1;

  constructor(
    private readonly gx: Float64Array,
    private readonly gy: Float64Array,
    private readonly gr: Float64Array,
    private readonly walls: WallGrid,
    private readonly step: number,
    private readonly projector: Projector | null,
    private readonly sigLo: Int32Array,
    private readonly sigHi: Int32Array,
    private readonly triangles: Uint32Array,
    private readonly moved: Uint8Array,
  ) {}

  /** Exact wall distance near a radius guess (the guess when no wall is that near). */
  private wall(x: number, y: number, guess: number): number {
    const d = this.walls.distance(x, y, guess * 1.5 + this.step);
    return Number.isFinite(d) ? d : guess;
  }

  /** Exact wall distance at a point whose walls are known to be r away (no nearer wall missed by sparse samples). */
  private nearestWall(x: number, y: number, r: number): number {
    const d = this.walls.distance(x, y, r * (1 + 1e-9) + 1e-12);
    return Number.isFinite(d) ? d : r;
  }

  /** Candidates strictly between (xa, ya) and (xb, yb) on chain edge t0–t1, in order, a few levels deep. */
  private sub(xa: number, ya: number, ra: number, xb: number, yb: number, rb: number, depth: number): void {
    const step = this.step;
    if (depth > 6 || norm(xb - xa, yb - ya) <= step) return;
    const t0 = this.t0, t1 = this.t1;
    const hx = (xa + xb) / 2, hy = (ya + yb) / 2;
    let xm = hx, ym = hy, rm: number;
    const pr = this.projector;
    if (pr) {
      // Between the same two edges the axis is straight and its radius linear: the chord is the axis.
      if (this.sigLo[t0] >= 0 && this.sigLo[t0] === this.sigLo[t1] && this.sigHi[t0] === this.sigHi[t1]) return;
      const T = this.triangles;
      if (this.shared < 0) this.shared = pr.sharedWalls(T[3 * t0], T[3 * t0 + 1], T[3 * t0 + 2], T[3 * t1], T[3 * t1 + 1], T[3 * t1 + 2]);
      if (this.shared >= 2 && pr.solve(hx, hy, hx, hy, Math.max(ra, rb))) {
        xm = pr.x;
        ym = pr.y;
        rm = pr.r;
      } else rm = this.wall(hx, hy, Math.max(ra, rb));
    } else rm = this.wall(hx, hy, Math.max(ra, rb));
    const lin = (ra + rb) / 2;
    if (Math.abs(rm - lin) <= 0.5 * WIDTH_TOLERANCE * Math.max(rm, lin) && norm(xm - hx, ym - hy) <= step / 8) return;
    this.sub(xa, ya, ra, xm, ym, rm, depth + 1);
    this.cx.push(xm);
    this.cy.push(ym);
    this.cr.push(rm);
    this.sub(xm, ym, rm, xb, yb, rb, depth + 1);
  }

  /**
   * Radius at vertex k of chain v: exact where projected; the ends (junctions) are measured, within their
   * Voronoi radius (the empty circle touches walls) unless a merge moved them.
   */
  private radiusAt(v: number[], k: number): number {
    const t = v[k];
    if (this.projector && k > 0 && k < v.length - 1) return this.gr[t];
    if (this.moved[t]) return this.wall(this.gx[t], this.gy[t], this.gr[t]);
    const d = this.walls.distance(this.gx[t], this.gy[t], this.gr[t] * (1 + 1e-9) + 1e-12);
    return Number.isFinite(d) ? d : this.wall(this.gx[t], this.gy[t], this.gr[t]);
  }

  /** The path of a chain of vertices; leafA / leafB: that end is a dead end. */
  build(v: number[], leafA: boolean, leafB: boolean): TuplePath {
    const { gx, gy, step, cx, cy, cr, cs } = this;
    cx.length = cy.length = cr.length = cs.length = 0;
    const m = v.length;
    let rPrev = this.radiusAt(v, 0);
    cx.push(gx[v[0]]);
    cy.push(gy[v[0]]);
    cr.push(rPrev);
    for (let k = 1; k < m; k++) {
      this.t0 = v[k - 1];
      this.t1 = v[k];
      this.shared = -1;
      const r1 = this.radiusAt(v, k);
      this.sub(gx[this.t0], gy[this.t0], rPrev, gx[this.t1], gy[this.t1], r1, 0);
      cx.push(gx[this.t1]);
      cy.push(gy[this.t1]);
      cr.push(r1);
      rPrev = r1;
    }
    const nC = cx.length;
    for (let k = 0; k < nC; k++) cs.push(k === 0 ? 0 : cs[k - 1] + norm(cx[k] - cx[k - 1], cy[k] - cy[k - 1]));
    // Keep points where either the shape (a quarter step) or the width (WIDTH_TOLERANCE) is off otherwise.
    if (this.keep.length < nC) this.keep = new Uint8Array(2 * nC);
    const keep = this.keep;
    const geomTol = step / 4;
    douglasPeucker(nC, keep, this.stack, (i, j) => {
      const ax = cx[i], ay = cy[i], bx = cx[j], by = cy[j];
      const l = norm(bx - ax, by - ay);
      const span = cs[j] - cs[i];
      let best = -1, worst = 1;
      for (let k = i + 1; k < j; k++) {
        const dGeom = l === 0 ? norm(cx[k] - ax, cy[k] - ay) : Math.abs((bx - ax) * (cy[k] - ay) - (by - ay) * (cx[k] - ax)) / l;
        const lin = span > 0 ? cr[i] + ((cr[j] - cr[i]) * (cs[k] - cs[i])) / span : cr[i];
        const bad = Math.max(dGeom / geomTol, Math.abs(cr[k] - lin) / (WIDTH_TOLERANCE * Math.max(cr[k], lin)));
        if (bad > worst) {
          worst = bad;
          best = k;
        }
      }
      return best;
    });
    // Points closer than half a step would make pieces shorter than the network's snap tolerance: skip them.
    const points: [number, number][] = [];
    const ks: number[] = [];
    for (let k = 0; k < nC; k++) {
      if (!keep[k]) continue;
      const prev = points.at(-1);
      const near = prev !== undefined && norm(cx[k] - prev[0], cy[k] - prev[1]) < step / 2;
      if (near && k !== nC - 1) continue;
      if (near && points.length > 1) {
        points.pop();
        ks.pop();
      }
      points.push([cx[k], cy[k]]);
      ks.push(k);
    }
    const radii: number[] = [];
    for (let i = 0; i < ks.length; i++) {
      const k = ks[i];
      const last = i === ks.length - 1;
      if ((i === 0 && leafA) || (last && leafB)) radii.push(this.leafRadius(i === 0, k));
      else radii.push(this.projector ? this.nearestWall(cx[k], cy[k], cr[k]) : cr[k]);
    }
    return { points, radii };
  }

  /** Point at distance d inwards along the candidates from one end, or null past the other end. */
  private inward(atStart: boolean, d: number): [number, number] | null {
    const { cx, cy, cs } = this;
    const nC = cs.length;
    const total = cs[nC - 1];
    if (d > total) return null;
    const target = atStart ? d : total - d;
    let lo = 0, hi = nC - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (cs[mid] <= target) lo = mid;
      else hi = mid;
    }
    const span = cs[hi] - cs[lo];
    const f = span > 0 ? (target - cs[lo]) / span : 0;
    return [cx[lo] + (cx[hi] - cx[lo]) * f, cy[lo] + (cy[hi] - cy[lo]) * f];
  }

  /**
   * Half-width at a dead end: the axis there stops one radius short of the end wall, which is nearer than the
   * side walls; measured one radius further in, and as far again to carry a taper's slope out to the end.
   */
  private leafRadius(atStart: boolean, kEnd: number): number {
    const rv = this.cr[kEnd];
    const reach = rv * 1.5 + this.step;
    const p1 = this.inward(atStart, rv);
    if (!p1) return rv;
    const d1 = this.walls.distance(p1[0], p1[1], reach);
    if (!Number.isFinite(d1)) return rv;
    const p2 = this.inward(atStart, 2 * rv);
    const d2 = p2 ? this.walls.distance(p2[0], p2[1], reach) : Infinity;
    if (!Number.isFinite(d2) || Math.abs(d2 - d1) > 0.2 * d1) return d1;
    return Math.max(0, d1 + (d1 - d2));
  }
}

/** Dead ends: the axis stops one radius short of a flat or round end wall; extend it there along its last direction. */
function extendLeaves(paths: TuplePath[], leafEnds: [boolean, boolean][], region: () => Region, step: number, maxSpacing: number): void {
  paths.forEach((p, i) => {
    for (const atEnd of [false, true]) {
      if (!leafEnds[i][atEnd ? 1 : 0] || p.points.length < 2) continue;
      const k = atEnd ? p.points.length - 1 : 0;
      const kPrev = atEnd ? k - 1 : 1;
      const [x, y] = p.points[k];
      const [px, py] = p.points[kPrev];
      const l = norm(x - px, y - py);
      if (l === 0) continue;
      const r = p.radii[k];
      let ux = (x - px) / l, uy = (y - py) / l;
      // On to the wall straight ahead: one radius from where the axis ends, which with sparse samples can be up
      // to one sample spacing further in (the last vertex is not the end wall's junction); never further.
      const reg = region();
      const cap = r + maxSpacing - step;
      let reach = cap;
      let lo = 0;
      for (let d = Math.min(r, cap); ; d = Math.min(d + step / 2, cap)) {
        if (!reg.contains(x + ux * d, y + uy * d)) {
          let hi = d;
          for (let it = 0; it < 40; it++) {
            const mid = (lo + hi) / 2;
            if (reg.contains(x + ux * mid, y + uy * mid)) lo = mid;
            else hi = mid;
          }
          reach = lo;
          break;
        }
        lo = d;
        if (d >= cap) break;
      }
      if (!(reach > step / 8)) continue;
      ux *= reach;
      uy *= reach;
      const pt: [number, number] = [x + ux, y + uy];
      // The width carried on along the last piece's slope (a taper keeps tapering to the end wall).
      const slope = (r - p.radii[kPrev]) / l;
      const rEnd = Math.abs(slope) < 0.5 ? Math.max(r * 0.5, r + slope * reach) : r;
      if (atEnd) {
        p.points.push(pt);
        p.radii.push(rEnd);
      } else {
        p.points.unshift(pt);
        p.radii.unshift(rEnd);
      }
    }
  });
}
