/**
 * The hydraulics engine: channel network + conditions → pressures, flows and
 * every segment's regime figures. Lumped, fully developed laminar model (see
 * lib/analysis/cautions.ts). Pure: no clock, no I/O.
 */
import type { ChannelNetwork } from "../network/types";
import type { Conditions } from "../analysis/conditions";
import type { HydraulicsResult, HydraulicsTotals, PortHydraulics, ResolvedFluid, SegmentHydraulics } from "./types";
import { ConditionsError, SolveError } from "../errors";
import { parseQuantity } from "../units/quantity";
import { integrateSegmentSection, type SegmentSection } from "./cross-section";
import { resolveFluid, resolveSoluteDiffusivity } from "./fluids";
import { solveGraph, type ResolvedDrive } from "./network-solve";
import {
  bondNumber,
  capillaryNumber,
  deanNumber,
  diffusionTimeS,
  entranceLengthM,
  hydrostaticPressurePa,
  mixingLengthM,
  pecletNumber,
  reynoldsNumber,
  weberNumber,
} from "./groups";
import { AIR_DENSITY_KG_PER_M3 } from "./constants";
import { buildFlowGraph, pathResidences } from "./flow-paths";

export interface ResolvedPhases {
  fluid: ResolvedFluid;
  secondPhase: ResolvedFluid | null;
  interfacialTensionNPerM: number;
  soluteDiffusivityM2PerS: number;
}

/**
 * Resolve the fluid, the optional second phase with its interfacial tension, and the solute diffusivity.
 * Without an interfacial tension the second phase gets Antonow's rule |σ₁ − σ₂| (an estimate, marked as such).
 * @throws ConditionsError for unknown presets or bad quantities.
 */
export function resolvePhases(conditions: Conditions): ResolvedPhases {
  const fluid = resolveFluid(conditions.fluid, "fluid");
  let secondPhase: ResolvedFluid | null = null;
  let interfacialTensionNPerM = fluid.surfaceTensionNPerM;
  if (conditions.second_phase) {
    const { interfacial_tension: gamma, ...rest } = conditions.second_phase;
    secondPhase = resolveFluid(rest, "second_phase", fluid.temperatureK);
    if (gamma !== undefined) {
      interfacialTensionNPerM = parseQuantity(gamma, "surface_tension", "second_phase.interfacial_tension");
      if (!(interfacialTensionNPerM > 0)) throw new ConditionsError("invalid_property", "second_phase.interfacial_tension must be positive.");
      secondPhase.sources.interfacial_tension = "given in the conditions";
    } else {
      // Antonow's rule, γ₁₂ ≈ |σ₁ − σ₂| (a rough estimate for immiscible liquids; surfactants change it a lot).
      interfacialTensionNPerM = Math.max(1e-4, Math.abs(fluid.surfaceTensionNPerM - secondPhase.surfaceTensionNPerM));
      secondPhase.sources.interfacial_tension = "Antonow's rule |σ₁ − σ₂|, a rough estimate: give the measured interfacial tension";
    }
  }
  const solute = resolveSoluteDiffusivity(conditions.solute, conditions.fluid?.diffusivity, fluid.temperatureK, fluid.viscosityPaS);
  fluid.sources.solute_diffusivity = solute.source;
  return { fluid, secondPhase, interfacialTensionNPerM, soluteDiffusivityM2PerS: solute.diffusivityM2PerS };
}

/**
 * Solve the network's hydraulics under the conditions. Ports not named in `conditions.ports` are open to
 * the atmosphere (0 Pa gauge). Pressures are gauge, Pa; flows m³/s, positive from `from` to `to` on segments
 * and into the chip at ports.
 * @throws ConditionsError for a driven port not in the network or a bad quantity; SolveError when the
 * network cannot be solved as posed (floating part, no pressure reference, contradictory ports).
 */
export function solveHydraulics(network: ChannelNetwork, conditions: Conditions): HydraulicsResult {
  const phases = resolvePhases(conditions);
  const { fluid, secondPhase, interfacialTensionNPerM: gamma, soluteDiffusivityM2PerS: diff } = phases;
  const mu = fluid.viscosityPaS;
  const rho = fluid.densityKgPerM3;

  const nodeIndex = new Map<string, number>();
  network.nodes.forEach((n, i) => nodeIndex.set(n.id, i));
  const portsByName = new Map(network.ports.map((p) => [p.name, p]));
  const drives = conditions.ports ?? {};
  for (const name of Object.keys(drives)) {
    if (!portsByName.has(name)) {
      const known = network.ports.map((p) => p.name);
      throw new ConditionsError(
        "unknown_port",
        `The conditions drive port "${name}", but the layout has no port of that name; the ports are ${known.length ? known.join(", ") : "none (put port circles on a port layer)"}.`,
        { port: name, known },
      );
    }
  }

  const sections: SegmentSection[] = network.segments.map((s) => integrateSegmentSection(s));
  const graphSegments = network.segments.map((s, k) => {
    const from = nodeIndex.get(s.from);
    const to = nodeIndex.get(s.to);
    if (from === undefined || to === undefined) {
      throw new SolveError("dangling_segment", `Segment ${s.id} refers to node ${from === undefined ? s.from : s.to}, which is not in the network.`);
    }
    return { id: s.id, from, to, conductanceM3PerPaS: 1 / (mu * sections[k].resistancePerViscosityPerM3) };
  });

  const portDrive: { name: string; node: number; drive: ResolvedDrive; kind: PortHydraulics["drive"]; phase: "continuous" | "dispersed" }[] = [];
  for (const port of network.ports) {
    const node = nodeIndex.get(port.node);
    if (node === undefined) throw new SolveError("dangling_port", `Port ${port.name} refers to node ${port.node}, which is not in the network.`);
    const d = drives[port.name] as Record<string, unknown> | undefined;
    const phase = d?.phase === "dispersed" ? "dispersed" : "continuous";
    const portRho = phase === "dispersed" && secondPhase ? secondPhase.densityKgPerM3 : rho;
    if (!d) {
      portDrive.push({ name: port.name, node, drive: { kind: "pressure", pressurePa: 0, as: "open" }, kind: "open", phase });
      continue;
    }
    const keys = ["flow", "pressure", "head"].filter((k) => d[k] !== undefined);
    if (keys.length !== 1) {
      throw new ConditionsError("contradictory_ports", `Port ${port.name} must have exactly one of flow, pressure or head (it has ${keys.length ? keys.join(" and ") : "none"}).`, { port: port.name });
    }
    const field = `ports.${port.name}.${keys[0]}`;
    if (keys[0] === "flow") {
      portDrive.push({ name: port.name, node, drive: { kind: "flow", flowM3PerS: parseQuantity(d.flow as string | number, "flow", field) }, kind: "flow", phase });
    } else if (keys[0] === "pressure") {
      portDrive.push({ name: port.name, node, drive: { kind: "pressure", pressurePa: parseQuantity(d.pressure as string | number, "pressure", field), as: "pressure" }, kind: "pressure", phase });
    } else {
      const headM = parseQuantity(d.head as string | number, "length", field);
      portDrive.push({ name: port.name, node, drive: { kind: "pressure", pressurePa: hydrostaticPressurePa(portRho, headM), as: "head" }, kind: "head", phase });
    }
  }

  const sol = solveGraph({
    nodeIds: network.nodes.map((n) => n.id),
    nodeXYM: network.nodes.map((n) => [n.xM, n.yM]),
    segments: graphSegments,
    ports: portDrive.map(({ name, node, drive }) => ({ name, node, drive })),
  });

  let qMax = 0;
  for (const q of sol.segmentFlowM3PerS) qMax = Math.max(qMax, Math.abs(q));
  const stagnant = 1e-12 * qMax;

  const segments: SegmentHydraulics[] = network.segments.map((s, k) => {
    const sec = sections[k];
    const q = sol.segmentFlowM3PerS[k];
    const speed = Math.abs(q) / sec.meanAreaM2;
    const dh = sec.hydraulicDiameterM;
    // Mixing across the channel width; for a round channel the width is its diameter.
    const w = sec.meanWidthM;
    const re = reynoldsNumber(rho, speed, dh, mu);
    const flowing = Math.abs(q) > stagnant;
    return {
      id: s.id,
      resistancePaSPerM3: mu * sec.resistancePerViscosityPerM3,
      flowM3PerS: q,
      meanVelocityMPerS: q / sec.meanAreaM2,
      pressureDropPa: sol.nodePressurePa[graphSegments[k].from] - sol.nodePressurePa[graphSegments[k].to],
      hydraulicDiameterM: dh,
      crossSectionAreaM2: sec.meanAreaM2,
      volumeM3: sec.volumeM3,
      reynolds: re,
      capillary: capillaryNumber(mu, speed, gamma),
      weber: weberNumber(rho, speed, dh, gamma),
      peclet: pecletNumber(speed, w, diff),
      dean: s.minBendRadiusM !== null && s.minBendRadiusM > 0 ? deanNumber(re, dh, s.minBendRadiusM) : null,
      wallShearPa: mu * Math.abs(q) * sec.maxWallShearFactorPerM3,
      residenceS: flowing ? sec.volumeM3 / Math.abs(q) : Infinity,
      diffusionTimeS: diffusionTimeS(w, diff),
      mixingLengthM: mixingLengthM(speed, w, diff),
      entranceLengthM: developingLength(s.section, re, dh, w, s.depthM, speed, rho, mu),
    };
  });

  const ports: PortHydraulics[] = network.ports.map((port, k) => {
    const pd = portDrive[k];
    const phaseFluid = pd.phase === "dispersed" && secondPhase ? secondPhase : fluid;
    return {
      name: port.name,
      drive: pd.kind,
      pressurePa: sol.nodePressurePa[pd.node],
      flowM3PerS: sol.portFlowM3PerS[k],
      // Liquid–air meniscus in the port's reservoir, L = port radius.
      bond: port.radiusM > 0 ? bondNumber(phaseFluid.densityKgPerM3 - AIR_DENSITY_KG_PER_M3, port.radiusM, phaseFluid.surfaceTensionNPerM) : 0,
    };
  });

  const result: HydraulicsResult = {
    fluid,
    secondPhase,
    interfacialTensionNPerM: gamma,
    soluteDiffusivityM2PerS: diff,
    segments,
    nodes: network.nodes.map((n, i) => ({ id: n.id, pressurePa: sol.nodePressurePa[i] })),
    ports,
    totals: emptyTotals(),
    diagnostics: { unknowns: sol.unknowns, nonZeros: sol.nonZeros, residualRel: sol.residualRel, method: sol.method },
  };
  result.totals = computeTotals(network, result);
  return result;
}

/**
 * Entrance length by Durst et al. (2005): the pipe correlation on D for round channels; the plane-channel one for
 * the rest, with H the smaller of width and depth (the gap the profile develops across) and Re on H.
 */
function developingLength(section: string, re: number, dh: number, widthM: number, depthM: number, speed: number, rho: number, mu: number): number {
  if (section === "circular") return entranceLengthM(re, dh, "pipe");
  const gap = Math.min(widthM, depthM);
  return entranceLengthM(reynoldsNumber(rho, speed, gap, mu), gap, "channel");
}

function emptyTotals(): HydraulicsTotals {
  return {
    totalFlowM3PerS: 0,
    maxInletPressurePa: 0,
    totalVolumeM3: 0,
    meanResidenceS: Infinity,
    pathResidence: [],
    maxReynolds: { value: 0, segment: null },
    maxCapillary: { value: 0, segment: null },
    maxWallShear: { valuePa: 0, segment: null },
  };
}

function computeTotals(network: ChannelNetwork, h: HydraulicsResult): HydraulicsTotals {
  const t = emptyTotals();
  let qScale = 0;
  for (const p of h.ports) qScale = Math.max(qScale, Math.abs(p.flowM3PerS));
  for (const p of h.ports) {
    if (p.flowM3PerS > 1e-12 * qScale) {
      t.totalFlowM3PerS += p.flowM3PerS;
      t.maxInletPressurePa = Math.max(t.maxInletPressurePa, p.pressurePa);
    }
  }
  for (const s of h.segments) {
    t.totalVolumeM3 += s.volumeM3;
    if (s.reynolds > t.maxReynolds.value) t.maxReynolds = { value: s.reynolds, segment: s.id };
    if (s.capillary > t.maxCapillary.value) t.maxCapillary = { value: s.capillary, segment: s.id };
    if (s.wallShearPa > t.maxWallShear.valuePa) t.maxWallShear = { valuePa: s.wallShearPa, segment: s.id };
  }
  t.meanResidenceS = t.totalFlowM3PerS > 0 ? t.totalVolumeM3 / t.totalFlowM3PerS : Infinity;
  t.pathResidence = pathResidences(network, h, buildFlowGraph(network, h));
  return t;
}
