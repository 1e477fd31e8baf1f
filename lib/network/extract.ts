/**
 * The layout reader's second half: typed drawing entities + layer plan →
 * channel network (nodes, segments, ports) in SI. Topology rules (issue 3):
 * endpoints within the snap tolerance merge; an endpoint on another channel's
 * interior splits it (T-junction); crossings on channel layers are junctions;
 * duplicated pieces are merged once with a warning; port circles trim the
 * channels that end inside them; segments run between ports, junctions, dead
 * ends and changes of width, depth or cross-section.
 */
import type { GeometryConditions } from "../analysis/conditions";
import { LayoutError } from "../errors";
import { readDxf, MAX_LAYOUT_BYTES } from "../dxf/read";
import type { ArcPiece, CircleEntity, LinePiece, DxfDrawing, PathEntity, Piece, TextEntity } from "../dxf/types";
import { parseQuantity } from "../units/quantity";
import { arcFraction, bboxInto, bboxOf, circleCrossings, endOf, intersect, lineArcHits, pieceLength, pointAt, reversed, samplePoints, startOf, subPiece } from "./geometry";
import { CellHash, joinNearPoints, StaticGrid } from "./grid";
import { describeLayers, planLayers, type LayerPlan, type ResolvedLayer } from "./layers";
import { flatRingsOf, readOutlineLayer } from "../outline/read";
import { unflatten, type FlatRings } from "../outline/region";
import type { ChannelNetwork, LayoutWarning, NetworkNode, NetworkPort, NetworkSegment, NodeKind } from "./types";
import { UnionFind } from "../graph/union-find";
import { PieceStore } from "./piece-store";

/** Endpoint-merging tolerance when the conditions give none, metres (common practice: below a 1 µm mask grid). */
export const DEFAULT_SNAP_M = 0.5e-6;
/** Chord tolerance for splines and ellipses when the conditions give none, metres (common practice). */
export const DEFAULT_CHORD_TOLERANCE_M = 0.1e-6;
const MAX_LISTED_WARNINGS = 25;

export interface ExtractOptions {
  maxBytes?: number;
  /** Called as each stage ends (for the benchmark's breakdown); no effect on the result. */
  onStage?: (stage: string) => void;
  /** Called inside the long stages (every 1,024 entities read, every 1,024 segments built) for the benchmark's heap samples; no effect on the result. */
  onSample?: () => void;
}

interface PortCircle {
  cx: number;
  cy: number;
  r: number;
  name: string;
}

const fmt = (v: number) => Number(v.toPrecision(6)).toString();

function layoutError(code: string, message: string, plan?: LayerPlan): LayoutError {
  return new LayoutError(code, message, plan ? { layers: plan.summaries } : undefined);
}

/**
 * Widths of a piece in metres at its two ends (its own drawn width, else the layer's), written to
 * out[at] and out[at + 1]; one shared array instead of a tuple per piece.
 */
function widthsInto(store: PieceStore, i: number, layers: ResolvedLayer[], mpu: number, out: Float64Array, at: number): void {
  const layer = layers[store.layer[i]];
  const lw = layer.widthM;
  const w0 = store.hasDrawnW0(i) ? store.w0[i] * mpu : lw;
  const w1 = store.hasDrawnW1(i) ? store.w1[i] * mpu : lw;
  if (w0 === null || w1 === null) {
    throw new LayoutError(
      "width_missing",
      `Channels on layer "${layer.name}" have no drawn width and the layer has none: add "width" (e.g. "100 um") to conditions.layers.${layer.name}, or draw the centrelines as polylines with a width.`,
    );
  }
  out[at] = w0;
  out[at + 1] = w1;
}

function nameports(circles: CircleEntity[], texts: TextEntity[], warnings: LayoutWarning[], mpu: number): PortCircle[] {
  // Inside the circle beats nearby; each text names one port; unnamed ports are P1, P2 … by x then y.
  const cands: { pi: number; ti: number; d: number; inside: boolean }[] = [];
  circles.forEach((c, pi) => {
    texts.forEach((t, ti) => {
      if (t.text === "") return;
      const d = Math.hypot(t.x - c.cx, t.y - c.cy);
      if (d <= 2 * c.r) cands.push({ pi, ti, d, inside: d <= c.r });
    });
  });
  cands.sort((a, b) => Number(b.inside) - Number(a.inside) || a.d - b.d);
  const names = new Array<string | null>(circles.length).fill(null);
  const usedText = new Set<number>();
  for (const c of cands) {
    if (names[c.pi] !== null || usedText.has(c.ti)) continue;
    names[c.pi] = texts[c.ti].text.slice(0, 64);
    usedText.add(c.ti);
  }
  const taken = new Set<string>();
  circles.forEach((c, i) => {
    const n = names[i];
    if (n === null) return;
    if (taken.has(n)) {
      let k = 2;
      while (taken.has(`${n}_${k}`)) k++;
      warnings.push({ code: "port_name_repeated", message: `Two ports are labelled "${n}"; the second is called "${n}_${k}". Give each port its own label.`, at: { xM: c.cx * mpu, yM: c.cy * mpu } });
      names[i] = `${n}_${k}`;
    }
    taken.add(names[i] as string);
  });
  const unnamed = circles.map((c, i) => ({ c, i })).filter((o) => names[o.i] === null).sort((a, b) => a.c.cx - b.c.cx || a.c.cy - b.c.cy);
  let k = 1;
  for (const { i } of unnamed) {
    while (taken.has(`P${k}`)) k++;
    names[i] = `P${k}`;
    taken.add(`P${k}`);
  }
  return circles.map((c, i) => ({ cx: c.cx, cy: c.cy, r: c.r, name: names[i] as string }));
}

const scratch: number[] = [];
const scratchBox = new Float64Array(4);
const NO_PIECES = new PieceStore(0);
const NO_UNION = new UnionFind(0);
const NO_F64 = new Float64Array(0);
const NO_I32 = new Int32Array(0);
const scratchEnd = new Float64Array(2);

/** End k of the stored pieces (2i: start of piece i, 2i + 1: its end) into out[0], out[1], exactly as the snap stage computes it. */
function endPointInto(pieces: PieceStore, k: number, out: Float64Array): void {
  const i = k >> 1;
  const t = k & 1;
  if (pieces.isLine(i)) {
    const x0 = pieces.g0[i], y0 = pieces.g1[i];
    out[0] = x0 + (pieces.g2[i] - x0) * t;
    out[1] = y0 + (pieces.g3[i] - y0) * t;
    return;
  }
  // pointAt(arc, 0 or 1), as startOf and endOf.
  const a = pieces.g3[i] + pieces.g4[i] * t;
  out[0] = pieces.g0[i] + pieces.g2[i] * Math.cos(a);
  out[1] = pieces.g1[i] + pieces.g2[i] * Math.sin(a);
}
const scratchLine: LinePiece = { kind: "line", x0: 0, y0: 0, x1: 0, y1: 0, w0: null, w1: null };

interface Part {
  p: Piece;
  len: number;
}

/** Cut away the parts of piece i inside any port circle: null when nothing is cut, else the parts kept. */
function trimByPorts(store: PieceStore, i: number, ports: PortCircle[], grid: StaticGrid | null): Part[] | null {
  if (!grid) return null;
  if (store.isLine(i)) {
    // bboxInto of the line, without its piece object.
    const x0 = store.g0[i], y0 = store.g1[i], x1 = store.g2[i], y1 = store.g3[i];
    scratchBox[0] = Math.min(x0, x1);
    scratchBox[1] = Math.min(y0, y1);
    scratchBox[2] = Math.max(x0, x1);
    scratchBox[3] = Math.max(y0, y1);
  } else bboxInto(store.arc(i), scratchBox, 0, 0);
  const hits = grid.queryInto(scratchBox[0], scratchBox[1], scratchBox[2], scratchBox[3], scratch);
  if (hits.length === 0) return null;
  let parts: Part[] = [{ p: store.piece(i), len: store.len[i] }];
  let changedAny = false;
  for (const pi of new Set(hits)) {
    const c = ports[pi];
    const next: Part[] = [];
    for (const part of parts) {
      const cuts = circleCrossings(part.p, c.cx, c.cy, c.r);
      const ts = [0, ...cuts, 1];
      for (let k = 0; k + 1 < ts.length; k++) {
        const ta = ts[k];
        const tb = ts[k + 1];
        if (tb - ta <= 1e-12) continue;
        const m = pointAt(part.p, (ta + tb) / 2);
        if (Math.hypot(m.x - c.cx, m.y - c.cy) < c.r) {
          changedAny = true;
          continue;
        }
        if (ta === 0 && tb === 1) next.push(part);
        else {
          changedAny = true;
          const p = subPiece(part.p, ta, tb);
          next.push({ p, len: part.len * (tb - ta) });
        }
      }
    }
    parts = next;
  }
  return changedAny ? parts : null;
}

/** Grid cell edge from the pieces' boxes (minX, minY, maxX, maxY per piece): their mean size, within sane bounds. */
function chooseCellSize(boxes: Float64Array, snap: number): number {
  const n = boxes.length / 4;
  if (n === 0) return 1;
  let sum = 0;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < n; i++) {
    const x0 = boxes[4 * i], y0 = boxes[4 * i + 1], x1 = boxes[4 * i + 2], y1 = boxes[4 * i + 3];
    sum += Math.max(x1 - x0, y1 - y0);
    if (x0 < minX) minX = x0;
    if (y0 < minY) minY = y0;
    if (x1 > maxX) maxX = x1;
    if (y1 > maxY) maxY = y1;
  }
  const extent = Math.max(maxX - minX, maxY - minY, snap * 4, 1e-300);
  return Math.max(sum / n, extent / 2048, snap * 4, extent * 1e-9);
}

/**
 * Split parameters for every piece: T-junctions and crossings. Line coordinates are copied into typed
 * arrays first: the pair loop then reads contiguous memory, and lines (the common case) need no allocation.
 */
function findSplits(store: PieceStore, snap: number): (number[] | null)[] {
  const n = store.n;
  const splits: (number[] | null)[] = new Array(n).fill(null);
  const add = (i: number, t: number) => {
    const list = splits[i];
    if (list) list.push(t);
    else splits[i] = [t];
  };
  const isLine = new Uint8Array(n);
  // Arcs: centre and radius, for a cheap distance test before any angle is computed.
  const CX = new Float64Array(n);
  const CY = new Float64Array(n);
  const R = new Float64Array(n);
  const X0 = new Float64Array(n);
  const Y0 = new Float64Array(n);
  const X1 = new Float64Array(n);
  const Y1 = new Float64Array(n);
  const L = new Float64Array(n);
  const boxes = new Float64Array(n * 4);
  // Arc objects for the geometry helpers (arcs are few); lines are read from the store.
  const arcs = new Array<ArcPiece | undefined>(n);
  for (let i = 0; i < n; i++) {
    if (store.isLine(i)) {
      isLine[i] = 1;
      const x0 = store.g0[i], y0 = store.g1[i], x1 = store.g2[i], y1 = store.g3[i];
      X0[i] = x0; Y0[i] = y0; X1[i] = x1; Y1[i] = y1;
      // Boxes grown by the snap tolerance, so pieces that nearly touch are paired too.
      boxes[4 * i] = Math.min(x0, x1) - snap;
      boxes[4 * i + 1] = Math.min(y0, y1) - snap;
      boxes[4 * i + 2] = Math.max(x0, x1) + snap;
      boxes[4 * i + 3] = Math.max(y0, y1) + snap;
    } else {
      const p = store.arc(i);
      arcs[i] = p;
      const s = startOf(p);
      const e = endOf(p);
      X0[i] = s.x; Y0[i] = s.y; X1[i] = e.x; Y1[i] = e.y;
      CX[i] = p.cx; CY[i] = p.cy; R[i] = p.r;
      const b = bboxOf(p);
      boxes[4 * i] = b[0] - snap;
      boxes[4 * i + 1] = b[1] - snap;
      boxes[4 * i + 2] = b[2] + snap;
      boxes[4 * i + 3] = b[3] + snap;
    }
    L[i] = store.len[i];
  }
  // One line object refilled from the store for each line–arc pair (lineArcHits reads only its ends).
  const lineAt = (i: number): LinePiece => {
    scratchLine.x0 = X0[i]; scratchLine.y0 = Y0[i]; scratchLine.x1 = X1[i]; scratchLine.y1 = Y1[i];
    return scratchLine;
  };
  const interior = (i: number, t: number) => t * L[i] > snap && (1 - t) * L[i] > snap;
  const snap2 = snap * snap;
  // Endpoint (x, y) of one piece on the interior of piece j (a T-junction): split j there.
  const endOnto = (x: number, y: number, j: number) => {
    if (isLine[j]) {
      const dx = X1[j] - X0[j];
      const dy = Y1[j] - Y0[j];
      const l2 = dx * dx + dy * dy;
      if (l2 === 0) return;
      const t = ((x - X0[j]) * dx + (y - Y0[j]) * dy) / l2;
      if (t <= 0 || t >= 1) return;
      const ex = x - (X0[j] + dx * t);
      const ey = y - (Y0[j] + dy * t);
      if (ex * ex + ey * ey <= snap2 && interior(j, t)) add(j, t);
      return;
    }
    const dc = Math.sqrt((x - CX[j]) * (x - CX[j]) + (y - CY[j]) * (y - CY[j])) - R[j];
    if (dc > snap || dc < -snap) return;
    // project() on an arc, without its result object: off the arc's angles the nearest point is an end (t 0 or 1), never interior.
    const arc = arcs[j]!;
    const t = arcFraction(arc, Math.atan2(y - arc.cy, x - arc.cx));
    if (t === null) return;
    if (Math.abs(Math.hypot(x - arc.cx, y - arc.cy) - arc.r) <= snap && interior(j, t)) add(j, t);
  };
  const hits = new Float64Array(8);
  const grid = new StaticGrid(chooseCellSize(boxes, snap), boxes);
  grid.forEachOverlappingPair(boxes, (i, j) => {
    if (isLine[i] && isLine[j]) {
      const rx = X1[i] - X0[i];
      const ry = Y1[i] - Y0[i];
      const sx = X1[j] - X0[j];
      const sy = Y1[j] - Y0[j];
      const den = rx * sy - ry * sx;
      if (Math.abs(den) > 1e-14 * Math.sqrt((rx * rx + ry * ry) * (sx * sx + sy * sy))) {
        const qpx = X0[j] - X0[i];
        const qpy = Y0[j] - Y0[i];
        const t = (qpx * sy - qpy * sx) / den;
        const u = (qpx * ry - qpy * rx) / den;
        if (t >= 0 && t <= 1 && u >= 0 && u <= 1) {
          if (interior(i, t)) add(i, t);
          if (interior(j, u)) add(j, u);
        }
      }
    } else if (isLine[i] || isLine[j]) {
      // Line and arc: intersect() without its result arrays.
      const li = isLine[i] ? i : j;
      const ai = li === i ? j : i;
      const n = lineArcHits(lineAt(li), arcs[ai]!, hits);
      for (let k = 0; k < n; k++) {
        const t = li === i ? hits[4 * k] : hits[4 * k + 1];
        const u = li === i ? hits[4 * k + 1] : hits[4 * k];
        if (interior(i, t)) add(i, t);
        if (interior(j, u)) add(j, u);
      }
    } else {
      for (const h of intersect(arcs[i]!, arcs[j]!)) {
        if (interior(i, h.t)) add(i, h.t);
        if (interior(j, h.u)) add(j, h.u);
      }
    }
    endOnto(X0[i], Y0[i], j);
    endOnto(X1[i], Y1[i], j);
    endOnto(X0[j], Y0[j], i);
    endOnto(X1[j], Y1[j], i);
  });
  return splits;
}

function sameGeometry(a: Piece, b: Piece, snap: number): boolean {
  if (a.kind !== b.kind) return false;
  const ma = pointAt(a, 0.5);
  const mb = pointAt(b, 0.5);
  if (Math.hypot(ma.x - mb.x, ma.y - mb.y) > snap) return false;
  return Math.abs(pieceLength(a) - pieceLength(b)) <= 2 * snap;
}

function chainOutline(paths: PathEntity[], circles: CircleEntity[], tol: number, mpu: number): [number, number][][] {
  const polys: [number, number][][] = [];
  const toM = (x: number, y: number): [number, number] => [x * mpu, y * mpu];
  for (const c of circles) {
    const ring: [number, number][] = [];
    for (let k = 0; k <= 72; k++) ring.push(toM(c.cx + c.r * Math.cos((k * Math.PI) / 36), c.cy + c.r * Math.sin((k * Math.PI) / 36)));
    polys.push(ring);
  }
  const open: Piece[] = [];
  for (const p of paths) {
    if (p.closed) {
      const s = startOf(p.pieces[0]);
      const ring: [number, number][] = [toM(s.x, s.y)];
      for (const q of p.pieces) for (const pt of samplePoints(q)) ring.push(toM(pt.x, pt.y));
      polys.push(ring);
    } else open.push(...p.pieces);
  }
  // Loose lines and arcs (a die drawn as four LINEs): chain end to start into closed rings.
  const used = new Array<boolean>(open.length).fill(false);
  if (open.length > 5000) return polys;
  for (let i = 0; i < open.length; i++) {
    if (used[i]) continue;
    used[i] = true;
    const chain: Piece[] = [open[i]];
    const first = startOf(open[i]);
    let end = endOf(open[i]);
    let grown = true;
    while (grown && Math.hypot(end.x - first.x, end.y - first.y) > tol) {
      grown = false;
      for (let j = 0; j < open.length; j++) {
        if (used[j]) continue;
        const s = startOf(open[j]);
        const e = endOf(open[j]);
        const piece = Math.hypot(s.x - end.x, s.y - end.y) <= tol ? open[j] : Math.hypot(e.x - end.x, e.y - end.y) <= tol ? reversed(open[j]) : null;
        if (!piece) continue;
        used[j] = true;
        chain.push(piece);
        end = endOf(piece);
        grown = true;
        break;
      }
    }
    if (chain.length > 1 && Math.hypot(end.x - first.x, end.y - first.y) <= tol) {
      const ring: [number, number][] = [toM(first.x, first.y)];
      for (const q of chain) for (const pt of samplePoints(q)) ring.push(toM(pt.x, pt.y));
      polys.push(ring);
    }
  }
  return polys;
}

/** Piece ends by node root in compressed rows (ends 2i, 2i + 1 of piece i); rootOf is −1 for the ends of dropped pieces. */
function incidence(nPieces: number, keep: Uint8Array, uf: UnionFind, nAll: number): { rootOf: Int32Array; degree: Int32Array; offset: Int32Array; endsAt: Int32Array } {
  const nEnds = 2 * nPieces;
  const rootOf = new Int32Array(nEnds).fill(-1);
  const degree = new Int32Array(nAll);
  for (let i = 0; i < nPieces; i++) {
    if (!keep[i]) continue;
    for (let k = 2 * i; k <= 2 * i + 1; k++) {
      const r = uf.find(k);
      rootOf[k] = r;
      degree[r]++;
    }
  }
  const offset = new Int32Array(nAll + 1);
  for (let r = 0; r < nAll; r++) offset[r + 1] = offset[r] + degree[r];
  const fill = offset.slice(0, nAll);
  const endsAt = new Int32Array(offset[nAll]);
  for (let k = 0; k < nEnds; k++) if (rootOf[k] >= 0) endsAt[fill[rootOf[k]]++] = k;
  return { rootOf, degree, offset, endsAt };
}

/** Connected components of the node roots (comp −1: no piece end) and whether each reaches a port. */
function findComponents(nAll: number, degree: Int32Array, offset: Int32Array, endsAt: Int32Array, rootOf: Int32Array, portOfRoot: Map<number, number>): { comp: Int32Array; compHasPort: boolean[] } {
  const comp = new Int32Array(nAll).fill(-1);
  const compHasPort: boolean[] = [];
  const stack = new Int32Array(nAll);
  for (let root = 0; root < nAll; root++) {
    if (degree[root] === 0 || comp[root] !== -1) continue;
    const id = compHasPort.length;
    let hasPort = false;
    let top = 0;
    stack[top++] = root;
    comp[root] = id;
    while (top > 0) {
      const r = stack[--top];
      if (portOfRoot.has(r)) hasPort = true;
      for (let e = offset[r]; e < offset[r + 1]; e++) {
        const other = rootOf[endsAt[e] ^ 1];
        if (comp[other] === -1) {
          comp[other] = id;
          stack[top++] = other;
        }
      }
    }
    compHasPort.push(hasPort);
  }
  return { comp, compHasPort };
}

interface DuplicatePair {
  x: number;
  y: number;
  count: number;
  types: string;
}

/**
 * Zero-length pieces and duplicates (same end nodes, same geometry either way round): keep[i] = 0 for those dropped,
 * and the merged copies by pair of source entities. A function of its own so its hash and chains are freed on return.
 */
function findDuplicates(pieces: PieceStore, uf: UnionFind, snap: number, typeNames: string[]): { keep: Uint8Array; dupPairs: Map<string, DuplicatePair> } {
  const keep = new Uint8Array(pieces.n).fill(1);
  // Pieces by their (unordered) pair of end nodes, chained per pair: only pieces between the same two nodes can be copies.
  const pairHash = new CellHash(pieces.n);
  const pairHead = new Int32Array(pieces.n).fill(-1);
  const pairNext = new Int32Array(pieces.n).fill(-1);
  const dupPairs = new Map<string, DuplicatePair>();
  for (let i = 0; i < pieces.n; i++) {
    const a = uf.find(2 * i);
    const b = uf.find(2 * i + 1);
    if (a === b && pieces.len[i] <= 2 * snap) {
      keep[i] = 0;
      continue;
    }
    const slot = a < b ? pairHash.slot(a, b, true) : pairHash.slot(b, a, true);
    let dup = -1;
    // Piece objects only for the few pieces that share their two end nodes with another.
    const w = pairHead[slot] === -1 ? null : pieces.piece(i);
    for (let j = pairHead[slot]; j !== -1; j = pairNext[j]) {
      const q = pieces.piece(j);
      if (sameGeometry(q, w!, snap) || sameGeometry(q, reversed(w!), snap)) {
        dup = j;
        break;
      }
    }
    if (dup === -1) {
      pairNext[i] = pairHead[slot];
      pairHead[slot] = i;
      continue;
    }
    keep[i] = 0;
    const srcDup = pieces.src[dup];
    const srcI = pieces.src[i];
    const srcKey = `${Math.min(srcDup, srcI)}:${Math.max(srcDup, srcI)}`;
    const m = pointAt(w!, 0.5);
    const d = dupPairs.get(srcKey);
    if (d) d.count++;
    else dupPairs.set(srcKey, { x: m.x, y: m.y, count: 1, types: `${typeNames[pieces.type[dup]]} and ${typeNames[pieces.type[i]]}` });
  }
  return { keep, dupPairs };
}

/**
 * Build the channel network from a DXF layout and the geometry conditions.
 * @param input DXF text or bytes.
 * @param conditions units, snap, chord_tolerance and layer mapping (zod-validated).
 * @returns the network in SI units with warnings and the layer listing.
 * @throws LayoutError (bad file, units unknown, no channel layer, width/depth missing, nothing connected) or ConditionsError (bad quantity).
 */
export function extractNetwork(input: string | Uint8Array, conditions: GeometryConditions, options: ExtractOptions = {}): ChannelNetwork {
  const snapM = conditions.snap === undefined ? DEFAULT_SNAP_M : parseQuantity(conditions.snap, "length", "snap");
  const chordM = conditions.chord_tolerance === undefined ? DEFAULT_CHORD_TOLERANCE_M : parseQuantity(conditions.chord_tolerance, "length", "chord_tolerance");
  if (snapM < 0) throw layoutError("invalid_snap", "snap must not be negative.");
  if (!(chordM > 0)) throw layoutError("invalid_chord_tolerance", "chord_tolerance must be greater than zero.");
  const drawing = readDxf(input, { maxBytes: options.maxBytes ?? MAX_LAYOUT_BYTES, chordToleranceM: chordM, units: conditions.units, onStage: options.onStage, onSample: options.onSample });
  const plan = planLayers(drawing, conditions);
  if (!drawing.units) throw layoutError("units_unknown", drawing.unitsProblem ?? "The drawing's units are not known.", plan);
  return buildNetwork(drawing, plan, snapM, drawing.units.metresPerUnit, options.onStage ?? (() => undefined), options.onSample);
}

function buildNetwork(drawing: DxfDrawing, plan: LayerPlan, snapM: number, mpu: number, stage: (name: string) => void, onSample?: () => void): ChannelNetwork {
  const units = drawing.units!;
  const snap = snapM / mpu;
  const warnings: LayoutWarning[] = drawing.notes.map((n) => ({ code: n.code, message: n.message }));
  const at = (x: number, y: number) => ({ xM: x * mpu, yM: y * mpu });
  if (plan.missing.length > 0) warnings.push({ code: "layer_missing", message: `The conditions name layers the drawing does not have: ${plan.missing.join(", ")}.` });
  if (plan.unmapped.length > 0) warnings.push({ code: "layers_unmapped", message: `Layers not named in the conditions were not read: ${plan.unmapped.join(", ")}. Map them in conditions.layers if they matter.` });
  if (plan.mappingProposed) warnings.push({ code: "mapping_proposed", message: "The conditions name no layers, so Stokeline proposed a mapping from the layers' contents (circles → ports, paths → channels). Check it and save your own." });

  const channelLayers = plan.summaries.filter((l) => l.role === "channel");
  if (channelLayers.length === 0) {
    throw layoutError("no_channel_layer", `No layer is mapped to the role "channel", so there is no channel network to read. Layers in this drawing: ${describeLayers(plan.summaries)}. Name the channel layer in conditions.layers.`, plan);
  }

  // Sort entities by role. Channel pieces go to a typed-array store, so the drawing's entities can be let go after this stage.
  let works = new PieceStore(drawing.entities.length);
  // Layers and source entity types of the stored pieces, by index (layers compared by identity, as objects before).
  const layers: ResolvedLayer[] = [];
  const layerIndex = new Map<ResolvedLayer, number>();
  const indexOfLayer = (l: ResolvedLayer) => layerIndex.get(l) ?? (layers.push(l), layerIndex.set(l, layers.length - 1), layers.length - 1);
  const typeNames: string[] = [];
  const typeIndex = new Map<string, number>();
  const indexOfType = (t: string) => typeIndex.get(t) ?? (typeNames.push(t), typeIndex.set(t, typeNames.length - 1), typeNames.length - 1);
  const portCircles: CircleEntity[] = [];
  const texts: TextEntity[] = [];
  const outlinePaths: PathEntity[] = [];
  const outlineCircles: CircleEntity[] = [];
  // Closed shapes (closed polylines without drawn width, circles) on channel layers, by layer: mask outlines.
  // This is where an outline reader (issue 9) plugs in, turning them into centreline pieces per layer.
  const shapesByLayer = new Map<string, (PathEntity | CircleEntity)[]>();
  const linesByLayer = new Map<string, number>();
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const grow = (b: ArrayLike<number>) => {
    minX = Math.min(minX, b[0]); minY = Math.min(minY, b[1]); maxX = Math.max(maxX, b[2]); maxY = Math.max(maxY, b[3]);
  };
  // One box reused for every channel piece (no tuple per piece).
  const box = new Float64Array(4);
  const growByPieces = (ps: Piece[]) => {
    for (const p of ps) {
      bboxInto(p, box, 0, 0);
      grow(box);
    }
  };
  // The last layer looked up, remembered: entities come in long runs on one layer (one Map lookup per run).
  let lastName: string | null = null;
  let lastLayer: ResolvedLayer | undefined;
  let lastLines = 0;
  const flushLines = () => {
    if (lastLines > 0) linesByLayer.set(lastName!, (linesByLayer.get(lastName!) ?? 0) + lastLines);
    lastLines = 0;
  };
  for (let src = 0; src < drawing.entities.length; src++) {
    const e = drawing.entities[src];
    if (e.kind === "text") {
      texts.push(e);
      continue;
    }
    if (e.layer !== lastName) {
      flushLines();
      lastName = e.layer;
      lastLayer = plan.byName.get(e.layer);
    }
    const role = lastLayer?.role ?? "ignore";
    if ((role === "port" || role === "outline") && e.kind === "circle") grow([e.cx - e.r, e.cy - e.r, e.cx + e.r, e.cy + e.r]);
    else if (role === "port" || role === "outline" || (role === "channel" && e.kind === "circle")) {
      if (e.kind === "circle") grow([e.cx - e.r, e.cy - e.r, e.cx + e.r, e.cy + e.r]);
      else growByPieces(e.pieces);
    }
    if (role === "port" && e.kind === "circle") portCircles.push(e);
    else if (role === "outline") {
      if (e.kind === "circle") outlineCircles.push(e);
      else outlinePaths.push(e);
    } else if (role === "channel") {
      const layer = lastLayer!;
      // pieces.some(p => p.w0 !== null) without a callback per entity (the hottest line of the sort).
      let drawnWidth = false;
      if (e.kind === "path") for (let k = 0; k < e.pieces.length && !drawnWidth; k++) drawnWidth = e.pieces[k].w0 !== null;
      if (e.kind === "circle" || (e.closed && !drawnWidth)) {
        if (e.kind === "path") growByPieces(e.pieces);
        // Closed shapes on a channel layer are mask outlines (chambers, filled channels), kept for an outline reader.
        (shapesByLayer.get(e.layer) ?? shapesByLayer.set(e.layer, []).get(e.layer)!).push(e);
        continue;
      }
      lastLines++;
      let li = -1;
      let ti = -1;
      for (const p of e.pieces) {
        const len = pieceLength(p);
        if (!(len > 0)) continue;
        bboxInto(p, box, 0, 0);
        // grow(box), inline: the one hot call site.
        minX = Math.min(minX, box[0]); minY = Math.min(minY, box[1]); maxX = Math.max(maxX, box[2]); maxY = Math.max(maxY, box[3]);
        if (li === -1) {
          li = indexOfLayer(layer);
          ti = indexOfType(e.type);
        }
        works.push(p, len, li, ti, src, e.minCurveRadius);
      }
    }
  }
  flushLines();
  // Mask outlines (issue 9), per layer: their rings, and the first shape's entity index and type (the pieces read
  // from them are attributed to it).
  const outlines = new Map<string, { rings: FlatRings; shapes: number; src: number; type: string }>();
  for (const [name, list] of shapesByLayer) {
    const src = drawing.entities.indexOf(list[0]);
    outlines.set(name, { rings: flatRingsOf(list), shapes: list.length, src, type: drawing.entities[src].type });
  }
  shapesByLayer.clear();
  // The drawing is extractNetwork's own (read there, never returned) and its entities are not needed past this point
  // (the store holds the channel pieces; ports, texts, outlines and mask rings are in their own lists): letting the
  // list go lets the entities and their piece objects be collected during the outline reads and the build.
  drawing.entities = [];
  // The mask rings for drawing, kept flat (as read) until the network is assembled.
  const maskRings: { layer: string; flat: FlatRings }[] = [];
  for (const l of plan.summaries) {
    if (l.role !== "channel") continue;
    const mask = outlines.get(l.name);
    const shapes = mask?.shapes ?? 0;
    const lines = linesByLayer.get(l.name) ?? 0;
    l.style = shapes > 0 && lines > 0 ? "mixed" : shapes > 0 ? "outline" : "centreline";
    if (mask) {
      // The filled area's centrelines (from facing wall pairs, else its medial axis) become centreline pieces
      // carrying their local widths.
      const layer = plan.byName.get(l.name)!;
      const { src } = mask;
      const read = readOutlineLayer(mask.rings);
      maskRings.push({ layer: l.name, flat: mask.rings });
      const li = indexOfLayer(layer);
      const ti = indexOfType(mask.type);
      works.reserve(works.n + read.count);
      works.profiles.reserve(read.profileS.length);
      const ids = new Int32Array(read.axis.paths.length);
      for (let p = 0; p < ids.length; p++) ids[p] = works.profiles.add(read.profileS, read.profileW, read.profileStart[p], read.profileStart[p + 1]);
      const { lines, curveRadii, pieceProfile, pieceS } = read;
      for (let k = 0; k < read.count; k++) {
        const bend = curveRadii[k];
        works.pushProfiled(lines[4 * k], lines[4 * k + 1], lines[4 * k + 2], lines[4 * k + 3], li, ti, src, Number.isNaN(bend) ? null : bend, ids[pieceProfile[k]], pieceS[2 * k], pieceS[2 * k + 1]);
      }
      const um = (u: number) => fmt(u * mpu * 1e6);
      const ax = read.axis;
      warnings.push({
        code: "outline_read",
        message: `Layer "${l.name}": ${shapes} closed shape(s) read as mask outlines (${ax.regions} filled region(s), ${ax.holes} hole(s)) → ${ax.paths.length} centreline path(s). Tolerances from the smallest width found, ${um(ax.minWidthUnits)} µm: ${
          ax.method === "paired walls"
            ? `centrelines from facing wall pairs, shape within ${um(ax.toleranceStepUnits / 8)} µm.`
            : `boundary sampled every ${um(ax.stepUnits)} µm, corner spurs shorter than ${um(ax.pruneLengthUnits)} µm pruned.`
        }${ax.notes.length ? ` ${ax.notes.join(" ")}` : ""}`,
      });
    }
    const other = Object.entries(l.byType).filter(([t]) => !["LINE", "ARC", "LWPOLYLINE", "POLYLINE", "SPLINE", "ELLIPSE", "CIRCLE", "HATCH", "TEXT", "MTEXT"].includes(t));
    if (other.length > 0) {
      warnings.push({ code: "entities_not_read", message: `Layer "${l.name}" has entities Stokeline does not read as channels: ${other.map(([t, n]) => `${t} ${n}`).join(", ")}.` });
    }
    const rl = plan.byName.get(l.name)!;
    if (rl.depthM === null && (lines > 0 || shapes > 0)) {
      const proposal = plan.mappingProposed
        ? ` The conditions name no layers; Stokeline proposes ${plan.summaries.map((x) => `${x.name} → ${x.role}`).join(", ")}. Save that mapping with a depth (and width) for each channel layer.`
        : "";
      throw layoutError("depth_missing", `Layer "${l.name}" is a channel layer but has no depth: add "depth" (e.g. "50 um") to conditions.layers.${l.name}.${proposal}`, plan);
    }
  }
  try {
    const two = new Float64Array(2);
    for (let i = 0; i < works.n; i++) widthsInto(works, i, layers, mpu, two, 0);
  } catch (e) {
    throw e instanceof LayoutError ? layoutError(e.code, e.message, plan) : e;
  }

  stage("sort by role");
  // Ports and trimming.
  const ports = nameports(portCircles, texts, warnings, mpu);
  let portGrid: StaticGrid | null = null;
  if (ports.length > 0) {
    const maxR = ports.reduce((m, p) => Math.max(m, p.r), 0);
    const boxes = new Float64Array(ports.length * 4);
    ports.forEach((p, i) => boxes.set([p.cx - p.r - snap, p.cy - p.r - snap, p.cx + p.r + snap, p.cy + p.r + snap], 4 * i));
    portGrid = new StaticGrid(Math.max(maxR * 4, snap * 4, 1e-300), boxes);
  }
  let trimmed = new PieceStore(works.n, works.profiles);
  for (let i = 0; i < works.n; i++) {
    const parts = trimByPorts(works, i, ports, portGrid);
    if (parts === null) trimmed.pushRow(works, i);
    else for (const t of parts) trimmed.pushPart(works, i, t.p, t.len);
  }
  // Each stage's store is let go once the next is filled (they are most of the builder's own memory).
  works = NO_PIECES;

  stage("ports and trimming");
  // T-junctions and crossings.
  let splits = findSplits(trimmed, snap);
  stage("crossings and T-junctions");
  const pieces = new PieceStore(trimmed.n, trimmed.profiles);
  for (let i = 0; i < trimmed.n; i++) {
    const ts = splits[i];
    if (ts === null) {
      pieces.pushRow(trimmed, i);
      continue;
    }
    ts.sort((a, b) => a - b);
    let prev = 0;
    const len = trimmed.len[i];
    const whole = trimmed.piece(i);
    for (const t of [...ts, 1]) {
      if ((t - prev) * len <= snap && t !== 1) continue;
      if (t - prev <= 0) continue;
      const p = subPiece(whole, prev, t);
      pieces.pushPart(trimmed, i, p, len * (t - prev));
      prev = t;
    }
  }
  trimmed = NO_PIECES;
  splits = [];

  stage("split pieces");
  // Endpoints → nodes (snap merge; ends near a port circle join the port).
  const nEnds = pieces.n * 2;
  let uf = new UnionFind(nEnds + ports.length);
  let endX = new Float64Array(nEnds);
  let endY = new Float64Array(nEnds);
  for (let i = 0; i < pieces.n; i++) {
    if (pieces.isLine(i)) {
      // Exactly pointAt(p, 0) and pointAt(p, 1), without the point objects.
      const x0 = pieces.g0[i], y0 = pieces.g1[i];
      const dx = pieces.g2[i] - x0;
      const dy = pieces.g3[i] - y0;
      endX[2 * i] = x0 + dx * 0; endY[2 * i] = y0 + dy * 0;
      endX[2 * i + 1] = x0 + dx * 1; endY[2 * i + 1] = y0 + dy * 1;
      continue;
    }
    const p = pieces.arc(i);
    const s = startOf(p);
    const e = endOf(p);
    endX[2 * i] = s.x; endY[2 * i] = s.y;
    endX[2 * i + 1] = e.x; endY[2 * i + 1] = e.y;
  }
  joinNearPoints(endX, endY, snap, (a, b) => uf.union(a, b));
  if (portGrid) {
    const near: number[] = [];
    for (let k = 0; k < nEnds; k++) {
      for (const pi of portGrid.queryInto(endX[k], endY[k], endX[k], endY[k], near)) {
        const p = ports[pi];
        if (Math.hypot(endX[k] - p.cx, endY[k] - p.cy) <= p.r + snap) uf.union(k, nEnds + pi);
      }
    }
  }
  const portOfRoot = new Map<number, number>();
  ports.forEach((_, pi) => {
    const root = uf.find(nEnds + pi);
    const prior = portOfRoot.get(root);
    if (prior !== undefined) {
      warnings.push({ code: "ports_joined", message: `Ports ${ports[prior].name} and ${ports[pi].name} are joined by channel ends closer than the snap tolerance; they were treated as one port, ${ports[prior].name}.`, at: at(ports[pi].cx, ports[pi].cy) });
    } else portOfRoot.set(root, pi);
  });

  stage("snap endpoints");
  // Duplicates and zero-length pieces.
  const { keep, dupPairs } = findDuplicates(pieces, uf, snap, typeNames);
  let listed = 0;
  for (const d of dupPairs.values()) {
    if (listed++ >= MAX_LISTED_WARNINGS) break;
    warnings.push({ code: "duplicate_merged", message: `Overlapping duplicate channel drawn twice (${d.types} on the same path); it was counted once. Delete the copy in the drawing.`, at: at(d.x, d.y) });
  }
  if (dupPairs.size > MAX_LISTED_WARNINGS) warnings.push({ code: "duplicate_merged", message: `${dupPairs.size - MAX_LISTED_WARNINGS} more duplicated channels were counted once.` });

  stage("duplicates");
  // Graph in compressed form: for every node root, the piece ends incident to it (ends 2i, 2i+1 of piece i).
  const nAll = nEnds + ports.length;
  const graph = incidence(pieces.n, keep, uf, nAll);
  const { rootOf, offset, endsAt } = graph;
  let degree = graph.degree;
  const firstEnd = (r: number) => endsAt[offset[r]];

  // Connected components; keep those that reach a port.
  const found = findComponents(nAll, degree, offset, endsAt, rootOf, portOfRoot);
  let comp = found.comp;
  const compHasPort = found.compHasPort;
  if (ports.length === 0) {
    const portLayers = plan.summaries.filter((l) => l.role === "port").map((l) => l.name);
    throw layoutError(
      "nothing_connected",
      portLayers.length === 0
        ? `No layer is mapped to the role "port", so no channel connects to an inlet or outlet. Draw each port as a circle on a port layer and map it in conditions.layers. Layers: ${describeLayers(plan.summaries)}.`
        : `No port circles were found on the port layer(s) ${portLayers.join(", ")}. Draw each inlet and outlet as a circle there.`,
      plan,
    );
  }
  if (!compHasPort.some(Boolean)) {
    throw layoutError("nothing_connected", `No channel reaches any of the ${ports.length} port circle(s): check that channel ends lie inside the port circles (or within ${fmt(snapM * 1e6)} µm of them).`, plan);
  }
  const isDropped = (r: number) => comp[r] === -1 || !compHasPort[comp[r]];
  {
    const warned = new Set<number>();
    for (let r = 0; r < nAll && warned.size < MAX_LISTED_WARNINGS; r++) {
      if (degree[r] === 0 || compHasPort[comp[r]] || warned.has(comp[r])) continue;
      warned.add(comp[r]);
      const k = firstEnd(r);
      warnings.push({ code: "unconnected_channels", message: "Channels here connect to no port and were left out of the network. Connect them or move them to another layer.", at: at(endX[k], endY[k]) });
    }
  }
  for (const [pi, port] of ports.entries()) {
    const root = uf.find(nEnds + pi);
    if (portOfRoot.get(root) === pi && degree[root] === 0) {
      warnings.push({ code: "port_unconnected", message: `Port ${port.name} touches no channel; it is left out of the network.`, at: at(port.cx, port.cy) });
    }
  }
  uf = NO_UNION;
  // Node positions are read from the pieces from here on (nodeOf): the end coordinates are let go.
  endX = NO_F64;
  endY = NO_F64;

  stage("graph and components");
  // Node kinds: 0 pass-through (no node), else an index into KINDS.
  const KINDS: NodeKind[] = ["port", "port", "junction", "dead_end", "change"];
  // End widths of every piece (metres): index 2i is piece i's start, 2i + 1 its end.
  const widthCache = new Float64Array(pieces.n * 2);
  for (let i = 0; i < pieces.n; i++) widthsInto(pieces, i, layers, mpu, widthCache, 2 * i);
  const endWidth = (k: number) => widthCache[k];
  const kindOf = new Int8Array(nAll);
  const stops: number[] = [];
  for (let root = 0; root < nAll; root++) {
    const d = degree[root];
    if (d === 0 || isDropped(root)) continue;
    let kind = 0;
    if (portOfRoot.has(root)) kind = 1;
    else if (d >= 3) kind = 2;
    else if (d === 1) kind = 3;
    else {
      const a = endsAt[offset[root]];
      const b = endsAt[offset[root] + 1];
      const wa = endWidth(a);
      const wb = endWidth(b);
      if (pieces.layer[a >> 1] !== pieces.layer[b >> 1] || Math.abs(wa - wb) > 1e-6 * Math.max(wa, wb)) kind = 4;
    }
    kindOf[root] = kind;
    if (kind > 0) stops.push(root);
  }
  // Not needed by the segment walk: freed before the network is built (a root's degree is also offset[r + 1] − offset[r]).
  comp = NO_I32;
  degree = NO_I32;
  pieces.releaseWidthsAndSources();

  stage("node kinds");
  // Walk segments between stop nodes.
  const nodeIndex = new Int32Array(nAll).fill(-1);
  const nodes: NetworkNode[] = [];
  const nodeOf = (root: number): string => {
    if (nodeIndex[root] >= 0) return nodes[nodeIndex[root]].id;
    const id = `n${nodes.length + 1}`;
    nodeIndex[root] = nodes.length;
    const pi = portOfRoot.get(root);
    if (pi !== undefined) nodes.push({ id, xM: ports[pi].cx * mpu, yM: ports[pi].cy * mpu, kind: "port", port: ports[pi].name });
    else {
      const k = firstEnd(root);
      endPointInto(pieces, k, scratchEnd);
      nodes.push({ id, xM: scratchEnd[0] * mpu, yM: scratchEnd[1] * mpu, kind: KINDS[kindOf[root]], port: null });
    }
    return id;
  };
  // Walk from the ports first (in port order), then the other nodes in drawing order: stable numbering.
  // Kind 1 marks exactly the port roots among the stops (no map lookup per stop).
  const portStops = stops.filter((r) => kindOf[r] === 1).sort((a, b) => portOfRoot.get(a)! - portOfRoot.get(b)!);
  const otherStops = stops.filter((r) => kindOf[r] !== 1);
  stops.length = 0;
  stops.push(...portStops);
  for (const r of otherStops) stops.push(r);
  const usedPiece = new Uint8Array(pieces.n);
  const segments: NetworkSegment[] = [];
  // The pieces of the segment being walked and their directions (1: start to end): typed arrays with a count, reused
  // (setting a plain array's length to 0 for each of 20k segments costs more than the walk itself).
  const chain = new Int32Array(pieces.n);
  const chainFwd = new Uint8Array(pieces.n);
  // The first path end seen at each node (by node index): later segment ends there with exactly the same coordinates
  // share that point array instead of holding their own (a node of degree 4 then holds one, not four).
  const nodeEnds: [number, number][] = [];
  for (const start of stops) {
    for (let e0 = offset[start]; e0 < offset[start + 1]; e0++) {
      const k0 = endsAt[e0];
      if (usedPiece[k0 >> 1]) continue;
      let n = 0;
      let k = k0;
      let endRoot = start;
      for (;;) {
        const i = k >> 1;
        usedPiece[i] = 1;
        chain[n] = i;
        chainFwd[n++] = (k & 1) === 0 ? 1 : 0;
        endRoot = rootOf[k ^ 1];
        if (kindOf[endRoot] !== 0) break;
        let next = -1;
        for (let e = offset[endRoot]; e < offset[endRoot + 1]; e++) {
          const cand = endsAt[e];
          if (cand >> 1 !== i && !usedPiece[cand >> 1]) {
            next = cand;
            break;
          }
        }
        if (next === -1) break;
        k = next;
      }
      const from = nodeOf(start);
      const to = nodeOf(endRoot);
      segments.push(makeSegment(`s${segments.length + 1}`, from, to, chain, chainFwd, n, pieces, layers, widthCache, mpu, nodeEnds, nodeIndex[start], nodeIndex[endRoot]));
      if ((segments.length & 1023) === 0) onSample?.();
    }
  }
  stage("segments");
  const networkPorts: NetworkPort[] = [];
  for (const [root, pi] of portOfRoot) {
    if (offset[root + 1] === offset[root]) continue;
    const id = nodeOf(root);
    networkPorts.push({ name: ports[pi].name, node: id, xM: ports[pi].cx * mpu, yM: ports[pi].cy * mpu, radiusM: ports[pi].r * mpu });
  }
  networkPorts.sort((a, b) => a.name.localeCompare(b.name));

  const tolOutline = Math.max(snap, 1e-9 * Math.max(Math.abs(maxX - minX), Math.abs(maxY - minY)));
  const outline = chainOutline(outlinePaths, outlineCircles, tolOutline, mpu);
  const bounds = Number.isFinite(minX)
    ? { minXM: minX * mpu, minYM: minY * mpu, maxXM: maxX * mpu, maxYM: maxY * mpu }
    : { minXM: 0, minYM: 0, maxXM: 0, maxYM: 0 };

  stage("ports, outline, bounds");
  return {
    units,
    nodes,
    segments,
    ports: networkPorts,
    warnings,
    layers: plan.summaries,
    outline,
    bounds,
    mappingProposed: plan.mappingProposed,
    ...(maskRings.length > 0 ? { masks: maskRings.map((m) => ({ layer: m.layer, ringsM: unflatten(m.flat, mpu) })) } : {}),
  };
}

/**
 * The point array already held at node `node` when (x, y) are exactly its coordinates (Object.is: −0 stays −0),
 * else a new one, remembered when the node has none (no throw-away array for the shared case).
 */
function endAt(ends: [number, number][], node: number, x: number, y: number): [number, number] {
  const held = ends[node];
  if (held !== undefined && Object.is(held[0], x) && Object.is(held[1], y)) return held;
  const p: [number, number] = [x, y];
  if (held === undefined) ends[node] = p;
  return p;
}

/** A piece's width points (fractions along it and widths, metres), reused for every piece of every segment. */
const profF: number[] = [];
const profW: number[] = [];
/** The segment's width profile while it is built (positions and widths, SI), copied into its columns once at the end. */
const segS: number[] = [];
const segW: number[] = [];

/** Steps for drawing an arc: every ≤ 5°, at least two. */
const arcSteps = (sweep: number) => Math.max(2, Math.ceil(Math.abs(sweep) / (Math.PI / 36)));

function makeSegment(
  id: string,
  from: string,
  to: string,
  chain: Int32Array,
  chainFwd: Uint8Array,
  /** How many entries of chain and chainFwd belong to this segment. */
  n: number,
  pieces: PieceStore,
  layers: ResolvedLayer[],
  widthCache: Float64Array,
  mpu: number,
  /** Path ends held per node index (see endAt), and the indices of the from and to nodes. */
  ends: [number, number][],
  fromNode: number,
  toNode: number,
): NetworkSegment {
  const layer = layers[pieces.layer[chain[0]]];
  // The path's exact size up front: arrays grown by push keep spare capacity, which 20k short paths would hold on to.
  let nPath = 1;
  for (let c = 0; c < n; c++) {
    const i = chain[c];
    nPath += pieces.isLine(i) ? 1 : arcSteps(pieces.g4[i]);
  }
  const path = new Array<[number, number]>(nPath);
  let np = 0;
  // Profile points so far in segS/segW (−1: widths constant so far, no profile yet).
  let nProf = -1;
  let s = 0;
  let minR: number | null = null;
  let area = 0;
  let first = NaN;
  let lastW = NaN;
  let minW = Infinity;
  let maxW = -Infinity;
  for (let c = 0; c < n; c++) {
    const i = chain[c];
    const fwd = chainFwd[c] === 1;
    const line = pieces.isLine(i);
    const len = pieces.len[i];
    const a = widthCache[2 * i];
    const b = widthCache[2 * i + 1];
    const w0 = fwd ? a : b;
    const w1 = fwd ? b : a;
    // Lines: g0…g3 = x0, y0, x1, y1; arcs: g0…g4 = cx, cy, r, a0, sweep, points as pointAt computes them.
    const g0 = pieces.g0[i], g1 = pieces.g1[i], g2 = pieces.g2[i], g3 = pieces.g3[i], g4 = pieces.g4[i];
    if (np === 0) {
      if (line) path[np++] = fwd ? endAt(ends, fromNode, g0 * mpu, g1 * mpu) : endAt(ends, fromNode, g2 * mpu, g3 * mpu);
      else {
        const ang = g3 + g4 * (fwd ? 0 : 1);
        path[np++] = endAt(ends, fromNode, (g0 + g2 * Math.cos(ang)) * mpu, (g1 + g2 * Math.sin(ang)) * mpu);
      }
      first = w0;
    }
    const lastPiece = c === n - 1;
    if (line) {
      const x = fwd ? g2 * mpu : g0 * mpu;
      const y = fwd ? g3 * mpu : g1 * mpu;
      path[np++] = lastPiece ? endAt(ends, toNode, x, y) : [x, y];
    } else {
      const steps = arcSteps(g4);
      for (let k = 1; k <= steps; k++) {
        const ang = g3 + g4 * (fwd ? k / steps : 1 - k / steps);
        const x = (g0 + g2 * Math.cos(ang)) * mpu;
        const y = (g1 + g2 * Math.sin(ang)) * mpu;
        path[np++] = lastPiece && k === steps ? endAt(ends, toNode, x, y) : [x, y];
      }
    }
    // The piece's widths: linear from w0 to w1, or through its profile's m points between (outline centrelines).
    const pid = pieces.profileOf(i);
    let m = 0;
    if (pid >= 0) {
      m = pieces.profiles.pointsBetween(pid, fwd ? pieces.ps0[i] : pieces.ps1[i], fwd ? pieces.ps1[i] : pieces.ps0[i], profF, profW);
    }
    for (let q = 0; q <= m; q++) {
      const wa = q === 0 ? w0 : profW[q - 1] * mpu, wb = q === m ? w1 : profW[q] * mpu;
      const sa = q === 0 ? s : s + len * profF[q - 1], sb = q === m ? s + len : s + len * profF[q];
      // A width profile only when widths vary along the segment.
      if (nProf < 0 && (wa !== first || wb !== first)) {
        nProf = 0;
        if (sa !== 0) {
          segS[0] = 0;
          segW[0] = first;
          segS[1] = sa * mpu;
          segW[1] = first;
          nProf = 2;
        }
      }
      if (nProf >= 0) {
        // Repeated points are left out here, so the profile needs no second pass.
        if (nProf === 0 || segS[nProf - 1] !== sa * mpu || segW[nProf - 1] !== wa) {
          segS[nProf] = sa * mpu;
          segW[nProf++] = wa;
        }
        if (segS[nProf - 1] !== sb * mpu || segW[nProf - 1] !== wb) {
          segS[nProf] = sb * mpu;
          segW[nProf++] = wb;
        }
      }
      // (len itself for a plain piece: s + len − s may differ from it in the last bit.)
      area += ((wa + wb) / 2) * (m === 0 ? len : sb - sa);
      minW = Math.min(minW, wa, wb);
      maxW = Math.max(maxW, wa, wb);
    }
    s += len;
    lastW = w1;
    const r = line ? pieces.curveRadius(i) : g2;
    if (r !== null) minR = minR === null ? r : Math.min(minR, r);
  }
  const lengthM = s * mpu;
  // A single linear taper is described by its end widths; anything else carries its profile (and the mean width).
  let linear = true;
  for (let k = 0; k < nProf && linear; k++) linear = Math.abs(first + ((lastW - first) * segS[k]) / (lengthM || 1) - segW[k]) <= 1e-9 * maxW;
  const seg: NetworkSegment = {
    id,
    layer: layer.name,
    from,
    to,
    lengthM,
    widthM: linear ? first : area / s,
    endWidthM: lastW,
    depthM: layer.depthM as number,
    section: layer.section,
    minBendRadiusM: minR === null ? null : minR * mpu,
    path,
  };
  if (minW !== maxW) {
    seg.minWidthM = minW;
    seg.maxWidthM = maxW;
  }
  if (!linear) seg.widthProfile = { sM: segS.slice(0, nProf), widthM: segW.slice(0, nProf) };
  return seg;
}
