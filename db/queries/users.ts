import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db";
import { users } from "@/db/schema";

export type PublicUser = { id: number; email: string; name: string };

/** Normalises an e-mail address for storage and lookup (trimmed, lower case). */
export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

/** The user's public fields, or null. Never returns the password hash. */
export async function getUserById(id: number): Promise<PublicUser | null> {
  const rows = await getDb().select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.id, id)).limit(1);
  return rows[0] ?? null;
}

/** For credential checks only: the user's id and password hash by e-mail, or null. */
export async function getUserCredentialsByEmail(email: string): Promise<{ id: number; passwordHash: string } | null> {
  const rows = await getDb()
    .select({ id: users.id, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.email, normaliseEmail(email)))
    .limit(1);
  return rows[0] ?? null;
}

export async function getUserIdByEmail(email: string): Promise<number | null> {
  const rows = await getDb().select({ id: users.id }).from(users).where(eq(users.email, normaliseEmail(email))).limit(1);
  return rows[0]?.id ?? null;
}
