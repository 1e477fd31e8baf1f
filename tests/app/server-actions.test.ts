// Server actions behind the admin and account forms, called directly with FormData (as React
// does) against a temporary database. Authorisation comes from the same helper as the routes.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
// revalidatePath needs Next's request scope; here it only has to be callable.
vi.mock("next/cache", () => ({ revalidatePath: vi.fn() }));
// headers() too; the accept action reads the client address from it.
vi.mock("next/headers", () => ({ headers: async () => new Headers({ "x-forwarded-for": "192.0.2.10" }) }));
import { changeRolesAction, inviteAction, removeMemberAction, revokeInvitationAction } from "@/app/(workspace)/w/[workspace]/admin/actions";
import { acceptInvitationAction, requestResetAction } from "@/app/(auth)/actions";
import { listInvitations } from "@/db/queries/invitations";
import { listMembers } from "@/db/queries/members";
import { listOutbox } from "@/db/queries/outbox";
import { scopeForTrustedCode } from "@/db/queries/scope";
import type { DemoContext } from "@/db/seed";
import { actAs } from "@/tests/support/fake-session";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
beforeAll(async () => {
  demo = (await useTempDatabase())!;
});
afterAll(dropTempDatabase);

const form = (fields: Record<string, string | string[]>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const item of Array.isArray(v) ? v : [v]) f.append(Array.isArray(v) ? `${k}[]` : k, item);
  return f;
};
const idle = { status: "idle" as const };
const adminScope = () => scopeForTrustedCode({ userId: demo.users["admin@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["admin"] });

describe("admin actions", () => {
  it("invite: signed-out and non-admin callers are refused with a message; nothing is stored", async () => {
    actAs(null);
    expect(await inviteAction(idle, form({ workspace: "brookmere", email: "z@brookmere.test", roles: ["lead"] }))).toMatchObject({ status: "error", message: /Sign in/ });
    actAs(demo.users["lead@brookmere.test"]);
    expect(await inviteAction(idle, form({ workspace: "brookmere", email: "z@brookmere.test", roles: ["lead"] }))).toMatchObject({ status: "error", message: /admin role/ });
    actAs(demo.users["admin@halvard.test"]);
    expect(await inviteAction(idle, form({ workspace: "brookmere", email: "z@brookmere.test", roles: ["lead"] }))).toMatchObject({ status: "error", message: /not a member/ });
    expect(await listInvitations(adminScope())).toHaveLength(0);
  });

  it("invite: field errors for bad input, success for good", async () => {
    actAs(demo.users["admin@brookmere.test"]);
    const bad = await inviteAction(idle, form({ workspace: "brookmere", email: "not-an-email" }));
    expect(bad.status).toBe("error");
    expect(Object.keys(bad.fieldErrors ?? {}).sort()).toEqual(["email", "roles"]);
    const ok = await inviteAction(idle, form({ workspace: "brookmere", email: "z@brookmere.test", roles: ["lead", "designer"] }));
    expect(ok).toEqual({ status: "ok", message: "Invitation sent to z@brookmere.test." });
    expect((await listInvitations(adminScope()))[0]).toMatchObject({ email: "z@brookmere.test", status: "pending" });
  });

  it("revoke, change roles and remove", async () => {
    actAs(demo.users["admin@brookmere.test"]);
    const [inv] = await listInvitations(adminScope());
    expect((await revokeInvitationAction(idle, form({ workspace: "brookmere", invitationId: String(inv.id) }))).status).toBe("ok");
    const target = String(demo.users["designer2@brookmere.test"]);
    expect((await changeRolesAction(idle, form({ workspace: "brookmere", userId: target, roles: ["lead"] }))).status).toBe("ok");
    expect((await listMembers(adminScope())).find((m) => m.userId === Number(target))?.roles).toEqual(["lead"]);
    expect((await changeRolesAction(idle, form({ workspace: "brookmere", userId: target }))).fieldErrors?.roles).toMatch(/at least one role/);
    expect((await removeMemberAction(idle, form({ workspace: "brookmere", userId: target }))).status).toBe("ok");
    expect((await listMembers(adminScope())).some((m) => m.userId === Number(target))).toBe(false);
  });
});

describe("account actions", () => {
  it("reset request answers the same for known and unknown addresses", async () => {
    actAs(null);
    const known = await requestResetAction(idle, form({ email: "lead@brookmere.test" }));
    const unknown = await requestResetAction(idle, form({ email: "ghost@brookmere.test" }));
    expect(known.status).toBe("ok");
    expect(unknown.message?.replace("ghost", "lead")).toBe(known.message);
  });

  it("accepting an invitation validates the form, then redirects to sign-in", async () => {
    actAs(demo.users["admin@brookmere.test"]);
    await inviteAction(idle, form({ workspace: "brookmere", email: "newbie@brookmere.test", roles: ["fluidics_reviewer"] }));
    const mail = (await listOutbox(adminScope())).find((m) => m.toAddress === "newbie@brookmere.test")!;
    const token = mail.text.match(/\/invite\/([A-Za-z0-9_-]+)/)![1];
    actAs(null);
    const mismatch = await acceptInvitationAction(idle, form({ token, existing: "no", name: "Newbie", password: "long-enough-pw", confirm: "different-pw" }));
    expect(mismatch.fieldErrors?.confirm).toMatch(/differ/);
    const redirect = await acceptInvitationAction(idle, form({ token, existing: "no", name: "Newbie", password: "long-enough-pw", confirm: "long-enough-pw" })).catch((e) => e);
    expect(String(redirect.digest)).toMatch(/NEXT_REDIRECT.*\/sign-in\?notice=joined/);
    expect((await listMembers(adminScope())).find((m) => m.email === "newbie@brookmere.test")?.roles).toEqual(["fluidics_reviewer"]);
  });
});
