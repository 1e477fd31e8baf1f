/**
 * Mask outlines of one channel layer (closed paths, circles) → centreline
 * pieces with drawn widths, ready for the network builder. Drawing units.
 */
import type { CircleEntity, LinePiece, PathEntity } from "../dxf/types";
import { samplePoints, startOf } from "../network/geometry";
import { extractMedialAxis, type MedialAxisResult } from "./medial-axis";
import type { Ring } from "./region";

/** Sides of the polygon standing in for a circle drawn on a channel layer (common practice: chord sag below 0.1 % of the radius). */
const CIRCLE_SIDES = 96;

export interface OutlineLayerResult {
  /** Centreline pieces whose w0/w1 carry the local width (twice the wall distance), drawing units. */
  pieces: LinePiece[];
  /** Smallest bend radius of the path each piece belongs to (drawing units), null where straight. */
  curveRadii: (number | null)[];
  /** The medial axis and the tolerances it used. */
  axis: MedialAxisResult;
  /** The rings read, drawing units (for drawing the outline under the centrelines). */
  rings: Ring[];
}

/** Rings of closed paths (arcs sampled every ≤ 5°) and circles, drawing units. */
export function ringsOf(shapes: (PathEntity | CircleEntity)[]): Ring[] {
  const rings: Ring[] = [];
  for (const s of shapes) {
    if (s.kind === "circle") {
      const ring: Ring = [];
      for (let k = 0; k < CIRCLE_SIDES; k++) ring.push([s.cx + s.r * Math.cos((2 * Math.PI * k) / CIRCLE_SIDES), s.cy + s.r * Math.sin((2 * Math.PI * k) / CIRCLE_SIDES)]);
      rings.push(ring);
      continue;
    }
    if (s.pieces.length === 0) continue;
    const st = startOf(s.pieces[0]);
    const ring: Ring = [[st.x, st.y]];
    for (const p of s.pieces) for (const q of samplePoints(p)) ring.push([q.x, q.y]);
    rings.push(ring);
  }
  return rings;
}

/**
 * Read one layer's mask outlines as centreline pieces.
 * @param shapes closed paths and circles of one channel layer, drawing units.
 * @param stepUnits optional sampling step (drawing units); by default derived from the smallest width.
 * @returns line pieces with widths, the medial axis result (tolerances, regions, holes) and the rings.
 */
export function readOutlineLayer(shapes: (PathEntity | CircleEntity)[], stepUnits?: number): OutlineLayerResult {
  const rings = ringsOf(shapes);
  const axis = extractMedialAxis(rings, stepUnits);
  const pieces: LinePiece[] = [];
  const curveRadii: (number | null)[] = [];
  for (const path of axis.paths) {
    const bend = bendRadius(path.points, path.radii);
    for (let i = 0; i + 1 < path.points.length; i++) {
      const [x0, y0] = path.points[i];
      const [x1, y1] = path.points[i + 1];
      if (x0 === x1 && y0 === y1) continue;
      pieces.push({ kind: "line", x0, y0, x1, y1, w0: 2 * path.radii[i], w1: 2 * path.radii[i + 1] });
      curveRadii.push(bend);
    }
  }
  return { pieces, curveRadii, axis, rings };
}

const dist = (a: [number, number], b: [number, number]) => Math.sqrt((b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2);

/** Circumradius of three points (plane geometry: R = abc / 4·area). */
function circumradius(a: [number, number], b: [number, number], c: [number, number]): number {
  const ab = dist(a, b);
  const bc = dist(b, c);
  const ca = dist(c, a);
  const area2 = Math.abs((b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]));
  return area2 === 0 ? Infinity : (ab * bc * ca) / (2 * area2);
}

/**
 * Smallest bend radius along a centreline from consecutive point triples, leaving out the first and last
 * two local radii of the path (where it turns into a junction or ends); null when straight (radius above
 * 1000 local widths).
 */
function bendRadius(points: [number, number][], radii: number[]): number | null {
  const s = [0];
  for (let i = 1; i < points.length; i++) s.push(s[i - 1] + dist(points[i - 1], points[i]));
  const total = s.at(-1)!;
  let min = Infinity;
  for (let i = 1; i + 1 < points.length; i++) {
    const margin = 2 * radii[i];
    if (s[i - 1] < margin || total - s[i + 1] < margin) continue;
    const r = circumradius(points[i - 1], points[i], points[i + 1]);
    if (r < 1000 * 2 * radii[i]) min = Math.min(min, r);
  }
  return Number.isFinite(min) ? min : null;
}
