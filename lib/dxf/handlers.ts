/**
 * Entity handlers registered into dxf-parser for the two entities whose stock
 * handlers drop values a layout needs: POLYLINE/VERTEX widths (codes 40, 41)
 * and SPLINE weights (code 41). They collect the raw groups and interpret them
 * here. LINE, ARC, CIRCLE and LWPOLYLINE get lean copies of dxf-parser's own
 * handlers (same groups read, same values, same errors) that keep only the
 * fields the reader uses. Everything else stays with dxf-parser's handlers.
 */

interface Group {
  code: number;
  value: number | string | boolean;
}

/** The part of dxf-parser's DxfArrayScanner these handlers use. */
interface Scanner {
  next(): Group;
  isEOF(): boolean;
  rewind(numberOfGroups?: number): void;
  lastReadGroup: Group;
}

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

/**
 * dxf-parser's parsePoint, given the x group just read: y must follow (else the same error), z may.
 * The stock one rewinds to read the x group a second time; the values are the same.
 */
function leanPoint(scanner: Scanner, x: Group): { x: number; y: number; z?: number } {
  const code = x.code;
  const y = scanner.next();
  if (y.code != code + 10) throw new Error("Expected code for point value to be " + (code + 10) + " but got " + y.code + ".");
  const point: { x: number; y: number; z?: number } = { x: x.value as number, y: y.value as number };
  const z = scanner.next();
  if (z.code != code + 20) scanner.rewind();
  else point.z = z.value as number;
  return point;
}

/** The layer name last read: entities come in runs on one layer, and each keeps the same string, not a copy of its own. */
let lastLayerName = "";

/** dxf-parser's checkCommonEntityProperties for the fields the reader uses (the others have no effect on them). */
function leanCommon(entity: LeanEntity, g: Group, scanner: Scanner): void {
  switch (g.code) {
    case 5: entity.handle = g.value as string; break;
    case 8: entity.layer = g.value === lastLayerName ? lastLayerName : (lastLayerName = g.value as string); break;
    case 67: entity.inPaperSpace = g.value !== 0; break;
    case 101: {
      // An embedded object (AutoCAD 2018): skipped to the next entity, as dxf-parser does.
      let c = g;
      while (c.code != 0) c = scanner.next();
      scanner.rewind();
      break;
    }
  }
}

// Each handler is looked up by its entity type name, so the type is that name (a shared string, not one per entity).
export class LeanLine {
  public ForEntityName = "LINE" as const;
  public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
    const entity = leanEntity("LINE", []);
    let g = scanner.next();
    while (!scanner.isEOF()) {
      if (g.code === 0) break;
      if (g.code === 10) entity.vertices!.unshift(leanPoint(scanner, g));
      else if (g.code === 11) entity.vertices!.push(leanPoint(scanner, g));
      else if (g.code === 210) entity.extrusionDirection = leanPoint(scanner, g);
      else if (g.code !== 100) leanCommon(entity, g, scanner);
      g = scanner.next();
    }
    return entity;
  }
}

export class LeanArc {
  public ForEntityName = "ARC" as const;
  public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
    const entity = leanEntity("ARC", undefined);
    let g = scanner.next();
    while (!scanner.isEOF()) {
      if (g.code === 0) break;
      switch (g.code) {
        case 10: entity.center = leanPoint(scanner, g); break;
        case 40: entity.radius = g.value as number; break;
        case 50: entity.startAngle = (Math.PI / 180) * (g.value as number); break;
        case 51: entity.endAngle = (Math.PI / 180) * (g.value as number); break;
        case 230: entity.extrusionDirectionZ = g.value as number; break;
        case 210: case 220: break;
        default: leanCommon(entity, g, scanner);
      }
      g = scanner.next();
    }
    return entity;
  }
}

export class LeanCircle {
  public ForEntityName = "CIRCLE" as const;
  public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
    const entity = leanEntity("CIRCLE", undefined);
    let g = scanner.next();
    while (!scanner.isEOF()) {
      if (g.code === 0) break;
      if (g.code === 10) entity.center = leanPoint(scanner, g);
      else if (g.code === 40) entity.radius = g.value as number;
      else if (g.code !== 50 && g.code !== 51) leanCommon(entity, g, scanner);
      g = scanner.next();
    }
    return entity;
  }
}

export class LeanLwpolyline {
  public ForEntityName = "LWPOLYLINE" as const;
  public parseEntity(scanner: Scanner, _head: Group): LeanEntity {
    const entity = leanEntity("LWPOLYLINE", []);
    let n = 0;
    let g = scanner.next();
    while (!scanner.isEOF()) {
      if (g.code === 0) break;
      switch (g.code) {
        case 70: entity.shape = ((g.value as number) & 1) === 1; break;
        case 90: n = g.value as number; break;
        case 10: entity.vertices = leanLwVertices(n, scanner); break;
        case 43: if (g.value !== 0) entity.width = g.value as number; break;
        case 230: entity.extrusionDirectionZ = g.value as number; break;
        case 38: case 39: case 210: case 220: break;
        default: leanCommon(entity, g, scanner);
      }
      g = scanner.next();
    }
    return entity;
  }
}

/**
 * dxf-parser's parseLWPolylineVertices, with one difference: on a group that is not a vertex group it steps back
 * one group, not two. Stepping back two re-reads the vertex's last group, which the entity loop ignores, except
 * when that group is the 10 of a vertex without its 20: then the stock handler reads the same vertex for ever
 * (a hung upload). Here that vertex lacks its y and the reader reports the entity as incomplete.
 */
function leanLwVertices(n: number, scanner: Scanner): NonNullable<LeanEntity["vertices"]> {
  if (!n || n <= 0) throw Error("n must be greater than 0 verticies");
  const vertices: NonNullable<LeanEntity["vertices"]> = [];
  let started = false;
  let finished = false;
  let g = scanner.lastReadGroup;
  for (let i = 0; i < n; i++) {
    const v = {} as NonNullable<LeanEntity["vertices"]>[number];
    while (!scanner.isEOF()) {
      if (g.code === 0 || finished) break;
      switch (g.code) {
        case 10:
          if (started) {
            finished = true;
            continue;
          }
          v.x = g.value as number;
          started = true;
          break;
        case 20: v.y = g.value as number; break;
        case 30: v.z = g.value as number; break;
        case 40: v.startWidth = g.value as number; break;
        case 41: v.endWidth = g.value as number; break;
        case 42: if (g.value != 0) v.bulge = g.value as number; break;
        default:
          scanner.rewind();
          if (started) vertices.push(v);
          return vertices;
      }
      g = scanner.next();
    }
    vertices.push(v);
    started = false;
    finished = false;
  }
  scanner.rewind();
  return vertices;
}
