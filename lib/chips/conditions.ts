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

/** Build the conditions document for one operating point. */
export function toConditions(layerMap: LayerMapInput, form: OperatingPointForm, workspaceFluids: WorkspaceFluidChoice[] = []): Conditions {
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
  return conditions;
}
