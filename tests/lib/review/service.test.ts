// The review service against a fresh temporary database: the compare-and-set write that
// decides between simultaneous steps, signature throttling, and the fan-out of the
// machine's recipients. Rules from issue 7; throttling numbers are common practice
// (OWASP Authentication Cheat Sheet advises throttling repeated failures; the numbers are ours).
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { listMembers } from "@/db/queries/members";
import { compareAndSetReview } from "@/db/queries/review";
import { scopeForTrustedCode } from "@/db/queries/scope";
import { getUserById } from "@/db/queries/users";
import { revisions } from "@/db/schema-chips";
import { DEMO_PASSWORD, type DemoContext } from "@/db/seed";
import type { MemberContext } from "@/lib/auth/require";
import type { Role } from "@/lib/auth/roles";
import { createChip, createOperatingPoint, saveLayerMap, uploadRevision } from "@/lib/chips/service";
import { planNotifications } from "@/lib/notifications/service";
import { reviewMail } from "@/lib/notifications/templates";
import { MAX_SIGNATURE_FAILURES, getReviewOverview, takeReviewStep } from "@/lib/review/service";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";
import { fixtureBytes } from "@/tests/support/uploads";

let demo: DemoContext;
let storageDir: string;

async function ctxFor(email: string, roles: Role[]): Promise<MemberContext> {
  const user = (await getUserById(demo.users[email]))!;
  const ws = demo.workspaces.brookmere;
  return { user, workspace: ws, scope: scopeForTrustedCode({ userId: user.id, workspaceId: ws.id, roles }) };
}

async function revisionWithAnalysis(name: string, flow: string) {
  const designer = await ctxFor("designer@brookmere.test", ["designer"]);
  const chip = await createChip(designer, { name, purpose: "" });
  const { revision } = await uploadRevision(designer, chip.id, { fileName: "tee.dxf", bytes: fixtureBytes("tee-um-r2000.dxf"), note: "" });
  await saveLayerMap(designer, chip.id, 1, {
    layers: { FLOW: { role: "channel", depth: "50 um", width: "100 um" }, PORTS: { role: "port" }, DIE: { role: "outline" }, TEXT: { role: "ignore" } },
  } as never);
  const op = await createOperatingPoint(designer, chip.id, 1, {
    name: "nominal",
    fluid: "preset:water",
    temperature: "25 degC",
    process: "pdms_soft_lithography",
    pumpMaxPressure: "2 bar",
    cells: false,
    ports: [
      { name: "A", drive: "flow", value: flow },
      { name: "B", drive: "pressure", value: "0 mbar" },
      { name: "C", drive: "pressure", value: "0 mbar" },
    ],
  });
  return { designer, chip, revision, analysisId: op.analysisId };
}

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("compare-and-set", () => {
  it("lets exactly one of two writes with the same expected version through", async () => {
    const { designer, revision } = await revisionWithAnalysis("CAS chip", "10 uL/min");
    const db = getDb();
    const first = await compareAndSetReview(db, designer.scope, revision.id, 0, { state: "with_fluidics", version: 1, analysisId: null, since: new Date() });
    const second = await compareAndSetReview(db, designer.scope, revision.id, 0, { state: "withdrawn", version: 1, analysisId: null, since: new Date() });
    expect([first, second]).toEqual([true, false]);
    const [row] = await db.select().from(revisions).where(eq(revisions.id, revision.id));
    expect(row).toMatchObject({ reviewState: "with_fluidics", reviewVersion: 1 });
  });

  it("does not touch another workspace's revision even with the right version", async () => {
    const { revision } = await revisionWithAnalysis("Scoped CAS chip", "10 uL/min");
    const other = scopeForTrustedCode({ userId: demo.users["designer@halvard.test"], workspaceId: demo.workspaces.halvard.id, roles: ["designer"] });
    expect(await compareAndSetReview(getDb(), other, revision.id, 0, { state: "cleared", version: 1, analysisId: null, since: null })).toBe(false);
  });
});

describe("signature", () => {
  it("refuses a wrong password (403), then throttles after repeated failures (429) even with the right one", async () => {
    const { designer, revision } = await revisionWithAnalysis("Signature chip", "10 uL/min");
    const reviewer = await ctxFor("reviewer@brookmere.test", ["fluidics_reviewer"]);
    await takeReviewStep(designer, revision.id, { type: "submit", expectedVersion: 0, note: "Ready." });
    await takeReviewStep(reviewer, revision.id, { type: "pass_fluidics", expectedVersion: 1 });
    const fab = await ctxFor("fab@brookmere.test", ["fab_liaison"]);
    const clear = (password: string) => takeReviewStep(fab, revision.id, { type: "clear", expectedVersion: 2, fabName: "Kestrel Foundry", process: "PDMS", password });
    for (let i = 0; i < MAX_SIGNATURE_FAILURES; i++) await expect(clear("wrong-password")).rejects.toMatchObject({ status: 403, code: "signature_not_verified" });
    await expect(clear(DEMO_PASSWORD)).rejects.toMatchObject({ status: 429, code: "rate_limited" });
    const overview = await getReviewOverview(fab, revision.id);
    expect(overview.state.status).toBe("with_fab");
    expect(overview.clearance).toBeNull();
  });
});

describe("fan-out", () => {
  it("expands role recipients minus the uploader, never notifies the actor, and names the revision", async () => {
    const scope = scopeForTrustedCode({ userId: demo.users["designer@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["designer"] });
    const members = await listMembers(scope);
    const designerId = demo.users["designer@brookmere.test"];
    const planned = planNotifications(
      [
        { kind: "review_requested", to: [{ role: "fluidics_reviewer", exceptMemberIds: [String(designerId)] }], details: { stage: "fluidics" } },
        { kind: "cleared", to: [{ memberId: String(designerId) }, { role: "lead", exceptMemberIds: [] }], details: { fabName: "Kestrel" } },
      ],
      members,
      { userId: designerId, name: "Tobiah Quill" },
      { revisionId: 1, chipId: 1, chipName: "Tee", number: 3 },
    );
    expect(planned.map((p) => [p.kind, p.userId])).toEqual([
      ["review_requested", demo.users["reviewer@brookmere.test"]],
      ["cleared", demo.users["lead@brookmere.test"]],
    ]);
    expect(planned[0].summary).toBe("Tobiah Quill asks for fluidics review of Tee revision 3.");
    const mail = reviewMail({
      kind: "cleared",
      recipientName: "Sunniva Holt",
      actorName: "Dario Penwright",
      workspaceName: "Brookmere Biofluidics",
      chipName: "Tee",
      revisionNumber: 3,
      link: "http://localhost:3000/w/brookmere/chips/1/revisions/3/review",
      details: { fabName: "Kestrel", process: "PDMS", fileSha256: "ab".repeat(32) },
    });
    expect(mail.subject).toBe("Cleared for tape-out: Tee revision 3 — Brookmere Biofluidics");
    expect(mail.text.split("\n")).toContain("http://localhost:3000/w/brookmere/chips/1/revisions/3/review");
  });
});

describe("words for the history and the queue", () => {
  it("names flags by their rule title and target, and says how long something waited", async () => {
    const { describeAuditEvent, describeFlagKey, formatWaited } = await import("@/lib/review/describe");
    // Titles come from the rule registry (lib/rules/registry.ts).
    const { ruleDefinition } = await import("@/lib/rules/registry");
    expect(describeFlagKey("pump_pressure_max|port|A")).toBe(`${ruleDefinition("pump_pressure_max").title} (port A)`);
    expect(describeAuditEvent("review.flag_waived", { flagKey: "pressure_bond|port|A", severity: "block", justification: "Clamped fixture." })).toBe(
      `Waived the blocking flag “${ruleDefinition("pressure_bond").title} (port A)” — “Clamped fixture.”`,
    );
    // Plain arithmetic: 3 h 20 min = 12 000 s; 4 d 2 h = 352 800 s.
    expect(formatWaited(0, 45 * 60_000)).toBe("45 min");
    expect(formatWaited(0, 12_000_000)).toBe("3 h 20 min");
    expect(formatWaited(0, 352_800_000)).toBe("4 d 2 h");
    expect(formatWaited(10_000, 0)).toBe("0 min");
  });
});
