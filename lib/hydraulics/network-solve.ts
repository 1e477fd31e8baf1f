/**
 * Kirchhoff's current law on the channel network: one unknown pressure per node
 * not fixed by a pressure port, conductance 1/R per segment, flow ports as
 * injected flows. Assembles the sparse SPD system, checks that it is solvable
 * (every connected part has a pressure reference, nothing contradicts), solves it
 * and returns pressures and flows. Pure: plain data in, plain data out.
 */
import { SolveError } from "../errors";
import { relativeResidual, solveSpdLdl, type SymmetricSystem } from "./sparse-ldl";
import { UnionFind } from "../graph/union-find";

export type ResolvedDrive =
  | { kind: "pressure"; pressurePa: number; as: "pressure" | "head" | "open" }
  | { kind: "flow"; flowM3PerS: number };

export interface GraphInput {
  nodeIds: string[];
  /** Node coordinates, for naming the place of a floating part. */
  nodeXYM?: [number, number][];
  segments: { id: string; from: number; to: number; conductanceM3PerPaS: number }[];
  /** Ports: name, node index, drive. */
  ports: { name: string; node: number; drive: ResolvedDrive }[];
}

export interface GraphSolution {
  nodePressurePa: Float64Array;
  segmentFlowM3PerS: Float64Array;
  /** Per port, positive into the chip. */
  portFlowM3PerS: Float64Array;
  unknowns: number;
  nonZeros: number;
  residualRel: number;
  method: string;
}

const fmtFlow = (q: number) => `${(q * 6e10).toPrecision(4)} µL/min`;

/**
 * Solve the network. Flow balance tolerance for all-flow-driven parts: 1e-9 of the largest port flow.
 * @throws SolveError naming the ports or the region when a part floats (no port), has no pressure
 * reference, has contradictory port settings, or the result is not finite.
 */
export function solveGraph(input: GraphInput): GraphSolution {
  const n = input.nodeIds.length;
  const fixed = new Float64Array(n).fill(NaN);
  const fixedBy: (string | null)[] = new Array(n).fill(null);
  const injected = new Float64Array(n);
  const flowBy: (string | null)[] = new Array(n).fill(null);
  for (const port of input.ports) {
    const i = port.node;
    if (port.drive.kind === "pressure") {
      if (flowBy[i]) {
        throw new SolveError("contradictory_ports", `Port ${port.name} sets a pressure on the same node where port ${flowBy[i]} sets a flow; a node can have one or the other. Drive one of them differently.`, { ports: [port.name, flowBy[i]] });
      }
      if (fixedBy[i] && Math.abs(fixed[i] - port.drive.pressurePa) > 1e-9 * Math.max(1, Math.abs(fixed[i]))) {
        throw new SolveError("contradictory_ports", `Ports ${fixedBy[i]} and ${port.name} share a node but set different pressures; give them the same pressure or drive only one.`, { ports: [fixedBy[i], port.name] });
      }
      fixed[i] = port.drive.pressurePa;
      fixedBy[i] = port.name;
    } else {
      if (fixedBy[i]) {
        throw new SolveError("contradictory_ports", `Port ${port.name} sets a flow on the same node where port ${fixedBy[i]} sets a pressure; a node can have one or the other.`, { ports: [port.name, fixedBy[i]] });
      }
      injected[i] += port.drive.flowM3PerS;
      flowBy[i] = flowBy[i] ? `${flowBy[i]}, ${port.name}` : port.name;
    }
  }

  // Connected parts and what drives each.
  const uf = new UnionFind(n);
  for (const s of input.segments) uf.union(s.from, s.to);
  const parts = new Map<number, { nodes: number; segments: string[]; pressurePorts: string[]; flowPorts: string[]; flowSum: number; flowScale: number; node: number }>();
  const partOf = (i: number) => {
    const r = uf.find(i);
    let p = parts.get(r);
    if (!p) {
      p = { nodes: 0, segments: [], pressurePorts: [], flowPorts: [], flowSum: 0, flowScale: 0, node: i };
      parts.set(r, p);
    }
    return p;
  };
  for (let i = 0; i < n; i++) partOf(i).nodes++;
  for (const s of input.segments) {
    const p = partOf(s.from);
    if (p.segments.length < 6) p.segments.push(s.id);
  }
  for (const port of input.ports) {
    const p = partOf(port.node);
    if (port.drive.kind === "pressure") p.pressurePorts.push(port.name);
    else {
      p.flowPorts.push(port.name);
      p.flowSum += port.drive.flowM3PerS;
      p.flowScale = Math.max(p.flowScale, Math.abs(port.drive.flowM3PerS));
    }
  }
  for (const p of parts.values()) {
    if (p.pressurePorts.length > 0) continue;
    const where = input.nodeXYM ? ` near (${(input.nodeXYM[p.node][0] * 1e3).toFixed(3)} mm, ${(input.nodeXYM[p.node][1] * 1e3).toFixed(3)} mm)` : "";
    const segs = p.segments.length ? ` (segments ${p.segments.join(", ")}${p.segments.length >= 6 ? ", …" : ""})` : ` (node ${input.nodeIds[p.node]})`;
    if (p.flowPorts.length === 0) {
      if (p.segments.length === 0) continue; // an isolated node with nothing attached carries no flow
      throw new SolveError(
        "floating_part",
        `A part of the channel network${where}${segs} is not connected to any port, so its pressure is undefined. Connect it to the rest of the chip, add a port to it, or move it off the channel layer.`,
        { segments: p.segments },
      );
    }
    if (Math.abs(p.flowSum) > 1e-9 * p.flowScale) {
      throw new SolveError(
        "contradictory_ports",
        `Every port of one part of the chip (${p.flowPorts.join(", ")}) is flow-driven and the flows do not balance (net ${fmtFlow(p.flowSum)} in); liquid cannot pile up. Set one of these ports to a pressure (for an outlet, "pressure": "0 Pa").`,
        { ports: p.flowPorts },
      );
    }
    throw new SolveError(
      "no_pressure_reference",
      `No port of the part containing ${p.flowPorts.join(", ")} sets a pressure, so the pressures are undetermined. Set at least one port (usually the outlet) to a pressure, e.g. "pressure": "0 Pa".`,
      { ports: p.flowPorts },
    );
  }

  // Unknowns: nodes without a fixed pressure that touch a segment or carry a flow.
  const index = new Int32Array(n).fill(-1);
  let m = 0;
  for (let i = 0; i < n; i++) if (Number.isNaN(fixed[i])) index[i] = m++;
  const diag = new Float64Array(m);
  const rhs = new Float64Array(m);
  const rows: number[] = [];
  const cols: number[] = [];
  const vals: number[] = [];
  for (let i = 0; i < n; i++) if (index[i] >= 0) rhs[index[i]] += injected[i];
  for (const s of input.segments) {
    const g = s.conductanceM3PerPaS;
    if (!(g > 0) || !Number.isFinite(g)) {
      throw new SolveError("invalid_resistance", `Segment ${s.id} has no finite positive hydraulic resistance; check its length, width and depth.`, { segment: s.id });
    }
    if (s.from === s.to) continue;
    const a = index[s.from];
    const b = index[s.to];
    if (a >= 0) diag[a] += g;
    if (b >= 0) diag[b] += g;
    if (a >= 0 && b >= 0) {
      rows.push(a);
      cols.push(b);
      vals.push(-g);
    } else if (a >= 0) rhs[a] += g * fixed[s.to];
    else if (b >= 0) rhs[b] += g * fixed[s.from];
  }
  // An unknown node with no segment (an isolated flow port) would be singular; the part check above excludes flow, so pin it.
  for (let i = 0; i < n; i++) {
    const k = index[i];
    if (k >= 0 && diag[k] === 0) {
      if (injected[i] !== 0) {
        throw new SolveError("contradictory_ports", `Port ${flowBy[i]} is flow-driven but its node has no channel attached; the flow has nowhere to go.`, { ports: [flowBy[i]] });
      }
      diag[k] = 1;
      rhs[k] = 0;
    }
  }
  const system: SymmetricSystem = { n: m, diag, rows: Int32Array.from(rows), cols: Int32Array.from(cols), values: Float64Array.from(vals) };
  let x: Float64Array = new Float64Array(0);
  let factorNonZeros = 0;
  if (m > 0) {
    try {
      const res = solveSpdLdl(system, rhs);
      x = res.x;
      factorNonZeros = res.factorNonZeros;
    } catch {
      throw new SolveError("singular_network", "The network's equations could not be solved (a part without a pressure reference or a channel with zero resistance); check the port settings and the channel sizes.");
    }
  }
  const residualRel = m > 0 ? relativeResidual(system, x, rhs) : 0;

  const p = new Float64Array(n);
  for (let i = 0; i < n; i++) p[i] = index[i] >= 0 ? x[index[i]] : fixed[i];
  const q = new Float64Array(input.segments.length);
  const netOut = new Float64Array(n);
  input.segments.forEach((s, k) => {
    const flow = s.from === s.to ? 0 : s.conductanceM3PerPaS * (p[s.from] - p[s.to]);
    q[k] = flow;
    netOut[s.from] += flow;
    netOut[s.to] -= flow;
  });
  const portFlow = new Float64Array(input.ports.length);
  const seenNode = new Set<number>();
  input.ports.forEach((port, k) => {
    if (port.drive.kind === "flow") portFlow[k] = port.drive.flowM3PerS;
    else if (!seenNode.has(port.node)) {
      portFlow[k] = netOut[port.node];
      seenNode.add(port.node);
    }
  });
  for (const arr of [p, q, portFlow]) {
    for (let i = 0; i < arr.length; i++) {
      if (!Number.isFinite(arr[i])) throw new SolveError("non_finite_result", "The solve gave a non-finite result; check for channels with extreme sizes or pressures.");
    }
  }
  return {
    nodePressurePa: p,
    segmentFlowM3PerS: q,
    portFlowM3PerS: portFlow,
    unknowns: m,
    nonZeros: m + 2 * rows.length,
    residualRel,
    method: `sparse LDLᵀ, minimum-degree order (${factorNonZeros} factor non-zeros)`,
  };
}
