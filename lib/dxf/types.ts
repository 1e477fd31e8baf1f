/**
 * Typed drawing entities in drawing units, world coordinates (blocks already
 * expanded, OCS already resolved). Pure data, produced by readDxf.
 */
import type { DrawingUnits } from "../network/types";

/** A straight piece of centreline. Widths are the drawn polyline widths (null: none drawn). */
export interface LinePiece {
  kind: "line";
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  w0: number | null;
  w1: number | null;
}

/** A circular-arc piece: centre, radius, start angle and signed sweep (radians, + = counter-clockwise). */
export interface ArcPiece {
  kind: "arc";
  cx: number;
  cy: number;
  r: number;
  a0: number;
  sweep: number;
  w0: number | null;
  w1: number | null;
}

export type Piece = LinePiece | ArcPiece;

/** An open or closed chain of pieces from one DXF entity (LINE, ARC, polyline, spline, ellipse). */
export interface PathEntity {
  kind: "path";
  layer: string;
  /** DXF entity type it came from. */
  type: string;
  handle: string | null;
  pieces: Piece[];
  closed: boolean;
  /** Smallest radius of curvature of flattened curves (splines, ellipses), drawing units; null if none. */
  minCurveRadius: number | null;
}

export interface CircleEntity {
  kind: "circle";
  layer: string;
  type: "CIRCLE";
  handle: string | null;
  cx: number;
  cy: number;
  r: number;
}

export interface TextEntity {
  kind: "text";
  layer: string;
  type: "TEXT" | "MTEXT";
  handle: string | null;
  x: number;
  y: number;
  text: string;
}

export type DrawingEntity = PathEntity | CircleEntity | TextEntity;

export interface DxfDrawing {
  /** $INSUNITS code from the header, or null when absent. */
  insUnits: number | null;
  /** Resolved drawing units (conditions first, then $INSUNITS), or null when neither is usable. */
  units: DrawingUnits | null;
  /** Why units is null, in words that say what to add. */
  unitsProblem: string | null;
  entities: DrawingEntity[];
  /** Model-space entity counts per layer, by DXF type (after block expansion; includes types not read). */
  layerCounts: Map<string, Record<string, number>>;
  /** Things the reader skipped or simplified, for the user. */
  notes: { code: string; message: string }[];
}
