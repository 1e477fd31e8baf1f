// Route handlers under /api/v1 called directly with a Request, against a fresh temporary
// SQLite file. Expected statuses follow RFC 9110 §15 (401 without credentials, 403 when
// refused, 404 unknown, 409 conflict, 413/415 for body problems) and the product rules of
// issue 2 (one authorisation helper; no rows of another workspace).
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
import { GET as getMembers } from "@/app/api/v1/workspaces/[workspaceId]/members/route";
import { DELETE as deleteMember, PATCH as patchMember } from "@/app/api/v1/workspaces/[workspaceId]/members/[userId]/route";
import { GET as listInvites, POST as postInvite } from "@/app/api/v1/workspaces/[workspaceId]/invitations/route";
import { DELETE as revokeInvite } from "@/app/api/v1/invitations/[invitationId]/route";
import { GET as getAudit } from "@/app/api/v1/workspaces/[workspaceId]/audit/route";
import { GET as getOutbox } from "@/app/api/v1/workspaces/[workspaceId]/outbox/route";
import { GET as getMe } from "@/app/api/v1/me/route";
import type { DemoContext } from "@/db/seed";
import { actAs } from "@/tests/support/fake-session";
import { call } from "@/tests/support/requests";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
let brookmere: string;
let halvard: string;
const u = (email: string) => demo.users[email];

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  brookmere = String(demo.workspaces.brookmere.id);
  halvard = String(demo.workspaces.halvard.id);
});
afterAll(dropTempDatabase);

describe("without a session", () => {
  it("answers 401 with a JSON error and no stack", async () => {
    actAs(null);
    for (const res of [
      await call(getMe),
      await call(getMembers, { params: { workspaceId: brookmere } }),
      await call(postInvite, { params: { workspaceId: brookmere }, json: { email: "x@y.test", roles: ["lead"] } }),
      await call(revokeInvite, { method: "DELETE", params: { invitationId: "1" } }),
    ]) {
      expect(res.status).toBe(401);
      expect(res.body.error?.code).toBe("unauthenticated");
      expect(res.text).not.toMatch(/at .*\.ts:\d+/);
    }
  });
});

describe("membership and roles", () => {
  it("lists members to any member of the workspace, with roles and no password hashes", async () => {
    actAs(u("lead@brookmere.test"));
    const res = await call(getMembers, { params: { workspaceId: brookmere } });
    expect(res.status).toBe(200);
    const members = res.body.members as { email: string; roles: string[] }[];
    expect(members.map((m) => m.email).sort()).toEqual(
      ["admin@brookmere.test", "designer2@brookmere.test", "designer@brookmere.test", "fab@brookmere.test", "lead@brookmere.test", "reviewer@brookmere.test"],
    );
    expect(res.text).not.toMatch(/password|\$2[aby]\$/i);
  });

  it("answers 403 to a member of another workspace, and for an unknown workspace id", async () => {
    actAs(u("admin@halvard.test"));
    const res = await call(getMembers, { params: { workspaceId: brookmere } });
    expect(res.status).toBe(403);
    expect(res.body.error?.message).toMatch(/not a member/);
    const unknown = await call(getMembers, { params: { workspaceId: "999999" } });
    expect(unknown.status).toBe(403);
  });

  it("answers 403 to a member without the admin role, naming the role needed", async () => {
    actAs(u("designer@brookmere.test"));
    const res = await call(postInvite, { params: { workspaceId: brookmere }, json: { email: "new@brookmere.test", roles: ["designer"] } });
    expect(res.status).toBe(403);
    expect(res.body.error?.message).toMatch(/admin role/);
    const patch = await call(patchMember, { method: "PATCH", params: { workspaceId: brookmere, userId: String(u("lead@brookmere.test")) }, json: { roles: ["admin"] } });
    expect(patch.status).toBe(403);
  });

  it("lets a person in two workspaces act in each with that workspace's roles only", async () => {
    actAs(u("fab@brookmere.test"));
    const me = await call(getMe);
    expect((me.body.workspaces as { slug: string }[]).map((w) => w.slug).sort()).toEqual(["brookmere", "halvard"]);
    expect((await call(getMembers, { params: { workspaceId: halvard } })).status).toBe(200);
    expect((await call(listInvites, { params: { workspaceId: halvard } })).status).toBe(403);
  });
});

describe("admin routes", () => {
  it("invites by e-mail (201), stores the message in the outbox and lists the invitation", async () => {
    actAs(u("admin@brookmere.test"));
    const res = await call(postInvite, { params: { workspaceId: brookmere }, json: { email: "  New.Person@Brookmere.test ", roles: ["designer", "lead"] } });
    expect(res.status).toBe(201);
    const list = await call(listInvites, { params: { workspaceId: brookmere } });
    const inv = (list.body.invitations as { email: string; status: string; roles: string[] }[])[0];
    expect(inv).toMatchObject({ email: "new.person@brookmere.test", status: "pending", roles: ["designer", "lead"] });
    const outbox = await call(getOutbox, { params: { workspaceId: brookmere } });
    const mail = (outbox.body.messages as { toAddress: string; text: string }[])[0];
    expect(mail.toAddress).toBe("new.person@brookmere.test");
    expect(mail.text).toMatch(/\/invite\/[A-Za-z0-9_-]{40,}/);
    // Halvard's admin sees none of it.
    actAs(u("admin@halvard.test"));
    const theirs = await call(getOutbox, { params: { workspaceId: halvard } });
    expect(theirs.status).toBe(200);
    expect(theirs.text).not.toMatch(/brookmere/i);
  });

  it("refuses to invite an existing member (409)", async () => {
    actAs(u("admin@brookmere.test"));
    const res = await call(postInvite, { params: { workspaceId: brookmere }, json: { email: "lead@brookmere.test", roles: ["lead"] } });
    expect(res.status).toBe(409);
    expect(res.body.error?.message).toMatch(/already a member/);
  });

  it("answers 403 when an admin revokes another workspace's invitation, 404 for an unknown one", async () => {
    actAs(u("admin@halvard.test"));
    const created = await call(postInvite, { params: { workspaceId: halvard }, json: { email: "guest@halvard.test", roles: ["lead"] } });
    const id = String((created.body.invitation as { id: number }).id);
    actAs(u("admin@brookmere.test"));
    const cross = await call(revokeInvite, { method: "DELETE", params: { invitationId: id } });
    expect(cross.status).toBe(403);
    expect((await call(revokeInvite, { method: "DELETE", params: { invitationId: "987654" } })).status).toBe(404);
    actAs(u("admin@halvard.test"));
    expect((await call(revokeInvite, { method: "DELETE", params: { invitationId: id } })).status).toBe(200);
    expect((await call(revokeInvite, { method: "DELETE", params: { invitationId: id } })).status).toBe(404);
  });

  it("changes roles, records the change in the audit trail, and keeps at least one admin (409)", async () => {
    actAs(u("admin@brookmere.test"));
    const target = String(u("designer2@brookmere.test"));
    const ok = await call(patchMember, { method: "PATCH", params: { workspaceId: brookmere, userId: target }, json: { roles: ["designer", "fluidics_reviewer"] } });
    expect(ok.status).toBe(200);
    const members = (await call(getMembers, { params: { workspaceId: brookmere } })).body.members as { userId: number; roles: string[] }[];
    expect(members.find((m) => m.userId === Number(target))?.roles.sort()).toEqual(["designer", "fluidics_reviewer"]);
    const audit = await call(getAudit, { params: { workspaceId: brookmere }, url: `http://localhost/api/v1/x?objectType=user&objectId=${target}` });
    const events = audit.body.events as { action: string; details: { to: string[] } }[];
    expect(events[0].action).toBe("member.roles_changed");
    expect(events[0].details.to).toEqual(["designer", "fluidics_reviewer"]);

    const self = String(u("admin@brookmere.test"));
    const lastAdmin = await call(patchMember, { method: "PATCH", params: { workspaceId: brookmere, userId: self }, json: { roles: ["lead"] } });
    expect(lastAdmin.status).toBe(409);
    expect(lastAdmin.body.error?.message).toMatch(/at least one admin/);
    expect((await call(deleteMember, { method: "DELETE", params: { workspaceId: brookmere, userId: self } })).status).toBe(409);
  });

  it("answers 404 when changing someone who is not a member here (another workspace's user)", async () => {
    actAs(u("admin@brookmere.test"));
    const res = await call(patchMember, { method: "PATCH", params: { workspaceId: brookmere, userId: String(u("designer@halvard.test")) }, json: { roles: ["lead"] } });
    expect(res.status).toBe(404);
  });

  it("removes a member, who then gets 403 in that workspace", async () => {
    actAs(u("admin@halvard.test"));
    const target = u("designer@halvard.test");
    expect((await call(deleteMember, { method: "DELETE", params: { workspaceId: halvard, userId: String(target) } })).status).toBe(200);
    actAs(target);
    expect((await call(getMembers, { params: { workspaceId: halvard } })).status).toBe(403);
  });
});

describe("bad input never gives a 500 or a stack trace", () => {
  const params = () => ({ workspaceId: brookmere });
  it.each([
    ["malformed JSON", { body: "{\"email\": " }, 400, "invalid_json"],
    ["empty body", { body: "" }, 400, "invalid_json"],
    ["missing roles", { json: { email: "a@b.test" } }, 400, "invalid_input"],
    ["missing email", { json: { roles: ["lead"] } }, 400, "invalid_input"],
    ["unknown role", { json: { email: "a@b.test", roles: ["owner"] } }, 400, "invalid_input"],
    ["not an e-mail", { json: { email: "not-an-address", roles: ["lead"] } }, 400, "invalid_input"],
    ["over-long e-mail", { json: { email: `${"a".repeat(300)}@b.test`, roles: ["lead"] } }, 400, "invalid_input"],
    ["a JSON array", { json: [1, 2] }, 400, "invalid_input"],
    ["wrong content type", { body: "email=a", headers: { "content-type": "application/x-www-form-urlencoded" } }, 415, "unsupported_media_type"],
    ["oversized body", { json: { email: "a@b.test", roles: ["lead"], pad: "x".repeat(70_000) } }, 413, "payload_too_large"],
  ])("%s → %i", async (_label, opts, status, code) => {
    actAs(u("admin@brookmere.test"));
    const res = await call(postInvite, { params: params(), ...(opts as object) });
    expect(res.status).toBe(status);
    expect(res.body.error?.code).toBe(code);
    expect(res.body.error?.message.length).toBeGreaterThan(10);
    expect(res.text).not.toMatch(/\n\s+at /);
  });

  it("names the field at fault", async () => {
    actAs(u("admin@brookmere.test"));
    const res = await call(postInvite, { params: params(), json: { email: "a@b.test", roles: [] } });
    expect(res.body.error?.message).toMatch(/^roles: Choose at least one role/);
  });

  it("answers 404 for a non-numeric id in the path and 400 for a bad query", async () => {
    actAs(u("admin@brookmere.test"));
    expect((await call(getMembers, { params: { workspaceId: "abc" } })).status).toBe(404);
    const q = await call(getAudit, { params: params(), url: "http://localhost/api/v1/x?limit=-3" });
    expect(q.status).toBe(400);
    expect(q.body.error?.message).toMatch(/limit/);
  });
});
