import "server-only";
/**
 * The one loader behind every revision page: checks the member's access to
 * the workspace (signed out → sign-in redirect; refused → a message for
 * <AccessDenied>), parses the ids in the URL and reads the chip and revision
 * through the scoped queries; anything missing or malformed is a 404.
 */
import { notFound } from "next/navigation";
import { getChip, getRevision } from "@/db/queries/chips";
import type { ChipRow, RevisionRow } from "@/db/schema-chips";
import { getPageAccess } from "@/lib/auth/page";
import type { Permission } from "@/lib/auth/permissions";
import type { MemberContext } from "@/lib/auth/require";

export type RevisionRouteParams = { workspace: string; chipId: string; number: string };

export type RevisionPage =
  | { ok: false; message: string; slug: string }
  | { ok: true; access: MemberContext; slug: string; chip: ChipRow; revision: RevisionRow; number: number; base: string };

/** A positive integer id from a URL segment, or a 404. */
export function requireIdSegment(raw: string): number {
  const n = Number(raw);
  if (!Number.isInteger(n) || n <= 0) notFound();
  return n;
}

/**
 * Loads the chip and revision a page at /w/<slug>/chips/<chipId>/revisions/<number>/<suffix> shows.
 * @param suffix the rest of the path after the revision number ("", "/review", …), for the sign-in callback.
 */
export async function loadRevisionPage(params: RevisionRouteParams, permission: Permission, suffix = ""): Promise<RevisionPage> {
  const { workspace: slug, chipId: rawId, number: rawNo } = params;
  const access = await getPageAccess(slug, permission, `/w/${slug}/chips/${rawId}/revisions/${rawNo}${suffix}`);
  if (!access.ok) return { ok: false, message: access.message, slug };
  const chipId = requireIdSegment(rawId);
  const number = requireIdSegment(rawNo);
  const chip = await getChip(access.scope, chipId);
  const revision = chip ? await getRevision(access.scope, chip.id, number) : null;
  if (!chip || !revision) notFound();
  return { ok: true, access, slug, chip, revision, number, base: `/w/${slug}/chips/${chip.id}/revisions/${number}` };
}
