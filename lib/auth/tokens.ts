import "server-only";
import { createHash, randomBytes } from "node:crypto";

/** A fresh URL-safe secret token (256 bits) and the SHA-256 hex digest that is stored instead of it. */
export function createSecretToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashSecretToken(token) };
}

/** SHA-256 hex digest of a token, as stored in the database. */
export function hashSecretToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
