/**
 * Spatial indexes over axis-aligned boxes and points: uniform grids whose
 * cells live in an open-addressing hash on typed arrays. Written here rather
 * than installed (no R-tree package is in node_modules): channel pieces are of
 * similar size, so a grid is as fast as a tree, and typed arrays keep 20k+
 * entities free of per-lookup allocation.
 */

const INT_LIMIT = 2 ** 30;
/**
 * Cell boundaries sit at (k − 0.382)·cell, not at multiples of the cell: CAD coordinates are usually
 * round numbers, and boxes that straddle boundaries cost extra cells and pair tests.
 */
const GRID_PHASE = 0.3819660112501051;
const clampCell = (v: number) => (v < -INT_LIMIT ? -INT_LIMIT : v > INT_LIMIT ? INT_LIMIT : v);

/** A set of integer cells (ix, iy) → dense slot numbers 0…n−1, by open addressing with linear probing. */
export class CellHash {
  private readonly xs: Int32Array;
  private readonly ys: Int32Array;
  private readonly slots: Int32Array;
  private readonly mask: number;
  size = 0;

  /** @param capacity most distinct cells that will be inserted. */
  constructor(capacity: number) {
    let n = 16;
    while (n < capacity * 2) n *= 2;
    this.mask = n - 1;
    this.xs = new Int32Array(n);
    this.ys = new Int32Array(n);
    this.slots = new Int32Array(n).fill(-1);
  }

  /** Cell coordinates of each slot, filled on insertion (slot → ix, iy without a probe). */
  cellX: Int32Array = new Int32Array(16);
  cellY: Int32Array = new Int32Array(16);

  /** Slot of cell (ix, iy); inserted when absent and `insert`, else −1. */
  slot(ix: number, iy: number, insert: boolean): number {
    let h = (Math.imul(ix, 0x9e3779b1) ^ Math.imul(iy, 0x85ebca77)) & this.mask;
    for (;;) {
      const s = this.slots[h];
      if (s === -1) {
        if (!insert) return -1;
        this.xs[h] = ix;
        this.ys[h] = iy;
        this.slots[h] = this.size;
        if (this.size === this.cellX.length) {
          const x = new Int32Array(this.size * 2);
          const y = new Int32Array(this.size * 2);
          x.set(this.cellX);
          y.set(this.cellY);
          this.cellX = x;
          this.cellY = y;
        }
        this.cellX[this.size] = ix;
        this.cellY[this.size] = iy;
        return this.size++;
      }
      if (this.xs[h] === ix && this.ys[h] === iy) return s;
      h = (h + 1) & this.mask;
    }
  }
}

/** A static grid over n boxes (minX, minY, maxX, maxY per item in `boxes`), built once, queried many times. */
export class StaticGrid {
  private readonly inv: number;
  private readonly hash: CellHash;
  private readonly offset: Int32Array;
  private readonly items: Int32Array;
  readonly cellSize: number;

  constructor(cellSize: number, boxes: Float64Array) {
    const n = boxes.length / 4;
    // Grow the cells until the item–cell incidences stay proportionate (a few very long pieces in a fine grid).
    let size = cellSize;
    let total = 0;
    for (let attempt = 0; attempt < 40; attempt++) {
      total = 0;
      const inv = 1 / size;
      for (let i = 0; i < n; i++) {
        const w = Math.floor(boxes[4 * i + 2] * inv + GRID_PHASE) - Math.floor(boxes[4 * i] * inv + GRID_PHASE) + 1;
        const h = Math.floor(boxes[4 * i + 3] * inv + GRID_PHASE) - Math.floor(boxes[4 * i + 1] * inv + GRID_PHASE) + 1;
        total += w * h;
      }
      if (total <= 16 * n + 4096) break;
      size *= 2;
    }
    this.cellSize = size;
    this.inv = 1 / size;
    const inv = this.inv;
    this.hash = new CellHash(total);
    const cellOf = new Int32Array(total);
    let t = 0;
    for (let i = 0; i < n; i++) {
      const x0 = clampCell(Math.floor(boxes[4 * i] * inv + GRID_PHASE));
      const y0 = clampCell(Math.floor(boxes[4 * i + 1] * inv + GRID_PHASE));
      const x1 = clampCell(Math.floor(boxes[4 * i + 2] * inv + GRID_PHASE));
      const y1 = clampCell(Math.floor(boxes[4 * i + 3] * inv + GRID_PHASE));
      for (let ix = x0; ix <= x1; ix++) for (let iy = y0; iy <= y1; iy++) cellOf[t++] = this.hash.slot(ix, iy, true);
    }
    this.offset = new Int32Array(this.hash.size + 1);
    for (let k = 0; k < total; k++) this.offset[cellOf[k] + 1]++;
    for (let c = 0; c < this.hash.size; c++) this.offset[c + 1] += this.offset[c];
    const fill = this.offset.slice(0, this.hash.size);
    this.items = new Int32Array(total);
    t = 0;
    for (let i = 0; i < n; i++) {
      const x0 = clampCell(Math.floor(boxes[4 * i] * inv + GRID_PHASE));
      const y0 = clampCell(Math.floor(boxes[4 * i + 1] * inv + GRID_PHASE));
      const x1 = clampCell(Math.floor(boxes[4 * i + 2] * inv + GRID_PHASE));
      const y1 = clampCell(Math.floor(boxes[4 * i + 3] * inv + GRID_PHASE));
      for (let ix = x0; ix <= x1; ix++) for (let iy = y0; iy <= y1; iy++) this.items[fill[cellOf[t++]]++] = i;
    }
  }

  /**
   * Call fn(a, b) once for every pair of items (a < b) whose boxes overlap: each pair is reported only by
   * the cell holding the lower-left corner of the two boxes' overlap, so no pair is seen twice.
   */
  forEachOverlappingPair(boxes: Float64Array, fn: (a: number, b: number) => void): void {
    const cells = this.hash.size;
    const cellX = this.hash.cellX;
    const cellY = this.hash.cellY;
    for (let c = 0; c < cells; c++) {
      const start = this.offset[c];
      const end = this.offset[c + 1];
      for (let u = start; u < end; u++) {
        const a = this.items[u];
        const a4 = 4 * a;
        for (let v = u + 1; v < end; v++) {
          const b = this.items[v];
          const b4 = 4 * b;
          if (boxes[b4] > boxes[a4 + 2] || boxes[b4 + 2] < boxes[a4] || boxes[b4 + 1] > boxes[a4 + 3] || boxes[b4 + 3] < boxes[a4 + 1]) continue;
          const cx = Math.floor(Math.max(boxes[a4], boxes[b4]) * this.inv + GRID_PHASE);
          const cy = Math.floor(Math.max(boxes[a4 + 1], boxes[b4 + 1]) * this.inv + GRID_PHASE);
          if (clampCell(cx) !== cellX[c] || clampCell(cy) !== cellY[c]) continue;
          if (a < b) fn(a, b);
          else fn(b, a);
        }
      }
    }
  }

  /** Collect into `out` (cleared first) the items whose cells meet the box; an item may repeat. */
  queryInto(minX: number, minY: number, maxX: number, maxY: number, out: number[]): number[] {
    if (out.length !== 0) out.length = 0;
    const x0 = clampCell(Math.floor(minX * this.inv + GRID_PHASE));
    const x1 = clampCell(Math.floor(maxX * this.inv + GRID_PHASE));
    const y0 = clampCell(Math.floor(minY * this.inv + GRID_PHASE));
    const y1 = clampCell(Math.floor(maxY * this.inv + GRID_PHASE));
    for (let ix = x0; ix <= x1; ix++) {
      for (let iy = y0; iy <= y1; iy++) {
        const s = this.hash.slot(ix, iy, false);
        if (s < 0) continue;
        for (let k = this.offset[s]; k < this.offset[s + 1]; k++) out.push(this.items[k]);
      }
    }
    return out;
  }
}

/**
 * Groups of points closer than `tol`: calls join(a, b) for every pair within tol.
 * Cells of 16·tol, so a point usually checks one cell and only points near a cell edge look next door.
 */
export function joinNearPoints(xs: Float64Array, ys: Float64Array, tol: number, join: (a: number, b: number) => void): void {
  const n = xs.length;
  const cell = Math.max(16 * tol, 1e-300);
  const inv = 1 / cell;
  const tol2 = tol * tol;
  const hash = new CellHash(n);
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const fx = xs[k] * inv + GRID_PHASE;
    const fy = ys[k] * inv + GRID_PHASE;
    const ix = clampCell(Math.floor(fx));
    const iy = clampCell(Math.floor(fy));
    const rx = (fx - ix) * cell;
    const ry = (fy - iy) * cell;
    const xa = rx <= tol ? ix - 1 : ix;
    const xb = cell - rx <= tol ? ix + 1 : ix;
    const ya = ry <= tol ? iy - 1 : iy;
    const yb = cell - ry <= tol ? iy + 1 : iy;
    for (let cx = xa; cx <= xb; cx++) {
      for (let cy = ya; cy <= yb; cy++) {
        const s = hash.slot(cx, cy, false);
        if (s < 0) continue;
        for (let o = head[s]; o !== -1; o = next[o]) {
          const dx = xs[o] - xs[k];
          const dy = ys[o] - ys[k];
          if (dx * dx + dy * dy <= tol2) join(o, k);
        }
      }
    }
    const s = hash.slot(ix, iy, true);
    next[k] = head[s];
    head[s] = k;
  }
}
