import "server-only";
/**
 * Review records, comments, clearances and the inbox — always within a
 * workspace scope. Writes take the caller's transaction so a review step is
 * stored whole (state, disposition or clearance, audit event, inbox rows) or
 * not at all. Dispositions and clearances are insert-only (triggers refuse
 * UPDATE/DELETE).
 */
import { and, asc, count, desc, eq, gte, inArray, isNull } from "drizzle-orm";
import { getDb, type Db } from "@/db";
import { auditEvents, users } from "@/db/schema";
import { chips, revisions } from "@/db/schema-chips";
import {
  clearances,
  flagDispositions,
  notificationPreferences,
  notifications,
  reviewComments,
  type ClearanceRow,
  type FlagDispositionRow,
  type NotificationRow,
} from "@/db/schema-review";
import { inWorkspace, type WorkspaceScope } from "./scope";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type Conn = Tx | Db;

export type NotificationKind = NotificationRow["kind"];

/** Unscoped lookup of a revision's workspace and uploader, for requireAccessTo (reveals nothing else). */
export async function locateRevision(revisionId: number): Promise<{ workspaceId: number; createdByUserId: number | null } | null> {
  const rows = await getDb()
    .select({ workspaceId: revisions.workspaceId, createdByUserId: revisions.uploadedByUserId })
    .from(revisions)
    .where(eq(revisions.id, revisionId))
    .limit(1);
  return rows[0] ?? null;
}

/** Every disposition of a revision, oldest first (the latest per flag key is the one that counts). */
export async function listDispositionHistory(scope: WorkspaceScope, revisionId: number): Promise<(FlagDispositionRow & { byName: string | null })[]> {
  return getDb()
    .select({
      id: flagDispositions.id,
      workspaceId: flagDispositions.workspaceId,
      revisionId: flagDispositions.revisionId,
      analysisId: flagDispositions.analysisId,
      flagKey: flagDispositions.flagKey,
      decision: flagDispositions.decision,
      justification: flagDispositions.justification,
      value: flagDispositions.value,
      byUserId: flagDispositions.byUserId,
      at: flagDispositions.at,
      byName: users.name,
    })
    .from(flagDispositions)
    .leftJoin(users, eq(users.id, flagDispositions.byUserId))
    .where(and(inWorkspace(scope, flagDispositions.workspaceId), eq(flagDispositions.revisionId, revisionId)))
    .orderBy(asc(flagDispositions.id));
}

export async function insertDisposition(
  tx: Conn,
  scope: WorkspaceScope,
  values: Omit<typeof flagDispositions.$inferInsert, "id" | "workspaceId">,
): Promise<void> {
  await tx.insert(flagDispositions).values({ ...values, workspaceId: scope.workspaceId });
}

export async function getClearance(scope: WorkspaceScope, revisionId: number): Promise<(ClearanceRow & { byName: string | null }) | null> {
  const rows = await getDb()
    .select({
      id: clearances.id,
      workspaceId: clearances.workspaceId,
      revisionId: clearances.revisionId,
      byUserId: clearances.byUserId,
      at: clearances.at,
      fabName: clearances.fabName,
      process: clearances.process,
      fileSha256: clearances.fileSha256,
      analysisId: clearances.analysisId,
      byName: users.name,
    })
    .from(clearances)
    .leftJoin(users, eq(users.id, clearances.byUserId))
    .where(and(inWorkspace(scope, clearances.workspaceId), eq(clearances.revisionId, revisionId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function insertClearance(tx: Conn, scope: WorkspaceScope, values: Omit<typeof clearances.$inferInsert, "id" | "workspaceId">): Promise<void> {
  await tx.insert(clearances).values({ ...values, workspaceId: scope.workspaceId });
}

/**
 * The compare-and-set write of a review step: changes the revision's review
 * columns only if its version is still `expectedVersion`.
 * @returns true when the row was updated, false when someone else moved it first.
 */
export async function compareAndSetReview(
  tx: Conn,
  scope: WorkspaceScope,
  revisionId: number,
  expectedVersion: number,
  next: { state: string; version: number; analysisId: number | null; since: Date | null },
): Promise<boolean> {
  const result = await tx
    .update(revisions)
    .set({
      reviewState: next.state,
      reviewVersion: next.version,
      reviewAnalysisId: next.analysisId,
      ...(next.since ? { reviewStateSince: next.since } : {}),
    })
    .where(and(inWorkspace(scope, revisions.workspaceId), eq(revisions.id, revisionId), eq(revisions.reviewVersion, expectedVersion)));
  return result.rowsAffected === 1;
}

export type QueueItem = {
  revisionId: number;
  chipId: number;
  chipName: string;
  number: number;
  state: string;
  since: Date;
  uploadedByUserId: number | null;
  uploaderName: string | null;
  fileName: string;
};

/** Revisions of the workspace in any of `states`, oldest state change first. */
export async function listRevisionsInStates(scope: WorkspaceScope, states: readonly string[]): Promise<QueueItem[]> {
  if (states.length === 0) return [];
  return getDb()
    .select({
      revisionId: revisions.id,
      chipId: revisions.chipId,
      chipName: chips.name,
      number: revisions.number,
      state: revisions.reviewState,
      since: revisions.reviewStateSince,
      uploadedByUserId: revisions.uploadedByUserId,
      uploaderName: users.name,
      fileName: revisions.fileName,
    })
    .from(revisions)
    .innerJoin(chips, eq(chips.id, revisions.chipId))
    .leftJoin(users, eq(users.id, revisions.uploadedByUserId))
    .where(and(inWorkspace(scope, revisions.workspaceId), inArray(revisions.reviewState, [...states])))
    .orderBy(asc(revisions.reviewStateSince), asc(revisions.id));
}

export type CommentView = {
  id: number;
  parentId: number | null;
  authorUserId: number;
  authorName: string | null;
  body: string;
  segmentId: string | null;
  xM: number | null;
  yM: number | null;
  mentions: number[];
  createdAt: Date;
  resolvedAt: Date | null;
  resolvedByUserId: number | null;
};

export async function listComments(scope: WorkspaceScope, revisionId: number): Promise<CommentView[]> {
  return getDb()
    .select({
      id: reviewComments.id,
      parentId: reviewComments.parentId,
      authorUserId: reviewComments.authorUserId,
      authorName: users.name,
      body: reviewComments.body,
      segmentId: reviewComments.segmentId,
      xM: reviewComments.xM,
      yM: reviewComments.yM,
      mentions: reviewComments.mentions,
      createdAt: reviewComments.createdAt,
      resolvedAt: reviewComments.resolvedAt,
      resolvedByUserId: reviewComments.resolvedByUserId,
    })
    .from(reviewComments)
    .leftJoin(users, eq(users.id, reviewComments.authorUserId))
    .where(and(inWorkspace(scope, reviewComments.workspaceId), eq(reviewComments.revisionId, revisionId)))
    .orderBy(asc(reviewComments.createdAt), asc(reviewComments.id));
}

export async function getComment(scope: WorkspaceScope, commentId: number) {
  const rows = await getDb()
    .select()
    .from(reviewComments)
    .where(and(inWorkspace(scope, reviewComments.workspaceId), eq(reviewComments.id, commentId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function insertComment(tx: Conn, scope: WorkspaceScope, values: Omit<typeof reviewComments.$inferInsert, "id" | "workspaceId">): Promise<number> {
  const [row] = await tx
    .insert(reviewComments)
    .values({ ...values, workspaceId: scope.workspaceId })
    .returning({ id: reviewComments.id });
  return row.id;
}

export async function setCommentResolved(tx: Conn, scope: WorkspaceScope, commentId: number, resolved: { at: Date; byUserId: number } | null): Promise<void> {
  await tx
    .update(reviewComments)
    .set({ resolvedAt: resolved?.at ?? null, resolvedByUserId: resolved?.byUserId ?? null })
    .where(and(inWorkspace(scope, reviewComments.workspaceId), eq(reviewComments.id, commentId)));
}

export async function insertNotifications(tx: Conn, scope: WorkspaceScope, rows: Omit<typeof notifications.$inferInsert, "id" | "workspaceId">[]): Promise<void> {
  if (rows.length === 0) return;
  await tx.insert(notifications).values(rows.map((r) => ({ ...r, workspaceId: scope.workspaceId })));
}

export type InboxItem = {
  id: number;
  kind: NotificationKind;
  summary: string;
  revisionId: number | null;
  chipId: number | null;
  chipName: string | null;
  revisionNumber: number | null;
  actorName: string | null;
  createdAt: Date;
  readAt: Date | null;
};

/** The signed-in member's inbox in the scope's workspace, newest first. */
export async function listInbox(scope: WorkspaceScope, options: { unreadOnly?: boolean; limit?: number } = {}): Promise<InboxItem[]> {
  const conditions = [inWorkspace(scope, notifications.workspaceId), eq(notifications.userId, scope.userId)];
  if (options.unreadOnly) conditions.push(isNull(notifications.readAt));
  return getDb()
    .select({
      id: notifications.id,
      kind: notifications.kind,
      summary: notifications.summary,
      revisionId: notifications.revisionId,
      chipId: revisions.chipId,
      chipName: chips.name,
      revisionNumber: revisions.number,
      actorName: users.name,
      createdAt: notifications.createdAt,
      readAt: notifications.readAt,
    })
    .from(notifications)
    .leftJoin(revisions, eq(revisions.id, notifications.revisionId))
    .leftJoin(chips, eq(chips.id, revisions.chipId))
    .leftJoin(users, eq(users.id, notifications.actorUserId))
    .where(and(...conditions))
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(options.limit ?? 200);
}

export async function countUnread(scope: WorkspaceScope): Promise<number> {
  const [row] = await getDb()
    .select({ n: count() })
    .from(notifications)
    .where(and(inWorkspace(scope, notifications.workspaceId), eq(notifications.userId, scope.userId), isNull(notifications.readAt)));
  return row?.n ?? 0;
}

/** Marks the member's own notifications read (all of them when `ids` is null); returns how many changed. */
export async function markRead(scope: WorkspaceScope, ids: number[] | null, at = new Date()): Promise<number> {
  const conditions = [inWorkspace(scope, notifications.workspaceId), eq(notifications.userId, scope.userId), isNull(notifications.readAt)];
  if (ids) {
    if (ids.length === 0) return 0;
    conditions.push(inArray(notifications.id, ids));
  }
  const result = await getDb().update(notifications).set({ readAt: at }).where(and(...conditions));
  return result.rowsAffected;
}

/** E-mail switches of these members (absent = on), as userId → kind → on. */
export async function getEmailPreferences(scope: WorkspaceScope, userIds: number[]): Promise<Map<number, Map<NotificationKind, boolean>>> {
  const out = new Map<number, Map<NotificationKind, boolean>>();
  if (userIds.length === 0) return out;
  const rows = await getDb()
    .select()
    .from(notificationPreferences)
    .where(and(inWorkspace(scope, notificationPreferences.workspaceId), inArray(notificationPreferences.userId, userIds)));
  for (const r of rows) {
    const m = out.get(r.userId) ?? new Map<NotificationKind, boolean>();
    m.set(r.kind, r.email);
    out.set(r.userId, m);
  }
  return out;
}

/** Sets the scope's member's e-mail switch for each kind given. */
export async function saveEmailPreferences(scope: WorkspaceScope, prefs: Partial<Record<NotificationKind, boolean>>, at = new Date()): Promise<void> {
  const entries = Object.entries(prefs) as [NotificationKind, boolean][];
  if (entries.length === 0) return;
  await getDb().transaction(async (tx) => {
    for (const [kind, email] of entries) {
      await tx
        .insert(notificationPreferences)
        .values({ workspaceId: scope.workspaceId, userId: scope.userId, kind, email, updatedAt: at })
        .onConflictDoUpdate({
          target: [notificationPreferences.workspaceId, notificationPreferences.userId, notificationPreferences.kind],
          set: { email, updatedAt: at },
        });
    }
  });
}

/** The stored bcrypt hash of a member's password, for the clearance signature. */
export async function getPasswordHash(userId: number): Promise<string | null> {
  const rows = await getDb().select({ hash: users.passwordHash }).from(users).where(eq(users.id, userId)).limit(1);
  return rows[0]?.hash ?? null;
}

/** Failed clearance signatures by this member since `since` (recorded as audit events). */
export async function countSignatureFailuresSince(scope: WorkspaceScope, since: Date): Promise<{ failures: number; oldestAt: Date | null }> {
  const rows = await getDb()
    .select({ at: auditEvents.at })
    .from(auditEvents)
    .where(
      and(
        inWorkspace(scope, auditEvents.workspaceId),
        eq(auditEvents.actorUserId, scope.userId),
        eq(auditEvents.action, "review.signature_failed"),
        gte(auditEvents.at, since),
      ),
    )
    .orderBy(asc(auditEvents.at));
  return { failures: rows.length, oldestAt: rows[0]?.at ?? null };
}
