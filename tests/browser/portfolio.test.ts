// The lead's path in Chromium (issue 8, "Done when"): sign in as the lead, see the portfolio,
// open a chip's trends, download the brief (checked as a PDF — header "%PDF-", ISO 32000-1
// §7.5.2 — whose text, read with pdfjs-dist, names the chip, its SHA-256 and the cautions),
// create a share link, open it signed out, revoke it, and see the revoked link answer 404
// (HTML) and 410 Gone (PDF) (RFC 9110 §15.5.5, §15.5.11). The lead sees no upload or edit control.
// Uses the demo seed's chips (db/seed-chips.ts), which every fresh test database has.
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { launch, Sessions, snap } from "./support";
import { looksLikePdf, pdfText } from "../lib/reports/pdf-text";

let browser: Browser;
const sessions = new Sessions(() => browser);

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await sessions.closeAll();
  await browser?.close();
});


const EDIT_CONTROLS = /upload a revision|upload the first layout|new chip|create chip|map the layers|add an operating point|submit for review/i;

async function editControlCount(page: Page): Promise<number> {
  return page.getByRole("button", { name: EDIT_CONTROLS }).or(page.getByRole("link", { name: EDIT_CONTROLS })).count();
}

describe("the lead's portfolio, trends, brief and share links", () => {
  it("lead: portfolio → trends → brief PDF → share link created, opened, revoked (404/410); no edit controls", async () => {
    const page = await sessions.signedIn("lead@brookmere.test", { acceptDownloads: true });
    await page.getByRole("navigation").getByRole("link", { name: "Portfolio" }).click();
    await page.waitForURL(/\/w\/brookmere\/portfolio$/);
    await page.getByRole("heading", { level: 1, name: "Portfolio" }).waitFor();
    const card = page.locator('[data-testid="portfolio-card"][data-chip="Droplet generator DG-1"]');
    await card.waitFor();
    expect(await card.textContent()).toMatch(/Revision 2 of 2/);
    expect(await card.textContent()).toMatch(/µL\/min/);
    expect(await page.getByTestId("portfolio-card").count()).toBeGreaterThanOrEqual(3);
    await snap(page, "reports-portfolio-1440");
    expect(await editControlCount(page)).toBe(0);

    // Search by name lives in the URL.
    await page.getByLabel("Search by name").fill("mixer");
    await page.getByRole("button", { name: "Apply" }).click();
    await page.waitForURL(/[?&]q=mixer/);
    await page.locator('[data-testid="portfolio-card"][data-chip="Serpentine mixer SM-2"]').waitFor();
    expect(await page.locator('[data-testid="portfolio-card"][data-chip="Droplet generator DG-1"]').count()).toBe(0);
    await page.getByRole("link", { name: "Clear" }).click();
    await card.waitFor();

    // Trends of one chip.
    await card.getByRole("link", { name: "Trends" }).click();
    await page.waitForURL(/\/chips\/\d+\/trends$/);
    await page.getByTestId("trend-pressure").locator("svg circle").first().waitFor();
    expect(await page.getByTestId("trend-pressure").locator("svg circle").count()).toBe(2);
    expect(await page.getByTestId("trend-flags").locator("svg rect").count()).toBeGreaterThan(0);
    expect(await page.getByTestId("trend-table").locator("tbody tr").count()).toBe(2);
    await snap(page, "reports-trends-1440");
    const chipPath = new URL(page.url()).pathname.replace(/\/trends$/, "");

    // The chip page offers the lead nothing to edit.
    await page.goto(chipPath);
    await page.getByRole("heading", { level: 1, name: "Droplet generator DG-1" }).waitFor();
    expect(await editControlCount(page)).toBe(0);

    // The brief of revision 2, as HTML, then as a PDF download.
    await page.goto(`${chipPath}/revisions/2/brief`);
    await page.getByTestId("brief").waitFor();
    const sha = (await page.getByTestId("brief-sha").textContent())!.trim();
    expect(sha).toMatch(/^[0-9a-f]{64}$/);
    expect(await page.getByTestId("brief-cautions").textContent()).toContain(MODEL_CAUTIONS[1]);
    expect(await page.getByTestId("brief-drawing").locator("polyline").count()).toBeGreaterThan(3);
    expect(await editControlCount(page)).toBe(0);
    await snap(page, "reports-brief-html-1440");
    // Print CSS: the workspace frame and the page's own buttons drop away, the brief and its footer stay.
    await page.emulateMedia({ media: "print" });
    expect(await page.locator("header").first().isVisible()).toBe(false);
    expect(await page.getByTestId("download-brief").isVisible()).toBe(false);
    expect(await page.getByTestId("brief-footer").isVisible()).toBe(true);
    await snap(page, "reports-brief-print-1440");
    await page.emulateMedia({ media: "screen" });
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-brief").click()]);
    expect(download.suggestedFilename()).toBe("brief-droplet-generator-dg-1-rev2.pdf");
    const bytes = new Uint8Array(readFileSync((await download.path())!));
    expect(looksLikePdf(bytes)).toBe(true);
    if (process.env.STOKELINE_SCREENSHOTS) writeFileSync(path.join(process.env.STOKELINE_SCREENSHOTS, "reports-brief-dg1.pdf"), bytes); // for looking, not asserting
    const text = (await pdfText(bytes)).all.replace(/\s+/g, " ");
    expect(text).toContain("Droplet generator DG-1");
    expect(text).toContain(sha);
    for (const c of MODEL_CAUTIONS) expect(text).toContain(c);

    // A share link: created, opened signed out, revoked.
    await page.getByLabel(/Valid for/).fill("7");
    await page.getByLabel(/For whom/).fill("Browser test partner");
    await page.getByRole("button", { name: "Create share link" }).click();
    const urlBox = page.getByTestId("new-share-url");
    await urlBox.waitFor();
    const shareUrl = await urlBox.inputValue();
    expect(shareUrl).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
    const sharePath = new URL(shareUrl).pathname;

    const stranger = await (await sessions.context({ acceptDownloads: true })).newPage();
    const opened = await stranger.goto(sharePath);
    expect(opened?.status()).toBe(200);
    await stranger.getByTestId("brief").waitFor();
    expect(await stranger.getByTestId("brief-sha").textContent()).toContain(sha);
    expect(await stranger.getByRole("navigation").count()).toBe(0); // no workspace navigation, only the brief
    await snap(stranger, "reports-shared-brief-1440");

    const row = page.locator('[data-testid="share-links"] tr', { hasText: "Browser test partner" });
    await row.getByRole("button", { name: /Revoke/ }).click();
    await page.locator('[data-testid="share-links"] tr[data-share-status="revoked"]', { hasText: "Browser test partner" }).waitFor();

    const gone = await stranger.goto(sharePath);
    expect(gone?.status()).toBe(404);
    await stranger.getByRole("heading", { name: "This link does not work" }).waitFor();
    const pdfGone = await stranger.request.get(`${sharePath}/brief.pdf`);
    expect(pdfGone.status()).toBe(410);
  });

  it("the lead's calls to mutating routes (chip create, upload, review steps) answer 403", async () => {
    const page = await sessions.signedIn("lead@brookmere.test", { acceptDownloads: true });
    const chips = await page.request.get("/api/v1/workspaces/1/chips");
    const chipId = ((await chips.json()) as { chips: { id: number }[] }).chips[0].id;
    const create = await page.request.post("/api/v1/workspaces/1/chips", { data: { name: "Lead's own chip" } });
    expect(create.status()).toBe(403);
    const upload = await page.request.post(`/api/v1/chips/${chipId}/revisions`, {
      multipart: { file: { name: "lead.dxf", mimeType: "application/dxf", buffer: Buffer.from("0\nEOF\n") }, note: "lead upload" },
    });
    expect(upload.status()).toBe(403);
    const revisions = await page.request.get(`/api/v1/chips/${chipId}/revisions`);
    const revisionId = ((await revisions.json()) as { revisions: { id: number }[] }).revisions[0].id;
    for (const step of ["submit", "pass", "request-changes", "withdraw"]) {
      const res = await page.request.post(`/api/v1/revisions/${revisionId}/review/${step}`, { data: { expectedVersion: 0, note: "The lead tries a step." } });
      expect(res.status()).toBe(403);
    }
  });
});
