/**
 * Regime rules per segment: Reynolds bands, Dean flow in bends, entrance
 * length share, and cell-safe wall shear.
 */
import type { ChannelNetwork } from "../network/types";
import type { Conditions } from "../analysis/conditions";
import type { Flag, HydraulicsResult } from "../hydraulics/types";
import { makeFlag, ruleDefinition, thresholdFor } from "./registry";
import { num, pa } from "./format";

function midpoint(path: [number, number][]): { xM: number; yM: number } | undefined {
  if (path.length === 0) return undefined;
  const p = path[Math.floor(path.length / 2)];
  if (path.length % 2 === 0 && path.length >= 2) {
    const q = path[path.length / 2 - 1];
    return { xM: (p[0] + q[0]) / 2, yM: (p[1] + q[1]) / 2 };
  }
  return { xM: p[0], yM: p[1] };
}

/** Reynolds, Dean, entrance-length and wall-shear flags for every segment. */
export function evaluateRegimeFlags(network: ChannelNetwork, h: HydraulicsResult, conditions: Conditions): Flag[] {
  const flags: Flag[] = [];
  const tRe1 = thresholdFor("re_inertial", conditions, ruleDefinition("re_inertial").defaultThreshold!);
  const tRe100 = thresholdFor("re_strongly_inertial", conditions, ruleDefinition("re_strongly_inertial").defaultThreshold!);
  const tRe2000 = thresholdFor("re_turbulent", conditions, ruleDefinition("re_turbulent").defaultThreshold!);
  const tDe = thresholdFor("dean_secondary_flow", conditions, ruleDefinition("dean_secondary_flow").defaultThreshold!);
  const tEnt = thresholdFor("entrance_length_share", conditions, ruleDefinition("entrance_length_share").defaultThreshold!);
  const tShear = thresholdFor("wall_shear_cells", conditions, ruleDefinition("wall_shear_cells").defaultThreshold!);
  network.segments.forEach((seg, k) => {
    const s = h.segments[k];
    if (!s) return;
    const target = { kind: "segment" as const, id: seg.id };
    const at = midpoint(seg.path);
    // Only the highest Reynolds band per segment.
    if (s.reynolds > tRe2000) {
      flags.push(makeFlag("re_turbulent", { target, at, value: s.reynolds, threshold: tRe2000, message: `Re = ${num(s.reynolds)} in segment ${seg.id}. Microchannels almost never reach the turbulent transition; this usually means a flow rate or a unit typed wrong (µL/min vs mL/min), or a channel much larger than intended. Check the port flows and the channel sizes.` }));
    } else if (s.reynolds > tRe100) {
      flags.push(makeFlag("re_strongly_inertial", { target, at, value: s.reynolds, threshold: tRe100, message: `Re = ${num(s.reynolds)} in segment ${seg.id}: inertia dominates viscosity. Expect recirculation behind corners and expansions, and pressure drops above the laminar estimate. Lower the flow or widen the channel if this was not intended.` }));
    } else if (s.reynolds > tRe1) {
      flags.push(makeFlag("re_inertial", { target, at, value: s.reynolds, threshold: tRe1, message: `Re = ${num(s.reynolds)} in segment ${seg.id}: inertia is no longer negligible, so particles migrate across the stream and bends drive secondary flow. Fine for inertial focusing; for a Stokes-flow design lower the flow or the channel size.` }));
    }
    if (s.dean !== null && s.dean > tDe) {
      flags.push(makeFlag("dean_secondary_flow", { target, at, value: s.dean, threshold: tDe, message: `De = ${num(s.dean)} in the bend of segment ${seg.id} (radius ${(seg.minBendRadiusM! * 1e6).toPrecision(3)} µm): the curve drives two counter-rotating vortices across the channel. They help mixing and focus particles; if streams must stay apart, use gentler bends or slower flow.` }));
    }
    const share = s.entranceLengthM / seg.lengthM;
    if (share > tEnt) {
      flags.push(makeFlag("entrance_length_share", { target, at, value: share, threshold: tEnt, message: `The flow needs ${(s.entranceLengthM * 1e6).toPrecision(3)} µm to develop, ${(share * 100).toPrecision(3)} % of segment ${seg.id}; its real pressure drop is higher than the fully developed figure. Usually harmless for short connectors; matters where this segment sets a flow split.` }));
    }
    if (conditions.cells && s.wallShearPa > tShear) {
      flags.push(makeFlag("wall_shear_cells", { target, at, value: s.wallShearPa, threshold: tShear, message: `Peak wall shear ${pa(s.wallShearPa)} in segment ${seg.id} is above ${pa(tShear)}. Cells on or near the wall may detach, change behaviour or be damaged. Lower the flow, or make the channel deeper or wider where cells pass.` }));
    }
  });
  return flags;
}
