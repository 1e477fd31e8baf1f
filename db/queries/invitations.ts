import "server-only";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { getDb, type Db } from "@/db";
import { invitations, users, workspaces } from "@/db/schema";
import { isRole, type Role } from "@/lib/auth/roles";
import { inWorkspace, type WorkspaceScope } from "./scope";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

export type InvitationView = {
  id: number;
  email: string;
  roles: Role[];
  invitedBy: string | null;
  createdAt: Date;
  expiresAt: Date;
  status: "pending" | "accepted" | "revoked" | "expired";
};

function statusOf(row: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }, now: Date): InvitationView["status"] {
  if (row.acceptedAt) return "accepted";
  if (row.revokedAt) return "revoked";
  if (row.expiresAt.getTime() <= now.getTime()) return "expired";
  return "pending";
}

/** Invitations of the scope's workspace, newest first. */
export async function listInvitations(scope: WorkspaceScope, now = new Date()): Promise<InvitationView[]> {
  const rows = await getDb()
    .select({
      id: invitations.id,
      email: invitations.email,
      roles: invitations.roles,
      invitedBy: users.name,
      createdAt: invitations.createdAt,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
    })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(inWorkspace(scope, invitations.workspaceId))
    .orderBy(desc(invitations.createdAt), desc(invitations.id));
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    roles: r.roles.filter(isRole),
    invitedBy: r.invitedBy,
    createdAt: r.createdAt,
    expiresAt: r.expiresAt,
    status: statusOf(r, now),
  }));
}

export async function insertInvitation(
  tx: Tx | Db,
  scope: WorkspaceScope,
  values: { email: string; roles: Role[]; tokenHash: string; expiresAt: Date; createdAt?: Date },
): Promise<number> {
  const [row] = await tx
    .insert(invitations)
    .values({ ...values, workspaceId: scope.workspaceId, invitedByUserId: scope.userId })
    .returning({ id: invitations.id });
  return row.id;
}

/** A pending invitation for this address in the scope's workspace, if any. */
export async function findPendingInvitation(scope: WorkspaceScope, email: string, now = new Date()): Promise<number | null> {
  const rows = await getDb()
    .select({ id: invitations.id })
    .from(invitations)
    .where(
      and(
        inWorkspace(scope, invitations.workspaceId),
        eq(invitations.email, email),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, now),
      ),
    )
    .limit(1);
  return rows[0]?.id ?? null;
}

/** Which workspace an invitation belongs to (for the 403-vs-404 decision), or null if none. */
export async function getInvitationWorkspaceId(id: number): Promise<number | null> {
  const rows = await getDb().select({ workspaceId: invitations.workspaceId }).from(invitations).where(eq(invitations.id, id)).limit(1);
  return rows[0]?.workspaceId ?? null;
}

/** Marks a pending invitation revoked; false when it is not pending in this workspace. */
export async function markInvitationRevoked(tx: Tx | Db, scope: WorkspaceScope, id: number, now = new Date()): Promise<boolean> {
  const rows = await tx
    .update(invitations)
    .set({ revokedAt: now })
    .where(and(eq(invitations.id, id), inWorkspace(scope, invitations.workspaceId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .returning({ id: invitations.id });
  return rows.length === 1;
}

export type InvitationByToken = {
  id: number;
  workspaceId: number;
  workspaceName: string;
  workspaceSlug: string;
  email: string;
  roles: Role[];
  expiresAt: Date;
  acceptedAt: Date | null;
  revokedAt: Date | null;
};

/** Token-addressed lookup (the token is the credential); null when no invitation has that hash. */
export async function getInvitationByTokenHash(tokenHash: string): Promise<InvitationByToken | null> {
  const rows = await getDb()
    .select({
      id: invitations.id,
      workspaceId: invitations.workspaceId,
      workspaceName: workspaces.name,
      workspaceSlug: workspaces.slug,
      email: invitations.email,
      roles: invitations.roles,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
    })
    .from(invitations)
    .innerJoin(workspaces, eq(workspaces.id, invitations.workspaceId))
    .where(eq(invitations.tokenHash, tokenHash))
    .limit(1);
  const r = rows[0];
  return r ? { ...r, roles: r.roles.filter(isRole) } : null;
}

/** Claims the invitation once: sets accepted_at only if still unaccepted and unrevoked. */
export async function claimInvitation(tx: Tx | Db, id: number, now: Date): Promise<boolean> {
  const rows = await tx
    .update(invitations)
    .set({ acceptedAt: now })
    .where(and(eq(invitations.id, id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now)))
    .returning({ id: invitations.id });
  return rows.length === 1;
}
