/**
 * The pressure profile along the flow from one port to another: which segments
 * the fluid passes, and the pressure at each node against the distance along
 * the centreline. Reads the node pressures and segment flows of an analyze
 * document; pure.
 */
import { DomainError } from "../errors";
import type { AnalyzeJson } from "./serialize";

export interface ProfileStep {
  segmentId: string;
  /** Node the fluid enters the segment at, and leaves it by. */
  entryNode: string;
  exitNode: string;
  /** True when the fluid runs from the segment's `to` to its `from` (negative flow). */
  againstDrawnDirection: boolean;
  startDistanceM: number;
  endDistanceM: number;
  startPressurePa: number;
  endPressurePa: number;
  /** Flow through the segment, m³/s, positive along the path. */
  flowM3PerS: number;
}

export interface ProfilePoint {
  nodeId: string;
  /** Distance along the centreline from the start port's node, m. */
  distanceM: number;
  pressurePa: number;
}

export interface PressureProfile {
  fromPort: string;
  toPort: string;
  steps: ProfileStep[];
  /** One point per node on the path, start to end (segment ends only: inside a segment the drop is linear only when its cross-section is uniform). */
  points: ProfilePoint[];
  lengthM: number;
  pressureDropPa: number;
  /** The smallest flow along the path, m³/s: the path chosen is the one whose smallest flow is largest. */
  bottleneckFlowM3PerS: number;
}

/** Flows smaller than this fraction of the largest flow count as no flow (solver round-off; common practice). */
const NO_FLOW_FRACTION = 1e-9;

interface Edge {
  seg: string;
  from: string;
  to: string;
  lengthM: number;
  flow: number;
  drawnReversed: boolean;
}

function portNode(doc: AnalyzeJson, name: string, role: string): string {
  const port = doc.ports.find((p) => p.name === name);
  if (!port) {
    const names = doc.ports.map((p) => p.name).join(", ") || "none";
    throw new DomainError("unknown_port", `There is no port "${name}" for the ${role} of the profile; this chip's ports are: ${names}.`, 400);
  }
  return port.node;
}

/** Downstream edges: each segment that carries flow, pointed the way the fluid goes. */
function flowEdges(doc: AnalyzeJson): Edge[] {
  let maxFlow = 0;
  for (const s of doc.segments) maxFlow = Math.max(maxFlow, Math.abs(s.flow_m3_per_s ?? 0));
  const eps = NO_FLOW_FRACTION * maxFlow;
  const edges: Edge[] = [];
  for (const s of doc.segments) {
    const f = s.flow_m3_per_s ?? 0;
    if (maxFlow === 0 || Math.abs(f) <= eps) continue;
    edges.push(f > 0 ? { seg: s.id, from: s.from, to: s.to, lengthM: s.length_m, flow: f, drawnReversed: false } : { seg: s.id, from: s.to, to: s.from, lengthM: s.length_m, flow: -f, drawnReversed: true });
  }
  return edges;
}

/** Kahn's topological order of the downstream graph (acyclic: flow runs from higher to lower pressure). */
function topologicalOrder(nodes: string[], out: Map<string, Edge[]>): string[] {
  const indegree = new Map(nodes.map((n) => [n, 0]));
  for (const list of out.values()) for (const e of list) indegree.set(e.to, (indegree.get(e.to) ?? 0) + 1);
  const queue = nodes.filter((n) => (indegree.get(n) ?? 0) === 0);
  const order: string[] = [];
  while (queue.length > 0) {
    const n = queue.shift()!;
    order.push(n);
    for (const e of out.get(n) ?? []) {
      const d = (indegree.get(e.to) ?? 0) - 1;
      indegree.set(e.to, d);
      if (d === 0) queue.push(e.to);
    }
  }
  return order;
}

/**
 * Pressure profile from `fromPort` to `toPort` following the flow. Where the
 * flow splits, the path keeps to the branch whose smallest flow is largest (the
 * main stream), and among equals the shortest. Hand-written: a dynamic
 * programme over the flow graph's topological order, a dozen lines that no
 * installed package offers.
 * @param doc an analyze document with an operating point (node pressures and segment flows)
 * @throws DomainError 400 for an unknown or repeated port; 422 when the analysis has no
 *   operating point or no flow path runs from the first port to the second (the message says which way the flow runs).
 */
export function pressureProfile(doc: AnalyzeJson, fromPort: string, toPort: string): PressureProfile {
  if (fromPort === toPort) throw new DomainError("same_port", "Pick two different ports: the profile runs from one port to another.", 400);
  const start = portNode(doc, fromPort, "start");
  const end = portNode(doc, toPort, "end");
  const pressure = new Map<string, number>();
  for (const n of doc.nodes) if (typeof n.pressure_Pa === "number") pressure.set(n.id, n.pressure_Pa);
  if (pressure.size === 0 || doc.segments.some((s) => typeof s.flow_m3_per_s !== "number")) {
    throw new DomainError(
      "no_operating_point",
      "This analysis has geometry only, so there is no pressure to plot; set the port conditions and analyse it first.",
      422,
    );
  }

  const edges = flowEdges(doc);
  const out = new Map<string, Edge[]>();
  for (const e of edges) out.set(e.from, [...(out.get(e.from) ?? []), e]);
  const nodes = doc.nodes.map((n) => n.id);
  const order = topologicalOrder(nodes, out);

  interface Best {
    bottleneck: number;
    lengthM: number;
    via: Edge | null;
  }
  const best = new Map<string, Best>([[start, { bottleneck: Infinity, lengthM: 0, via: null }]]);
  const better = (c: Best, old: Best | undefined) => {
    if (!old) return true;
    const scale = Math.max(Math.abs(c.bottleneck === Infinity ? 0 : c.bottleneck), Math.abs(old.bottleneck === Infinity ? 0 : old.bottleneck));
    if (c.bottleneck > old.bottleneck + 1e-9 * scale) return true;
    return Math.abs(c.bottleneck - old.bottleneck) <= 1e-9 * scale && c.lengthM < old.lengthM;
  };
  for (const u of order) {
    const bu = best.get(u);
    if (!bu) continue;
    for (const e of out.get(u) ?? []) {
      const cand = { bottleneck: Math.min(bu.bottleneck, e.flow), lengthM: bu.lengthM + e.lengthM, via: e };
      if (better(cand, best.get(e.to))) best.set(e.to, cand);
    }
  }

  if (!best.has(end)) throw noPathError(doc, edges, start, end, fromPort, toPort);

  const path: Edge[] = [];
  for (let n = end; n !== start; ) {
    const via = best.get(n)!.via!;
    path.push(via);
    n = via.from;
  }
  path.reverse();

  const pAt = (node: string) => {
    const p = pressure.get(node);
    if (p === undefined) throw new DomainError("no_operating_point", `Node ${node} has no pressure in this analysis; analyse it again.`, 422);
    return p;
  };
  const steps: ProfileStep[] = [];
  const points: ProfilePoint[] = [{ nodeId: start, distanceM: 0, pressurePa: pAt(start) }];
  let distanceM = 0;
  for (const e of path) {
    const step: ProfileStep = {
      segmentId: e.seg,
      entryNode: e.from,
      exitNode: e.to,
      againstDrawnDirection: e.drawnReversed,
      startDistanceM: distanceM,
      endDistanceM: distanceM + e.lengthM,
      startPressurePa: pAt(e.from),
      endPressurePa: pAt(e.to),
      flowM3PerS: e.flow,
    };
    distanceM = step.endDistanceM;
    steps.push(step);
    points.push({ nodeId: e.to, distanceM, pressurePa: step.endPressurePa });
  }
  return {
    fromPort,
    toPort,
    steps,
    points,
    lengthM: distanceM,
    pressureDropPa: points[0].pressurePa - points[points.length - 1].pressurePa,
    bottleneckFlowM3PerS: steps.reduce((m, s) => Math.min(m, s.flowM3PerS), Infinity),
  };
}

function reachable(edges: Edge[], from: string, to: string): boolean {
  const out = new Map<string, string[]>();
  for (const e of edges) out.set(e.from, [...(out.get(e.from) ?? []), e.to]);
  const seen = new Set([from]);
  const stack = [from];
  while (stack.length > 0) {
    const n = stack.pop()!;
    if (n === to) return true;
    for (const m of out.get(n) ?? []) {
      if (seen.has(m)) continue;
      seen.add(m);
      stack.push(m);
    }
  }
  return false;
}

function noPathError(doc: AnalyzeJson, edges: Edge[], start: string, end: string, fromPort: string, toPort: string): DomainError {
  if (reachable(edges, end, start)) {
    return new DomainError(
      "no_flow_path",
      `The flow runs from ${toPort} to ${fromPort}, not the other way; swap the two ports to draw the profile along the flow.`,
      422,
    );
  }
  const carries = (node: string) => edges.some((e) => e.from === node || e.to === node);
  const idle = [carries(start) ? null : fromPort, carries(end) ? null : toPort].filter((p) => p !== null);
  const why = idle.length > 0 ? ` No flow passes through ${idle.join(" or ")} at this operating point.` : "";
  return new DomainError("no_flow_path", `No flow path leads from ${fromPort} to ${toPort} at this operating point.${why} Pick an inlet and an outlet it feeds.`, 422, {
    segments: doc.segments.length,
  });
}
