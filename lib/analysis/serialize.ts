/**
 * The `analyze` JSON document: snake_case keys with the unit in each name, as
 * the CLI prints it and the API returns it. Internal types are camelCase; this
 * is the one place that maps them.
 */
import type { ChannelNetwork } from "../network/types";
import type { Flag, HydraulicsResult } from "../hydraulics/types";
import { MODEL_CAUTIONS } from "./cautions";

export const ANALYZE_FORMAT_VERSION = 1;

export interface AnalyzeSegmentJson {
  id: string;
  layer: string;
  from: string;
  to: string;
  length_m: number;
  width_m: number;
  end_width_m: number;
  min_width_m: number;
  max_width_m: number;
  depth_m: number;
  section: string;
  min_bend_radius_m: number | null;
  path_m: [number, number][];
  // Hydraulics (present when ports are driven). Lumped, fully developed laminar model; see MODEL_CAUTIONS.
  /** Hydraulic resistance R = Δp/Q, integrated along the segment's width profile. */
  resistance_Pa_s_per_m3?: number;
  /** Volumetric flow Q, positive from `from` to `to`. */
  flow_m3_per_s?: number;
  /** U = Q/A with A the length-averaged cross-section area; same sign as the flow. */
  mean_velocity_m_per_s?: number;
  /** p(from) − p(to). */
  pressure_drop_Pa?: number;
  /** D_h = 4A/P (wetted perimeter, lid included). */
  hydraulic_diameter_m?: number;
  /** Re = ρ·|U|·D_h/μ (inertial / viscous). */
  reynolds?: number;
  /** Ca = μ·|U|/σ, continuous-phase viscosity; σ is the interfacial tension when a second phase is given. */
  capillary?: number;
  /** We = ρ·U²·D_h/σ (inertial / surface). */
  weber?: number;
  /** Pe = |U|·w/D, w the channel width (the mixing direction), D the solute diffusivity. */
  peclet?: number;
  /** De = Re·√(D_h/(2·R_c)), R_c the smallest bend radius; null for a straight segment. */
  dean?: number | null;
  /** Peak wall shear: exact series for rectangles, 4μQ/(πa³) for circles, a tabulated numerical solution for D, KOH and half-disc sections. */
  wall_shear_Pa?: number;
  /** Volume / |Q|; serialised as null (Infinity in memory) where the segment carries no flow. */
  residence_s?: number;
  /** w²/D, time to diffuse across the width. */
  diffusion_time_s?: number;
  /** ≈ Pe·w = |U|·w²/D, length the flow travels while the solute diffuses across (Squires & Quake 2005). */
  mixing_length_m?: number;
  /** Hydrodynamic entrance length, Durst et al. (2005): pipe correlation on D for round channels, plane-channel on the smaller of width and depth otherwise. */
  entrance_length_m?: number;
}

export interface AnalyzeJson {
  ok: true;
  format: number;
  units: { drawing: string; source: string };
  mapping_proposed: boolean;
  nodes: { id: string; x_m: number; y_m: number; kind: string; port: string | null; pressure_Pa?: number }[];
  segments: AnalyzeSegmentJson[];
  /** Port pressure is gauge (for a flow-driven port: the pressure its pump must supply); flow is positive into the chip;
   * bond is Bo = Δρ·g_n·r²/σ with r the port radius (the liquid against air in the port). Undriven ports are open (0 Pa). */
  ports: { name: string; node: string; x_m: number; y_m: number; radius_m: number; drive?: string; pressure_Pa?: number; flow_m3_per_s?: number; bond?: number }[];
  warnings: { code: string; message: string; at?: { x_m: number; y_m: number } }[];
  layers: { name: string; role: string; entities: number; by_type: Record<string, number>; style?: string; proposed_role?: string }[];
  outline_m: [number, number][][];
  /** Channel layers drawn as filled mask shapes (outline layouts): the shapes' rings, metres. */
  mask_m?: { layer: string; rings: [number, number][][] }[];
  bounds_m: { min_x: number; min_y: number; max_x: number; max_y: number };
  fluid: null | {
    name: string;
    temperature_K: number;
    viscosity_Pa_s: number;
    density_kg_per_m3: number;
    surface_tension_N_per_m: number;
    interfacial_tension_N_per_m: number;
    solute_diffusivity_m2_per_s: number;
    sources: Record<string, string>;
  };
  totals: null | {
    total_flow_m3_per_s: number;
    max_inlet_pressure_Pa: number;
    total_volume_m3: number;
    mean_residence_s: number;
    path_residence: { from: string; to: string; residence_s: number }[];
    max_reynolds: { value: number; segment: string | null };
    max_capillary: { value: number; segment: string | null };
    max_wall_shear_Pa: { value: number; segment: string | null };
  };
  flags: {
    code: string;
    severity: string;
    family: string;
    target: { kind: string; id: string | null };
    title: string;
    message: string;
    value: number | null;
    threshold: number | null;
    source: string;
    at?: { x_m: number; y_m: number };
  }[];
  solver: null | { unknowns: number; non_zeros: number; residual_rel: number; method: string };
  cautions: readonly string[];
}

const at = (p?: { xM: number; yM: number }) => (p ? { x_m: p.xM, y_m: p.yM } : undefined);

/** Map the network, the hydraulics (or null for geometry only) and the flags to the output document. */
export function toAnalyzeJson(network: ChannelNetwork, hydraulics: HydraulicsResult | null, flags: Flag[]): AnalyzeJson {
  const segH = new Map(hydraulics?.segments.map((s) => [s.id, s]) ?? []);
  const nodeH = new Map(hydraulics?.nodes.map((n) => [n.id, n]) ?? []);
  const portH = new Map(hydraulics?.ports.map((p) => [p.name, p]) ?? []);
  return {
    ok: true,
    format: ANALYZE_FORMAT_VERSION,
    units: { drawing: network.units.drawing, source: network.units.source },
    mapping_proposed: network.mappingProposed,
    nodes: network.nodes.map((n) => {
      const h = nodeH.get(n.id);
      return { id: n.id, x_m: n.xM, y_m: n.yM, kind: n.kind, port: n.port, ...(h ? { pressure_Pa: h.pressurePa } : {}) };
    }),
    segments: network.segments.map((s) => {
      const h = segH.get(s.id);
      const base: AnalyzeSegmentJson = {
        id: s.id,
        layer: s.layer,
        from: s.from,
        to: s.to,
        length_m: s.lengthM,
        width_m: s.widthM,
        end_width_m: s.endWidthM,
        min_width_m: s.minWidthM ?? Math.min(s.widthM, s.endWidthM),
        max_width_m: s.maxWidthM ?? Math.max(s.widthM, s.endWidthM),
        depth_m: s.depthM,
        section: s.section,
        min_bend_radius_m: s.minBendRadiusM,
        path_m: s.path,
      };
      if (!h) return base;
      return {
        ...base,
        resistance_Pa_s_per_m3: h.resistancePaSPerM3,
        flow_m3_per_s: h.flowM3PerS,
        mean_velocity_m_per_s: h.meanVelocityMPerS,
        pressure_drop_Pa: h.pressureDropPa,
        hydraulic_diameter_m: h.hydraulicDiameterM,
        reynolds: h.reynolds,
        capillary: h.capillary,
        weber: h.weber,
        peclet: h.peclet,
        dean: h.dean,
        wall_shear_Pa: h.wallShearPa,
        residence_s: h.residenceS,
        diffusion_time_s: h.diffusionTimeS,
        mixing_length_m: h.mixingLengthM,
        entrance_length_m: h.entranceLengthM,
      };
    }),
    ports: network.ports.map((p) => {
      const h = portH.get(p.name);
      return {
        name: p.name,
        node: p.node,
        x_m: p.xM,
        y_m: p.yM,
        radius_m: p.radiusM,
        ...(h ? { drive: h.drive, pressure_Pa: h.pressurePa, flow_m3_per_s: h.flowM3PerS, bond: h.bond } : {}),
      };
    }),
    warnings: network.warnings.map((w) => ({ code: w.code, message: w.message, ...(w.at ? { at: at(w.at) } : {}) })),
    layers: network.layers.map((l) => ({
      name: l.name,
      role: l.role,
      entities: l.entities,
      by_type: l.byType,
      ...(l.style ? { style: l.style } : {}),
      ...(l.proposedRole ? { proposed_role: l.proposedRole } : {}),
    })),
    outline_m: network.outline,
    ...(network.masks ? { mask_m: network.masks.map((m) => ({ layer: m.layer, rings: m.ringsM })) } : {}),
    bounds_m: { min_x: network.bounds.minXM, min_y: network.bounds.minYM, max_x: network.bounds.maxXM, max_y: network.bounds.maxYM },
    fluid: hydraulics
      ? {
          name: hydraulics.fluid.name,
          temperature_K: hydraulics.fluid.temperatureK,
          viscosity_Pa_s: hydraulics.fluid.viscosityPaS,
          density_kg_per_m3: hydraulics.fluid.densityKgPerM3,
          surface_tension_N_per_m: hydraulics.fluid.surfaceTensionNPerM,
          interfacial_tension_N_per_m: hydraulics.interfacialTensionNPerM,
          solute_diffusivity_m2_per_s: hydraulics.soluteDiffusivityM2PerS,
          sources: hydraulics.fluid.sources,
        }
      : null,
    totals: hydraulics
      ? {
          total_flow_m3_per_s: hydraulics.totals.totalFlowM3PerS,
          max_inlet_pressure_Pa: hydraulics.totals.maxInletPressurePa,
          total_volume_m3: hydraulics.totals.totalVolumeM3,
          mean_residence_s: hydraulics.totals.meanResidenceS,
          path_residence: hydraulics.totals.pathResidence.map((p) => ({ from: p.from, to: p.to, residence_s: p.residenceS })),
          max_reynolds: hydraulics.totals.maxReynolds,
          max_capillary: hydraulics.totals.maxCapillary,
          max_wall_shear_Pa: { value: hydraulics.totals.maxWallShear.valuePa, segment: hydraulics.totals.maxWallShear.segment },
        }
      : null,
    flags: flags.map((f) => ({
      code: f.code,
      severity: f.severity,
      family: f.family,
      target: f.target,
      title: f.title,
      message: f.message,
      value: f.value,
      threshold: f.threshold,
      source: f.source,
      ...(f.at ? { at: at(f.at) } : {}),
    })),
    solver: hydraulics
      ? {
          unknowns: hydraulics.diagnostics.unknowns,
          non_zeros: hydraulics.diagnostics.nonZeros,
          residual_rel: hydraulics.diagnostics.residualRel,
          method: hydraulics.diagnostics.method,
        }
      : null,
    cautions: MODEL_CAUTIONS,
  };
}
