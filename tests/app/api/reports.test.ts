// The lead's brief and share links through the /api/v1 route handlers, against a fresh
// temporary SQLite file and storage folder (issue 8). The PDF is read back with pdfjs-dist,
// an independent reader; its header is "%PDF-" (ISO 32000-1 §7.5.2). The file digest is
// SHA-256 (FIPS 180-4) computed independently with node:crypto. Status codes per RFC 9110
// §15: 201 Created, 403 Forbidden, 404 Not Found, 410 Gone.
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
import { POST as createChipRoute } from "@/app/api/v1/workspaces/[workspaceId]/chips/route";
import { POST as uploadRoute } from "@/app/api/v1/chips/[chipId]/revisions/route";
import { PUT as layerMapRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/layer-map/route";
import { POST as operatingPointRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/operating-points/route";
import { GET as reviewRoute } from "@/app/api/v1/revisions/[revisionId]/review/route";
import { POST as submitRoute } from "@/app/api/v1/revisions/[revisionId]/review/submit/route";
import { POST as flagsRoute } from "@/app/api/v1/revisions/[revisionId]/review/flags/route";
import { POST as passRoute } from "@/app/api/v1/revisions/[revisionId]/review/pass/route";
import { POST as requestChangesRoute } from "@/app/api/v1/revisions/[revisionId]/review/request-changes/route";
import { POST as clearRoute } from "@/app/api/v1/revisions/[revisionId]/review/clear/route";
import { POST as withdrawRoute } from "@/app/api/v1/revisions/[revisionId]/review/withdraw/route";
import { POST as updateAnalysisRoute } from "@/app/api/v1/revisions/[revisionId]/review/analysis/route";
import { GET as briefPdfRoute } from "@/app/api/v1/revisions/[revisionId]/brief.pdf/route";
import { GET as listLinksRoute, POST as createLinkRoute } from "@/app/api/v1/revisions/[revisionId]/share-links/route";
import { DELETE as revokeLinkRoute } from "@/app/api/v1/share-links/[id]/route";
import { GET as sharedPdfRoute } from "@/app/share/[token]/brief.pdf/route";
import { getDb } from "@/db";
import { auditEvents } from "@/db/schema";
import { shareLinks } from "@/db/schema-reports";
import { DEMO_PASSWORD, type DemoContext } from "@/db/seed";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { actAs } from "@/tests/support/fake-session";
import { call } from "@/tests/support/requests";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";
import { fixtureBytes, send, uploadRequest } from "@/tests/support/uploads";
import { looksLikePdf, pdfText } from "@/tests/lib/reports/pdf-text";
import { TEE, TEE_LAYERS as LAYERS, teeForm as form, BOND_FLAG as BOND, PUMP_FLAG as PUMP } from "@/tests/support/tee-fixture";

let demo: DemoContext;
let storageDir: string;
const u = (email: string) => demo.users[email];
const DESIGNER = "designer@brookmere.test";
const REVIEWER = "reviewer@brookmere.test";
const FAB = "fab@brookmere.test";
const LEAD = "lead@brookmere.test";
const ADMIN = "admin@brookmere.test";
const OTHER_ADMIN = "admin@halvard.test";

const WAIVER = "Bench runs use a 4 bar pressure controller behind a polycarbonate shield for this chip.";
const BOND_WAIVER = "Chips for this run are bonded with the fab's reinforced clamp fixture rated to 5 bar.";

type Setup = { chipId: number; revisionId: number; chipName: string; params: { chipId: string; number: string }; analysisId: number; bytes: Uint8Array };
let counter = 0;

async function setupRevision(flow = "2000 uL/min"): Promise<Setup> {
  actAs(u(DESIGNER));
  counter += 1;
  const chipName = `Brief chip ${counter}`;
  const chip = await call(createChipRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) }, json: { name: chipName, purpose: "Tee splitter for the brief tests." } });
  expect(chip.status).toBe(201);
  const chipId = (chip.body.chip as { id: number }).id;
  const bytes = fixtureBytes(TEE);
  const up = await send(uploadRoute, uploadRequest(`http://localhost/api/v1/chips/${chipId}/revisions`, { name: TEE, bytes }, { note: "first cut" }), { chipId: String(chipId) });
  expect(up.status).toBe(201);
  const revisionId = (up.body.revision as { id: number }).id;
  const params = { chipId: String(chipId), number: "1" };
  expect((await call(layerMapRoute, { method: "PUT", params, json: { layers: LAYERS } })).status).toBe(201);
  const op = await call(operatingPointRoute, { params, json: form("hard push", flow) });
  expect(op.status).toBe(201);
  return { chipId, revisionId, chipName, params, analysisId: op.body.analysis_id as number, bytes };
}

const rp = (s: Setup) => ({ revisionId: String(s.revisionId) });

async function step(handler: Parameters<typeof call>[0], s: Setup, as: string, json: Record<string, unknown>) {
  actAs(u(as));
  const v = await call(reviewRoute, { params: rp(s) });
  return call(handler, { params: rp(s), json: { expectedVersion: (v.body.review as { version: number }).version, ...json } });
}

/** Calls a route handler that answers with bytes (the PDF routes). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- handlers type their own params
async function fetchBytes(handler: (req: Request, ctx: { params: Promise<any> }) => Promise<Response>, params: Record<string, string>) {
  const res = await handler(new Request("http://localhost/x"), { params: Promise.resolve(params) });
  return { status: res.status, headers: res.headers, bytes: new Uint8Array(await res.arrayBuffer()) };
}

let cleared: Setup;

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
  // A revision taken through the whole review path with both block flags waived, then cleared.
  cleared = await setupRevision();
  expect((await step(submitRoute, cleared, DESIGNER, { note: "Driving hard on purpose for the bench limits." })).status).toBe(200);
  expect((await step(flagsRoute, cleared, REVIEWER, { flagKey: PUMP, decision: "waived", justification: WAIVER })).status).toBe(200);
  expect((await step(flagsRoute, cleared, REVIEWER, { flagKey: BOND, decision: "waived", justification: BOND_WAIVER })).status).toBe(200);
  expect((await step(passRoute, cleared, REVIEWER, { note: "Both limits waived for the shielded bench run." })).status).toBe(200);
  expect((await step(clearRoute, cleared, FAB, { fabName: "Kestrel Foundry (invented)", process: "PDMS soft lithography", password: DEMO_PASSWORD })).status).toBe(200);
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("the brief as PDF", () => {
  it("downloads for the lead as a valid PDF naming the chip, the SHA-256, the cautions, the waivers and the clearance", async () => {
    actAs(u(LEAD));
    const res = await fetchBytes(briefPdfRoute, rp(cleared));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="brief-brief-chip-1-rev1.pdf"`);
    expect(looksLikePdf(res.bytes)).toBe(true);
    if (process.env.STOKELINE_SCREENSHOTS) writeFileSync(path.join(process.env.STOKELINE_SCREENSHOTS, "brief-cleared.pdf"), res.bytes); // for looking, not asserting
    const { pages, all } = await pdfText(res.bytes);
    const sha = createHash("sha256").update(cleared.bytes).digest("hex");
    const flat = all.replace(/\s+/g, " ");
    expect(flat).toContain(cleared.chipName);
    expect(flat).toContain(sha);
    expect(flat).toContain(WAIVER);
    expect(flat).toContain(BOND_WAIVER);
    expect(flat).toContain("Kestrel Foundry (invented)");
    expect(flat).toContain("Dario Penwright"); // the demo fab liaison who signed (db/seed.ts)
    for (const caution of MODEL_CAUTIONS) expect(flat).toContain(caution.replace(/\s+/g, " "));
    // Every page carries the SHA-256 and the generation time in UTC.
    expect(pages.length).toBeGreaterThan(1);
    for (const p of pages) {
      const line = p.replace(/\s+/g, " ");
      expect(line).toContain(sha);
      expect(line).toMatch(/generated \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
    }
  });

  it("answers 403 to a member of another workspace, 404 for a revision that does not exist, 401 signed out", async () => {
    actAs(u(OTHER_ADMIN));
    expect((await fetchBytes(briefPdfRoute, rp(cleared))).status).toBe(403);
    actAs(u(LEAD));
    expect((await fetchBytes(briefPdfRoute, { revisionId: "999999" })).status).toBe(404);
    actAs(null);
    expect((await fetchBytes(briefPdfRoute, rp(cleared))).status).toBe(401);
  });

  it("works for a draft revision with open flags and no clearance", async () => {
    const draft = await setupRevision();
    actAs(u(DESIGNER));
    const res = await fetchBytes(briefPdfRoute, rp(draft));
    expect(res.status).toBe(200);
    const flat = (await pdfText(res.bytes)).all.replace(/\s+/g, " ");
    expect(flat).toContain("Not cleared for tape-out");
    expect(flat).toContain("Open — needs a waiver or a fix");
    expect(flat).toContain("OVER LIMIT");
  });
});

describe("share links", () => {
  it("lead creates (201), designer may not (403); the link serves the PDF (200) until revoked (410); views, creation and revocation are audited", async () => {
    actAs(u(DESIGNER));
    const refused = await call(createLinkRoute, { params: rp(cleared), json: { expiresInDays: 7 } });
    expect(refused.status).toBe(403);

    actAs(u(LEAD));
    const created = await call(createLinkRoute, { params: rp(cleared), json: { expiresInDays: 7, label: "Seed investors, December" } });
    expect(created.status).toBe(201);
    const sharePath = created.body.path as string;
    expect(sharePath).toMatch(/^\/share\/[A-Za-z0-9_-]{43}$/);
    const token = sharePath.split("/").pop()!;
    const link = created.body.share_link as { id: number; status: string; expires_at: string };
    expect(link.status).toBe("active");
    // The token is stored hashed only (SHA-256, FIPS 180-4, via node:crypto).
    const [row] = await getDb().select().from(shareLinks).where(eq(shareLinks.id, link.id));
    expect(row.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(token);

    actAs(null); // the public link needs no session
    const viewed = await fetchBytes(sharedPdfRoute, { token });
    expect(viewed.status).toBe(200);
    expect(looksLikePdf(viewed.bytes)).toBe(true);
    expect((await pdfText(viewed.bytes)).all).toContain(cleared.chipName);

    actAs(u(LEAD));
    const list = await call(listLinksRoute, { params: rp(cleared) });
    expect(list.status).toBe(200);
    expect((list.body.share_links as { id: number; label: string }[]).find((l) => l.id === link.id)?.label).toBe("Seed investors, December");
    expect(JSON.stringify(list.body)).not.toContain(token);

    actAs(u(DESIGNER));
    expect((await call(revokeLinkRoute, { method: "DELETE", params: { id: String(link.id) } })).status).toBe(403);
    actAs(u(LEAD));
    const revoked = await call(revokeLinkRoute, { method: "DELETE", params: { id: String(link.id) } });
    expect(revoked.status).toBe(200);
    expect((revoked.body.share_link as { status: string }).status).toBe("revoked");

    actAs(null);
    const gone = await fetchBytes(sharedPdfRoute, { token });
    expect(gone.status).toBe(410);
    expect(Buffer.from(gone.bytes).toString("utf8")).toMatch(/withdrawn/);

    const actions = (await getDb().select({ action: auditEvents.action }).from(auditEvents).where(eq(auditEvents.objectId, String(cleared.revisionId)))).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(["report.share_created", "report.share_viewed", "report.share_revoked"]));
  });

  it("admin may create; an expired link answers 410, an unknown one 404; expiry past 90 days or in the past is refused (400)", async () => {
    actAs(u(ADMIN));
    const created = await call(createLinkRoute, { params: rp(cleared), json: { expiresInDays: 1 } });
    expect(created.status).toBe(201);
    const token = (created.body.path as string).split("/").pop()!;
    const id = (created.body.share_link as { id: number }).id;
    await getDb().update(shareLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(shareLinks.id, id));
    actAs(null);
    const expired = await fetchBytes(sharedPdfRoute, { token });
    expect(expired.status).toBe(410);
    expect(Buffer.from(expired.bytes).toString("utf8")).toMatch(/expired/);
    expect((await fetchBytes(sharedPdfRoute, { token: "A".repeat(43) })).status).toBe(404);
    expect((await fetchBytes(sharedPdfRoute, { token: "not a token" })).status).toBe(404);

    actAs(u(LEAD));
    const tooLong = await call(createLinkRoute, { params: rp(cleared), json: { expiresInDays: 91 } });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.error?.message).toMatch(/90 days/);
    const past = await call(createLinkRoute, { params: rp(cleared), json: { expiresAt: "2020-01-01" } });
    expect(past.status).toBe(400);
    expect(past.body.error?.message).toMatch(/passed/);
    actAs(u(OTHER_ADMIN));
    expect((await call(createLinkRoute, { params: rp(cleared), json: { expiresInDays: 3 } })).status).toBe(403);
  });
});

describe("the lead reaches no mutating route", () => {
  it("answers 403 to the lead for creating a chip, uploading, mapping layers, operating points and every review step", async () => {
    const s = await setupRevision("200 uL/min");
    actAs(u(LEAD));
    expect((await call(createChipRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) }, json: { name: "Lead's chip" } })).status).toBe(403);
    const up = await send(uploadRoute, uploadRequest(`http://localhost/api/v1/chips/${s.chipId}/revisions`, { name: TEE, bytes: s.bytes }, { note: "x" }), { chipId: String(s.chipId) });
    expect(up.status).toBe(403);
    expect((await call(layerMapRoute, { method: "PUT", params: s.params, json: { layers: LAYERS } })).status).toBe(403);
    expect((await call(operatingPointRoute, { params: s.params, json: form("lead", "100 uL/min") })).status).toBe(403);
    for (const [handler, json] of [
      [submitRoute, { note: "lead submits" }],
      [updateAnalysisRoute, { analysisId: s.analysisId }],
      [flagsRoute, { flagKey: PUMP, decision: "waived", justification: WAIVER }],
      [passRoute, {}],
      [requestChangesRoute, { note: "lead asks" }],
      [clearRoute, { fabName: "F", process: "P", password: DEMO_PASSWORD }],
      [withdrawRoute, {}],
    ] as const) {
      const res = await step(handler, s, LEAD, json);
      expect(res.status).toBe(403);
    }
  });
});
