// Issue 2, "Done when": an admin invites a new member by e-mail, the invitee sets a password
// from the outbox link and signs in.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { freshPage, launch, signIn, snap } from "./support";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("invitation by e-mail", () => {
  it("admin invites, the invitee follows the outbox link, sets a password and signs in with the invited role", async () => {
    const admin = await freshPage(browser);
    const invitee = await freshPage(browser);
    try {
      await signIn(admin.page, "admin@brookmere.test");
      await admin.page.getByRole("link", { name: "Invite a member" }).click();
      await admin.page.waitForURL(/\/admin\/invitations$/);
      await admin.page.getByLabel("E-mail address").fill("rosalind.ferro@brookmere.test");
      await admin.page.getByLabel("Fluidics reviewer").check();
      await admin.page.getByRole("button", { name: "Send invitation" }).click();
      await admin.page.getByText("Invitation sent to rosalind.ferro@brookmere.test.").waitFor();
      await expect(admin.page.getByTestId("invitation-row").first().textContent()).resolves.toMatch(/rosalind\.ferro@brookmere\.test.*Fluidics reviewer.*pending/);

      await admin.page.getByRole("link", { name: "Mail outbox" }).click();
      const message = admin.page.getByTestId("outbox-message").filter({ hasText: "rosalind.ferro@brookmere.test" }).first();
      await message.waitFor();
      await snap(admin.page, "outbox");
      const link = await message.getByRole("link", { name: /\/invite\// }).getAttribute("href");
      expect(link).toMatch(/\/invite\/[A-Za-z0-9_-]{40,}$/);

      // The invitee opens the link in their own browser profile.
      await invitee.page.goto(new URL(link!).pathname);
      await invitee.page.getByRole("heading", { name: "Join Brookmere Biofluidics" }).waitFor();
      await invitee.page.getByLabel("Your name").fill("Rosalind Ferro");
      await invitee.page.getByLabel("Choose a password").fill("short");
      await invitee.page.getByLabel("Type it again").fill("short");
      await invitee.page.getByRole("button", { name: "Set password and join" }).click();
      await invitee.page.locator("#field-password-error").getByText("Use at least 10 characters for the password.").waitFor();
      // What was typed (except passwords) survives the failed attempt.
      await expect(invitee.page.getByLabel("Your name").inputValue()).resolves.toBe("Rosalind Ferro");
      await invitee.page.getByLabel("Choose a password").fill("ferro-in-the-lab-2026");
      await invitee.page.getByLabel("Type it again").fill("ferro-in-the-lab-2026");
      await invitee.page.getByRole("button", { name: "Set password and join" }).click();
      await invitee.page.waitForURL(/\/sign-in\?notice=joined/);
      await expect(invitee.page.getByLabel("E-mail").inputValue()).resolves.toBe("rosalind.ferro@brookmere.test");
      await invitee.page.getByLabel("Password").fill("ferro-in-the-lab-2026");
      await invitee.page.getByRole("button", { name: "Sign in" }).click();
      await invitee.page.waitForURL(/\/w\/brookmere$/);
      await expect(invitee.page.getByTestId("user-name").textContent()).resolves.toBe("Rosalind Ferro");
      await expect(invitee.page.getByTestId("user-roles").textContent()).resolves.toBe("Fluidics reviewer");
      await snap(invitee.page, "invitee-landing");

      // The link worked once.
      await invitee.page.goto(new URL(link!).pathname);
      await invitee.page.getByText("This invitation has already been used.").waitFor();

      // The admin now sees the new member and the accepted invitation.
      await admin.page.goto("/w/brookmere/admin/members");
      await expect(admin.page.getByTestId("member-row").filter({ hasText: "Rosalind Ferro" }).count()).resolves.toBe(1);
    } finally {
      await admin.context.close();
      await invitee.context.close();
    }
  });
});
