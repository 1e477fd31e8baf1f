import "server-only";
/** Password reset by e-mail link: expiring (1 hour), single-use tokens stored only as hashes. */
import { and, count, eq, gt, isNull } from "drizzle-orm";
import { getDb } from "@/db";
import { passwordResetTokens, users } from "@/db/schema";
import { insertAuditEvent } from "@/db/queries/audit";
import { normaliseEmail } from "@/db/queries/users";
import { getEnv } from "@/lib/env";
import { ConflictError, NotFoundError } from "@/lib/errors";
import { sendMail } from "@/lib/mail";
import { passwordResetMail } from "@/lib/mail/templates";
import { hashPassword } from "./password";
import { createSecretToken, hashSecretToken } from "./tokens";

/** One hour: OWASP Forgot Password Cheat Sheet advises short-lived reset tokens (from memory); common practice. */
export const RESET_LIFETIME_MS = 60 * 60 * 1000;

/** At most this many reset e-mails per account per hour (common practice: stops mail-bombing a colleague). */
export const MAX_RESETS_PER_HOUR = 3;

/**
 * Sends a reset link when the address belongs to an account; does nothing
 * otherwise, and the caller answers the same either way (no account probing).
 * Past MAX_RESETS_PER_HOUR requests in the last hour it silently sends nothing more.
 */
export async function requestPasswordReset(email: string, now = new Date()): Promise<void> {
  const db = getDb();
  const [user] = await db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(eq(users.email, normaliseEmail(email)))
    .limit(1);
  if (!user) return;
  const [recent] = await db
    .select({ n: count() })
    .from(passwordResetTokens)
    .where(and(eq(passwordResetTokens.userId, user.id), gt(passwordResetTokens.createdAt, new Date(now.getTime() - 60 * 60 * 1000))));
  if ((recent?.n ?? 0) >= MAX_RESETS_PER_HOUR) return;
  const { token, tokenHash } = createSecretToken();
  const expiresAt = new Date(now.getTime() + RESET_LIFETIME_MS);
  await db.insert(passwordResetTokens).values({ userId: user.id, tokenHash, expiresAt, createdAt: now });
  await insertAuditEvent(db, { workspaceId: null, actorUserId: user.id, action: "password_reset.requested", objectType: "user", objectId: user.id, at: now });
  await sendMail({ to: user.email, ...passwordResetMail({ name: user.name, link: `${getEnv().appUrl}/reset-password/${token}`, expiresAt }) });
}

/** Checks a reset token without using it; throws NotFoundError or ConflictError with what to do next. */
export async function checkResetToken(token: string, now = new Date()): Promise<{ email: string }> {
  const [row] = await getDb()
    .select({ usedAt: passwordResetTokens.usedAt, expiresAt: passwordResetTokens.expiresAt, email: users.email })
    .from(passwordResetTokens)
    .innerJoin(users, eq(users.id, passwordResetTokens.userId))
    .where(eq(passwordResetTokens.tokenHash, hashSecretToken(token)))
    .limit(1);
  if (!row) throw new NotFoundError("This reset link is not valid. Ask for a new one on the sign-in page.");
  if (row.usedAt) throw new ConflictError("reset_used", "This reset link has already been used. Ask for a new one if you still need it.");
  if (row.expiresAt.getTime() <= now.getTime()) throw new ConflictError("reset_expired", "This reset link has expired. Ask for a new one on the sign-in page.");
  return { email: row.email };
}

/**
 * Sets a new password with a reset token, once. Every other outstanding reset
 * token of the account is spent too. Throws as checkResetToken.
 */
export async function resetPassword(token: string, newPassword: string, now = new Date()): Promise<{ email: string }> {
  const { email } = await checkResetToken(token, now);
  const passwordHash = await hashPassword(newPassword);
  const tokenHash = hashSecretToken(token);
  await getDb().transaction(async (tx) => {
    const claimed = await tx
      .update(passwordResetTokens)
      .set({ usedAt: now })
      .where(and(eq(passwordResetTokens.tokenHash, tokenHash), isNull(passwordResetTokens.usedAt), gt(passwordResetTokens.expiresAt, now)))
      .returning({ userId: passwordResetTokens.userId });
    if (claimed.length !== 1) throw new ConflictError("reset_used", "This reset link has just been used. Ask for a new one if you still need it.");
    const userId = claimed[0].userId;
    await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
    await tx
      .update(passwordResetTokens)
      .set({ usedAt: now })
      .where(and(eq(passwordResetTokens.userId, userId), isNull(passwordResetTokens.usedAt)));
    await insertAuditEvent(tx, { workspaceId: null, actorUserId: userId, action: "password_reset.completed", objectType: "user", objectId: userId, at: now });
  });
  return { email };
}
