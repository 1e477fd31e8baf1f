import "server-only";
/**
 * Page-side use of the one authorisation helper: signed-out visitors are
 * redirected to sign-in (coming back afterwards); members without the
 * permission get an access-denied result the page renders.
 */
import { redirect } from "next/navigation";
import { ForbiddenError, UnauthenticatedError } from "@/lib/errors";
import type { ObjectFacts, Permission } from "./permissions";
import { requireMembershipBySlug, requireUser, type MemberContext } from "./require";
import type { PublicUser } from "@/db/queries/users";

export type PageAccess = ({ ok: true } & MemberContext) | { ok: false; message: string };

function signInPath(callbackPath: string): string {
  return `/sign-in?callbackUrl=${encodeURIComponent(callbackPath)}`;
}

/** The signed-in user, or a redirect to sign-in. */
export async function requirePageUser(callbackPath = "/"): Promise<PublicUser> {
  try {
    return await requireUser();
  } catch (err) {
    if (err instanceof UnauthenticatedError) redirect(signInPath(callbackPath));
    throw err;
  }
}

/** Checks membership of the workspace (by slug) with `permission`; redirects when signed out. */
export async function getPageAccess(slug: string, permission: Permission, callbackPath?: string, object?: ObjectFacts): Promise<PageAccess> {
  try {
    return { ok: true, ...(await requireMembershipBySlug(slug, permission, object)) };
  } catch (err) {
    if (err instanceof UnauthenticatedError) redirect(signInPath(callbackPath ?? `/w/${slug}`));
    if (err instanceof ForbiddenError) return { ok: false, message: err.message };
    throw err;
  }
}
