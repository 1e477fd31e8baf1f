/**
 * Shared helpers for browser tests. Each test file gets its own Chromium with a fresh
 * profile (launch + new context). See DEVELOPERS.md, "Adding a browser test".
 */
import { mkdirSync } from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";

export const BASE_URL = process.env.STOKELINE_BASE_URL ?? "";
export const DEMO_PASSWORD = "stokeline-demo";

/** The launch flags the project requires (issue 2). */
export const CHROMIUM_ARGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--no-first-run",
  "--disable-quic",
];

export async function launch(): Promise<Browser> {
  if (!BASE_URL) throw new Error("STOKELINE_BASE_URL is not set: run browser tests with `npm run test:browser`.");
  return chromium.launch({ executablePath: process.env.CHROME_PATH || "/usr/bin/chromium", args: CHROMIUM_ARGS });
}

/** A fresh, signed-out context (own cookies and storage). */
export async function freshPage(browser: Browser): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ baseURL: BASE_URL, viewport: { width: 1280, height: 860 } });
  const page = await context.newPage();
  return { context, page };
}

/**
 * The contexts one test file opens at 1440×900 (the size the screenshots are judged at), each with its own
 * cookies, closed together in afterAll. Takes the browser lazily: it is launched in beforeAll.
 */
export class Sessions {
  private readonly open: BrowserContext[] = [];
  constructor(private readonly browser: () => Browser) {}

  async context(options: { acceptDownloads?: boolean } = {}): Promise<BrowserContext> {
    const context = await this.browser().newContext({ baseURL: BASE_URL, viewport: { width: 1440, height: 900 }, ...options });
    this.open.push(context);
    return context;
  }

  /** A page in a new context, signed in as email through the real form. */
  async signedIn(email: string, options: { acceptDownloads?: boolean } = {}): Promise<Page> {
    const page = await (await this.context(options)).newPage();
    await signIn(page, email);
    return page;
  }

  async closeAll(): Promise<void> {
    for (const c of this.open.splice(0)) await c.close().catch(() => undefined);
  }
}

/** Signs in through the real form and waits until the workspace shell shows. */
export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL(/\/w\/[a-z0-9-]+$/);
}

/** Saves a screenshot when STOKELINE_SCREENSHOTS names a folder (for looking, not asserting). */
export async function snap(page: Page, name: string): Promise<void> {
  const dir = process.env.STOKELINE_SCREENSHOTS;
  if (!dir) return;
  mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}
