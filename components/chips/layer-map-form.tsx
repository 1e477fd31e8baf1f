"use client";
/**
 * The layer-mapping step: every layer with its entity counts by type and a
 * thumbnail, the reader's proposed role preselected, and depth, default width
 * and cross-section per channel layer (remembered from the chip's previous
 * revision). Checked with layerMapSchema and the quantity parser before
 * PUT …/layer-map; the server then reads the network with it and refuses, in
 * plain words, a mapping that gives no channel network.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Notice } from "@/components/ui/notice";
import { layerRoleSchema, sectionSchema, drawingUnitSchema } from "@/lib/analysis/conditions";
import type { LayoutPreview } from "@/lib/chips/preview";
import { layerMapSchema, type LayerMapInput } from "@/lib/chips/schemas";
import { DomainError } from "@/lib/errors";
import { parseQuantity } from "@/lib/units/quantity";
import { LayerThumbnail } from "./layer-thumbnail";

export interface MappingLayer {
  name: string;
  entities: number;
  byType: Record<string, number>;
  style?: string;
  role: string;
  depth: string;
  width: string;
  section: string;
  remembered: boolean;
}

const ROLE_WORDS: Record<string, string> = {
  channel: "Channel (fluid flows here)",
  port: "Port (inlets and outlets)",
  control: "Control (valves, not fluid)",
  outline: "Outline (die edge)",
  ignore: "Ignore (text, notes)",
};
const SECTION_WORDS: Record<string, string> = {
  rectangular: "Rectangular",
  circular: "Circular",
  isotropic_etch: "Isotropic etch (D-shaped)",
  trapezoid_koh: "Trapezoid (KOH etch)",
  semicircular: "Semicircular (reflowed resist)",
};

function quantityProblem(value: string, label: string): string | null {
  try {
    parseQuantity(value, "length", label);
    return null;
  } catch (err) {
    return err instanceof DomainError ? err.message : `Not a valid ${label}.`;
  }
}

export function LayerMapForm({
  chipId,
  revisionNumber,
  revisionHref,
  initialLayers,
  preview,
  fileUnits,
  unitsProblem,
  rememberedUnits,
}: {
  chipId: number;
  revisionNumber: number;
  revisionHref: string;
  initialLayers: MappingLayer[];
  preview: LayoutPreview | null;
  fileUnits: string | null;
  unitsProblem: string | null;
  rememberedUnits: string | null;
}) {
  const router = useRouter();
  const [layers, setLayers] = useState(initialLayers);
  const [units, setUnits] = useState<string>(rememberedUnits ?? (fileUnits ? "" : "um"));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = (i: number, patch: Partial<MappingLayer>) => setLayers((ls) => ls.map((l, k) => (k === i ? { ...l, ...patch } : l)));

  const submit = async () => {
    const fieldErrors: Record<string, string> = {};
    const mapping: LayerMapInput["layers"] = {};
    for (const l of layers) {
      const role = layerRoleSchema.parse(l.role);
      if (role === "channel") {
        const depthProblem = l.depth ? quantityProblem(l.depth, `depth of ${l.name}`) : `Enter the depth of the channels on ${l.name}, e.g. 50 um.`;
        if (depthProblem) fieldErrors[`${l.name}.depth`] = depthProblem;
        const widthProblem = l.width ? quantityProblem(l.width, `width of ${l.name}`) : null;
        if (widthProblem) fieldErrors[`${l.name}.width`] = widthProblem;
        mapping[l.name] = {
          role,
          depth: l.depth,
          ...(l.width ? { width: l.width } : {}),
          ...(l.section ? { section: sectionSchema.parse(l.section) } : {}),
        };
      } else mapping[l.name] = { role };
    }
    setErrors(fieldErrors);
    const parsed = layerMapSchema.safeParse({ ...(units ? { units } : {}), layers: mapping });
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? "The mapping is not complete.");
      return;
    }
    if (Object.keys(fieldErrors).length > 0) {
      setProblem("Some layers need attention.");
      return;
    }
    setProblem(null);
    setBusy(true);
    try {
      const res = await fetch(`/api/v1/chips/${chipId}/revisions/${revisionNumber}/layer-map`, {
        method: "PUT",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(parsed.data),
      });
      if (res.ok) {
        router.push(`${revisionHref}?mapped=1`);
        router.refresh();
        return;
      }
      const body = await res.json().catch(() => null);
      setProblem(body?.error?.message ?? `The mapping was not saved (HTTP ${res.status}).`);
    } catch {
      setProblem("The mapping did not reach the server (network error). Try again.");
    } finally {
      setBusy(false);
    }
  };

  const previewOf = (name: string) => preview?.layers.find((l) => l.name === name);
  return (
    <div className="space-y-4">
      <div className="panel flex flex-wrap items-end gap-4 p-4">
        <div>
          <label htmlFor="drawing-units" className="mb-1 block text-sm font-medium text-ink-800">
            Drawing units
          </label>
          <select id="drawing-units" className="field-input w-56" value={units} onChange={(e) => setUnits(e.target.value)}>
            {fileUnits ? <option value="">As the file says ({fileUnits})</option> : null}
            {drawingUnitSchema.options.map((u) => (
              <option key={u} value={u}>
                {u === "um" ? "µm" : u}
              </option>
            ))}
          </select>
        </div>
        <p className="max-w-xl text-sm text-ink-600">
          {unitsProblem ? <span className="text-heed-800">{unitsProblem} </span> : null}
          One drawing unit is one {units || fileUnits || "µm"}; widths and depths below take their own units.
        </p>
      </div>
      <ul className="space-y-3" aria-label="Layers of this revision">
        {layers.map((l, i) => {
          const pv = previewOf(l.name);
          const depthErr = errors[`${l.name}.depth`];
          const widthErr = errors[`${l.name}.width`];
          return (
            <li key={l.name} className="panel flex flex-wrap gap-4 p-4" data-testid="layer-row" data-layer={l.name}>
              {pv ? <LayerThumbnail layer={pv} frame={preview!.bounds} /> : <div className="h-[132px] w-[132px] rounded border border-ink-200 bg-ink-50" />}
              <div className="min-w-64 flex-1 space-y-2">
                <h3 className="font-mono text-base font-semibold text-ink-900">{l.name}</h3>
                <p className="text-sm text-ink-600">
                  {l.entities} {l.entities === 1 ? "entity" : "entities"}:{" "}
                  {Object.entries(l.byType)
                    .sort((a, b) => b[1] - a[1])
                    .map(([t, n]) => `${n} ${t}`)
                    .join(", ") || "none"}
                  {l.style ? ` · drawn as ${l.style === "centreline" ? "centrelines" : l.style === "outline" ? "outlines" : "mixed lines"}` : ""}
                </p>
                <div>
                  <label htmlFor={`role-${i}`} className="mb-1 block text-sm font-medium text-ink-800">
                    Role of {l.name}
                  </label>
                  <select id={`role-${i}`} className="field-input w-72" value={l.role} onChange={(e) => set(i, { role: e.target.value })}>
                    {layerRoleSchema.options.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_WORDS[r]}
                      </option>
                    ))}
                  </select>
                </div>
                {l.role === "channel" ? (
                  <div className="grid gap-3 sm:grid-cols-3">
                    <div>
                      <label htmlFor={`depth-${i}`} className="mb-1 block text-sm font-medium text-ink-800">
                        Depth
                      </label>
                      <input
                        id={`depth-${i}`}
                        className="field-input"
                        value={l.depth}
                        placeholder="50 um"
                        aria-invalid={depthErr ? true : undefined}
                        aria-describedby={depthErr ? `depth-${i}-error` : undefined}
                        onChange={(e) => set(i, { depth: e.target.value })}
                      />
                      {depthErr ? (
                        <p id={`depth-${i}-error`} className="mt-1 text-sm font-medium text-halt-800">
                          {depthErr}
                        </p>
                      ) : null}
                    </div>
                    <div>
                      <label htmlFor={`width-${i}`} className="mb-1 block text-sm font-medium text-ink-800">
                        Default width
                      </label>
                      <input
                        id={`width-${i}`}
                        className="field-input"
                        value={l.width}
                        placeholder="100 um"
                        aria-invalid={widthErr ? true : undefined}
                        aria-describedby={widthErr ? `width-${i}-error` : `width-${i}-hint`}
                        onChange={(e) => set(i, { width: e.target.value })}
                      />
                      {widthErr ? (
                        <p id={`width-${i}-error`} className="mt-1 text-sm font-medium text-halt-800">
                          {widthErr}
                        </p>
                      ) : (
                        <p id={`width-${i}-hint`} className="mt-1 text-xs text-ink-600">
                          For centrelines without a drawn width.
                        </p>
                      )}
                    </div>
                    <div>
                      <label htmlFor={`section-${i}`} className="mb-1 block text-sm font-medium text-ink-800">
                        Cross-section
                      </label>
                      <select id={`section-${i}`} className="field-input" value={l.section} onChange={(e) => set(i, { section: e.target.value })}>
                        <option value="">From the process (usual)</option>
                        {sectionSchema.options.map((s) => (
                          <option key={s} value={s}>
                            {SECTION_WORDS[s]}
                          </option>
                        ))}
                      </select>
                    </div>
                    {l.remembered ? <p className="text-xs text-stream-800 sm:col-span-3">Depth and width remembered from the previous revision.</p> : null}
                  </div>
                ) : null}
              </div>
            </li>
          );
        })}
      </ul>
      {problem ? (
        <div data-testid="layer-map-problem">
          <Notice tone="error" title="Not saved">
            {problem}
          </Notice>
        </div>
      ) : null}
      <div className="flex gap-2">
        <button type="button" className="btn-primary" onClick={submit} disabled={busy}>
          {busy ? "Reading the layout…" : "Save layer mapping"}
        </button>
        <Link href={revisionHref} className="btn-quiet">
          Later
        </Link>
      </div>
      <p className="text-sm text-ink-600">The mapping is checked by reading the channel network; once saved it stays with this revision.</p>
    </div>
  );
}
