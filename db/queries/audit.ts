import "server-only";
/** The audit trail: insert and read only. There is deliberately no update or delete here (and triggers forbid them). */
import { and, desc, eq, isNull } from "drizzle-orm";
import { getDb, type Db } from "@/db";
import { auditEvents, users } from "@/db/schema";
import { inWorkspace, type WorkspaceScope } from "./scope";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

export type AuditInput = {
  workspaceId: number | null;
  actorUserId: number | null;
  action: string;
  objectType: string;
  objectId: string | number;
  details?: Record<string, unknown>;
  at?: Date;
};

export async function insertAuditEvent(tx: Tx | Db, e: AuditInput): Promise<void> {
  await tx.insert(auditEvents).values({
    workspaceId: e.workspaceId,
    actorUserId: e.actorUserId,
    action: e.action,
    objectType: e.objectType,
    objectId: String(e.objectId),
    details: e.details ?? {},
    at: e.at ?? new Date(),
  });
}

export type AuditView = {
  id: number;
  at: Date;
  actor: string | null;
  action: string;
  objectType: string;
  objectId: string;
  details: Record<string, unknown>;
};

/** The scope's workspace's events, newest first, optionally for one object. */
export async function listAuditEvents(
  scope: WorkspaceScope,
  filter: { objectType?: string; objectId?: string | number; limit?: number } = {},
): Promise<AuditView[]> {
  const conditions = [inWorkspace(scope, auditEvents.workspaceId)];
  if (filter.objectType) conditions.push(eq(auditEvents.objectType, filter.objectType));
  if (filter.objectId !== undefined) conditions.push(eq(auditEvents.objectId, String(filter.objectId)));
  return getDb()
    .select({
      id: auditEvents.id,
      at: auditEvents.at,
      actor: users.name,
      action: auditEvents.action,
      objectType: auditEvents.objectType,
      objectId: auditEvents.objectId,
      details: auditEvents.details,
    })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorUserId))
    .where(and(...conditions))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(filter.limit ?? 500);
}

/** When the user last completed a password reset (from the audit trail), or null. */
export async function getLastPasswordResetAt(userId: number): Promise<Date | null> {
  const [row] = await getDb()
    .select({ at: auditEvents.at })
    .from(auditEvents)
    .where(
      and(
        isNull(auditEvents.workspaceId),
        eq(auditEvents.objectType, "user"),
        eq(auditEvents.objectId, String(userId)),
        eq(auditEvents.action, "password_reset.completed"),
      ),
    )
    .orderBy(desc(auditEvents.at))
    .limit(1);
  return row?.at ?? null;
}
