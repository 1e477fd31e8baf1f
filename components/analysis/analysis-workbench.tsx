"use client";
/**
 * The analysis view of one revision's operating point: the drawing coloured by
 * a chosen quantity, the segment table, the regime map, the pressure profile,
 * the ports, the flags and the model's cautions, all sharing one selection.
 * Mounted by a server page with one small prop (AnalysisWorkbenchProps).
 */
import { useCallback, useId, useMemo, useState, useTransition } from "react";
import { compareAnalyses } from "@/lib/analysis/compare";
import { createColourScale, type ColourScheme } from "@/lib/analysis/colour-scales";
import { ChipDrawing, flagMarkers } from "./chip-drawing";
import { ColourLegend } from "./colour-legend";
import { CompareView, overlayFromComparison } from "./compare-view";
import { CautionsPanel } from "./cautions-panel";
import { colourQuantities, formatNumber, segmentFields } from "./fields";
import { FlagIcon } from "./flag-marker";
import { FlagsList } from "./flags-list";
import { PortSummary } from "./port-summary";
import { PressureProfileChart } from "./pressure-profile";
import { RegimeChart } from "./regime-chart";
import { SegmentTable } from "./segment-table";
import { WhenVisible } from "./when-visible";
import { DISPLAY_UNITS, resolveUnit, suggestScale, type QuantityKey, type UnitFamily, type UnitPreferences } from "@/lib/analysis/quantities";
import { asSeverity, SEVERITY_LABEL, SEVERITY_ORDER, type AnalysisWorkbenchProps, type Severity } from "./types";

/** The unit families offered in the toolbar (the others keep the member's stored choice or the default). */
const UNIT_PICKERS: { family: UnitFamily; label: string }[] = [
  { family: "pressure", label: "Pressure in" },
  { family: "flow", label: "Flow in" },
  { family: "length", label: "Sizes in" },
  { family: "stress", label: "Shear in" },
];

export function AnalysisWorkbench(props: AnalysisWorkbenchProps) {
  const { analysis, labels, compare, compareLinks, closeCompareHref, saveUnitsAction } = props;
  const tableId = useId().replace(/:/g, "") + "-segments";
  const [units, setUnits] = useState<UnitPreferences>(props.units ?? {});
  const [quantityKey, setQuantityKey] = useState<QuantityKey>("pressure");
  const [scheme, setScheme] = useState<ColourScheme>("viridis");
  const [selectedId, setSelectedId] = useState<string | null>(() =>
    props.initialSegmentId && analysis.segments.some((s) => s.id === props.initialSegmentId) ? props.initialSegmentId : null,
  );
  const [showOverlay, setShowOverlay] = useState(true);
  const [, startSaving] = useTransition();

  const fields = useMemo(() => segmentFields(analysis, units), [analysis, units]);
  const quantities = useMemo(() => colourQuantities(analysis, units), [analysis, units]);
  const quantity = quantities.find((q) => q.key === quantityKey) ?? quantities[0];
  const values = quantity.values;
  const scale = useMemo(() => createColourScale(values.values(), { scheme, log: suggestScale(values.values()) === "log" }), [values, scheme]);
  const colourOf = useCallback((id: string) => scale.colour(values.get(id)), [scale, values]);
  const colourKey = `${quantity.key}|${scheme}|${JSON.stringify(units)}`;

  const flagsBySegment = useMemo(() => {
    const m = new Map<string, Severity[]>();
    for (const f of analysis.flags) {
      if (f.target.kind !== "segment" || !f.target.id) continue;
      const list = m.get(f.target.id) ?? [];
      list.push(asSeverity(f.severity));
      m.set(f.target.id, list);
    }
    return m;
  }, [analysis.flags]);
  const markers = useMemo(() => flagMarkers(analysis), [analysis]);
  const comparison = useMemo(() => (compare ? compareAnalyses(compare.analysis, analysis) : null), [compare, analysis]);
  const overlay = useMemo(() => (comparison && compare && showOverlay ? overlayFromComparison(comparison, compare.analysis) : null), [comparison, compare, showOverlay]);
  const segById = useMemo(() => new Map(analysis.segments.map((s) => [s.id, s])), [analysis]);

  const field = (key: string) => fields.find((f) => f.key === key)!;
  const pressureView = { unitLabel: field("pressure_drop").unitLabel, toDisplay: field("pressure_drop").toDisplay };
  const flowView = { unitLabel: field("flow").unitLabel, toDisplay: field("flow").toDisplay };

  const changeUnits = (next: UnitPreferences) => {
    setUnits(next);
    if (saveUnitsAction) startSaving(() => saveUnitsAction(next));
  };

  const select = useCallback((id: string | null) => setSelectedId(id), []);

  const summaryFields = ["width", "depth", "flow", "pressure_drop", "reynolds", "capillary", "peclet", "wall_shear", "residence"];
  const describe = (id: string) => {
    const s = segById.get(id);
    if (!s) return null;
    const v = values.get(id);
    const flags = analysis.flags.filter((f) => f.target.kind === "segment" && f.target.id === id);
    return (
      <div>
        <p className="font-mono font-semibold">{s.id} <span className="font-sans font-normal text-ink-600">· {s.layer}</span></p>
        <p>{quantity.label}: <b>{formatNumber(v === undefined ? null : quantity.toDisplay(v))}</b> {quantity.unitLabel}</p>
        <dl className="mt-0.5 grid grid-cols-[auto_auto] gap-x-2">
          {summaryFields.map((k) => {
            const f = field(k);
            const raw = f.value(s);
            if (raw === null) return null;
            return [
              <dt key={`${k}t`} className="text-ink-600">{f.short}</dt>,
              <dd key={`${k}d`} className="text-right font-mono">{typeof raw === "number" ? formatNumber(f.toDisplay(raw)) : raw} {f.unitLabel}</dd>,
            ];
          })}
        </dl>
        {flags.map((f, i) => (
          <p key={i} className="mt-0.5 flex items-center gap-1"><FlagIcon severity={asSeverity(f.severity)} size={10} /> {f.title}</p>
        ))}
      </div>
    );
  };

  const selected = selectedId ? segById.get(selectedId) : undefined;
  const totals = analysis.totals;
  const counts = SEVERITY_ORDER.map((s) => ({ s, n: analysis.flags.filter((f) => asSeverity(f.severity) === s).length }));
  const title = `${labels.chip} · ${labels.revision}${labels.operatingPoint ? ` · ${labels.operatingPoint}` : ""}`;

  return (
    <div className="space-y-4 text-ink-900" data-testid="analysis-workbench">
      <header className="flex flex-wrap items-start gap-x-6 gap-y-2">
        <div className="mr-auto">
          <h1 className="text-lg font-semibold">{title}</h1>
          <p className="text-xs text-ink-700">
            {analysis.segments.length} segments · {analysis.ports.length} ports
            {totals && (
              <>
                {" "}· total flow {formatNumber(flowView.toDisplay(totals.total_flow_m3_per_s))} {flowView.unitLabel} · highest inlet pressure {formatNumber(pressureView.toDisplay(totals.max_inlet_pressure_Pa))} {pressureView.unitLabel} · max Re {formatNumber(totals.max_reynolds.value)} · mean residence {formatNumber(totals.mean_residence_s)} s
              </>
            )}
            {!totals && " · geometry only (no port is driven)"}
          </p>
          <p className="mt-1 flex flex-wrap gap-3 text-xs">
            {counts.map(({ s, n }) => (
              <span key={s} className="inline-flex items-center gap-1"><FlagIcon severity={s} size={11} /> {n} {SEVERITY_LABEL[s].toLowerCase()}</span>
            ))}
          </p>
        </div>
        {compareLinks && compareLinks.length > 0 && (
          <nav aria-label="Compare with" className="text-xs">
            <span className="mr-1 text-ink-700">Compare with</span>
            {compareLinks.map((l) => (
              <a key={l.href} href={l.href} className="mr-2 text-stream-700 underline hover:text-stream-800">{l.label}</a>
            ))}
          </nav>
        )}
      </header>

      <div role="toolbar" aria-label="Drawing and unit settings" className="flex flex-wrap items-end gap-3 rounded-md border border-ink-200 bg-white px-3 py-2 text-xs">
        <Picker label="Colour by" value={quantity.key} onChange={(v) => setQuantityKey(v as QuantityKey)} options={quantities.map((q) => ({ value: q.key, label: q.unitLabel ? `${q.label} (${q.unitLabel})` : q.label }))} />
        <Picker label="Colour scale" value={scheme} onChange={(v) => setScheme(v as ColourScheme)} options={[{ value: "viridis", label: "Viridis" }, { value: "cividis", label: "Cividis" }]} />
        <span className="mx-1 h-6 w-px bg-ink-200" aria-hidden="true" />
        {UNIT_PICKERS.map(({ family, label }) => (
          <Picker
            key={family}
            label={label}
            value={resolveUnit(family, units).id}
            onChange={(v) => changeUnits({ ...units, [family]: v })}
            options={DISPLAY_UNITS[family].map((u) => ({ value: u.id, label: u.label }))}
          />
        ))}
      </div>

      <div className="grid gap-4 lg:grid-cols-12">
        <div className="space-y-2 lg:col-span-8">
          <ChipDrawing
            analysis={analysis}
            colourOf={colourOf}
            colourKey={colourKey}
            selectedId={selectedId}
            onSelect={select}
            markers={markers}
            overlay={overlay}
            describe={describe}
            label={`Drawing of ${title}, coloured by ${quantity.label}`}
            describedBy={tableId}
          />
          <div className="flex flex-wrap items-start justify-between gap-3">
            <ColourLegend scale={scale} label={quantity.label} unitLabel={quantity.unitLabel} toDisplay={quantity.toDisplay} missing={analysis.segments.length - values.size} />
            <p className="flex flex-wrap items-center gap-3 text-xs text-ink-700" aria-label="Flag marker key">
              {SEVERITY_ORDER.map((s) => (
                <span key={s} className="inline-flex items-center gap-1"><FlagIcon severity={s} size={12} /> {SEVERITY_LABEL[s]}</span>
              ))}
            </p>
          </div>
          <p aria-live="polite" className="min-h-[1.25rem] text-xs text-ink-800" data-testid="selection-status">
            {selected ? (
              <>
                Selected <span className="font-mono font-semibold">{selected.id}</span> on {selected.layer}: {quantity.label} {formatNumber(values.has(selected.id) ? quantity.toDisplay(values.get(selected.id)!) : null)} {quantity.unitLabel}
                <button type="button" onClick={() => select(null)} className="ml-2 text-stream-700 underline">Clear selection</button>
              </>
            ) : (
              "Hover a channel for its numbers; click it (or a row of the table) to select it."
            )}
          </p>
          <CautionsPanel cautions={analysis.cautions} />
        </div>
        <div className="space-y-4 lg:col-span-4">
          <PortSummary analysis={analysis} limits={props.limits ?? {}} pressure={pressureView} flow={flowView} />
          <FlagsList analysis={analysis} selectedId={selectedId} onSelect={select} pressure={pressureView} length={{ unitLabel: field("width").unitLabel, toDisplay: field("width").toDisplay }} />
        </div>
      </div>

      {comparison && compare && (
        <CompareView
          comparison={comparison}
          labels={labels}
          otherLabels={compare.labels}
          lengthField={field("length")}
          widthField={field("width")}
          pressure={pressureView}
          flow={flowView}
          showOverlay={showOverlay}
          onShowOverlay={setShowOverlay}
          onSelect={select}
          closeHref={closeCompareHref}
        />
      )}

      <SegmentTable id={tableId} segments={analysis.segments} fields={fields} flagsBySegment={flagsBySegment} selectedId={selectedId} onSelect={select} exportName={props.exportName ?? "stokeline"} />

      <div className="grid gap-4 xl:grid-cols-2">
        <WhenVisible minHeight={470} label="Regime map (loads when scrolled into view)…">
          <RegimeChart analysis={analysis} flagsBySegment={flagsBySegment} selectedId={selectedId} onSelect={select} />
        </WhenVisible>
        <WhenVisible minHeight={380} label="Pressure profile (loads when scrolled into view)…">
          <PressureProfileChart analysis={analysis} pressure={pressureView} selectedId={selectedId} onSelect={select} />
        </WhenVisible>
      </div>
    </div>
  );
}

function Picker({ label, value, onChange, options }: { label: string; value: string; onChange: (v: string) => void; options: { value: string; label: string }[] }) {
  return (
    <label className="flex flex-col gap-0.5 text-ink-800">
      <span className="font-medium">{label}</span>
      <select value={value} onChange={(e) => onChange(e.target.value)} className="rounded border border-ink-300 bg-white px-1.5 py-1 text-xs focus-visible:outline-2 focus-visible:outline-stream-600">
        {options.map((o) => (
          <option key={o.value} value={o.value}>{o.label}</option>
        ))}
      </select>
    </label>
  );
}
