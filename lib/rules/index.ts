/**
 * Flags for a layout: regime rules (need the hydraulics) and fabrication rules
 * (need a process). One file per rule family; the registry lists every code.
 */
import type { ChannelNetwork } from "../network/types";
import type { Conditions } from "../analysis/conditions";
import type { Flag, HydraulicsResult } from "../hydraulics/types";
import { evaluateRegimeFlags } from "./regime";
import { evaluateStreamFlags } from "./streams";
import { evaluatePressureFlags } from "./pressure";
import { evaluateFabricationFlags } from "./fabrication";
import { requireProcess } from "./processes";
import { makeFlag } from "./registry";

export { RULES, ruleDefinition, type RuleDefinition } from "./registry";
export { PROCESS_PROFILES, listProcesses, requireProcess, type ProcessProfile, type MaskType } from "./processes";

/** Most flags kept per code; the rest are summarised in one chip-level flag so large chips stay readable. */
export const MAX_FLAGS_PER_CODE = 200;

const SEVERITY_ORDER = { block: 0, warn: 1, info: 2 } as const;

/**
 * Evaluate every rule. Regime and pressure rules run when `hydraulics` is given; fabrication and bond rules
 * when `conditions.process` is set. Thresholds come from `conditions.thresholds[code]` or the defaults.
 * Sorted by severity (block first), then code.
 * @throws ConditionsError for an unknown process or a bad pump pressure.
 */
export function evaluateFlags(network: ChannelNetwork, hydraulics: HydraulicsResult | null, conditions: Conditions): Flag[] {
  const process = conditions.process ? requireProcess(conditions.process) : null;
  const all: Flag[] = [];
  if (hydraulics) {
    all.push(...evaluateRegimeFlags(network, hydraulics, conditions));
    all.push(...evaluateStreamFlags(network, hydraulics, conditions));
    all.push(...evaluatePressureFlags(network, hydraulics, conditions, process));
  }
  if (process) all.push(...evaluateFabricationFlags(network, conditions, process));
  const byCode = new Map<string, Flag[]>();
  for (const f of all) {
    const list = byCode.get(f.code);
    if (list) list.push(f);
    else byCode.set(f.code, [f]);
  }
  const out: Flag[] = [];
  for (const [code, list] of byCode) {
    if (list.length <= MAX_FLAGS_PER_CODE) {
      out.push(...list);
      continue;
    }
    const worst = [...list].sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] || Math.abs(b.value ?? 0) - Math.abs(a.value ?? 0));
    out.push(...worst.slice(0, MAX_FLAGS_PER_CODE));
    out.push(
      makeFlag(code, {
        severity: worst[0].severity,
        target: { kind: "chip", id: null },
        value: list.length,
        threshold: worst[0].threshold,
        message: `${list.length - MAX_FLAGS_PER_CODE} more places raise this flag; the ${MAX_FLAGS_PER_CODE} listed are the most severe.`,
      }),
    );
  }
  return out.sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] || a.code.localeCompare(b.code));
}
