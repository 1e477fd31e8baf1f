/**
 * Hand-built channel networks for the hydraulics and rules tests: plain
 * ChannelNetwork objects, no DXF involved.
 */
import type { ChannelNetwork, NetworkNode, NetworkSegment, NetworkPort, SectionShape } from "@/lib/network/types";

export interface SegSpec {
  id?: string;
  from: string;
  to: string;
  lengthM: number;
  widthM: number;
  depthM: number;
  endWidthM?: number;
  section?: SectionShape;
  minBendRadiusM?: number | null;
  path?: [number, number][];
}

export interface NetSpec {
  /** Node id → [x, y] in metres. */
  nodes: Record<string, [number, number]>;
  /** Port name → node id (radius defaults to 0.5 mm). */
  ports?: Record<string, string | { node: string; radiusM: number }>;
  segments: SegSpec[];
  outline?: [number, number][][];
}

/** Build a ChannelNetwork from a compact spec; straight centrelines between node positions unless a path is given. */
export function buildNetwork(spec: NetSpec): ChannelNetwork {
  const portOf = new Map<string, string>();
  const ports: NetworkPort[] = [];
  for (const [name, v] of Object.entries(spec.ports ?? {})) {
    const node = typeof v === "string" ? v : v.node;
    const radiusM = typeof v === "string" ? 0.5e-3 : v.radiusM;
    portOf.set(node, name);
    const [x, y] = spec.nodes[node];
    ports.push({ name, node, xM: x, yM: y, radiusM });
  }
  const nodes: NetworkNode[] = Object.entries(spec.nodes).map(([id, [x, y]]) => ({
    id,
    xM: x,
    yM: y,
    kind: portOf.has(id) ? "port" : "junction",
    port: portOf.get(id) ?? null,
  }));
  const segments: NetworkSegment[] = spec.segments.map((s, k) => ({
    id: s.id ?? `s${k}`,
    layer: "CHANNELS",
    from: s.from,
    to: s.to,
    lengthM: s.lengthM,
    widthM: s.widthM,
    endWidthM: s.endWidthM ?? s.widthM,
    depthM: s.depthM,
    section: s.section ?? "rectangular",
    minBendRadiusM: s.minBendRadiusM ?? null,
    path: s.path ?? [spec.nodes[s.from], spec.nodes[s.to]],
  }));
  const xs = Object.values(spec.nodes).map((p) => p[0]);
  const ys = Object.values(spec.nodes).map((p) => p[1]);
  return {
    units: { drawing: "um", source: "conditions", metresPerUnit: 1e-6 },
    nodes,
    segments,
    ports,
    warnings: [],
    layers: [],
    outline: spec.outline ?? [],
    bounds: { minXM: Math.min(...xs), minYM: Math.min(...ys), maxXM: Math.max(...xs), maxYM: Math.max(...ys) },
    mappingProposed: false,
  };
}
