// Public routes (no session: the e-mailed token is the credential) and the JSON 404 for
// unknown API addresses. Status codes per RFC 9110 §15; token rules per the OWASP Forgot
// Password Cheat Sheet (from memory); the per-hour cap on reset mails is common practice.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
import { POST as accept } from "@/app/api/v1/invitations/accept/route";
import { POST as requestReset } from "@/app/api/v1/password-reset/route";
import { POST as completeReset } from "@/app/api/v1/password-reset/complete/route";
import { GET as unknownGet, DELETE as unknownDelete } from "@/app/api/v1/[...unknown]/route";
import { listOutbox } from "@/db/queries/outbox";
import { scopeForTrustedCode, type WorkspaceScope } from "@/db/queries/scope";
import { DEMO_PASSWORD, type DemoContext } from "@/db/seed";
import { authorizeCredentials } from "@/lib/auth/credentials";
import { inviteMember } from "@/lib/auth/invitations";
import { MAX_RESETS_PER_HOUR } from "@/lib/auth/password-reset";
import { MAX_ACCOUNT_FAILURES } from "@/lib/auth/rate-limit";
import { actAs } from "@/tests/support/fake-session";
import { call } from "@/tests/support/requests";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
let admin: WorkspaceScope;
beforeAll(async () => {
  demo = (await useTempDatabase())!;
  admin = scopeForTrustedCode({ userId: demo.users["admin@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["admin"] });
  actAs(null);
});
afterAll(dropTempDatabase);

async function inviteAndGetToken(email: string, scope = admin): Promise<string> {
  await inviteMember(scope, { inviterName: "Admin", workspaceName: "Workspace" }, { email, roles: ["designer"] });
  const mail = (await listOutbox(scope)).find((m) => m.toAddress === email)!;
  return mail.text.match(/\/invite\/([A-Za-z0-9_-]+)/)![1];
}

describe("POST /api/v1/invitations/accept", () => {
  it("creates the account and membership once (201), then answers 409", async () => {
    const token = await inviteAndGetToken("api.invitee@brookmere.test");
    const res = await call(accept, { json: { token, name: "Api Invitee", password: "api-invitee-pw-1" } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: "api.invitee@brookmere.test", workspace: "brookmere" });
    const again = await call(accept, { json: { token, name: "Api Invitee", password: "api-invitee-pw-1" } });
    expect(again.status).toBe(409);
    expect(again.body.error?.code).toBe("invitation_used");
  });

  it.each([
    ["unknown token", { token: "z".repeat(43), name: "X", password: "long-enough-pw" }, 404],
    ["short token", { token: "abc", name: "X", password: "long-enough-pw" }, 400],
    ["missing password", { token: "z".repeat(43), name: "X" }, 400],
    ["over-long name", { token: "z".repeat(43), name: "N".repeat(500), password: "long-enough-pw" }, 400],
  ])("%s → %i", async (_label, json, status) => {
    const res = await call(accept, { json });
    expect(res.status).toBe(status);
    expect(res.body.error?.message).toBeTruthy();
  });

  it("refuses a weak password for a new account (400) and stores nothing", async () => {
    const token = await inviteAndGetToken("weak@brookmere.test");
    const res = await call(accept, { json: { token, name: "Weak", password: "short" } });
    expect(res.status).toBe(400);
    expect(res.body.error?.message).toMatch(/at least 10 characters/);
    expect((await call(accept, { json: { token, name: "Weak", password: "strong-enough-1" } })).status).toBe(201);
  });

  it("throttles password guesses for an existing account through the invitation link (429)", async () => {
    const halvard = scopeForTrustedCode({ userId: demo.users["admin@halvard.test"], workspaceId: demo.workspaces.halvard.id, roles: ["admin"] });
    const token = await inviteAndGetToken("lead@brookmere.test", halvard);
    for (let i = 0; i < MAX_ACCOUNT_FAILURES; i++) {
      expect((await call(accept, { json: { token, password: `guess-${i}` }, headers: { "x-forwarded-for": "198.51.100.9" } })).status).toBe(401);
    }
    const blocked = await call(accept, { json: { token, password: DEMO_PASSWORD }, headers: { "x-forwarded-for": "198.51.100.9" } });
    expect(blocked.status).toBe(429);
    expect(blocked.headers.get("retry-after")).toMatch(/^\d+$/);
    await expect(authorizeCredentials({ email: "lead@brookmere.test", password: DEMO_PASSWORD }, "198.51.100.10")).rejects.toMatchObject({ status: 429 });
  });
});

describe("password reset routes", () => {
  it("answers 202 alike for known and unknown addresses, 400 for a malformed one", async () => {
    const known = await call(requestReset, { json: { email: "designer@brookmere.test" } });
    const unknown = await call(requestReset, { json: { email: "nobody@brookmere.test" } });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    expect((await call(requestReset, { json: { email: "nope" } })).status).toBe(400);
    expect((await call(requestReset, { body: "{oops" })).status).toBe(400);
  });

  it(`sends at most ${MAX_RESETS_PER_HOUR} reset e-mails per account per hour`, async () => {
    for (let i = 0; i < MAX_RESETS_PER_HOUR + 2; i++) await call(requestReset, { json: { email: "designer2@brookmere.test" } });
    const sent = (await listOutbox(admin)).filter((m) => m.toAddress === "designer2@brookmere.test");
    expect(sent).toHaveLength(MAX_RESETS_PER_HOUR);
  });

  it("completes a reset with the e-mailed token (200), and refuses a bad token (404) or weak password (400)", async () => {
    const mail = (await listOutbox(admin)).find((m) => m.toAddress === "designer@brookmere.test")!;
    const token = mail.text.match(/\/reset-password\/([A-Za-z0-9_-]+)/)![1];
    expect((await call(completeReset, { json: { token, password: "short" } })).status).toBe(400);
    expect((await call(completeReset, { json: { token: "q".repeat(43), password: "long-enough-pw" } })).status).toBe(404);
    expect((await call(completeReset, { json: { token, password: "long-enough-pw" } })).status).toBe(200);
    expect((await call(completeReset, { json: { token, password: "long-enough-pw2" } })).status).toBe(409);
  });
});

describe("unknown API addresses", () => {
  it("answer a JSON 404 for any method", async () => {
    for (const h of [unknownGet, unknownDelete]) {
      const res = await call(h);
      expect(res.status).toBe(404);
      expect(res.body.error?.code).toBe("not_found");
    }
  });
});
