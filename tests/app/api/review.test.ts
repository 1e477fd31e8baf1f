// The review path through the /api/v1 route handlers, against a fresh temporary SQLite
// file and storage folder. Product rules from issue 7 (review and sign-off): only the
// named role takes each step, nobody reviews or clears what they uploaded (four-eyes),
// two simultaneous approvals cannot both win, every step is audited, a cleared revision
// is frozen. Status codes per RFC 9110 §15 (403 Forbidden, 409 Conflict).
import { spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
import { POST as createChipRoute } from "@/app/api/v1/workspaces/[workspaceId]/chips/route";
import { POST as uploadRoute } from "@/app/api/v1/chips/[chipId]/revisions/route";
import { PUT as layerMapRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/layer-map/route";
import { POST as operatingPointRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/operating-points/route";
import { GET as reviewRoute } from "@/app/api/v1/revisions/[revisionId]/review/route";
import { POST as submitRoute } from "@/app/api/v1/revisions/[revisionId]/review/submit/route";
import { POST as updateAnalysisRoute } from "@/app/api/v1/revisions/[revisionId]/review/analysis/route";
import { POST as flagsRoute } from "@/app/api/v1/revisions/[revisionId]/review/flags/route";
import { POST as passRoute } from "@/app/api/v1/revisions/[revisionId]/review/pass/route";
import { POST as requestChangesRoute } from "@/app/api/v1/revisions/[revisionId]/review/request-changes/route";
import { POST as clearRoute } from "@/app/api/v1/revisions/[revisionId]/review/clear/route";
import { POST as withdrawRoute } from "@/app/api/v1/revisions/[revisionId]/review/withdraw/route";
import { GET as commentsRoute, POST as commentRoute } from "@/app/api/v1/revisions/[revisionId]/review/comments/route";
import { PATCH as resolveRoute } from "@/app/api/v1/revisions/[revisionId]/review/comments/[commentId]/route";
import { GET as auditRoute } from "@/app/api/v1/revisions/[revisionId]/audit/route";
import { GET as inboxRoute } from "@/app/api/v1/notifications/route";
import { POST as readRoute } from "@/app/api/v1/notifications/read/route";
import { GET as getPrefsRoute, PUT as putPrefsRoute } from "@/app/api/v1/notifications/preferences/route";
import { getDb } from "@/db";
import { mailOutbox, membershipRoles, memberships } from "@/db/schema";
import { clearances } from "@/db/schema-review";
import { DEMO_PASSWORD, type DemoContext } from "@/db/seed";
import { actAs } from "@/tests/support/fake-session";
import { call } from "@/tests/support/requests";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";
import { fixtureBytes, send, uploadRequest } from "@/tests/support/uploads";
import { TEE, TEE_LAYERS as LAYERS, teeForm as form, BOND_FLAG as BOND, PUMP_FLAG as PUMP } from "@/tests/support/tee-fixture";

let demo: DemoContext;
let storageDir: string;
const u = (email: string) => demo.users[email];
const DESIGNER = "designer@brookmere.test";
const DESIGNER2 = "designer2@brookmere.test";
const REVIEWER = "reviewer@brookmere.test";
const FAB = "fab@brookmere.test";
const LEAD = "lead@brookmere.test";
const ADMIN = "admin@brookmere.test";

const WAIVER = "The bench uses a 4 bar pressure controller for this run; the pump limit does not apply.";

type Setup = { chipId: number; revisionId: number; params: { chipId: string; number: string }; analysisId: number; bytes: Uint8Array };
let chipCounter = 0;

/** A chip with one mapped revision and one analysed operating point, uploaded by `designer`. */
async function setupRevision(designer = DESIGNER, flow = "2000 uL/min", file = TEE): Promise<Setup> {
  actAs(u(designer));
  chipCounter += 1;
  const chip = await call(createChipRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) }, json: { name: `Review chip ${chipCounter}` } });
  expect(chip.status).toBe(201);
  const chipId = (chip.body.chip as { id: number }).id;
  const bytes = fixtureBytes(file);
  const up = await send(uploadRoute, uploadRequest(`http://localhost/api/v1/chips/${chipId}/revisions`, { name: file, bytes }, { note: "first cut" }), {
    chipId: String(chipId),
  });
  expect(up.status).toBe(201);
  const revisionId = (up.body.revision as { id: number }).id;
  const params = { chipId: String(chipId), number: "1" };
  expect((await call(layerMapRoute, { method: "PUT", params, json: { layers: LAYERS } })).status).toBe(201);
  const op = await call(operatingPointRoute, { params, json: form("nominal", flow) });
  expect(op.status).toBe(201);
  return { chipId, revisionId, params, analysisId: op.body.analysis_id as number, bytes };
}

const rp = (s: Setup) => ({ revisionId: String(s.revisionId) });

async function version(s: Setup): Promise<number> {
  const res = await call(reviewRoute, { params: rp(s) });
  expect(res.status).toBe(200);
  return (res.body.review as { version: number }).version;
}

async function step(handler: Parameters<typeof call>[0], s: Setup, as: string, json: Record<string, unknown>) {
  actAs(u(as));
  const expectedVersion = json.expectedVersion ?? (await version(s));
  return call(handler, { params: rp(s), json: { expectedVersion, ...json } });
}

async function outboxTo(email: string): Promise<{ subject: string; text: string }[]> {
  return getDb().select({ subject: mailOutbox.subject, text: mailOutbox.text }).from(mailOutbox).where(eq(mailOutbox.toAddress, email));
}

async function grantRoles(email: string, roles: ("designer" | "fluidics_reviewer" | "fab_liaison")[]) {
  const [m] = await getDb()
    .select({ id: memberships.id })
    .from(memberships)
    .where(and(eq(memberships.userId, u(email)), eq(memberships.workspaceId, demo.workspaces.brookmere.id)));
  await getDb().insert(membershipRoles).values(roles.map((role) => ({ membershipId: m.id, role }))).onConflictDoNothing();
}

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
  // designer2 also holds both reviewing roles, so only the four-eyes rule stands between them and their own upload.
  await grantRoles(DESIGNER2, ["fluidics_reviewer", "fab_liaison"]);
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("the whole path", () => {
  it("submit → waive one flag, must-fix another → designer's fix → pass → clear with signature → frozen, with mail and audit", async () => {
    const s = await setupRevision();
    const before = (await outboxTo(REVIEWER)).length;

    const geometryOnlyNote = await step(submitRoute, s, DESIGNER, { note: "" });
    expect(geometryOnlyNote.status).toBe(400);
    expect(geometryOnlyNote.body.error?.message).toMatch(/note is required/i);

    const submitted = await step(submitRoute, s, DESIGNER, { note: "First cut of the tee; driving hard to see the limits." });
    expect(submitted.status).toBe(200);
    expect(submitted.body.review).toMatchObject({ state: "with_fluidics", label: "With fluidics review", version: 1 });
    const mails = await outboxTo(REVIEWER);
    expect(mails.length).toBe(before + 1);
    expect(mails.at(-1)!.subject).toMatch(/^Review requested: Review chip \d+ revision 1/);
    expect(mails.at(-1)!.text).toContain(`/chips/${s.chipId}/revisions/1/review`);

    actAs(u(REVIEWER));
    const overview = await call(reviewRoute, { params: rp(s) });
    const flags = overview.body.flags as { flag_key: string; severity: string; status: string }[];
    expect(flags.filter((f) => f.severity === "block").map((f) => f.flag_key).sort()).toEqual([BOND, PUMP]);
    expect(overview.body.allowed).toEqual(expect.arrayContaining(["dispose_flag", "pass_fluidics", "request_changes"]));

    const shortWaiver = await step(flagsRoute, s, REVIEWER, { flagKey: PUMP, decision: "waived", justification: "fine" });
    expect(shortWaiver.status).toBe(400);
    expect(shortWaiver.body.error?.message).toMatch(/justification/i);
    expect((await step(flagsRoute, s, REVIEWER, { flagKey: PUMP, decision: "waived", justification: WAIVER })).status).toBe(200);
    expect((await step(flagsRoute, s, REVIEWER, { flagKey: BOND, decision: "must_fix", justification: "Bond would fail; lower the flow." })).status).toBe(200);

    const early = await step(passRoute, s, REVIEWER, {});
    expect(early.status).toBe(409);
    expect(early.body.error?.code).toBe("flags_unresolved");
    expect(early.body.error?.message).toMatch(/must-fix/);

    // The designer's fix: a gentler operating point on the same revision, put under review.
    actAs(u(DESIGNER));
    const fixed = await call(operatingPointRoute, { params: s.params, json: form("gentle", "200 uL/min") });
    expect(fixed.status).toBe(201);
    const updated = await step(updateAnalysisRoute, s, DESIGNER, { analysisId: fixed.body.analysis_id, note: "Flow lowered to 200 µL/min." });
    expect(updated.status).toBe(200);
    actAs(u(REVIEWER));
    const afterFix = await call(reviewRoute, { params: rp(s) });
    const statuses = Object.fromEntries((afterFix.body.flags as { flag_key: string; status: string }[]).map((f) => [f.flag_key, f.status]));
    expect(statuses[BOND]).toBe("fixed");
    expect(statuses[PUMP]).toBe("fixed");

    const passed = await step(passRoute, s, REVIEWER, { note: "Regimes fine at 200 µL/min." });
    expect(passed.status).toBe(200);
    expect((passed.body.review as { state: string }).state).toBe("with_fab");
    expect((await outboxTo(FAB)).some((m) => m.subject.startsWith("Review requested"))).toBe(true);

    const wrongPassword = await step(clearRoute, s, FAB, { fabName: "Kestrel Foundry (invented)", process: "PDMS soft lithography", password: "not-my-password" });
    expect(wrongPassword.status).toBe(403);
    expect(wrongPassword.body.error?.code).toBe("signature_not_verified");
    const noFab = await step(clearRoute, s, FAB, { fabName: " ", process: "PDMS soft lithography", password: DEMO_PASSWORD });
    expect(noFab.status).toBe(400);
    const cleared = await step(clearRoute, s, FAB, { fabName: "Kestrel Foundry (invented)", process: "PDMS soft lithography", password: DEMO_PASSWORD });
    expect(cleared.status).toBe(200);
    expect((cleared.body.review as { state: string }).state).toBe("cleared");

    // The clearance record: who, the file's SHA-256 (FIPS 180-4, computed independently with node:crypto) and the analysis.
    const [record] = await getDb().select().from(clearances).where(eq(clearances.revisionId, s.revisionId));
    expect(record.byUserId).toBe(u(FAB));
    expect(record.fileSha256).toBe(createHash("sha256").update(s.bytes).digest("hex"));
    expect(record.analysisId).toBe(fixed.body.analysis_id);
    expect(record.fabName).toBe("Kestrel Foundry (invented)");
    expect((await outboxTo(DESIGNER)).some((m) => m.subject.startsWith("Cleared for tape-out"))).toBe(true);
    expect((await outboxTo(LEAD)).some((m) => m.subject.startsWith("Cleared for tape-out"))).toBe(true);

    // Frozen: the chips API refuses a new operating point and a layer map (409), and review steps end.
    actAs(u(DESIGNER));
    const op = await call(operatingPointRoute, { params: s.params, json: form("after clearance", "10 uL/min") });
    expect(op.status).toBe(409);
    expect(op.body.error?.code).toBe("revision_frozen");
    expect((await call(layerMapRoute, { method: "PUT", params: s.params, json: { layers: LAYERS } })).status).toBe(409);
    const withdraw = await step(withdrawRoute, s, DESIGNER, {});
    expect(withdraw.status).toBe(409);

    // Audit: every step in order, JSON and CSV.
    const audit = await call(auditRoute, { params: rp(s), url: "http://localhost/x?format=json" });
    const actions = (audit.body.events as { action: string }[]).map((e) => e.action).filter((a) => a.startsWith("review."));
    expect(actions).toEqual([
      "review.submitted",
      "review.flag_waived",
      "review.flag_must_fix",
      "review.analysis_updated",
      "review.fluidics_passed",
      "review.signature_failed",
      "review.cleared",
    ]);
  });
});

describe("refusals", () => {
  it("refuses each step for the wrong role with 403", async () => {
    const s = await setupRevision();
    expect((await step(submitRoute, s, LEAD, { note: "x" })).status).toBe(403);
    expect((await step(submitRoute, s, REVIEWER, { note: "x" })).status).toBe(403);
    expect((await step(submitRoute, s, DESIGNER, { note: "Ready for review." })).status).toBe(200);
    expect((await step(flagsRoute, s, DESIGNER, { flagKey: PUMP, decision: "must_fix" })).status).toBe(403);
    expect((await step(flagsRoute, s, FAB, { flagKey: PUMP, decision: "must_fix" })).status).toBe(403);
    expect((await step(passRoute, s, FAB, {})).status).toBe(403);
    expect((await step(passRoute, s, LEAD, {})).status).toBe(403);
    expect((await step(requestChangesRoute, s, LEAD, { note: "Leads only read." })).status).toBe(403);
    expect((await step(requestChangesRoute, s, DESIGNER, { note: "Designers do not review." })).status).toBe(403);
    const fabTooEarly = await step(requestChangesRoute, s, FAB, { note: "Not my stage yet." });
    expect(fabTooEarly.status).toBe(403);
    expect(fabTooEarly.body.error?.message).toMatch(/At this stage only a fluidics reviewer/);
    expect((await step(clearRoute, s, REVIEWER, { fabName: "F", process: "P", password: DEMO_PASSWORD })).status).toBe(403);
    expect((await step(withdrawRoute, s, REVIEWER, {})).status).toBe(403);
    const notUploader = await step(withdrawRoute, s, DESIGNER2, {});
    expect(notUploader.status).toBe(403);
    actAs(u(LEAD));
    expect((await call(commentRoute, { params: rp(s), json: { body: "Looks good." } })).status).toBe(403);
  });

  it("refuses the uploader every reviewing step (four-eyes, 403), even holding the roles", async () => {
    const s = await setupRevision(DESIGNER2);
    expect((await step(submitRoute, s, DESIGNER2, { note: "My own tee." })).status).toBe(200);
    for (const [handler, json] of [
      [flagsRoute, { flagKey: PUMP, decision: "waived", justification: WAIVER }],
      [passRoute, {}],
      [requestChangesRoute, { note: "Changing my own mind." }],
    ] as const) {
      const res = await step(handler, s, DESIGNER2, json);
      expect(res.status).toBe(403);
      expect(res.body.error?.code).toBe("four_eyes");
    }
    // Someone else passes it; the uploader still may not clear it.
    await step(flagsRoute, s, REVIEWER, { flagKey: PUMP, decision: "waived", justification: WAIVER });
    await step(flagsRoute, s, REVIEWER, { flagKey: BOND, decision: "waived", justification: "Clamped fixture: the bond is mechanically supported in this test." });
    expect((await step(passRoute, s, REVIEWER, {})).status).toBe(200);
    const clear = await step(clearRoute, s, DESIGNER2, { fabName: "F", process: "P", password: DEMO_PASSWORD });
    expect(clear.status).toBe(403);
    expect(clear.body.error?.code).toBe("four_eyes");
  });

  it("refuses steps in the wrong state with 409 and a message naming the state", async () => {
    const s = await setupRevision();
    const pass = await step(passRoute, s, REVIEWER, {});
    expect(pass.status).toBe(409);
    expect(pass.body.error?.code).toBe("wrong_state");
    expect(pass.body.error?.message).toMatch(/This revision is draft.*with fluidics review/);
    expect((await step(clearRoute, s, FAB, { fabName: "F", process: "P", password: DEMO_PASSWORD })).status).toBe(409);
    expect((await step(submitRoute, s, DESIGNER, { note: "Ready." })).status).toBe(200);
    const again = await step(submitRoute, s, DESIGNER, { note: "Again." });
    expect(again.status).toBe(409);
    expect(again.body.error?.message).toMatch(/with fluidics review/);
    const stale = await step(requestChangesRoute, s, REVIEWER, { note: "Old page.", expectedVersion: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error?.code).toBe("stale_version");
    expect((await step(withdrawRoute, s, DESIGNER, { reason: "Superseded." })).status).toBe(200);
    actAs(u(DESIGNER));
    const op = await call(operatingPointRoute, { params: s.params, json: form("late", "10 uL/min") });
    expect(op.status).toBe(409);
    expect(op.body.error?.code).toBe("revision_withdrawn");
  });

  it("lets exactly one of two simultaneous approvals win; the other gets 409 stale_version", async () => {
    const s = await setupRevision(DESIGNER, "10 uL/min"); // info flags only, so pass needs no dispositions
    expect((await step(submitRoute, s, DESIGNER, { note: "Gentle flow." })).status).toBe(200);
    actAs(u(REVIEWER));
    const v = await version(s);
    const [a, b] = await Promise.all([
      call(passRoute, { params: rp(s), json: { expectedVersion: v } }),
      call(passRoute, { params: rp(s), json: { expectedVersion: v } }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.error?.code).toBe("stale_version");
    expect(loser.body.error?.message).toMatch(/Someone else acted on this revision/);
    const audit = await call(auditRoute, { params: rp(s) });
    expect((audit.body.events as { action: string }[]).filter((e) => e.action === "review.fluidics_passed")).toHaveLength(1);
    expect(await version(s)).toBe(v + 1);
  });

  it("answers 404 for an unknown revision and 403 for another workspace's", async () => {
    const s = await setupRevision();
    actAs(u("designer@halvard.test"));
    expect((await call(reviewRoute, { params: rp(s) })).status).toBe(403);
    expect((await call(submitRoute, { params: rp(s), json: { expectedVersion: 0, note: "x" } })).status).toBe(403);
    expect((await call(reviewRoute, { params: { revisionId: "999999" } })).status).toBe(404);
  });
});

describe("notifications", () => {
  it("writes each kind to the inbox always, and e-mails it unless the member switched that kind off", async () => {
    // The reviewer turns off review-requested e-mail.
    actAs(u(REVIEWER));
    const ws = String(demo.workspaces.brookmere.id);
    const put = await call(putPrefsRoute, { method: "PUT", url: `http://localhost/x?workspaceId=${ws}`, json: { review_requested: false } });
    expect(put.status).toBe(200);
    expect(put.body.email).toEqual({ review_requested: false, changes_requested: true, cleared: true, mentioned: true });
    expect((await call(getPrefsRoute, { url: `http://localhost/x?workspaceId=${ws}` })).body.email).toMatchObject({ review_requested: false });

    const s = await setupRevision();
    const reviewerMailBefore = (await outboxTo(REVIEWER)).length;
    actAs(u(REVIEWER));
    const inboxBefore = ((await call(inboxRoute, { url: `http://localhost/x?workspaceId=${ws}` })).body.notifications as unknown[]).length;
    expect((await step(submitRoute, s, DESIGNER, { note: "Please look." })).status).toBe(200);
    expect((await outboxTo(REVIEWER)).length).toBe(reviewerMailBefore);
    actAs(u(REVIEWER));
    const inbox = await call(inboxRoute, { url: `http://localhost/x?workspaceId=${ws}` });
    const items = inbox.body.notifications as { id: number; kind: string; revision_id: number; read_at: string | null }[];
    expect(items.length).toBe(inboxBefore + 1);
    expect(items[0]).toMatchObject({ kind: "review_requested", revision_id: s.revisionId, read_at: null });

    // Mentioned: the reviewer @-mentions the designer by name; a reply pins to a segment.
    const designerMailBefore = (await outboxTo(DESIGNER)).length;
    const comment = await call(commentRoute, { params: rp(s), json: { body: "@Tobiah Quill the inlet pressure is high here.", segmentId: "s1" } });
    expect(comment.status).toBe(201);
    expect(comment.body.mentioned).toEqual([u(DESIGNER)]);
    const designerMail = await outboxTo(DESIGNER);
    expect(designerMail.length).toBe(designerMailBefore + 1);
    expect(designerMail.at(-1)!.subject).toMatch(/^You were mentioned on/);
    expect(designerMail.at(-1)!.text).toContain("> @Tobiah Quill the inlet pressure is high here.");

    // Changes requested → the designer.
    expect((await step(requestChangesRoute, s, REVIEWER, { note: "Lower the flow and resubmit." })).status).toBe(200);
    const changes = await outboxTo(DESIGNER);
    expect(changes.at(-1)!.subject).toMatch(/^Changes requested/);
    expect(changes.at(-1)!.text).toContain("> Lower the flow and resubmit.");

    // Mark read.
    actAs(u(REVIEWER));
    const read = await call(readRoute, { url: `http://localhost/x?workspaceId=${ws}`, json: { ids: [items[0].id] } });
    expect(read.body.marked).toBe(1);
    const unread = await call(inboxRoute, { url: `http://localhost/x?workspaceId=${ws}&unread=1` });
    expect((unread.body.notifications as { id: number }[]).some((n) => n.id === items[0].id)).toBe(false);
    await call(putPrefsRoute, { method: "PUT", url: `http://localhost/x?workspaceId=${ws}`, json: { review_requested: true } });
  });
});

describe("comments", () => {
  it("threads replies under the first comment, pins to a point, resolves and reopens", async () => {
    const s = await setupRevision(DESIGNER, "10 uL/min");
    actAs(u(REVIEWER));
    const first = await call(commentRoute, { params: rp(s), json: { body: "Why this width at the junction?", x_m: 0.001, y_m: 0.0005 } });
    expect(first.status).toBe(201);
    actAs(u(DESIGNER));
    const reply = await call(commentRoute, { params: rp(s), json: { body: "To match the outlet.", parentId: first.body.comment_id } });
    const replyToReply = await call(commentRoute, { params: rp(s), json: { body: "And the inlet.", parentId: reply.body.comment_id } });
    expect(replyToReply.status).toBe(201);
    expect((await call(commentRoute, { params: rp(s), json: { body: "   " } })).status).toBe(400);
    expect((await call(commentRoute, { params: rp(s), json: { body: "half a pin", x_m: 0.001 } })).status).toBe(400);
    const list = (await call(commentsRoute, { params: rp(s) })).body.comments as { id: number; parent_id: number | null; point: unknown }[];
    expect(list.map((c) => c.parent_id)).toEqual([null, first.body.comment_id, first.body.comment_id]);
    expect(list[0].point).toEqual({ x_m: 0.001, y_m: 0.0005 });

    const cp = { revisionId: String(s.revisionId), commentId: String(first.body.comment_id) };
    expect((await call(resolveRoute, { method: "PATCH", params: cp, json: { resolved: true } })).status).toBe(200);
    expect((await call(resolveRoute, { method: "PATCH", params: cp, json: { resolved: true } })).status).toBe(409);
    expect((await call(resolveRoute, { method: "PATCH", params: cp, json: { resolved: false } })).status).toBe(200);
    actAs(u(LEAD));
    expect((await call(resolveRoute, { method: "PATCH", params: cp, json: { resolved: true } })).status).toBe(403);
  });
});

describe("audit trail", () => {
  it("exports the same events as JSON and as RFC 4180 CSV (parsed back with Python's csv module)", async () => {
    const s = await setupRevision(DESIGNER, "10 uL/min");
    expect((await step(submitRoute, s, DESIGNER, { note: 'Note with "quotes", a comma\nand a line break.' })).status).toBe(200);
    actAs(u(ADMIN));
    const json = await call(auditRoute, { params: rp(s) });
    expect(json.status).toBe(200);
    const events = json.body.events as { id: number; at: string; actor: string | null; action: string; details: Record<string, unknown> }[];
    expect(events.map((e) => e.action)).toEqual(["revision.uploaded", "revision.layers_mapped", "analysis.completed", "review.submitted"]);
    expect(events[3].details).toMatchObject({ from: "draft", to: "with_fluidics", note: 'Note with "quotes", a comma\nand a line break.' });

    const csv = await call(auditRoute, { params: rp(s), url: "http://localhost/x?format=csv" });
    expect(csv.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(csv.text.endsWith("\r\n")).toBe(true);
    // Independent parser: CPython's csv module (RFC 4180 dialect "excel").
    const py = spawnSync("/usr/bin/python3", ["-c", "import csv,io,json,sys; print(json.dumps(list(csv.reader(io.TextIOWrapper(sys.stdin.buffer, newline='')))))"], {
      input: csv.text,
    });
    expect(py.status).toBe(0);
    const rows = JSON.parse(py.stdout.toString()) as string[][];
    expect(rows[0]).toEqual(["id", "at_utc", "actor", "action", "details_json"]);
    expect(rows.slice(1).map((r) => [Number(r[0]), r[1], r[2], r[3], JSON.parse(r[4])])).toEqual(events.map((e) => [e.id, e.at, e.actor ?? "", e.action, e.details]));
    expect((await call(auditRoute, { params: rp(s), url: "http://localhost/x?format=xml" })).status).toBe(400);
  });

  it("has no route that writes to audit events, and the database refuses updates and deletes", async () => {
    const apiRoot = path.resolve(__dirname, "../../../app/api");
    const routeFiles: string[] = [];
    const walk = (dir: string) => {
      for (const name of readdirSync(dir)) {
        const p = path.join(dir, name);
        if (statSync(p).isDirectory()) walk(p);
        else if (name === "route.ts") routeFiles.push(p);
      }
    };
    walk(apiRoot);
    const auditRoutes = routeFiles.filter((f) => f.includes(`${path.sep}audit${path.sep}`));
    expect(auditRoutes.length).toBeGreaterThan(0);
    for (const f of auditRoutes) expect(readFileSync(f, "utf8")).not.toMatch(/export const (POST|PUT|PATCH|DELETE)\b/);
    for (const f of routeFiles) expect(readFileSync(f, "utf8")).not.toMatch(/(update|delete)\(\s*auditEvents/);

    const db = getDb();
    /** Drizzle wraps the driver's error; the trigger's RAISE message is on the cause. */
    const refusal = async (statement: ReturnType<typeof sql>) => {
      try {
        await db.run(statement);
        return "accepted";
      } catch (err) {
        const e = err as Error & { cause?: Error };
        return `${e.message} ${e.cause?.message ?? ""}`;
      }
    };
    expect(await refusal(sql`UPDATE audit_events SET action = 'review.cleared' WHERE id = 1`)).toMatch(/append-only/);
    expect(await refusal(sql`DELETE FROM audit_events`)).toMatch(/append-only/);
    expect(await refusal(sql`UPDATE clearances SET fab_name = 'other'`)).toMatch(/immutable/);
    expect(await refusal(sql`DELETE FROM clearances`)).toMatch(/immutable/);
    expect(await refusal(sql`UPDATE flag_dispositions SET decision = 'waived'`)).toMatch(/append-only/);
    expect(await refusal(sql`DELETE FROM flag_dispositions`)).toMatch(/append-only/);
    expect(await refusal(sql`INSERT INTO flag_dispositions (workspace_id, revision_id, analysis_id, flag_key, decision, justification, by_user_id, at)
      SELECT workspace_id, revision_id, analysis_id, flag_key, 'waived', '  ', by_user_id, at FROM flag_dispositions LIMIT 1`)).toMatch(/CHECK constraint/);
  });
});
