/**
 * Plane geometry for the fabrication rules: distances between polylines and to
 * polygon edges, point-in-polygon, and a uniform grid to find neighbours.
 * Written here because the checks need only these few primitives on plain
 * coordinate arrays; the tests compare them with Shapely.
 */

export type Pt = [number, number];

/** Distance from point p to the segment ab. */
export function pointSegmentDistance(p: Pt, a: Pt, b: Pt): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  let t = len2 > 0 ? ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2 : 0;
  t = Math.max(0, Math.min(1, t));
  return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy));
}

function orient(a: Pt, b: Pt, c: Pt): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

function segmentsIntersect(a: Pt, b: Pt, c: Pt, d: Pt): boolean {
  const o1 = orient(a, b, c);
  const o2 = orient(a, b, d);
  const o3 = orient(c, d, a);
  const o4 = orient(c, d, b);
  return ((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0));
}

/** Shortest distance between segments ab and cd (0 when they cross). */
export function segmentSegmentDistance(a: Pt, b: Pt, c: Pt, d: Pt): number {
  if (segmentsIntersect(a, b, c, d)) return 0;
  return Math.min(pointSegmentDistance(a, c, d), pointSegmentDistance(b, c, d), pointSegmentDistance(c, a, b), pointSegmentDistance(d, a, b));
}

/** Shortest distance between two polylines. */
export function polylineDistance(p: Pt[], q: Pt[]): number {
  let best = Infinity;
  for (let i = 0; i + 1 < p.length; i++) for (let j = 0; j + 1 < q.length; j++) best = Math.min(best, segmentSegmentDistance(p[i], p[i + 1], q[j], q[j + 1]));
  return best;
}

/** Even–odd point-in-polygon test (ring may be open or closed). */
export function pointInPolygon(p: Pt, ring: Pt[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Shortest distance from a polyline to a polygon's boundary. */
export function polylineToRingDistance(p: Pt[], ring: Pt[]): number {
  const closed = ring.length > 1 && (ring[0][0] !== ring[ring.length - 1][0] || ring[0][1] !== ring[ring.length - 1][1]) ? [...ring, ring[0]] : ring;
  if (p.length === 1) {
    let best = Infinity;
    for (let j = 0; j + 1 < closed.length; j++) best = Math.min(best, pointSegmentDistance(p[0], closed[j], closed[j + 1]));
    return best;
  }
  return polylineDistance(p, closed);
}

/** Uniform grid over axis-aligned boxes: returns candidate pairs (i < j) whose boxes, grown by `reachM`, share a cell. */
export function candidatePairs(boxes: { minX: number; minY: number; maxX: number; maxY: number }[], reachM: number, cellM: number): [number, number][] {
  const cells = new Map<number, number[]>();
  // Numeric cell keys (x·2²⁶ + y, both offset to be positive) are much faster than strings.
  let gx0 = Infinity;
  let gy0 = Infinity;
  for (const b of boxes) {
    gx0 = Math.min(gx0, b.minX - reachM);
    gy0 = Math.min(gy0, b.minY - reachM);
  }
  boxes.forEach((b, i) => {
    const x0 = Math.floor((b.minX - reachM - gx0) / cellM);
    const x1 = Math.floor((b.maxX + reachM - gx0) / cellM);
    const y0 = Math.floor((b.minY - reachM - gy0) / cellM);
    const y1 = Math.floor((b.maxY + reachM - gy0) / cellM);
    for (let x = x0; x <= x1; x++) {
      for (let y = y0; y <= y1; y++) {
        const key = x * 67108864 + y;
        const list = cells.get(key);
        if (list) list.push(i);
        else cells.set(key, [i]);
      }
    }
  });
  const seen = new Set<number>();
  const out: [number, number][] = [];
  const n = boxes.length;
  for (const list of cells.values()) {
    for (let a = 0; a < list.length; a++) {
      for (let b = a + 1; b < list.length; b++) {
        const i = Math.min(list[a], list[b]);
        const j = Math.max(list[a], list[b]);
        const key = i * n + j;
        if (seen.has(key)) continue;
        seen.add(key);
        const A = boxes[i];
        const B = boxes[j];
        if (A.minX - reachM > B.maxX || B.minX - reachM > A.maxX || A.minY - reachM > B.maxY || B.minY - reachM > A.maxY) continue;
        out.push([i, j]);
      }
    }
  }
  return out;
}
