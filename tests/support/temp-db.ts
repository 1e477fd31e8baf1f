/**
 * A fresh, migrated SQLite file per test file (never the dev database).
 * Call `await useTempDatabase()` in beforeAll; it points DATABASE_URL at a new
 * temporary file, applies the migrations and, unless told not to, seeds the
 * demo workspaces and people (DemoContext).
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { closeDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { seedFoundation, type DemoContext } from "@/db/seed";

let dir: string | undefined;

export async function useTempDatabase(options: { seed?: boolean } = {}): Promise<DemoContext | null> {
  closeDb();
  dir = mkdtempSync(path.join(tmpdir(), "stokeline-test-"));
  process.env.DATABASE_URL = `file:${path.join(dir, "test.db")}`;
  delete process.env.SMTP_URL;
  await migrateDatabase();
  return options.seed === false ? null : seedFoundation();
}

/** Closes the client and deletes the temporary folder (call in afterAll). */
export function dropTempDatabase(): void {
  closeDb();
  if (dir) rmSync(dir, { recursive: true, force: true });
  dir = undefined;
}
