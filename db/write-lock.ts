import "server-only";
/**
 * One writer at a time for the embedded database. @libsql/client opens a new
 * SQLite connection for every interactive transaction, and SQLite refuses a
 * second writer with SQLITE_BUSY at once (the client sets no busy timeout), so
 * two uploads or review steps landing together would fail. For file: URLs
 * every transaction and every statement outside one takes this process-wide
 * lock; statements issued from inside a transaction's async context (through
 * `tx` or, by mistake, through getDb()) pass straight through, so nothing can
 * deadlock on itself. A libsql:// server does its own locking and is not wrapped.
 */
import { AsyncLocalStorage } from "node:async_hooks";
import type { Client } from "@libsql/client";

const holding = new AsyncLocalStorage<true>();
let tail: Promise<void> = Promise.resolve();

async function withLock<T>(fn: () => Promise<T>): Promise<T> {
  if (holding.getStore()) return fn();
  let release!: () => void;
  const mine = new Promise<void>((resolve) => (release = resolve));
  const previous = tail;
  tail = previous.then(() => mine);
  await previous;
  try {
    return await holding.run(true, fn);
  } finally {
    release();
  }
}

/** Wraps the client's statement calls and the Drizzle database's transaction() in the lock. */
export function serialiseWrites<D extends { transaction: (...args: never[]) => Promise<unknown> }>(client: Client, db: D): void {
  const execute = client.execute.bind(client);
  const batch = client.batch.bind(client);
  const executeMultiple = client.executeMultiple.bind(client);
  client.execute = ((...args: Parameters<Client["execute"]>) => withLock(() => execute(...args))) as Client["execute"];
  client.batch = ((...args: Parameters<Client["batch"]>) => withLock(() => batch(...args))) as Client["batch"];
  client.executeMultiple = ((sql: string) => withLock(() => executeMultiple(sql))) as Client["executeMultiple"];
  const transaction = db.transaction.bind(db) as (...args: unknown[]) => Promise<unknown>;
  (db as { transaction: unknown }).transaction = (...args: unknown[]) => withLock(() => transaction(...args));
}
