// The demo review history goes through the real review service, so it must obey the
// review rules of issue 7: a revision reaches "cleared" only after fluidics passes and a
// fab liaison signs with their password, and every step leaves an audit event and mail.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { getDb } from "@/db";
import { seedChipsStep } from "@/db/seed-chips";
import { seedReviewStep } from "@/db/seed-review";
import type { DemoContext } from "@/db/seed";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
let storageDir: string;

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
  await seedChipsStep.run(demo);
  await seedReviewStep.run(demo);
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("demo review history", () => {
  it("leaves the gradient generator cleared, the droplet generator with fluidics and the mixer submitted", async () => {
    const rows = await getDb().all<{ name: string; number: number; review_state: string }>(
      sql`select c.name, r.number, r.review_state from revisions r join chips c on c.id = r.chip_id order by c.name, r.number`,
    );
    const state = Object.fromEntries(rows.map((r) => [`${r.name} #${r.number}`, r.review_state]));
    expect(state["Gradient generator GG-3 #2"]).toBe("cleared");
    expect(state["Droplet generator DG-1 #2"]).toBe("with_fluidics");
    expect(state["Serpentine mixer SM-2 #2"]).toBe("with_fluidics");
    expect(state["Gradient generator GG-3 #1"]).toBe("draft");
  });

  it("records the clearance signature with the file's digest, and mail in the outbox", async () => {
    const [clearance] = await getDb().all<{ file_sha256: string; sha256: string; fab_name: string }>(
      sql`select cl.file_sha256, r.sha256, cl.fab_name from clearances cl join revisions r on r.id = cl.revision_id`,
    );
    expect(clearance.file_sha256).toBe(clearance.sha256);
    expect(clearance.fab_name).toMatch(/invented/);
    const [{ n }] = await getDb().all<{ n: number }>(sql`select count(*) as n from mail_outbox where subject like '%leared%'`);
    expect(n).toBeGreaterThan(0);
    const [{ waived }] = await getDb().all<{ waived: number }>(sql`select count(*) as waived from flag_dispositions where decision = 'waived'`);
    expect(waived).toBeGreaterThanOrEqual(1);
  });
});
