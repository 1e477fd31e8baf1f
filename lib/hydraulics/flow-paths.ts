/**
 * Following the flow through a solved network: which inlets feed each node and
 * segment, and the quickest residence time from each inlet to each outlet.
 * Flow runs from high to low pressure, so the flow graph is acyclic and
 * descending pressure is a topological order.
 */
import type { ChannelNetwork } from "../network/types";
import type { HydraulicsResult } from "./types";

export interface FlowGraph {
  nodeIndex: Map<string, number>;
  /** Node indices in order of descending pressure (upstream first). */
  order: Int32Array;
  /** Outgoing flow edges per node: [segment index, downstream node index]. */
  out: [number, number][][];
  /** Incoming flow edges per node: [segment index, upstream node index]. */
  into: [number, number][][];
  /** |Q| below this counts as no flow, m³/s. */
  stagnantM3PerS: number;
}

/** Build the directed flow graph of a solved network. Segments with |Q| ≤ 1e-12 × the largest |Q| carry no flow. */
export function buildFlowGraph(network: ChannelNetwork, hydraulics: HydraulicsResult): FlowGraph {
  const nodeIndex = new Map(network.nodes.map((n, i) => [n.id, i]));
  const pressure = new Float64Array(network.nodes.length);
  for (const n of hydraulics.nodes) {
    const i = nodeIndex.get(n.id);
    if (i !== undefined) pressure[i] = n.pressurePa;
  }
  let qMax = 0;
  for (const s of hydraulics.segments) qMax = Math.max(qMax, Math.abs(s.flowM3PerS));
  const stagnant = 1e-12 * qMax;
  const out: [number, number][][] = network.nodes.map(() => []);
  const into: [number, number][][] = network.nodes.map(() => []);
  network.segments.forEach((seg, k) => {
    const q = hydraulics.segments[k]?.flowM3PerS ?? 0;
    if (Math.abs(q) <= stagnant) return;
    const a = nodeIndex.get(seg.from)!;
    const b = nodeIndex.get(seg.to)!;
    const [up, down] = q > 0 ? [a, b] : [b, a];
    out[up].push([k, down]);
    into[down].push([k, up]);
  });
  const order = Int32Array.from(network.nodes.map((_, i) => i)).sort((x, y) => pressure[y] - pressure[x]);
  return { nodeIndex, order, out, into, stagnantM3PerS: stagnant };
}

/**
 * Which inlet ports feed each segment: a bit per inlet (the first 31 inlets by name; more share the last bit).
 * Returns per-segment masks and the inlet names in bit order.
 */
export function tagInletStreams(network: ChannelNetwork, hydraulics: HydraulicsResult, graph: FlowGraph): { inlets: string[]; segmentMask: Int32Array; nodeMask: Int32Array } {
  const inlets = hydraulics.ports.filter((p) => p.flowM3PerS > graph.stagnantM3PerS).map((p) => p.name).sort();
  const portNode = new Map(network.ports.map((p) => [p.name, graph.nodeIndex.get(p.node)!]));
  const nodeMask = new Int32Array(network.nodes.length);
  inlets.forEach((name, b) => {
    const i = portNode.get(name);
    if (i !== undefined) nodeMask[i] |= 1 << Math.min(b, 30);
  });
  const segmentMask = new Int32Array(network.segments.length);
  for (const i of graph.order) {
    for (const [k, down] of graph.out[i]) {
      segmentMask[k] |= nodeMask[i];
      nodeMask[down] |= nodeMask[i];
    }
  }
  return { inlets, segmentMask, nodeMask };
}

/** Quickest residence time from each inlet to each outlet it reaches, following the flow (DP over the acyclic flow graph; at most 64 inlets). */
export function pathResidences(network: ChannelNetwork, hydraulics: HydraulicsResult, graph: FlowGraph): { from: string; to: string; residenceS: number }[] {
  const inlets = hydraulics.ports.filter((p) => p.flowM3PerS > graph.stagnantM3PerS).slice(0, 64);
  const outlets = hydraulics.ports.filter((p) => p.flowM3PerS < -graph.stagnantM3PerS);
  const portNode = new Map(network.ports.map((p) => [p.name, graph.nodeIndex.get(p.node)!]));
  const result: { from: string; to: string; residenceS: number }[] = [];
  const t = new Float64Array(network.nodes.length);
  for (const inlet of inlets) {
    t.fill(Infinity);
    const start = portNode.get(inlet.name);
    if (start === undefined) continue;
    t[start] = 0;
    for (const i of graph.order) {
      if (t[i] === Infinity) continue;
      for (const [k, down] of graph.out[i]) {
        const cand = t[i] + hydraulics.segments[k].residenceS;
        if (cand < t[down]) t[down] = cand;
      }
    }
    for (const outlet of outlets) {
      const j = portNode.get(outlet.name);
      if (j !== undefined && t[j] < Infinity && j !== start) result.push({ from: inlet.name, to: outlet.name, residenceS: t[j] });
    }
  }
  return result;
}
