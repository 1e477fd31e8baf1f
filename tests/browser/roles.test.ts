// Each demo role sees the shell fitted to it (issue 2, "Done when"): the sections its roles
// grant, and refusals for what they may not open — another workspace, the admin pages.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { navFor } from "@/components/shell/nav-items";
import type { Role } from "@/lib/auth/roles";
import { freshPage, launch, signIn, snap } from "./support";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

const ROLES: { email: string; name: string; badge: string; role: Role; admin: boolean }[] = [
  { email: "admin@brookmere.test", name: "Maren Ostby", badge: "Admin", role: "admin", admin: true },
  { email: "designer@brookmere.test", name: "Tobiah Quill", badge: "Device designer", role: "designer", admin: false },
  { email: "reviewer@brookmere.test", name: "Ilse Varga", badge: "Fluidics reviewer", role: "fluidics_reviewer", admin: false },
  { email: "fab@brookmere.test", name: "Dario Penwright", badge: "Fab liaison", role: "fab_liaison", admin: false },
  { email: "lead@brookmere.test", name: "Sunniva Holt", badge: "Lead", role: "lead", admin: false },
];

describe("the shell for each demo role", () => {
  for (const role of ROLES) {
    it(`${role.badge}: lands in Brookmere with the sections its role grants`, async () => {
      const { context, page } = await freshPage(browser);
      try {
        await signIn(page, role.email);
        expect(new URL(page.url()).pathname).toBe("/w/brookmere");
        await expect(page.getByTestId("user-name").textContent()).resolves.toBe(role.name);
        await expect(page.getByTestId("user-roles").textContent()).resolves.toBe(role.badge);
        await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Brookmere Biofluidics");
        const nav = page.getByRole("navigation", { name: "Workspace sections" });
        const shown = await nav.getByRole("link").allTextContents();
        // Exactly the sections the permission table grants this role (and whose pages exist)…
        expect(shown).toEqual(navFor({ userId: 0, workspaceId: 0, roles: [role.role] }, "brookmere").map((i) => i.label));
        // …which always includes the overview, and Admin only for admins.
        expect(shown[0]).toBe("Overview");
        expect(shown.includes("Admin")).toBe(role.admin);
        await expect(page.getByRole("link", { name: "Overview" }).getAttribute("aria-current")).resolves.toBe("page");
        await snap(page, `landing-${role.email.split("@")[0]}`);

        // The admin pages: open to admins, refused (server-side) to everyone else.
        await page.goto("/w/brookmere/admin/members");
        if (role.admin) {
          const rows = (await page.getByTestId("member-row").allTextContents()).join(" ");
          for (const r of ROLES) expect(rows).toContain(r.name);
        } else {
          await page.getByRole("heading", { name: "You can’t open this page" }).waitFor();
          await page.getByText("This needs the admin role in this workspace.").waitFor();
          expect(await page.getByTestId("member-row").count()).toBe(0);
        }
        // Halvard Microsystems is another company: only the shared fab liaison belongs.
        await page.goto("/w/halvard");
        if (role.email === "fab@brookmere.test") {
          await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Halvard Microsystems");
        } else {
          await page.getByText("You are not a member of that workspace.").waitFor();
        }
      } finally {
        await context.close();
      }
    });
  }

  it("offers a workspace switcher only to people in several workspaces, and it switches", async () => {
    const { context, page } = await freshPage(browser);
    try {
      await signIn(page, "fab@brookmere.test");
      const switcher = page.getByTestId("workspace-switcher");
      await switcher.locator("summary").click();
      await switcher.getByRole("link", { name: "Halvard Microsystems" }).click();
      await page.waitForURL(/\/w\/halvard$/);
      await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Halvard Microsystems");
    } finally {
      await context.close();
    }
    const single = await freshPage(browser);
    try {
      await signIn(single.page, "lead@brookmere.test");
      expect(await single.page.getByTestId("workspace-switcher").count()).toBe(0);
    } finally {
      await single.context.close();
    }
  });

  it("sends a signed-out visitor to sign-in and back to the page asked for; sign-out ends the session", async () => {
    const { context, page } = await freshPage(browser);
    try {
      await page.goto("/w/brookmere/admin/invitations");
      await page.waitForURL(/\/sign-in\?callbackUrl=/);
      await page.getByLabel("E-mail").fill("admin@brookmere.test");
      await page.getByLabel("Password").fill("stokeline-demo");
      await page.getByRole("button", { name: "Sign in" }).click();
      await page.waitForURL(/\/w\/brookmere\/admin\/invitations$/);
      await page.getByRole("button", { name: "Sign out" }).click();
      await page.waitForURL(/\/sign-in/);
      await page.getByText("You are signed out.").waitFor();
      await page.goto("/w/brookmere");
      await page.waitForURL(/\/sign-in/);
    } finally {
      await context.close();
    }
  });

  it("signs in with the keyboard alone", async () => {
    const { context, page } = await freshPage(browser);
    try {
      await page.goto("/sign-in");
      await page.getByLabel("E-mail").focus();
      await page.keyboard.type("designer@brookmere.test");
      await page.keyboard.press("Tab");
      await expect(page.evaluate(() => document.activeElement?.getAttribute("name"))).resolves.toBe("password");
      await page.keyboard.type("stokeline-demo");
      await page.keyboard.press("Enter");
      await page.waitForURL(/\/w\/brookmere$/);
    } finally {
      await context.close();
    }
  });
});
