/**
 * What the hydraulics engine returns for a channel network under a set of
 * conditions: SI units, keyed by the network's ids. Plain data only.
 */

/** Fluid properties resolved to SI at the analysis temperature. */
export interface ResolvedFluid {
  name: string;
  temperatureK: number;
  viscosityPaS: number;
  densityKgPerM3: number;
  /** Against air (or the second phase's interfacial tension when one is given, see ResolvedConditions). */
  surfaceTensionNPerM: number;
  /** Where each value came from (standard, handbook, typical value, user). */
  sources: Record<string, string>;
}

export interface SegmentHydraulics {
  id: string;
  resistancePaSPerM3: number;
  /** Positive from the segment's `from` node to its `to` node. */
  flowM3PerS: number;
  meanVelocityMPerS: number;
  pressureDropPa: number;
  hydraulicDiameterM: number;
  crossSectionAreaM2: number;
  volumeM3: number;
  reynolds: number;
  capillary: number;
  weber: number;
  peclet: number;
  /** null for a straight segment. */
  dean: number | null;
  wallShearPa: number;
  residenceS: number;
  /** Time to diffuse across the width, w²/D. */
  diffusionTimeS: number;
  mixingLengthM: number;
  entranceLengthM: number;
}

export interface NodeHydraulics {
  id: string;
  pressurePa: number;
}

export interface PortHydraulics {
  name: string;
  drive: "flow" | "pressure" | "head" | "open";
  pressurePa: number;
  /** Positive into the chip. */
  flowM3PerS: number;
  /** Bond number at the port, Δρ g r² / σ. */
  bond: number;
}

export interface HydraulicsTotals {
  /** Sum of inflows (positive flows at ports). */
  totalFlowM3PerS: number;
  maxInletPressurePa: number;
  totalVolumeM3: number;
  /** Volume / total flow: mean residence time of the chip. */
  meanResidenceS: number;
  /** Residence along each inlet→outlet path following the flow (shortest by time). */
  pathResidence: { from: string; to: string; residenceS: number }[];
  maxReynolds: { value: number; segment: string | null };
  maxCapillary: { value: number; segment: string | null };
  maxWallShear: { valuePa: number; segment: string | null };
}

export interface HydraulicsResult {
  fluid: ResolvedFluid;
  secondPhase: ResolvedFluid | null;
  /** Interfacial tension used for Ca and We, N/m. */
  interfacialTensionNPerM: number;
  soluteDiffusivityM2PerS: number;
  segments: SegmentHydraulics[];
  nodes: NodeHydraulics[];
  ports: PortHydraulics[];
  totals: HydraulicsTotals;
  /** Solver diagnostics: unknowns, non-zeros, residual. */
  diagnostics: { unknowns: number; nonZeros: number; residualRel: number; method: string };
}

export type FlagSeverity = "info" | "warn" | "block";

export interface Flag {
  /** Stable rule code, e.g. "re_inertial", "fab_min_width". */
  code: string;
  severity: FlagSeverity;
  family: "regime" | "fabrication" | "pressure";
  /** What it concerns. */
  target: { kind: "segment" | "port" | "node" | "chip"; id: string | null };
  title: string;
  /** Plain words: what it means physically and what a designer usually changes. */
  message: string;
  value: number | null;
  threshold: number | null;
  /** Where the threshold comes from (publication, or "common practice"). */
  source: string;
  at?: { xM: number; yM: number };
}
