/**
 * The lead's figures, pure: which analysis stands for a revision, its required
 * inlet pressure against the pump and bond limits, throughput and residence in
 * plain units, the worst flag still open (not waived), and the per-revision
 * trend points. No database, no clock: callers pass rows and `now`.
 */
import { formatEngineering } from "../analysis/quantities";
import { convertFromSI, parseQuantity } from "../units/quantity";
import { PROCESS_PROFILES } from "../rules/processes";
import { flagKey, reviewChecklist, STATUS_LABELS, type FlagDisposition, type ReviewStatus } from "../review/machine";
import { formatWaited } from "../review/describe";

/** What figures need of an analysis row (db/queries/reports ReportAnalysis). */
export interface FigureAnalysis {
  id: number;
  revisionId: number;
  status: "ok" | "failed";
  operatingPointName: string;
  conditions: Record<string, unknown>;
  maxInletPressurePa: number | null;
  totalFlowM3PerS: number | null;
  meanResidenceS: number | null;
  footprintM2: number | null;
  flagsInfo: number;
  flagsWarn: number;
  flagsBlock: number;
  createdAt: Date;
}

export interface FigureRevision {
  id: number;
  chipId: number;
  number: number;
  sha256: string;
  reviewState: string;
  reviewStateSince: Date;
  reviewAnalysisId: number | null;
  uploadedAt: Date;
}

export interface FigureFlag {
  code: string;
  severity: string;
  target: { kind: string; id: string | null };
  title: string;
  value: number | null;
}

export interface FigureDisposition {
  flagKey: string;
  decision: "waived" | "must_fix";
  justification: string | null;
  value: number | null;
  analysisId: number;
  at: Date;
}

const SEVERITY_ORDER: Record<string, number> = { block: 3, warn: 2, info: 1 };
export const SEVERITY_WORDS: Record<string, string> = { block: "Must change", warn: "Check", info: "Note" };

/**
 * The analysis that stands for a revision: the one under review (or cleared)
 * when it is set and succeeded; else the newest successful analysis with an
 * operating point; else the newest successful geometry-only one; else null.
 */
export function chooseReportAnalysis<A extends FigureAnalysis>(revision: Pick<FigureRevision, "id" | "reviewAnalysisId">, analyses: readonly A[]): A | null {
  const own = analyses.filter((a) => a.revisionId === revision.id && a.status === "ok");
  if (revision.reviewAnalysisId !== null) {
    const under = own.find((a) => a.id === revision.reviewAnalysisId);
    if (under) return under;
  }
  const newestFirst = [...own].sort((a, b) => b.id - a.id);
  return newestFirst.find((a) => a.totalFlowM3PerS !== null) ?? newestFirst[0] ?? null;
}

export interface PressureLimits {
  /** The pump's maximum, Pa gauge (threshold override first), or null when the operating point names none. */
  pumpMaxPa: number | null;
  /** The process bond's working limit, Pa gauge (the workspace's override first), or null without a process. */
  bondLimitPa: number | null;
  processLabel: string | null;
}

/**
 * The limits an analysis was judged against, read from its operating point's
 * conditions exactly as lib/rules/pressure.ts reads them (conditions.thresholds
 * overrides first). Unreadable values count as absent (never throws).
 */
export function pressureLimits(conditions: Record<string, unknown>): PressureLimits {
  const thresholds = (conditions.thresholds ?? {}) as Record<string, unknown>;
  const override = (code: string): number | null => {
    const v = thresholds[code];
    return typeof v === "number" && Number.isFinite(v) ? v : null;
  };
  let pumpMaxPa: number | null = null;
  const pump = conditions.pump as { max_pressure?: string | number } | undefined;
  if (pump?.max_pressure !== undefined) {
    try {
      pumpMaxPa = override("pump_pressure_max") ?? parseQuantity(pump.max_pressure, "pressure", "pump.max_pressure");
    } catch {
      pumpMaxPa = null;
    }
  }
  const processId = typeof conditions.process === "string" ? conditions.process : null;
  const profile = processId ? PROCESS_PROFILES[processId] : undefined;
  return {
    pumpMaxPa,
    bondLimitPa: profile ? (override("pressure_bond") ?? profile.maxWorkingPressurePa) : null,
    processLabel: profile?.label ?? null,
  };
}

/** Volume flow, m³/s → µL/min (mathjs conversion, lib/units). */
export function toMicrolitresPerMinute(flowM3PerS: number): number {
  return convertFromSI(flowM3PerS, "flow", "uL/min");
}

/** Pressure, Pa → mbar (mathjs conversion, lib/units). */
export function toMillibar(pressurePa: number): number {
  return convertFromSI(pressurePa, "pressure", "mbar");
}

/** "1 250 mbar"-style text (engineering precision, 3 figures) or "—". */
export function formatPressure(pressurePa: number | null | undefined): string {
  return typeof pressurePa === "number" && Number.isFinite(pressurePa) ? `${formatEngineering(toMillibar(pressurePa))} mbar` : "—";
}

export function formatFlow(flowM3PerS: number | null | undefined): string {
  return typeof flowM3PerS === "number" && Number.isFinite(flowM3PerS) ? `${formatEngineering(toMicrolitresPerMinute(Math.abs(flowM3PerS)))} µL/min` : "—";
}

/** Seconds below two minutes, minutes below two hours, hours above. */
export function formatDuration(seconds: number | null | undefined): string {
  if (typeof seconds !== "number" || !Number.isFinite(seconds)) return "—";
  if (seconds < 1) return `${formatEngineering(seconds * 1000)} ms`;
  if (seconds < 120) return `${formatEngineering(seconds)} s`;
  if (seconds < 7200) return `${formatEngineering(seconds / 60)} min`;
  return `${formatEngineering(seconds / 3600)} h`;
}

/** Square metres → mm² text. */
export function formatArea(areaM2: number | null | undefined): string {
  return typeof areaM2 === "number" && Number.isFinite(areaM2) ? `${formatEngineering(areaM2 * 1e6)} mm²` : "—";
}

/** Required pressure as a fraction of a limit (1 = at the limit), or null without both. */
export function limitRatio(pressurePa: number | null, limitPa: number | null): number | null {
  if (pressurePa === null || limitPa === null || !(limitPa > 0)) return null;
  return pressurePa / limitPa;
}

export type FlagStanding = "open" | "must_fix" | "waived" | "fixed";

export interface StandingFlag {
  flagKey: string;
  code: string;
  severity: string;
  title: string;
  target: { kind: string; id: string | null };
  value: number | null;
  standing: FlagStanding;
  disposition: FigureDisposition | null;
}

/**
 * Where each flag of `analysisId` stands against the revision's dispositions
 * (the latest per flag key counts, as in lib/review/machine reviewChecklist:
 * a waiver stops counting when a re-analysis moved the flag's value).
 * Dispositions whose flag is no longer raised are returned as "fixed".
 */
export function flagStandings(analysisId: number, flags: readonly FigureFlag[], dispositions: readonly FigureDisposition[]): StandingFlag[] {
  const latest = new Map<string, FigureDisposition>();
  for (const d of dispositions) latest.set(d.flagKey, d);
  const machineDispositions: FlagDisposition[] = [...latest.values()].map((d) => ({
    flagKey: d.flagKey,
    decision: d.decision,
    justification: d.justification,
    value: d.value,
    analysisId: String(d.analysisId),
    byMemberId: "",
    atIso: d.at.toISOString(),
  }));
  const byKey = new Map(flags.map((f) => [flagKey(f), f]));
  const checklist = reviewChecklist(
    { dispositions: machineDispositions },
    { id: String(analysisId), hasOperatingPoint: true, flags: flags.map((f) => ({ key: flagKey(f), code: f.code, severity: f.severity, value: f.value, title: f.title })) },
  );
  return checklist.map((item) => {
    const f = byKey.get(item.flagKey);
    const [code = "", kind = "", id = "*"] = item.flagKey.split("|");
    return {
      flagKey: item.flagKey,
      code: f?.code ?? code,
      severity: f?.severity ?? item.severity ?? "info",
      title: f?.title ?? code,
      target: f?.target ?? { kind, id: id === "*" ? null : id },
      value: f?.value ?? null,
      standing: item.status,
      disposition: latest.get(item.flagKey) ?? null,
    };
  });
}

/** The worst flag not waived (open or must-fix), or null when none remains. Ties: must-fix before open, then first raised. */
export function worstOpenFlag(standings: readonly StandingFlag[]): StandingFlag | null {
  let best: StandingFlag | null = null;
  for (const s of standings) {
    if (s.standing !== "open" && s.standing !== "must_fix") continue;
    const rank = SEVERITY_ORDER[s.severity] ?? 0;
    const bestRank = best ? (SEVERITY_ORDER[best.severity] ?? 0) : -1;
    if (rank > bestRank || (rank === bestRank && best && s.standing === "must_fix" && best.standing === "open")) best = s;
  }
  return best;
}

/** "port A", "segment s3", "the whole chip". */
export function describeTarget(target: { kind: string; id: string | null }): string {
  if (!target.id) return target.kind === "chip" || !target.kind ? "the whole chip" : target.kind;
  return `${target.kind} ${target.id}`;
}

export function stateLabel(state: string | null | undefined): string {
  return state && state in STATUS_LABELS ? STATUS_LABELS[state as ReviewStatus] : "No revision yet";
}

export interface PortfolioCard {
  chipId: number;
  name: string;
  purpose: string;
  revisionCount: number;
  current: null | {
    revisionId: number;
    number: number;
    sha256: string;
    state: string;
    stateLabel: string;
    stateSinceIso: string;
    /** "3 d 4 h" in that state. */
    inStateFor: string;
  };
  cleared: null | { atIso: string; fabName: string; process: string };
  analysis: null | {
    id: number;
    operatingPointName: string;
    requiredPressurePa: number | null;
    pumpMaxPa: number | null;
    bondLimitPa: number | null;
    processLabel: string | null;
    pumpRatio: number | null;
    bondRatio: number | null;
    throughputUlPerMin: number | null;
    residenceS: number | null;
  };
  worstOpen: null | { severity: string; title: string; where: string; standing: FlagStanding };
  openCount: number;
  waivedCount: number;
}

export interface PortfolioInput {
  chips: readonly { id: number; name: string; purpose: string }[];
  revisions: readonly FigureRevision[];
  analyses: readonly FigureAnalysis[];
  flagsByAnalysis: ReadonlyMap<number, readonly FigureFlag[]>;
  dispositions: readonly (FigureDisposition & { revisionId: number })[];
  clearances: ReadonlyMap<number, { at: Date; fabName: string; process: string }>;
}

/** The revision each chip's card reports on: its newest (by number). */
export function currentRevisions(revisions: readonly FigureRevision[]): Map<number, FigureRevision> {
  const out = new Map<number, FigureRevision>();
  for (const r of revisions) {
    const seen = out.get(r.chipId);
    if (!seen || r.number > seen.number) out.set(r.chipId, r);
  }
  return out;
}

/** One card per chip: current revision, its state and time in it, headline figures against limits, worst open flag. */
export function buildPortfolio(input: PortfolioInput, now: Date): PortfolioCard[] {
  const current = currentRevisions(input.revisions);
  const counts = new Map<number, number>();
  for (const r of input.revisions) counts.set(r.chipId, (counts.get(r.chipId) ?? 0) + 1);
  return input.chips.map((chip) => {
    const rev = current.get(chip.id) ?? null;
    const card: PortfolioCard = {
      chipId: chip.id,
      name: chip.name,
      purpose: chip.purpose,
      revisionCount: counts.get(chip.id) ?? 0,
      current: null,
      cleared: null,
      analysis: null,
      worstOpen: null,
      openCount: 0,
      waivedCount: 0,
    };
    if (!rev) return card;
    card.current = {
      revisionId: rev.id,
      number: rev.number,
      sha256: rev.sha256,
      state: rev.reviewState,
      stateLabel: stateLabel(rev.reviewState),
      stateSinceIso: rev.reviewStateSince.toISOString(),
      inStateFor: formatWaited(rev.reviewStateSince.getTime(), now.getTime()),
    };
    const clearance = input.clearances.get(rev.id);
    if (clearance && rev.reviewState === "cleared") card.cleared = { atIso: clearance.at.toISOString(), fabName: clearance.fabName, process: clearance.process };
    const a = chooseReportAnalysis(rev, input.analyses);
    if (!a) return card;
    const limits = pressureLimits(a.conditions);
    card.analysis = {
      id: a.id,
      operatingPointName: a.operatingPointName,
      requiredPressurePa: a.maxInletPressurePa,
      pumpMaxPa: limits.pumpMaxPa,
      bondLimitPa: limits.bondLimitPa,
      processLabel: limits.processLabel,
      pumpRatio: limitRatio(a.maxInletPressurePa, limits.pumpMaxPa),
      bondRatio: limitRatio(a.maxInletPressurePa, limits.bondLimitPa),
      throughputUlPerMin: a.totalFlowM3PerS === null ? null : toMicrolitresPerMinute(a.totalFlowM3PerS),
      residenceS: a.meanResidenceS,
    };
    const standings = flagStandings(
      a.id,
      input.flagsByAnalysis.get(a.id) ?? [],
      input.dispositions.filter((d) => d.revisionId === rev.id),
    );
    card.openCount = standings.filter((s) => s.standing === "open" || s.standing === "must_fix").length;
    card.waivedCount = standings.filter((s) => s.standing === "waived").length;
    const worst = worstOpenFlag(standings);
    if (worst) card.worstOpen = { severity: worst.severity, title: worst.title, where: describeTarget(worst.target), standing: worst.standing };
    return card;
  });
}

/** Review-state filter values the portfolio offers, plus "none" for chips without a revision. */
export const PORTFOLIO_STATE_FILTERS = ["draft", "with_fluidics", "with_fab", "changes_requested", "cleared", "withdrawn", "none"] as const;
export type PortfolioStateFilter = (typeof PORTFOLIO_STATE_FILTERS)[number];

/** Cards whose current state matches `state` (any when absent) and whose name contains `query` (case-insensitive). */
export function filterPortfolio(cards: readonly PortfolioCard[], filter: { state?: string | null; query?: string | null }): PortfolioCard[] {
  const q = (filter.query ?? "").trim().toLocaleLowerCase("en");
  const state = filter.state && (PORTFOLIO_STATE_FILTERS as readonly string[]).includes(filter.state) ? filter.state : null;
  return cards.filter((c) => {
    if (state === "none" ? c.current !== null : state !== null && c.current?.state !== state) return false;
    return q === "" || c.name.toLocaleLowerCase("en").includes(q);
  });
}

export interface TrendPoint {
  revisionNumber: number;
  revisionId: number;
  state: string;
  uploadedAtIso: string;
  analysisId: number | null;
  operatingPointName: string | null;
  requiredPressurePa: number | null;
  pumpMaxPa: number | null;
  bondLimitPa: number | null;
  flagsBlock: number;
  flagsWarn: number;
  flagsInfo: number;
  /** Flags of the reported analysis still open or must-fix. */
  openFlags: number;
  footprintM2: number | null;
}

/** One point per revision of a chip, oldest first, from the analysis that stands for each. */
export function buildTrend(
  revisions: readonly FigureRevision[],
  analyses: readonly FigureAnalysis[],
  flagsByAnalysis: ReadonlyMap<number, readonly FigureFlag[]>,
  dispositions: readonly (FigureDisposition & { revisionId: number })[],
): TrendPoint[] {
  return [...revisions]
    .sort((a, b) => a.number - b.number)
    .map((rev) => {
      const a = chooseReportAnalysis(rev, analyses);
      const limits = a ? pressureLimits(a.conditions) : { pumpMaxPa: null, bondLimitPa: null };
      const standings = a ? flagStandings(a.id, flagsByAnalysis.get(a.id) ?? [], dispositions.filter((d) => d.revisionId === rev.id)) : [];
      return {
        revisionNumber: rev.number,
        revisionId: rev.id,
        state: rev.reviewState,
        uploadedAtIso: rev.uploadedAt.toISOString(),
        analysisId: a?.id ?? null,
        operatingPointName: a?.operatingPointName ?? null,
        requiredPressurePa: a?.maxInletPressurePa ?? null,
        pumpMaxPa: limits.pumpMaxPa,
        bondLimitPa: limits.bondLimitPa,
        flagsBlock: a?.flagsBlock ?? 0,
        flagsWarn: a?.flagsWarn ?? 0,
        flagsInfo: a?.flagsInfo ?? 0,
        openFlags: standings.filter((s) => s.standing === "open" || s.standing === "must_fix").length,
        footprintM2: a?.footprintM2 ?? null,
      };
    });
}
