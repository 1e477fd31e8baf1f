// Invitation and password-reset links. Token handling follows the OWASP Forgot Password
// Cheat Sheet (from memory): random, single use, short expiry, stored only as a hash. The
// stored hash is checked against Python's hashlib (independent SHA-256 implementation).
import { execFileSync } from "node:child_process";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { invitations, passwordResetTokens } from "@/db/schema";
import { listOutbox } from "@/db/queries/outbox";
import { scopeForTrustedCode, type WorkspaceScope } from "@/db/queries/scope";
import { listMembers } from "@/db/queries/members";
import { DEMO_PASSWORD, type DemoContext } from "@/db/seed";
import { authorizeCredentials } from "@/lib/auth/credentials";
import { acceptInvitation, getOpenInvitation, INVITATION_LIFETIME_MS, inviteMember, revokeInvitation } from "@/lib/auth/invitations";
import { checkResetToken, requestPasswordReset, RESET_LIFETIME_MS, resetPassword } from "@/lib/auth/password-reset";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
let admin: WorkspaceScope;
beforeAll(async () => {
  demo = (await useTempDatabase())!;
  admin = scopeForTrustedCode({ userId: demo.users["admin@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["admin"] });
});
afterAll(dropTempDatabase);

const linkToken = (text: string, kind: "invite" | "reset-password") => {
  const m = text.match(new RegExp(`/${kind}/([A-Za-z0-9_-]+)`));
  if (!m) throw new Error(`no ${kind} link in: ${text}`);
  return m[1];
};
const pySha256 = (s: string) =>
  execFileSync("/usr/bin/python3", ["-c", "import hashlib,sys; print(hashlib.sha256(sys.argv[1].encode()).hexdigest())", s]).toString().trim();

describe("invitations", () => {
  const ctx = { inviterName: "Maren Ostby", workspaceName: "Brookmere Biofluidics" };

  it("e-mails a link whose token is stored only as its SHA-256", async () => {
    const { invitationId } = await inviteMember(admin, ctx, { email: "kit@brookmere.test", roles: ["designer"] });
    const [mail] = await listOutbox(admin);
    expect(mail.toAddress).toBe("kit@brookmere.test");
    expect(mail.subject).toMatch(/Brookmere Biofluidics/);
    const token = linkToken(mail.text, "invite");
    const [row] = await getDb().select().from(invitations).where(eq(invitations.id, invitationId));
    expect(row.tokenHash).toBe(pySha256(token));
    expect(JSON.stringify(row)).not.toContain(token);
    expect(row.expiresAt.getTime() - row.createdAt.getTime()).toBe(INVITATION_LIFETIME_MS);
  });

  it("lets a new invitee set a password, join with the invited roles and sign in; the link then stops working", async () => {
    const [mail] = await listOutbox(admin);
    const token = linkToken(mail.text, "invite");
    const result = await acceptInvitation(token, { name: "Kit Arbuthnot", password: "a-long-password-1" });
    expect(result.workspaceSlug).toBe("brookmere");
    const kit = (await listMembers(admin)).find((m) => m.email === "kit@brookmere.test");
    expect(kit?.roles).toEqual(["designer"]);
    await expect(authorizeCredentials({ email: "kit@brookmere.test", password: "a-long-password-1" }, "t")).resolves.toEqual({ id: result.userId });
    await expect(acceptInvitation(token, { name: "Kit", password: "a-long-password-1" })).rejects.toMatchObject({ status: 409, code: "invitation_used" });
  });

  it("refuses a short password for a new account and stores nothing", async () => {
    await inviteMember(admin, ctx, { email: "short@brookmere.test", roles: ["lead"] });
    const token = linkToken((await listOutbox(admin))[0].text, "invite");
    await expect(acceptInvitation(token, { name: "Short", password: "abc" })).rejects.toMatchObject({ status: 400 });
    expect((await listMembers(admin)).some((m) => m.email === "short@brookmere.test")).toBe(false);
    await expect(getOpenInvitation(token)).resolves.toMatchObject({ email: "short@brookmere.test" });
  });

  it("adds an existing account to a second workspace only with its current password", async () => {
    const halvardAdmin = scopeForTrustedCode({ userId: demo.users["admin@halvard.test"], workspaceId: demo.workspaces.halvard.id, roles: ["admin"] });
    await inviteMember(halvardAdmin, { inviterName: "Piet Ramsauer", workspaceName: "Halvard Microsystems" }, { email: "lead@brookmere.test", roles: ["lead"] });
    const token = linkToken((await listOutbox(halvardAdmin))[0].text, "invite");
    expect((await getOpenInvitation(token)).existingAccount).toBe(true);
    await expect(acceptInvitation(token, { password: "wrong-password" })).rejects.toMatchObject({ status: 401 });
    await acceptInvitation(token, { password: DEMO_PASSWORD });
    expect((await listMembers(halvardAdmin)).find((m) => m.email === "lead@brookmere.test")?.roles).toEqual(["lead"]);
  });

  it("refuses revoked and expired links with what to do next", async () => {
    const { invitationId } = await inviteMember(admin, ctx, { email: "gone@brookmere.test", roles: ["lead"] });
    const token = linkToken((await listOutbox(admin))[0].text, "invite");
    await revokeInvitation(admin, invitationId);
    await expect(getOpenInvitation(token)).rejects.toMatchObject({ code: "invitation_revoked", message: expect.stringMatching(/Ask your workspace admin/) });

    const now = new Date();
    await inviteMember(admin, ctx, { email: "late@brookmere.test", roles: ["lead"] }, now);
    const late = linkToken((await listOutbox(admin))[0].text, "invite");
    const afterExpiry = new Date(now.getTime() + INVITATION_LIFETIME_MS + 1);
    await expect(acceptInvitation(late, { name: "Late", password: "a-long-password-2" }, afterExpiry)).rejects.toMatchObject({ code: "invitation_expired" });
    await expect(getOpenInvitation("x".repeat(43))).rejects.toMatchObject({ status: 404 });
  });

  it("replaces a pending invitation to the same address (the old link stops working)", async () => {
    await inviteMember(admin, ctx, { email: "twice@brookmere.test", roles: ["lead"] });
    const first = linkToken((await listOutbox(admin))[0].text, "invite");
    await inviteMember(admin, ctx, { email: "twice@brookmere.test", roles: ["designer"] });
    const second = linkToken((await listOutbox(admin))[0].text, "invite");
    await expect(getOpenInvitation(first)).rejects.toMatchObject({ code: "invitation_revoked" });
    await expect(getOpenInvitation(second)).resolves.toMatchObject({ roles: ["designer"] });
  });
});

describe("password reset", () => {
  it("sends nothing for an unknown address", async () => {
    const before = (await listOutbox(admin)).length;
    await requestPasswordReset("nobody@brookmere.test");
    expect((await listOutbox(admin)).length).toBe(before);
  });

  it("works once within the hour, replaces the password and spends the other links", async () => {
    await requestPasswordReset("designer@brookmere.test");
    await requestPasswordReset("Designer@Brookmere.test");
    const mails = (await listOutbox(admin)).filter((m) => m.toAddress === "designer@brookmere.test");
    expect(mails).toHaveLength(2);
    const [newest, older] = mails.map((m) => linkToken(m.text, "reset-password"));
    const [stored] = await getDb().select().from(passwordResetTokens).where(eq(passwordResetTokens.tokenHash, pySha256(newest)));
    expect(stored.expiresAt.getTime() - stored.createdAt.getTime()).toBe(RESET_LIFETIME_MS);

    await resetPassword(newest, "brand-new-password-9");
    await expect(authorizeCredentials({ email: "designer@brookmere.test", password: "brand-new-password-9" }, "t2")).resolves.toBeTruthy();
    await expect(authorizeCredentials({ email: "designer@brookmere.test", password: DEMO_PASSWORD }, "t2")).rejects.toMatchObject({ status: 401 });
    await expect(resetPassword(newest, "another-password-1")).rejects.toMatchObject({ code: "reset_used" });
    await expect(checkResetToken(older)).rejects.toMatchObject({ code: "reset_used" });
  });

  it("refuses an expired link", async () => {
    const now = new Date();
    await requestPasswordReset("lead@brookmere.test", now);
    const token = linkToken((await listOutbox(admin)).find((m) => m.toAddress === "lead@brookmere.test")!.text, "reset-password");
    await expect(resetPassword(token, "later-password-1", new Date(now.getTime() + RESET_LIFETIME_MS + 1))).rejects.toMatchObject({ code: "reset_expired" });
  });
});
