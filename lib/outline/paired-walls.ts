/**
 * Centrelines of a mask drawn as straight channels between parallel walls,
 * read without sampling: each wall is paired with the antiparallel wall it
 * faces, the stretch between them is a straight channel of constant width
 * whose centreline is the midline, and the stretches' ends are joined where
 * their centrelines meet. A mask of straight channels, mitred bends, bends
 * drawn as arcs (their chords pair up), T and cross junctions and flat or
 * round dead ends (most photomasks) is read this way in a few operations per
 * wall.
 *
 * Every step checks what it assumes, and any region the pairing does not
 * explain in full (a chamber, a taper, a post in a channel, a jog, shapes
 * that overlap) returns null so the caller falls back to the Voronoi medial
 * axis (medial-axis.ts). Own code: no package we use pairs walls; it is plane
 * geometry on the wall segments in a grid (region.ts WallGrid).
 */
import { PRUNE_FACTOR, WIDTH_TOLERANCE, type CentrelinePath, type MedialAxisResult } from "./medial-axis";
import { circumradius, segDist2, type WallGrid } from "./region";
import { douglasPeucker } from "./simplify";
import { grownCopy } from "../typed-arrays";

/** A wall's ray may pair it with another whose direction is this close to opposite (sine of the angle): a coarse filter. */
const PARALLEL_SIN = 1e-3;
/**
 * Two walls are parallel where their distance changes by less than this fraction over their overlap: coordinates
 * rounded to a drawing grid (1 nm on a 50 µm channel at any angle) pass, a taper of 0.5 % (WIDTH_TOLERANCE) does not.
 */
const PARALLEL_TOLERANCE = 1e-4;
/** Points this close to a line, in half-widths, are on it (coordinates rounded to the drawing grid). */
const ON_LINE = 1e-4;
/**
 * A stretch is a channel only where no other wall comes nearer its midline than its half-width, less this
 * fraction (tessellated round caps and bends come within 0.1 % of it at 5° steps).
 */
const CLEARANCE_SLACK = 0.01;
/** A joint (junction, bend, dead end) reaches at most this many of its widest half-widths from its centre. */
export const JOINT_REACH = 2.5;
/** Centrelines meeting at a joint: within this fraction of the smallest width of the joint's centre. */
const MEET_TOLERANCE = 1e-3;

export interface PairedWallsOptions {
  /** Samples per smallest width of the Voronoi reader: the tolerance step is stated on the same scale. */
  samplesPerWidth: number;
}

/**
 * Read the filled area of non-touching rings as straight channels between parallel walls.
 * @param prep the rings' containment depths (region.ts orientFlat: rings oriented with the filled side on the
 *   left, no two touching, whose edges these are).
 * @param edges the rings' edges, x0 y0 x1 y1 each, ring by ring; ringEdgeStart[r] is ring r's first edge.
 * @param grid the same edges in a grid.
 * @returns the centreline paths (split at junctions and dead ends, half-widths along them), or null where the
 *   walls are not all explained by facing pairs; drawing units.
 */
export function readPairedWalls(prep: { depth: number[] }, edges: Float64Array, ringEdgeStart: Int32Array, grid: WallGrid, options: PairedWallsOptions): MedialAxisResult | null {
  const nE = edges.length / 4;
  if (nE === 0) return null;
  const ux = new Float64Array(nE), uy = new Float64Array(nE), len = new Float64Array(nE);
  for (let e = 0; e < nE; e++) {
    const dx = edges[4 * e + 2] - edges[4 * e], dy = edges[4 * e + 3] - edges[4 * e + 1];
    const l = Math.sqrt(dx * dx + dy * dy);
    if (!(l > 0)) return null;
    len[e] = l;
    ux[e] = dx / l;
    uy[e] = dy / l;
  }
  const extent = Math.max(grid.width, grid.height);
  const near: number[] = [];

  // 1. Pairs: the wall each edge's midpoint faces (a ray along its inward normal), kept when antiparallel.
  const hit = new Int32Array(nE).fill(-1);
  for (let a = 0; a < nE; a++) {
    const px = (edges[4 * a] + edges[4 * a + 2]) / 2, py = (edges[4 * a + 1] + edges[4 * a + 3]) / 2;
    const nx = -uy[a], ny = ux[a];
    const b = firstHit(grid, edges, a, px, py, nx, ny, extent, near);
    if (b < 0) return null;
    if (Math.abs(ux[a] * uy[b] - uy[a] * ux[b]) <= PARALLEL_SIN && ux[a] * ux[b] + uy[a] * uy[b] < 0) hit[a] = b;
  }
  // Each pair (lo, hi), lo < hi, found from either side, once, in order of lo then hi: grouped by lo with the same
  // counting sort as the joints (bucket), each group (one or two pairs as a rule) put in order by insertion.
  let nP = 0;
  for (let a = 0; a < nE; a++) if (hit[a] >= 0) nP++;
  const pairLo = new Int32Array(nP), pairHi = new Int32Array(nP);
  for (let a = 0, k = 0; a < nE; a++) {
    if (hit[a] < 0) continue;
    pairLo[k] = Math.min(a, hit[a]);
    pairHi[k++] = Math.max(a, hit[a]);
  }
  const [loStart, byLo] = bucket(pairLo, nE);
  const his = Int32Array.from(byLo, (k) => pairHi[k]);

  // 2. Stretches: the overlap of each pair, kept where nothing else comes within the half-width of its midline.
  const st = new StretchList(his.length);
  for (let lo = 0; lo < nE; lo++) {
    const k0 = loStart[lo], k1 = loStart[lo + 1];
    for (let k = k0 + 1; k < k1; k++) {
      for (let j = k; j > k0 && his[j - 1] > his[j]; j--) {
        const t = his[j];
        his[j] = his[j - 1];
        his[j - 1] = t;
      }
    }
    for (let k = k0; k < k1; k++) if (k === k0 || his[k] !== his[k - 1]) st.tryPair(edges, ux, uy, len, lo, his[k], grid, near);
  }
  const nS = st.n;
  if (nS === 0) return null;

  // 3. Walk each ring: the wall between one stretch's end and the next stretch's start joins those two ends.
  const intervals = wallIntervals(st, nE);
  if (!intervals) return null;
  const { order, iStart } = intervals;
  const parent = new Int32Array(2 * nS);
  for (let i = 0; i < parent.length; i++) parent[i] = i;
  const find = (x: number): number => {
    while (parent[x] !== x) x = parent[x] = parent[parent[x]];
    return x;
  };
  const selfJoined = new Uint8Array(2 * nS);
  // Gaps: the end each leaves from, and the wall points along it (x y pairs) from gapStart[g] to gapStart[g + 1].
  // One gap per wall interval; its points are its two interval ends and the ring vertices between (each vertex in
  // about one gap), so the columns are sized once (the points grown if ever needed).
  const gapEnd = new Int32Array(2 * nS);
  const gapStart = new Int32Array(2 * nS + 1);
  let gapPts = new Float64Array(2 * (4 * nS + nE) + 8);
  let nGaps = 0, nPts = 0;
  const put = (x: number, y: number) => {
    if (nPts + 2 > gapPts.length) gapPts = grownCopy(gapPts, 2 * gapPts.length);
    gapPts[nPts++] = x;
    gapPts[nPts++] = y;
  };
  const pushPoint = (iv: number, high: boolean) => {
    const e = st.ivEdge[iv];
    const t = high ? st.ivHi[iv] : st.ivLo[iv];
    put(edges[4 * e] + ux[e] * t, edges[4 * e + 1] + uy[e] * t);
  };
  const joinGap = (from: number, to: number, ring: number): void => {
    const x = st.hiEnd(from), y = st.loEnd(to);
    const rx = find(x), ry = find(y);
    if (x === y) selfJoined[x] = 1;
    if (rx !== ry) parent[rx] = ry;
    gapEnd[nGaps] = x;
    gapStart[nGaps++] = nPts;
    const ef = st.ivEdge[from], et = st.ivEdge[to];
    pushPoint(from, true);
    // The ring vertices between (none when both lie on one edge in order).
    if (!(ef === et && st.ivLo[to] >= st.ivHi[from])) {
      const e0 = ringEdgeStart[ring], e1 = ringEdgeStart[ring + 1];
      for (let e = ef, steps = 0; steps < e1 - e0; steps++) {
        e = e + 1 === e1 ? e0 : e + 1;
        put(edges[4 * e], edges[4 * e + 1]);
        if (e === et) break;
      }
    }
    pushPoint(to, false);
  };
  const nRings = ringEdgeStart.length - 1;
  for (let r = 0; r < nRings; r++) {
    let first = -1, last = -1;
    for (let e = ringEdgeStart[r]; e < ringEdgeStart[r + 1]; e++) {
      for (let q = iStart[e]; q < iStart[e + 1]; q++) {
        const iv = order[q];
        if (last < 0) first = iv;
        else joinGap(last, iv, r);
        last = iv;
      }
    }
    if (first < 0) return null;
    joinGap(last, first, r);
  }
  gapStart[nGaps] = nPts;

  // 4. Joints: the ends each group joins, their centre where the centrelines meet, checked to stay local.
  const joints = new Joints(nS, find, gapEnd, gapStart, gapPts);
  let minR = Infinity;
  for (let s = 0; s < nS; s++) minR = Math.min(minR, st.r[s]);
  const tol = MEET_TOLERANCE * 2 * minR;
  const frame = new Float64Array(4);
  let junctions = 0, deadEnds = 0;
  for (let g = 0; g < joints.n; g++) {
    const k0 = joints.start[g], k1 = joints.start[g + 1];
    let px: number, py: number, reach: number;
    if (k1 - k0 === 1) {
      const x = joints.ends[k0];
      if (!selfJoined[x]) return null;
      // A dead end: on along the centreline to the end wall (flat: already there; round: one half-width on).
      st.endFrameInto(x, frame);
      const cx = frame[0], cy = frame[1], dx = frame[2], dy = frame[3];
      const t = joints.rayToWalls(g, cx, cy, dx, dy, tol);
      if (t === null) return null;
      px = cx + dx * t;
      py = cy + dy * t;
      joints.rMax[g] = st.r[x >> 1];
      reach = JOINT_REACH * joints.rMax[g];
      if (!joints.withinReach(g, cx, cy, reach)) return null;
      deadEnds++;
    } else {
      let rMax = 0;
      for (let k = k0; k < k1; k++) {
        if (selfJoined[joints.ends[k]]) return null;
        rMax = Math.max(rMax, st.r[joints.ends[k] >> 1]);
      }
      if (!meetingPoint(st, joints.ends, k0, k1, tol, frame)) return null;
      px = frame[0];
      py = frame[1];
      joints.rMax[g] = rMax;
      reach = JOINT_REACH * rMax;
      for (let k = k0; k < k1; k++) {
        st.endFrameInto(joints.ends[k], frame);
        if (Math.sqrt((px - frame[0]) ** 2 + (py - frame[1]) ** 2) > reach) return null;
      }
      if (!joints.withinReach(g, px, py, reach)) return null;
      if (k1 - k0 > 2) junctions++;
    }
    joints.x[g] = px;
    joints.y[g] = py;
  }

  // A dead end straight off a junction must outreach what the Voronoi reader prunes as a corner spur
  // (PRUNE_FACTOR junction radii, here the junction's widest half-width, plus its own): shorter, it is the side of
  // a chamber the junction sits in (a chamber fed through its long sides reads as a cross of squat arms otherwise).
  for (let x = 0; x < 2 * nS; x++) {
    if (joints.degree(x) !== 1 || joints.degree(x ^ 1) < 3) continue;
    const g = joints.of[x ^ 1], leaf = joints.of[x];
    const reach = Math.sqrt((joints.x[leaf] - joints.x[g]) ** 2 + (joints.y[leaf] - joints.y[g]) ** 2);
    if (!(reach > PRUNE_FACTOR * joints.rMax[g] + st.r[x >> 1])) return null;
  }

  // A stretch no longer than wide is a piece of a curved channel (a tessellated arc's chord): each of its ends
  // must be a bend on to a stretch of its own width. Anything else so squat (two walls facing across a chamber,
  // or past a post, with channels on either side; a taper's short sides facing each other, both dead ends) is
  // not a channel of its own.
  for (let s = 0; s < nS; s++) {
    if (st.length(s) > 2 * st.r[s]) continue;
    for (let x = 2 * s; x <= 2 * s + 1; x++) {
      if (joints.degree(x) !== 2) return null;
      const other = st.r[joints.other(x) >> 1];
      if (Math.abs(other - st.r[s]) > PARALLEL_TOLERANCE * st.r[s]) return null;
    }
  }

  // 5. Paths: from each junction or dead end along stretches through the bends (degree-2 joints) to the next.
  const paths = tracePaths(st, joints, minR);
  const holes = prep.depth.filter((d) => d % 2 === 1).length;
  const step = (2 * minR) / options.samplesPerWidth;
  return {
    method: "paired walls",
    paths,
    stepUnits: step,
    toleranceStepUnits: step,
    pruneLengthUnits: 0,
    minWidthUnits: 2 * minR,
    regions: prep.depth.length - holes,
    holes,
    notes: [
      `Every wall faces a parallel wall: ${nS} straight stretch(es) of constant width, joined at ${junctions} junction(s) and ${deadEnds} dead end(s) where their centrelines meet (within ${fmt(MEET_TOLERANCE * 100)} % of the smallest width); exact widths, no boundary sampling.`,
    ],
  };
}

/**
 * Stretch ends grouped into joints (junctions, bends, dead ends), with the wall gaps between them: ends of
 * joint g are ends[start[g] .. start[g + 1]), its gaps gaps[gapFrom[g] .. gapFrom[g + 1]); x, y its centre
 * and rMax its widest half-width, once the joints are checked.
 */
class Joints {
  readonly n: number;
  readonly of: Int32Array;
  readonly start: Int32Array;
  readonly ends: Int32Array;
  readonly gapFrom: Int32Array;
  readonly gaps: Int32Array;
  readonly x: Float64Array;
  readonly y: Float64Array;
  /** Widest half-width among the stretches ending at each joint. */
  readonly rMax: Float64Array;

  constructor(nS: number, find: (x: number) => number, gapEnd: Int32Array, readonly gapStart: Int32Array, readonly gapPts: Float64Array) {
    const nX = 2 * nS;
    const of = new Int32Array(nX).fill(-1);
    let n = 0;
    const rootGroup = new Int32Array(nX).fill(-1);
    for (let x = 0; x < nX; x++) {
      const r = find(x);
      if (rootGroup[r] < 0) rootGroup[r] = n++;
      of[x] = rootGroup[r];
    }
    this.n = n;
    this.of = of;
    [this.start, this.ends] = bucket(of, n);
    const gapGroup = new Int32Array(gapEnd.length);
    for (let q = 0; q < gapEnd.length; q++) gapGroup[q] = of[gapEnd[q]];
    [this.gapFrom, this.gaps] = bucket(gapGroup, n);
    this.x = new Float64Array(n);
    this.y = new Float64Array(n);
    this.rMax = new Float64Array(n);
  }

  degree(x: number): number {
    const g = this.of[x];
    return this.start[g + 1] - this.start[g];
  }

  /** The other end of a two-end joint. */
  other(x: number): number {
    const k = this.start[this.of[x]];
    return this.ends[k] === x ? this.ends[k + 1] : this.ends[k];
  }

  /** Every wall point of joint g's gaps within `reach` of (px, py). */
  withinReach(g: number, px: number, py: number, reach: number): boolean {
    const { gapStart, gapPts } = this;
    const r2 = reach * reach;
    for (let q = this.gapFrom[g]; q < this.gapFrom[g + 1]; q++) {
      const gp = this.gaps[q];
      for (let k = gapStart[gp]; k < gapStart[gp + 1]; k += 2) if ((gapPts[k] - px) ** 2 + (gapPts[k + 1] - py) ** 2 > r2) return false;
    }
    return true;
  }

  /** Distance along a ray to the first of joint g's gap walls it meets (≥ −tol), or null. */
  rayToWalls(g: number, cx: number, cy: number, dx: number, dy: number, tol: number): number | null {
    const { gapStart, gapPts } = this;
    let best: number | null = null;
    for (let q = this.gapFrom[g]; q < this.gapFrom[g + 1]; q++) {
      const gp = this.gaps[q];
      for (let k = gapStart[gp]; k + 3 < gapStart[gp + 1]; k += 2) {
        const t = rayHit(cx, cy, dx, dy, gapPts[k], gapPts[k + 1], gapPts[k + 2], gapPts[k + 3], 1e-9);
        if (t >= -tol && (best === null || t < best)) best = Math.max(0, t);
      }
    }
    return best;
  }

  /**
   * The walls in reach from inside joint g, relative to its centre, x0 y0 x1 y1 each, into out (grown as
   * needed; the count of numbers returned): its gaps' wall pieces and, for each stretch ending there, the
   * stretch's two walls back from the end for JOINT_REACH half-widths (or its length).
   */
  wallsInto(g: number, st: StretchList, frame: Float64Array, out: { buf: Float64Array }): number {
    const { gapStart, gapPts } = this;
    const px = this.x[g], py = this.y[g];
    let m = 0;
    const put = (x0: number, y0: number, x1: number, y1: number) => {
      if (m + 4 > out.buf.length) out.buf = grownCopy(out.buf, 2 * out.buf.length + 16);
      out.buf[m++] = x0 - px;
      out.buf[m++] = y0 - py;
      out.buf[m++] = x1 - px;
      out.buf[m++] = y1 - py;
    };
    for (let q = this.gapFrom[g]; q < this.gapFrom[g + 1]; q++) {
      const gp = this.gaps[q];
      for (let k = gapStart[gp]; k + 3 < gapStart[gp + 1]; k += 2) put(gapPts[k], gapPts[k + 1], gapPts[k + 2], gapPts[k + 3]);
    }
    for (let k = this.start[g]; k < this.start[g + 1]; k++) {
      const x = this.ends[k];
      const s = x >> 1, r = st.r[s];
      st.endFrameInto(x, frame);
      const cx = frame[0], cy = frame[1], dx = frame[2], dy = frame[3];
      const back = Math.min(JOINT_REACH * r, st.length(s));
      put(cx + dy * r, cy - dx * r, cx + dy * r - dx * back, cy - dx * r - dy * back);
      put(cx - dy * r, cy + dx * r, cx - dy * r - dx * back, cy + dx * r - dy * back);
    }
    return m;
  }
}

/**
 * Where the ray (px, py) + t·(dx, dy) crosses segment AB: t, or NaN where it misses (parallel, or past an end by
 * more than slack of the segment's length).
 */
function rayHit(px: number, py: number, dx: number, dy: number, ax: number, ay: number, bx: number, by: number, slack: number): number {
  const vx = bx - ax, vy = by - ay;
  const den = dx * vy - dy * vx;
  if (den === 0) return NaN;
  const wx = ax - px, wy = ay - py;
  const s = (wx * dy - wy * dx) / den;
  return s >= -slack && s <= 1 + slack ? (wx * vy - wy * vx) / den : NaN;
}

/** Items grouped by key (counting sort): items of key g are items[start[g] .. start[g + 1]). */
function bucket(keyOf: Int32Array, n: number): [Int32Array, Int32Array] {
  const start = new Int32Array(n + 1);
  for (const g of keyOf) start[g + 1]++;
  for (let g = 0; g < n; g++) start[g + 1] += start[g];
  const fill = start.slice(0, n);
  const items = new Int32Array(keyOf.length);
  for (let i = 0; i < keyOf.length; i++) items[fill[keyOf[i]]++] = i;
  return [start, items];
}

const fmt = (x: number) => String(Number(x.toPrecision(6)));

/** The first wall a ray from edge `self` meets (its distance growing by doubling up to the extent), or -1. */
function firstHit(grid: WallGrid, edges: Float64Array, self: number, px: number, py: number, nx: number, ny: number, extent: number, near: number[]): number {
  for (let reach = grid.cellSize; ; reach *= 2) {
    const qx = px + nx * reach, qy = py + ny * reach;
    const count = grid.collect(Math.min(px, qx), Math.min(py, qy), Math.max(px, qx), Math.max(py, qy), near);
    let best = -1, bestT = Infinity;
    for (let k = 0; k < count; k++) {
      const e = near[k];
      if (e === self) continue;
      const t = rayHit(px, py, nx, ny, edges[4 * e], edges[4 * e + 1], edges[4 * e + 2], edges[4 * e + 3], 1e-12);
      if (t > 0 && t < bestT) {
        bestT = t;
        best = e;
      }
    }
    if (best >= 0 && bestT <= reach) return best;
    if (reach > 2 * extent) return best;
  }
}

/**
 * Straight stretches between facing walls, in typed columns sized for every candidate pair. Stretch s runs along
 * its wall a from (cx0, cy0) to (cx1, cy1) on the midline, half-width r; end 2s is its start, 2s + 1 its end.
 */
class StretchList {
  n = 0;
  readonly cx0: Float64Array;
  readonly cy0: Float64Array;
  readonly cx1: Float64Array;
  readonly cy1: Float64Array;
  readonly r: Float64Array;
  readonly dx: Float64Array;
  readonly dy: Float64Array;
  /** Wall intervals, two per stretch (on a: 2s, on b: 2s + 1): edge, parameter range (distance from its start). */
  readonly ivEdge: Int32Array;
  readonly ivLo: Float64Array;
  readonly ivHi: Float64Array;

  /** @param capacity the most stretches there can be (candidate pairs). */
  constructor(capacity: number) {
    const f = () => new Float64Array(capacity);
    [this.cx0, this.cy0, this.cx1, this.cy1, this.r, this.dx, this.dy] = [f(), f(), f(), f(), f(), f(), f()];
    this.ivEdge = new Int32Array(2 * capacity);
    this.ivLo = new Float64Array(2 * capacity);
    this.ivHi = new Float64Array(2 * capacity);
  }

  /** Add the stretch between walls a and b if they overlap, face each other and nothing else comes nearer. */
  tryPair(edges: Float64Array, ux: Float64Array, uy: Float64Array, len: Float64Array, a: number, b: number, grid: WallGrid, near: number[]): void {
    const ax = edges[4 * a], ay = edges[4 * a + 1];
    const dx = ux[a], dy = uy[a];
    const nx = -dy, ny = dx;
    const bx0 = edges[4 * b], by0 = edges[4 * b + 1], bx1 = edges[4 * b + 2], by1 = edges[4 * b + 3];
    const d0 = (bx0 - ax) * nx + (by0 - ay) * ny, d1 = (bx1 - ax) * nx + (by1 - ay) * ny;
    const t0 = (bx0 - ax) * dx + (by0 - ay) * dy, t1 = (bx1 - ax) * dx + (by1 - ay) * dy;
    const lo = Math.max(0, Math.min(t0, t1)), hi = Math.min(len[a], Math.max(t0, t1));
    // B's distance from A at the overlap's two ends: parallel within PARALLEL_TOLERANCE, its mean the width.
    const slope = t1 === t0 ? 0 : (d1 - d0) / (t1 - t0);
    const dLo = d0 + slope * (lo - t0), dHi = d0 + slope * (hi - t0);
    const d = (dLo + dHi) / 2;
    if (!(d > 0) || Math.abs(dHi - dLo) > PARALLEL_TOLERANCE * d) return;
    if (!(hi - lo > 1e-9 * d)) return;
    const r = d / 2;
    const mx0 = ax + dx * lo + nx * r, my0 = ay + dy * lo + ny * r;
    const mx1 = ax + dx * hi + nx * r, my1 = ay + dy * hi + ny * r;
    const clear = r * (1 - CLEARANCE_SLACK);
    const count = grid.collect(Math.min(mx0, mx1) - r, Math.min(my0, my1) - r, Math.max(mx0, mx1) + r, Math.max(my0, my1) + r, near);
    // In the stretch's frame (t along a from its start, o across towards b): no other wall may come within the
    // clearance of the midline o = r between the two ends (lo < t < hi); walls lying on an end line across the
    // stretch close it (a flat dead end). Beyond the ends, in the joints, walls are the joints' to check.
    const tolT = ON_LINE * r;
    let capped = false;
    // Walls outside the midline's box grown by the half-width are farther than it from every point between the
    // ends and from the end lines' spans: skipped without the frame arithmetic (most of them).
    const bx0m = Math.min(mx0, mx1) - r, bx1m = Math.max(mx0, mx1) + r, by0m = Math.min(my0, my1) - r, by1m = Math.max(my0, my1) + r;
    for (let k = 0; k < count; k++) {
      const e = near[k];
      if (e === a || e === b) continue;
      const wx0 = edges[4 * e], wy0 = edges[4 * e + 1], wx1 = edges[4 * e + 2], wy1 = edges[4 * e + 3];
      if (Math.max(wx0, wx1) < bx0m || Math.min(wx0, wx1) > bx1m || Math.max(wy0, wy1) < by0m || Math.min(wy0, wy1) > by1m) continue;
      const ex0 = wx0 - ax, ey0 = wy0 - ay, ex1 = wx1 - ax, ey1 = wy1 - ay;
      const ta = ex0 * dx + ey0 * dy, tb = ex1 * dx + ey1 * dy;
      const oa = ex0 * nx + ey0 * ny, ob = ex1 * nx + ey1 * ny;
      const across = oa >= -tolT && oa <= d + tolT && ob >= -tolT && ob <= d + tolT;
      if (across && ((Math.abs(ta - lo) <= tolT && Math.abs(tb - lo) <= tolT) || (Math.abs(ta - hi) <= tolT && Math.abs(tb - hi) <= tolT))) {
        capped = true;
        continue;
      }
      // The part of the wall strictly between the ends, as parameters s0..s1 along it.
      let s0 = 0, s1 = 1;
      if (ta === tb) {
        if (!(ta > lo + tolT && ta < hi - tolT)) continue;
      } else {
        const sLo = (lo + tolT - ta) / (tb - ta), sHi = (hi - tolT - ta) / (tb - ta);
        s0 = Math.max(0, Math.min(sLo, sHi));
        s1 = Math.min(1, Math.max(sLo, sHi));
        if (!(s1 > s0)) continue;
      }
      const o0 = oa + (ob - oa) * s0 - r, o1 = oa + (ob - oa) * s1 - r;
      if (o0 * o1 <= 0 || Math.min(Math.abs(o0), Math.abs(o1)) < clear) return;
    }
    if (capped && !(hi - lo > d)) return;
    const s = this.n++;
    this.cx0[s] = mx0;
    this.cy0[s] = my0;
    this.cx1[s] = mx1;
    this.cy1[s] = my1;
    this.r[s] = r;
    this.dx[s] = dx;
    this.dy[s] = dy;
    // On b (running the other way) the stretch's start is at the larger parameter.
    const bLo = Math.max(0, (ax + dx * hi - bx0) * ux[b] + (ay + dy * hi - by0) * uy[b]);
    const bHi = Math.min(len[b], (ax + dx * lo - bx0) * ux[b] + (ay + dy * lo - by0) * uy[b]);
    this.ivEdge[2 * s] = a;
    this.ivEdge[2 * s + 1] = b;
    this.ivLo[2 * s] = lo;
    this.ivLo[2 * s + 1] = bLo;
    this.ivHi[2 * s] = hi;
    this.ivHi[2 * s + 1] = bHi;
  }

  /** Length of stretch s along its midline. */
  length(s: number): number {
    return Math.sqrt((this.cx1[s] - this.cx0[s]) ** 2 + (this.cy1[s] - this.cy0[s]) ** 2);
  }

  /** The stretch end at an interval's high end: on wall a that is the stretch's end, on wall b its start. */
  hiEnd(iv: number): number {
    return 2 * (iv >> 1) + (iv & 1 ? 0 : 1);
  }
  loEnd(iv: number): number {
    return 2 * (iv >> 1) + (iv & 1 ? 1 : 0);
  }

  /** Centre of stretch end x and the direction out of the stretch there (cx, cy, dx, dy) into out. */
  endFrameInto(x: number, out: Float64Array): void {
    const s = x >> 1;
    const one = x & 1;
    out[0] = one ? this.cx1[s] : this.cx0[s];
    out[1] = one ? this.cy1[s] : this.cy0[s];
    out[2] = one ? this.dx[s] : -this.dx[s];
    out[3] = one ? this.dy[s] : -this.dy[s];
  }
}

/**
 * The stretches' wall intervals sorted along each edge (order, with iStart[e] the first of edge e), or null
 * where two overlap (one wall claimed by two stretches: not a plain channel).
 */
function wallIntervals(st: StretchList, nE: number): { order: Int32Array; iStart: Int32Array } | null {
  const [iStart, order] = bucket(st.ivEdge.subarray(0, 2 * st.n), nE);
  for (let e = 0; e < nE; e++) {
    const k0 = iStart[e], k1 = iStart[e + 1];
    if (k1 - k0 < 2) continue;
    const part = Array.from(order.subarray(k0, k1)).sort((p, q) => st.ivLo[p] - st.ivLo[q]);
    for (let k = 0; k < part.length; k++) {
      order[k0 + k] = part[k];
      if (k > 0 && st.ivLo[part[k]] < st.ivHi[part[k - 1]] - ON_LINE * st.r[part[k] >> 1]) return null;
    }
  }
  return { order, iStart };
}

/**
 * Least-squares meeting point of the centrelines of ends[k0 .. k1) into out[0], out[1]; false where they do not
 * meet at one point ahead of every end (out is also the scratch frame).
 */
function meetingPoint(st: StretchList, ends: Int32Array, k0: number, k1: number, tol: number, out: Float64Array): boolean {
  const n = k1 - k0;
  let sxx = 0, sxy = 0, syy = 0, bx = 0, by = 0;
  for (let k = k0; k < k1; k++) {
    st.endFrameInto(ends[k], out);
    const cx = out[0], cy = out[1], dx = out[2], dy = out[3];
    // (I − d dᵀ) p = (I − d dᵀ) c, summed over the ends.
    const m00 = 1 - dx * dx, m01 = -dx * dy, m11 = 1 - dy * dy;
    sxx += m00;
    sxy += m01;
    syy += m11;
    bx += m00 * cx + m01 * cy;
    by += m01 * cx + m11 * cy;
  }
  const det = sxx * syy - sxy * sxy;
  let px: number, py: number;
  if (det > 1e-6 * n * n) {
    px = (syy * bx - sxy * by) / det;
    py = (sxx * by - sxy * bx) / det;
  } else {
    // All parallel: two ends facing each other on one line and of one width (a wall split by a vertex).
    if (n !== 2) return false;
    const ra = st.r[ends[k0] >> 1], rb = st.r[ends[k0 + 1] >> 1];
    if (Math.abs(ra - rb) > PARALLEL_TOLERANCE * Math.max(ra, rb)) return false;
    st.endFrameInto(ends[k0], out);
    const ax = out[0], ay = out[1];
    st.endFrameInto(ends[k0 + 1], out);
    if (Math.sqrt((ax - out[0]) ** 2 + (ay - out[1]) ** 2) > tol) return false;
    px = (ax + out[0]) / 2;
    py = (ay + out[1]) / 2;
  }
  for (let k = k0; k < k1; k++) {
    st.endFrameInto(ends[k], out);
    const cx = out[0], cy = out[1], dx = out[2], dy = out[3];
    const off = Math.abs((px - cx) * dy - (py - cy) * dx);
    const ahead = (px - cx) * dx + (py - cy) * dy;
    if (off > tol || ahead < -tol) return false;
  }
  out[0] = px;
  out[1] = py;
  return true;
}

/**
 * Centreline paths between junctions and dead ends, through bends; closed loops start and end at one bend.
 * Each stretch keeps its constant width; within a joint (from a stretch's end to the joint's centre) the width is
 * twice the exact distance to the nearest wall, as on the Voronoi reader's axis (so a crossing widens to w·√2).
 */
function tracePaths(st: StretchList, joints: Joints, minR: number): CentrelinePath[] {
  const used = new Uint8Array(st.n);
  const paths: CentrelinePath[] = [];
  const arms = new ArmCache(joints, st, minR);
  const frame = new Float64Array(4);
  // Every path's points in one pair of growing columns (room for a few points per stretch end to begin with);
  // each path is its run of them (no array per point, no view per path).
  let XY = new Float64Array(16 * st.n + 16), R = new Float64Array(8 * st.n + 8);
  let n = 0;
  const room = (k: number) => {
    if (n + k <= R.length) return;
    const c = Math.max(2 * R.length, n + k);
    XY = grownCopy(XY, 2 * c);
    R = grownCopy(R, c);
  };
  const put = (x: number, y: number, r: number) => {
    XY[2 * n] = x;
    XY[2 * n + 1] = y;
    R[n++] = r;
  };
  /** A point unless it repeats the path's last one (a flat dead end's wall is its stretch's end). */
  const putNew = (x: number, y: number, r: number, pathStart: number) => {
    if (n > pathStart && XY[2 * n - 2] === x && XY[2 * n - 1] === y) return;
    put(x, y, r);
  };
  /**
   * From stretch end x's centre into its joint's centre (or the reverse, inward: from the joint's centre, leaving
   * it out when the path already ends there, at a bend).
   */
  const throughJoint = (x: number, inward: boolean, pathStart: number) => {
    const g = joints.of[x];
    const r = st.r[x >> 1];
    st.endFrameInto(x, frame);
    const cx = frame[0], cy = frame[1];
    const px = joints.x[g], py = joints.y[g];
    room(3);
    if (joints.degree(x) === 1) {
      // A dead end keeps the channel's width out to its end wall (as the Voronoi reader's dead ends do).
      if (inward) put(px, py, r);
      putNew(cx, cy, r, pathStart);
      if (!inward) putNew(px, py, r, pathStart);
      return;
    }
    const arm = arms.get(g, x, frame);
    const m = arm.length / 3;
    room(m);
    if (inward) for (let q = n > pathStart ? m - 2 : m - 1; q >= 0; q--) put(px + arm[3 * q], py + arm[3 * q + 1], arm[3 * q + 2]);
    else for (let q = 0; q < m; q++) put(px + arm[3 * q], py + arm[3 * q + 1], arm[3 * q + 2]);
  };
  /** Joint centres of the bends passed on the path being walked, x y pairs (reused from path to path). */
  const bends: number[] = [];
  const walk = (startEnd: number): CentrelinePath => {
    const pathStart = n;
    let nb = 0;
    let rMax = 0;
    let x = startEnd;
    throughJoint(x, true, pathStart);
    for (;;) {
      const s = x >> 1;
      used[s] = 1;
      rMax = Math.max(rMax, st.r[s]);
      const out = x ^ 1;
      throughJoint(out, false, pathStart);
      if (joints.degree(out) !== 2) break;
      const g = joints.of[out];
      bends[nb++] = joints.x[g];
      bends[nb++] = joints.y[g];
      const next = joints.other(out);
      if (used[next >> 1]) break;
      throughJoint(next, true, pathStart);
      x = next;
    }
    // A run of bends (a drawn arc between facing walls) has the radius of three consecutive joint centres; a lone
    // sharp corner has none, as a centreline polyline's vertex has none.
    let bendRadius: number | null = null;
    for (let k = 2; 2 * k + 1 < nb; k++) {
      const R = circumradius(bends[2 * k - 4], bends[2 * k - 3], bends[2 * k - 2], bends[2 * k - 1], bends[2 * k], bends[2 * k + 1]);
      if (R < 1000 * 2 * rMax && (bendRadius === null || R < bendRadius)) bendRadius = R;
    }
    return { xy: XY, radii: R, start: pathStart, end: n, bendRadius };
  };
  for (let x = 0; x < 2 * st.n; x++) if (joints.degree(x) !== 2 && !used[x >> 1]) paths.push(walk(x));
  for (let s = 0; s < st.n; s++) if (!used[s]) paths.push(walk(2 * s));
  // The buffers last: the columns may have been reallocated while they grew.
  for (const p of paths) {
    p.xy = XY;
    p.radii = R;
  }
  return paths;
}

/**
 * Width profiles from a stretch's end to its joint's centre, as x y r triples relative to the centre, kept by the
 * joint's shape: a mask repeats the same junction many times, and each shape's profiles are worked out once.
 */
class ArmCache {
  /** Shapes: their walls relative to the centre (quantised, the key) and the arms worked out in them. */
  private readonly byHash = new Map<number, number[]>();
  private readonly shapes: { key: Float64Array; walls: Float64Array; arms: { c: [number, number, number]; arm: Float64Array }[] }[] = [];
  private readonly shapeOf: Int32Array;
  private readonly walls = { buf: new Float64Array(64) };
  private key = new Float64Array(64);
  private readonly q: number;

  /** @param minR smallest half-width: shapes are compared to 1e-7 of it. */
  constructor(
    private readonly joints: Joints,
    private readonly st: StretchList,
    minR: number,
  ) {
    this.q = minR * 1e-7;
    this.shapeOf = new Int32Array(joints.n).fill(-1);
  }

  /** The shape of joint g: found by its walls relative to its centre, or added. */
  private shape(g: number, frame: Float64Array): number {
    if (this.shapeOf[g] >= 0) return this.shapeOf[g];
    const m = this.keyInto(g);
    const w = this.key;
    let h = 2166136261;
    for (let k = 0; k < m; k++) h = Math.imul(h ^ (w[k] | 0), 16777619);
    h &= 0x3fffffff; // a small integer key for the map
    const list = this.byHash.get(h) ?? this.byHash.set(h, []).get(h)!;
    for (let t = 0; t < list.length; t++) {
      const e = this.shapes[list[t]].key;
      if (e.length !== m) continue;
      let k = 0;
      while (k < m && e[k] === w[k]) k++;
      if (k === m) return (this.shapeOf[g] = list[t]);
    }
    // A new shape (a handful per mask): its key, and its walls exact.
    const n = this.joints.wallsInto(g, this.st, frame, this.walls);
    this.shapes.push({ key: w.slice(0, m), walls: this.walls.buf.slice(0, n), arms: [] });
    list.push(this.shapes.length - 1);
    return (this.shapeOf[g] = this.shapes.length - 1);
  }

  /**
   * Joint g's shape key into this.key (grown as needed; its length returned): what its walls are made from, relative
   * to its centre and quantised to q: each gap's point count and points, each end's centre, direction, half-width and
   * how far back its walls reach (as wallsInto puts them). Equal keys, equal walls (within q).
   */
  private keyInto(g: number): number {
    const { joints, st } = this;
    const { gapStart, gapPts } = joints;
    const px = joints.x[g], py = joints.y[g], inv = 1 / this.q;
    let need = 0;
    for (let t = joints.gapFrom[g]; t < joints.gapFrom[g + 1]; t++) need += 1 + gapStart[joints.gaps[t] + 1] - gapStart[joints.gaps[t]];
    need += 6 * (joints.start[g + 1] - joints.start[g]);
    if (this.key.length < need) this.key = new Float64Array(2 * need);
    const w = this.key;
    let m = 0;
    for (let t = joints.gapFrom[g]; t < joints.gapFrom[g + 1]; t++) {
      const gp = joints.gaps[t];
      w[m++] = gapStart[gp + 1] - gapStart[gp];
      for (let k = gapStart[gp]; k < gapStart[gp + 1]; k += 2) {
        w[m++] = Math.round((gapPts[k] - px) * inv);
        w[m++] = Math.round((gapPts[k + 1] - py) * inv);
      }
    }
    for (let k = joints.start[g]; k < joints.start[g + 1]; k++) {
      const x = joints.ends[k];
      const s = x >> 1, r = st.r[s], one = x & 1;
      w[m++] = Math.round(((one ? st.cx1[s] : st.cx0[s]) - px) * inv);
      w[m++] = Math.round(((one ? st.cy1[s] : st.cy0[s]) - py) * inv);
      w[m++] = Math.round((one ? st.dx[s] : -st.dx[s]) * 1e9);
      w[m++] = Math.round((one ? st.dy[s] : -st.dy[s]) * 1e9);
      w[m++] = Math.round(r * inv);
      w[m++] = Math.round(Math.min(JOINT_REACH * r, st.length(s)) * inv);
    }
    return m;
  }

  /** The profile from end x of a stretch into its joint g. */
  get(g: number, x: number, frame: Float64Array): Float64Array {
    const sh = this.shapes[this.shape(g, frame)];
    this.st.endFrameInto(x, frame);
    const cx = frame[0] - this.joints.x[g], cy = frame[1] - this.joints.y[g], r = this.st.r[x >> 1];
    const q = this.q;
    const kx = Math.round(cx / q), ky = Math.round(cy / q), kr = Math.round(r / q);
    for (const a of sh.arms) if (a.c[0] === kx && a.c[1] === ky && a.c[2] === kr) return a.arm;
    const arm = profileArm(sh.walls, sh.walls.length, cx, cy, r);
    sh.arms.push({ c: [kx, ky, kr], arm });
    return arm;
  }
}

/** Samples along a joint's arm the width profile is chosen from (64: the flare's peak within 1/64 of the arm). */
const ARM_SAMPLES = 64;

/**
 * The width profile from (cx, cy) (a stretch's end, half-width r) to the origin (its joint's centre) through the
 * walls w (m numbers, x0 y0 x1 y1 each): the exact wall distance at ARM_SAMPLES + 1 points, kept where straight
 * interpolation between the points kept would be off by more than WIDTH_TOLERANCE (Douglas–Peucker on the
 * width, as the Voronoi reader's paths); x y r triples. Worked out once per joint shape (ArmCache).
 */
function profileArm(w: Float64Array, m: number, cx: number, cy: number, r: number): Float64Array {
  // A stretch ending on its joint's centre (a wall split by a vertex) has no arm: the one point.
  if (cx === 0 && cy === 0) return Float64Array.of(0, 0, r);
  const n = ARM_SAMPLES + 1;
  const rs = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const f = k / ARM_SAMPLES, x = cx * (1 - f), y = cy * (1 - f);
    let best = Infinity;
    for (let q = 0; q < m; q += 4) best = Math.min(best, segDist2(x, y, w[q], w[q + 1], w[q + 2], w[q + 3]));
    rs[k] = k === 0 || !Number.isFinite(best) ? r : Math.sqrt(best);
  }
  const keep = new Uint8Array(n);
  douglasPeucker(n, keep, [], (i, j) => {
    let best = -1, worst = 1;
    for (let k = i + 1; k < j; k++) {
      const lin = rs[i] + ((rs[j] - rs[i]) * (k - i)) / (j - i);
      const bad = Math.abs(rs[k] - lin) / (WIDTH_TOLERANCE * Math.max(rs[k], lin));
      if (bad > worst) {
        worst = bad;
        best = k;
      }
    }
    return best;
  });
  const out: number[] = [];
  for (let k = 0; k < n; k++) {
    if (!keep[k]) continue;
    const f = k / ARM_SAMPLES;
    out.push(cx * (1 - f), cy * (1 - f), rs[k]);
  }
  return Float64Array.from(out);
}

