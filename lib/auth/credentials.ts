import "server-only";
import { z } from "zod";
import { getUserCredentialsByEmail, normaliseEmail } from "@/db/queries/users";
import { DomainError, UnauthenticatedError } from "@/lib/errors";
import { verifyPassword } from "./password";
import { assertSignInAllowed, recordSignInAttempt } from "./rate-limit";

export const signInSchema = z.object({
  email: z.string({ message: "Enter your e-mail address." }).trim().min(1, { message: "Enter your e-mail address." }).max(254, { message: "That e-mail address is too long." }),
  password: z.string({ message: "Enter your password." }).min(1, { message: "Enter your password." }).max(200, { message: "That password is too long." }),
});

/** A bcrypt hash of a random string, compared against when the account does not exist, so timing does not reveal which e-mails are registered. */
const DUMMY_HASH = "$2b$10$019Akty8T/fULZLdaY.PouZ8JxRt/XVASlQ5W9OKS8iOcoccTfq26";

/** Picks the client address from proxy headers (first X-Forwarded-For hop), else "unknown". */
export function clientAddressFrom(headers: Record<string, string | string[] | undefined> | Headers | undefined): string {
  const get = (name: string): string | undefined => {
    if (!headers) return undefined;
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name];
    return Array.isArray(v) ? v[0] : v;
  };
  const forwarded = get("x-forwarded-for")?.split(",")[0]?.trim();
  return (forwarded || get("x-real-ip") || "unknown").slice(0, 64);
}

/**
 * Checks e-mail + password for the sign-in form. Returns the user id.
 * Throws DomainError (400) for malformed input, RateLimitedError (429) when the
 * account or address is throttled, UnauthenticatedError (401) for a wrong pair.
 * Every verdict is recorded for the rate limiter.
 */
export async function authorizeCredentials(input: unknown, clientAddress: string, now = new Date()): Promise<{ id: number }> {
  const parsed = signInSchema.safeParse(input);
  if (!parsed.success) throw new DomainError("invalid_input", parsed.error.issues[0].message, 400);
  const email = normaliseEmail(parsed.data.email);
  await assertSignInAllowed(email, clientAddress, now);
  const user = await getUserCredentialsByEmail(email);
  const ok = await verifyPassword(parsed.data.password, user?.passwordHash ?? DUMMY_HASH);
  await recordSignInAttempt(email, clientAddress, Boolean(user && ok), now);
  if (!user || !ok) throw new UnauthenticatedError("That e-mail and password do not match. Check both and try again.");
  return { id: user.id };
}
