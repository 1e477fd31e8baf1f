// Repeated wrong passwords are throttled with a clear message (issue 2). Limit: 5 failures per
// account per 15 minutes — common practice (see lib/auth/rate-limit.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { freshPage, launch, snap } from "./support";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("sign-in throttling", () => {
  it("says the pair does not match, then after five failures refuses even the right password and says why", async () => {
    const { context, page } = await freshPage(browser);
    try {
      await page.goto("/sign-in");
      const attempt = async (password: string) => {
        await page.getByLabel("E-mail").fill("designer@halvard.test");
        await page.getByLabel("Password").fill(password);
        await page.getByRole("button", { name: "Sign in" }).click();
        const error = page.getByTestId("sign-in-error");
        await error.waitFor();
        const text = (await error.textContent()) ?? "";
        // Clear the message so the next attempt's text is its own.
        await page.reload();
        return text;
      };
      for (let i = 0; i < 5; i++) expect(await attempt(`wrong-guess-${i}`)).toBe("That e-mail and password do not match. Check both and try again.");
      const blocked = await attempt("stokeline-demo");
      expect(blocked).toMatch(/^Too many failed sign-ins for this account\. Wait 1[45] minutes and try again, or reset your password\.$/);
      await page.getByLabel("E-mail").fill("designer@halvard.test");
      await page.getByLabel("Password").fill("stokeline-demo");
      await page.getByRole("button", { name: "Sign in" }).click();
      await page.getByTestId("sign-in-error").waitFor();
      await snap(page, "rate-limited");
      expect(new URL(page.url()).pathname).toBe("/sign-in");
    } finally {
      await context.close();
    }
  });

  it("shows a field-level message for a malformed reset request, and the same answer for any address", async () => {
    const { context, page } = await freshPage(browser);
    try {
      await page.goto("/forgot-password");
      await page.getByLabel("E-mail").fill("not-an-address");
      await page.getByRole("button", { name: "Send reset link" }).click();
      await page.getByText("Enter a valid e-mail address, like name@example.com.").first().waitFor();
      await page.getByLabel("E-mail").fill("nobody-here@brookmere.test");
      await page.getByRole("button", { name: "Send reset link" }).click();
      await page.getByText(/If an account uses nobody-here@brookmere\.test, a reset link is on its way/).waitFor();
    } finally {
      await context.close();
    }
  });
});
