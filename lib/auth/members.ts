import "server-only";
/** Changing members' roles and removing members, keeping at least one admin per workspace. */
import { getDb } from "@/db";
import { insertAuditEvent } from "@/db/queries/audit";
import { countMembersWithRole, deleteMembership, listMembers, replaceMemberRoles } from "@/db/queries/members";
import type { WorkspaceScope } from "@/db/queries/scope";
import { ConflictError, NotFoundError } from "@/lib/errors";
import type { Role } from "./roles";

const LAST_ADMIN = "A workspace needs at least one admin. Give another member the admin role first.";

/**
 * Replaces the roles of member `userId` in the scope's workspace. Throws
 * NotFoundError when they are not a member here and ConflictError when the
 * change would leave the workspace without an admin.
 */
export async function changeMemberRoles(scope: WorkspaceScope, userId: number, roles: Role[], now = new Date()): Promise<void> {
  const before = (await listMembers(scope)).find((m) => m.userId === userId);
  if (!before) throw new NotFoundError("That person is not a member of this workspace.");
  await getDb().transaction(async (tx) => {
    if (before.roles.includes("admin") && !roles.includes("admin") && (await countMembersWithRole(tx, scope, "admin")) <= 1) {
      throw new ConflictError("last_admin", LAST_ADMIN);
    }
    if (!(await replaceMemberRoles(tx, scope, userId, roles))) throw new NotFoundError("That person is not a member of this workspace.");
    await insertAuditEvent(tx, {
      workspaceId: scope.workspaceId,
      actorUserId: scope.userId,
      action: "member.roles_changed",
      objectType: "user",
      objectId: userId,
      details: { from: before.roles, to: roles },
      at: now,
    });
  });
}

/** Removes member `userId` from the scope's workspace; same errors as changeMemberRoles. */
export async function removeMember(scope: WorkspaceScope, userId: number, now = new Date()): Promise<void> {
  const before = (await listMembers(scope)).find((m) => m.userId === userId);
  if (!before) throw new NotFoundError("That person is not a member of this workspace.");
  await getDb().transaction(async (tx) => {
    if (before.roles.includes("admin") && (await countMembersWithRole(tx, scope, "admin")) <= 1) throw new ConflictError("last_admin", LAST_ADMIN);
    if (!(await deleteMembership(tx, scope, userId))) throw new NotFoundError("That person is not a member of this workspace.");
    await insertAuditEvent(tx, {
      workspaceId: scope.workspaceId,
      actorUserId: scope.userId,
      action: "member.removed",
      objectType: "user",
      objectId: userId,
      details: { email: before.email, roles: before.roles },
      at: now,
    });
  });
}
