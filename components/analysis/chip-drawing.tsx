"use client";
/**
 * The chip drawn to scale: every segment as its centreline stroked at its real
 * width, ports as their circles with labels, flags as shape markers, an
 * optional comparison overlay. SVG up to CANVAS_THRESHOLD segments, canvas
 * above (the overlay stays SVG). Pan and zoom by d3-zoom (wheel, drag, pinch),
 * buttons and keys (arrows pan, + / − zoom, 0 fits). Hover shows the numbers,
 * click selects; hit-testing uses a d3-quadtree in both modes.
 */
import { memo, useCallback, useEffect, useId, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import { select } from "d3-selection";
import { zoom as d3zoom, zoomIdentity, type ZoomBehavior, type ZoomTransform } from "d3-zoom";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";
import { buildHitIndex, type HitIndex, drawingBounds, fitTransform, hitSegment, midpointM, pathData, strokeWidthUm, toDrawing, UM_PER_M } from "./drawing-geometry";
import { FlagShape } from "./flag-marker";
import type { Severity } from "./types";

/** Above this many segments the channels are painted on a canvas (SVG DOM gets slow to pan). */
export const CANVAS_THRESHOLD = 3000;

export interface FlagMarker {
  key: string;
  severity: Severity;
  title: string;
  segmentId: string | null;
  xM: number;
  yM: number;
}

/** What the comparison adds to the drawing. */
export interface DrawingOverlay {
  /** Segments only in the other document, drawn as dashed ghosts. */
  removed: { key: string; path_m: [number, number][]; width_m: number }[];
  added: Set<string>;
  changed: Set<string>;
}

export interface ChipDrawingProps {
  analysis: AnalyzeJson;
  /** Fill colour per segment id. */
  colourOf: (segmentId: string) => string;
  /** Bumps when the colours change (the drawing repaints then). */
  colourKey: string;
  selectedId: string | null;
  onSelect: (segmentId: string | null) => void;
  markers: FlagMarker[];
  overlay?: DrawingOverlay | null;
  /** Lines of the hover card for a segment. */
  describe: (segmentId: string) => ReactNode;
  /** Accessible name and the id of the element that describes the drawing in text (the table). */
  label: string;
  describedBy?: string;
  canvasThreshold?: number;
  /** Called once the first paint with a fitted view is done (bench). */
  onReady?: () => void;
  children?: ReactNode;
}

const ZOOM_STEP = 1.4;
const PAN_STEP_PX = 60;
/** Room kept free on the right for the zoom buttons when fitting. */
const BUTTON_GUTTER_PX = 44;

export function ChipDrawing(props: ChipDrawingProps) {
  const { analysis, colourOf, colourKey, selectedId, onSelect, markers, overlay, describe, label, describedBy, onReady } = props;
  const threshold = props.canvasThreshold ?? CANVAS_THRESHOLD;
  const useCanvas = analysis.segments.length > threshold;
  const hostRef = useRef<HTMLDivElement>(null);
  const canvasRef = useRef<HTMLCanvasElement>(null);
  // Outline layouts: show the mask shapes as read, with the extracted centrelines over them.
  const hasMask = (analysis.mask_m?.length ?? 0) > 0;
  const [showMask, setShowMask] = useState(true);
  const zoomRef = useRef<ZoomBehavior<HTMLDivElement, unknown> | null>(null);
  const [size, setSize] = useState<{ w: number; h: number } | null>(null);
  const [t, setT] = useState<ZoomTransform>(zoomIdentity);
  const [hover, setHover] = useState<{ id: string; x: number; y: number } | null>(null);
  const readySent = useRef(false);
  const hintId = useId();

  const box = useMemo(() => drawingBounds(analysis), [analysis]);
  // The hit index is built after the first paint (idle time), or on the first pointer event if that comes sooner.
  const indexRef = useRef<{ key: AnalyzeSegmentJson[]; index: HitIndex } | null>(null);
  const getIndex = useCallback(() => {
    if (indexRef.current?.key !== analysis.segments) indexRef.current = { key: analysis.segments, index: buildHitIndex(analysis.segments, box) };
    return indexRef.current.index;
  }, [analysis, box]);
  useEffect(() => {
    const id = setTimeout(getIndex, 50);
    return () => clearTimeout(id);
  }, [getIndex]);
  const byId = useMemo(() => new Map(analysis.segments.map((s) => [s.id, s])), [analysis]);

  // Track the host's size (its height is fixed by CSS, so nothing jumps on hydration); measured before the first paint.
  useLayoutEffect(() => {
    const el = hostRef.current;
    if (!el) return;
    const measure = () => setSize({ w: el.clientWidth, h: el.clientHeight });
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  const fit = useCallback(() => {
    const el = hostRef.current;
    const z = zoomRef.current;
    if (!el || !z || !size) return;
    const f = fitTransform(box, size.w - BUTTON_GUTTER_PX, size.h);
    select(el).call(z.transform, zoomIdentity.translate(f.x, f.y).scale(f.k));
  }, [box, size]);

  // d3-zoom owns wheel, drag and pinch; the transform lives in React state.
  useEffect(() => {
    const el = hostRef.current;
    if (!el || !size) return;
    const f = fitTransform(box, size.w - BUTTON_GUTTER_PX, size.h);
    const z = d3zoom<HTMLDivElement, unknown>()
      .scaleExtent([f.k / 4, f.k * 400])
      .on("zoom", (event: { transform: ZoomTransform }) => setT(event.transform));
    zoomRef.current = z;
    const sel = select(el);
    sel.call(z).on("dblclick.zoom", null);
    sel.call(z.transform, zoomIdentity.translate(f.x, f.y).scale(f.k));
    return () => {
      sel.on(".zoom", null);
    };
  }, [box, size]);

  // Canvas mode: paint channels batched by colour and width (batches rebuilt only when colours change).
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const batches = useMemo(() => (useCanvas && typeof Path2D !== "undefined" ? canvasBatches(analysis.segments, colourOf) : []), [useCanvas, analysis, colourKey]);
  useEffect(() => {
    if (!useCanvas || !size || t === zoomIdentity) return;
    const canvas = canvasRef.current;
    const ctx = canvas?.getContext("2d");
    if (!canvas || !ctx) return;
    const frame = requestAnimationFrame(() => {
      const dpr = window.devicePixelRatio || 1;
      if (canvas.width !== Math.round(size.w * dpr)) canvas.width = Math.round(size.w * dpr);
      if (canvas.height !== Math.round(size.h * dpr)) canvas.height = Math.round(size.h * dpr);
      ctx.setTransform(1, 0, 0, 1, 0, 0);
      ctx.clearRect(0, 0, canvas.width, canvas.height);
      ctx.setTransform(dpr * t.k, 0, 0, dpr * t.k, dpr * t.x, dpr * t.y);
      ctx.lineCap = "round";
      ctx.lineJoin = "round";
      for (const batch of batches) {
        ctx.strokeStyle = batch.colour;
        ctx.lineWidth = Math.max(batch.widthUm, 1 / t.k);
        ctx.stroke(batch.path);
      }
    });
    return () => cancelAnimationFrame(frame);
  }, [useCanvas, size, t, batches]);

  useEffect(() => {
    if (!size || readySent.current || t === zoomIdentity) return;
    readySent.current = true;
    requestAnimationFrame(() => onReady?.());
  }, [size, t, onReady]);

  const pointerToDrawing = (clientX: number, clientY: number): [number, number] | null => {
    const el = hostRef.current;
    if (!el) return null;
    const r = el.getBoundingClientRect();
    return t.invert([clientX - r.left, clientY - r.top]);
  };

  const hitAt = (clientX: number, clientY: number): string | null => {
    const p = pointerToDrawing(clientX, clientY);
    if (!p) return null;
    const i = hitSegment(getIndex(), analysis.segments, p[0], p[1], 5 / t.k);
    return i >= 0 ? analysis.segments[i].id : null;
  };

  const onPointerMove = (e: React.PointerEvent) => {
    if (e.buttons !== 0) return setHover(null);
    const id = hitAt(e.clientX, e.clientY);
    const r = hostRef.current!.getBoundingClientRect();
    setHover(id ? { id, x: e.clientX - r.left, y: e.clientY - r.top } : null);
  };

  const onClick = (e: React.MouseEvent) => {
    const id = hitAt(e.clientX, e.clientY);
    onSelect(id);
  };

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const el = hostRef.current;
    const z = zoomRef.current;
    if (!el || !z) return;
    const sel = select(el);
    const pan = (dx: number, dy: number) => sel.call(z.translateBy, dx / t.k, dy / t.k);
    switch (e.key) {
      case "ArrowLeft": pan(PAN_STEP_PX, 0); break;
      case "ArrowRight": pan(-PAN_STEP_PX, 0); break;
      case "ArrowUp": pan(0, PAN_STEP_PX); break;
      case "ArrowDown": pan(0, -PAN_STEP_PX); break;
      case "+": case "=": sel.call(z.scaleBy, ZOOM_STEP); break;
      case "-": case "_": sel.call(z.scaleBy, 1 / ZOOM_STEP); break;
      case "0": fit(); break;
      case "Escape": onSelect(null); break;
      default: return;
    }
    e.preventDefault();
  };

  const zoomBy = (f: number) => {
    const el = hostRef.current;
    if (el && zoomRef.current) select(el).call(zoomRef.current.scaleBy, f);
  };

  const selected = selectedId ? byId.get(selectedId) : undefined;
  const transform = `translate(${t.x},${t.y}) scale(${t.k})`;
  const px = 1 / t.k;
  const sizeUmPerPx = px;

  return (
    <div className="relative">
      <div
        ref={hostRef}
        role="application"
        aria-roledescription="zoomable chip drawing"
        aria-label={label}
        aria-describedby={[hintId, describedBy].filter(Boolean).join(" ")}
        tabIndex={0}
        onKeyDown={onKeyDown}
        onPointerMove={onPointerMove}
        onPointerLeave={() => setHover(null)}
        onClick={onClick}
        className="relative h-[420px] w-full cursor-crosshair touch-none overflow-hidden rounded-md border border-ink-200 bg-ink-50 outline-none focus-visible:ring-2 focus-visible:ring-stream-600 focus-visible:ring-offset-2 lg:h-[520px]"
        data-testid="chip-drawing"
        data-render-mode={useCanvas ? "canvas" : "svg"}
      >
        {useCanvas && <canvas ref={canvasRef} className="absolute inset-0 h-full w-full" aria-hidden="true" />}
        {size && (
          <svg width={size.w} height={size.h} className="absolute inset-0" aria-hidden="true">
            <g transform={transform}>
              {analysis.outline_m.map((poly, i) => (
                <path key={i} d={pathData(poly) + "Z"} fill="#ffffff" stroke="#9aaec4" strokeWidth={1.5 * px} />
              ))}
              {!useCanvas && <SegmentPaths segments={analysis.segments} colourOf={colourOf} colourKey={colourKey} />}
              {overlay?.removed.map((r) => (
                <path key={r.key} d={pathData(r.path_m)} fill="none" stroke="#b8321a" strokeOpacity={0.8} strokeWidth={Math.max(r.width_m * UM_PER_M, 2 * px)} strokeDasharray={`${6 * px} ${4 * px}`} data-overlay="removed" />
              ))}
              {overlay &&
                analysis.segments
                  .filter((s) => overlay.added.has(s.id) || overlay.changed.has(s.id))
                  .map((s) => (
                    <path
                      key={`ov-${s.id}`}
                      d={pathData(s.path_m)}
                      fill="none"
                      stroke={overlay.added.has(s.id) ? "#0c6a5c" : "#a86400"}
                      strokeWidth={strokeWidthUm(s) + 6 * px}
                      strokeOpacity={0.9}
                      strokeDasharray={overlay.added.has(s.id) ? undefined : `${2 * px} ${3 * px}`}
                      strokeLinecap="round"
                      data-overlay={overlay.added.has(s.id) ? "added" : "changed"}
                      style={{ mixBlendMode: "multiply" }}
                    />
                  ))}
              {hasMask && showMask && (
                <g data-testid="mask-overlay" pointerEvents="none">
                  {analysis.mask_m!.map((m) => (
                    <path
                      key={`mask-${m.layer}`}
                      d={m.rings.map((ring) => pathData(ring) + "Z").join(" ")}
                      fill="none"
                      stroke="#1c2b3d"
                      strokeWidth={1 * px}
                      strokeDasharray={`${4 * px} ${3 * px}`}
                    />
                  ))}
                  {analysis.segments.map((seg) => (
                    <path key={`cl-${seg.id}`} d={pathData(seg.path_m)} fill="none" stroke="#ffffff" strokeWidth={1.2 * px} strokeLinecap="round" />
                  ))}
                </g>
              )}
              {analysis.ports.map((p) => {
                const [x, y] = toDrawing(p.x_m, p.y_m);
                return <circle key={p.name} cx={x} cy={y} r={Math.max(p.radius_m * UM_PER_M, 4 * px)} fill="#e3e9f0" stroke="#293d54" strokeWidth={1.5 * px} />;
              })}
              {selected && (
                <g data-testid="selected-highlight" data-segment={selected.id}>
                  <path d={pathData(selected.path_m)} fill="none" stroke="#111c29" strokeWidth={strokeWidthUm(selected) + 8 * px} strokeLinecap="round" strokeLinejoin="round" />
                  <path d={pathData(selected.path_m)} fill="none" stroke="#ffffff" strokeWidth={strokeWidthUm(selected) + 4 * px} strokeLinecap="round" strokeLinejoin="round" />
                  <path d={pathData(selected.path_m)} fill="none" stroke={colourOf(selected.id)} strokeWidth={Math.max(strokeWidthUm(selected), 1.5 * px)} strokeLinecap="round" strokeLinejoin="round" />
                </g>
              )}
            </g>
            {placeMarkers(markers, t).map(({ m, x, y }) => (
              <g key={m.key} transform={`translate(${x},${y})`} data-flag={m.severity}>
                <FlagShape severity={m.severity} size={11} />
              </g>
            ))}
            {analysis.ports.map((p) => {
              const [x, y] = t.apply(toDrawing(p.x_m, p.y_m));
              const r = Math.max(p.radius_m * UM_PER_M * t.k, 4);
              return (
                <text key={p.name} x={x} y={y - r - 5} textAnchor="middle" className="fill-ink-900 font-mono text-[12px] font-semibold" stroke="#ffffff" strokeWidth={3} paintOrder="stroke">
                  {p.name}
                </text>
              );
            })}
            <ScaleBar umPerPx={sizeUmPerPx} height={size.h} />
          </svg>
        )}
        {hover && (
          <div
            role="tooltip"
            className="pointer-events-none absolute z-10 max-w-[18rem] rounded border border-ink-300 bg-white/95 px-2 py-1.5 text-xs text-ink-900 shadow-md"
            style={{ left: Math.min(hover.x + 14, (size?.w ?? 0) - 230), top: Math.min(hover.y + 14, (size?.h ?? 0) - 150) }}
          >
            {describe(hover.id)}
          </div>
        )}
      </div>
      <p id={hintId} className="sr-only">
        Arrow keys pan, plus and minus zoom, 0 fits the chip, Escape clears the selection. Every value drawn here is listed in the segment table.
      </p>
      <div className="absolute right-2 top-2 flex flex-col gap-1">
        <DrawingButton label="Zoom in" onClick={() => zoomBy(ZOOM_STEP)}>+</DrawingButton>
        <DrawingButton label="Zoom out" onClick={() => zoomBy(1 / ZOOM_STEP)}>−</DrawingButton>
        <DrawingButton label="Fit the chip in view" onClick={fit}>
          <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true"><path d="M1 5V1h4M9 1h4v4M13 9v4H9M5 13H1V9" fill="none" stroke="currentColor" strokeWidth="1.6" /></svg>
        </DrawingButton>
        {hasMask && (
          <DrawingButton label={showMask ? "Hide the mask outline and extracted centrelines" : "Show the mask outline and extracted centrelines"} onClick={() => setShowMask((v) => !v)} pressed={showMask}>
            <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true"><rect x="1.5" y="4" width="11" height="6" fill="none" stroke="currentColor" strokeWidth="1.2" strokeDasharray="2 1.5" /><path d="M1 7h12" stroke="currentColor" strokeWidth="1.2" /></svg>
          </DrawingButton>
        )}
      </div>
      {props.children}
    </div>
  );
}

function DrawingButton({ label, onClick, children, pressed }: { label: string; onClick: () => void; children: ReactNode; pressed?: boolean }) {
  return (
    <button
      type="button"
      aria-label={label}
      aria-pressed={pressed}
      title={label}
      onClick={onClick}
      className="flex h-8 w-8 items-center justify-center rounded border border-ink-300 bg-white text-base font-semibold text-ink-800 shadow-sm hover:bg-ink-100 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-stream-600"
    >
      {children}
    </button>
  );
}

const SegmentPaths = memo(function SegmentPaths({ segments, colourOf }: { segments: AnalyzeSegmentJson[]; colourOf: (id: string) => string; colourKey: string }) {
  return (
    <g fill="none" strokeLinecap="round" strokeLinejoin="round">
      {segments.map((s) => (
        <path key={s.id} d={pathData(s.path_m)} stroke={colourOf(s.id)} strokeWidth={strokeWidthUm(s)} data-segment={s.id} />
      ))}
    </g>
  );
}, (a, b) => a.segments === b.segments && a.colourKey === b.colourKey);

function canvasBatches(segments: AnalyzeSegmentJson[], colourOf: (id: string) => string): { colour: string; widthUm: number; path: Path2D }[] {
  const batches = new Map<string, { colour: string; widthUm: number; path: Path2D }>();
  for (const s of segments) {
    const colour = colourOf(s.id);
    const widthUm = Math.round(strokeWidthUm(s) * 10) / 10;
    const key = `${colour}|${widthUm}`;
    let b = batches.get(key);
    if (!b) {
      b = { colour, widthUm, path: new Path2D() };
      batches.set(key, b);
    }
    s.path_m.forEach(([xm, ym], i) => {
      const [x, y] = toDrawing(xm, ym);
      if (i === 0) b.path.moveTo(x, y);
      else b.path.lineTo(x, y);
    });
  }
  return [...batches.values()];
}

const SEVERITY_RANK: Record<Severity, number> = { info: 0, warn: 1, block: 2 };

/**
 * Screen positions of the flag markers, 9 px above their point; markers that
 * would fall on the same spot are set side by side, the most severe first.
 */
function placeMarkers(markers: FlagMarker[], t: ZoomTransform): { m: FlagMarker; x: number; y: number }[] {
  const spots = new Map<string, FlagMarker[]>();
  for (const m of markers) {
    const [x, y] = t.apply(toDrawing(m.xM, m.yM));
    const key = `${Math.round(x / 8)},${Math.round(y / 8)}`;
    const list = spots.get(key) ?? [];
    list.push(m);
    spots.set(key, list);
  }
  const out: { m: FlagMarker; x: number; y: number }[] = [];
  for (const list of spots.values()) {
    list.sort((a, b) => SEVERITY_RANK[b.severity] - SEVERITY_RANK[a.severity]);
    const [x0, y0] = t.apply(toDrawing(list[0].xM, list[0].yM));
    list.forEach((m, i) => out.push({ m, x: x0 + (i - (list.length - 1) / 2) * 14, y: y0 - 9 }));
  }
  return out;
}

/** A scale bar with a round length (1-2-5 steps) about 100 px long. */
function ScaleBar({ umPerPx, height }: { umPerPx: number; height: number }) {
  const target = umPerPx * 100;
  const pow = 10 ** Math.floor(Math.log10(target));
  const step = [1, 2, 5, 10].find((m) => m * pow >= target) ?? 10;
  const lengthUm = step * pow;
  const w = lengthUm / umPerPx;
  const text = lengthUm >= 1000 ? `${lengthUm / 1000} mm` : `${lengthUm} µm`;
  return (
    <g transform={`translate(12,${height - 14})`}>
      <path d={`M0,-5V0H${w}V-5`} fill="none" stroke="#1c2b3d" strokeWidth={1.5} />
      <text x={w / 2} y={-8} textAnchor="middle" className="fill-ink-800 font-mono text-[11px]" stroke="#f3f6f9" strokeWidth={3} paintOrder="stroke">
        {text}
      </text>
    </g>
  );
}

/** Marker position for a flag: its own point, else its segment's midpoint, else its port. */
export function flagMarkers(analysis: AnalyzeJson): FlagMarker[] {
  const seg = new Map(analysis.segments.map((s) => [s.id, s]));
  const port = new Map(analysis.ports.map((p) => [p.name, p]));
  const node = new Map(analysis.nodes.map((n) => [n.id, n]));
  const out: FlagMarker[] = [];
  analysis.flags.forEach((f, i) => {
    const severity: Severity = f.severity === "block" || f.severity === "warn" ? f.severity : "info";
    let at: [number, number] | null = f.at ? [f.at.x_m, f.at.y_m] : null;
    let segmentId: string | null = null;
    if (f.target.kind === "segment" && f.target.id && seg.has(f.target.id)) {
      segmentId = f.target.id;
      at ??= midpointM(seg.get(f.target.id)!.path_m);
    } else if (f.target.kind === "port" && f.target.id && port.has(f.target.id)) {
      const p = port.get(f.target.id)!;
      // On the port's right rim, clear of its label above.
      at ??= [p.x_m + p.radius_m, p.y_m];
    } else if (f.target.kind === "node" && f.target.id && node.has(f.target.id)) {
      const n = node.get(f.target.id)!;
      at ??= [n.x_m, n.y_m];
    }
    if (at) out.push({ key: `${f.code}-${i}`, severity, title: f.title, segmentId, xM: at[0], yM: at[1] });
  });
  return out;
}
