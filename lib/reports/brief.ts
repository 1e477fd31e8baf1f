/**
 * The brief's content model: everything the PDF (lib/reports/pdf.ts) and the
 * printable HTML view (components/brief) show, decided once here so the two
 * cannot drift. Pure: callers pass the loaded rows and the generation time.
 * The drawing is reduced to primitives in drawing units (µm, y down, as in
 * components/analysis/drawing-geometry.ts) with each segment's colour on a
 * viridis scale of its mean pressure.
 */
import { MODEL_CAUTIONS } from "../analysis/cautions";
import { createColourScale, NO_DATA_COLOUR } from "../analysis/colour-scales";
import { createQuantityReader, formatEngineering } from "../analysis/quantities";
import type { AnalyzeJson } from "../analysis/serialize";
import { describeAuditEvent } from "../review/describe";
import {
  describeTarget,
  flagStandings,
  formatDuration,
  formatFlow,
  formatPressure,
  limitRatio,
  pressureLimits,
  SEVERITY_WORDS,
  stateLabel,
  toMillibar,
  type FigureDisposition,
  type FlagStanding,
} from "./figures";

const UM_PER_M = 1e6;

export interface BriefInput {
  workspaceName: string;
  chip: { id: number; name: string; purpose: string };
  revision: {
    id: number;
    number: number;
    fileName: string;
    sha256: string;
    uploadedAt: Date;
    uploaderName: string | null;
    note: string;
    reviewState: string;
    reviewStateSince: Date;
  };
  /** The analysis that stands for the revision (figures.chooseReportAnalysis), with its document; null when none succeeded. */
  analysis: null | {
    id: number;
    operatingPointName: string;
    createdAt: Date;
    underReview: boolean;
    conditions: Record<string, unknown>;
    doc: AnalyzeJson;
  };
  dispositions: readonly (FigureDisposition & { byName: string | null })[];
  clearance: null | { byName: string | null; at: Date; fabName: string; process: string; fileSha256: string; analysisId: number };
  /** The revision's audit events, oldest first (sharing events, "report.*", are left out of the brief). */
  history: readonly { at: Date; actor: string | null; action: string; details: Record<string, unknown> }[];
}

export interface BriefFigure {
  label: string;
  value: string;
  /** The limit it is held against, in words ("pump 2 000 mbar"), or "" when none applies. */
  limit: string;
  /** "over" when a limit is exceeded, "near" above 80 % of one (common practice margin), "ok", or "none" without a limit. */
  status: "ok" | "near" | "over" | "none";
  note: string;
}

export interface BriefDrawing {
  /** View box in drawing units (µm, y down). */
  box: { minX: number; minY: number; width: number; height: number };
  segments: { id: string; points: [number, number][]; widthUm: number; colour: string }[];
  outline: [number, number][][];
  ports: { name: string; x: number; y: number; radiusUm: number }[];
  legend: { title: string; stops: { offset: number; colour: string }[]; ticks: { offset: number; label: string }[]; noData: boolean };
}

export interface BriefFlag {
  title: string;
  severity: string;
  severityLabel: string;
  where: string;
  message: string;
  value: string;
  standing: FlagStanding;
  standingLabel: string;
  justification: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
}

export interface BriefModel {
  title: string;
  subtitle: string;
  workspaceName: string;
  chip: { name: string; purpose: string };
  revision: { number: number; fileName: string; sha256: string; uploadedAt: string; uploaderName: string; note: string; stateLabel: string; stateSince: string; state: string };
  generatedAt: string;
  generatedAtIso: string;
  /** The line printed on every page. */
  footer: string;
  analysis: null | { id: number; operatingPointName: string; createdAt: string; basis: string };
  figures: BriefFigure[];
  drawing: BriefDrawing | null;
  flags: BriefFlag[];
  history: { at: string; actor: string; text: string }[];
  clearance: null | { by: string; at: string; fabName: string; process: string; fileSha256: string; analysisId: number; matchesRevision: boolean };
  cautions: readonly string[];
}

/** "2026-12-01 22:41 UTC". */
export function formatUtc(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

const STANDING_LABELS: Record<FlagStanding, string> = {
  open: "Open — needs a waiver or a fix",
  must_fix: "Must be fixed",
  waived: "Accepted with a waiver",
  fixed: "Fixed — no longer raised",
};

/** Above this fraction of a limit a figure is marked "near" (common practice: keep a 20 % margin). */
export const NEAR_LIMIT_RATIO = 0.8;

function judge(ratios: (number | null)[]): BriefFigure["status"] {
  const known = ratios.filter((r): r is number => r !== null);
  if (known.length === 0) return "none";
  const worst = Math.max(...known);
  return worst > 1 ? "over" : worst > NEAR_LIMIT_RATIO ? "near" : "ok";
}

const pct = (r: number | null) => (r === null ? "" : ` (${Math.round(r * 100)} %)`);

function keyFigures(input: BriefInput): BriefFigure[] {
  const a = input.analysis;
  if (!a || !a.doc.totals) {
    return [{ label: "Operating figures", value: "—", limit: "", status: "none", note: a ? "Geometry only: no operating point was solved." : "No successful analysis of this revision yet." }];
  }
  const t = a.doc.totals;
  const limits = pressureLimits(a.conditions);
  const pumpRatio = limitRatio(t.max_inlet_pressure_Pa, limits.pumpMaxPa);
  const bondRatio = limitRatio(t.max_inlet_pressure_Pa, limits.bondLimitPa);
  const limitWords = [
    limits.pumpMaxPa !== null ? `pump ${formatPressure(limits.pumpMaxPa)}${pct(pumpRatio)}` : "",
    limits.bondLimitPa !== null ? `bond ${formatPressure(limits.bondLimitPa)}${pct(bondRatio)}` : "",
  ].filter(Boolean);
  const b = a.doc.bounds_m;
  const widthM = b.max_x - b.min_x;
  const heightM = b.max_y - b.min_y;
  const re = t.max_reynolds;
  const shear = t.max_wall_shear_Pa;
  return [
    {
      label: "Required inlet pressure",
      value: formatPressure(t.max_inlet_pressure_Pa),
      limit: limitWords.join("; "),
      status: judge([pumpRatio, bondRatio]),
      note: limits.processLabel ? `Bond limit of ${limits.processLabel}.` : "No process named: no bond limit checked.",
    },
    { label: "Throughput", value: formatFlow(t.total_flow_m3_per_s), limit: "", status: "none", note: "Total flow into the chip." },
    { label: "Mean residence time", value: formatDuration(t.mean_residence_s), limit: "", status: "none", note: "Channel volume divided by throughput." },
    { label: "Channel volume", value: `${formatEngineering(t.total_volume_m3 * 1e9)} µL`, limit: "", status: "none", note: "" },
    { label: "Largest Reynolds number", value: formatEngineering(re.value), limit: "", status: "none", note: re.segment ? `In segment ${re.segment}; laminar well below ~2 000.` : "" },
    { label: "Largest wall shear stress", value: `${formatEngineering(shear.value)} Pa`, limit: "", status: "none", note: shear.segment ? `In segment ${shear.segment}.` : "" },
    {
      label: "Footprint",
      value: Number.isFinite(widthM) && Number.isFinite(heightM) ? `${formatEngineering(widthM * 1e3)} × ${formatEngineering(heightM * 1e3)} mm` : "—",
      limit: "",
      status: "none",
      note: "Bounding box of the layout.",
    },
  ];
}

function drawingOf(doc: AnalyzeJson): BriefDrawing | null {
  if (doc.segments.length === 0) return null;
  const read = createQuantityReader(doc);
  const values = doc.segments.map((s) => read("pressure", s));
  const scale = createColourScale(values, { scheme: "viridis", log: false });
  const toXY = ([x, y]: [number, number]): [number, number] => [x * UM_PER_M, -y * UM_PER_M];
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  const grow = ([x, y]: [number, number], r = 0) => {
    minX = Math.min(minX, x - r);
    maxX = Math.max(maxX, x + r);
    minY = Math.min(minY, y - r);
    maxY = Math.max(maxY, y + r);
  };
  const segments = doc.segments.map((s, i) => {
    const points = s.path_m.map(toXY);
    const widthUm = ((s.width_m + s.end_width_m) / 2) * UM_PER_M;
    for (const p of points) grow(p, widthUm / 2);
    return { id: s.id, points, widthUm, colour: scale.colour(values[i]) };
  });
  const outline = doc.outline_m.map((ring) => ring.map(toXY));
  for (const ring of outline) for (const p of ring) grow(p);
  const ports = doc.ports.map((p) => {
    const [x, y] = toXY([p.x_m, p.y_m]);
    const radiusUm = p.radius_m * UM_PER_M;
    grow([x, y], radiusUm);
    return { name: p.name, x, y, radiusUm };
  });
  const pad = Math.max(maxX - minX, maxY - minY) * 0.03 || 100;
  const hasData = values.some((v) => v !== null);
  const [lo, hi] = scale.domain;
  const span = hi - lo;
  const ticks = hasData
    ? scale.ticks(5).map((v) => ({ offset: span > 0 ? (v - lo) / span : 0.5, label: formatEngineering(toMillibar(v)) }))
    : [];
  return {
    box: { minX: minX - pad, minY: minY - pad, width: maxX - minX + 2 * pad, height: maxY - minY + 2 * pad },
    segments,
    outline,
    ports,
    legend: { title: hasData ? "Mean pressure in each segment (mbar, gauge)" : "No pressures: geometry only", stops: scale.stops(11), ticks, noData: !hasData },
  };
}

function valueText(code: string, value: number | null): string {
  if (value === null) return "";
  if (code.startsWith("pressure") || code.startsWith("pump")) return formatPressure(value);
  return formatEngineering(value);
}

/**
 * Build the brief for one revision.
 * @param input the loaded rows (lib/reports/load.ts)
 * @param now the generation time (printed on every page, UTC)
 */
export function buildBrief(input: BriefInput, now: Date): BriefModel {
  const a = input.analysis;
  const docFlags = a?.doc.flags ?? [];
  const messages = new Map(docFlags.map((f) => [`${f.code}|${f.target.kind}|${f.target.id ?? "*"}`, f.message]));
  const byName = new Map(input.dispositions.map((d) => [`${d.flagKey}@${d.at.getTime()}`, d.byName]));
  const standings = a ? flagStandings(a.id, docFlags, input.dispositions) : [];
  const order: Record<string, number> = { block: 0, warn: 1, info: 2 };
  const flags: BriefFlag[] = standings
    .map((s) => ({
      title: s.title,
      severity: s.standing === "fixed" ? "none" : s.severity,
      severityLabel: s.standing === "fixed" ? "Fixed" : (SEVERITY_WORDS[s.severity] ?? s.severity),
      where: describeTarget(s.target),
      message: messages.get(s.flagKey) ?? "",
      value: valueText(s.code, s.value),
      standing: s.standing,
      standingLabel: s.standing === "open" && s.severity !== "block" ? "Open — not blocking, no decision needed" : STANDING_LABELS[s.standing],
      justification: s.disposition?.justification ?? null,
      decidedBy: s.disposition ? (byName.get(`${s.flagKey}@${s.disposition.at.getTime()}`) ?? "a former member") : null,
      decidedAt: s.disposition ? formatUtc(s.disposition.at) : null,
    }))
    .sort((x, y) => (order[x.severity] ?? 3) - (order[y.severity] ?? 3));
  const r = input.revision;
  const generatedAt = formatUtc(now);
  return {
    title: input.chip.name,
    subtitle: `Revision ${r.number} · ${stateLabel(r.reviewState)}`,
    workspaceName: input.workspaceName,
    chip: { name: input.chip.name, purpose: input.chip.purpose },
    revision: {
      number: r.number,
      fileName: r.fileName,
      sha256: r.sha256,
      uploadedAt: formatUtc(r.uploadedAt),
      uploaderName: r.uploaderName ?? "a former member",
      note: r.note,
      stateLabel: stateLabel(r.reviewState),
      stateSince: formatUtc(r.reviewStateSince),
      state: r.reviewState,
    },
    generatedAt,
    generatedAtIso: now.toISOString(),
    footer: `${input.chip.name} rev. ${r.number} · file SHA-256 ${r.sha256} · generated ${generatedAt}`,
    analysis: a
      ? {
          id: a.id,
          operatingPointName: a.operatingPointName,
          createdAt: formatUtc(a.createdAt),
          basis: a.underReview ? "the analysis under review" : "the newest analysis (not yet submitted for review)",
        }
      : null,
    figures: keyFigures(input),
    drawing: a ? drawingOf(a.doc) : null,
    flags,
    history: input.history.filter((e) => !e.action.startsWith("report.")).map((e) => ({ at: formatUtc(e.at), actor: e.actor ?? "Stokeline", text: describeAuditEvent(e.action, e.details) })),
    clearance: input.clearance
      ? {
          by: input.clearance.byName ?? "a former member",
          at: formatUtc(input.clearance.at),
          fabName: input.clearance.fabName,
          process: input.clearance.process,
          fileSha256: input.clearance.fileSha256,
          analysisId: input.clearance.analysisId,
          matchesRevision: input.clearance.fileSha256.toLowerCase() === r.sha256.toLowerCase(),
        }
      : null,
    cautions: MODEL_CAUTIONS,
  };
}

export { NO_DATA_COLOUR };
