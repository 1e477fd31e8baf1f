import "server-only";
/**
 * The one place that reads the next-auth session. Tests replace this module
 * with vi.mock("@/lib/auth/session") to act as a given user without cookies.
 */
import { getServerSession } from "next-auth";
import { currentBearerToken } from "@/lib/http/request-context";
import { resolveApiToken } from "./api-tokens";
import { getAuthOptions } from "./options";

/**
 * The signed-in user's id: from a personal API token when the route handler's
 * request carries `Authorization: Bearer …` (an invalid or revoked token is a
 * 401, never anonymous), else from the JWT session; null when signed out.
 */
export async function getSessionUserId(): Promise<number | null> {
  const bearer = currentBearerToken();
  if (bearer) return resolveApiToken(bearer);
  const session = await getServerSession(getAuthOptions());
  const raw = (session?.user as { id?: unknown } | undefined)?.id;
  const id = typeof raw === "string" ? Number(raw) : NaN;
  return Number.isInteger(id) && id > 0 ? id : null;
}
