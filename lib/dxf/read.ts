/**
 * DXF bytes or text → typed entities in drawing units (lib/dxf/types.ts), or a
 * LayoutError saying what to fix. Parsing is dxf-parser's; this module adds the
 * checks a web upload needs (size, empty, truncated, binary DXF, DWG), expands
 * INSERTs (nested, arrays, mirror), resolves OCS mirroring, and turns every
 * curve into line and arc pieces.
 */
import DxfParser from "dxf-parser";
import type { IDxf, IEntity, IBlock } from "dxf-parser";
import { LayoutError } from "../errors";
import { flattenNurbs, flattenParametric, minRadiusOfPolyline, type Pt } from "./curves";
import { COUNTED_ONLY_TYPES, countingHandler, LeanArc, LeanCircle, LeanLine, LeanLwpolyline, PolylineWithWidths, SplineWithWeights, type RawPolyline, type RawSpline } from "./handlers";
import { flattenHatchEdge, HatchWithBoundaries, type RawHatch } from "./hatch";
import type { ArcPiece, DrawingEntity, DxfDrawing, Piece } from "./types";
import { TextScanner, TRUNCATED_MESSAGE, type Group, type GroupScanner } from "./scanner";
import { INSUNITS_OTHER_NAMES, INSUNITS_TO_UNIT, METRES_PER_UNIT, type DrawingUnit } from "./units";

/** Largest layout accepted by default, bytes (25 MiB). */
export const MAX_LAYOUT_BYTES = 25 * 1024 * 1024;
/** Most entities after block expansion; protects against array-of-array bombs. */
export const MAX_EXPANDED_ENTITIES = 2_000_000;
const MAX_INSERT_DEPTH = 16;

export interface ReadDxfOptions {
  /** Size limit in bytes (default MAX_LAYOUT_BYTES). */
  maxBytes?: number;
  /** Chord tolerance for flattening splines and ellipses, metres. */
  chordToleranceM: number;
  /** Drawing unit from the conditions; overrides $INSUNITS. */
  units?: DrawingUnit;
  /** Called as each stage ends (benchmark breakdown only). */
  onStage?: (stage: string) => void;
  /**
   * false: dxf-parser parses the whole text before any entity is walked, the way the streamed read (default) is
   * checked against in the tests. Same result either way; the streamed read is faster and holds less.
   */
  streamEntities?: boolean;
  /** Called every 1,024 entities read and walked (the benchmark samples the heap there); no effect on the result. */
  onSample?: () => void;
}

/** 2-D affine map: x' = a·x + b·y + e, y' = c·x + d·y + f. */
type Affine = readonly [number, number, number, number, number, number];
const IDENTITY: Affine = [1, 0, 0, 1, 0, 0];

const compose = (m: Affine, n: Affine): Affine => [
  m[0] * n[0] + m[1] * n[2],
  m[0] * n[1] + m[1] * n[3],
  m[2] * n[0] + m[3] * n[2],
  m[2] * n[1] + m[3] * n[3],
  m[0] * n[4] + m[1] * n[5] + m[4],
  m[2] * n[4] + m[3] * n[5] + m[5],
];
const apply = (m: Affine, x: number, y: number): Pt => ({ x: m[0] * x + m[1] * y + m[4], y: m[2] * x + m[3] * y + m[5] });
const det = (m: Affine) => m[0] * m[3] - m[1] * m[2];
const isSimilarity = (m: Affine) => {
  const s2 = Math.abs(det(m));
  return Math.abs(m[0] * m[1] + m[2] * m[3]) <= 1e-9 * s2 && Math.abs(m[0] * m[0] + m[2] * m[2] - (m[1] * m[1] + m[3] * m[3])) <= 1e-9 * s2;
};
/** OCS with extrusion (0,0,−1) is the WCS mirrored in x (DXF arbitrary-axis algorithm for that one normal). */
const MIRROR_X: Affine = [-1, 0, 0, 1, 0, 0];

const TAU = 2 * Math.PI;
const startsWith = (bytes: Uint8Array, text: string) => {
  if (bytes.length < text.length) return false;
  for (let i = 0; i < text.length; i++) if (bytes[i] !== text.charCodeAt(i)) return false;
  return true;
};

/**
 * Check the raw upload and decode it to text.
 * @throws LayoutError empty_file, too_large, binary_dxf, dwg_file.
 */
export function decodeLayout(input: string | Uint8Array, maxBytes = MAX_LAYOUT_BYTES): string {
  const size = typeof input === "string" ? input.length : input.byteLength;
  if (size > maxBytes) {
    throw new LayoutError(
      "too_large",
      `The layout is ${(size / 1048576).toFixed(1)} MiB; the limit is ${(maxBytes / 1048576).toFixed(1)} MiB. Remove unused blocks and layers, or purge the drawing, and export again.`,
    );
  }
  const head = typeof input === "string" ? new TextEncoder().encode(input.slice(0, 32)) : input.subarray(0, 32);
  if (startsWith(head, "AutoCAD Binary DXF")) {
    throw new LayoutError("binary_dxf", "This is a binary DXF. Export the layout as an ASCII DXF (R12, R2000 or later) and upload that.");
  }
  // DWG files open with their version string: AC1.2 … AC2.10 for the oldest, AC1001 … AC1032 since.
  if (startsWith(head, "AC10") || startsWith(head, "AC1.") || startsWith(head, "AC2.")) {
    throw new LayoutError("dwg_file", "This is a DWG drawing, not a DXF. Save or export it as an ASCII DXF and upload that.");
  }
  const text = typeof input === "string" ? input : new TextDecoder("utf-8").decode(input);
  if (text.trim() === "") throw new LayoutError("empty_file", "The layout file is empty. Upload an ASCII DXF export of the chip layout.");
  if (!/^\s*0\s*\r?\n\s*SECTION\s*$/m.test(text.slice(0, 65536))) {
    throw new LayoutError("not_dxf", "This file is not a DXF drawing (no SECTION found). Upload an ASCII DXF export of the chip layout.");
  }
  if (!/(^|\n)\s*0\s*\r?\n\s*EOF\s*$/.test(text.slice(-64))) {
    throw new LayoutError("truncated_file", "The DXF ends before its EOF marker: the file is truncated. Upload the complete file again.");
  }
  return text;
}

const SECTION_START = /(^|\n)[ \t]*0[ \t]*\r?\n[ \t]*SECTION[ \t]*\r?\n[ \t]*2[ \t]*\r?\n[ \t]*([^\r\n]*?)[ \t]*\r?\n/g;
const SECTIONS_READ = new Set(["HEADER", "BLOCKS", "ENTITIES"]);

/**
 * The text with only the sections a layout needs (HEADER, BLOCKS, ENTITIES). The others (TABLES,
 * CLASSES, OBJECTS, …) hold nothing Stokeline reads, and dxf-parser's TABLES reader can loop
 * forever on a damaged table; leaving them out also makes the parse cheaper.
 * @throws LayoutError truncated_file when a section has no ENDSEC before the end, unreadable_dxf when it has none before
 * the next section (dxf-parser's LAYER and VPORT table readers never return on such a file; its others read past the cut).
 */
export function keepLayoutSections(text: string): string {
  const parts: string[] = [];
  let from = 0;
  SECTION_START.lastIndex = 0;
  let m = SECTION_START.exec(text);
  while (m) {
    const name = m[2];
    const start = m.index + m[1].length;
    const body = SECTION_START.lastIndex;
    const end = findEndsec(text, body);
    SECTION_START.lastIndex = body;
    const next = SECTION_START.exec(text);
    if (end === null) throw unterminatedSection(name, false);
    if (next !== null && next.index + next[1].length < end.at) throw unterminatedSection(name, true);
    if (name.toUpperCase() === "BLOCKS") checkBlockEnds(text, body, end.at);
    if (!SECTIONS_READ.has(name.toUpperCase())) {
      parts.push(text.slice(from, start));
      from = end.after;
    }
    m = next;
  }
  if (from === 0) return text;
  parts.push(text.slice(from));
  return parts.join("");
}

function unterminatedSection(name: string, beforeNext: boolean): LayoutError {
  const section = name.slice(0, 40) || "unnamed";
  if (beforeNext) {
    return new LayoutError(
      "unreadable_dxf",
      `The DXF's ${section} section has no end (ENDSEC) before the next section starts: the file is damaged there. Export it again as an ASCII DXF.`,
    );
  }
  return new LayoutError("truncated_file", `The DXF ends in the middle of a section (${section} has no ENDSEC): the file is truncated. Upload the complete file again.`);
}

const BLOCK_MARK = /(^|\n)[ \t]*0[ \t]*\r?\n[ \t]*(BLOCK|ENDBLK)[ \t]*(?=\r?\n)/g;

/**
 * Every BLOCK in text[from, to) closed by its ENDBLK before the next BLOCK or the section's end (DXF reference, BLOCKS
 * section). Without one, dxf-parser reads the block on into the next section and stops only at the EOF marker.
 * @throws LayoutError unreadable_dxf naming the block.
 */
function checkBlockEnds(text: string, from: number, to: number): void {
  let open: number | null = null;
  BLOCK_MARK.lastIndex = from === 0 ? 0 : from - 1;
  for (let m = BLOCK_MARK.exec(text); m && m.index < to; m = BLOCK_MARK.exec(text)) {
    if (m[2] === "ENDBLK") open = null;
    else if (open !== null) break;
    else open = BLOCK_MARK.lastIndex;
  }
  if (open === null) return;
  // The block's name is its header's group 2; the header's lines read in pairs (code, value) up to the next group 0.
  const lines = text.slice(open, Math.min(to, open + 4000)).split("\n");
  let name: string | undefined;
  for (let k = 1; k + 1 < lines.length && name === undefined; k += 2) {
    const code = lines[k].trim();
    if (code === "0") break;
    if (code === "2") name = lines[k + 1].trim();
  }
  throw new LayoutError(
    "unreadable_dxf",
    `The DXF's block ${name ? `"${name.slice(0, 60)}" ` : ""}has no end (ENDBLK) before the next block or the end of the BLOCKS section: the file is damaged there. Export it again as an ASCII DXF.`,
  );
}

const ENDSEC_AT = /[ \t]*0[ \t]*\r?\n[ \t]*ENDSEC[ \t]*(\r?\n|$)/y;

/**
 * The first ENDSEC group at or after offset from (a code line starting there or later): the offset of its code line
 * and the offset after its value line, or null. Candidates by indexOf (a regex over a large section is slower), each
 * checked at its code line.
 */
function findEndsec(text: string, from: number): { at: number; after: number } | null {
  for (let i = text.indexOf("ENDSEC", from); i !== -1; i = text.indexOf("ENDSEC", i + 6)) {
    const valueLine = text.lastIndexOf("\n", i - 1) + 1;
    if (valueLine <= from) continue;
    const codeLine = text.lastIndexOf("\n", valueLine - 2) + 1;
    if (codeLine < from) continue;
    ENDSEC_AT.lastIndex = codeLine;
    const m = ENDSEC_AT.exec(text);
    if (m) return { at: codeLine, after: codeLine + m[0].length };
  }
  return null;
}

/** A dxf-parser entity handler, as dxf-parser keeps them by entity type name. */
interface EntityHandler {
  parseEntity(scanner: GroupScanner, head: Group): IEntity;
}

function newParser(): DxfParser {
  const parser = new DxfParser();
  // dxf-parser's handler type names its own classes; ours have the same shape.
  parser.registerEntityHandler(LeanLine as never);
  parser.registerEntityHandler(LeanArc as never);
  parser.registerEntityHandler(LeanCircle as never);
  parser.registerEntityHandler(LeanLwpolyline as never);
  parser.registerEntityHandler(PolylineWithWidths as never);
  parser.registerEntityHandler(SplineWithWeights as never);
  for (const t of COUNTED_ONLY_TYPES) parser.registerEntityHandler(countingHandler(t) as never);
  // After the counting handlers: this one replaces their HATCH entry and reads the boundary paths.
  parser.registerEntityHandler(HatchWithBoundaries as never);
  return parser;
}

/** A failure of the parse as a LayoutError: dxf-parser's message for a file it cannot read, or ours as it is. */
function parseError(e: unknown): LayoutError {
  // Our scanner and handlers already answer in our words.
  if (e instanceof LayoutError) return e;
  const msg = e instanceof Error ? e.message : String(e);
  if (/Unexpected end of input/i.test(msg)) return new LayoutError("truncated_file", TRUNCATED_MESSAGE);
  return new LayoutError("unreadable_dxf", `The DXF could not be read (${msg.slice(0, 200)}). Export it again as an ASCII DXF.`);
}

/** Run fn with the console silenced: dxf-parser reports oddities there and carries on; keep them off the CLI's JSON output. */
function quietly<T>(fn: () => T): T {
  const saved = { error: console.error, log: console.log, warn: console.warn };
  try {
    console.error = console.log = console.warn = () => undefined;
    return fn();
  } finally {
    console.error = saved.error;
    console.log = saved.log;
    console.warn = saved.warn;
  }
}

/** The whole text (layout sections only) through dxf-parser. */
function parseText(kept: string): IDxf {
  try {
    const dxf = quietly(() => newParser().parseSync(kept));
    if (!dxf) throw new Error("no result");
    return dxf;
  } catch (e) {
    throw parseError(e);
  }
}

const ENTITIES_START = /(^|\n)[ \t]*0[ \t]*\r?\n[ \t]*SECTION[ \t]*\r?\n[ \t]*2[ \t]*\r?\n[ \t]*ENTITIES[ \t]*\r?\n/g;
const LONE_CR = /\r(?!\n)/g;
/** An entity type no DXF uses: a one-entity ENTITIES section of it stands in for the real one in the header-and-blocks parse. */
const PROBE_TYPE = "$STOKELINE_ENTITIES_PROBE";
const PROBE_SECTION = `0\nSECTION\n2\nENTITIES\n0\n${PROBE_TYPE}\n0\nENDSEC\n`;

/** The ENTITIES section left for the streamed read: its body [from, endsecAt) in the kept text, and what dxf-parser made of the rest. */
interface EntitiesSplit {
  from: number;
  endsecAt: number;
  dxf: IDxf;
  handlers: Record<string, EntityHandler>;
  /** The automatic handle dxf-parser gave the probe: the next one it would give the first entity without a handle. */
  nextHandle: number;
}

/**
 * Parse everything but the ENTITIES section with dxf-parser, a probe entity in the section's place.
 * Null when the file is not shaped so that the result is what the whole parse would give (then the caller parses
 * the whole text): the section not found, dxf-parser not reading the probe as the model-space entities (a damaged
 * file, a second ENTITIES section), handles after the section numbered by dxf-parser, a lone CR line end, or any error.
 */
function splitEntities(kept: string): EntitiesSplit | null {
  ENTITIES_START.lastIndex = 0;
  const start = ENTITIES_START.exec(kept);
  if (!start) return null;
  const sectionAt = start.index + start[1].length;
  const from = start.index + start[0].length;
  const endsec = findEndsec(kept, from);
  if (endsec === null) return null;
  const endsecAt = endsec.at;
  const after = endsec.after;
  // The scanner splits lines at LF (and CRLF); dxf-parser also at a lone CR.
  LONE_CR.lastIndex = from;
  if (LONE_CR.test(kept)) return null;
  const parser = newParser();
  let probe: object | null = null;
  let probes = 0;
  parser.registerEntityHandler(
    class {
      public ForEntityName = PROBE_TYPE;
      public parseEntity(scanner: GroupScanner) {
        probes++;
        for (let g = scanner.next(); !scanner.isEOF() && g.code !== 0; g = scanner.next());
        return (probe = { type: PROBE_TYPE });
      }
    } as never,
  );
  const handlers = (parser as unknown as { _entityHandlers?: Record<string, EntityHandler> })._entityHandlers;
  if (!handlers || typeof handlers !== "object") return null;
  let dxf: IDxf | null;
  try {
    dxf = quietly(() => parser.parseSync(kept.slice(0, sectionAt) + PROBE_SECTION + kept.slice(after)));
  } catch {
    return null;
  }
  if (!dxf || probes !== 1 || dxf.entities?.length !== 1 || dxf.entities[0] !== probe) return null;
  const nextHandle = (probe as { handle?: unknown }).handle;
  if (typeof nextHandle !== "number") return null;
  // A number handle above the probe's was given after the section; in the whole parse it would count the section's entities too.
  for (const block of Object.values(dxf.blocks ?? {})) {
    const late = (h: unknown) => typeof h === "number" && h > nextHandle;
    if (late(block.handle) || (block.entities ?? []).some((e) => late(e.handle))) return null;
  }
  dxf.entities = [];
  delete handlers[PROBE_TYPE];
  return { from, endsecAt, dxf, handlers, nextHandle };
}

/**
 * The ENTITIES section read group by group with dxf-parser's entity loop and handlers, each entity walked into ctx as
 * soon as it is read, so the raw entities are never held together. A walk error waits until the section is read:
 * a parse error anywhere comes first, as with the whole parse.
 * @returns the number of entities read, or null when dxf-parser would have ended the section elsewhere.
 */
function streamEntities(ctx: Ctx, kept: string, split: EntitiesSplit, onSample?: () => void): number | null {
  const scanner = new TextScanner(kept, split.from, kept.length);
  let nextHandle = split.nextHandle;
  let read = 0;
  let walkError: unknown = null;
  let endAt = -1;
  try {
    quietly(() => {
      let curr = scanner.next();
      for (;;) {
        if (curr.code !== 0) {
          curr = scanner.next();
          continue;
        }
        if (curr.value === "ENDSEC") break;
        const handler = split.handlers[curr.value as string];
        if (handler == null) {
          curr = scanner.next();
          continue;
        }
        const entity = handler.parseEntity(scanner, curr);
        if (!entity) throw new Error(`The ${String(curr.value)} reader returned no entity`);
        curr = scanner.lastReadGroup;
        // An entity without a handle gets the next number, as in the whole parse.
        if (!entity.handle) (entity as { handle: unknown }).handle = nextHandle++;
        if ((++read & 1023) === 0) onSample?.();
        if (walkError === null) {
          try {
            walkEntity(ctx, entity, IDENTITY, null, 0, []);
          } catch (e) {
            walkError = e;
          }
        }
      }
      endAt = scanner.lastGroupStart;
    });
  } catch (e) {
    throw parseError(e);
  }
  // The ENDSEC group that ended the loop must be the one found by text search, where the probe parse went on.
  if (endAt !== split.endsecAt) return null;
  if (walkError !== null) throw walkError;
  return read;
}

type AnyEntity = IEntity & Record<string, unknown>;

interface Ctx {
  blocks: Record<string, IBlock>;
  tol: number;
  out: DrawingEntity[];
  counts: Map<string, Record<string, number>>;
  notes: Map<string, { code: string; message: string; n: number }>;
  expanded: number;
  /** The last layer counted and its counts: entities come in runs on one layer (one Map lookup per run). */
  lastLayer: string | null;
  lastCounts: Record<string, number> | null;
}

function note(ctx: Ctx, code: string, message: string) {
  const n = ctx.notes.get(code);
  if (n) n.n++;
  else ctx.notes.set(code, { code, message, n: 1 });
}

function count(ctx: Ctx, layer: string, type: string) {
  let c = layer === ctx.lastLayer ? ctx.lastCounts : ctx.counts.get(layer);
  if (!c) ctx.counts.set(layer, (c = {}));
  ctx.lastLayer = layer;
  ctx.lastCounts = c;
  c[type] = (c[type] ?? 0) + 1;
  if (++ctx.expanded > MAX_EXPANDED_ENTITIES) {
    throw new LayoutError("too_many_entities", `The layout expands to more than ${MAX_EXPANDED_ENTITIES.toLocaleString("en")} entities (block arrays inside arrays?). Explode or simplify the blocks and export again.`);
  }
}

const normSweep = (s: number) => {
  let v = s % TAU;
  if (v <= 1e-12) v += TAU;
  return v;
};

function arcEnd(a: ArcPiece): Pt {
  const t = a.a0 + a.sweep;
  return { x: a.cx + a.r * Math.cos(t), y: a.cy + a.r * Math.sin(t) };
}

/** Sample an arc as points (for arcs under a non-uniform scale, which become ellipses). */
function sampleArc(a: ArcPiece, tol: number): Pt[] {
  const step = a.r > tol ? 2 * Math.acos(1 - tol / a.r) : Math.PI / 4;
  const n = Math.max(2, Math.min(4096, Math.ceil(Math.abs(a.sweep) / Math.min(step, Math.PI / 8))));
  const pts: Pt[] = [];
  for (let i = 0; i <= n; i++) {
    const t = a.a0 + (a.sweep * i) / n;
    pts.push({ x: a.cx + a.r * Math.cos(t), y: a.cy + a.r * Math.sin(t) });
  }
  return pts;
}

function linesThrough(pts: Pt[], w0: number | null, w1: number | null): Piece[] {
  const pieces: Piece[] = [];
  let total = 0;
  for (let i = 1; i < pts.length; i++) total += Math.hypot(pts[i].x - pts[i - 1].x, pts[i].y - pts[i - 1].y);
  let s = 0;
  const widthAt = (u: number) => (w0 === null || w1 === null ? (w0 ?? w1) : w0 + (w1 - w0) * u);
  for (let i = 1; i < pts.length; i++) {
    const len = Math.hypot(pts[i].x - pts[i - 1].x, pts[i].y - pts[i - 1].y);
    if (len === 0) continue;
    const a = total > 0 ? s / total : 0;
    s += len;
    const b = total > 0 ? s / total : 1;
    pieces.push({ kind: "line", x0: pts[i - 1].x, y0: pts[i - 1].y, x1: pts[i].x, y1: pts[i].y, w0: widthAt(a), w1: widthAt(b) });
  }
  return pieces;
}

/** Transform pieces by m; arcs stay arcs under similarities, otherwise they are flattened. */
function transformPieces(pieces: Piece[], m: Affine, tol: number): { pieces: Piece[]; flattenedRadius: number | null } {
  if (m === IDENTITY) return { pieces, flattenedRadius: null };
  const s = Math.sqrt(Math.abs(det(m)));
  const ws = (w: number | null) => (w === null ? null : w * s);
  const similar = isSimilarity(m);
  const out: Piece[] = [];
  let flattenedRadius: number | null = null;
  for (const p of pieces) {
    if (p.kind === "line") {
      const a = apply(m, p.x0, p.y0);
      const b = apply(m, p.x1, p.y1);
      out.push({ kind: "line", x0: a.x, y0: a.y, x1: b.x, y1: b.y, w0: ws(p.w0), w1: ws(p.w1) });
    } else if (similar) {
      const c = apply(m, p.cx, p.cy);
      const st = apply(m, p.cx + p.r * Math.cos(p.a0), p.cy + p.r * Math.sin(p.a0));
      out.push({ kind: "arc", cx: c.x, cy: c.y, r: p.r * s, a0: Math.atan2(st.y - c.y, st.x - c.x), sweep: det(m) < 0 ? -p.sweep : p.sweep, w0: ws(p.w0), w1: ws(p.w1) });
    } else {
      const pts = sampleArc(p, tol / Math.max(1e-300, s)).map((q) => apply(m, q.x, q.y));
      const r = minRadiusOfPolyline(pts);
      if (r !== null) flattenedRadius = flattenedRadius === null ? r : Math.min(flattenedRadius, r);
      out.push(...linesThrough(pts, ws(p.w0), ws(p.w1)));
    }
  }
  return { pieces: out, flattenedRadius };
}

interface Vtx {
  x: number;
  y: number;
  bulge: number;
  sw: number | null;
  ew: number | null;
}

/** Polyline vertices → pieces; a bulge b between two vertices is an arc of sweep 4·atan(b) (DXF reference, LWPOLYLINE group 42). */
export function polylinePieces(verts: Vtx[], closed: boolean): Piece[] {
  const pieces: Piece[] = [];
  const n = verts.length;
  const count = closed ? n : n - 1;
  for (let i = 0; i < count; i++) {
    const v = verts[i];
    const u = verts[(i + 1) % n];
    // Repeated vertices give no piece (compared, not measured: Math.hypot is slow here, and only zero matters).
    if (u.x === v.x && u.y === v.y) continue;
    let w0 = v.sw;
    let w1 = v.ew;
    if (w0 === 0 && w1 === 0) w0 = w1 = null;
    if (w0 === null && w1 !== null) w0 = w1;
    if (w1 === null && w0 !== null) w1 = w0;
    if (!v.bulge) {
      pieces.push({ kind: "line", x0: v.x, y0: v.y, x1: u.x, y1: u.y, w0, w1 });
      continue;
    }
    const b = v.bulge;
    const sweep = 4 * Math.atan(b);
    // Centre sits on the chord's left normal at (c/2)·(1 − b²)/(2b) from the chord midpoint.
    const k = (1 - b * b) / (4 * b);
    const cx = (v.x + u.x) / 2 - (u.y - v.y) * k;
    const cy = (v.y + u.y) / 2 + (u.x - v.x) * k;
    const r = Math.hypot(v.x - cx, v.y - cy);
    pieces.push({ kind: "arc", cx, cy, r, a0: Math.atan2(v.y - cy, v.x - cx), sweep, w0, w1 });
  }
  return pieces;
}

function ellipsePoints(e: AnyEntity, tol: number): { pts: Pt[]; closed: boolean } | null {
  const c = e.center as Pt | undefined;
  const maj = e.majorAxisEndPoint as Pt | undefined;
  const ratio = Number(e.axisRatio ?? 1);
  if (!c || !maj) return null;
  let t0 = Number(e.startAngle ?? 0);
  let t1 = Number(e.endAngle ?? TAU);
  const closed = Math.abs(normSweep(t1 - t0) - TAU) < 1e-9;
  if (t1 <= t0) t1 += TAU;
  if (closed) { t0 = 0; t1 = TAU; }
  const ux = maj.x;
  const uy = maj.y;
  const vx = -maj.y * ratio;
  const vy = maj.x * ratio;
  const f = (t: number): Pt => ({ x: c.x + ux * Math.cos(t) + vx * Math.sin(t), y: c.y + uy * Math.cos(t) + vy * Math.sin(t) });
  return { pts: flattenParametric(f, t0, t1, tol, Math.max(4, Math.ceil((t1 - t0) / (Math.PI / 8)))), closed };
}

/** A point field of a parsed entity, or a LayoutError when the file left it out (a damaged entity). */
function requirePoint(v: unknown, type: string, layer: string, handle: string | null): Pt {
  const p = v as Partial<Pt> | undefined;
  if (!p || typeof p !== "object" || p.x === undefined || p.y === undefined) {
    throw new LayoutError(
      "entity_incomplete",
      `A ${type} on layer "${layer}"${handle ? ` (handle ${handle})` : ""} is missing its coordinates; the file is damaged there. Fix or delete the entity and export again.`,
    );
  }
  return p as Pt;
}

function layerOf(entity: AnyEntity, parentLayer: string | null): string {
  const own = typeof entity.layer === "string" && entity.layer !== "" ? entity.layer : "0";
  // Entities on layer 0 inside a block take the layer of the INSERT (DXF block rule).
  return own === "0" && parentLayer !== null ? parentLayer : own;
}

/** MTEXT inline formatting codes (\P, \f…;, braces…) removed, as the DXF reference lists them; a few regexes, no package needed. */
function stripMtext(text: string): string {
  return text
    .replace(/\\P/g, " ")
    .replace(/\\[ACcFfHhLlOoKkQqTtWw][^;\\{}]*;?/g, "")
    .replace(/\\S([^;]*);/g, "$1")
    .replace(/\\~/g, " ")
    .replace(/[{}]/g, "")
    .replace(/\s+/g, " ")
    .trim();
}

function pushPath(ctx: Ctx, layer: string, type: string, handle: string | null, pieces: Piece[], closed: boolean, m: Affine, curveRadius: number | null) {
  if (pieces.length === 0) return;
  if (m === IDENTITY) {
    // Model space, untransformed: the pieces as they are (the common case; no wrapper objects).
    ctx.out.push({ kind: "path", layer, type, handle, pieces, closed, minCurveRadius: curveRadius });
    return;
  }
  const t = transformPieces(pieces, m, ctx.tol);
  let radius = curveRadius === null ? null : curveRadius * Math.sqrt(Math.abs(det(m)));
  if (t.flattenedRadius !== null) radius = radius === null ? t.flattenedRadius : Math.min(radius, t.flattenedRadius);
  ctx.out.push({ kind: "path", layer, type, handle, pieces: t.pieces, closed, minCurveRadius: radius });
}

function walk(ctx: Ctx, entities: IEntity[], m: Affine, parentLayer: string | null, depth: number, stack: string[]) {
  for (const raw of entities) walkEntity(ctx, raw, m, parentLayer, depth, stack);
}

/** One parsed entity (an INSERT with its block) into ctx.out; the reader calls it as each top-level entity is parsed. */
function walkEntity(ctx: Ctx, raw: IEntity, m: Affine, parentLayer: string | null, depth: number, stack: string[]) {
  {
    const e = raw as AnyEntity;
    if (e.inPaperSpace) return;
    const type = String(e.type ?? "UNKNOWN");
    const layer = layerOf(e, parentLayer);
    const handle = e.handle === undefined ? null : String(e.handle);
    if (type === "INSERT") {
      expandInsert(ctx, e, m, layer, depth, stack);
      return;
    }
    count(ctx, layer, type);
    const ocs = Number((e.extrusionDirectionZ as number | undefined) ?? (e.extrusionDirection as Pt & { z?: number } | undefined)?.z ?? 1) < 0 ? compose(m, MIRROR_X) : m;
    switch (type) {
      case "LINE": {
        const v = (e.vertices as unknown[] | undefined) ?? [];
        const a = requirePoint(v[0], type, layer, handle);
        const b = requirePoint(v[1], type, layer, handle);
        pushPath(ctx, layer, type, handle, [{ kind: "line", x0: a.x, y0: a.y, x1: b.x, y1: b.y, w0: null, w1: null }], false, m, null);
        break;
      }
      case "ARC": {
        const c = requirePoint(e.center, type, layer, handle);
        const r = Number(e.radius);
        const a0 = Number(e.startAngle ?? 0);
        const sweep = normSweep(Number(e.endAngle ?? TAU) - a0);
        pushPath(ctx, layer, type, handle, [{ kind: "arc", cx: c.x, cy: c.y, r, a0, sweep, w0: null, w1: null }], false, ocs, null);
        break;
      }
      case "CIRCLE": {
        const c = requirePoint(e.center, type, layer, handle);
        const p = apply(m, c.x, c.y);
        ctx.out.push({ kind: "circle", layer, type: "CIRCLE", handle, cx: p.x, cy: p.y, r: Number(e.radius) * Math.sqrt(Math.abs(det(m))) });
        break;
      }
      case "LWPOLYLINE": {
        const vs = (e.vertices as ({ x: number; y: number; bulge?: number; startWidth?: number; endWidth?: number } | undefined)[] | undefined) ?? [];
        const constW = typeof e.width === "number" ? e.width : null;
        // One pass: each vertex checked and converted (no intermediate array).
        const verts: Vtx[] = new Array(vs.length);
        for (let k = 0; k < vs.length; k++) {
          const v = vs[k];
          requirePoint(v, type, layer, handle);
          verts[k] = { x: v!.x, y: v!.y, bulge: v!.bulge ?? 0, sw: v!.startWidth ?? constW, ew: v!.endWidth ?? constW };
        }
        pushPath(ctx, layer, type, handle, polylinePieces(verts, Boolean(e.shape)), Boolean(e.shape), ocs, null);
        break;
      }
      case "POLYLINE": {
        const p = raw as unknown as RawPolyline;
        if (p.flags & (16 | 64)) {
          note(ctx, "mesh_skipped", "Polygon and polyface meshes are not channel geometry and were skipped.");
          break;
        }
        const verts = p.vertices
          .filter((v) => !(v.flags & 16))
          .map((v) => ({ x: v.x, y: v.y, bulge: v.bulge, sw: v.startWidth ?? p.defaultStartWidth, ew: v.endWidth ?? p.defaultEndWidth }));
        const closed = (p.flags & 1) !== 0;
        pushPath(ctx, layer, type, handle, polylinePieces(verts, closed), closed, p.extrusionZ < 0 ? compose(m, MIRROR_X) : m, null);
        break;
      }
      case "SPLINE": {
        const s = raw as unknown as RawSpline;
        let pts: Pt[] | null = null;
        if (s.controlPoints.length > 0) {
          const weights = s.weights.length === s.controlPoints.length ? s.weights : [];
          pts = flattenNurbs(s.controlPoints, weights, s.knots, s.degree, ctx.tol);
        }
        if (!pts && s.fitPoints.length >= 2) {
          note(ctx, "spline_fit_points", "A spline without a usable control polygon was read as straight pieces through its fit points.");
          pts = s.fitPoints;
        }
        if (!pts) {
          note(ctx, "spline_invalid", "A spline with inconsistent knots or control points was skipped.");
          break;
        }
        const closed = (s.flags & 1) !== 0;
        pushPath(ctx, layer, type, handle, linesThrough(pts, null, null), closed, m, minRadiusOfPolyline(pts));
        break;
      }
      case "ELLIPSE": {
        const el = ellipsePoints(e, ctx.tol);
        if (!el) break;
        pushPath(ctx, layer, type, handle, linesThrough(el.pts, null, null), el.closed, ocs, minRadiusOfPolyline(el.pts));
        break;
      }
      case "TEXT": {
        const useEnd = (Number(e.halign ?? 0) !== 0 || Number(e.valign ?? 0) !== 0) && e.endPoint;
        const at = (useEnd ? e.endPoint : e.startPoint) as Pt | undefined;
        if (!at) break;
        const p = apply(m, at.x, at.y);
        ctx.out.push({ kind: "text", layer, type: "TEXT", handle, x: p.x, y: p.y, text: String(e.text ?? "").trim() });
        break;
      }
      case "MTEXT": {
        const at = e.position as Pt | undefined;
        if (!at) break;
        const p = apply(m, at.x, at.y);
        ctx.out.push({ kind: "text", layer, type: "MTEXT", handle, x: p.x, y: p.y, text: stripMtext(String(e.text ?? "")) });
        break;
      }
      case "HATCH": {
        // Boundary paths as closed paths (issue 9: filled masks).
        const h = raw as unknown as RawHatch;
        for (const path of h.paths ?? []) {
          let pieces: Piece[] = [];
          let curveRadius: number | null = null;
          if (path.kind === "polyline") pieces = polylinePieces(path.vertices.map((v) => ({ x: v.x, y: v.y, bulge: v.bulge, sw: null, ew: null })), true);
          else {
            const unknown = path.edges.find((ed) => ed.kind === "unsupported");
            if (unknown) {
              note(ctx, "hatch_edge_skipped", `A hatch boundary with an edge of unknown type ${unknown.type} was skipped; redraw it with lines and arcs or as a closed polyline.`);
              continue;
            }
            for (const ed of path.edges) {
              if (ed.kind === "line") pieces.push({ kind: "line", x0: ed.x0, y0: ed.y0, x1: ed.x1, y1: ed.y1, w0: null, w1: null });
              else if (ed.kind === "arc") {
                // DXF reference: a clockwise edge arc stores its angles mirrored (negated).
                const a0 = ((ed.ccw ? ed.startDeg : -ed.startDeg) * Math.PI) / 180;
                const sweep = normSweep(((ed.endDeg - ed.startDeg) * Math.PI) / 180) * (ed.ccw ? 1 : -1);
                pieces.push({ kind: "arc", cx: ed.cx, cy: ed.cy, r: ed.r, a0, sweep, w0: null, w1: null });
              } else if (ed.kind !== "unsupported") {
                const pts = flattenHatchEdge(ed, ctx.tol);
                if (!pts) {
                  note(ctx, "spline_invalid", "A spline with inconsistent knots or control points was skipped.");
                  pieces = [];
                  break;
                }
                const r = minRadiusOfPolyline(pts);
                if (r !== null) curveRadius = curveRadius === null ? r : Math.min(curveRadius, r);
                pieces.push(...linesThrough(pts, null, null));
              }
            }
          }
          if (pieces.length > 0) pushPath(ctx, layer, type, handle, pieces, true, h.extrusionZ < 0 ? compose(m, MIRROR_X) : m, curveRadius);
        }
        break;
      }
      default:
        break;
    }
  }
}

function expandInsert(ctx: Ctx, e: AnyEntity, m: Affine, layer: string, depth: number, stack: string[]) {
  const name = String(e.name ?? "");
  const block = ctx.blocks[name];
  if (!block) {
    note(ctx, "block_missing", `An INSERT refers to a block that is not in the file ("${name.slice(0, 60)}"); it was skipped.`);
    return;
  }
  if (depth >= MAX_INSERT_DEPTH || stack.includes(name)) {
    note(ctx, "block_recursion", `Block "${name.slice(0, 60)}" inserts itself or nests deeper than ${MAX_INSERT_DEPTH} levels; the inner copies were skipped.`);
    return;
  }
  const pos = (e.position as Pt | undefined) ?? { x: 0, y: 0 };
  const base = block.position ?? { x: 0, y: 0 };
  const sx = Number(e.xScale ?? 1) || 1;
  const sy = Number(e.yScale ?? 1) || 1;
  const rot = (Number(e.rotation ?? 0) * Math.PI) / 180;
  const cos = Math.cos(rot);
  const sin = Math.sin(rot);
  const cols = Math.max(1, Math.floor(Number(e.columnCount ?? 1)) || 1);
  const rows = Math.max(1, Math.floor(Number(e.rowCount ?? 1)) || 1);
  const cs = Number(e.columnSpacing ?? 0);
  const rs = Number(e.rowSpacing ?? 0);
  const ext = (e.extrusionDirection as (Pt & { z?: number }) | undefined)?.z ?? 1;
  const local: Affine = [cos * sx, -sin * sy, sin * sx, cos * sy, 0, 0];
  const toBase: Affine = [1, 0, 0, 1, -base.x, -base.y];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      // Array offsets run along the insert's rotated axes (DXF INSERT groups 44/45).
      const ox = pos.x + cos * c * cs - sin * r * rs;
      const oy = pos.y + sin * c * cs + cos * r * rs;
      let im: Affine = compose([1, 0, 0, 1, ox, oy], compose(local, toBase));
      if (ext < 0) im = compose(MIRROR_X, im);
      walk(ctx, block.entities ?? [], compose(m, im), layer, depth + 1, [...stack, name]);
    }
  }
}

const fin = Number.isFinite;
// Checked field by field: no array per piece (20k+ pieces on a large layout).
const badPiece = (p: Piece) => (p.kind === "line" ? !(fin(p.x0) && fin(p.y0) && fin(p.x1) && fin(p.y1)) : !(fin(p.cx) && fin(p.cy) && fin(p.r) && fin(p.a0) && fin(p.sweep)));
const badEntity = (e: DrawingEntity) => {
  if (e.kind === "circle") return !(fin(e.cx) && fin(e.cy) && fin(e.r));
  if (e.kind === "text") return !(fin(e.x) && fin(e.y));
  for (const p of e.pieces) if (badPiece(p)) return true;
  return false;
};

function checkFinite(entities: DrawingEntity[]) {
  const e = entities.find(badEntity);
  if (e) {
    throw new LayoutError(
      "non_finite_coordinates",
      `A ${e.type} on layer "${e.layer}"${e.handle ? ` (handle ${e.handle})` : ""} has coordinates that are not finite numbers. Fix or delete it in the CAD program and export again.`,
    );
  }
}

/**
 * Read a DXF layout into typed model-space entities in drawing units.
 * @param input DXF text or bytes (ASCII DXF, any version dxf-parser reads).
 * @throws LayoutError empty_file, truncated_file, binary_dxf, dwg_file, not_dxf, too_large, unreadable_dxf, non_finite_coordinates, too_many_entities.
 */
export function readDxf(input: string | Uint8Array, options: ReadDxfOptions): DxfDrawing {
  const text = decodeLayout(input, options.maxBytes);
  options.onStage?.("checks and decoding");
  const kept = keepLayoutSections(text);
  const split = options.streamEntities === false ? null : splitEntities(kept);
  let dxf = split ? split.dxf : parseText(kept);
  options.onStage?.(split ? "dxf-parser parse (all but the entities)" : "dxf-parser parse");
  const rawIns = dxf.header?.["$INSUNITS"];
  const insUnits = typeof rawIns === "number" && Number.isFinite(rawIns) ? rawIns : null;
  const fromFile = insUnits === null ? undefined : INSUNITS_TO_UNIT[insUnits];
  const drawingUnit = options.units ?? fromFile;
  const units = drawingUnit
    ? { drawing: drawingUnit, source: options.units ? ("conditions" as const) : ("$INSUNITS" as const), metresPerUnit: METRES_PER_UNIT[drawingUnit] }
    : null;
  const declared = insUnits === null ? "does not declare its units ($INSUNITS is absent)" : `declares $INSUNITS = ${insUnits} (${INSUNITS_OTHER_NAMES[insUnits] ?? "unknown code"})`;
  const unitsProblem = units
    ? null
    : `The drawing ${declared}. Say which unit its coordinates are in: add "units": "um" (or nm, mm, cm, m, in, mil) to the conditions.`;
  // Without known units, flatten as if in micrometres: only the layer listing uses such a read.
  const tol = options.chordToleranceM / (units?.metresPerUnit ?? 1e-6);
  const newCtx = (): Ctx => ({ blocks: dxf.blocks ?? {}, tol, out: [], counts: new Map(), notes: new Map(), expanded: 0, lastLayer: null, lastCounts: null });
  let ctx = newCtx();
  const walkAll = (entities: IEntity[]) => {
    try {
      walk(ctx, entities, IDENTITY, null, 0, []);
    } catch (e) {
      throw walkError(e);
    }
  };
  // Some writers put model space only in the *Model_Space block and leave out the ENTITIES section.
  const modelEntities = () => Object.entries(ctx.blocks).find(([name]) => name.toLowerCase() === "*model_space")?.[1]?.entities ?? [];
  let streamed: number | null = null;
  if (split) {
    try {
      streamed = streamEntities(ctx, kept, split, options.onSample);
    } catch (e) {
      throw e instanceof LayoutError ? e : walkError(e);
    }
    if (streamed === null) {
      // dxf-parser would end the section elsewhere: read the whole text its way after all.
      dxf = parseText(kept);
      ctx = newCtx();
    }
  }
  if (streamed === null) walkAll(dxf.entities && dxf.entities.length > 0 ? dxf.entities : modelEntities());
  else if (streamed === 0) walkAll(modelEntities());
  checkFinite(ctx.out);
  options.onStage?.("entities, blocks, curves");
  return {
    insUnits,
    units,
    unitsProblem,
    entities: ctx.out,
    layerCounts: ctx.counts,
    notes: [...ctx.notes.values()].map((n) => ({ code: n.code, message: n.n > 1 ? `${n.message} (${n.n} times)` : n.message })),
  };
}

/** A walk failure as the reader reports it. */
function walkError(e: unknown): LayoutError {
  if (e instanceof LayoutError) return e;
  // A shape the parser accepted but no entity reader expects: the file is damaged, not the reader.
  return new LayoutError("unreadable_dxf", `The DXF has an entity Stokeline cannot read (${e instanceof Error ? e.message.slice(0, 120) : "malformed data"}). Export it again as an ASCII DXF.`);
}

export { arcEnd };
