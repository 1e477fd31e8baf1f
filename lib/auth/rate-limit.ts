import "server-only";
/**
 * Sign-in throttling, per account and per client address, over a sliding
 * window. Limits: common practice (OWASP Authentication Cheat Sheet suggests
 * throttling after a handful of failures; numbers are ours).
 */
import { countAccountFailuresSince, countAddressFailuresSince, insertSignInAttempt } from "@/db/queries/sign-in-attempts";
import { RateLimitedError } from "@/lib/errors";

export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;
/** Failures allowed for one account inside the window (the next attempt is refused). */
export const MAX_ACCOUNT_FAILURES = 5;
/** Failures allowed from one client address inside the window, across accounts (higher: offices share addresses). */
export const MAX_ADDRESS_FAILURES = 20;

function minutesLeft(oldest: Date | null, now: Date): number {
  if (!oldest) return 15;
  return Math.max(1, Math.ceil((oldest.getTime() + SIGN_IN_WINDOW_MS - now.getTime()) / 60000));
}

/**
 * Throws RateLimitedError (429) when the account or the address has used up its
 * failures in the last 15 minutes. `email` must already be normalised.
 */
export async function assertSignInAllowed(email: string, clientAddress: string, now = new Date()): Promise<void> {
  const since = new Date(now.getTime() - SIGN_IN_WINDOW_MS);
  const account = await countAccountFailuresSince(email, since);
  if (account.failures >= MAX_ACCOUNT_FAILURES) {
    const m = minutesLeft(account.oldestAt, now);
    throw new RateLimitedError(
      `Too many failed sign-ins for this account. Wait ${m} minute${m === 1 ? "" : "s"} and try again, or reset your password.`,
      m * 60,
    );
  }
  const fromAddress = await countAddressFailuresSince(clientAddress, since);
  if (fromAddress >= MAX_ADDRESS_FAILURES) {
    throw new RateLimitedError("Too many failed sign-ins from your network. Wait 15 minutes and try again.", 15 * 60);
  }
}

export async function recordSignInAttempt(email: string, clientAddress: string, succeeded: boolean, now = new Date()): Promise<void> {
  await insertSignInAttempt(email, clientAddress, succeeded, now);
}
