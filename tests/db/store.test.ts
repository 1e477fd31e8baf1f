// Store invariants the database itself enforces (SQLite triggers and CHECK constraints, see
// https://sqlite.org/lang_createtrigger.html and lang_createtable.html#ckconst), and the
// workspace-scoping rule of db/queries (issue 2: no query returns another workspace's rows).
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { auditEvents, membershipRoles, memberships } from "@/db/schema";
import { insertAuditEvent, listAuditEvents } from "@/db/queries/audit";
import { listInvitations } from "@/db/queries/invitations";
import { listMembers } from "@/db/queries/members";
import { scopeForTrustedCode } from "@/db/queries/scope";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { DEMO_PEOPLE, seedDemo, type DemoContext } from "@/db/seed";
import { inviteMember } from "@/lib/auth/invitations";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
beforeAll(async () => {
  demo = (await useTempDatabase())!;
});
afterAll(dropTempDatabase);

/** Drizzle wraps driver errors ("Failed query: …"); the database's own message is in the cause. */
async function failure(p: Promise<unknown>): Promise<string> {
  try {
    await p;
  } catch (e) {
    const err = e as Error & { cause?: Error };
    return `${err.message} ${err.cause?.message ?? ""}`;
  }
  return "(no error)";
}

const scopeOf = (email: string, ws: "brookmere" | "halvard") =>
  scopeForTrustedCode({ userId: demo.users[email], workspaceId: demo.workspaces[ws].id, roles: ["admin"] });

describe("audit_events is append-only", () => {
  it("accepts inserts and refuses UPDATE and DELETE from any code path", async () => {
    const db = getDb();
    await insertAuditEvent(db, { workspaceId: demo.workspaces.brookmere.id, actorUserId: null, action: "test.event", objectType: "thing", objectId: 1 });
    expect(await failure(db.run(sql`update audit_events set action = 'tampered'`))).toMatch(/append-only/);
    expect(await failure(db.run(sql`delete from audit_events`))).toMatch(/append-only/);
    expect(await failure(db.update(auditEvents).set({ action: "x" }))).toMatch(/append-only/);
    const events = await listAuditEvents(scopeOf("admin@brookmere.test", "brookmere"), { objectType: "thing" });
    expect(events.map((e) => e.action)).toEqual(["test.event"]);
  });

  it("stores timestamps as UTC epoch milliseconds", async () => {
    const at = new Date("2026-05-04T03:02:01.123Z");
    await insertAuditEvent(getDb(), { workspaceId: null, actorUserId: null, action: "clock.check", objectType: "clock", objectId: "c", at });
    const rows = await getDb().all<{ at: number }>(sql`select at from audit_events where action = 'clock.check'`);
    expect(rows[0].at).toBe(Date.UTC(2026, 4, 4, 3, 2, 1, 123));
  });
});

describe("roles", () => {
  it("are limited to the five known roles by the database", async () => {
    const [m] = await getDb().select({ id: memberships.id }).from(memberships).limit(1);
    expect(await failure(getDb().insert(membershipRoles).values({ membershipId: m.id, role: "owner" as never }))).toMatch(/CHECK constraint failed/i);
  });

  it("seed gives every Brookmere role one person and the shared fab liaison two workspaces", async () => {
    const roles = (await listMembers(scopeOf("admin@brookmere.test", "brookmere"))).flatMap((m) => m.roles);
    expect(new Set(roles)).toEqual(new Set(["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"]));
    expect((await listWorkspacesForUser(demo.users["fab@brookmere.test"])).map((w) => w.name)).toEqual(["Brookmere Biofluidics", "Halvard Microsystems"]);
    expect(Object.keys(demo.users)).toEqual(DEMO_PEOPLE.map((p) => p.email));
  });

  it("seedDemo does nothing on a seeded database", async () => {
    await expect(seedDemo()).resolves.toBeNull();
  });
});

describe("workspace scoping in db/queries", () => {
  it("never returns another workspace's members, invitations or audit events", async () => {
    const b = scopeOf("admin@brookmere.test", "brookmere");
    const h = scopeOf("admin@halvard.test", "halvard");
    await inviteMember(b, { inviterName: "M", workspaceName: "Brookmere Biofluidics" }, { email: "only-b@brookmere.test", roles: ["lead"] });
    await inviteMember(h, { inviterName: "P", workspaceName: "Halvard Microsystems" }, { email: "only-h@halvard.test", roles: ["lead"] });
    expect((await listInvitations(b)).map((i) => i.email)).toEqual(["only-b@brookmere.test"]);
    expect((await listInvitations(h)).map((i) => i.email)).toEqual(["only-h@halvard.test"]);
    expect((await listMembers(h)).map((m) => m.email).sort()).toEqual(["admin@halvard.test", "designer@halvard.test", "fab@brookmere.test"]);
    const hEvents = await listAuditEvents(h);
    expect(hEvents.length).toBeGreaterThan(0);
    expect(hEvents.every((e) => !JSON.stringify(e).includes("only-b@"))).toBe(true);
  });
});
