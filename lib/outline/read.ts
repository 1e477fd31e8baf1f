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
  for (const path of axis.paths) {
    for (let i = 0; i + 1 < path.points.length; i++) {
      const [x0, y0] = path.points[i];
      const [x1, y1] = path.points[i + 1];
      if (x0 === x1 && y0 === y1) continue;
      pieces.push({ kind: "line", x0, y0, x1, y1, w0: 2 * path.radii[i], w1: 2 * path.radii[i + 1] });
    }
  }
  return { pieces, axis, rings };
}
