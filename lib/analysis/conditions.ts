/**
 * The conditions document: everything besides the DXF that an analysis needs.
 * Declared once here and used by the CLI, the API, the forms and the store.
 * Quantities stay as typed ("50 um" or an SI number) and are resolved to SI by
 * lib/units at the point of use, so a stored document reads as the user wrote it.
 */
import { z } from "zod";

export const quantitySchema = z.union([
  z.number().finite(),
  z.string().trim().min(1, "give a value with a unit").max(64, "too long for a quantity"),
]);

export const drawingUnitSchema = z.enum(["nm", "um", "mm", "cm", "m", "in", "mil"]);

export const sectionSchema = z.enum(["rectangular", "circular", "isotropic_etch", "trapezoid_koh", "semicircular"]);

export const layerRoleSchema = z.enum(["channel", "port", "control", "outline", "ignore"]);

export const layerMappingSchema = z
  .object({
    role: layerRoleSchema,
    depth: quantitySchema.optional(),
    width: quantitySchema.optional(),
    section: sectionSchema.optional(),
  })
  .strict();

/** The geometry part: how to read the drawing. */
export const geometryConditionsSchema = z.object({
  units: drawingUnitSchema.optional(),
  snap: quantitySchema.optional(),
  /** Chord tolerance for flattening splines and ellipses. */
  chord_tolerance: quantitySchema.optional(),
  layers: z.record(z.string().min(1).max(255), layerMappingSchema).optional(),
});

export const fluidSchema = z
  .object({
    preset: z.string().min(1).max(64).optional(),
    temperature: quantitySchema.optional(),
    viscosity: quantitySchema.optional(),
    density: quantitySchema.optional(),
    surface_tension: quantitySchema.optional(),
    diffusivity: quantitySchema.optional(),
    name: z.string().max(120).optional(),
  })
  .strict();

export const secondPhaseSchema = fluidSchema.extend({ interfacial_tension: quantitySchema.optional() });

export const soluteSchema = z
  .object({ preset: z.string().min(1).max(64).optional(), diffusivity: quantitySchema.optional(), name: z.string().max(120).optional() })
  .strict();

/** Which phase a port feeds on a two-phase chip: `fluid` is the continuous phase, `second_phase` the dispersed one. Optional; ports default to continuous. */
export const portPhaseSchema = z.enum(["continuous", "dispersed"]);

export const portDriveSchema = z.union([
  z.object({ flow: quantitySchema, phase: portPhaseSchema.optional() }).strict(),
  z.object({ pressure: quantitySchema, phase: portPhaseSchema.optional() }).strict(),
  z.object({ head: quantitySchema, phase: portPhaseSchema.optional() }).strict(),
]);

/** Photomask (or tool) class for the process's minimum feature size; optional, each process has a default. */
export const maskSchema = z.enum(["transparency", "film", "chrome"]);

export const conditionsSchema = geometryConditionsSchema.extend({
  fluid: fluidSchema.optional(),
  second_phase: secondPhaseSchema.optional(),
  solute: soluteSchema.optional(),
  ports: z.record(z.string().min(1).max(64), portDriveSchema).optional(),
  process: z.string().min(1).max(64).optional(),
  mask: maskSchema.optional(),
  pump: z.object({ max_pressure: quantitySchema.optional() }).strict().optional(),
  /** Living cells flow through the chip: enables the cell-safe wall-shear check. */
  cells: z.boolean().optional(),
  /** Per-workspace overrides of flag thresholds, by rule code. */
  thresholds: z.record(z.string().max(64), z.number().finite()).optional(),
});

export type QuantityValue = z.infer<typeof quantitySchema>;
export type LayerMapping = z.infer<typeof layerMappingSchema>;
export type GeometryConditions = z.infer<typeof geometryConditionsSchema>;
export type Conditions = z.infer<typeof conditionsSchema>;
export type PortDrive = z.infer<typeof portDriveSchema>;
