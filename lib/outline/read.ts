/**
 * Mask outlines of one channel layer (closed paths, circles) → centreline
 * pieces with drawn widths, ready for the network builder. Drawing units.
 */
import type { CircleEntity, PathEntity } from "../dxf/types";
import { samplePoints, startOf } from "../network/geometry";
import { extractMedialAxis, type MedialAxisResult } from "./medial-axis";
import { circumradius, unflatten, type FlatRings, type Ring } from "./region";
import { douglasPeucker } from "./simplify";
import { grownCopy } from "../typed-arrays";

/** Sides of the polygon standing in for a circle drawn on a channel layer (common practice: chord sag below 0.1 % of the radius). */
const CIRCLE_SIDES = 96;

export interface OutlineLayerResult {
  /**
   * Centreline pieces, straight: each path's shape (its points within an eighth of the tolerance step, collinear
   * points dropped), x0 y0 x1 y1 per piece in one column, drawing units. A piece's widths come from its path's
   * profile (pieceProfile, pieceS).
   */
  lines: Float64Array;
  /** Number of pieces. */
  count: number;
  /** Smallest bend radius of the path each piece belongs to (drawing units), NaN where straight. */
  curveRadii: Float64Array;
  /**
   * Every path's width profile in one pair of columns: path p's positions along it from its first point (s) and
   * widths (w) are at profileStart[p] .. profileStart[p + 1] − 1, drawing units.
   */
  profileS: Float64Array;
  profileW: Float64Array;
  profileStart: Int32Array;
  /** For each piece, its path, and its start and end positions along the path (2 per piece). */
  pieceProfile: Int32Array;
  pieceS: Float64Array;
  /** The medial axis and the tolerances it used. */
  axis: MedialAxisResult;
}

/** Rings of closed paths (arcs sampled every ≤ 5°) and circles, flat, drawing units. */
export function flatRingsOf(shapes: (PathEntity | CircleEntity)[]): FlatRings {
  let xy = new Float64Array(256);
  const start: number[] = [0];
  let n = 0;
  const put = (x: number, y: number) => {
    if (2 * n + 2 > xy.length) xy = grownCopy(xy, 2 * xy.length);
    xy[2 * n] = x;
    xy[2 * n + 1] = y;
    n++;
  };
  for (const s of shapes) {
    if (s.kind === "circle") {
      for (let k = 0; k < CIRCLE_SIDES; k++) put(s.cx + s.r * Math.cos((2 * Math.PI * k) / CIRCLE_SIDES), s.cy + s.r * Math.sin((2 * Math.PI * k) / CIRCLE_SIDES));
      start.push(n);
      continue;
    }
    if (s.pieces.length === 0) continue;
    const first = n;
    const st = startOf(s.pieces[0]);
    put(st.x, st.y);
    for (const p of s.pieces) {
      if (p.kind === "line") put(p.x1, p.y1);
      else for (const q of samplePoints(p)) put(q.x, q.y);
    }
    // A closed path ends where it starts: the ring closes on its own.
    if (n - first > 1 && xy[2 * n - 2] === st.x && xy[2 * n - 1] === st.y) n--;
    start.push(n);
  }
  return { xy: xy.subarray(0, 2 * n), start: Int32Array.from(start) };
}

/** The same rings as [x, y] pairs. */
export function ringsOf(shapes: (PathEntity | CircleEntity)[]): Ring[] {
  return unflatten(flatRingsOf(shapes));
}

/**
 * Read one layer's mask outlines as centreline pieces.
 * @param rings the rings of the layer's closed paths and circles (flatRingsOf, or [x, y] rings), drawing units.
 * @param stepUnits optional sampling step (drawing units); by default derived from the smallest width.
 * @returns line pieces with widths and the medial axis result (tolerances, regions, holes).
 */
export function readOutlineLayer(rings: Ring[] | FlatRings, stepUnits?: number): OutlineLayerResult {
  const axis = extractMedialAxis(rings, stepUnits);
  const nPaths = axis.paths.length;
  // Typed columns, no object per piece or per profile: the profiles sized once, the pieces (most paths are one or
  // two) grown as needed.
  let total = 0;
  for (const path of axis.paths) total += path.end - path.start;
  const profileS = new Float64Array(total), profileW = new Float64Array(total);
  const profileStart = new Int32Array(nPaths + 1);
  let cap = 2 * nPaths + 16;
  let lines = new Float64Array(4 * cap), curveRadii = new Float64Array(cap);
  let pieceProfile = new Int32Array(cap), pieceS = new Float64Array(2 * cap);
  const keep: number[] = [];
  const scratch = { keep: new Uint8Array(64), stack: [] as number[] };
  let at = 0, count = 0;
  for (let pi = 0; pi < nPaths; pi++) {
    const { xy, radii, start: o, bendRadius: drawnBend } = axis.paths[pi];
    const m = axis.paths[pi].end - o;
    profileStart[pi] = at;
    for (let i = 0; i < m; i++) {
      const k = o + i;
      profileS[at + i] = i === 0 ? 0 : profileS[at + i - 1] + Math.sqrt((xy[2 * k] - xy[2 * k - 2]) ** 2 + (xy[2 * k + 1] - xy[2 * k - 1]) ** 2);
      profileW[at + i] = 2 * radii[k];
    }
    const bend = (drawnBend !== undefined ? drawnBend : bendRadius(xy, radii, o, m, profileS, at)) ?? NaN;
    const nKeep = shapePoints(xy, o, m, axis.toleranceStepUnits / 8, keep, scratch);
    for (let q = 0; q + 1 < nKeep; q++) {
      const i = o + keep[q], j = o + keep[q + 1];
      const x0 = xy[2 * i], y0 = xy[2 * i + 1], x1 = xy[2 * j], y1 = xy[2 * j + 1];
      if (x0 === x1 && y0 === y1) continue;
      if (count === cap) {
        cap *= 2;
        lines = grownCopy(lines, 4 * cap);
        curveRadii = grownCopy(curveRadii, cap);
        pieceProfile = grownCopy(pieceProfile, cap);
        pieceS = grownCopy(pieceS, 2 * cap);
      }
      lines[4 * count] = x0;
      lines[4 * count + 1] = y0;
      lines[4 * count + 2] = x1;
      lines[4 * count + 3] = y1;
      curveRadii[count] = bend;
      pieceProfile[count] = pi;
      pieceS[2 * count] = profileS[at + i - o];
      pieceS[2 * count + 1] = profileS[at + j - o];
      count++;
    }
    at += m;
  }
  profileStart[nPaths] = at;
  return { lines, count, curveRadii, profileS, profileW, profileStart, pieceProfile, pieceS, axis };
}

/**
 * Indices (from o) of the m points o .. o + m − 1 (x y interleaved) that keep a polyline's shape within tol
 * (Douglas–Peucker, simplify.ts), into out[0 .. the count returned): the width points between them stay in the
 * path's profile.
 */
function shapePoints(xy: Float64Array, o: number, m: number, tol: number, out: number[], scratch: { keep: Uint8Array; stack: number[] }): number {
  if (scratch.keep.length < m) scratch.keep = new Uint8Array(2 * m);
  const keep = scratch.keep;
  douglasPeucker(m, keep, scratch.stack, (i, j) => {
    const ax = xy[2 * (o + i)], ay = xy[2 * (o + i) + 1], bx = xy[2 * (o + j)], by = xy[2 * (o + j) + 1];
    const l = Math.sqrt((bx - ax) ** 2 + (by - ay) ** 2);
    let best = -1, worst = tol;
    for (let k = i + 1; k < j; k++) {
      const x = xy[2 * (o + k)], y = xy[2 * (o + k) + 1];
      const d = l === 0 ? Math.sqrt((x - ax) ** 2 + (y - ay) ** 2) : Math.abs((bx - ax) * (y - ay) - (by - ay) * (x - ax)) / l;
      if (d > worst) {
        worst = d;
        best = k;
      }
    }
    return best;
  });
  // Written from the start of out, which is never shortened (it keeps its storage from path to path).
  let n = 0;
  for (let k = 0; k < m; k++) if (keep[k]) out[n++] = k;
  return n;
}

/**
 * Smallest bend radius along a centreline (its m points from index o, x y interleaved, half-widths radii;
 * positions along it in s from index at) from consecutive point triples, leaving out the first and last two local
 * radii of the path (where it turns into a junction or ends); null when straight (radius above 1000 local widths).
 */
function bendRadius(xy: Float64Array, radii: Float64Array, o: number, m: number, s: Float64Array, at: number): number | null {
  const total = s[at + m - 1];
  let min = Infinity;
  for (let i = 1; i + 1 < m; i++) {
    const k = o + i;
    const margin = 2 * radii[k];
    if (s[at + i - 1] < margin || total - s[at + i + 1] < margin) continue;
    const r = circumradius(xy[2 * k - 2], xy[2 * k - 1], xy[2 * k], xy[2 * k + 1], xy[2 * k + 2], xy[2 * k + 3]);
    if (r < 1000 * 2 * radii[k]) min = Math.min(min, r);
  }
  return Number.isFinite(min) ? min : null;
}
