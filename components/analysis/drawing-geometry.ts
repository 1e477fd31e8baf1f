/**
 * Geometry of the chip drawing: drawing coordinates are micrometres with y
 * pointing down (SVG/canvas), i.e. X = x_m·1e6, Y = −y_m·1e6, so a 20 mm die is
 * 20,000 units wide and float precision is never an issue at any zoom.
 */
import { quadtree, type Quadtree } from "d3-quadtree";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";

export const UM_PER_M = 1e6;

export function toDrawing(xM: number, yM: number): [number, number] {
  return [xM * UM_PER_M, -yM * UM_PER_M];
}

/** SVG path data of a segment's centreline in drawing units. */
export function pathData(path: [number, number][]): string {
  let d = "";
  for (let i = 0; i < path.length; i++) {
    const [x, y] = toDrawing(path[i][0], path[i][1]);
    d += `${i === 0 ? "M" : "L"}${round(x)},${round(y)}`;
  }
  return d;
}

function round(v: number): number {
  return Math.round(v * 100) / 100;
}

/** Drawn stroke width in drawing units: the mean of the end widths (tapers are drawn at their mean). */
export function strokeWidthUm(seg: AnalyzeSegmentJson): number {
  return ((seg.width_m + seg.end_width_m) / 2) * UM_PER_M;
}

/** A point halfway along the centreline, in metres (for markers and labels). */
export function midpointM(path: [number, number][]): [number, number] {
  if (path.length === 0) return [0, 0];
  if (path.length === 1) return path[0];
  let total = 0;
  for (let i = 1; i < path.length; i++) total += Math.hypot(path[i][0] - path[i - 1][0], path[i][1] - path[i - 1][1]);
  let left = total / 2;
  for (let i = 1; i < path.length; i++) {
    const l = Math.hypot(path[i][0] - path[i - 1][0], path[i][1] - path[i - 1][1]);
    if (l >= left && l > 0) {
      const f = left / l;
      return [path[i - 1][0] + f * (path[i][0] - path[i - 1][0]), path[i - 1][1] + f * (path[i][1] - path[i - 1][1])];
    }
    left -= l;
  }
  return path[path.length - 1];
}

export interface ViewBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** Bounds of everything drawn, in drawing units (y already flipped). */
export function drawingBounds(analysis: AnalyzeJson): ViewBox {
  const b = analysis.bounds_m;
  let minX = b.min_x * UM_PER_M;
  let maxX = b.max_x * UM_PER_M;
  let minY = -b.max_y * UM_PER_M;
  let maxY = -b.min_y * UM_PER_M;
  if (!(maxX > minX) || !(maxY > minY)) {
    minX = minY = Infinity;
    maxX = maxY = -Infinity;
    for (const s of analysis.segments)
      for (const [xm, ym] of s.path_m) {
        const [x, y] = toDrawing(xm, ym);
        minX = Math.min(minX, x);
        maxX = Math.max(maxX, x);
        minY = Math.min(minY, y);
        maxY = Math.max(maxY, y);
      }
    if (!Number.isFinite(minX)) return { minX: 0, minY: 0, maxX: 1000, maxY: 1000 };
  }
  const pad = Math.max(maxX - minX, maxY - minY) * 0.03 || 100;
  return { minX: minX - pad, minY: minY - pad, maxX: maxX + pad, maxY: maxY + pad };
}

/** Scale and translation that fit `box` into a width×height viewport, centred. */
export function fitTransform(box: ViewBox, width: number, height: number): { k: number; x: number; y: number } {
  const w = box.maxX - box.minX;
  const h = box.maxY - box.minY;
  const k = Math.min(width / w, height / h);
  return { k, x: (width - k * w) / 2 - k * box.minX, y: (height - k * h) / 2 - k * box.minY };
}

interface Sample {
  x: number;
  y: number;
  i: number;
}

export interface HitIndex {
  tree: Quadtree<Sample>;
  spacing: number;
  maxHalfWidth: number;
}

/**
 * A d3-quadtree of points sampled along every centreline (spacing in drawing
 * units), so a pointer position finds its candidate segments without a scan.
 */
export function buildHitIndex(segments: AnalyzeSegmentJson[], box: ViewBox): HitIndex {
  const diag = Math.hypot(box.maxX - box.minX, box.maxY - box.minY);
  // Coarse sampling is enough: hitSegment widens its search by the spacing and measures exactly.
  const spacing = Math.max(diag / 400, 1);
  const pts: Sample[] = [];
  let maxHalfWidth = 0;
  segments.forEach((s, i) => {
    maxHalfWidth = Math.max(maxHalfWidth, strokeWidthUm(s) / 2);
    const p = s.path_m.map(([x, y]) => toDrawing(x, y));
    if (p.length === 1) pts.push({ x: p[0][0], y: p[0][1], i });
    for (let j = 1; j < p.length; j++) {
      const [x0, y0] = p[j - 1];
      const [x1, y1] = p[j];
      const n = Math.max(1, Math.ceil(Math.hypot(x1 - x0, y1 - y0) / spacing));
      for (let k = j === 1 ? 0 : 1; k <= n; k++) pts.push({ x: x0 + ((x1 - x0) * k) / n, y: y0 + ((y1 - y0) * k) / n, i });
    }
  });
  const tree = quadtree<Sample>().x((d) => d.x).y((d) => d.y).addAll(pts);
  return { tree, spacing, maxHalfWidth };
}

function distanceToPolyline(x: number, y: number, p: [number, number][]): number {
  let best = Infinity;
  for (let j = 1; j < p.length; j++) {
    const [ax, ay] = toDrawing(p[j - 1][0], p[j - 1][1]);
    const [bx, by] = toDrawing(p[j][0], p[j][1]);
    const dx = bx - ax;
    const dy = by - ay;
    const l2 = dx * dx + dy * dy;
    const t = l2 > 0 ? Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / l2)) : 0;
    best = Math.min(best, Math.hypot(x - (ax + t * dx), y - (ay + t * dy)));
  }
  if (p.length === 1) {
    const [ax, ay] = toDrawing(p[0][0], p[0][1]);
    best = Math.hypot(x - ax, y - ay);
  }
  return best;
}

/**
 * The segment under a point (drawing units): the nearest whose channel edge is
 * within `slack` units, or -1. Candidates come from the quadtree, the distance
 * is exact to the polyline.
 */
export function hitSegment(index: HitIndex, segments: AnalyzeSegmentJson[], x: number, y: number, slack: number): number {
  const r = index.spacing + index.maxHalfWidth + slack;
  const candidates = new Set<number>();
  index.tree.visit((node, x0, y0, x1, y1) => {
    if (!node.length) {
      let leaf: typeof node | undefined = node;
      while (leaf) {
        const d = (leaf as { data: Sample }).data;
        if (Math.abs(d.x - x) <= r && Math.abs(d.y - y) <= r) candidates.add(d.i);
        leaf = (leaf as { next?: typeof node }).next;
      }
    }
    return x0 > x + r || x1 < x - r || y0 > y + r || y1 < y - r;
  });
  let best = -1;
  let bestD = Infinity;
  for (const i of candidates) {
    const d = distanceToPolyline(x, y, segments[i].path_m) - strokeWidthUm(segments[i]) / 2;
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  return bestD <= slack ? best : -1;
}
