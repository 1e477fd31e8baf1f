// The lead's portfolio figures (lib/reports/figures.ts). Unit conversions are checked against
// their SI definitions (BIPM SI Brochure, 9th ed.: 1 L = 1e-3 m³, 1 bar = 1e5 Pa); the PDMS
// bond limit against the process profile it comes from (lib/rules/processes.ts); which flags
// count as open follows the review rules of issue 7 (a waiver counts while the flag's value is
// unchanged; must-fix stays open) as implemented by lib/review/machine reviewChecklist.
import { describe, expect, it } from "vitest";
import { PROCESS_PROFILES } from "@/lib/rules/processes";
import {
  buildPortfolio,
  buildTrend,
  chooseReportAnalysis,
  filterPortfolio,
  flagStandings,
  formatDuration,
  formatPressure,
  limitRatio,
  pressureLimits,
  toMicrolitresPerMinute,
  toMillibar,
  worstOpenFlag,
  type FigureAnalysis,
  type FigureFlag,
  type FigureRevision,
} from "@/lib/reports/figures";

const T0 = new Date("2026-11-20T08:00:00Z");
const hours = (h: number) => new Date(T0.getTime() + h * 3600e3);

function analysis(over: Partial<FigureAnalysis> & Pick<FigureAnalysis, "id" | "revisionId">): FigureAnalysis {
  return {
    status: "ok",
    operatingPointName: `op ${over.id}`,
    conditions: { pump: { max_pressure: "2 bar" }, process: "pdms_soft_lithography" },
    maxInletPressurePa: 1e5,
    totalFlowM3PerS: 1e-9 / 60,
    meanResidenceS: 3,
    footprintM2: 2e-4,
    flagsInfo: 0,
    flagsWarn: 0,
    flagsBlock: 0,
    createdAt: T0,
    ...over,
  };
}

function revision(over: Partial<FigureRevision> & Pick<FigureRevision, "id" | "chipId" | "number">): FigureRevision {
  return { sha256: "a".repeat(64), reviewState: "draft", reviewStateSince: T0, reviewAnalysisId: null, uploadedAt: T0, ...over };
}

const flag = (code: string, severity: string, id: string, value: number | null): FigureFlag => ({ code, severity, target: { kind: "port", id }, title: `${code} title`, value });
const waiver = (flagKey: string, value: number | null, at = T0) => ({ flagKey, decision: "waived" as const, justification: "Accepted for the bench run behind a shield.", value, analysisId: 1, at });

describe("units for the lead", () => {
  it("converts flow to µL/min and pressure to mbar by the SI definitions", () => {
    // 1 µL/min = 1e-9 m³ / 60 s (BIPM: 1 L = 1e-3 m³).
    expect(toMicrolitresPerMinute(1e-9 / 60)).toBeCloseTo(1, 12);
    expect(toMicrolitresPerMinute(2000e-9 / 60)).toBeCloseTo(2000, 9);
    // 1 mbar = 100 Pa (BIPM: 1 bar = 1e5 Pa).
    expect(toMillibar(100)).toBeCloseTo(1, 12);
    expect(formatPressure(289_600)).toBe("2896 mbar");
    expect(formatPressure(null)).toBe("—");
  });

  it("says durations in the unit a reader expects", () => {
    expect(formatDuration(0.00217)).toBe("2.17 ms");
    expect(formatDuration(45)).toBe("45.0 s");
    expect(formatDuration(600)).toBe("10.0 min"); // 600 s = 10 min
    expect(formatDuration(3 * 3600)).toBe("3.00 h");
    expect(formatDuration(Number.POSITIVE_INFINITY)).toBe("—");
  });
});

describe("pressureLimits and limitRatio", () => {
  it("reads the pump maximum and the process bond limit as the pressure rules do, overrides first", () => {
    const plain = pressureLimits({ pump: { max_pressure: "2 bar" }, process: "pdms_soft_lithography" });
    expect(plain.pumpMaxPa).toBeCloseTo(2e5, 6); // 2 bar = 2e5 Pa
    expect(plain.bondLimitPa).toBe(PROCESS_PROFILES.pdms_soft_lithography.maxWorkingPressurePa);
    expect(plain.processLabel).toBe(PROCESS_PROFILES.pdms_soft_lithography.label);
    const overridden = pressureLimits({ pump: { max_pressure: "2 bar" }, process: "pdms_soft_lithography", thresholds: { pump_pressure_max: 3e5, pressure_bond: 1.5e5 } });
    expect(overridden.pumpMaxPa).toBe(3e5);
    expect(overridden.bondLimitPa).toBe(1.5e5);
  });

  it("treats a missing process, an unknown one or an unreadable pump value as no limit", () => {
    expect(pressureLimits({})).toEqual({ pumpMaxPa: null, bondLimitPa: null, processLabel: null });
    expect(pressureLimits({ process: "no_such_process", pump: { max_pressure: "lots" } })).toEqual({ pumpMaxPa: null, bondLimitPa: null, processLabel: null });
  });

  it("gives the fraction of the limit used", () => {
    expect(limitRatio(290e3, 200e3)).toBeCloseTo(1.45, 12);
    expect(limitRatio(null, 200e3)).toBeNull();
    expect(limitRatio(1, 0)).toBeNull();
  });
});

describe("chooseReportAnalysis", () => {
  it("prefers the analysis under review, then the newest with an operating point, then geometry only; failures never count", () => {
    const rev = revision({ id: 1, chipId: 1, number: 1 });
    const geometry = analysis({ id: 5, revisionId: 1, totalFlowM3PerS: null });
    const older = analysis({ id: 2, revisionId: 1 });
    const failed = analysis({ id: 7, revisionId: 1, status: "failed" });
    const other = analysis({ id: 9, revisionId: 2 });
    expect(chooseReportAnalysis(rev, [older, geometry, failed, other])?.id).toBe(2);
    expect(chooseReportAnalysis({ ...rev, reviewAnalysisId: 5 }, [older, geometry])?.id).toBe(5);
    expect(chooseReportAnalysis({ ...rev, reviewAnalysisId: 7 }, [older, failed])?.id).toBe(2);
    expect(chooseReportAnalysis(rev, [geometry])?.id).toBe(5);
    expect(chooseReportAnalysis(rev, [failed, other])).toBeNull();
  });
});

describe("flag standings and the worst open flag", () => {
  const flags = [flag("pump_pressure_max", "block", "A", 290e3), flag("pressure_bond", "block", "A", 290e3), flag("reynolds_high", "warn", "A", 498)];

  it("a waived block flag no longer counts; the worst open one is the other block flag", () => {
    const s = flagStandings(1, flags, [waiver("pump_pressure_max|port|A", 290e3)]);
    expect(s.map((x) => x.standing)).toEqual(["waived", "open", "open"]);
    expect(worstOpenFlag(s)?.code).toBe("pressure_bond");
  });

  it("with both block flags waived, the worst open flag is the warning", () => {
    const s = flagStandings(1, flags, [waiver("pump_pressure_max|port|A", 290e3), waiver("pressure_bond|port|A", 290e3)]);
    expect(worstOpenFlag(s)?.code).toBe("reynolds_high");
  });

  it("a waiver stops counting when a re-analysis moved the flag's value", () => {
    const s = flagStandings(1, flags, [waiver("pump_pressure_max|port|A", 250e3)]);
    expect(s[0].standing).toBe("open");
  });

  it("must-fix stays open and ranks before an open flag of the same severity; the latest decision per flag counts", () => {
    const mustFix = { flagKey: "pressure_bond|port|A", decision: "must_fix" as const, justification: null, value: 290e3, analysisId: 1, at: hours(1) };
    const s = flagStandings(1, flags, [waiver("pressure_bond|port|A", 290e3), mustFix]);
    expect(s[1].standing).toBe("must_fix");
    expect(worstOpenFlag(s)?.code).toBe("pressure_bond");
  });

  it("a disposed flag the analysis no longer raises is fixed, and nothing open remains", () => {
    const s = flagStandings(2, [], [waiver("pump_pressure_max|port|A", 290e3)]);
    expect(s).toHaveLength(1);
    expect(s[0]).toMatchObject({ standing: "fixed", code: "pump_pressure_max", target: { kind: "port", id: "A" } });
    expect(worstOpenFlag(s)).toBeNull();
  });
});

describe("buildPortfolio", () => {
  const chips = [
    { id: 1, name: "Droplet generator DG-1", purpose: "Droplets" },
    { id: 2, name: "Serpentine mixer SM-2", purpose: "Mixing" },
    { id: 3, name: "Empty chip", purpose: "" },
  ];
  const revisions = [
    revision({ id: 10, chipId: 1, number: 1, reviewState: "withdrawn" }),
    revision({ id: 11, chipId: 1, number: 2, reviewState: "cleared", reviewStateSince: hours(0), reviewAnalysisId: 21 }),
    revision({ id: 12, chipId: 2, number: 1, reviewState: "with_fluidics", reviewStateSince: hours(-51), reviewAnalysisId: 22 }),
  ];
  const analyses = [
    analysis({ id: 20, revisionId: 10, maxInletPressurePa: 9e5 }),
    analysis({ id: 21, revisionId: 11, maxInletPressurePa: 1.5e5, totalFlowM3PerS: 12e-9 / 60, meanResidenceS: 0.5, flagsWarn: 1 }),
    analysis({ id: 22, revisionId: 12, maxInletPressurePa: 2.9e5, flagsBlock: 2 }),
  ];
  const flagsByAnalysis = new Map<number, FigureFlag[]>([
    [21, [flag("reynolds_high", "warn", "s1", 40)]],
    [22, [flag("pump_pressure_max", "block", "A", 2.9e5), flag("pressure_bond", "block", "A", 2.9e5)]],
  ]);
  const dispositions = [{ ...waiver("pump_pressure_max|port|A", 2.9e5), revisionId: 12 }];
  const clearances = new Map([[11, { at: hours(0), fabName: "Kestrel Foundry (invented)", process: "PDMS" }]]);
  const now = hours(2);
  const cards = buildPortfolio({ chips, revisions, analyses, flagsByAnalysis, dispositions, clearances }, now);

  it("reports each chip's newest revision, its state and how long it has been there", () => {
    const [dg, sm, empty] = cards;
    expect(dg.current).toMatchObject({ number: 2, state: "cleared", stateLabel: "Cleared for tape-out", inStateFor: "2 h 0 min" });
    expect(dg.revisionCount).toBe(2);
    expect(sm.current?.inStateFor).toBe("2 d 5 h"); // 53 h
    expect(empty.current).toBeNull();
    expect(empty.analysis).toBeNull();
  });

  it("marks cleared only a cleared revision with its signature", () => {
    expect(cards[0].cleared).toMatchObject({ fabName: "Kestrel Foundry (invented)" });
    expect(cards[1].cleared).toBeNull();
  });

  it("gives the required pressure against the pump (2 bar) and the PDMS bond, throughput in µL/min and residence", () => {
    const a = cards[1].analysis!;
    expect(a.requiredPressurePa).toBe(2.9e5);
    expect(a.pumpRatio).toBeCloseTo(2.9e5 / 2e5, 9);
    expect(a.bondRatio).toBeCloseTo(2.9e5 / PROCESS_PROFILES.pdms_soft_lithography.maxWorkingPressurePa, 9);
    expect(cards[0].analysis!.throughputUlPerMin).toBeCloseTo(12, 9);
    expect(cards[0].analysis!.residenceS).toBe(0.5);
  });

  it("names the worst flag not waived, with the open and waived counts", () => {
    expect(cards[1].worstOpen).toEqual({ severity: "block", title: "pressure_bond title", where: "port A", standing: "open" });
    expect(cards[1].openCount).toBe(1);
    expect(cards[1].waivedCount).toBe(1);
    expect(cards[0].worstOpen?.severity).toBe("warn");
  });

  it("filters by state and by name, case-insensitively; an unknown state filters nothing", () => {
    expect(filterPortfolio(cards, { state: "cleared" }).map((c) => c.chipId)).toEqual([1]);
    expect(filterPortfolio(cards, { state: "none" }).map((c) => c.chipId)).toEqual([3]);
    expect(filterPortfolio(cards, { query: "  MIXER " }).map((c) => c.chipId)).toEqual([2]);
    expect(filterPortfolio(cards, { state: "with_fluidics", query: "droplet" })).toEqual([]);
    expect(filterPortfolio(cards, { state: "bogus" })).toHaveLength(3);
  });
});

describe("buildTrend", () => {
  it("gives one point per revision, oldest first, with pressure, limits, flag counts, open flags and footprint", () => {
    const revisions = [revision({ id: 2, chipId: 1, number: 2, reviewAnalysisId: 31 }), revision({ id: 1, chipId: 1, number: 1 }), revision({ id: 3, chipId: 1, number: 3 })];
    const analyses = [analysis({ id: 30, revisionId: 1, maxInletPressurePa: 3e5, flagsBlock: 2, footprintM2: 2e-4 }), analysis({ id: 31, revisionId: 2, maxInletPressurePa: 1e5, flagsWarn: 1, footprintM2: 1.5e-4 })];
    const flags = new Map<number, FigureFlag[]>([
      [30, [flag("pump_pressure_max", "block", "A", 3e5), flag("pressure_bond", "block", "A", 3e5)]],
      [31, [flag("reynolds_high", "warn", "s1", 40)]],
    ]);
    const points = buildTrend(revisions, analyses, flags, [{ ...waiver("pressure_bond|port|A", 3e5), revisionId: 1 }]);
    expect(points.map((p) => p.revisionNumber)).toEqual([1, 2, 3]);
    expect(points[0]).toMatchObject({ requiredPressurePa: 3e5, flagsBlock: 2, openFlags: 1, footprintM2: 2e-4 });
    expect(points[0].pumpMaxPa).toBeCloseTo(2e5, 6);
    expect(points[1]).toMatchObject({ requiredPressurePa: 1e5, flagsWarn: 1, openFlags: 1 });
    expect(points[2]).toMatchObject({ analysisId: null, requiredPressurePa: null, openFlags: 0 });
  });
});
