/**
 * Plain words for audit events of a revision and for how long something has
 * waited, for the history page, the review screen and the queue. Pure.
 */
import { RULES } from "../rules/registry";
import { STATUS_LABELS, type ReviewStatus } from "./machine";

const SEVERITY_WORDS: Record<string, string> = { block: "blocking", warn: "warning", info: "note" };
const severityWord = (v: unknown): string => SEVERITY_WORDS[String(v)] ?? String(v ?? "");

const RULE_TITLES = new Map(RULES.map((r) => [r.code, r.title]));

/** "Pump cannot reach this pressure (port A)" for the flag key "pump_pressure_max|port|A". */
export function describeFlagKey(flagKey: string): string {
  const [code = "", kind = "", id = "*"] = flagKey.split("|");
  const where = id === "*" ? kind : `${kind} ${id}`;
  return `${RULE_TITLES.get(code) ?? code}${where ? ` (${where})` : ""}`;
}

const str = (v: unknown): string | null => (typeof v === "string" && v.trim() !== "" ? v.trim() : null);
const label = (v: unknown): string => (typeof v === "string" && v in STATUS_LABELS ? STATUS_LABELS[v as ReviewStatus] : String(v ?? "—"));

/** One sentence saying what an audit event recorded (the actor's name is shown beside it). */
export function describeAuditEvent(action: string, details: Record<string, unknown>): string {
  const note = str(details.note) ?? str(details.reason) ?? str(details.justification);
  const withNote = (s: string) => (note ? `${s} — “${note.length > 300 ? `${note.slice(0, 300)}…` : note}”` : s);
  switch (action) {
    case "revision.uploaded":
      return `Uploaded ${str(details.fileName) ?? "the file"} (SHA-256 ${String(details.sha256 ?? "").slice(0, 12)}…).`;
    case "revision.layers_mapped":
      return "Mapped the layers.";
    case "analysis.completed":
      return `Analysed operating point “${str(details.name) ?? "?"}” (analysis ${String(details.analysisId ?? "?")}).`;
    case "analysis.failed":
      return `Analysis of “${str(details.name) ?? "?"}” failed (${String(details.code ?? "error")}).`;
    case "review.submitted":
      return withNote(`${details.resubmitted ? "Resubmitted" : "Submitted"} for review with analysis ${String(details.analysisId ?? "?")}: ${label(details.from)} → ${label(details.to)}`);
    case "review.analysis_updated":
      return withNote(`Put analysis ${String(details.analysisId ?? "?")} under review in place of ${String(details.previousAnalysisId ?? "?")}`);
    case "review.flag_waived":
      return withNote(`Waived the ${severityWord(details.severity)} flag “${describeFlagKey(String(details.flagKey ?? ""))}”`);
    case "review.flag_must_fix":
      return withNote(`Marked the ${severityWord(details.severity)} flag “${describeFlagKey(String(details.flagKey ?? ""))}” must-fix`);
    case "review.fluidics_passed":
      return withNote(`Passed the fluidics review: ${label(details.from)} → ${label(details.to)}`);
    case "review.changes_requested":
      return withNote(`Requested changes at ${details.stage === "fab" ? "fab" : "fluidics"} review: ${label(details.from)} → ${label(details.to)}`);
    case "review.cleared":
      return `Cleared for tape-out at ${str(details.fabName) ?? "?"}, process ${str(details.process) ?? "?"}; file SHA-256 ${String(details.fileSha256 ?? "").slice(0, 12)}…, analysis ${String(details.analysisId ?? "?")}.`;
    case "review.withdrawn":
      return withNote("Withdrew the revision");
    case "review.signature_failed":
      return "A clearance signature was refused (wrong password).";
    case "review.commented":
      return details.parentId ? "Replied to a comment." : `Commented${details.segmentId ? ` on segment ${String(details.segmentId)}` : details.point ? " on a point of the drawing" : ""}.`;
    case "review.comment_resolved":
      return "Marked a comment resolved.";
    case "review.comment_reopened":
      return "Opened a comment again.";
    default:
      return action;
  }
}

/** "45 min", "3 h 20 min", "4 d 2 h": how long since `since`, coarse enough to read at a glance. */
export function formatWaited(sinceMs: number, nowMs: number): string {
  const minutes = Math.max(0, Math.floor((nowMs - sinceMs) / 60000));
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return `${hours} h ${minutes % 60} min`;
  const days = Math.floor(hours / 24);
  return `${days} d ${hours % 24} h`;
}
