import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db";
import { membershipRoles, memberships, workspaces } from "@/db/schema";
import { isRole, type Role } from "@/lib/auth/roles";

export type WorkspaceSummary = { id: number; slug: string; name: string; roles: Role[] };

/** Workspaces the user belongs to, with their roles in each, by name. */
export async function listWorkspacesForUser(userId: number): Promise<WorkspaceSummary[]> {
  const rows = await getDb()
    .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name, role: membershipRoles.role })
    .from(memberships)
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .leftJoin(membershipRoles, eq(membershipRoles.membershipId, memberships.id))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(workspaces.name));
  const byId = new Map<number, WorkspaceSummary>();
  for (const r of rows) {
    const ws = byId.get(r.id) ?? { id: r.id, slug: r.slug, name: r.name, roles: [] };
    if (isRole(r.role)) ws.roles.push(r.role);
    byId.set(r.id, ws);
  }
  return [...byId.values()];
}

export async function getWorkspaceBySlug(slug: string): Promise<{ id: number; slug: string; name: string } | null> {
  const rows = await getDb()
    .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name })
    .from(workspaces)
    .where(eq(workspaces.slug, slug))
    .limit(1);
  return rows[0] ?? null;
}

export async function getWorkspaceById(id: number): Promise<{ id: number; slug: string; name: string } | null> {
  const rows = await getDb()
    .select({ id: workspaces.id, slug: workspaces.slug, name: workspaces.name })
    .from(workspaces)
    .where(eq(workspaces.id, id))
    .limit(1);
  return rows[0] ?? null;
}

/** The user's roles in the workspace, or null when they are not a member. */
export async function getMembershipRoles(userId: number, workspaceId: number): Promise<Role[] | null> {
  const rows = await getDb()
    .select({ membershipId: memberships.id, role: membershipRoles.role })
    .from(memberships)
    .leftJoin(membershipRoles, eq(membershipRoles.membershipId, memberships.id))
    .where(and(eq(memberships.userId, userId), eq(memberships.workspaceId, workspaceId)));
  if (rows.length === 0) return null;
  return rows.map((r) => r.role).filter(isRole);
}
