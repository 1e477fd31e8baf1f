// Personal API tokens: a script authenticates with `Authorization: Bearer …` (RFC 6750 §2.1)
// and acts as the token's owner; a revoked or unknown token is 401 (RFC 6750 §3.1
// invalid_token), never an anonymous request. This file uses the real session module;
// only next-auth's cookie session is stubbed to "signed out".
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("next-auth", async (original) => ({ ...(await original<typeof import("next-auth")>()), getServerSession: async () => null }));
import { POST as createChipRoute } from "@/app/api/v1/workspaces/[workspaceId]/chips/route";
import { POST as uploadRoute } from "@/app/api/v1/chips/[chipId]/revisions/route";
import { GET as listTokensRoute } from "@/app/api/v1/workspaces/[workspaceId]/tokens/route";
import { DELETE as revokeRoute } from "@/app/api/v1/tokens/[tokenId]/route";
import { scopeForTrustedCode } from "@/db/queries/scope";
import type { DemoContext } from "@/db/seed";
import { createApiToken } from "@/lib/auth/api-tokens";
import { getUserById } from "@/db/queries/users";
import type { MemberContext } from "@/lib/auth/require";
import { call } from "@/tests/support/requests";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";
import { fixtureBytes, send, uploadRequest } from "@/tests/support/uploads";

let demo: DemoContext;
let storageDir: string;
let designerToken: string;
let designerTokenId: number;

async function memberContext(email: string): Promise<MemberContext> {
  const userId = demo.users[email];
  const user = (await getUserById(userId))!;
  const ws = demo.workspaces.brookmere;
  return { user, workspace: ws, scope: scopeForTrustedCode({ userId, workspaceId: ws.id, roles: ["designer"] }) };
}

const bearer = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
  const created = await createApiToken(await memberContext("designer@brookmere.test"), "lab script");
  designerToken = created.token;
  designerTokenId = created.view.id;
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("personal API tokens", () => {
  it("lets a script create a chip and upload a revision with a bearer token", async () => {
    const ws = String(demo.workspaces.brookmere.id);
    const chip = await call(createChipRoute, { params: { workspaceId: ws }, json: { name: "Scripted chip" }, headers: bearer(designerToken) });
    expect(chip.status).toBe(201);
    const chipId = String((chip.body.chip as { id: number }).id);
    const up = await send(
      uploadRoute,
      uploadRequest(`http://localhost/api/v1/chips/${chipId}/revisions`, { name: "tee.dxf", bytes: fixtureBytes("tee-um-r2000.dxf") }, {}, bearer(designerToken)),
      { chipId },
    );
    expect(up.status).toBe(201);
  });

  it("lists the owner's tokens without their secrets", async () => {
    const res = await call(listTokensRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) }, headers: bearer(designerToken) });
    expect(res.status).toBe(200);
    expect(res.text).not.toContain(designerToken);
    expect((res.body.tokens as { prefix: string }[])[0].prefix).toBe(designerToken.slice(0, 10));
  });

  it("answers 401 without credentials and for an unknown token", async () => {
    const ws = String(demo.workspaces.brookmere.id);
    expect((await call(createChipRoute, { params: { workspaceId: ws }, json: { name: "x" } })).status).toBe(401);
    const wrong = await call(createChipRoute, { params: { workspaceId: ws }, json: { name: "x" }, headers: bearer("stk_not-a-real-token") });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error?.message).toMatch(/not valid/);
  });

  it("stops a revoked token at once (401), and refuses revoking someone else's token (404)", async () => {
    const other = await createApiToken(await memberContext("designer2@brookmere.test"), "other");
    const foreign = await call(revokeRoute, { method: "DELETE", params: { tokenId: String(other.view.id) }, headers: bearer(designerToken) });
    expect(foreign.status).toBe(404);

    const revoke = await call(revokeRoute, { method: "DELETE", params: { tokenId: String(designerTokenId) }, headers: bearer(designerToken) });
    expect(revoke.status).toBe(200);
    const after = await call(createChipRoute, { params: { workspaceId: String(demo.workspaces.brookmere.id) }, json: { name: "too late" }, headers: bearer(designerToken) });
    expect(after.status).toBe(401);
    expect(after.body.error?.message).toMatch(/revoked/);
  });
});
