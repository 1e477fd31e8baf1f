/**
 * The one analysis pipeline: layout bytes + conditions → result document.
 * Used by the web app, the REST API, the command line and the seed, so every
 * surface shows the same numbers.
 */
import { z } from "zod";
import { ConditionsError } from "../errors";
import { extractNetwork } from "../network/extract";
import { solveHydraulics } from "../hydraulics/solve-hydraulics";
import { evaluateFlags } from "../rules";
import { conditionsSchema, type Conditions } from "./conditions";
import { toAnalyzeJson, type AnalyzeJson } from "./serialize";

/**
 * Validate a conditions document (already parsed from JSON).
 * @throws ConditionsError listing every field that is wrong, in plain words.
 */
export function parseConditions(raw: unknown): Conditions {
  const parsed = conditionsSchema.safeParse(raw ?? {});
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => `${i.path.join(".") || "conditions"}: ${i.message}`);
    throw new ConditionsError("invalid_conditions", `The conditions are not valid — ${issues.join("; ")}.`, { issues: z.treeifyError(parsed.error) });
  }
  return parsed.data;
}

/**
 * Analyse one layout. Geometry always; hydraulics and regime flags when the
 * conditions drive at least one port. Fabrication flags whenever a process is named.
 * @throws LayoutError, ConditionsError or SolveError (all DomainError) on bad input.
 */
export function analyzeLayout(input: string | Uint8Array, rawConditions: unknown): AnalyzeJson {
  const conditions = parseConditions(rawConditions);
  const network = extractNetwork(input, conditions);
  const hydraulics = conditions.ports && Object.keys(conditions.ports).length > 0 ? solveHydraulics(network, conditions) : null;
  const flags = evaluateFlags(network, hydraulics, conditions);
  return toAnalyzeJson(network, hydraulics, flags);
}
