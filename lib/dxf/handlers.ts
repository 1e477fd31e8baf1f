/**
 * Entity handlers registered into dxf-parser for the two entities whose stock
 * handlers drop values a layout needs: POLYLINE/VERTEX widths (codes 40, 41)
 * and SPLINE weights (code 41). They collect the raw groups and interpret them
 * here; everything else stays with dxf-parser's own handlers.
 */

interface Group {
  code: number;
  value: number | string | boolean;
}

/** The part of dxf-parser's DxfArrayScanner these handlers use. */
interface Scanner {
  next(): Group;
  isEOF(): boolean;
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
