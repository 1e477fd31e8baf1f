/**
 * A uniform grid (spatial hash) over axis-aligned boxes. Written here rather
 * than installed (no R-tree package is in node_modules): channel pieces are of
 * similar size, so a grid is as fast as a tree and needs no dependency.
 */
export class SpatialGrid {
  private readonly cells = new Map<number, number[]>();
  private readonly inv: number;

  /** @param cellSize edge of a square cell in drawing units (> 0). */
  constructor(readonly cellSize: number) {
    this.inv = 1 / cellSize;
  }

  private key(ix: number, iy: number): number {
    // Cell indices are kept within ±2^25 by clamping, so the key is an exact integer.
    const cx = Math.max(-33554432, Math.min(33554431, ix)) + 33554432;
    const cy = Math.max(-33554432, Math.min(33554431, iy)) + 33554432;
    return cx * 67108864 + cy;
  }

  /** Insert item id with box [minX, minY, maxX, maxY]. */
  insert(id: number, minX: number, minY: number, maxX: number, maxY: number): void {
    const x0 = Math.floor(minX * this.inv);
    const x1 = Math.floor(maxX * this.inv);
    const y0 = Math.floor(minY * this.inv);
    const y1 = Math.floor(maxY * this.inv);
    for (let ix = x0; ix <= x1; ix++) {
      for (let iy = y0; iy <= y1; iy++) {
        const k = this.key(ix, iy);
        const list = this.cells.get(k);
        if (list) list.push(id);
        else this.cells.set(k, [id]);
      }
    }
  }

  /** Call fn for each id whose cells meet the box (an id may come more than once; callers dedupe). */
  query(minX: number, minY: number, maxX: number, maxY: number, fn: (id: number) => void): void {
    const x0 = Math.floor(minX * this.inv);
    const x1 = Math.floor(maxX * this.inv);
    const y0 = Math.floor(minY * this.inv);
    const y1 = Math.floor(maxY * this.inv);
    for (let ix = x0; ix <= x1; ix++) {
      for (let iy = y0; iy <= y1; iy++) {
        const list = this.cells.get(this.key(ix, iy));
        if (list) for (let i = 0; i < list.length; i++) fn(list[i]);
      }
    }
  }

  /** Collect into `out` (cleared first) the ids whose cells meet the box; ids may repeat. Allocation-free for hot loops. */
  queryInto(minX: number, minY: number, maxX: number, maxY: number, out: number[]): number[] {
    out.length = 0;
    const x0 = Math.floor(minX * this.inv);
    const x1 = Math.floor(maxX * this.inv);
    const y0 = Math.floor(minY * this.inv);
    const y1 = Math.floor(maxY * this.inv);
    for (let ix = x0; ix <= x1; ix++) {
      for (let iy = y0; iy <= y1; iy++) {
        const list = this.cells.get(this.key(ix, iy));
        if (list) for (let i = 0; i < list.length; i++) out.push(list[i]);
      }
    }
    return out;
  }
}
