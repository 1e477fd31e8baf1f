/**
 * Input shapes for chips, revisions, operating points and workspace settings,
 * declared once and used by the forms (react-hook-form's zod resolver), the
 * server actions and the REST API. Pure: no server imports, so client
 * components can use them.
 */
import { z } from "zod";
import { drawingUnitSchema, layerMappingSchema, quantitySchema } from "@/lib/analysis/conditions";
import { parseQuantity, type Dimension } from "@/lib/units/quantity";
import { DomainError } from "@/lib/errors";

/** A quantity field that must parse to the given dimension; the message says what to type. */
function quantityOf(dimension: Dimension, label: string) {
  return z
    .string()
    .trim()
    .min(1, `Enter the ${label}, with a unit.`)
    .max(64, `The ${label} is too long.`)
    .superRefine((value, ctx) => {
      try {
        parseQuantity(value, dimension, label);
      } catch (err) {
        ctx.addIssue({ code: "custom", message: err instanceof DomainError ? err.message : `Not a valid ${label}.` });
      }
    });
}

export const chipCreateSchema = z.object({
  name: z.string().trim().min(1, "Give the chip a name.").max(80, "Keep the name under 80 characters."),
  purpose: z.string().trim().max(500, "Keep the purpose under 500 characters.").default(""),
});
export type ChipCreateInput = z.infer<typeof chipCreateSchema>;

export const revisionNoteSchema = z.string().trim().max(2000, "Keep the note under 2,000 characters.").default("");

export const layerMapSchema = z.object({
  units: drawingUnitSchema.optional(),
  snap: quantitySchema.optional(),
  layers: z.record(z.string().min(1).max(255), layerMappingSchema).refine(
    (layers) => Object.values(layers).some((l) => l.role === "channel"),
    "Map at least one layer as a channel layer.",
  ),
});
export type LayerMapInput = z.infer<typeof layerMapSchema>;

export const portDriveKindSchema = z.enum(["pressure", "flow", "head", "open"]);

/** The operating point form: what a designer fills in. Converted to the engine's conditions by toConditions. */
export const operatingPointFormSchema = z
  .object({
    name: z.string().trim().min(1, "Name this operating point, e.g. “nominal”.").max(80, "Keep the name under 80 characters."),
    fluid: z.string().trim().min(1, "Choose a fluid.").max(80),
    temperature: quantityOf("temperature", "temperature"),
    secondPhase: z.string().trim().max(80).optional().or(z.literal("")),
    interfacialTension: z.string().trim().max(64).optional().or(z.literal("")),
    solute: z.string().trim().max(80).optional().or(z.literal("")),
    process: z.string().trim().min(1, "Choose the process the chip will be made with.").max(64),
    pumpMaxPressure: z.string().trim().max(64).optional().or(z.literal("")),
    cells: z.boolean().default(false),
    ports: z
      .array(
        z.object({
          name: z.string().trim().min(1).max(64),
          drive: portDriveKindSchema,
          value: z.string().trim().max(64).default(""),
          phase: z.enum(["continuous", "dispersed"]).optional(),
        }),
      )
      .min(1, "The layout has no ports to drive."),
  })
  .superRefine((form, ctx) => {
    const optionalQuantity = (value: string | undefined, dimension: Dimension, label: string, path: (string | number)[]) => {
      if (!value) return;
      try {
        parseQuantity(value, dimension, label);
      } catch (err) {
        ctx.addIssue({ code: "custom", path, message: err instanceof DomainError ? err.message : `Not a valid ${label}.` });
      }
    };
    optionalQuantity(form.pumpMaxPressure, "pressure", "pump limit", ["pumpMaxPressure"]);
    optionalQuantity(form.interfacialTension, "surface_tension", "interfacial tension", ["interfacialTension"]);
    let pressureDriven = 0;
    form.ports.forEach((port, i) => {
      if (port.drive === "open") return;
      const dimension: Dimension = port.drive === "flow" ? "flow" : port.drive === "head" ? "length" : "pressure";
      const label = port.drive === "flow" ? `flow at ${port.name}` : port.drive === "head" ? `liquid head at ${port.name}` : `pressure at ${port.name}`;
      if (!port.value) {
        ctx.addIssue({ code: "custom", path: ["ports", i, "value"], message: `Enter the ${label}, with a unit.` });
        return;
      }
      optionalQuantity(port.value, dimension, label, ["ports", i, "value"]);
      if (port.drive !== "flow") pressureDriven += 1;
    });
    if (pressureDriven === 0) {
      ctx.addIssue({
        code: "custom",
        path: ["ports"],
        message: "Drive at least one port by pressure (an outlet at 0 mbar is usual): with flows alone the pressures have no reference.",
      });
    }
  });
export type OperatingPointForm = z.infer<typeof operatingPointFormSchema>;

export const workspaceFluidSchema = z.object({
  key: z
    .string()
    .trim()
    .min(2, "Give the fluid a short key (letters, digits, underscores).")
    .max(40)
    .regex(/^[a-z][a-z0-9_]*$/, "Use lower-case letters, digits and underscores, starting with a letter."),
  name: z.string().trim().min(1, "Name the fluid.").max(80),
  viscosity: quantityOf("viscosity", "viscosity"),
  viscositySource: z.string().trim().min(1, "Say where the viscosity comes from (datasheet, measurement, handbook).").max(200),
  density: quantityOf("density", "density"),
  densitySource: z.string().trim().min(1, "Say where the density comes from.").max(200),
  surfaceTension: quantityOf("surface_tension", "surface tension"),
  surfaceTensionSource: z.string().trim().min(1, "Say where the surface tension comes from.").max(200),
});
export type WorkspaceFluidInput = z.infer<typeof workspaceFluidSchema>;

export const thresholdOverrideSchema = z.object({
  ruleCode: z.string().trim().min(1).max(64),
  value: z.coerce.number({ message: "Enter a number." }).finite("Enter a finite number.").positive("Thresholds are positive numbers."),
  note: z.string().trim().max(500).default(""),
});

export const processOverrideSchema = z.object({
  processKey: z.string().trim().min(1).max(64),
  values: z.record(z.string().max(64), z.coerce.number().finite().positive()),
  note: z.string().trim().max(500).default(""),
});

export const apiTokenCreateSchema = z.object({
  name: z.string().trim().min(1, "Name the token after the script or machine that will use it.").max(80),
});
