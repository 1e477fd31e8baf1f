import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { getDb, type Db } from "@/db";
import { membershipRoles, memberships, users } from "@/db/schema";
import { isRole, type Role } from "@/lib/auth/roles";
import { inWorkspace, type WorkspaceScope } from "./scope";

export type MemberView = { userId: number; email: string; name: string; roles: Role[]; joinedAt: Date };

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** Members of the scope's workspace, by name. */
export async function listMembers(scope: WorkspaceScope): Promise<MemberView[]> {
  const rows = await getDb()
    .select({
      userId: users.id,
      email: users.email,
      name: users.name,
      joinedAt: memberships.createdAt,
      role: membershipRoles.role,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .leftJoin(membershipRoles, eq(membershipRoles.membershipId, memberships.id))
    .where(inWorkspace(scope, memberships.workspaceId))
    .orderBy(asc(users.name));
  const byUser = new Map<number, MemberView>();
  for (const r of rows) {
    const m = byUser.get(r.userId) ?? { userId: r.userId, email: r.email, name: r.name, joinedAt: r.joinedAt, roles: [] };
    if (isRole(r.role)) m.roles.push(r.role);
    byUser.set(r.userId, m);
  }
  return [...byUser.values()];
}

async function membershipIdOf(tx: Tx | Db, scope: WorkspaceScope, userId: number): Promise<number | null> {
  const rows = await tx
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(inWorkspace(scope, memberships.workspaceId), eq(memberships.userId, userId)))
    .limit(1);
  return rows[0]?.id ?? null;
}

/** Number of members of the workspace holding `role`. */
export async function countMembersWithRole(tx: Tx | Db, scope: WorkspaceScope, role: Role): Promise<number> {
  const rows = await tx
    .select({ id: memberships.id })
    .from(memberships)
    .innerJoin(membershipRoles, eq(membershipRoles.membershipId, memberships.id))
    .where(and(inWorkspace(scope, memberships.workspaceId), eq(membershipRoles.role, role)));
  return rows.length;
}

/** Adds a member with roles inside a transaction; returns false if already a member. */
export async function insertMembership(tx: Tx | Db, scope: WorkspaceScope, userId: number, roles: readonly Role[]): Promise<boolean> {
  if ((await membershipIdOf(tx, scope, userId)) !== null) return false;
  const [row] = await tx.insert(memberships).values({ workspaceId: scope.workspaceId, userId }).returning({ id: memberships.id });
  if (roles.length > 0) await tx.insert(membershipRoles).values(roles.map((role) => ({ membershipId: row.id, role })));
  return true;
}

/** Replaces a member's roles; returns false when the user is not a member of the scope's workspace. */
export async function replaceMemberRoles(tx: Tx | Db, scope: WorkspaceScope, userId: number, roles: readonly Role[]): Promise<boolean> {
  const id = await membershipIdOf(tx, scope, userId);
  if (id === null) return false;
  await tx.delete(membershipRoles).where(eq(membershipRoles.membershipId, id));
  if (roles.length > 0) await tx.insert(membershipRoles).values(roles.map((role) => ({ membershipId: id, role })));
  return true;
}

/** Removes a member (and their role rows); returns false when not a member. */
export async function deleteMembership(tx: Tx | Db, scope: WorkspaceScope, userId: number): Promise<boolean> {
  const id = await membershipIdOf(tx, scope, userId);
  if (id === null) return false;
  await tx.delete(membershipRoles).where(eq(membershipRoles.membershipId, id));
  await tx.delete(memberships).where(and(eq(memberships.id, id), inWorkspace(scope, memberships.workspaceId)));
  return true;
}

/** E-mail addresses of the workspace's members (for the outbox filter). */
export async function listMemberEmails(scope: WorkspaceScope): Promise<string[]> {
  const rows = await getDb()
    .select({ email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(inWorkspace(scope, memberships.workspaceId));
  return rows.map((r) => r.email);
}

/** Whether these users are all members of the scope's workspace. */
export async function areMembers(scope: WorkspaceScope, userIds: number[]): Promise<boolean> {
  if (userIds.length === 0) return true;
  const rows = await getDb()
    .select({ userId: memberships.userId })
    .from(memberships)
    .where(and(inWorkspace(scope, memberships.workspaceId), inArray(memberships.userId, userIds)));
  return new Set(rows.map((r) => r.userId)).size === new Set(userIds).size;
}
