/**
 * Layer mapping: which layer plays which role, with its width, depth and
 * cross-section in SI. From the conditions where they name layers; otherwise a
 * mapping proposed from what each layer holds (circles → port, paths → channel).
 */
import type { GeometryConditions } from "../analysis/conditions";
import type { DxfDrawing } from "../dxf/types";
import { parseQuantity } from "../units/quantity";
import type { LayerRole, LayerSummary, SectionShape } from "./types";

export interface ResolvedLayer {
  name: string;
  role: LayerRole;
  widthM: number | null;
  depthM: number | null;
  section: SectionShape;
}

export interface LayerPlan {
  byName: Map<string, ResolvedLayer>;
  summaries: LayerSummary[];
  mappingProposed: boolean;
  /** Layers named in the conditions that the drawing does not have. */
  missing: string[];
  unmapped: string[];
}

const PATH_TYPES = new Set(["LINE", "ARC", "LWPOLYLINE", "POLYLINE", "SPLINE", "ELLIPSE"]);
const TEXT_TYPES = new Set(["TEXT", "MTEXT"]);

/** Role a layer's contents suggest: outline by name or by one big closed shape, port for circles only, channel for paths. */
export function proposeRole(name: string, byType: Record<string, number>, closedPaths: number): LayerRole {
  const types = Object.keys(byType);
  const paths = types.filter((t) => PATH_TYPES.has(t)).reduce((n, t) => n + byType[t], 0);
  const circles = byType.CIRCLE ?? 0;
  if (/(^|[^a-z])(die|outline|border|frame|boundary|chip_?edge)([^a-z]|$)/i.test(name) && paths + circles > 0) return "outline";
  if (paths === 0 && circles > 0) return "port";
  if (paths > 0 && closedPaths === paths && paths <= 2 && circles === 0) return "outline";
  if (paths > 0) return "channel";
  if (types.length > 0 && types.every((t) => TEXT_TYPES.has(t))) return "ignore";
  return "ignore";
}

/** Every model-space layer of the drawing with its counts and the role its contents suggest, sorted by name. */
export function summarizeLayers(drawing: DxfDrawing): { name: string; entities: number; byType: Record<string, number>; proposedRole: LayerRole }[] {
  const closedByLayer = new Map<string, number>();
  for (const e of drawing.entities) if (e.kind === "path" && e.closed) closedByLayer.set(e.layer, (closedByLayer.get(e.layer) ?? 0) + 1);
  return [...drawing.layerCounts.keys()]
    .sort((a, b) => a.localeCompare(b))
    .map((name) => {
      const byType = drawing.layerCounts.get(name) ?? {};
      return { name, entities: Object.values(byType).reduce((a, b) => a + b, 0), byType, proposedRole: proposeRole(name, byType, closedByLayer.get(name) ?? 0) };
    });
}

/**
 * Resolve the layer roles for a drawing.
 * @throws ConditionsError when a layer's width or depth is not a length.
 */
export function planLayers(drawing: DxfDrawing, conditions: GeometryConditions): LayerPlan {
  const named = conditions.layers ?? {};
  const namedKeys = Object.keys(named);
  const mappingProposed = namedKeys.length === 0;
  const byUpper = new Map(namedKeys.map((k) => [k.toUpperCase(), k]));
  const byName = new Map<string, ResolvedLayer>();
  const summaries: LayerSummary[] = [];
  const unmapped: string[] = [];
  const seen = new Set<string>();
  for (const { name, byType, entities, proposedRole: proposed } of summarizeLayers(drawing)) {
    const key = byUpper.get(name.toUpperCase());
    if (key !== undefined) {
      seen.add(key);
      const m = named[key];
      const field = `layers.${key}`;
      byName.set(name, {
        name,
        role: m.role,
        widthM: m.width === undefined ? null : parseQuantity(m.width, "length", `${field}.width`),
        depthM: m.depth === undefined ? null : parseQuantity(m.depth, "length", `${field}.depth`),
        section: m.section ?? "rectangular",
      });
      summaries.push({ name, role: m.role, entities, byType });
    } else if (mappingProposed) {
      byName.set(name, { name, role: proposed, widthM: null, depthM: null, section: "rectangular" });
      summaries.push({ name, role: proposed, entities, byType, proposedRole: proposed });
    } else {
      unmapped.push(name);
      summaries.push({ name, role: "unmapped", entities, byType, proposedRole: proposed });
    }
  }
  const missing = namedKeys.filter((k) => !seen.has(k));
  return { byName, summaries, mappingProposed, missing, unmapped };
}

/** One line per layer for messages: `FLOW (12: LINE 10, ARC 2)`. */
export function describeLayers(summaries: LayerSummary[]): string {
  if (summaries.length === 0) return "the drawing has no model-space entities";
  return summaries
    .slice(0, 30)
    .map((l) => `${l.name} (${Object.entries(l.byType).map(([t, n]) => `${t} ${n}`).join(", ")}${l.proposedRole ? `; looks like ${l.proposedRole}` : ""})`)
    .join("; ") + (summaries.length > 30 ? `; and ${summaries.length - 30} more` : "");
}
