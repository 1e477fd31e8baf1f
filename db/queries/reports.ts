import "server-only";
/**
 * Reads behind the lead's portfolio, the trends and the brief, and the share
 * links' rows — always within a workspace scope, except the two unscoped
 * lookups that reveal nothing but a workspace id or one link's row by its
 * token hash. Analyses are read without their full result JSON here; only the
 * flags are extracted (json_extract) where a figure needs them.
 */
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { users } from "@/db/schema";
import { analyses, chips, operatingPoints, revisions } from "@/db/schema-chips";
import { clearances, flagDispositions } from "@/db/schema-review";
import { shareLinks, type ShareLinkRow } from "@/db/schema-reports";
import { inWorkspace, type WorkspaceScope } from "./scope";

export type ReportChip = { id: number; name: string; purpose: string; lastActivityAt: Date };
export type ReportRevision = {
  id: number;
  chipId: number;
  number: number;
  sha256: string;
  fileName: string;
  uploadedAt: Date;
  reviewState: string;
  reviewStateSince: Date;
  reviewAnalysisId: number | null;
};
export type ReportAnalysis = {
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
  worstSeverity: string | null;
  createdAt: Date;
};
export type ReportFlag = { code: string; severity: string; target: { kind: string; id: string | null }; title: string; value: number | null };
export type ReportDisposition = { revisionId: number; flagKey: string; decision: "waived" | "must_fix"; justification: string | null; value: number | null; analysisId: number; at: Date };

export async function listReportChips(scope: WorkspaceScope, chipId?: number): Promise<ReportChip[]> {
  const where = chipId === undefined ? inWorkspace(scope, chips.workspaceId) : and(inWorkspace(scope, chips.workspaceId), eq(chips.id, chipId));
  return getDb()
    .select({ id: chips.id, name: chips.name, purpose: chips.purpose, lastActivityAt: chips.lastActivityAt })
    .from(chips)
    .where(where)
    .orderBy(asc(chips.name));
}

/** Revisions of the workspace (or of one chip), oldest first per chip. */
export async function listReportRevisions(scope: WorkspaceScope, chipId?: number): Promise<ReportRevision[]> {
  const where = chipId === undefined ? inWorkspace(scope, revisions.workspaceId) : and(inWorkspace(scope, revisions.workspaceId), eq(revisions.chipId, chipId));
  return getDb()
    .select({
      id: revisions.id,
      chipId: revisions.chipId,
      number: revisions.number,
      sha256: revisions.sha256,
      fileName: revisions.fileName,
      uploadedAt: revisions.uploadedAt,
      reviewState: revisions.reviewState,
      reviewStateSince: revisions.reviewStateSince,
      reviewAnalysisId: revisions.reviewAnalysisId,
    })
    .from(revisions)
    .where(where)
    .orderBy(asc(revisions.chipId), asc(revisions.number));
}

/** Analyses of these revisions with their summary figures and operating point (no result JSON), oldest first. */
export async function listReportAnalyses(scope: WorkspaceScope, revisionIds: number[]): Promise<ReportAnalysis[]> {
  if (revisionIds.length === 0) return [];
  return getDb()
    .select({
      id: analyses.id,
      revisionId: analyses.revisionId,
      status: analyses.status,
      operatingPointName: operatingPoints.name,
      conditions: operatingPoints.conditions,
      maxInletPressurePa: analyses.maxInletPressurePa,
      totalFlowM3PerS: analyses.totalFlowM3PerS,
      meanResidenceS: analyses.meanResidenceS,
      footprintM2: analyses.footprintM2,
      flagsInfo: analyses.flagsInfo,
      flagsWarn: analyses.flagsWarn,
      flagsBlock: analyses.flagsBlock,
      worstSeverity: analyses.worstSeverity,
      createdAt: analyses.createdAt,
    })
    .from(analyses)
    .innerJoin(operatingPoints, eq(operatingPoints.id, analyses.operatingPointId))
    .where(and(inWorkspace(scope, analyses.workspaceId), inArray(analyses.revisionId, revisionIds)))
    .orderBy(asc(analyses.id));
}

/** Only the flags of these analyses (extracted from the stored result), by analysis id. */
export async function listAnalysisFlags(scope: WorkspaceScope, analysisIds: number[]): Promise<Map<number, ReportFlag[]>> {
  const out = new Map<number, ReportFlag[]>();
  if (analysisIds.length === 0) return out;
  const rows = await getDb()
    .select({ id: analyses.id, flags: sql<string | null>`json_extract(${analyses.result}, '$.flags')` })
    .from(analyses)
    .where(and(inWorkspace(scope, analyses.workspaceId), inArray(analyses.id, analysisIds)));
  for (const r of rows) {
    const parsed = r.flags ? (JSON.parse(r.flags) as ReportFlag[]) : [];
    out.set(r.id, Array.isArray(parsed) ? parsed : []);
  }
  return out;
}

/** Every disposition of these revisions, oldest first (the latest per flag key counts). */
export async function listReportDispositions(scope: WorkspaceScope, revisionIds: number[]): Promise<ReportDisposition[]> {
  if (revisionIds.length === 0) return [];
  return getDb()
    .select({
      revisionId: flagDispositions.revisionId,
      flagKey: flagDispositions.flagKey,
      decision: flagDispositions.decision,
      justification: flagDispositions.justification,
      value: flagDispositions.value,
      analysisId: flagDispositions.analysisId,
      at: flagDispositions.at,
    })
    .from(flagDispositions)
    .where(and(inWorkspace(scope, flagDispositions.workspaceId), inArray(flagDispositions.revisionId, revisionIds)))
    .orderBy(asc(flagDispositions.id));
}

/** Revision ids of these that hold a clearance, with when. */
export async function listReportClearances(scope: WorkspaceScope, revisionIds: number[]): Promise<Map<number, { at: Date; fabName: string; process: string }>> {
  const out = new Map<number, { at: Date; fabName: string; process: string }>();
  if (revisionIds.length === 0) return out;
  const rows = await getDb()
    .select({ revisionId: clearances.revisionId, at: clearances.at, fabName: clearances.fabName, process: clearances.process })
    .from(clearances)
    .where(and(inWorkspace(scope, clearances.workspaceId), inArray(clearances.revisionId, revisionIds)));
  for (const r of rows) out.set(r.revisionId, { at: r.at, fabName: r.fabName, process: r.process });
  return out;
}

/** The uploader's name of a revision (null when the account is gone). */
export async function getRevisionUploaderName(scope: WorkspaceScope, revisionId: number): Promise<string | null> {
  const rows = await getDb()
    .select({ name: users.name })
    .from(revisions)
    .leftJoin(users, eq(users.id, revisions.uploadedByUserId))
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.id, revisionId)))
    .limit(1);
  return rows[0]?.name ?? null;
}

// ── Share links ────────────────────────────────────────────────────────────

/** Unscoped lookup of a share link's workspace, for requireAccessTo (reveals nothing else). */
export async function locateShareLink(id: number): Promise<{ workspaceId: number; revisionId: number } | null> {
  const rows = await getDb().select({ workspaceId: shareLinks.workspaceId, revisionId: shareLinks.revisionId }).from(shareLinks).where(eq(shareLinks.id, id)).limit(1);
  return rows[0] ?? null;
}

/** Unscoped: the link whose token hashes to `tokenHash` (the public share page's only way in), or null. */
export async function findShareLinkByTokenHash(tokenHash: string): Promise<ShareLinkRow | null> {
  const rows = await getDb().select().from(shareLinks).where(eq(shareLinks.tokenHash, tokenHash)).limit(1);
  return rows[0] ?? null;
}

export async function insertShareLink(
  scope: WorkspaceScope,
  values: { revisionId: number; tokenHash: string; prefix: string; label: string; expiresAt: Date; createdAt: Date },
): Promise<ShareLinkRow> {
  const [row] = await getDb()
    .insert(shareLinks)
    .values({ ...values, workspaceId: scope.workspaceId, createdByUserId: scope.userId })
    .returning();
  return row;
}

export type ShareLinkListItem = Omit<ShareLinkRow, "tokenHash"> & { createdByName: string | null };

/** A revision's share links, newest first, without their hashes. */
export async function listShareLinks(scope: WorkspaceScope, revisionId: number): Promise<ShareLinkListItem[]> {
  return getDb()
    .select({
      id: shareLinks.id,
      workspaceId: shareLinks.workspaceId,
      revisionId: shareLinks.revisionId,
      prefix: shareLinks.prefix,
      label: shareLinks.label,
      createdByUserId: shareLinks.createdByUserId,
      createdAt: shareLinks.createdAt,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
      revokedByUserId: shareLinks.revokedByUserId,
      createdByName: users.name,
    })
    .from(shareLinks)
    .leftJoin(users, eq(users.id, shareLinks.createdByUserId))
    .where(and(inWorkspace(scope, shareLinks.workspaceId), eq(shareLinks.revisionId, revisionId)))
    .orderBy(desc(shareLinks.id));
}

export async function getShareLink(scope: WorkspaceScope, id: number): Promise<ShareLinkRow | null> {
  const rows = await getDb()
    .select()
    .from(shareLinks)
    .where(and(inWorkspace(scope, shareLinks.workspaceId), eq(shareLinks.id, id)))
    .limit(1);
  return rows[0] ?? null;
}

/** Marks the link revoked unless it already is; true when this call revoked it. */
export async function revokeShareLinkRow(scope: WorkspaceScope, id: number, at: Date): Promise<boolean> {
  const result = await getDb()
    .update(shareLinks)
    .set({ revokedAt: at, revokedByUserId: scope.userId })
    .where(and(inWorkspace(scope, shareLinks.workspaceId), eq(shareLinks.id, id), sql`${shareLinks.revokedAt} is null`));
  return result.rowsAffected === 1;
}
