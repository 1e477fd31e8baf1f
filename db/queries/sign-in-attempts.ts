import "server-only";
import { and, count, eq, gt } from "drizzle-orm";
import { getDb } from "@/db";
import { signInAttempts } from "@/db/schema";

export async function insertSignInAttempt(email: string, clientAddress: string, succeeded: boolean, at = new Date()): Promise<void> {
  await getDb().insert(signInAttempts).values({ email, clientAddress, succeeded, at });
}

/** Failed attempts for this account since `since` (and after its latest success). */
export async function countAccountFailuresSince(email: string, since: Date): Promise<{ failures: number; oldestAt: Date | null }> {
  const rows = await getDb()
    .select({ succeeded: signInAttempts.succeeded, at: signInAttempts.at })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), gt(signInAttempts.at, since)))
    .orderBy(signInAttempts.at);
  let failures = 0;
  let oldestAt: Date | null = null;
  for (const r of rows) {
    if (r.succeeded) {
      failures = 0;
      oldestAt = null;
    } else {
      failures += 1;
      oldestAt ??= r.at;
    }
  }
  return { failures, oldestAt };
}

/** Failed attempts from this client address since `since`, whatever the account. */
export async function countAddressFailuresSince(clientAddress: string, since: Date): Promise<number> {
  const [row] = await getDb()
    .select({ n: count() })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.clientAddress, clientAddress), eq(signInAttempts.succeeded, false), gt(signInAttempts.at, since)));
  return row?.n ?? 0;
}
