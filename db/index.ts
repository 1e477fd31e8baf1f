import "server-only";
/**
 * The one database client. @libsql/client speaks to an embedded SQLite file
 * (file: URLs, resolved against the working directory — the repo root for every
 * npm script — with the folder created on demand) or, unchanged, to a libSQL
 * server (libsql:// URL plus DATABASE_AUTH_TOKEN). Created lazily on first use so
 * tests can point DATABASE_URL at a temporary file before anything connects.
 */
import { mkdirSync } from "node:fs";
import path from "node:path";
import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { getEnv } from "@/lib/env";
import * as schema from "./schema";
import { serialiseWrites } from "./write-lock";

export type Db = LibSQLDatabase<typeof schema>;

type Holder = { url: string; client: Client; db: Db };
const globalHolder = globalThis as unknown as { __stokelineDb?: Holder };

/** Turns a relative file: URL into an absolute one and makes sure its folder exists. */
export function resolveDatabaseUrl(url: string): string {
  if (!url.startsWith("file:")) return url;
  const rest = url.slice("file:".length);
  if (rest === ":memory:") return url;
  const filePath = path.isAbsolute(rest) ? rest : path.resolve(/*turbopackIgnore: true*/ process.cwd(), rest);
  mkdirSync(path.dirname(filePath), { recursive: true });
  return `file:${filePath}`;
}

/** Returns the shared Drizzle client for DATABASE_URL; throws if the environment is invalid. */
export function getDb(): Db {
  const env = getEnv();
  const url = resolveDatabaseUrl(env.databaseUrl);
  const held = globalHolder.__stokelineDb;
  if (held && held.url === url) return held.db;
  if (held) held.client.close();
  const client = createClient({ url, authToken: env.databaseAuthToken });
  const db = drizzle(client, { schema });
  if (url.startsWith("file:")) serialiseWrites(client, db);
  globalHolder.__stokelineDb = { url, client, db };
  return db;
}

/** Closes the shared client (scripts and tests call this before exiting). */
export function closeDb(): void {
  globalHolder.__stokelineDb?.client.close();
  globalHolder.__stokelineDb = undefined;
}

export { schema };
