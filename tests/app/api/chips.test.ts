// Chips, revisions, layer maps and operating points through the /api/v1 route handlers,
// against a fresh temporary SQLite file and storage folder. Status codes per RFC 9110 §15;
// product rules from the chips-and-revisions issue (immutable revisions, duplicate detection
// by SHA-256, nothing stored on a bad upload, other workspaces refused).
import { mkdtempSync, readdirSync, rmSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
import { GET as listChipsRoute, POST as createChipRoute } from "@/app/api/v1/workspaces/[workspaceId]/chips/route";
import { GET as getChipRoute } from "@/app/api/v1/chips/[chipId]/route";
import { POST as uploadRoute } from "@/app/api/v1/chips/[chipId]/revisions/route";
import { GET as getRevisionRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/route";
import { GET as fileRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/file/route";
import { PUT as layerMapRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/layer-map/route";
import { POST as operatingPointRoute } from "@/app/api/v1/chips/[chipId]/revisions/[number]/operating-points/route";
import { GET as analysisRoute } from "@/app/api/v1/analyses/[analysisId]/route";
import { POST as analyzeRoute } from "@/app/api/v1/analyze/route";
import { GET as openapiRoute } from "@/app/api/v1/openapi.json/route";
import type { DemoContext } from "@/db/seed";
import { actAs } from "@/tests/support/fake-session";
import { call } from "@/tests/support/requests";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";
import { fixtureBytes, send, uploadRequest } from "@/tests/support/uploads";

let demo: DemoContext;
let storageDir: string;
const u = (email: string) => demo.users[email];
const TEE = "tee-um-r2000.dxf";
const LAYERS = {
  FLOW: { role: "channel", depth: "50 um", width: "100 um" },
  PORTS: { role: "port" },
  DIE: { role: "outline" },
  TEXT: { role: "ignore" },
} as const;
const FORM = {
  name: "nominal",
  fluid: "preset:water",
  temperature: "25 degC",
  process: "pdms_soft_lithography",
  pumpMaxPressure: "2 bar",
  ports: [
    { name: "A", drive: "flow", value: "10 uL/min" },
    { name: "B", drive: "pressure", value: "0 mbar" },
    { name: "C", drive: "pressure", value: "0 mbar" },
  ],
};

function storedFiles(): string[] {
  if (!existsSync(storageDir)) return [];
  return readdirSync(storageDir, { recursive: true, withFileTypes: true })
    .filter((d) => d.isFile())
    .map((d) => d.name);
}

async function createChip(name: string, workspace = demo.workspaces.brookmere.id) {
  actAs(u("designer@brookmere.test"));
  const res = await call(createChipRoute, { params: { workspaceId: String(workspace) }, json: { name, purpose: "test chip" } });
  expect(res.status).toBe(201);
  return (res.body.chip as { id: number }).id;
}

function upload(chipId: number, name: string, bytes: Uint8Array, note = "") {
  return send(uploadRoute, uploadRequest(`http://localhost/api/v1/chips/${chipId}/revisions`, { name, bytes }, { note }), { chipId: String(chipId) });
}

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
  process.env.MAX_UPLOAD_BYTES = String(2 * 1024 * 1024);
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("upload and revisions", () => {
  it("uploads a DXF as revision 1 with its layer survey, keeps the bytes intact, and lists it", async () => {
    const chipId = await createChip("Tee splitter");
    const bytes = fixtureBytes(TEE);
    const res = await upload(chipId, TEE, bytes, "first cut");
    expect(res.status).toBe(201);
    const revision = res.body.revision as { number: number; sha256: string; size_bytes: number };
    expect(revision.number).toBe(1);
    // SHA-256 per FIPS 180-4, computed independently with node:crypto.
    expect(revision.sha256).toBe(createHash("sha256").update(bytes).digest("hex"));
    expect(revision.size_bytes).toBe(bytes.byteLength);
    const survey = res.body.survey as { layers: { name: string; proposed_role?: string; proposedRole?: string }[] };
    expect(survey.layers.map((l) => l.name).sort()).toEqual(expect.arrayContaining(["FLOW", "PORTS"]));

    const file = await fileRoute(new Request("http://localhost/x"), { params: Promise.resolve({ chipId: String(chipId), number: "1" }) });
    expect(file.status).toBe(200);
    expect(new Uint8Array(await file.arrayBuffer())).toEqual(bytes);

    const chip = await call(getChipRoute, { params: { chipId: String(chipId) } });
    expect((chip.body.revisions as { note: string }[])[0].note).toBe("first cut");
  });

  it("answers an identical re-upload with 409 'already revision N' and stores nothing", async () => {
    const chipId = await createChip("Duplicate check");
    expect((await upload(chipId, TEE, fixtureBytes(TEE))).status).toBe(201);
    const before = storedFiles().length;
    const again = await upload(chipId, "renamed.dxf", fixtureBytes(TEE));
    expect(again.status).toBe(409);
    expect(again.body.error?.code).toBe("duplicate_revision");
    expect(again.body.error?.message).toMatch(/already revision 1/);
    expect(storedFiles().length).toBe(before);
    const changed = await upload(chipId, "tee-mm.dxf", fixtureBytes("tee-mm-r2000.dxf"), "same tee drawn in mm");
    expect(changed.status).toBe(201);
    expect((changed.body.revision as { number: number; parent_revision_id: number | null }).number).toBe(2);
    expect((changed.body.revision as { parent_revision_id: number | null }).parent_revision_id).not.toBeNull();
  });

  it("refuses bad files with a clear 4xx and stores nothing", async () => {
    const chipId = await createChip("Bad inputs");
    const before = storedFiles().length;
    const cases: { name: string; bytes: Uint8Array; status: number; code: string }[] = [
      { name: "notes.txt", bytes: new TextEncoder().encode("hello"), status: 415, code: "unsupported_file" },
      { name: "empty.dxf", bytes: new Uint8Array(0), status: 422, code: "empty_file" },
      { name: "broken.dxf", bytes: new TextEncoder().encode("0\nSECTION\n2\nENTITIES\n0\nLINE\n8\nFLOW\n10\n"), status: 422, code: "truncated_file" },
      { name: "drawing.dxf", bytes: new TextEncoder().encode("AC1032\u0000\u0000binary dwg body"), status: 422, code: "dwg_file" },
      { name: "big.dxf", bytes: new Uint8Array(3 * 1024 * 1024).fill(32), status: 413, code: "file_too_large" },
    ];
    for (const c of cases) {
      const res = await upload(chipId, c.name, c.bytes);
      expect({ name: c.name, status: res.status, code: res.body.error?.code }).toEqual({ name: c.name, status: c.status, code: c.code });
      expect(res.body.error?.message.length).toBeGreaterThan(20);
      expect(res.text).not.toMatch(/at .*\.(ts|js):\d+/);
    }
    expect(storedFiles().length).toBe(before);
    const chip = await call(getChipRoute, { params: { chipId: String(chipId) } });
    expect(chip.body.revisions).toEqual([]);
  });

  it("refuses a request that is not multipart, or has no file field", async () => {
    const chipId = await createChip("Form checks");
    const notMultipart = await call(uploadRoute, { params: { chipId: String(chipId) }, json: { file: "x" } });
    expect(notMultipart.status).toBe(415);
    const form = new FormData();
    form.set("note", "no file");
    const noFile = await send(uploadRoute, new Request("http://localhost/x", { method: "POST", body: form }), { chipId: String(chipId) });
    expect(noFile.status).toBe(400);
    expect(noFile.body.error?.code).toBe("missing_file");
  });
});

describe("roles and workspaces", () => {
  it("lets a lead read but not create chips or upload (403)", async () => {
    const chipId = await createChip("Lead view");
    actAs(u("lead@brookmere.test"));
    expect((await call(getChipRoute, { params: { chipId: String(chipId) } })).status).toBe(200);
    const create = await call(createChipRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) }, json: { name: "nope" } });
    expect(create.status).toBe(403);
    const up = await upload(chipId, TEE, fixtureBytes(TEE));
    expect(up.status).toBe(403);
    const op = await call(operatingPointRoute, { params: { chipId: String(chipId), number: "1" }, json: FORM });
    expect(op.status).toBe(403);
  });

  it("answers 403 for another workspace's chip, and never lists it", async () => {
    const chipId = await createChip("Brookmere only");
    actAs(u("designer@halvard.test"));
    expect((await call(getChipRoute, { params: { chipId: String(chipId) } })).status).toBe(403);
    expect((await upload(chipId, TEE, fixtureBytes(TEE))).status).toBe(403);
    const list = await call(listChipsRoute, { params: { workspaceId: String(demo.workspaces.halvard.id) } });
    expect(list.status).toBe(200);
    expect((list.body.chips as { name: string }[]).map((c) => c.name)).not.toContain("Brookmere only");
  });

  it("answers 401 without a session", async () => {
    actAs(null);
    expect((await call(listChipsRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) } })).status).toBe(401);
  });
});

describe("layer map and operating points", () => {
  it("maps layers, analyses an operating point, and stores the result with its summary", async () => {
    const chipId = await createChip("Analysed tee");
    await upload(chipId, TEE, fixtureBytes(TEE));
    const params = { chipId: String(chipId), number: "1" };
    const map = await call(layerMapRoute, { method: "PUT", params, json: { layers: LAYERS } });
    expect(map.status).toBe(201);
    const again = await call(layerMapRoute, { method: "PUT", params, json: { layers: LAYERS } });
    expect(again.status).toBe(409);

    const op = await call(operatingPointRoute, { params, json: FORM });
    expect(op.status).toBe(201);
    expect(op.body.status).toBe("ok");
    const analysis = await call(analysisRoute, { params: { analysisId: String(op.body.analysis_id) } });
    expect(analysis.status).toBe(200);
    const result = analysis.body.result as { ports: { name: string; flow_m3_per_s: number }[] };
    // Mass balance (Kirchhoff's current law): what enters at A leaves through B and C.
    const flows = Object.fromEntries(result.ports.map((p) => [p.name, p.flow_m3_per_s]));
    expect(flows.A).toBeCloseTo(10e-9 / 60, 20);
    expect(flows.A + flows.B + flows.C).toBeCloseTo(0, 20);

    const rev = await call(getRevisionRoute, { params });
    const summary = (rev.body.analyses as { summary: { segments: number; max_inlet_pressure_Pa: number } }[])[0].summary;
    expect(summary.segments).toBe(3);
    expect(summary.max_inlet_pressure_Pa).toBeGreaterThan(0);
  });

  it("refuses a layer map without a channel layer, and field errors in the form, in plain words", async () => {
    const chipId = await createChip("Form errors");
    await upload(chipId, TEE, fixtureBytes(TEE));
    const params = { chipId: String(chipId), number: "1" };
    const noChannel = await call(layerMapRoute, { method: "PUT", params, json: { layers: { PORTS: { role: "port" } } } });
    expect(noChannel.status).toBe(400);
    expect(noChannel.body.error?.message).toMatch(/channel layer/);
    await call(layerMapRoute, { method: "PUT", params, json: { layers: LAYERS } });
    const bad = await call(operatingPointRoute, {
      params,
      json: { ...FORM, temperature: "25 mbar", ports: [{ name: "A", drive: "flow", value: "ten" }] },
    });
    expect(bad.status).toBe(400);
    const fields = (bad.body.error?.details as { fields: Record<string, string> }).fields;
    expect(fields.temperature).toMatch(/not a temperature/);
    expect(fields["ports.0.value"]).toMatch(/not a quantity/);
    const malformed = await call(operatingPointRoute, { params, body: "{not json" });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error?.code).toBe("invalid_json");
  });

  it("keeps an operating point whose analysis fails, with the reason in plain words", async () => {
    const chipId = await createChip("Failing analysis");
    await upload(chipId, TEE, fixtureBytes(TEE));
    const params = { chipId: String(chipId), number: "1" };
    await call(layerMapRoute, { method: "PUT", params, json: { layers: LAYERS } });
    const op = await call(operatingPointRoute, {
      params,
      json: { ...FORM, ports: [{ name: "NOPE", drive: "pressure", value: "100 mbar" }] },
    });
    expect(op.status).toBe(201);
    expect(op.body.status).toBe("failed");
    expect((op.body.error as { message: string }).message).toMatch(/NOPE/);
  });
});

describe("stateless analysis and the API description", () => {
  it("analyses a file with conditions and stores nothing", async () => {
    actAs(u("lead@brookmere.test"));
    const before = storedFiles().length;
    const conditions = JSON.stringify({ layers: LAYERS, ports: { A: { pressure: "100 mbar" }, B: { pressure: "0 Pa" }, C: { pressure: "0 Pa" } } });
    const res = await send(analyzeRoute, uploadRequest("http://localhost/api/v1/analyze", { name: TEE, bytes: fixtureBytes(TEE) }, { conditions }));
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(true);
    expect((res.body.ports as { name: string; pressure_Pa: number }[]).find((p) => p.name === "A")?.pressure_Pa).toBe(10000);
    expect(storedFiles().length).toBe(before);
    const badJson = await send(analyzeRoute, uploadRequest("http://localhost/api/v1/analyze", { name: TEE, bytes: fixtureBytes(TEE) }, { conditions: "{" }));
    expect(badJson.status).toBe(400);
  });

  it("serves an OpenAPI 3.1 description generated from the schemas", async () => {
    const res = await openapiRoute();
    const doc = (await res.json()) as { openapi: string; paths: Record<string, Record<string, { requestBody?: { content: Record<string, { schema: { properties?: Record<string, unknown> } }> } }>> };
    expect(doc.openapi).toBe("3.1.0");
    const op = doc.paths["/api/v1/chips/{chipId}/revisions/{number}/operating-points"].post;
    expect(Object.keys(op.requestBody!.content["application/json"].schema.properties!)).toEqual(expect.arrayContaining(["fluid", "temperature", "ports"]));
  });
});
