import "server-only";
/**
 * The server-side authorisation helper used by every page, route handler and
 * server action. Unauthenticated → UnauthenticatedError (401; pages redirect to
 * sign-in); not a member, or lacking the permission → ForbiddenError (403).
 */
import { getUserById, type PublicUser } from "@/db/queries/users";
import { getMembershipRoles, getWorkspaceById, getWorkspaceBySlug } from "@/db/queries/workspaces";
import { scopeForTrustedCode, type WorkspaceScope } from "@/db/queries/scope";
import { ForbiddenError, NotFoundError, UnauthenticatedError } from "@/lib/errors";
import { can, explainRefusal, type ObjectFacts, type Permission } from "./permissions";
import { getSessionUserId } from "./session";

export type WorkspaceInfo = { id: number; slug: string; name: string };
export type MemberContext = { user: PublicUser; workspace: WorkspaceInfo; scope: WorkspaceScope };

/** The signed-in user; throws UnauthenticatedError when there is no valid session (or the user was deleted). */
export async function requireUser(): Promise<PublicUser> {
  const id = await getSessionUserId();
  if (id === null) throw new UnauthenticatedError();
  const user = await getUserById(id);
  if (!user) throw new UnauthenticatedError("Your account no longer exists. Sign in again.");
  return user;
}

async function contextFor(workspace: WorkspaceInfo | null, permission: Permission, object?: ObjectFacts): Promise<MemberContext> {
  const user = await requireUser();
  if (!workspace) throw new ForbiddenError("You are not a member of that workspace.");
  const roles = await getMembershipRoles(user.id, workspace.id);
  if (roles === null) throw new ForbiddenError("You are not a member of that workspace.");
  const actor = { userId: user.id, workspaceId: workspace.id, roles };
  if (!can(actor, permission, object)) throw new ForbiddenError(explainRefusal(actor, permission, object));
  return { user, workspace, scope: scopeForTrustedCode(actor) };
}

/**
 * Checks that the signed-in user is a member of workspace `workspaceId` holding
 * `permission` (on `object`, when given) and returns the scope every query takes.
 * Throws UnauthenticatedError (401) or ForbiddenError (403); an unknown
 * workspace id is treated like one the user is not in (403), so ids reveal nothing.
 */
export async function requireMembership(workspaceId: number, permission: Permission, object?: ObjectFacts): Promise<MemberContext> {
  return contextFor(await getWorkspaceById(workspaceId), permission, object);
}

/** As requireMembership, addressing the workspace by its URL slug. */
export async function requireMembershipBySlug(slug: string, permission: Permission, object?: ObjectFacts): Promise<MemberContext> {
  return contextFor(await getWorkspaceBySlug(slug), permission, object);
}

/**
 * For objects addressed by their own id: `locate` returns the object's facts
 * (at least its workspaceId) from an unscoped lookup of that one column, or
 * null. Signed-out → 401; missing → 404; another workspace's object or
 * missing permission → 403. Then read the object through scoped queries.
 */
export async function requireAccessTo(
  locate: () => Promise<ObjectFacts | null>,
  permission: Permission,
): Promise<MemberContext & { object: ObjectFacts }> {
  await requireUser();
  const object = await locate();
  if (!object) throw new NotFoundError("That item does not exist (it may have been removed).");
  const ctx = await requireMembership(object.workspaceId, permission, object);
  return { ...ctx, object };
}
