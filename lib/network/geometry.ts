/**
 * Plane geometry of centreline pieces (lines and circular arcs) in drawing
 * units: lengths, points by length fraction, projection, intersections,
 * splitting and sampling. Written here because the few operations the
 * topology needs on exact arcs are not what general polygon packages offer.
 */
import type { ArcPiece, LinePiece, Piece } from "../dxf/types";

export interface Pt {
  x: number;
  y: number;
}

const TAU = 2 * Math.PI;

/** Length of a line (Euclid) or an arc (r·|sweep|). */
export function pieceLength(p: Piece): number {
  if (p.kind === "arc") return p.r * Math.abs(p.sweep);
  const dx = p.x1 - p.x0;
  const dy = p.y1 - p.y0;
  return Math.sqrt(dx * dx + dy * dy);
}

/** Point at length fraction t ∈ [0, 1]. */
export function pointAt(p: Piece, t: number): Pt {
  if (p.kind === "line") return { x: p.x0 + (p.x1 - p.x0) * t, y: p.y0 + (p.y1 - p.y0) * t };
  const a = p.a0 + p.sweep * t;
  return { x: p.cx + p.r * Math.cos(a), y: p.cy + p.r * Math.sin(a) };
}

export const startOf = (p: Piece): Pt => pointAt(p, 0);
export const endOf = (p: Piece): Pt => pointAt(p, 1);

/** The same piece run the other way. */
export function reversed(p: Piece): Piece {
  if (p.kind === "line") return { ...p, x0: p.x1, y0: p.y1, x1: p.x0, y1: p.y0, w0: p.w1, w1: p.w0 };
  return { ...p, a0: p.a0 + p.sweep, sweep: -p.sweep, w0: p.w1, w1: p.w0 };
}

/** Sub-piece between length fractions ta < tb; drawn widths interpolated linearly. */
export function subPiece(p: Piece, ta: number, tb: number): Piece {
  const w = (t: number) => (p.w0 === null || p.w1 === null ? (p.w0 ?? p.w1) : p.w0 + (p.w1 - p.w0) * t);
  if (p.kind === "line") {
    const a = pointAt(p, ta);
    const b = pointAt(p, tb);
    return { kind: "line", x0: a.x, y0: a.y, x1: b.x, y1: b.y, w0: w(ta), w1: w(tb) };
  }
  return { kind: "arc", cx: p.cx, cy: p.cy, r: p.r, a0: p.a0 + p.sweep * ta, sweep: p.sweep * (tb - ta), w0: w(ta), w1: w(tb) };
}

/** Axis-aligned bounds [minX, minY, maxX, maxY]. */
export function bboxOf(p: Piece): [number, number, number, number] {
  if (p.kind === "line") return [Math.min(p.x0, p.x1), Math.min(p.y0, p.y1), Math.max(p.x0, p.x1), Math.max(p.y0, p.y1)];
  const s = startOf(p);
  const e = endOf(p);
  let minX = Math.min(s.x, e.x);
  let minY = Math.min(s.y, e.y);
  let maxX = Math.max(s.x, e.x);
  let maxY = Math.max(s.y, e.y);
  for (let k = 0; k < 4; k++) {
    const ang = (k * Math.PI) / 2;
    if (arcFraction(p, ang) !== null) {
      const x = p.cx + p.r * Math.cos(ang);
      const y = p.cy + p.r * Math.sin(ang);
      minX = Math.min(minX, x); maxX = Math.max(maxX, x);
      minY = Math.min(minY, y); maxY = Math.max(maxY, y);
    }
  }
  return [minX, minY, maxX, maxY];
}

/**
 * Axis-aligned bounds written into out[at … at+3] (minX, minY, maxX, maxY), grown by `pad`; the same
 * box as bboxOf without allocating for lines (hot loops over 20k+ pieces).
 */
export function bboxInto(p: Piece, out: Float64Array, at: number, pad: number): void {
  if (p.kind === "line") {
    out[at] = Math.min(p.x0, p.x1) - pad;
    out[at + 1] = Math.min(p.y0, p.y1) - pad;
    out[at + 2] = Math.max(p.x0, p.x1) + pad;
    out[at + 3] = Math.max(p.y0, p.y1) + pad;
    return;
  }
  const b = bboxOf(p);
  out[at] = b[0] - pad;
  out[at + 1] = b[1] - pad;
  out[at + 2] = b[2] + pad;
  out[at + 3] = b[3] + pad;
}

/** Length fraction of polar angle `ang` on an arc, or null when the angle is outside the arc. */
export function arcFraction(p: ArcPiece, ang: number): number | null {
  let d = p.sweep >= 0 ? ang - p.a0 : p.a0 - ang;
  d = ((d % TAU) + TAU) % TAU;
  const t = d / Math.abs(p.sweep);
  if (t <= 1 + 1e-12) return Math.min(1, t);
  // Angles just below the start wrap to ≈ 2π; treat a hair before the start as the start.
  if (TAU - d < 1e-12) return 0;
  return null;
}

/** Closest point of the piece to (x, y): its length fraction and distance. */
export function project(p: Piece, x: number, y: number): { t: number; dist: number } {
  if (p.kind === "line") {
    const dx = p.x1 - p.x0;
    const dy = p.y1 - p.y0;
    const l2 = dx * dx + dy * dy;
    const t = l2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - p.x0) * dx + (y - p.y0) * dy) / l2));
    return { t, dist: Math.hypot(x - (p.x0 + dx * t), y - (p.y0 + dy * t)) };
  }
  const f = arcFraction(p, Math.atan2(y - p.cy, x - p.cx));
  if (f !== null) return { t: f, dist: Math.abs(Math.hypot(x - p.cx, y - p.cy) - p.r) };
  const s = startOf(p);
  const e = endOf(p);
  const ds = Math.hypot(x - s.x, y - s.y);
  const de = Math.hypot(x - e.x, y - e.y);
  return ds <= de ? { t: 0, dist: ds } : { t: 1, dist: de };
}

/** Fractions (on a line of direction d from o) where it meets the circle (c, r). */
function lineCircleParams(ox: number, oy: number, dx: number, dy: number, cx: number, cy: number, r: number): number[] {
  const fx = ox - cx;
  const fy = oy - cy;
  const a = dx * dx + dy * dy;
  const b = 2 * (fx * dx + fy * dy);
  const c = fx * fx + fy * fy - r * r;
  const disc = b * b - 4 * a * c;
  if (a === 0 || disc < 0) return [];
  const sq = Math.sqrt(disc);
  return disc === 0 ? [-b / (2 * a)] : [(-b - sq) / (2 * a), (-b + sq) / (2 * a)];
}

/** Points where two circles meet (none when concentric or apart). */
function circleCircle(ax: number, ay: number, ar: number, bx: number, by: number, br: number): Pt[] {
  const dx = bx - ax;
  const dy = by - ay;
  const d = Math.hypot(dx, dy);
  if (d === 0 || d > ar + br || d < Math.abs(ar - br)) return [];
  const a = (ar * ar - br * br + d * d) / (2 * d);
  const h = Math.sqrt(Math.max(0, ar * ar - a * a));
  const mx = ax + (dx * a) / d;
  const my = ay + (dy * a) / d;
  if (h === 0) return [{ x: mx, y: my }];
  return [
    { x: mx - (dy * h) / d, y: my + (dx * h) / d },
    { x: mx + (dy * h) / d, y: my - (dx * h) / d },
  ];
}

const EPS_T = 1e-12;
const inUnit = (t: number) => t >= -EPS_T && t <= 1 + EPS_T;
const clamp01 = (t: number) => Math.max(0, Math.min(1, t));

/** Where two pieces meet: pairs of length fractions (t on p, u on q). Parallel and concentric overlaps give none. */
export function intersect(p: Piece, q: Piece): { t: number; u: number; x: number; y: number }[] {
  if (p.kind === "line" && q.kind === "line") return lineLine(p, q);
  if (p.kind === "line" && q.kind === "arc") return lineArc(p, q);
  if (p.kind === "arc" && q.kind === "line") return lineArc(q, p).map((h) => ({ t: h.u, u: h.t, x: h.x, y: h.y }));
  const a = p as ArcPiece;
  const b = q as ArcPiece;
  const out: { t: number; u: number; x: number; y: number }[] = [];
  for (const pt of circleCircle(a.cx, a.cy, a.r, b.cx, b.cy, b.r)) {
    const t = arcFraction(a, Math.atan2(pt.y - a.cy, pt.x - a.cx));
    const u = arcFraction(b, Math.atan2(pt.y - b.cy, pt.x - b.cx));
    if (t !== null && u !== null) out.push({ t, u, ...pt });
  }
  return out;
}

function lineLine(p: LinePiece, q: LinePiece) {
  const rx = p.x1 - p.x0;
  const ry = p.y1 - p.y0;
  const sx = q.x1 - q.x0;
  const sy = q.y1 - q.y0;
  const den = rx * sy - ry * sx;
  if (Math.abs(den) <= 1e-14 * Math.hypot(rx, ry) * Math.hypot(sx, sy)) return [];
  const qpx = q.x0 - p.x0;
  const qpy = q.y0 - p.y0;
  const t = (qpx * sy - qpy * sx) / den;
  const u = (qpx * ry - qpy * rx) / den;
  if (!inUnit(t) || !inUnit(u)) return [];
  const tc = clamp01(t);
  return [{ t: tc, u: clamp01(u), x: p.x0 + rx * tc, y: p.y0 + ry * tc }];
}

function lineArc(p: LinePiece, a: ArcPiece) {
  const out: { t: number; u: number; x: number; y: number }[] = [];
  const n = lineArcHits(p, a, hitScratch);
  for (let k = 0; k < n; k++) out.push({ t: hitScratch[4 * k], u: hitScratch[4 * k + 1], x: hitScratch[4 * k + 2], y: hitScratch[4 * k + 3] });
  return out;
}

const hitScratch = new Float64Array(8);

/**
 * Where a line meets an arc, without allocating (hot pair loops): writes (t on the line, u on the arc, x, y)
 * for each of at most two meeting points into out[4k … 4k+3] and returns how many.
 */
export function lineArcHits(p: LinePiece, a: ArcPiece, out: Float64Array): number {
  // The line–circle quadratic of lineCircleParams, roots in the same order.
  const dx = p.x1 - p.x0;
  const dy = p.y1 - p.y0;
  const fx = p.x0 - a.cx;
  const fy = p.y0 - a.cy;
  const qa = dx * dx + dy * dy;
  const qb = 2 * (fx * dx + fy * dy);
  const qc = fx * fx + fy * fy - a.r * a.r;
  const disc = qb * qb - 4 * qa * qc;
  if (qa === 0 || disc < 0) return 0;
  const sq = Math.sqrt(disc);
  const roots = disc === 0 ? 1 : 2;
  let n = 0;
  for (let k = 0; k < roots; k++) {
    const t = roots === 1 ? -qb / (2 * qa) : k === 0 ? (-qb - sq) / (2 * qa) : (-qb + sq) / (2 * qa);
    if (!inUnit(t)) continue;
    const x = p.x0 + dx * t;
    const y = p.y0 + dy * t;
    const u = arcFraction(a, Math.atan2(y - a.cy, x - a.cx));
    if (u === null) continue;
    out[4 * n] = clamp01(t);
    out[4 * n + 1] = u;
    out[4 * n + 2] = x;
    out[4 * n + 3] = y;
    n++;
  }
  return n;
}

/** Length fractions where a piece crosses the circle (c, r), sorted. */
export function circleCrossings(p: Piece, cx: number, cy: number, r: number): number[] {
  if (p.kind === "line") return lineCircleParams(p.x0, p.y0, p.x1 - p.x0, p.y1 - p.y0, cx, cy, r).filter(inUnit).map(clamp01).sort((a, b) => a - b);
  const out: number[] = [];
  for (const pt of circleCircle(p.cx, p.cy, p.r, cx, cy, r)) {
    const t = arcFraction(p, Math.atan2(pt.y - p.cy, pt.x - p.cx));
    if (t !== null) out.push(t);
  }
  return out.sort((a, b) => a - b);
}

/** Points for drawing, excluding the start point: arcs every ≤ 5° (and ≥ 2 steps), lines their end. */
export function samplePoints(p: Piece): Pt[] {
  if (p.kind === "line") return [{ x: p.x1, y: p.y1 }];
  const n = Math.max(2, Math.ceil(Math.abs(p.sweep) / (Math.PI / 36)));
  const pts: Pt[] = [];
  for (let i = 1; i <= n; i++) pts.push(pointAt(p, i / n));
  return pts;
}
