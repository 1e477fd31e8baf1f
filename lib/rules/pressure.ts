/**
 * Pressure rules at the ports: the pump's maximum, and the process bond's
 * working limit (burst risk). In a passive network the highest pressure is at
 * a port (maximum principle), so checking ports covers every node.
 */
import type { ChannelNetwork } from "../network/types";
import type { Conditions } from "../analysis/conditions";
import type { Flag, HydraulicsResult } from "../hydraulics/types";
import { parseQuantity } from "../units/quantity";
import { makeFlag, thresholdFor } from "./registry";
import type { ProcessProfile } from "./processes";
import { kPa } from "./format";

/** Pump and bond-limit flags; `process` may be null (no bond check). */
export function evaluatePressureFlags(network: ChannelNetwork, h: HydraulicsResult, conditions: Conditions, process: ProcessProfile | null): Flag[] {
  const flags: Flag[] = [];
  const portAt = new Map(network.ports.map((p) => [p.name, { xM: p.xM, yM: p.yM }]));
  const pumpMax = conditions.pump?.max_pressure !== undefined ? parseQuantity(conditions.pump.max_pressure, "pressure", "pump.max_pressure") : null;
  if (pumpMax !== null) {
    const limit = thresholdFor("pump_pressure_max", conditions, pumpMax);
    for (const p of h.ports) {
      if (p.drive === "open") continue;
      if (p.pressurePa > limit) {
        const what = p.drive === "flow" ? `To push the set flow, the pump at port ${p.name} must supply ${kPa(p.pressurePa)}` : `Port ${p.name} is set to ${kPa(p.pressurePa)}`;
        flags.push(makeFlag("pump_pressure_max", { target: { kind: "port", id: p.name }, at: portAt.get(p.name), value: p.pressurePa, threshold: limit, message: `${what}, above the pump's maximum of ${kPa(limit)}. The pump will stall or fall short of the set flow. Lower the flow, shorten or widen the channels, or use a stronger pump.` }));
      }
    }
  }
  if (process) {
    const limit = thresholdFor("pressure_bond", conditions, process.maxWorkingPressurePa);
    for (const p of h.ports) {
      if (p.pressurePa > limit) {
        flags.push(makeFlag("pressure_bond", {
          target: { kind: "port", id: p.name },
          at: portAt.get(p.name),
          value: p.pressurePa,
          threshold: limit,
          source: process.sources.maxWorkingPressure,
          message: `Port ${p.name} runs at ${kPa(p.pressurePa)}, above the ${kPa(limit)} that a ${process.label} bond usually holds. The chip may delaminate, leak or burst and spray its contents. Lower the pressure (wider or shorter channels, lower flow) or use a stronger bond, and stay below the limit your fab has measured.`,
        }));
      }
    }
  }
  return flags;
}
