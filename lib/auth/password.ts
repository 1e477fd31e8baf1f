import "server-only";
import bcrypt from "bcryptjs";
import { z } from "zod";

/** bcrypt work factor 10 (2^10 rounds): OWASP Password Storage Cheat Sheet's minimum for bcrypt (from memory). */
const BCRYPT_COST = 10;

/** A new password: 10–200 characters (bcrypt reads only the first 72 bytes; longer is refused as over-long). */
export const newPasswordSchema = z
  .string({ message: "Enter a password." })
  .min(10, { message: "Use at least 10 characters for the password." })
  .max(72, { message: "Use at most 72 characters for the password." });

/** Hashes a password with bcrypt (pure-JS bcryptjs: no install script). */
export async function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

/** True when `password` matches the bcrypt `hash`; false for any malformed hash. */
export async function verifyPassword(password: string, hash: string): Promise<boolean> {
  try {
    return await bcrypt.compare(password, hash);
  } catch {
    return false;
  }
}
