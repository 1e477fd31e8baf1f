/**
 * Entity handlers registered into dxf-parser for the two entities whose stock
 * handlers drop values a layout needs: POLYLINE/VERTEX widths (codes 40, 41)
 * and SPLINE weights (code 41). They collect the raw groups and interpret them
 * here. LINE, ARC, CIRCLE and LWPOLYLINE get lean handlers of our own that read
 * the same values as dxf-parser's stock ones on a well-formed file and keep only
 * the fields the reader uses. Everything else stays with dxf-parser's handlers.
 */
import { LayoutError } from "../errors";

import type { Group, GroupScanner as Scanner } from "./scanner";

export interface RawPolylineVertex {
  x: number;
  y: number;
  bulge: number;
  startWidth: number | null;
  endWidth: number | null;
  flags: number;
}

export interface RawPolyline {
  type: "POLYLINE";
  layer?: string;
  handle?: string;
  inPaperSpace?: boolean;
  flags: number;
  defaultStartWidth: number | null;
  defaultEndWidth: number | null;
  extrusionZ: number;
  vertices: RawPolylineVertex[];
}

export interface RawSpline {
  type: "SPLINE";
  layer?: string;
  handle?: string;
  inPaperSpace?: boolean;
  flags: number;
  degree: number;
  knots: number[];
  weights: number[];
  controlPoints: { x: number; y: number }[];
  fitPoints: { x: number; y: number }[];
}

/** Read groups up to (not including) the next code-0 group. */
function collectGroups(scanner: Scanner): Group[] {
  const groups: Group[] = [];
  let g = scanner.next();
  while (!scanner.isEOF() && g.code !== 0) {
    groups.push(g);
    g = scanner.next();
  }
  return groups;
}

function common(target: { layer?: string; handle?: string; inPaperSpace?: boolean }, g: Group): boolean {
  if (g.code === 8) target.layer = String(g.value);
  else if (g.code === 5) target.handle = String(g.value);
  else if (g.code === 67) target.inPaperSpace = g.value !== 0;
  else return false;
  return true;
}

const num = (v: Group["value"]): number => (typeof v === "number" ? v : Number(v));

export class PolylineWithWidths {
  public ForEntityName = "POLYLINE" as const;
  public parseEntity(scanner: Scanner): RawPolyline {
    const entity: RawPolyline = { type: "POLYLINE", flags: 0, defaultStartWidth: null, defaultEndWidth: null, extrusionZ: 1, vertices: [] };
    for (const g of collectGroups(scanner)) {
      if (common(entity, g)) continue;
      if (g.code === 70) entity.flags = num(g.value);
      else if (g.code === 40) entity.defaultStartWidth = num(g.value);
      else if (g.code === 41) entity.defaultEndWidth = num(g.value);
      else if (g.code === 230) entity.extrusionZ = num(g.value);
    }
    // Then VERTEX entities until SEQEND.
    while (!scanner.isEOF()) {
      const head = scanner.lastReadGroup;
      if (head.code === 0 && head.value === "VERTEX") {
        const v: RawPolylineVertex = { x: NaN, y: NaN, bulge: 0, startWidth: null, endWidth: null, flags: 0 };
        for (const g of collectGroups(scanner)) {
          if (g.code === 10) v.x = num(g.value);
          else if (g.code === 20) v.y = num(g.value);
          else if (g.code === 42) v.bulge = num(g.value);
          else if (g.code === 40) v.startWidth = num(g.value);
          else if (g.code === 41) v.endWidth = num(g.value);
          else if (g.code === 70) v.flags = num(g.value);
        }
        entity.vertices.push(v);
      } else if (head.code === 0 && head.value === "SEQEND") {
        collectGroups(scanner);
        break;
      } else {
        break; // a POLYLINE without SEQEND: stop at the next entity
      }
    }
    return entity;
  }
}

export class SplineWithWeights {
  public ForEntityName = "SPLINE" as const;
  public parseEntity(scanner: Scanner): RawSpline {
    const entity: RawSpline = { type: "SPLINE", flags: 0, degree: 3, knots: [], weights: [], controlPoints: [], fitPoints: [] };
    for (const g of collectGroups(scanner)) {
      if (common(entity, g)) continue;
      switch (g.code) {
        case 70: entity.flags = num(g.value); break;
        case 71: entity.degree = num(g.value); break;
        case 40: entity.knots.push(num(g.value)); break;
        case 41: entity.weights.push(num(g.value)); break;
        case 10: entity.controlPoints.push({ x: num(g.value), y: NaN }); break;
        case 20: { const p = entity.controlPoints.at(-1); if (p) p.y = num(g.value); break; }
        case 11: entity.fitPoints.push({ x: num(g.value), y: NaN }); break;
        case 21: { const p = entity.fitPoints.at(-1); if (p) p.y = num(g.value); break; }
      }
    }
    return entity;
  }
}

export interface RawOther {
  type: string;
  layer?: string;
  handle?: string;
  inPaperSpace?: boolean;
  /** The raw groups, kept for HATCH only (its boundary paths, for an outline reader). */
  groups?: Group[];
}

/** Entity types dxf-parser has no handler for and would drop silently; registered so layers list them. */
export const COUNTED_ONLY_TYPES = [
  "HATCH", "MULTILEADER", "MLEADER", "LEADER", "IMAGE", "WIPEOUT", "REGION", "3DSOLID", "BODY",
  "RAY", "XLINE", "TRACE", "TOLERANCE", "SHAPE", "MLINE", "ACAD_TABLE", "VIEWPORT", "SURFACE", "MESH",
] as const;

/** A handler class that only records type, layer and paper-space flag of one entity type. */
export function countingHandler(typeName: string) {
  return class {
    public ForEntityName = typeName;
    public parseEntity(scanner: Scanner): RawOther {
      const entity: RawOther = { type: typeName };
      const groups = collectGroups(scanner);
      for (const g of groups) common(entity, g);
      if (typeName === "HATCH") entity.groups = groups;
      return entity;
    }
  };
}

/** The fields of LINE, ARC, CIRCLE and LWPOLYLINE the reader uses, named as dxf-parser names them. */
export interface LeanEntity {
  type: string;
  layer?: string;
  handle?: string | number;
  inPaperSpace?: boolean;
  vertices?: { x: number; y: number; z?: number; bulge?: number; startWidth?: number; endWidth?: number }[];
  center?: { x: number; y: number; z?: number };
  radius?: number;
  startAngle?: number;
  endAngle?: number;
  extrusionDirection?: { x: number; y: number; z?: number };
  extrusionDirectionZ?: number;
  width?: number;
  shape?: boolean;
}

/** Every lean entity with all its fields in one order (unset ones undefined): one object shape, so the walk's reads stay monomorphic. */
function leanEntity(type: string, vertices: LeanEntity["vertices"]): LeanEntity {
  return {
    type,
    layer: undefined,
    handle: undefined,
    inPaperSpace: undefined,
    vertices,
    center: undefined,
    radius: undefined,
    startAngle: undefined,
    endAngle: undefined,
    extrusionDirection: undefined,
    extrusionDirectionZ: undefined,
    width: undefined,
    shape: undefined,
  };
}

type Point = { x: number; y: number; z?: number };
type Vertex = NonNullable<LeanEntity["vertices"]>[number];

/**
 * What one entity type takes from its own groups: the entity record, and points under construction. A point starts
 * at its x group (code c in 10-18) and takes y and z from codes c+10 and c+20 (DXF reference, group codes in
 * numerical order); LWPOLYLINE vertices start at each 10 (DXF reference, LWPOLYLINE).
 */
interface Reading {
  entity: LeanEntity;
  first: Point | null;
  second: Point | null;
  extrusion: Point | null;
  declaredVertices: number;
}

/** One reading reused for every entity (handlers never nest): no extra object per entity. */
const reading: Reading = { entity: leanEntity("", undefined), first: null, second: null, extrusion: null, declaredVertices: -1 };

/** The layer name last read: entities come in runs on one layer, and each keeps the same string, not a copy of its own. */
let lastLayerName = "";

/**
 * The one group loop of the lean handlers: the groups after the entity's type, up to the next code-0 group (left as
 * the scanner's last group, where dxf-parser's entity loop looks for it). Handle (5), layer (8) and paper-space flag
 * (67) are common to every entity; from a 101 marker on, the groups belong to an embedded object (AutoCAD 2018) and
 * are passed over. Everything else goes to the type's own take.
 */
function readEntity(scanner: Scanner, entity: LeanEntity, take: (r: Reading, code: number, value: Group["value"]) => void): Reading {
  const r = reading;
  r.entity = entity;
  r.first = r.second = r.extrusion = null;
  r.declaredVertices = -1;
  let embedded = false;
  for (let g = scanner.next(); g.code !== 0; g = scanner.next()) {
    if (embedded) continue;
    const code = g.code;
    if (code === 8) entity.layer = g.value === lastLayerName ? lastLayerName : (lastLayerName = g.value as string);
    else if (code === 5) entity.handle = g.value as string;
    else if (code === 67) entity.inPaperSpace = g.value !== 0;
    else if (code === 101) embedded = true;
    else take(r, code, g.value);
  }
  return r;
}

/** A point begun by its x value; y stays undefined until its group comes, so a point without one is reported as incomplete. */
const startPoint = (x: number): Point => ({ x, y: undefined as unknown as number, z: undefined });

function takeLine(r: Reading, code: number, value: Group["value"]): void {
  const v = value as number;
  switch (code) {
    case 10: r.first = startPoint(v); break;
    case 20: if (r.first) r.first.y = v; break;
    case 30: if (r.first) r.first.z = v; break;
    case 11: r.second = startPoint(v); break;
    case 21: if (r.second) r.second.y = v; break;
    case 31: if (r.second) r.second.z = v; break;
    case 210: r.extrusion = startPoint(v); break;
    case 220: if (r.extrusion) r.extrusion.y = v; break;
    case 230: if (r.extrusion) r.extrusion.z = v; break;
  }
}

/** Degrees to radians as dxf-parser's ARC handler computes it (same rounding, so the same angles to the last bit). */
const radians = (degrees: number) => (Math.PI / 180) * degrees;

function takeArcOrCircle(r: Reading, code: number, value: Group["value"]): void {
  const v = value as number;
  const e = r.entity;
  switch (code) {
    case 10: r.first = startPoint(v); break;
    case 20: if (r.first) r.first.y = v; break;
    case 30: if (r.first) r.first.z = v; break;
    case 40: e.radius = v; break;
    // A CIRCLE has no angles; its extrusion does not change a circle seen from above.
    case 50: if (e.type === "ARC") e.startAngle = radians(v); break;
    case 51: if (e.type === "ARC") e.endAngle = radians(v); break;
    case 230: if (e.type === "ARC") e.extrusionDirectionZ = v; break;
  }
}

function takeLwpolyline(r: Reading, code: number, value: Group["value"]): void {
  const v = value as number;
  const e = r.entity;
  const vertices = e.vertices!;
  const last: Vertex | undefined = vertices[vertices.length - 1];
  switch (code) {
    case 10: vertices.push({ x: v, y: undefined as unknown as number }); break;
    case 20: if (last) last.y = v; break;
    case 30: if (last) last.z = v; break;
    case 40: if (last) last.startWidth = v; break;
    case 41: if (last) last.endWidth = v; break;
    case 42: if (last && v !== 0) last.bulge = v; break;
    case 43: if (v !== 0) e.width = v; break;
    case 70: e.shape = (v & 1) === 1; break;
    case 90: r.declaredVertices = v; break;
    case 230: e.extrusionDirectionZ = v; break;
  }
}

// Each handler is looked up by its entity type name, so the type is that name (a shared string, not one per entity).
export class LeanLine {
  public ForEntityName = "LINE" as const;
  public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
    const r = readEntity(scanner, leanEntity("LINE", undefined), takeLine);
    const e = r.entity;
    const { first, second } = r;
    e.vertices = first ? (second ? [first, second] : [first]) : second ? [second] : [];
    if (r.extrusion) e.extrusionDirection = r.extrusion;
    return e;
  }
}

/** ARC and CIRCLE read the same groups (centre, radius, angles); one handler class for each name. */
function arcOrCircleHandler(name: "ARC" | "CIRCLE") {
  return class {
    public ForEntityName = name;
    public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
      const r = readEntity(scanner, leanEntity(name, undefined), takeArcOrCircle);
      if (r.first) r.entity.center = r.first;
      return r.entity;
    }
  };
}

export const LeanArc = arcOrCircleHandler("ARC");
export const LeanCircle = arcOrCircleHandler("CIRCLE");

export class LeanLwpolyline {
  public ForEntityName = "LWPOLYLINE" as const;
  public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
    const r = readEntity(scanner, leanEntity("LWPOLYLINE", []), takeLwpolyline);
    const e = r.entity;
    const listed = e.vertices!.length;
    // The count (90) comes before the vertices (DXF reference, LWPOLYLINE): a different number listed means lost lines.
    if (listed > 0 && r.declaredVertices !== listed) {
      const declared = r.declaredVertices < 0 ? "no vertex count" : `${r.declaredVertices} vertices`;
      throw new LayoutError(
        "entity_incomplete",
        `An LWPOLYLINE on layer "${e.layer ?? "0"}"${e.handle ? ` (handle ${e.handle})` : ""} declares ${declared} but lists ${listed}: the file is damaged there. Fix or delete the polyline and export again.`,
      );
    }
    return e;
  }
}
