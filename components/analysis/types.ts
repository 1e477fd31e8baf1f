/**
 * Props and shared state of the analysis view. The page (a server component)
 * passes one small typed prop: the analyze document, the user's unit
 * preferences and the labels; comparing is offered as links (hrefs), because
 * a server component cannot hand functions to the client.
 */
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import type { UnitPreferences } from "@/lib/analysis/quantities";

/** Per-user display units (validated by lib/analysis/unit-preferences.ts); values stay SI everywhere else. */
export type { UnitPreferences };

/** Labels of what is being shown, already resolved by the page. */
export interface AnalysisLabels {
  chip: string;
  revision: string;
  /** Name of the operating point (conditions set), when there are several. */
  operatingPoint?: string;
}

/** Pressure limits the port summary compares against, SI. Either may be unknown. */
export interface PressureLimits {
  /** The pump or controller's maximum output (conditions.pump.max_pressure). */
  pumpMaxPa?: number;
  /** The process's working-pressure limit (bond strength with margin). */
  processMaxPa?: number;
  processName?: string;
}

/** Another revision or operating point to compare with. */
export interface CompareTarget {
  analysis: AnalyzeJson;
  labels: AnalysisLabels;
}

export interface AnalysisWorkbenchProps {
  analysis: AnalyzeJson;
  labels: AnalysisLabels;
  /** The member's stored unit choices; missing families take the catalogue's defaults. */
  units?: UnitPreferences;
  limits?: PressureLimits;
  /** The other side of a comparison, when the page was opened with one (e.g. ?compare=3). */
  compare?: CompareTarget | null;
  /** Links to open this view compared with another revision or operating point. */
  compareLinks?: { label: string; href: string }[];
  /** Link that closes the comparison. */
  closeCompareHref?: string;
  /** Server action that stores a changed unit preference for the user. */
  saveUnitsAction?: (units: UnitPreferences) => Promise<void>;
  /** File name stem for CSV downloads, e.g. "bb-204-rev-b". */
  exportName?: string;
  /** Segment selected when the page opens (e.g. from ?segment=s7 or a flag's link). */
  initialSegmentId?: string | null;
}

/** The shared selection: one segment (or port) at a time. */
export type Selection = { kind: "segment" | "port"; id: string } | null;

export type Severity = "info" | "warn" | "block";
export const SEVERITY_ORDER: Severity[] = ["block", "warn", "info"];
export const SEVERITY_LABEL: Record<Severity, string> = { block: "Must change", warn: "Check", info: "Note" };

export function asSeverity(s: string): Severity {
  return s === "block" || s === "warn" ? s : "info";
}
