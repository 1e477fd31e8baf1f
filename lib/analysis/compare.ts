/**
 * Compare two analyze documents (two revisions of a chip, or two operating
 * points of one revision): geometry matched by POSITION, never by id, since a
 * new upload renumbers segments; ports by name; flags by rule code and the
 * position of what they concern. Pure.
 */
import { quadtree, type Quadtree, type QuadtreeLeaf } from "d3";
import type { AnalyzeJson, AnalyzeSegmentJson } from "./serialize";

export interface CompareTolerances {
  /** Two segment ends (or nodes, ports) closer than this are the same place. Default 1 µm, below any mask's resolution (REFERENCES §6). */
  positionM: number;
  /** Length, width and depth differences up to this are "unchanged". Default 10 nm (float noise from unit conversion, far below fab tolerances). */
  sizeM: number;
  /** Relative tolerance for port pressures and flows. Default 1e-6 (solver residuals are far smaller; common practice). */
  relative: number;
  /** Absolute floor for port pressure differences, Pa. Default 1e-3 Pa. */
  pressurePa: number;
  /** Absolute floor for port flow differences, m³/s. Default 1e-18 m³/s (0.06 pL/min). */
  flowM3PerS: number;
}

export const DEFAULT_COMPARE_TOLERANCES: CompareTolerances = { positionM: 1e-6, sizeM: 1e-8, relative: 1e-6, pressurePa: 1e-3, flowM3PerS: 1e-18 };

export interface ValueDelta {
  a: number;
  b: number;
  /** b − a. */
  delta: number;
}

export interface SegmentMatch {
  a: string;
  b: string;
  /** True when B's segment runs the other way (its `from` is A's `to`). */
  reversed: boolean;
  /** Largest end-point offset between the two, m. */
  endOffsetM: number;
  /** Distance between the mid-points (half-way along the centreline), m; large when the route between the same ends changed. */
  midOffsetM: number;
  /** Only the sizes that changed beyond tolerance. Widths are compared end for end (a reversed match swaps them). */
  deltas: Partial<Record<"length_m" | "width_m" | "end_width_m" | "depth_m", ValueDelta>>;
  layer: { a: string; b: string } | null;
  section: { a: string; b: string } | null;
  /** The centreline between the same ends took another route. */
  routeChanged: boolean;
  changed: boolean;
}

export interface PortChange {
  name: string;
  pressurePa: ValueDelta | null;
  flowM3PerS: ValueDelta | null;
  /** How far the port moved, m, when more than the position tolerance. */
  movedM: number | null;
  drive: { a: string | null; b: string | null } | null;
}

export interface FlagRef {
  code: string;
  severity: string;
  title: string;
  target: { kind: string; id: string | null };
  value: number | null;
}

export interface FlagPair {
  code: string;
  a: FlagRef;
  b: FlagRef;
}

export interface AnalysisComparison {
  tolerances: CompareTolerances;
  segments: {
    /** Ids in B with no counterpart in A. */
    added: string[];
    /** Ids in A with no counterpart in B. */
    removed: string[];
    /** Matched pairs that differ (sizes, layer, section or route). */
    changed: SegmentMatch[];
    /** Every matched pair, changed or not, for overlays and per-segment tables. */
    matched: SegmentMatch[];
  };
  ports: { added: string[]; removed: string[]; changed: PortChange[] };
  /** `unchanged`: still raised in both (its value may differ; both are given). */
  flags: { added: FlagRef[]; removed: FlagRef[]; unchanged: FlagPair[] };
}

type Point = [number, number];

const dist = (p: Point, q: Point) => Math.hypot(p[0] - q[0], p[1] - q[1]);

/** The point half-way along a polyline's length. */
function midpointAlong(path: Point[]): Point {
  if (path.length === 1) return path[0];
  let total = 0;
  for (let i = 1; i < path.length; i++) total += dist(path[i - 1], path[i]);
  let remaining = total / 2;
  for (let i = 1; i < path.length; i++) {
    const step = dist(path[i - 1], path[i]);
    if (step >= remaining && step > 0) {
      const t = remaining / step;
      return [path[i - 1][0] + t * (path[i][0] - path[i - 1][0]), path[i - 1][1] + t * (path[i][1] - path[i - 1][1])];
    }
    remaining -= step;
  }
  return path[path.length - 1];
}

interface Indexed<T> {
  x: number;
  y: number;
  item: T;
}

/** Everything in the quadtree within `r` of (x, y): visit only the quads that overlap the query square. */
function within<T>(tree: Quadtree<Indexed<T>>, x: number, y: number, r: number): Indexed<T>[] {
  const out: Indexed<T>[] = [];
  tree.visit((node, x0, y0, x1, y1) => {
    if (!node.length) {
      for (let leaf: QuadtreeLeaf<Indexed<T>> | undefined = node as QuadtreeLeaf<Indexed<T>>; leaf; leaf = leaf.next) {
        if (Math.hypot(leaf.data.x - x, leaf.data.y - y) <= r) out.push(leaf.data);
      }
    }
    return x0 > x + r || x1 < x - r || y0 > y + r || y1 < y - r;
  });
  return out;
}

interface SegGeom {
  seg: AnalyzeSegmentJson;
  start: Point;
  end: Point;
  mid: Point;
}

function geometry(seg: AnalyzeSegmentJson): SegGeom | null {
  const path = seg.path_m.filter((p) => Number.isFinite(p[0]) && Number.isFinite(p[1]));
  if (path.length === 0) return null;
  return { seg, start: path[0], end: path[path.length - 1], mid: midpointAlong(path) };
}

function sizeDelta(a: number, b: number, tol: number): ValueDelta | null {
  return Math.abs(b - a) > tol ? { a, b, delta: b - a } : null;
}

function describeMatch(a: SegGeom, b: SegGeom, reversed: boolean, endOffsetM: number, tol: CompareTolerances): SegmentMatch {
  const midOffsetM = dist(a.mid, b.mid);
  const deltas: SegmentMatch["deltas"] = {};
  const bStartWidth = reversed ? b.seg.end_width_m : b.seg.width_m;
  const bEndWidth = reversed ? b.seg.width_m : b.seg.end_width_m;
  const pairs: [keyof SegmentMatch["deltas"], number, number][] = [
    ["length_m", a.seg.length_m, b.seg.length_m],
    ["width_m", a.seg.width_m, bStartWidth],
    ["end_width_m", a.seg.end_width_m, bEndWidth],
    ["depth_m", a.seg.depth_m, b.seg.depth_m],
  ];
  for (const [key, va, vb] of pairs) {
    const d = sizeDelta(va, vb, tol.sizeM);
    if (d) deltas[key] = d;
  }
  const layer = a.seg.layer !== b.seg.layer ? { a: a.seg.layer, b: b.seg.layer } : null;
  const section = a.seg.section !== b.seg.section ? { a: a.seg.section, b: b.seg.section } : null;
  const routeChanged = midOffsetM > tol.positionM;
  const changed = Object.keys(deltas).length > 0 || layer !== null || section !== null || routeChanged;
  return { a: a.seg.id, b: b.seg.id, reversed, endOffsetM, midOffsetM, deltas, layer, section, routeChanged, changed };
}

/**
 * Match A's segments to B's by where their ends lie. A pair is a candidate when
 * both ends agree within `positionM` (either direction); candidates are taken
 * greedily, closest first (ends, then mid-points, break ties), each segment at
 * most once. The end points go into a d3 quadtree so each lookup is local.
 * A segment whose end moved (the network's topology changed there) shows as
 * removed plus added.
 */
function matchSegments(a: AnalyzeSegmentJson[], b: AnalyzeSegmentJson[], tol: CompareTolerances): SegmentMatch[] {
  const ga = a.map(geometry).filter((g): g is SegGeom => g !== null);
  const gb = b.map(geometry).filter((g): g is SegGeom => g !== null);
  const tree = quadtree<Indexed<number>>()
    .x((d) => d.x)
    .y((d) => d.y);
  gb.forEach((g, i) => {
    tree.add({ x: g.start[0], y: g.start[1], item: i });
    tree.add({ x: g.end[0], y: g.end[1], item: i });
  });
  const candidates: { ia: number; ib: number; reversed: boolean; endOffset: number; cost: number }[] = [];
  ga.forEach((sa, ia) => {
    const near = new Set(within(tree, sa.start[0], sa.start[1], tol.positionM).map((d) => d.item));
    for (const ib of near) {
      const sb = gb[ib];
      const forward = Math.max(dist(sa.start, sb.start), dist(sa.end, sb.end));
      const backward = Math.max(dist(sa.start, sb.end), dist(sa.end, sb.start));
      const reversed = backward < forward;
      const endOffset = Math.min(forward, backward);
      if (endOffset > tol.positionM) continue;
      candidates.push({ ia, ib, reversed, endOffset, cost: endOffset + dist(sa.mid, sb.mid) });
    }
  });
  candidates.sort((p, q) => p.cost - q.cost || p.ia - q.ia || p.ib - q.ib);
  const usedA = new Set<number>();
  const usedB = new Set<number>();
  const matches: SegmentMatch[] = [];
  for (const c of candidates) {
    if (usedA.has(c.ia) || usedB.has(c.ib)) continue;
    usedA.add(c.ia);
    usedB.add(c.ib);
    matches.push(describeMatch(ga[c.ia], gb[c.ib], c.reversed, c.endOffset, tol));
  }
  return matches;
}

function valueDelta(a: number | undefined, b: number | undefined, relative: number, absolute: number): ValueDelta | null {
  if (a === undefined || b === undefined) return null;
  const tol = Math.max(absolute, relative * Math.max(Math.abs(a), Math.abs(b)));
  return Math.abs(b - a) > tol ? { a, b, delta: b - a } : null;
}

function comparePorts(a: AnalyzeJson, b: AnalyzeJson, tol: CompareTolerances): AnalysisComparison["ports"] {
  const pb = new Map(b.ports.map((p) => [p.name, p]));
  const pa = new Map(a.ports.map((p) => [p.name, p]));
  const changed: PortChange[] = [];
  for (const p of a.ports) {
    const q = pb.get(p.name);
    if (!q) continue;
    const moved = Math.hypot(q.x_m - p.x_m, q.y_m - p.y_m);
    const change: PortChange = {
      name: p.name,
      pressurePa: valueDelta(p.pressure_Pa, q.pressure_Pa, tol.relative, tol.pressurePa),
      flowM3PerS: valueDelta(p.flow_m3_per_s, q.flow_m3_per_s, tol.relative, tol.flowM3PerS),
      movedM: moved > tol.positionM ? moved : null,
      drive: (p.drive ?? null) !== (q.drive ?? null) ? { a: p.drive ?? null, b: q.drive ?? null } : null,
    };
    if (change.pressurePa || change.flowM3PerS || change.movedM !== null || change.drive) changed.push(change);
  }
  return {
    added: b.ports.filter((p) => !pa.has(p.name)).map((p) => p.name),
    removed: a.ports.filter((p) => !pb.has(p.name)).map((p) => p.name),
    changed,
  };
}

const toFlagRef = (f: AnalyzeJson["flags"][number]): FlagRef => ({ code: f.code, severity: f.severity, title: f.title, target: f.target, value: f.value });

/**
 * Flags match when the rule code is the same and they concern the same place:
 * a segment through the segment matching, a port by name, a node by position,
 * the chip as a whole by code alone. Repeated identical keys pair up in order.
 */
function compareFlags(a: AnalyzeJson, b: AnalyzeJson, matches: SegmentMatch[], tol: CompareTolerances): AnalysisComparison["flags"] {
  const segAtoB = new Map(matches.map((m) => [m.a, m.b]));
  const nodeTree = quadtree<Indexed<string>>()
    .x((d) => d.x)
    .y((d) => d.y)
    .addAll(b.nodes.map((n) => ({ x: n.x_m, y: n.y_m, item: n.id })));
  const nodeA = new Map(a.nodes.map((n) => [n.id, n]));
  const placeInB = (kind: string, id: string | null): string => {
    if (id === null || kind === "chip") return "chip";
    if (kind === "segment") return segAtoB.has(id) ? `segment:${segAtoB.get(id)}` : `segment-only-in-a:${id}`;
    if (kind === "port") return `port:${id}`;
    if (kind === "node") {
      const n = nodeA.get(id);
      const near = n ? nodeTree.find(n.x_m, n.y_m, tol.positionM) : undefined;
      return near ? `node:${near.item}` : `node-only-in-a:${id}`;
    }
    return `${kind}:${id}`;
  };
  const placeOwn = (kind: string, id: string | null) => (id === null || kind === "chip" ? "chip" : `${kind}:${id}`);
  const pending = new Map<string, AnalyzeJson["flags"]>();
  for (const f of b.flags) {
    const key = `${f.code}|${placeOwn(f.target.kind, f.target.id)}`;
    pending.set(key, [...(pending.get(key) ?? []), f]);
  }
  const removed: FlagRef[] = [];
  const unchanged: FlagPair[] = [];
  for (const f of a.flags) {
    const key = `${f.code}|${placeInB(f.target.kind, f.target.id)}`;
    const list = pending.get(key);
    const other = list?.shift();
    if (other) unchanged.push({ code: f.code, a: toFlagRef(f), b: toFlagRef(other) });
    else removed.push(toFlagRef(f));
  }
  const added = [...pending.values()].flat().map(toFlagRef);
  return { added, removed, unchanged };
}

/**
 * Compare analysis A (before) with B (after).
 * @param tolerances overrides of DEFAULT_COMPARE_TOLERANCES (metres, pascals, m³/s)
 * @returns added/removed/changed segments (by position), port changes (by name), flags added/removed/still raised
 */
export function compareAnalyses(a: AnalyzeJson, b: AnalyzeJson, tolerances: Partial<CompareTolerances> = {}): AnalysisComparison {
  const tol = { ...DEFAULT_COMPARE_TOLERANCES, ...tolerances };
  const matched = matchSegments(a.segments, b.segments, tol);
  const matchedA = new Set(matched.map((m) => m.a));
  const matchedB = new Set(matched.map((m) => m.b));
  return {
    tolerances: tol,
    segments: {
      added: b.segments.filter((s) => !matchedB.has(s.id)).map((s) => s.id),
      removed: a.segments.filter((s) => !matchedA.has(s.id)).map((s) => s.id),
      changed: matched.filter((m) => m.changed),
      matched,
    },
    ports: comparePorts(a, b, tol),
    flags: compareFlags(a, b, matched, tol),
  };
}
