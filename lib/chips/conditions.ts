/**
 * From what a designer fills in (layer map + operating point form) to the
 * engine's conditions document. Pure, so the form can preview it and the
 * server stores exactly what it analysed.
 */
import type { Conditions } from "@/lib/analysis/conditions";
import type { LayerMapInput, OperatingPointForm } from "./schemas";

/** A workspace fluid as the form offers it: explicit properties with units. */
export interface WorkspaceFluidChoice {
  key: string;
  name: string;
  viscosity: string;
  density: string;
  surfaceTension: string;
}

/** The form's fluid field: "preset:water" or "workspace:<key>". */
export function fluidChoiceValue(kind: "preset" | "workspace", key: string): string {
  return `${kind}:${key}`;
}

function fluidFromChoice(choice: string, temperature: string, workspaceFluids: WorkspaceFluidChoice[]): NonNullable<Conditions["fluid"]> {
  const [kind, ...rest] = choice.split(":");
  const key = rest.join(":");
  if (kind === "workspace") {
    const fluid = workspaceFluids.find((f) => f.key === key);
    // An unknown workspace fluid falls through to a preset of that name, which the engine refuses in plain words.
    if (fluid) return { name: fluid.name, temperature, viscosity: fluid.viscosity, density: fluid.density, surface_tension: fluid.surfaceTension };
  }
  return { preset: kind === "preset" || kind === "workspace" ? key : choice, temperature };
}

/**
 * Process-profile limits a fab liaison may override per workspace, by the key
 * stored in process_overrides.values, with the rule code whose threshold the
 * limit is (lib/rules reads process limits through conditions.thresholds).
 * Values are SI (Pa, m) or plain ratios.
 */
export const PROCESS_LIMIT_FIELDS = [
  { key: "maxWorkingPressurePa", ruleCode: "pressure_bond", label: "Working-pressure limit (bond)", unit: "kPa", toSi: 1e3 },
  { key: "minFeatureM", ruleCode: "fab_min_width", label: "Smallest channel width", unit: "µm", toSi: 1e-6 },
  { key: "minSpacingM", ruleCode: "fab_min_spacing", label: "Smallest gap between channels", unit: "µm", toSi: 1e-6 },
  { key: "minAspect", ruleCode: "fab_roof_collapse", label: "Smallest depth/width (roof collapse)", unit: "", toSi: 1 },
  { key: "maxAspect", ruleCode: "fab_aspect_max", label: "Largest depth/width", unit: "", toSi: 1 },
  { key: "maxWallAspect", ruleCode: "fab_tall_wall", label: "Largest wall height/width", unit: "", toSi: 1 },
  { key: "edgeMarginM", ruleCode: "fab_edge_margin", label: "Margin to the die edge", unit: "mm", toSi: 1e-3 },
] as const;
export type ProcessLimitKey = (typeof PROCESS_LIMIT_FIELDS)[number]["key"];

/** Workspace settings that change how an analysis judges the result. */
export interface WorkspaceOverrides {
  /** Flag-threshold overrides by rule code (fluidics reviewers). */
  thresholds?: Record<string, number>;
  /** Process-limit overrides by process id, then by PROCESS_LIMIT_FIELDS key (fab liaisons). */
  processes?: Record<string, Record<string, number>>;
}

/**
 * The conditions.thresholds an operating point runs with: the reviewers'
 * threshold overrides, then the chosen process's limit overrides (which are
 * specific to that process, so they win for their rule codes). Undefined when
 * nothing is overridden.
 */
export function thresholdsFor(process: string | undefined, overrides: WorkspaceOverrides): Record<string, number> | undefined {
  const out: Record<string, number> = { ...(overrides.thresholds ?? {}) };
  const limits = process ? overrides.processes?.[process] : undefined;
  if (limits) {
    for (const field of PROCESS_LIMIT_FIELDS) {
      const v = limits[field.key];
      if (typeof v === "number" && Number.isFinite(v) && v > 0) out[field.ruleCode] = v;
    }
  }
  return Object.keys(out).length > 0 ? out : undefined;
}

/** Build the conditions document for one operating point, with the workspace's overrides when given. */
export function toConditions(
  layerMap: LayerMapInput,
  form: OperatingPointForm,
  workspaceFluids: WorkspaceFluidChoice[] = [],
  overrides: WorkspaceOverrides = {},
): Conditions {
  const ports: NonNullable<Conditions["ports"]> = {};
  for (const port of form.ports) {
    if (port.drive === "open") continue;
    const drive = port.drive === "flow" ? { flow: port.value } : port.drive === "head" ? { head: port.value } : { pressure: port.value };
    ports[port.name] = port.phase ? ({ ...drive, phase: port.phase } as (typeof ports)[string]) : drive;
  }
  const conditions: Conditions = {
    ...(layerMap.units ? { units: layerMap.units } : {}),
    ...(layerMap.snap !== undefined ? { snap: layerMap.snap } : {}),
    layers: layerMap.layers,
    fluid: fluidFromChoice(form.fluid, form.temperature, workspaceFluids),
    ports,
    process: form.process,
    cells: form.cells,
  };
  if (form.secondPhase) {
    conditions.second_phase = {
      ...fluidFromChoice(form.secondPhase, form.temperature, workspaceFluids),
      ...(form.interfacialTension ? { interfacial_tension: form.interfacialTension } : {}),
    };
  }
  if (form.solute) conditions.solute = { preset: form.solute };
  if (form.pumpMaxPressure) conditions.pump = { max_pressure: form.pumpMaxPressure };
  const thresholds = thresholdsFor(form.process, overrides);
  if (thresholds) conditions.thresholds = thresholds;
  return conditions;
}
