/**
 * HATCH entity handler for dxf-parser, which has none: reads the boundary
 * paths (polyline paths with bulges; edge paths of lines, circular arcs,
 * elliptic arcs and splines) so a filled mask drawn as hatches can be read as
 * outlines (issue 9). Group codes from the DXF reference, HATCH entity and
 * "Boundary path data".
 */
import { flattenNurbs, flattenParametric, type Pt } from "./curves";

import type { Group, GroupScanner as Scanner } from "./scanner";

export interface HatchVertex {
  x: number;
  y: number;
  bulge: number;
}

export type HatchEdge =
  | { kind: "line"; x0: number; y0: number; x1: number; y1: number }
  | { kind: "arc"; cx: number; cy: number; r: number; startDeg: number; endDeg: number; ccw: boolean }
  /** Elliptic arc: centre, major-axis end point relative to it, minor/major ratio; angles in degrees from the major axis. */
  | { kind: "ellipse"; cx: number; cy: number; mx: number; my: number; ratio: number; startDeg: number; endDeg: number; ccw: boolean }
  | { kind: "spline"; degree: number; knots: number[]; controlPoints: Pt[]; weights: number[]; fitPoints: Pt[] }
  | { kind: "unsupported"; type: number };

export type HatchPath = { kind: "polyline"; vertices: HatchVertex[] } | { kind: "edges"; edges: HatchEdge[] };

export interface RawHatch {
  type: "HATCH";
  layer?: string;
  handle?: string;
  inPaperSpace?: boolean;
  extrusionZ: number;
  paths: HatchPath[];
}

const num = (v: Group["value"]): number => (typeof v === "number" ? v : Number(v));

/** Parse the boundary paths from the HATCH's groups (code 91 starts them; each path starts with its 92 flags). */
export function parseHatchGroups(groups: Group[]): Omit<RawHatch, "type"> {
  const out: Omit<RawHatch, "type"> = { extrusionZ: 1, paths: [] };
  let i = 0;
  const at = (code: number) => i < groups.length && groups[i].code === code;
  const take = () => groups[i++];
  /**
   * A spline edge (type 4): 94 degree, 73 rational, 74 periodic, 95/96 counts, 40 knots, 10/20 (42) control
   * points, then optionally 97 and 11/21 fit points and 12/22, 13/23 end tangents. Its 97 is the fit-point
   * count only when fit data or tangents follow; otherwise it is the path's source-object count.
   */
  const readSplineEdge = (): HatchEdge => {
    const e = { kind: "spline" as const, degree: 3, knots: [] as number[], controlPoints: [] as Pt[], weights: [] as number[], fitPoints: [] as Pt[] };
    while (i < groups.length && !at(72) && !at(92)) {
      const g = groups[i];
      if (g.code === 97) {
        const next = groups[i + 1]?.code;
        if (next !== 11 && next !== 12 && next !== 13 && next !== 72) break;
      }
      i++;
      const v = num(g.value);
      switch (g.code) {
        case 94: e.degree = v; break;
        case 40: e.knots.push(v); break;
        case 42: e.weights.push(v); break;
        case 10: e.controlPoints.push({ x: v, y: NaN }); break;
        case 20: { const p = e.controlPoints.at(-1); if (p) p.y = v; break; }
        case 11: e.fitPoints.push({ x: v, y: NaN }); break;
        case 21: { const p = e.fitPoints.at(-1); if (p) p.y = v; break; }
      }
    }
    return e;
  };
  while (i < groups.length) {
    const g = groups[i];
    if (g.code === 8) out.layer = String(g.value);
    else if (g.code === 5) out.handle = String(g.value);
    else if (g.code === 67) out.inPaperSpace = g.value !== 0;
    else if (g.code === 230) out.extrusionZ = num(g.value);
    else if (g.code === 91) {
      i++;
      const nPaths = num(g.value);
      for (let p = 0; p < nPaths && i < groups.length; p++) {
        while (i < groups.length && !at(92)) i++;
        if (i >= groups.length) break;
        const flags = num(take().value);
        if (flags & 2) {
          // Polyline path: 72 has-bulge, 73 closed, 93 vertex count, then 10/20 (42) per vertex.
          let hasBulge = false;
          let n = 0;
          while (i < groups.length && !at(10)) {
            const h = take();
            if (h.code === 72) hasBulge = num(h.value) !== 0;
            else if (h.code === 93) n = num(h.value);
          }
          const vertices: HatchVertex[] = [];
          for (let k = 0; k < n && at(10); k++) {
            const x = num(take().value);
            const y = at(20) ? num(take().value) : NaN;
            const bulge = hasBulge && at(42) ? num(take().value) : 0;
            vertices.push({ x, y, bulge });
          }
          out.paths.push({ kind: "polyline", vertices });
        } else {
          // Edge path: 93 edge count, then per edge 72 type and its data.
          while (i < groups.length && !at(93)) i++;
          const nEdges = i < groups.length ? num(take().value) : 0;
          const edges: HatchEdge[] = [];
          for (let k = 0; k < nEdges; k++) {
            while (i < groups.length && !at(72)) i++;
            if (i >= groups.length) break;
            const type = num(take().value);
            if (type === 4) {
              edges.push(readSplineEdge());
              continue;
            }
            const vals = new Map<number, number>();
            // The edge's data runs up to the next edge's 72, or the path's 97 (source objects) / next 92.
            while (i < groups.length && !at(72) && !at(97) && !at(92)) {
              const h = take();
              if (!vals.has(h.code)) vals.set(h.code, num(h.value));
            }
            if (type === 1) edges.push({ kind: "line", x0: vals.get(10)!, y0: vals.get(20)!, x1: vals.get(11)!, y1: vals.get(21)! });
            else if (type === 2) edges.push({ kind: "arc", cx: vals.get(10)!, cy: vals.get(20)!, r: vals.get(40)!, startDeg: vals.get(50)!, endDeg: vals.get(51)!, ccw: (vals.get(73) ?? 1) !== 0 });
            else if (type === 3) {
              edges.push({ kind: "ellipse", cx: vals.get(10)!, cy: vals.get(20)!, mx: vals.get(11)!, my: vals.get(21)!, ratio: vals.get(40)!, startDeg: vals.get(50)!, endDeg: vals.get(51)!, ccw: (vals.get(73) ?? 1) !== 0 });
            } else edges.push({ kind: "unsupported", type });
          }
          out.paths.push({ kind: "edges", edges });
        }
        // Source boundary objects (97 count, 330 handles) end the path.
        if (at(97)) {
          const nSrc = num(take().value);
          for (let k = 0; k < nSrc && at(330); k++) i++;
        }
      }
      continue;
    }
    i++;
  }
  return out;
}

/** dxf-parser handler class for HATCH (registered with parser.registerEntityHandler). */
export class HatchWithBoundaries {
  public ForEntityName = "HATCH" as const;
  public parseEntity(scanner: Scanner): RawHatch {
    const groups: Group[] = [];
    let g = scanner.next();
    while (!scanner.isEOF() && g.code !== 0) {
      groups.push(g);
      g = scanner.next();
    }
    return { type: "HATCH", ...parseHatchGroups(groups) };
  }
}

const TAU = 2 * Math.PI;
const sweepOf = (s: number) => {
  let v = s % TAU;
  if (v <= 1e-12) v += TAU;
  return v;
};

/**
 * An elliptic-arc or spline boundary edge as points within the chord tolerance tol (drawing units), in the
 * edge's own direction; null for a spline whose knots and control points do not make a B-spline and that
 * has fewer than two fit points.
 * Elliptic edges store angles from the major axis, not ellipse parameters (DXF reference, HATCH edge type 3);
 * a clockwise edge stores them mirrored, as arc edges do.
 */
export function flattenHatchEdge(edge: Extract<HatchEdge, { kind: "ellipse" | "spline" }>, tol: number): Pt[] | null {
  if (edge.kind === "spline") {
    const weights = edge.weights.length === edge.controlPoints.length ? edge.weights : [];
    const pts = edge.controlPoints.length > 0 ? flattenNurbs(edge.controlPoints, weights, edge.knots, edge.degree, tol) : null;
    return pts ?? (edge.fitPoints.length >= 2 ? edge.fitPoints : null);
  }
  const { cx, cy, mx, my, ratio } = edge;
  const rad = (deg: number) => ((edge.ccw ? deg : -deg) * Math.PI) / 180;
  // Angle θ from the major axis → parameter t of x = a·cos t, y = b·sin t: tan t = tan θ / ratio.
  const param = (theta: number) => Math.atan2(Math.sin(theta) / ratio, Math.cos(theta));
  const t0 = param(rad(edge.startDeg));
  const t1raw = param(rad(edge.endDeg));
  const full = Math.abs(sweepOf(((edge.endDeg - edge.startDeg) * Math.PI) / 180) - TAU) < 1e-9;
  const t1 = edge.ccw ? t0 + (full ? TAU : sweepOf(t1raw - t0)) : t0 - (full ? TAU : sweepOf(t0 - t1raw));
  const nx = -my * ratio;
  const ny = mx * ratio;
  const f = (t: number): Pt => ({ x: cx + mx * Math.cos(t) + nx * Math.sin(t), y: cy + my * Math.cos(t) + ny * Math.sin(t) });
  return flattenParametric(f, t0, t1, tol, Math.max(4, Math.ceil(Math.abs(t1 - t0) / (Math.PI / 8))));
}
