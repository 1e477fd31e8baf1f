import "server-only";
/**
 * Loads what the portfolio, the trends and the brief are built from, through
 * the scoped queries (db/queries), and hands it to the pure builders
 * (lib/reports/figures.ts, lib/reports/brief.ts). Callers have authorised the
 * member ("portfolio.view" / "report.view") or verified a share link.
 */
import * as chipsQ from "@/db/queries/chips";
import { listAuditEvents } from "@/db/queries/audit";
import * as reviewQ from "@/db/queries/review";
import * as q from "@/db/queries/reports";
import type { WorkspaceScope } from "@/db/queries/scope";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { NotFoundError } from "@/lib/errors";
import { buildBrief, type BriefInput, type BriefModel } from "./brief";
import { buildPortfolio, buildTrend, chooseReportAnalysis, currentRevisions, type PortfolioCard, type TrendPoint } from "./figures";

/** Every chip's portfolio card in the scope's workspace, by name. */
export async function loadPortfolio(scope: WorkspaceScope, now = new Date()): Promise<PortfolioCard[]> {
  const [chips, revisions] = await Promise.all([q.listReportChips(scope), q.listReportRevisions(scope)]);
  const current = [...currentRevisions(revisions).values()];
  const currentIds = current.map((r) => r.id);
  const [analyses, dispositions, clearances] = await Promise.all([
    q.listReportAnalyses(scope, currentIds),
    q.listReportDispositions(scope, currentIds),
    q.listReportClearances(scope, currentIds),
  ]);
  const chosen = current.map((r) => chooseReportAnalysis(r, analyses)).filter((a) => a !== null);
  const flagsByAnalysis = await q.listAnalysisFlags(scope, chosen.map((a) => a.id));
  return buildPortfolio({ chips, revisions, analyses, flagsByAnalysis, dispositions, clearances }, now);
}

/**
 * One chip's revisions as trend points, oldest first.
 * @throws NotFoundError when the chip is not in the scope's workspace.
 */
export async function loadTrend(scope: WorkspaceScope, chipId: number): Promise<{ chip: q.ReportChip; points: TrendPoint[] }> {
  const [chip] = await q.listReportChips(scope, chipId);
  if (!chip) throw new NotFoundError("That chip does not exist in this workspace.");
  const revisions = await q.listReportRevisions(scope, chipId);
  const ids = revisions.map((r) => r.id);
  const [analyses, dispositions] = await Promise.all([q.listReportAnalyses(scope, ids), q.listReportDispositions(scope, ids)]);
  const chosen = revisions.map((r) => chooseReportAnalysis(r, analyses)).filter((a) => a !== null);
  const flagsByAnalysis = await q.listAnalysisFlags(scope, chosen.map((a) => a.id));
  return { chip, points: buildTrend(revisions, analyses, flagsByAnalysis, dispositions) };
}

/**
 * The rows one revision's brief is built from.
 * @throws NotFoundError when the revision (or its chip) is not in the scope's workspace.
 */
export async function loadBriefInput(scope: WorkspaceScope, workspaceName: string, revisionId: number): Promise<BriefInput> {
  const revision = await chipsQ.getRevisionById(scope, revisionId);
  if (!revision) throw new NotFoundError("That revision does not exist in this workspace.");
  const chip = await chipsQ.getChip(scope, revision.chipId);
  if (!chip) throw new NotFoundError("That revision's chip does not exist in this workspace.");
  const [analyses, dispositions, clearance, events, uploaderName] = await Promise.all([
    q.listReportAnalyses(scope, [revision.id]),
    reviewQ.listDispositionHistory(scope, revision.id),
    reviewQ.getClearance(scope, revision.id),
    listAuditEvents(scope, { objectType: "revision", objectId: revision.id, limit: 10000 }),
    q.getRevisionUploaderName(scope, revision.id),
  ]);
  const chosen = chooseReportAnalysis(revision, analyses);
  const detail = chosen ? await chipsQ.getAnalysis(scope, chosen.id) : null;
  return {
    workspaceName,
    chip: { id: chip.id, name: chip.name, purpose: chip.purpose },
    revision: {
      id: revision.id,
      number: revision.number,
      fileName: revision.fileName,
      sha256: revision.sha256,
      uploadedAt: revision.uploadedAt,
      uploaderName,
      note: revision.note,
      reviewState: revision.reviewState,
      reviewStateSince: revision.reviewStateSince,
    },
    analysis:
      detail && detail.result
        ? {
            id: detail.id,
            operatingPointName: detail.operatingPointName,
            createdAt: detail.createdAt,
            underReview: revision.reviewAnalysisId === detail.id,
            conditions: detail.conditions,
            doc: detail.result as unknown as AnalyzeJson,
          }
        : null,
    dispositions: dispositions.map((d) => ({
      flagKey: d.flagKey,
      decision: d.decision,
      justification: d.justification,
      value: d.value,
      analysisId: d.analysisId,
      at: d.at,
      byName: d.byName,
    })),
    clearance: clearance
      ? { byName: clearance.byName, at: clearance.at, fabName: clearance.fabName, process: clearance.process, fileSha256: clearance.fileSha256, analysisId: clearance.analysisId }
      : null,
    history: [...events].reverse().map((e) => ({ at: e.at, actor: e.actor, action: e.action, details: e.details })),
  };
}

/** The brief of one revision, generated now. @throws NotFoundError as loadBriefInput. */
export async function loadBrief(scope: WorkspaceScope, workspaceName: string, revisionId: number, now = new Date()): Promise<BriefModel> {
  return buildBrief(await loadBriefInput(scope, workspaceName, revisionId), now);
}

/** A file name for the brief's PDF: "brief-droplet-generator-dg-1-rev2.pdf". */
export function briefFileName(chipName: string, revisionNumber: number): string {
  const slug = chipName
    .normalize("NFKD")
    .replace(/[^\w\s-]/g, "")
    .trim()
    .toLowerCase()
    .replace(/[\s_]+/g, "-")
    .replace(/-+/g, "-")
    .slice(0, 60);
  return `brief-${slug || "chip"}-rev${revisionNumber}.pdf`;
}
