import "server-only";
/**
 * Chips, revisions, layer maps, operating points and analyses — always within
 * a workspace scope. Writes happen inside the caller's transaction so an upload
 * or an analysis is stored whole or not at all.
 */
import { and, asc, desc, eq, inArray, max, sql } from "drizzle-orm";
import { getDb, type Db } from "@/db";
import { users } from "@/db/schema";
import { analyses, chips, layerMaps, operatingPoints, revisions, type AnalysisRow, type ChipRow, type RevisionRow } from "@/db/schema-chips";
import { inWorkspace, type WorkspaceScope } from "./scope";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type Conn = Tx | Db;

/** Unscoped lookup of a chip's workspace, for requireAccessTo (reveals nothing else). */
export async function locateChip(chipId: number): Promise<{ workspaceId: number } | null> {
  const rows = await getDb().select({ workspaceId: chips.workspaceId }).from(chips).where(eq(chips.id, chipId)).limit(1);
  return rows[0] ?? null;
}

/** Unscoped lookup of an analysis's workspace, for requireAccessTo. */
export async function locateAnalysis(analysisId: number): Promise<{ workspaceId: number } | null> {
  const rows = await getDb().select({ workspaceId: analyses.workspaceId }).from(analyses).where(eq(analyses.id, analysisId)).limit(1);
  return rows[0] ?? null;
}

export type ChipListItem = {
  id: number;
  name: string;
  purpose: string;
  lastActivityAt: Date;
  latestRevision: number | null;
  latestState: string | null;
  latestStateSince: Date | null;
  worstSeverity: string | null;
  revisionCount: number;
};

/** The workspace's chips with their latest revision and the worst flag of its latest analysis. */
export async function listChips(scope: WorkspaceScope): Promise<ChipListItem[]> {
  const db = getDb();
  const chipRows = await db.select().from(chips).where(inWorkspace(scope, chips.workspaceId)).orderBy(desc(chips.lastActivityAt));
  if (chipRows.length === 0) return [];
  const revRows = await db
    .select({ id: revisions.id, chipId: revisions.chipId, number: revisions.number, state: revisions.reviewState, since: revisions.reviewStateSince })
    .from(revisions)
    .where(inWorkspace(scope, revisions.workspaceId))
    .orderBy(asc(revisions.chipId), desc(revisions.number));
  const latestByChip = new Map<number, (typeof revRows)[number]>();
  const countByChip = new Map<number, number>();
  for (const r of revRows) {
    if (!latestByChip.has(r.chipId)) latestByChip.set(r.chipId, r);
    countByChip.set(r.chipId, (countByChip.get(r.chipId) ?? 0) + 1);
  }
  const latestIds = [...latestByChip.values()].map((r) => r.id);
  const worst = new Map<number, string | null>();
  if (latestIds.length > 0) {
    const rows = await db
      .select({ revisionId: analyses.revisionId, worst: analyses.worstSeverity, id: analyses.id })
      .from(analyses)
      .where(and(inWorkspace(scope, analyses.workspaceId), inArray(analyses.revisionId, latestIds)))
      .orderBy(desc(analyses.id));
    for (const r of rows) if (!worst.has(r.revisionId)) worst.set(r.revisionId, r.worst);
  }
  return chipRows.map((c) => {
    const latest = latestByChip.get(c.id);
    return {
      id: c.id,
      name: c.name,
      purpose: c.purpose,
      lastActivityAt: c.lastActivityAt,
      latestRevision: latest?.number ?? null,
      latestState: latest?.state ?? null,
      latestStateSince: latest?.since ?? null,
      worstSeverity: latest ? (worst.get(latest.id) ?? null) : null,
      revisionCount: countByChip.get(c.id) ?? 0,
    };
  });
}

export async function getChip(scope: WorkspaceScope, chipId: number): Promise<ChipRow | null> {
  const rows = await getDb()
    .select()
    .from(chips)
    .where(and(inWorkspace(scope, chips.workspaceId), eq(chips.id, chipId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function findChipByName(scope: WorkspaceScope, name: string): Promise<ChipRow | null> {
  const rows = await getDb()
    .select()
    .from(chips)
    .where(and(inWorkspace(scope, chips.workspaceId), eq(chips.name, name)))
    .limit(1);
  return rows[0] ?? null;
}

export async function insertChip(tx: Conn, scope: WorkspaceScope, values: { name: string; purpose: string }): Promise<ChipRow> {
  const [row] = await tx
    .insert(chips)
    .values({ workspaceId: scope.workspaceId, name: values.name, purpose: values.purpose, createdByUserId: scope.userId })
    .returning();
  return row;
}

export async function touchChip(tx: Conn, scope: WorkspaceScope, chipId: number, at = new Date()): Promise<void> {
  await tx
    .update(chips)
    .set({ lastActivityAt: at })
    .where(and(inWorkspace(scope, chips.workspaceId), eq(chips.id, chipId)));
}

export type RevisionListItem = Omit<RevisionRow, "layers"> & { uploaderName: string | null; analysisCount: number };

/** A chip's revisions, newest first, with uploader names. */
export async function listRevisions(scope: WorkspaceScope, chipId: number): Promise<RevisionListItem[]> {
  const db = getDb();
  const rows = await db
    .select({
      id: revisions.id,
      workspaceId: revisions.workspaceId,
      chipId: revisions.chipId,
      number: revisions.number,
      parentRevisionId: revisions.parentRevisionId,
      uploadedByUserId: revisions.uploadedByUserId,
      uploadedAt: revisions.uploadedAt,
      fileName: revisions.fileName,
      sizeBytes: revisions.sizeBytes,
      sha256: revisions.sha256,
      storageKey: revisions.storageKey,
      note: revisions.note,
      reviewState: revisions.reviewState,
      reviewVersion: revisions.reviewVersion,
      reviewStateSince: revisions.reviewStateSince,
      reviewAnalysisId: revisions.reviewAnalysisId,
      uploaderName: users.name,
      analysisCount: sql<number>`(select count(*) from ${analyses} where ${analyses.revisionId} = ${revisions.id})`,
    })
    .from(revisions)
    .leftJoin(users, eq(users.id, revisions.uploadedByUserId))
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.chipId, chipId)))
    .orderBy(desc(revisions.number));
  return rows;
}

export async function getRevision(scope: WorkspaceScope, chipId: number, number: number): Promise<RevisionRow | null> {
  const rows = await getDb()
    .select()
    .from(revisions)
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.chipId, chipId), eq(revisions.number, number)))
    .limit(1);
  return rows[0] ?? null;
}

export async function getRevisionById(scope: WorkspaceScope, revisionId: number): Promise<RevisionRow | null> {
  const rows = await getDb()
    .select()
    .from(revisions)
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.id, revisionId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function findRevisionBySha(scope: WorkspaceScope, chipId: number, sha256: string): Promise<RevisionRow | null> {
  const rows = await getDb()
    .select()
    .from(revisions)
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.chipId, chipId), eq(revisions.sha256, sha256)))
    .limit(1);
  return rows[0] ?? null;
}

export async function nextRevisionNumber(tx: Conn, scope: WorkspaceScope, chipId: number): Promise<{ number: number; parentId: number | null }> {
  const [row] = await tx
    .select({ top: max(revisions.number) })
    .from(revisions)
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.chipId, chipId)));
  const top = row?.top ?? 0;
  if (top === 0) return { number: 1, parentId: null };
  const [parent] = await tx
    .select({ id: revisions.id })
    .from(revisions)
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.chipId, chipId), eq(revisions.number, top)));
  return { number: top + 1, parentId: parent?.id ?? null };
}

export async function insertRevision(
  tx: Conn,
  scope: WorkspaceScope,
  values: Pick<RevisionRow, "chipId" | "number" | "parentRevisionId" | "fileName" | "sizeBytes" | "sha256" | "storageKey" | "note" | "layers">,
): Promise<RevisionRow> {
  const [row] = await tx
    .insert(revisions)
    .values({ ...values, workspaceId: scope.workspaceId, uploadedByUserId: scope.userId })
    .returning();
  return row;
}

export async function getLayerMap(scope: WorkspaceScope, revisionId: number): Promise<Record<string, unknown> | null> {
  const rows = await getDb()
    .select({ mapping: layerMaps.mapping })
    .from(layerMaps)
    .where(and(inWorkspace(scope, layerMaps.workspaceId), eq(layerMaps.revisionId, revisionId)))
    .limit(1);
  return rows[0]?.mapping ?? null;
}

/** Writes the revision's layer map once; returns false when it already has one. */
export async function insertLayerMap(tx: Conn, scope: WorkspaceScope, revisionId: number, mapping: Record<string, unknown>): Promise<boolean> {
  const rows = await tx
    .insert(layerMaps)
    .values({ workspaceId: scope.workspaceId, revisionId, mapping, createdByUserId: scope.userId })
    .onConflictDoNothing()
    .returning({ id: layerMaps.id });
  return rows.length > 0;
}

export async function insertOperatingPoint(
  tx: Conn,
  scope: WorkspaceScope,
  values: { revisionId: number; name: string; conditions: Record<string, unknown>; form: Record<string, unknown> },
): Promise<number> {
  const [row] = await tx
    .insert(operatingPoints)
    .values({ ...values, workspaceId: scope.workspaceId, createdByUserId: scope.userId })
    .returning({ id: operatingPoints.id });
  return row.id;
}

export async function insertAnalysis(tx: Conn, scope: WorkspaceScope, values: Omit<typeof analyses.$inferInsert, "workspaceId" | "id" | "createdAt">): Promise<number> {
  const [row] = await tx
    .insert(analyses)
    .values({ ...values, workspaceId: scope.workspaceId })
    .returning({ id: analyses.id });
  return row.id;
}

export type AnalysisListItem = Omit<AnalysisRow, "result"> & { operatingPointName: string; createdByName: string | null };

/** A revision's analyses with their operating point names, newest first (no result JSON). */
export async function listAnalyses(scope: WorkspaceScope, revisionId: number): Promise<AnalysisListItem[]> {
  const { result: _result, ...columns } = getTableColumnsOfAnalyses();
  return getDb()
    .select({ ...columns, operatingPointName: operatingPoints.name, createdByName: users.name })
    .from(analyses)
    .innerJoin(operatingPoints, eq(operatingPoints.id, analyses.operatingPointId))
    .leftJoin(users, eq(users.id, operatingPoints.createdByUserId))
    .where(and(inWorkspace(scope, analyses.workspaceId), eq(analyses.revisionId, revisionId)))
    .orderBy(desc(analyses.id));
}

function getTableColumnsOfAnalyses() {
  return {
    id: analyses.id,
    workspaceId: analyses.workspaceId,
    revisionId: analyses.revisionId,
    operatingPointId: analyses.operatingPointId,
    status: analyses.status,
    result: analyses.result,
    errorCode: analyses.errorCode,
    errorMessage: analyses.errorMessage,
    engineVersion: analyses.engineVersion,
    segmentCount: analyses.segmentCount,
    maxInletPressurePa: analyses.maxInletPressurePa,
    totalFlowM3PerS: analyses.totalFlowM3PerS,
    meanResidenceS: analyses.meanResidenceS,
    maxReynolds: analyses.maxReynolds,
    footprintM2: analyses.footprintM2,
    flagsInfo: analyses.flagsInfo,
    flagsWarn: analyses.flagsWarn,
    flagsBlock: analyses.flagsBlock,
    worstSeverity: analyses.worstSeverity,
    createdAt: analyses.createdAt,
  };
}

export type AnalysisDetail = AnalysisRow & { operatingPointName: string; conditions: Record<string, unknown>; form: Record<string, unknown> };

export async function getAnalysis(scope: WorkspaceScope, analysisId: number): Promise<AnalysisDetail | null> {
  const rows = await getDb()
    .select({ ...getTableColumnsOfAnalyses(), operatingPointName: operatingPoints.name, conditions: operatingPoints.conditions, form: operatingPoints.form })
    .from(analyses)
    .innerJoin(operatingPoints, eq(operatingPoints.id, analyses.operatingPointId))
    .where(and(inWorkspace(scope, analyses.workspaceId), eq(analyses.id, analysisId)))
    .limit(1);
  return rows[0] ?? null;
}

/** The latest form filled in on any revision of the chip, to prefill the next one. */
export async function getLatestOperatingPointForm(scope: WorkspaceScope, chipId: number): Promise<Record<string, unknown> | null> {
  const rows = await getDb()
    .select({ form: operatingPoints.form })
    .from(operatingPoints)
    .innerJoin(revisions, eq(revisions.id, operatingPoints.revisionId))
    .where(and(inWorkspace(scope, operatingPoints.workspaceId), eq(revisions.chipId, chipId)))
    .orderBy(desc(operatingPoints.id))
    .limit(1);
  return rows[0]?.form ?? null;
}

/** The layer map of the chip's most recent mapped revision, to remember depths and widths. */
export async function getLatestLayerMapForChip(scope: WorkspaceScope, chipId: number): Promise<Record<string, unknown> | null> {
  const rows = await getDb()
    .select({ mapping: layerMaps.mapping })
    .from(layerMaps)
    .innerJoin(revisions, eq(revisions.id, layerMaps.revisionId))
    .where(and(inWorkspace(scope, layerMaps.workspaceId), eq(revisions.chipId, chipId)))
    .orderBy(desc(revisions.number))
    .limit(1);
  return rows[0]?.mapping ?? null;
}

/** The member's stored display units for the analysis view (users.unit_preferences). */
export async function getUserUnitPreferences(userId: number): Promise<Record<string, string>> {
  const rows = await getDb().select({ prefs: users.unitPreferences }).from(users).where(eq(users.id, userId)).limit(1);
  return rows[0]?.prefs ?? {};
}

/** Replaces the member's display units (already validated by unitPreferencesSchema). */
export async function saveUserUnitPreferences(userId: number, prefs: Record<string, string>): Promise<void> {
  await getDb().update(users).set({ unitPreferences: prefs }).where(eq(users.id, userId));
}

/** The latest analysis of a revision (any status), or null — for "compare with the previous revision". */
export async function getLatestAnalysisIdForRevision(scope: WorkspaceScope, revisionId: number): Promise<number | null> {
  const rows = await getDb()
    .select({ id: analyses.id })
    .from(analyses)
    .where(and(inWorkspace(scope, analyses.workspaceId), eq(analyses.revisionId, revisionId), eq(analyses.status, "ok")))
    .orderBy(desc(analyses.id))
    .limit(1);
  return rows[0]?.id ?? null;
}
