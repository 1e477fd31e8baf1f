/**
 * Small per-layer previews for the layer-mapping step: each layer's paths as
 * simplified polylines and its circles, in metres, so the page can draw an SVG
 * thumbnail of what a role would apply to. Pure (no server imports).
 */
import { readDxf } from "@/lib/dxf/read";
import type { Piece } from "@/lib/dxf/types";
import { DEFAULT_CHORD_TOLERANCE_M } from "@/lib/network/extract";

export interface LayerPreview {
  name: string;
  /** Polylines as flat [x0, y0, x1, y1, …] arrays, metres. */
  paths: number[][];
  /** Circles as [cx, cy, r], metres. */
  circles: [number, number, number][];
  /** Bounding box of everything on the layer, metres; null when the layer has nothing drawable. */
  bounds: { minX: number; minY: number; maxX: number; maxY: number } | null;
  /** True when points were dropped to keep the preview small. */
  simplified: boolean;
}

export interface LayoutPreview {
  layers: LayerPreview[];
  /** Bounds of the whole drawing, metres (null when empty). */
  bounds: LayerPreview["bounds"];
  /** False when the drawing's units are unknown and micrometres were assumed for the picture only. */
  unitsKnown: boolean;
}

/** Most points kept per layer; a thumbnail a few hundred pixels wide needs no more. */
export const MAX_PREVIEW_POINTS_PER_LAYER = 4000;
const ARC_STEPS_PER_TURN = 48;

function piecePoints(p: Piece, out: number[], scale: number): void {
  if (p.kind === "line") {
    if (out.length === 0) out.push(p.x0 * scale, p.y0 * scale);
    out.push(p.x1 * scale, p.y1 * scale);
    return;
  }
  const steps = Math.max(2, Math.ceil((Math.abs(p.sweep) / (2 * Math.PI)) * ARC_STEPS_PER_TURN));
  for (let i = out.length === 0 ? 0 : 1; i <= steps; i++) {
    const a = p.a0 + (p.sweep * i) / steps;
    out.push((p.cx + p.r * Math.cos(a)) * scale, (p.cy + p.r * Math.sin(a)) * scale);
  }
}

/** Keeps every k-th vertex (and the last) so the layer stays under the budget; own code because a thumbnail needs no topology-preserving simplifier. */
function decimate(path: number[], keepEvery: number): number[] {
  if (keepEvery <= 1 || path.length <= 4) return path;
  const out: number[] = [];
  const n = path.length / 2;
  for (let i = 0; i < n; i += keepEvery) out.push(path[2 * i], path[2 * i + 1]);
  if ((n - 1) % keepEvery !== 0) out.push(path[2 * n - 2], path[2 * n - 1]);
  return out;
}

type Box = NonNullable<LayerPreview["bounds"]>;
function grow(box: Box | null, x0: number, y0: number, x1: number, y1: number): Box {
  if (!box) return { minX: x0, minY: y0, maxX: x1, maxY: y1 };
  return { minX: Math.min(box.minX, x0), minY: Math.min(box.minY, y0), maxX: Math.max(box.maxX, x1), maxY: Math.max(box.maxY, y1) };
}

/**
 * Reads a DXF layout and returns every model-space layer's geometry as small
 * polylines and circles in metres (text is left out). Layers that hold only
 * entity types the reader does not draw come back with empty paths.
 * @param input DXF text or bytes. @param units drawing unit to use when the file does not say.
 * @throws LayoutError when the file cannot be read (same refusals as the upload check).
 */
export function previewLayers(input: string | Uint8Array, units?: Parameters<typeof readDxf>[1]["units"]): LayoutPreview {
  const drawing = readDxf(input, { chordToleranceM: DEFAULT_CHORD_TOLERANCE_M * 100, units });
  const scale = drawing.units?.metresPerUnit ?? 1e-6;
  const byLayer = new Map<string, { paths: number[][]; circles: [number, number, number][]; bounds: Box | null }>();
  for (const name of drawing.layerCounts.keys()) byLayer.set(name, { paths: [], circles: [], bounds: null });
  const layerOf = (name: string) => {
    let l = byLayer.get(name);
    if (!l) byLayer.set(name, (l = { paths: [], circles: [], bounds: null }));
    return l;
  };
  for (const e of drawing.entities) {
    if (e.kind === "text") continue;
    const layer = layerOf(e.layer);
    if (e.kind === "circle") {
      const c: [number, number, number] = [e.cx * scale, e.cy * scale, e.r * scale];
      layer.circles.push(c);
      layer.bounds = grow(layer.bounds, c[0] - c[2], c[1] - c[2], c[0] + c[2], c[1] + c[2]);
      continue;
    }
    const pts: number[] = [];
    for (const p of e.pieces) piecePoints(p, pts, scale);
    if (e.closed && pts.length >= 4) pts.push(pts[0], pts[1]);
    if (pts.length < 4) continue;
    layer.paths.push(pts);
    for (let i = 0; i < pts.length; i += 2) layer.bounds = grow(layer.bounds, pts[i], pts[i + 1], pts[i], pts[i + 1]);
  }
  let all: Box | null = null;
  const layers: LayerPreview[] = [...byLayer.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([name, l]) => {
      const points = l.paths.reduce((s, p) => s + p.length / 2, 0);
      const keepEvery = Math.ceil(points / MAX_PREVIEW_POINTS_PER_LAYER);
      const simplified = keepEvery > 1 || l.circles.length > MAX_PREVIEW_POINTS_PER_LAYER;
      if (l.bounds) all = grow(all, l.bounds.minX, l.bounds.minY, l.bounds.maxX, l.bounds.maxY);
      let paths = keepEvery > 1 ? l.paths.map((p) => decimate(p, keepEvery)) : l.paths;
      // Many short entities (separate LINEs) cannot be thinned vertex-wise: keep every k-th entity instead.
      const kept = paths.reduce((s, p) => s + p.length / 2, 0);
      if (kept > MAX_PREVIEW_POINTS_PER_LAYER) {
        const every = Math.ceil(kept / MAX_PREVIEW_POINTS_PER_LAYER);
        paths = paths.filter((_, i) => i % every === 0);
      }
      return {
        name,
        paths,
        circles: l.circles.slice(0, MAX_PREVIEW_POINTS_PER_LAYER),
        bounds: l.bounds,
        simplified,
      };
    });
  return { layers, bounds: all, unitsKnown: drawing.units !== null };
}
