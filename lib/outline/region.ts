/**
 * A filled region given as closed rings (mask outlines) in drawing units:
 * overlapping rings are one region, rings inside another ring are holes
 * (pillars, posts), a ring inside a hole is an island again. Answers "is this
 * point inside the filled area" and "how far is the nearest wall" through a
 * uniform grid of the ring edges.
 *
 * Own code rather than a polygon-clipping package: the medial axis only needs
 * an inside test (winding number of orientation-normalised rings, > 0 inside)
 * and wall distances, not the union polygon itself.
 */

export type Ring = [number, number][];

/**
 * Rings end to end in one column: ring k's points are points start[k] .. start[k + 1] − 1 of xy (x y pairs),
 * drawing units, closing point not repeated. The readers' own form: an [x, y] pair per point was garbage.
 */
export interface FlatRings {
  xy: Float64Array;
  start: Int32Array;
}

/** [x, y] rings as flat rings. */
export function flatten(rings: Ring[]): FlatRings {
  const start = new Int32Array(rings.length + 1);
  for (let k = 0; k < rings.length; k++) start[k + 1] = start[k] + rings[k].length;
  const xy = new Float64Array(2 * start[rings.length]);
  for (let k = 0, at = 0; k < rings.length; k++) {
    const r = rings[k];
    for (let i = 0; i < r.length; i++, at += 2) {
      xy[at] = r[i][0];
      xy[at + 1] = r[i][1];
    }
  }
  return { xy, start };
}

/** Flat rings as [x, y] rings, each coordinate times `scale`. */
export function unflatten(f: FlatRings, scale = 1): Ring[] {
  const out: Ring[] = new Array(f.start.length - 1);
  for (let k = 0; k + 1 < f.start.length; k++) {
    const ring: Ring = new Array(f.start[k + 1] - f.start[k]);
    for (let i = f.start[k]; i < f.start[k + 1]; i++) ring[i - f.start[k]] = [f.xy[2 * i] * scale, f.xy[2 * i + 1] * scale];
    out[k] = ring;
  }
  return out;
}

const orient = (ax: number, ay: number, bx: number, by: number, px: number, py: number) => (bx - ax) * (py - ay) - (by - ay) * (px - ax);

/** Signed area of flat ring k (shoelace formula), positive when counter-clockwise. */
function signedAreaOf(f: FlatRings, k: number): number {
  const xy = f.xy, i0 = f.start[k], i1 = f.start[k + 1];
  let a = 0;
  for (let i = i0, j = i1 - 1; i < i1; j = i++) a += xy[2 * j] * xy[2 * i + 1] - xy[2 * i] * xy[2 * j + 1];
  return a / 2;
}

/** Even-odd point-in-ring test (ray casting) on flat ring k, for ring-in-ring containment only. */
function inRing(f: FlatRings, k: number, x: number, y: number): boolean {
  const xy = f.xy, i0 = f.start[k], i1 = f.start[k + 1];
  let inside = false;
  for (let i = i0, j = i1 - 1; i < i1; j = i++) {
    const xi = xy[2 * i], yi = xy[2 * i + 1], xj = xy[2 * j], yj = xy[2 * j + 1];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Flat rings without repeated points (a repeated closing point included), zero-length edges or zero area. */
function cleanFlat(f: FlatRings): FlatRings {
  const n = f.start.length - 1;
  const xy = new Float64Array(f.xy.length);
  const start = new Int32Array(n + 1);
  let m = 0, kept = 0;
  for (let k = 0; k < n; k++) {
    const first = m;
    for (let i = f.start[k]; i < f.start[k + 1]; i++) {
      const x = f.xy[2 * i], y = f.xy[2 * i + 1];
      if (m > first && xy[2 * m - 2] === x && xy[2 * m - 1] === y) continue;
      xy[2 * m] = x;
      xy[2 * m + 1] = y;
      m++;
    }
    while (m - first > 1 && xy[2 * first] === xy[2 * m - 2] && xy[2 * first + 1] === xy[2 * m - 1]) m--;
    start[kept + 1] = m;
    if (m - first >= 3 && Math.abs(signedAreaOf({ xy, start }, kept)) > 0) kept++;
    else m = first;
  }
  return { xy: xy.subarray(0, 2 * m), start: start.subarray(0, kept + 1) };
}

/** Three spread vertices of flat ring r lie inside flat ring o. */
function spreadInside(f: FlatRings, r: number, o: number): boolean {
  const i0 = f.start[r], n = f.start[r + 1] - i0;
  const a = i0 + Math.floor(n / 3), b = i0 + Math.floor((2 * n) / 3);
  return inRing(f, o, f.xy[2 * i0], f.xy[2 * i0 + 1]) && inRing(f, o, f.xy[2 * a], f.xy[2 * a + 1]) && inRing(f, o, f.xy[2 * b], f.xy[2 * b + 1]);
}

/**
 * How many other rings contain each ring: even = outer boundary of filled area, odd = hole. A ring is nested
 * in another when its box lies inside the other's and three spread vertices are inside it.
 */
function nestingDepths(f: FlatRings): number[] {
  const n = f.start.length - 1;
  const box = new Float64Array(4 * n);
  for (let k = 0; k < n; k++) {
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
    for (let i = f.start[k]; i < f.start[k + 1]; i++) {
      const x = f.xy[2 * i], y = f.xy[2 * i + 1];
      if (x < x0) x0 = x;
      if (y < y0) y0 = y;
      if (x > x1) x1 = x;
      if (y > y1) y1 = y;
    }
    box[4 * k] = x0;
    box[4 * k + 1] = y0;
    box[4 * k + 2] = x1;
    box[4 * k + 3] = y1;
  }
  // Rings sorted by box left edge: only rings starting further left can contain a ring. Within that, a ring's
  // container must also reach past its right edge, so each ring is checked only against the rings still "open"
  // at its left edge (boxes not yet ended), kept in a list pruned as the sweep moves right.
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => box[4 * a] - box[4 * b]);
  const depth = new Array<number>(n).fill(0);
  const open: number[] = [];
  for (const i of order) {
    const x0 = box[4 * i], y0 = box[4 * i + 1], x1 = box[4 * i + 2], y1 = box[4 * i + 3];
    let kept = 0;
    for (let q = 0; q < open.length; q++) if (box[4 * open[q] + 2] >= x0) open[kept++] = open[q];
    open.length = kept;
    for (let q = 0; q < kept; q++) {
      const j = open[q];
      if (y0 < box[4 * j + 1] || x1 > box[4 * j + 2] || y1 > box[4 * j + 3]) continue;
      if (spreadInside(f, i, j)) depth[i]++;
    }
    // Rings with the same left edge may contain each other either way round: check the earlier ones against it.
    for (let q = 0; q < kept; q++) {
      const j = open[q];
      if (box[4 * j] !== x0) continue;
      const bj = 4 * j;
      if (box[bj + 1] < y0 || box[bj + 2] > x1 || box[bj + 3] > y1) continue;
      if (spreadInside(f, j, i)) depth[j]++;
    }
    open.push(i);
  }
  return depth;
}

/** Flat rings cleaned and oriented so the filled side is on the left of every edge, with their containment depths. */
export interface OrientedFlat extends FlatRings {
  /** Containment depth of each ring: even = outer boundary of filled area, odd = hole. */
  depth: number[];
}

/** Clean flat rings, find how deeply each is nested and orient each (reversed in place) so the filled side is on its left. */
export function orientFlat(rings: FlatRings): OrientedFlat {
  const clean = cleanFlat(rings);
  const depth = nestingDepths(clean);
  const xy = clean.xy;
  for (let k = 0; k + 1 < clean.start.length; k++) {
    if (signedAreaOf(clean, k) > 0 === (depth[k] % 2 === 0)) continue;
    for (let i = clean.start[k], j = clean.start[k + 1] - 1; i < j; i++, j--) {
      const x = xy[2 * i], y = xy[2 * i + 1];
      xy[2 * i] = xy[2 * j];
      xy[2 * i + 1] = xy[2 * j + 1];
      xy[2 * j] = x;
      xy[2 * j + 1] = y;
    }
  }
  return { xy, start: clean.start, depth };
}

/** Filled area of oriented flat rings (each ring's signed area is positive for filled, negative for holes), square drawing units. */
export function orientedArea(o: FlatRings): number {
  let a = 0;
  for (let k = 0; k + 1 < o.start.length; k++) a += signedAreaOf(o, k);
  return a;
}

/** Filled area of rings after nesting (outer boundaries minus holes), square drawing units. */
export function filledArea(rings: Ring[]): number {
  return orientedArea(orientFlat(flatten(rings)));
}

/** Rings cleaned and oriented so the filled side is on the left of every edge, with their containment depths. */
export interface OrientedRings {
  rings: Ring[];
  /** Containment depth of each ring: even = outer boundary of filled area, odd = hole. */
  depth: number[];
}

/** Clean the rings, find how deeply each is nested and orient each so the filled side is on its left. */
export function orientRings(rings: Ring[]): OrientedRings {
  const o = orientFlat(flatten(rings));
  return { rings: unflatten(o), depth: o.depth };
}

/**
 * The cells of a uniform grid over [minX, maxX] × [minY, maxY] with a margin of one cell: at most ~4 million
 * cells, whatever the cell size asked for.
 */
function gridFrame(minX: number, minY: number, maxX: number, maxY: number, cellSize: number): { cell: number; ox: number; oy: number; nx: number; ny: number } {
  const extent = Math.max(maxX - minX, maxY - minY, 1e-300);
  const cell = Math.max(cellSize, extent / 2048);
  const ox = minX - cell;
  const oy = minY - cell;
  return { cell, ox, oy, nx: Math.ceil((maxX - ox) / cell) + 2, ny: Math.ceil((maxY - oy) / cell) + 2 };
}

export class Region {
  /** Rings oriented so the filled side is on the left of every edge. */
  readonly rings: Ring[];
  /** Containment depth of each ring: even = outer boundary of filled area, odd = hole. */
  readonly depth: number[];
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
  /** Edge coordinates, 4 per edge (x0, y0, x1, y1). */
  private readonly edges: Float64Array;
  private readonly cell: number;
  /** Grid origin: one cell left of and below everything, so each row's sweep starts outside. */
  private readonly ox: number;
  private readonly oy: number;
  private readonly nx: number;
  private readonly ny: number;
  private readonly cellStart: Int32Array;
  private readonly cellEdges: Int32Array;
  /** Winding number at each cell's left-middle reference point. */
  private readonly cellWinding: Int32Array;

  /**
   * @param rings closed rings in drawing units (closing point optional), any orientation.
   * @param cellSize grid cell edge in drawing units (about the sampling step × 4 is a good choice).
   * @param prepared the same rings already through orientRings (saves cleaning and nesting them again).
   */
  constructor(rings: Ring[], cellSize: number, prepared?: OrientedRings) {
    const { rings: oriented, depth } = prepared ?? orientRings(rings);
    this.rings = oriented;
    this.depth = depth;
    let nE = 0;
    for (const r of this.rings) nE += r.length;
    this.edges = new Float64Array(nE * 4);
    let k = 0;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (const r of this.rings) {
      for (let i = 0; i < r.length; i++) {
        const a = r[i];
        const b = r[(i + 1) % r.length];
        this.edges.set([a[0], a[1], b[0], b[1]], 4 * k++);
        minX = Math.min(minX, a[0]); minY = Math.min(minY, a[1]); maxX = Math.max(maxX, a[0]); maxY = Math.max(maxY, a[1]);
      }
    }
    this.minX = minX; this.minY = minY; this.maxX = maxX; this.maxY = maxY;
    ({ cell: this.cell, ox: this.ox, oy: this.oy, nx: this.nx, ny: this.ny } = gridFrame(minX, minY, maxX, maxY, cellSize));
    const nCells = this.nx * this.ny;
    const counts = new Int32Array(nCells + 1);
    const forCells = (e: number, f: (c: number) => void) => {
      const ex0 = this.edges[4 * e], ey0 = this.edges[4 * e + 1], ex1 = this.edges[4 * e + 2], ey1 = this.edges[4 * e + 3];
      // Grown by a hair so an edge on a cell border is listed on both sides of it.
      const m = this.cell * 1e-6;
      const i0 = this.cx(Math.min(ex0, ex1) - m), i1 = this.cx(Math.max(ex0, ex1) + m);
      const j0 = this.cy(Math.min(ey0, ey1) - m), j1 = this.cy(Math.max(ey0, ey1) + m);
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) f(j * this.nx + i);
    };
    for (let e = 0; e < nE; e++) forCells(e, (c) => counts[c + 1]++);
    for (let c = 0; c < nCells; c++) counts[c + 1] += counts[c];
    this.cellStart = counts;
    this.cellEdges = new Int32Array(counts[nCells]);
    const fill = counts.slice(0, nCells);
    for (let e = 0; e < nE; e++) forCells(e, (c) => (this.cellEdges[fill[c]++] = e));
    // Reference points: left edge of each cell at a height off the cell centre by an irrational fraction (avoids vertices).
    this.cellWinding = new Int32Array(nCells);
    for (let j = 0; j < this.ny; j++) {
      let w = 0;
      const y = this.refY(j);
      for (let i = 0; i < this.nx; i++) {
        const c = j * this.nx + i;
        this.cellWinding[c] = w;
        w += this.crossings(c, this.ox + i * this.cell, y, this.ox + (i + 1) * this.cell, y);
      }
    }
  }

  private cx(x: number): number {
    return Math.min(this.nx - 1, Math.max(0, Math.floor((x - this.ox) / this.cell)));
  }
  private cy(y: number): number {
    return Math.min(this.ny - 1, Math.max(0, Math.floor((y - this.oy) / this.cell)));
  }
  private refY(j: number): number {
    return this.oy + (j + 0.5 + 0.0137 * Math.SQRT2) * this.cell;
  }

  /** Winding change along the segment P→Q from the edges listed in cell c (+1 for each edge crossed from its right to its left). */
  private crossings(c: number, px: number, py: number, qx: number, qy: number): number {
    let w = 0;
    const E = this.edges;
    for (let k = this.cellStart[c]; k < this.cellStart[c + 1]; k++) {
      const e = this.cellEdges[k];
      const ax = E[4 * e], ay = E[4 * e + 1], bx = E[4 * e + 2], by = E[4 * e + 3];
      const op = orient(ax, ay, bx, by, px, py);
      const oq = orient(ax, ay, bx, by, qx, qy);
      // Half-open rule: a point on the edge's line counts as on its left.
      const pl = op >= 0;
      const ql = oq >= 0;
      if (pl === ql) continue;
      const oa = orient(px, py, qx, qy, ax, ay) >= 0;
      const ob = orient(px, py, qx, qy, bx, by) >= 0;
      if (oa === ob) continue;
      w += ql ? 1 : -1;
    }
    return w;
  }

  /** Winding number of the filled rings around (x, y): > 0 inside the filled area. */
  winding(x: number, y: number): number {
    if (x < this.minX || y < this.minY || x > this.maxX || y > this.maxY) return 0;
    const i = this.cx(x);
    const j = this.cy(y);
    const c = j * this.nx + i;
    const rx = this.ox + i * this.cell;
    const ry = this.refY(j);
    return this.cellWinding[c] + this.crossings(c, rx, ry, x, y);
  }

  /** True when (x, y) is inside the filled area (drawing units). */
  contains(x: number, y: number): boolean {
    return this.winding(x, y) > 0;
  }
}

/** Distance from a point to a segment (plane geometry). */
export function segDist(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  return Math.sqrt(segDist2(px, py, ax, ay, bx, by));
}

/** Circumradius of three points (plane geometry: R = abc / 4·area); Infinity when collinear. */
export function circumradius(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const ab = Math.sqrt((bx - ax) ** 2 + (by - ay) ** 2), bc = Math.sqrt((cx - bx) ** 2 + (cy - by) ** 2), ca = Math.sqrt((ax - cx) ** 2 + (ay - cy) ** 2);
  const area2 = Math.abs((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
  return area2 === 0 ? Infinity : (ab * bc * ca) / (2 * area2);
}

/** Squared distance from a point to a segment (plane geometry). */
export function segDist2(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 === 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / l2;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = px - (ax + t * dx);
  const ey = py - (ay + t * dy);
  return ex * ex + ey * ey;
}

/** R within the bounding box of P and Q (for a point already known to be on the line PQ). */
function within(px: number, py: number, qx: number, qy: number, rx: number, ry: number): boolean {
  return Math.min(px, qx) <= rx && rx <= Math.max(px, qx) && Math.min(py, qy) <= ry && ry <= Math.max(py, qy);
}

/** True when closed segments AB and CD share a point (orientation tests; touching and collinear overlap count). */
export function segmentsMeet(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
  const d1 = orient(cx, cy, dx, dy, ax, ay);
  const d2 = orient(cx, cy, dx, dy, bx, by);
  const d3 = orient(ax, ay, bx, by, cx, cy);
  const d4 = orient(ax, ay, bx, by, dx, dy);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  return (d1 === 0 && within(cx, cy, dx, dy, ax, ay)) || (d2 === 0 && within(cx, cy, dx, dy, bx, by)) ||
    (d3 === 0 && within(ax, ay, bx, by, cx, cy)) || (d4 === 0 && within(ax, ay, bx, by, dx, dy));
}

/** Wall segments (4 numbers each, drawing units) in a uniform grid, for nearest-wall distances. */
export class WallGrid {
  /** Extent of the segments' bounding box, drawing units. */
  readonly width: number;
  readonly height: number;
  private readonly ox: number;
  private readonly oy: number;
  private readonly cell: number;
  private readonly nx: number;
  private readonly ny: number;
  private readonly start: Int32Array;
  private readonly list: Int32Array;
  /** collect(): the query each segment was last listed by. */
  private seen: Int32Array | undefined;
  private mark = 0;

  /**
   * @param segs wall segments, x0 y0 x1 y1 each, drawing units.
   * @param cellSize grid cell edge, drawing units.
   */
  constructor(private readonly segs: Float64Array, cellSize: number) {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (let i = 0; i < segs.length; i += 2) {
      const x = segs[i], y = segs[i + 1];
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
    if (!Number.isFinite(minX)) minX = minY = maxX = maxY = 0;
    this.width = maxX - minX;
    this.height = maxY - minY;
    ({ cell: this.cell, ox: this.ox, oy: this.oy, nx: this.nx, ny: this.ny } = gridFrame(minX, minY, maxX, maxY, cellSize));
    const n = segs.length / 4;
    const counts = new Int32Array(this.nx * this.ny + 1);
    for (let e = 0; e < n; e++) {
      const i0 = this.ix(Math.min(segs[4 * e], segs[4 * e + 2])), i1 = this.ix(Math.max(segs[4 * e], segs[4 * e + 2]));
      const j0 = this.iy(Math.min(segs[4 * e + 1], segs[4 * e + 3])), j1 = this.iy(Math.max(segs[4 * e + 1], segs[4 * e + 3]));
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) counts[j * this.nx + i + 1]++;
    }
    for (let c = 0; c + 1 < counts.length; c++) counts[c + 1] += counts[c];
    this.start = counts;
    this.list = new Int32Array(counts[counts.length - 1]);
    const fill = counts.slice(0, counts.length - 1);
    for (let e = 0; e < n; e++) {
      const i0 = this.ix(Math.min(segs[4 * e], segs[4 * e + 2])), i1 = this.ix(Math.max(segs[4 * e], segs[4 * e + 2]));
      const j0 = this.iy(Math.min(segs[4 * e + 1], segs[4 * e + 3])), j1 = this.iy(Math.max(segs[4 * e + 1], segs[4 * e + 3]));
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) this.list[fill[j * this.nx + i]++] = e;
    }
  }

  private ix(x: number): number {
    return Math.min(this.nx - 1, Math.max(0, Math.floor((x - this.ox) / this.cell)));
  }
  private iy(y: number): number {
    return Math.min(this.ny - 1, Math.max(0, Math.floor((y - this.oy) / this.cell)));
  }

  /** Cell edge, drawing units. */
  get cellSize(): number {
    return this.cell;
  }

  /**
   * Ids of the segments listed in the cells the box touches, each once, into out[0 .. the count returned): the
   * caller tests them exactly.
   */
  collect(minX: number, minY: number, maxX: number, maxY: number, out: number[]): number {
    // The count is returned and out is never shortened: truncating an array lets V8 drop its storage, and a
    // query per wall would then grow it again each time.
    let n = 0;
    const seen = (this.seen ??= new Int32Array(this.segs.length / 4));
    const mark = ++this.mark;
    const i0 = this.ix(minX), i1 = this.ix(maxX), j0 = this.iy(minY), j1 = this.iy(maxY);
    for (let j = j0; j <= j1; j++) {
      for (let i = i0; i <= i1; i++) {
        const c = j * this.nx + i;
        for (let k = this.start[c]; k < this.start[c + 1]; k++) {
          const e = this.list[k];
          if (seen[e] === mark) continue;
          seen[e] = mark;
          out[n++] = e;
        }
      }
    }
    return n;
  }

  /** Distance from (x, y) to the nearest wall segment within maxR (drawing units); Infinity if none that near. */
  distance(x: number, y: number, maxR: number): number {
    const i0 = this.ix(x - maxR), i1 = this.ix(x + maxR), j0 = this.iy(y - maxR), j1 = this.iy(y + maxR);
    const S = this.segs;
    let best = maxR * maxR;
    let found = false;
    for (let j = j0; j <= j1; j++) {
      for (let i = i0; i <= i1; i++) {
        const c = j * this.nx + i;
        for (let k = this.start[c]; k < this.start[c + 1]; k++) {
          const e = this.list[k];
          const d2 = segDist2(x, y, S[4 * e], S[4 * e + 1], S[4 * e + 2], S[4 * e + 3]);
          if (d2 <= best) {
            best = d2;
            found = true;
          }
        }
      }
    }
    return found ? Math.sqrt(best) : Infinity;
  }

  /**
   * True when two segments share a point, leaving out the pairs `skip` allows (e.g. consecutive edges of one
   * ring meeting at their common vertex).
   */
  anyMeeting(skip: (a: number, b: number) => boolean): boolean {
    const S = this.segs;
    for (let c = 0; c + 1 < this.start.length; c++) {
      const k0 = this.start[c], k1 = this.start[c + 1];
      for (let k = k0; k < k1; k++) {
        const a = this.list[k];
        const ax0 = S[4 * a], ay0 = S[4 * a + 1], ax1 = S[4 * a + 2], ay1 = S[4 * a + 3];
        const loX = Math.min(ax0, ax1), hiX = Math.max(ax0, ax1), loY = Math.min(ay0, ay1), hiY = Math.max(ay0, ay1);
        for (let m = k + 1; m < k1; m++) {
          const b = this.list[m];
          const bx0 = S[4 * b], by0 = S[4 * b + 1], bx1 = S[4 * b + 2], by1 = S[4 * b + 3];
          // Boxes apart: the segments cannot meet (most pairs in a cell, tested in four comparisons).
          if (Math.max(bx0, bx1) < loX || Math.min(bx0, bx1) > hiX || Math.max(by0, by1) < loY || Math.min(by0, by1) > hiY) continue;
          if (skip(a, b)) continue;
          if (segmentsMeet(ax0, ay0, ax1, ay1, bx0, by0, bx1, by1)) return true;
        }
      }
    }
    return false;
  }
}
