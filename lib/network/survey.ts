/**
 * A layer survey of a layout: what is on each layer, the role each layer's
 * contents suggest, and the drawing's units. Used at upload (before any
 * mapping exists) and by `stokeline layers`. Throws only for files that cannot
 * be read at all; unknown units are reported, not refused.
 */
import type { GeometryConditions } from "../analysis/conditions";
import { readDxf, MAX_LAYOUT_BYTES } from "../dxf/read";
import { DEFAULT_CHORD_TOLERANCE_M } from "./extract";
import { summarizeLayers } from "./layers";
import type { DrawingUnits, LayerSummary, LayoutWarning } from "./types";

export interface LayoutSurvey {
  /** Every model-space layer with entity counts; role "unmapped" unless the conditions name it; proposedRole on every layer. */
  layers: LayerSummary[];
  /** Units from the conditions or $INSUNITS; null when neither says. */
  units: DrawingUnits | null;
  /** $INSUNITS as written in the header (null when absent). */
  insUnits: number | null;
  /** What to add when units is null. */
  unitsProblem: string | null;
  warnings: LayoutWarning[];
}

/**
 * Survey a DXF layout's layers.
 * @param input DXF text or bytes. @param conditions optional units and layer names. @param maxBytes size limit.
 * @throws LayoutError when the file is empty, truncated, binary, a DWG, too large, not a DXF or has non-finite coordinates.
 */
export function surveyLayout(input: string | Uint8Array, conditions: GeometryConditions = {}, maxBytes = MAX_LAYOUT_BYTES): LayoutSurvey {
  // A coarse chord tolerance: the survey only counts entities.
  const drawing = readDxf(input, { maxBytes, chordToleranceM: DEFAULT_CHORD_TOLERANCE_M * 100, units: conditions.units });
  const named = new Map(Object.entries(conditions.layers ?? {}).map(([k, v]) => [k.toUpperCase(), v.role]));
  const layers: LayerSummary[] = summarizeLayers(drawing).map((l) => ({ ...l, role: named.get(l.name.toUpperCase()) ?? "unmapped" }));
  return {
    layers,
    units: drawing.units,
    insUnits: drawing.insUnits,
    unitsProblem: drawing.unitsProblem,
    warnings: drawing.notes.map((n) => ({ code: n.code, message: n.message })),
  };
}
