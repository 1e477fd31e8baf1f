/**
 * Centrelines of a filled mask region: the medial axis from the Voronoi
 * diagram of densely sampled boundary points (d3-delaunay), pruned of the
 * spurs that corners create, split at junctions, with the local width from
 * the exact distance to the walls. Drawing units throughout (the caller
 * converts to SI).
 */
import { Delaunay } from "d3-delaunay";
import { filledArea, Region, WallGrid, type Ring } from "./region";

/** Samples per smallest width (common practice for Voronoi medial axes: a few samples across the narrowest gap). */
export const SAMPLES_PER_WIDTH = 6;
/** A leaf branch shorter than this many local radii of its junction is a corner spur (common practice; a 90° corner's spur is √2 ≈ 1.41 radii). */
export const PRUNE_FACTOR = 2;
/** Most boundary samples one layer may use (keeps memory bounded); beyond it the step grows and a note says so. */
export const MAX_SAMPLES = 3_000_000;

export interface CentrelinePath {
  /** Points along the centreline, drawing units. */
  points: [number, number][];
  /** Local half-width at each point (distance to the nearest wall), drawing units. */
  radii: number[];
}

export interface MedialAxisResult {
  paths: CentrelinePath[];
  /** Boundary sampling step used, drawing units. */
  stepUnits: number;
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

interface Graph {
  x: Float64Array;
  y: Float64Array;
  r: Float64Array;
  /** Neighbours per vertex; only vertices on the axis have an entry (read only for live vertices). */
  adj: number[][];
  alive: Uint8Array;
  /** The vertices that have neighbours, ascending. */
  verts: number[];
}

/**
 * Find the centrelines of the area filled by `rings`.
 * @param rings closed rings in drawing units (outer boundaries and holes, any orientation).
 * @param stepUnits boundary sampling step; when omitted it derives from the smallest feature (two passes).
 * @returns centreline paths split at junctions and dead ends, with half-widths, and the tolerances used.
 */
export function extractMedialAxis(rings: Ring[], stepUnits?: number): MedialAxisResult {
  const notes: string[] = [];
  let perimeter = 0;
  for (const r of rings) for (let i = 0; i < r.length; i++) {
    const a = r[i], b = r[(i + 1) % r.length];
    perimeter += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  let step = stepUnits;
  if (step === undefined) {
    // First guess from the shapes' hydraulic-width-like ratio 2·area/perimeter (a thin band's width), refined below.
    const area = Math.max(0, filledArea(rings));
    step = (2 * area) / Math.max(perimeter, 1e-300) / SAMPLES_PER_WIDTH;
  }
  const floor = perimeter / MAX_SAMPLES;
  if (step < floor) {
    notes.push(`The outline is too long for its smallest feature; the boundary was sampled every ${floor.toPrecision(3)} drawing units instead of ${step.toPrecision(3)}.`);
    step = floor;
  }
  let result = medialAxisAt(rings, step);
  if (stepUnits === undefined && result.minWidthUnits / SAMPLES_PER_WIDTH < step / 1.5 && result.minWidthUnits > 0) {
    // A narrower channel than the first guess: sample again at the step its width asks for.
    const finer = Math.max(result.minWidthUnits / SAMPLES_PER_WIDTH, floor);
    if (finer < step) result = medialAxisAt(rings, finer);
  }
  result.notes.unshift(...notes);
  return result;
}

function medialAxisAt(rings: Ring[], step: number): MedialAxisResult {
  const region = new Region(rings, step * 4);
  const eps = step * 1e-3;
  // Boundary samples, dropping those inside the filled area (where shapes overlap, a wall is not a wall).
  const xs: number[] = [];
  const ys: number[] = [];
  const ringOf: number[] = [];
  const posOf: number[] = [];
  // Walls for widths: whole edges where no sample fell inside the filled area, else the runs between kept samples.
  const walls: number[] = [];
  region.rings.forEach((ring, ri) => {
    let s = 0;
    for (let i = 0; i < ring.length; i++) {
      const [ax, ay] = ring[i];
      const [bx, by] = ring[(i + 1) % ring.length];
      const len = Math.hypot(bx - ax, by - ay);
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
        xs.push(x);
        ys.push(y);
        ringOf.push(ri);
        posOf.push(s + (len * k) / n);
      }
      if (dropped === 0) walls.push(ax, ay, bx, by);
      s += len;
    }
  });
  const wallGrid = new WallGrid(Float64Array.from(walls), step * 4);
  const perimOf = region.rings.map((r) => r.reduce((acc, a, i) => acc + Math.hypot(r[(i + 1) % r.length][0] - a[0], r[(i + 1) % r.length][1] - a[1]), 0));
  const n = xs.length;
  const coords = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    coords[2 * i] = xs[i];
    coords[2 * i + 1] = ys[i];
  }
  const del = new Delaunay(coords);
  const { triangles, halfedges } = del;
  const nT = triangles.length / 3;
  const gx = new Float64Array(nT), gy = new Float64Array(nT), gr = new Float64Array(nT);
  const inside = new Uint8Array(nT);
  for (let t = 0; t < nT; t++) {
    const a = triangles[3 * t], b = triangles[3 * t + 1], c = triangles[3 * t + 2];
    const ax = xs[a], ay = ys[a];
    const bx = xs[b] - ax, by = ys[b] - ay, cx = xs[c] - ax, cy = ys[c] - ay;
    const d = 2 * (bx * cy - by * cx);
    if (Math.abs(d) < 1e-300) continue;
    const b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
    const ux = (cy * b2 - by * c2) / d, uy = (bx * c2 - cx * b2) / d;
    gx[t] = ax + ux;
    gy[t] = ay + uy;
    gr[t] = Math.hypot(ux, uy);
    inside[t] = region.contains(gx[t], gy[t]) ? 1 : 0;
  }
  // Voronoi edges between inside circumcentres whose generating samples are far apart along the wall
  // (neighbouring samples on one wall give the spokes towards that wall, not the axis).
  const adj: number[][] = new Array(nT);
  const minGap = 2.5 * step;
  for (let e = 0; e < halfedges.length; e++) {
    const o = halfedges[e];
    if (o < e) continue;
    const t1 = (e / 3) | 0, t2 = (o / 3) | 0;
    if (!inside[t1] || !inside[t2]) continue;
    const p = triangles[e], q = triangles[e % 3 === 2 ? e - 2 : e + 1];
    if (ringOf[p] === ringOf[q]) {
      const per = perimOf[ringOf[p]];
      const d = Math.abs(posOf[p] - posOf[q]);
      if (Math.min(d, per - d) < minGap) continue;
    }
    (adj[t1] ??= []).push(t2);
    (adj[t2] ??= []).push(t1);
  }
  const g: Graph = { x: gx, y: gy, r: gr, adj, alive: new Uint8Array(nT), verts: [] };
  for (let t = 0; t < nT; t++) if (adj[t] !== undefined) {
    g.alive[t] = 1;
    g.verts.push(t);
  }
  const regions = countComponents(g);
  const pruneMin = prune(g, step);
  contractShort(g, step);
  const branches = listBranches(g);
  const paths: CentrelinePath[] = [];
  let minR = Infinity;
  for (const br of branches) {
    const pts: [number, number][] = br.map((v) => [g.x[v], g.y[v]]);
    const keep = simplifyMask(pts, step / 4);
    const rOf = (k: number) => branchRadius(g, wallGrid, br, pts, k, step);
    const radii = new Map<number, number>();
    const radius = (k: number) => {
      let r = radii.get(k);
      if (r === undefined) radii.set(k, (r = rOf(k)));
      return r;
    };
    // Widths between kept points: bisect along the branch's own vertices (they lie on the axis) while the
    // width at the middle departs from the straight interpolation by more than 0.5 %.
    const kept: number[] = [];
    keep.forEach((on, k) => on && kept.push(k));
    const stack: [number, number][] = [];
    for (let i = kept.length - 2; i >= 0; i--) stack.push([kept[i], kept[i + 1]]);
    while (stack.length) {
      const [a, b] = stack.pop()!;
      if (b - a < 2) continue;
      const m = (a + b) >> 1;
      const ra = radius(a), rb = radius(b), rm = radius(m);
      const lin = ra + ((rb - ra) * (m - a)) / (b - a);
      if (Math.abs(rm - lin) > 0.005 * Math.max(rm, lin)) {
        keep[m] = 1;
        stack.push([m, b], [a, m]);
      }
    }
    // Points closer than half a step would make pieces shorter than the network's snap tolerance: skip them.
    const points: [number, number][] = [];
    const rs: number[] = [];
    const last = pts.length - 1;
    keep.forEach((on, k) => {
      if (!on) return;
      const prev = points.at(-1);
      if (prev && k !== last && Math.hypot(pts[k][0] - prev[0], pts[k][1] - prev[1]) < step / 2) return;
      if (prev && k === last && points.length > 1 && Math.hypot(pts[k][0] - prev[0], pts[k][1] - prev[1]) < step / 2) {
        points.pop();
        rs.pop();
      }
      points.push(pts[k]);
      rs.push(radius(k));
    });
    for (const r of rs) minR = Math.min(minR, r);
    paths.push({ points, radii: rs });
  }
  extendLeaves(g, branches, paths, region, step);
  const holes = region.depth.filter((d) => d % 2 === 1).length;
  return {
    paths,
    stepUnits: step,
    pruneLengthUnits: PRUNE_FACTOR * (Number.isFinite(pruneMin) ? pruneMin : minR),
    minWidthUnits: Number.isFinite(minR) ? 2 * minR : 0,
    regions,
    holes,
    notes: [],
  };
}

const liveDegree = (g: Graph, v: number) => {
  let d = 0;
  for (const u of g.adj[v]) if (g.alive[u]) d++;
  return d;
};

function countComponents(g: Graph): number {
  const seen = new Uint8Array(g.alive.length);
  let count = 0;
  const stack: number[] = [];
  for (const v of g.verts) {
    if (!g.alive[v] || seen[v]) continue;
    count++;
    seen[v] = 1;
    stack.push(v);
    while (stack.length) {
      const u = stack.pop()!;
      for (const w of g.adj[u]) if (g.alive[w] && !seen[w]) {
        seen[w] = 1;
        stack.push(w);
      }
    }
  }
  return count;
}

/** Walk from `from` through `first` along degree-2 vertices; returns the vertices including both ends. */
function walk(g: Graph, from: number, first: number): number[] {
  const out = [from, first];
  let prev = from, cur = first;
  while (liveDegree(g, cur) === 2) {
    let next = -1;
    for (const u of g.adj[cur]) if (g.alive[u] && u !== prev) { next = u; break; }
    if (next === -1 || next === from) break;
    out.push(next);
    prev = cur;
    cur = next;
  }
  return out;
}

const pathLength = (g: Graph, vs: number[]) => {
  let s = 0;
  for (let i = 1; i < vs.length; i++) s += Math.hypot(g.x[vs[i]] - g.x[vs[i - 1]], g.y[vs[i]] - g.y[vs[i - 1]]);
  return s;
};

/** Remove leaf branches shorter than PRUNE_FACTOR × their junction's radius, until none is left; returns the smallest junction radius that pruned. */
function prune(g: Graph, step: number): number {
  let minJunctionR = Infinity;
  for (let round = 0; round < 50; round++) {
    // Decide every spur of the round first, then remove them together: removing one at a time would let
    // its sibling spur merge into the channel before being looked at.
    const doomed: number[][] = [];
    for (const v of g.verts) {
      if (!g.alive[v] || liveDegree(g, v) !== 1) continue;
      const first = g.adj[v].find((u) => g.alive[u])!;
      const br = walk(g, v, first);
      const end = br.at(-1)!;
      if (liveDegree(g, end) < 3) continue;
      if (pathLength(g, br) < PRUNE_FACTOR * g.r[end] + step) {
        doomed.push(br);
        minJunctionR = Math.min(minJunctionR, g.r[end]);
      }
    }
    for (const br of doomed) for (let i = 0; i < br.length - 1; i++) g.alive[br[i]] = 0;
    if (doomed.length === 0) break;
  }
  return minJunctionR;
}

/** Merge junctions joined by a branch shorter than two sampling steps (a junction the Voronoi diagram split in two). */
function contractShort(g: Graph, step: number): void {
  for (let round = 0; round < 10; round++) {
    let merged = 0;
    for (const v of g.verts) {
      if (!g.alive[v] || liveDegree(g, v) < 3) continue;
      for (const u of g.adj[v]) {
        if (!g.alive[u] || !g.alive[v]) continue;
        const br = walk(g, v, u);
        const end = br.at(-1)!;
        if (end === v || liveDegree(g, end) < 3 || pathLength(g, br) >= 2 * step) continue;
        // Fold the short branch into v: v moves to the branch's middle and takes over end's other neighbours.
        const mid = br[(br.length / 2) | 0];
        g.x[v] = g.x[mid];
        g.y[v] = g.y[mid];
        g.r[v] = Math.max(g.r[v], g.r[end]);
        for (let i = 1; i < br.length; i++) g.alive[br[i]] = 0;
        for (const w of g.adj[end]) {
          if (!g.alive[w] || w === v) continue;
          g.adj[w] = g.adj[w].map((x) => (x === end ? v : x)).filter((x, i, a) => a.indexOf(x) === i);
          g.adj[v].push(w);
        }
        g.adj[v] = g.adj[v].filter((w, i, a) => g.alive[w] && a.indexOf(w) === i);
        merged++;
        break;
      }
    }
    if (merged === 0) break;
  }
}

/** Branches between vertices of degree ≠ 2 (and one per loop without such a vertex). */
function listBranches(g: Graph): number[][] {
  const out: number[][] = [];
  const usedEdge = new Set<number>();
  const n = g.alive.length;
  const key = (a: number, b: number) => (a < b ? a * n + b : b * n + a);
  const take = (from: number, first: number) => {
    if (usedEdge.has(key(from, first))) return;
    const br = walk(g, from, first);
    for (let i = 1; i < br.length; i++) usedEdge.add(key(br[i - 1], br[i]));
    out.push(br);
  };
  for (const v of g.verts) {
    if (!g.alive[v] || liveDegree(g, v) === 2) continue;
    for (const u of g.adj[v]) if (g.alive[u]) take(v, u);
  }
  for (const v of g.verts) {
    if (!g.alive[v] || liveDegree(g, v) !== 2) continue;
    for (const u of g.adj[v]) if (g.alive[u] && !usedEdge.has(key(v, u))) {
      const br = walk(g, v, u);
      if (br.at(-1) !== v) br.push(v);
      for (let i = 1; i < br.length; i++) usedEdge.add(key(br[i - 1], br[i]));
      out.push(br);
    }
  }
  return out;
}

/** Douglas–Peucker simplification (iterative, keeps the ends): which points to keep. Own code: a dozen lines. */
export function simplifyMask(pts: [number, number][], tol: number): Uint8Array {
  const keep = new Uint8Array(pts.length);
  if (pts.length === 0) return keep;
  keep[0] = keep[pts.length - 1] = 1;
  const stack: [number, number][] = pts.length > 2 ? [[0, pts.length - 1]] : [];
  while (stack.length) {
    const [i, j] = stack.pop()!;
    const [ax, ay] = pts[i], [bx, by] = pts[j];
    const l = Math.hypot(bx - ax, by - ay);
    let best = -1, bestD = tol;
    for (let k = i + 1; k < j; k++) {
      const [px, py] = pts[k];
      const d = l === 0 ? Math.hypot(px - ax, py - ay) : Math.abs((bx - ax) * (py - ay) - (by - ay) * (px - ax)) / l;
      if (d > bestD) { bestD = d; best = k; }
    }
    if (best >= 0) {
      keep[best] = 1;
      stack.push([i, best], [best, j]);
    }
  }
  return keep;
}

/** Half-width at vertex k of a branch: the exact wall distance; at a dead end, measured one radius further in (the end wall is nearer there). */
function branchRadius(g: Graph, walls: WallGrid, br: number[], pts: [number, number][], k: number, step: number): number {
  const v = br[k];
  const rv = g.r[v];
  const [x, y] = pts[k];
  if ((k === 0 || k === br.length - 1) && liveDegree(g, v) === 1 && br.length >= 2) {
    // Walk inwards along the branch by one radius.
    const dir = k === 0 ? 1 : -1;
    let walked = 0;
    let j = k;
    while (j + dir >= 0 && j + dir < br.length && walked < rv) {
      walked += Math.hypot(pts[j + dir][0] - pts[j][0], pts[j + dir][1] - pts[j][1]);
      j += dir;
    }
    const d1 = walls.distance(pts[j][0], pts[j][1], rv * 1.5 + step);
    // And as far again, to carry a taper's slope out to the end (linear extrapolation).
    const s1 = walked;
    while (j + dir >= 0 && j + dir < br.length && walked < 2 * s1) {
      walked += Math.hypot(pts[j + dir][0] - pts[j][0], pts[j + dir][1] - pts[j][1]);
      j += dir;
    }
    const d2 = walls.distance(pts[j][0], pts[j][1], rv * 1.5 + step);
    if (!Number.isFinite(d1)) return rv;
    if (!Number.isFinite(d2) || walked <= s1 || Math.abs(d2 - d1) > 0.2 * d1) return d1;
    return Math.max(0, d1 + ((d1 - d2) * s1) / (walked - s1));
  }
  const d = walls.distance(x, y, rv * 1.5 + step);
  return Number.isFinite(d) ? d : rv;
}

/** Dead ends: the axis stops one radius short of a flat or round end wall; extend it there along its last direction. */
function extendLeaves(g: Graph, branches: number[][], paths: CentrelinePath[], region: Region, step: number): void {
  branches.forEach((br, i) => {
    const p = paths[i];
    for (const atEnd of [false, true]) {
      const v = atEnd ? br.at(-1)! : br[0];
      if (liveDegree(g, v) !== 1 || p.points.length < 2) continue;
      const k = atEnd ? p.points.length - 1 : 0;
      const kPrev = atEnd ? k - 1 : 1;
      const [x, y] = p.points[k];
      const [px, py] = p.points[kPrev];
      const l = Math.hypot(x - px, y - py);
      if (l === 0) continue;
      const r = p.radii[k];
      let ux = (x - px) / l, uy = (y - py) / l;
      // Stop at the wall if it is nearer than one radius straight ahead.
      let reach = r;
      if (!region.contains(x + ux * reach, y + uy * reach)) {
        let lo = 0, hi = r;
        for (let it = 0; it < 40; it++) {
          const mid = (lo + hi) / 2;
          if (region.contains(x + ux * mid, y + uy * mid)) lo = mid;
          else hi = mid;
        }
        reach = lo;
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
