import "server-only";
/**
 * Where uploaded layout files live. Content-addressed by SHA-256 under
 * STORAGE_DIR, written atomically (temp file + rename), never overwritten, so a
 * revision's file stays byte-for-byte what was uploaded. Everything else goes
 * through these three functions, so moving to object storage means changing
 * only this module.
 */
import { createHash, randomBytes } from "node:crypto";
import { mkdir, readFile, rename, stat, writeFile, unlink } from "node:fs/promises";
import path from "node:path";

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

// The storage folder is chosen at run time, so the build must not try to trace it into the bundle
// (Next's file tracing would otherwise warn and trace the whole project).
function storageRoot(): string {
  return path.resolve(/* turbopackIgnore: true */ process.env.STORAGE_DIR || "data/files");
}

function keyPath(key: string): string {
  if (!/^[0-9a-f]{64}$/.test(key)) throw new Error(`invalid storage key ${key}`);
  return path.join(/* turbopackIgnore: true */ storageRoot(), key.slice(0, 2), key);
}

/**
 * Store bytes; returns the storage key (their SHA-256) and whether this call
 * created the file (only then may a failed database write undo it).
 */
export async function putFile(bytes: Uint8Array): Promise<{ key: string; created: boolean }> {
  const key = sha256Hex(bytes);
  const target = keyPath(key);
  try {
    await stat(target);
    return { key, created: false };
  } catch {
    // not stored yet
  }
  await mkdir(path.dirname(target), { recursive: true });
  const tmp = `${target}.${randomBytes(6).toString("hex")}.tmp`;
  await writeFile(tmp, bytes);
  await rename(tmp, target);
  return { key, created: true };
}

/** Read a stored file back; throws if it is missing (a storage fault, not a user error). */
export async function getFile(key: string): Promise<Buffer> {
  return readFile(keyPath(key));
}

/** Remove a file; used only to undo a put (created: true) whose database write failed. */
export async function deleteFile(key: string): Promise<void> {
  await unlink(keyPath(key)).catch(() => undefined);
}
