/**
 * The network builder's working pieces (channel lines and arcs with their length, layer, source entity and curve
 * radius) as columns of typed arrays. Written here because no package stores such records: one object per piece
 * (20k+ on a large chip) was most of what the garbage collector copied while the network was built, and typed
 * arrays keep the drawing's own piece objects from being held past the sort by role.
 */
import type { ArcPiece, LinePiece, Piece } from "../dxf/types";
import { grownCopy } from "../typed-arrays";

const W0_NULL = 1;
const W1_NULL = 2;
const CURVE_NULL = 4;

export class PieceStore {
  /** How many pieces are stored. */
  n = 0;
  /** 0: line (g0…g3 = x0, y0, x1, y1), 1: arc (g0…g4 = cx, cy, r, a0, sweep). */
  kind: Uint8Array;
  g0: Float64Array;
  g1: Float64Array;
  g2: Float64Array;
  g3: Float64Array;
  g4: Float64Array;
  /** Drawn widths at the two ends, drawing units (see flags for null). */
  w0: Float64Array;
  w1: Float64Array;
  /** Length, drawing units. */
  len: Float64Array;
  /** Smallest radius of curvature of the flattened curve it came from, drawing units (see flags for null). */
  curveR: Float64Array;
  /** Index into the builder's layer list and its source-type list; the source entity's index. */
  layer: Int32Array;
  type: Uint8Array;
  src: Int32Array;
  /** Bits: 1 w0 null, 2 w1 null, 4 curveR null. */
  flags: Uint8Array;

  constructor(capacity: number) {
    const c = Math.max(16, capacity);
    this.kind = new Uint8Array(c);
    this.g0 = new Float64Array(c);
    this.g1 = new Float64Array(c);
    this.g2 = new Float64Array(c);
    this.g3 = new Float64Array(c);
    this.g4 = new Float64Array(c);
    this.w0 = new Float64Array(c);
    this.w1 = new Float64Array(c);
    this.len = new Float64Array(c);
    this.curveR = new Float64Array(c);
    this.layer = new Int32Array(c);
    this.type = new Uint8Array(c);
    this.src = new Int32Array(c);
    this.flags = new Uint8Array(c);
  }

  private grow(): void {
    const c = this.kind.length * 2;
    this.kind = grownCopy(this.kind, c);
    this.g0 = grownCopy(this.g0, c);
    this.g1 = grownCopy(this.g1, c);
    this.g2 = grownCopy(this.g2, c);
    this.g3 = grownCopy(this.g3, c);
    this.g4 = grownCopy(this.g4, c);
    this.w0 = grownCopy(this.w0, c);
    this.w1 = grownCopy(this.w1, c);
    this.len = grownCopy(this.len, c);
    this.curveR = grownCopy(this.curveR, c);
    this.layer = grownCopy(this.layer, c);
    this.type = grownCopy(this.type, c);
    this.src = grownCopy(this.src, c);
    this.flags = grownCopy(this.flags, c);
  }

  /** Store the geometry and widths of p at row i (row already counted). */
  private setPiece(i: number, p: Piece): void {
    if (p.kind === "line") {
      this.kind[i] = 0;
      this.g0[i] = p.x0;
      this.g1[i] = p.y0;
      this.g2[i] = p.x1;
      this.g3[i] = p.y1;
    } else {
      this.kind[i] = 1;
      this.g0[i] = p.cx;
      this.g1[i] = p.cy;
      this.g2[i] = p.r;
      this.g3[i] = p.a0;
      this.g4[i] = p.sweep;
    }
    let f = 0;
    if (p.w0 === null) f |= W0_NULL;
    else this.w0[i] = p.w0;
    if (p.w1 === null) f |= W1_NULL;
    else this.w1[i] = p.w1;
    this.flags[i] = f;
  }

  /** Append a piece with its length (drawing units), layer index, source-type index, source entity and curve radius. */
  push(p: Piece, len: number, layer: number, type: number, src: number, curveR: number | null): void {
    if (this.n === this.kind.length) this.grow();
    const i = this.n++;
    this.setPiece(i, p);
    this.len[i] = len;
    this.layer[i] = layer;
    this.type[i] = type;
    this.src[i] = src;
    if (curveR === null) this.flags[i] |= CURVE_NULL;
    else this.curveR[i] = curveR;
  }

  /** Append a part of row i of `from`: new geometry and length, the same layer, source and curve radius. */
  pushPart(from: PieceStore, i: number, p: Piece, len: number): void {
    if (this.n === this.kind.length) this.grow();
    const k = this.n++;
    this.setPiece(k, p);
    this.len[k] = len;
    this.layer[k] = from.layer[i];
    this.type[k] = from.type[i];
    this.src[k] = from.src[i];
    this.curveR[k] = from.curveR[i];
    this.flags[k] |= from.flags[i] & CURVE_NULL;
  }

  /** Append row i of `from` unchanged. */
  pushRow(from: PieceStore, i: number): void {
    if (this.n === this.kind.length) this.grow();
    const k = this.n++;
    this.kind[k] = from.kind[i];
    this.g0[k] = from.g0[i];
    this.g1[k] = from.g1[i];
    this.g2[k] = from.g2[i];
    this.g3[k] = from.g3[i];
    this.g4[k] = from.g4[i];
    this.w0[k] = from.w0[i];
    this.w1[k] = from.w1[i];
    this.len[k] = from.len[i];
    this.curveR[k] = from.curveR[i];
    this.layer[k] = from.layer[i];
    this.type[k] = from.type[i];
    this.src[k] = from.src[i];
    this.flags[k] = from.flags[i];
  }

  /**
   * Let go of the drawn widths and the source columns (the segment walk needs neither once the end widths are
   * computed); drawnW0, drawnW1, piece, line and arc must not be called afterwards.
   */
  releaseWidthsAndSources(): void {
    this.w0 = new Float64Array(0);
    this.w1 = new Float64Array(0);
    this.type = new Uint8Array(0);
    this.src = new Int32Array(0);
  }

  isLine(i: number): boolean {
    return this.kind[i] === 0;
  }

  drawnW0(i: number): number | null {
    return this.flags[i] & W0_NULL ? null : this.w0[i];
  }

  drawnW1(i: number): number | null {
    return this.flags[i] & W1_NULL ? null : this.w1[i];
  }

  curveRadius(i: number): number | null {
    return this.flags[i] & CURVE_NULL ? null : this.curveR[i];
  }

  /** Row i as a fresh piece object (same fields and values as the piece stored), for the geometry helpers. */
  piece(i: number): Piece {
    if (this.kind[i] === 0) return this.line(i);
    return this.arc(i);
  }

  line(i: number): LinePiece {
    return { kind: "line", x0: this.g0[i], y0: this.g1[i], x1: this.g2[i], y1: this.g3[i], w0: this.drawnW0(i), w1: this.drawnW1(i) };
  }

  arc(i: number): ArcPiece {
    return { kind: "arc", cx: this.g0[i], cy: this.g1[i], r: this.g2[i], a0: this.g3[i], sweep: this.g4[i], w0: this.drawnW0(i), w1: this.drawnW1(i) };
  }
}
