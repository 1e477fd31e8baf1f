/**
 * The network builder's working pieces (channel lines and arcs with their length, layer, source entity and curve
 * radius) as columns of typed arrays. Written here because no package stores such records: one object per piece
 * (20k+ on a large chip) was most of what the garbage collector copied while the network was built, and typed
 * arrays keep the drawing's own piece objects from being held past the sort by role.
 */
import type { ArcPiece, LinePiece, Piece } from "../dxf/types";
import { grownCopy } from "../typed-arrays";

/**
 * Width profiles along outline centrelines (lib/outline): a centreline path's widths at many points, so that the
 * network builder can take the path as a few straight pieces (its shape) while each piece keeps the widths along
 * it. Positions and widths in drawing units, positions increasing.
 */
export class WidthProfiles {
  /** All profiles' positions and widths end to end (one pair of columns: a small array per path was mostly GC). */
  private S = new Float64Array(256);
  private W = new Float64Array(256);
  /** Profile id's points are S[off[id]] .. S[off[id + 1] - 1]. */
  private readonly off: number[] = [0];

  /** Make room for `points` more profile points at once. */
  reserve(points: number): void {
    const need = this.off[this.off.length - 1] + points;
    if (need > this.S.length) {
      this.S = grownCopy(this.S, need);
      this.W = grownCopy(this.W, need);
    }
  }

  /** Register a profile (copied): positions s and widths w from index `from` (default 0) up to `to` (default all); returns its id. */
  add(s: ArrayLike<number>, w: ArrayLike<number>, from = 0, to = s.length): number {
    const at = this.off[this.off.length - 1], n = to - from;
    if (at + n > this.S.length) {
      const c = Math.max(2 * this.S.length, at + n);
      this.S = grownCopy(this.S, c);
      this.W = grownCopy(this.W, c);
    }
    for (let k = 0; k < n; k++) {
      this.S[at + k] = s[from + k];
      this.W[at + k] = w[from + k];
    }
    this.off.push(at + n);
    return this.off.length - 2;
  }

  /** Index of the last profile point at or before position at (the first when before it), into S and W. */
  private before(id: number, at: number): number {
    const s = this.S;
    let lo = this.off[id], hi = this.off[id + 1] - 1;
    if (at >= s[hi]) return hi;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (s[mid] <= at) lo = mid;
      else hi = mid;
    }
    return lo;
  }

  /** Width of profile id at position at, linear between its points (held flat beyond its ends). */
  widthAt(id: number, at: number): number {
    const s = this.S, w = this.W;
    const first = this.off[id], last = this.off[id + 1] - 1;
    if (at <= s[first]) return w[first];
    const k = this.before(id, at);
    if (k === last) return w[k];
    const span = s[k + 1] - s[k];
    return span > 0 ? w[k] + ((w[k + 1] - w[k]) * (at - s[k])) / span : w[k];
  }

  /**
   * The profile's own points strictly between positions a and b (either order), in the order a → b, as fractions
   * of the way from a to b and widths, written to f[0 ..] and w[0 ..] (scratch arrays the caller keeps: never
   * shortened, so they keep their storage); returns how many.
   */
  pointsBetween(id: number, a: number, b: number, f: number[], w: number[]): number {
    const s = this.S, ws = this.W;
    const lo = Math.min(a, b), hi = Math.max(a, b), span = b - a;
    if (!(hi > lo)) return 0;
    const end = this.off[id + 1];
    let first = this.before(id, lo);
    if (s[first] <= lo) first++;
    let last = first;
    while (last < end && s[last] < hi) last++;
    const n = last - first;
    for (let q = 0; q < n; q++) {
      const k = a <= b ? first + q : last - 1 - q;
      f[q] = (s[k] - a) / span;
      w[q] = ws[k];
    }
    return n;
  }
}

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
  /**
   * Width profile of the row (an id in `profiles` plus one; 0: none, the widths are linear from w0 to w1). Empty
   * until a row with a profile is stored: centreline layouts never pay for these three columns.
   */
  prof1 = new Int32Array(0);
  /** Positions along that profile at the row's start and end (drawing units). */
  ps0 = new Float64Array(0);
  ps1 = new Float64Array(0);

  /**
   * @param capacity rows to make room for (the store grows by doubling beyond it).
   * @param profiles the width profiles rows may refer to; stores filled from one another share one table.
   */
  constructor(capacity: number, readonly profiles: WidthProfiles = new WidthProfiles()) {
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

  /** Make room for at least `capacity` rows at once (an outline layer's pieces come all together). */
  reserve(capacity: number): void {
    if (capacity > this.kind.length) this.grow(capacity);
  }

  private grow(atLeast = 0): void {
    const c = Math.max(this.kind.length * 2, atLeast);
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
    if (this.prof1.length > 0) {
      this.prof1 = grownCopy(this.prof1, c);
      this.ps0 = grownCopy(this.ps0, c);
      this.ps1 = grownCopy(this.ps1, c);
    }
  }

  /** The profile columns, made at the store's capacity the first time a row needs them. */
  private withProfiles(): void {
    if (this.prof1.length > 0) return;
    const c = this.kind.length;
    this.prof1 = new Int32Array(c);
    this.ps0 = new Float64Array(c);
    this.ps1 = new Float64Array(c);
  }

  /** Width profile id of row i, -1 for none. */
  profileOf(i: number): number {
    return this.prof1.length > 0 ? this.prof1[i] - 1 : -1;
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

  /**
   * Append the straight piece (x0, y0) → (x1, y1) whose widths follow profile `profile` from position s0 (its
   * start) to s1 (its end); its w0 and w1 are set to the profile's widths there. Coordinates, not a piece object:
   * an outline layer gives thousands.
   */
  pushProfiled(x0: number, y0: number, x1: number, y1: number, layer: number, type: number, src: number, curveR: number | null, profile: number, s0: number, s1: number): void {
    if (this.n === this.kind.length) this.grow();
    const i = this.n++;
    this.kind[i] = 0;
    this.g0[i] = x0;
    this.g1[i] = y0;
    this.g2[i] = x1;
    this.g3[i] = y1;
    this.flags[i] = curveR === null ? CURVE_NULL : 0;
    if (curveR !== null) this.curveR[i] = curveR;
    this.len[i] = Math.sqrt((x1 - x0) ** 2 + (y1 - y0) ** 2);
    this.layer[i] = layer;
    this.type[i] = type;
    this.src[i] = src;
    this.setProfile(i, profile, s0, s1);
  }

  private setProfile(i: number, profile: number, s0: number, s1: number): void {
    this.withProfiles();
    this.prof1[i] = profile + 1;
    this.ps0[i] = s0;
    this.ps1[i] = s1;
    this.w0[i] = this.profiles.widthAt(profile, s0);
    this.w1[i] = this.profiles.widthAt(profile, s1);
    this.flags[i] &= ~(W0_NULL | W1_NULL);
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
    const pid = from.profileOf(i);
    if (pid >= 0 && p.kind === "line" && from.kind[i] === 0) {
      // The part's ends as fractions along row i's line; the profile positions follow (the widths with them).
      const ax = from.g0[i], ay = from.g1[i], dx = from.g2[i] - ax, dy = from.g3[i] - ay;
      const l2 = dx * dx + dy * dy;
      const t0 = l2 > 0 ? ((p.x0 - ax) * dx + (p.y0 - ay) * dy) / l2 : 0;
      const t1 = l2 > 0 ? ((p.x1 - ax) * dx + (p.y1 - ay) * dy) / l2 : 1;
      const a = from.ps0[i], b = from.ps1[i];
      this.setProfile(k, pid, a + (b - a) * t0, a + (b - a) * t1);
    }
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
    if (from.profileOf(i) >= 0) {
      this.withProfiles();
      this.prof1[k] = from.prof1[i];
      this.ps0[k] = from.ps0[i];
      this.ps1[k] = from.ps1[i];
    }
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

  /** Row i has a drawn width at its start (w0[i] holds it); a boolean, where drawnW0's number | null would be boxed. */
  hasDrawnW0(i: number): boolean {
    return (this.flags[i] & W0_NULL) === 0;
  }

  hasDrawnW1(i: number): boolean {
    return (this.flags[i] & W1_NULL) === 0;
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
