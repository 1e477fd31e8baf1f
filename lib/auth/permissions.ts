/**
 * Who may do what, decided in one place. Pure: no React, Next or database.
 * Membership rows are the single source of roles; the server calls `can` (via
 * requireMembership) to decide, components call it only to choose what to show.
 */
import type { Role } from "./roles";

/** Every permission the product knows, with the roles that hold it. */
export const PERMISSION_ROLES = {
  "workspace.view": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "workspace.manage": ["admin"],
  "member.view": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "mail.outbox.view": ["admin"],
  "chip.view": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "chip.create": ["designer"],
  "revision.upload": ["designer"],
  "operating_point.create": ["designer"],
  "revision.submit": ["designer"],
  "revision.withdraw": ["designer"],
  "revision.review": ["fluidics_reviewer"],
  "revision.clear": ["fab_liaison"],
  "comment.create": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "review.queue.view": ["designer", "fluidics_reviewer", "fab_liaison"],
  "portfolio.view": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "report.view": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "report.share": ["lead", "admin"],
  "settings.view": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
  "settings.fluids.edit": ["designer", "admin"],
  "settings.process.edit": ["fab_liaison"],
  "settings.thresholds.edit": ["fluidics_reviewer"],
  "token.manage": ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSION_ROLES;

/** A signed-in user as a member of one workspace. */
export type Actor = {
  userId: number;
  workspaceId: number;
  roles: readonly Role[];
};

/** What `can` needs to know about the object acted on (all fields optional except its workspace). */
export type ObjectFacts = {
  workspaceId: number;
  /** Who uploaded/authored it, for the four-eyes rule and own-only steps. */
  createdByUserId?: number | null;
};

/** Steps nobody may take on an object they authored themselves (four-eyes). */
const FOUR_EYES: ReadonlySet<Permission> = new Set<Permission>(["revision.review", "revision.clear"]);
/** Steps only the author may take. */
const AUTHOR_ONLY: ReadonlySet<Permission> = new Set<Permission>(["revision.withdraw"]);

export function isPermission(value: string): value is Permission {
  return Object.prototype.hasOwnProperty.call(PERMISSION_ROLES, value);
}

/**
 * Decides whether `actor` may take `permission`, optionally on `object`.
 * False when the actor holds none of the permission's roles, when the object
 * lies in another workspace, when a four-eyes step targets the actor's own
 * object, or when an author-only step targets someone else's. Never throws.
 */
export function can(actor: Actor | null | undefined, permission: Permission, object?: ObjectFacts): boolean {
  if (!actor) return false;
  const allowed: readonly Role[] = PERMISSION_ROLES[permission];
  if (!actor.roles.some((r) => allowed.includes(r))) return false;
  if (object) {
    if (object.workspaceId !== actor.workspaceId) return false;
    const author = object.createdByUserId ?? null;
    if (FOUR_EYES.has(permission) && author !== null && author === actor.userId) return false;
    if (AUTHOR_ONLY.has(permission) && author !== actor.userId) return false;
  }
  return true;
}

/** The reason `can` said no, in plain words for a 403 message. */
export function explainRefusal(actor: Actor, permission: Permission, object?: ObjectFacts): string {
  if (object && object.workspaceId !== actor.workspaceId) return "That belongs to a workspace you are not a member of.";
  const allowed: readonly Role[] = PERMISSION_ROLES[permission];
  if (!actor.roles.some((r) => allowed.includes(r))) {
    return `This needs the ${allowed.map((r) => r.replace("_", " ")).join(" or ")} role in this workspace.`;
  }
  if (object && FOUR_EYES.has(permission) && object.createdByUserId === actor.userId) {
    return "You cannot review or clear work you uploaded yourself; another member must do it.";
  }
  if (object && AUTHOR_ONLY.has(permission)) return "Only the member who uploaded it can do that.";
  return "You do not have permission to do that.";
}
