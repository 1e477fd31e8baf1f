/**
 * The channel network: the contract between the layout reader (lib/dxf,
 * lib/network) and the hydraulics engine (lib/hydraulics). Plain data, SI units,
 * unit in every numeric field's name. Coordinates are in the drawing's plane,
 * converted to metres.
 */

export type NodeKind = "port" | "junction" | "dead_end" | "change";

/** Cross-section families the hydraulics engine knows. */
export type SectionShape =
  | "rectangular" // flat floor, vertical walls (PDMS replica, DRIE, milling)
  | "circular" // round capillary or tubing
  | "isotropic_etch" // wet-etched glass: flat floor, quarter-circle walls of radius = depth
  | "trapezoid_koh" // KOH on Si(100): {111} walls at 54.74°; width is the top (mask) width
  | "semicircular"; // reflowed-resist moulds: half-disc of radius = depth

export type LayerRole = "channel" | "port" | "control" | "outline" | "ignore";

export interface NetworkNode {
  id: string;
  xM: number;
  yM: number;
  kind: NodeKind;
  /** Port name when kind === "port". */
  port: string | null;
}

/** A point of a width profile: distance from the segment's `from` end and the local width. */
export interface WidthSample {
  sM: number;
  widthM: number;
}

/**
 * A segment's width profile as two columns of one length: distances from the `from` end (ascending) and the
 * local widths there, linear in between. Columns rather than a point object each: an outline layout's junction
 * flares give every segment ten or so points, and thousands of segments.
 */
export interface WidthProfile {
  sM: number[];
  widthM: number[];
}

export interface NetworkSegment {
  id: string;
  layer: string;
  from: string;
  to: string;
  /** Length along the centreline, node to node (after trimming inside port circles). */
  lengthM: number;
  /** Width at the `from` end (the mean width when a width profile is given). */
  widthM: number;
  /** Width at the `to` end; differs from widthM on tapered pieces. */
  endWidthM: number;
  depthM: number;
  section: SectionShape;
  /** Smallest centreline bend radius along the segment, null if straight. */
  minBendRadiusM: number | null;
  /** Centreline as a polyline in metres, from `from` to `to`, for drawing and comparison. */
  path: [number, number][];
  /** Optional width profile along the segment (tapers, outline layouts); hydraulics integrates over it. */
  widthProfile?: WidthProfile;
  minWidthM?: number;
  maxWidthM?: number;
}

export interface NetworkPort {
  name: string;
  node: string;
  xM: number;
  yM: number;
  radiusM: number;
}

export interface LayoutWarning {
  code: string;
  message: string;
  at?: { xM: number; yM: number };
}

export interface LayerSummary {
  name: string;
  role: LayerRole | "unmapped";
  entities: number;
  /** Entity counts by DXF type, for the mapping step. */
  byType: Record<string, number>;
  /** For channel layers: how the channels were drawn. */
  style?: "centreline" | "outline" | "mixed";
  /** Role the reader proposes from the layer's contents, when the conditions did not name it. */
  proposedRole?: LayerRole;
}

export interface DrawingUnits {
  drawing: "nm" | "um" | "mm" | "cm" | "m" | "in" | "mil";
  source: "$INSUNITS" | "conditions";
  /** Metres per drawing unit. */
  metresPerUnit: number;
}

export interface ChannelNetwork {
  units: DrawingUnits;
  nodes: NetworkNode[];
  segments: NetworkSegment[];
  ports: NetworkPort[];
  warnings: LayoutWarning[];
  layers: LayerSummary[];
  /** Die outline polygons in metres (from layers with role "outline"), for edge margins and footprint. */
  outline: [number, number][][];
  /** Axis-aligned bounds of everything on flow, port and outline layers, metres. */
  bounds: { minXM: number; minYM: number; maxXM: number; maxYM: number };
  /** True when the conditions named no layer and the reader proposed the mapping itself. */
  mappingProposed: boolean;
  /** Channel layers drawn as filled mask shapes: their rings in metres, so a drawing can show the extracted centrelines over them. */
  masks?: { layer: string; ringsM: [number, number][][] }[];
}
