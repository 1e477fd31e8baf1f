/**
 * Flattening of free-form curves (NURBS splines, ellipse arcs) into polylines
 * within a chord tolerance. Written here rather than taken from a package
 * because no NURBS package is installed and de Boor's algorithm is short.
 */

export interface Pt {
  x: number;
  y: number;
}

const MAX_DEPTH = 14;
/** Most points one flattened curve may produce; beyond it refinement stops (a hostile or broken file cannot stall the reader). */
export const MAX_CURVE_POINTS = 100_000;

/** Index of the knot span containing t (p ≤ span < n), by binary search. */
function findSpan(knots: number[], p: number, n: number, t: number): number {
  if (t >= knots[n]) return n - 1;
  if (t <= knots[p]) return p;
  let lo = p;
  let hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t < knots[mid]) hi = mid;
    else lo = mid;
  }
  return lo;
}

/** Point on a (rational) B-spline at parameter t — de Boor's algorithm in homogeneous coordinates (de Boor, "A Practical Guide to Splines", 1978). */
export function evaluateNurbs(ctrl: Pt[], weights: number[], knots: number[], p: number, t: number): Pt {
  const n = ctrl.length;
  const k = findSpan(knots, p, n, t);
  const dx: number[] = [];
  const dy: number[] = [];
  const dw: number[] = [];
  for (let j = 0; j <= p; j++) {
    const i = j + k - p;
    const w = weights[i] ?? 1;
    dx.push(ctrl[i].x * w);
    dy.push(ctrl[i].y * w);
    dw.push(w);
  }
  for (let r = 1; r <= p; r++) {
    for (let j = p; j >= r; j--) {
      const i = j + k - p;
      const denom = knots[i + p - r + 1] - knots[i];
      const a = denom === 0 ? 0 : (t - knots[i]) / denom;
      dx[j] = (1 - a) * dx[j - 1] + a * dx[j];
      dy[j] = (1 - a) * dy[j - 1] + a * dy[j];
      dw[j] = (1 - a) * dw[j - 1] + a * dw[j];
    }
  }
  return { x: dx[p] / dw[p], y: dy[p] / dw[p] };
}

function chordDeviation(a: Pt, b: Pt, m: Pt): number {
  const ux = b.x - a.x;
  const uy = b.y - a.y;
  const len = Math.hypot(ux, uy);
  if (len === 0) return Math.hypot(m.x - a.x, m.y - a.y);
  return Math.abs((m.x - a.x) * uy - (m.y - a.y) * ux) / len;
}

/** Adaptive flattening of a parametric curve on [t0, t1] so no chord strays more than tol from the curve (checked at chord midpoints and quarter points). */
export function flattenParametric(f: (t: number) => Pt, t0: number, t1: number, tol: number, initialSteps: number, maxPoints = MAX_CURVE_POINTS): Pt[] {
  const out: Pt[] = [f(t0)];
  const steps = Math.max(1, initialSteps);
  const refine = (ta: number, a: Pt, tb: number, b: Pt, depth: number) => {
    const tm = (ta + tb) / 2;
    const m = f(tm);
    const q1 = f((ta + tm) / 2);
    const q3 = f((tm + tb) / 2);
    const dev = Math.max(chordDeviation(a, b, m), chordDeviation(a, b, q1), chordDeviation(a, b, q3));
    if (dev <= tol || depth >= MAX_DEPTH || out.length >= maxPoints) {
      out.push(b);
      return;
    }
    refine(ta, a, tm, m, depth + 1);
    refine(tm, m, tb, b, depth + 1);
  };
  let prevT = t0;
  let prev = out[0];
  for (let s = 1; s <= steps; s++) {
    const t = t0 + ((t1 - t0) * s) / steps;
    const p = f(t);
    refine(prevT, prev, t, p, 0);
    prevT = t;
    prev = p;
  }
  return out;
}

/**
 * Flatten a NURBS curve (control points, weights, knot vector, degree) to a polyline within tol.
 * @returns null when the data does not describe a valid B-spline.
 */
export function flattenNurbs(ctrl: Pt[], weights: number[], knots: number[], degree: number, tol: number): Pt[] | null {
  const n = ctrl.length;
  const p = degree;
  if (p < 1 || n < p + 1 || knots.length !== n + p + 1) return null;
  for (let i = 1; i < knots.length; i++) if (!(knots[i] >= knots[i - 1])) return null;
  const t0 = knots[p];
  const t1 = knots[n];
  if (!(t1 > t0)) return null;
  const spans = new Set<number>();
  for (let i = p; i <= n; i++) spans.add(knots[i]);
  const breaks = [...spans].sort((a, b) => a - b);
  const out: Pt[] = [];
  // The point budget is shared by the knot spans, so every span is drawn even when the budget binds.
  const perSpan = Math.max(16, Math.floor(MAX_CURVE_POINTS / Math.max(1, breaks.length - 1)));
  for (let i = 0; i + 1 < breaks.length; i++) {
    const part = flattenParametric((t) => evaluateNurbs(ctrl, weights, knots, p, t), breaks[i], breaks[i + 1], tol, 4, perSpan);
    if (out.length > 0) part.shift();
    out.push(...part);
  }
  return out;
}

/** Radius of the circle through three points, R = abc / (4·area) (the triangle's circumradius); Infinity when collinear. */
export function circumradius(a: Pt, b: Pt, c: Pt): number {
  const ab = Math.hypot(b.x - a.x, b.y - a.y);
  const bc = Math.hypot(c.x - b.x, c.y - b.y);
  const ca = Math.hypot(a.x - c.x, a.y - c.y);
  const cross = Math.abs((b.x - a.x) * (c.y - a.y) - (b.y - a.y) * (c.x - a.x));
  if (cross <= 1e-12 * ab * bc) return Infinity;
  return (ab * bc * ca) / (2 * cross);
}

/** Smallest circumradius over consecutive point triples of a finely flattened curve: its smallest radius of curvature, approximately. */
export function minRadiusOfPolyline(pts: Pt[]): number | null {
  let min = Infinity;
  for (let i = 1; i + 1 < pts.length; i++) min = Math.min(min, circumradius(pts[i - 1], pts[i], pts[i + 1]));
  return Number.isFinite(min) ? min : null;
}
