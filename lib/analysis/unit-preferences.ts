/**
 * The schema of a member's stored display units. Kept apart from the quantity
 * catalogue so the analysis view's browser bundle does not carry zod.
 */
import { z } from "zod";
import { DISPLAY_UNITS, type UnitFamily, type UnitPreferences } from "./quantities";

const unitIds = (family: UnitFamily) => DISPLAY_UNITS[family].map((u) => u.id) as [string, ...string[]];

export const unitPreferencesSchema = z.object({
  length: z.enum(unitIds("length")).optional(),
  pressure: z.enum(unitIds("pressure")).optional(),
  flow: z.enum(unitIds("flow")).optional(),
  velocity: z.enum(unitIds("velocity")).optional(),
  stress: z.enum(unitIds("stress")).optional(),
  time: z.enum(unitIds("time")).optional(),
  resistance: z.enum(unitIds("resistance")).optional(),
}) satisfies z.ZodType<UnitPreferences>;
