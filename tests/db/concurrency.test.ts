// Concurrent transactions on the embedded database. SQLite admits one writer at a time and
// answers a second with SQLITE_BUSY (sqlite.org/rescode.html#busy); @libsql/client opens a
// connection per interactive transaction with no busy timeout, so without db/write-lock.ts the
// second of two simultaneous uploads would fail. These must all succeed.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { getDb } from "@/db";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

beforeAll(async () => {
  await useTempDatabase({ seed: false });
  await getDb().run(sql`create table counter_probe (id integer primary key, v integer not null)`);
  await getDb().run(sql`insert into counter_probe (id, v) values (1, 0)`);
});
afterAll(dropTempDatabase);

describe("embedded database under concurrent writes", () => {
  it("runs overlapping transactions one after another instead of failing with SQLITE_BUSY", async () => {
    const db = getDb();
    const work = (i: number) =>
      db.transaction(async (tx) => {
        const [row] = await tx.all<{ v: number }>(sql`select v from counter_probe where id = 1`);
        await new Promise((r) => setTimeout(r, 5));
        await tx.run(sql`update counter_probe set v = ${row.v + 1} where id = 1`);
        return i;
      });
    const results = await Promise.allSettled(Array.from({ length: 8 }, (_, i) => work(i)));
    expect(results.map((r) => r.status)).toEqual(Array(8).fill("fulfilled"));
    // Serialised read-modify-write: no lost update.
    const [row] = await db.all<{ v: number }>(sql`select v from counter_probe where id = 1`);
    expect(row.v).toBe(8);
  });

  it("lets a statement sent through getDb() inside a transaction through (no self-deadlock)", async () => {
    const db = getDb();
    const v = await db.transaction(async (tx) => {
      await tx.run(sql`update counter_probe set v = 100 where id = 1`);
      const [row] = await getDb().all<{ v: number }>(sql`select v from counter_probe where id = 1`);
      return row.v;
    });
    expect(typeof v).toBe("number");
  });

  it("runs plain statements alongside transactions without SQLITE_BUSY", async () => {
    const db = getDb();
    const jobs = Array.from({ length: 6 }, (_, i) =>
      i % 2 === 0
        ? db.transaction(async (tx) => {
            await tx.run(sql`update counter_probe set v = v + 1 where id = 1`);
            await new Promise((r) => setTimeout(r, 5));
          })
        : db.run(sql`update counter_probe set v = v + 1 where id = 1`),
    );
    const results = await Promise.allSettled(jobs);
    expect(results.map((r) => r.status)).toEqual(Array(6).fill("fulfilled"));
  });
});
