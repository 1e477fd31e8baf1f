// The analysis view in a real browser (issue 6, "Browser tests"): a designer opens a demo
// analysis from the chips pages by clicking, colours the drawing by Re, selects a segment
// from the table and from the drawing, filters to flagged segments, exports the CSV, draws a
// pressure profile between two ports and compares two revisions; Tab reaches the controls.
// Demo data: db/seed-chips.ts (Brookmere Biofluidics, invented). Expected values come from
// the server's own stored analysis (GET /api/v1/analyses/:id), read independently of the page.
import { mkdirSync, readFileSync } from "node:fs";
import { csvParseRows } from "d3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE_URL, launch, signIn } from "./support";

const SHOTS = "/tmp/shots/view";
// Droplet generator DG-1: revision 2 widened the orifice (db/seed-chips.ts), and its nominal
// analysis raises segment flags on some segments but not all, so the flagged filter can be seen to narrow.
const CHIP = "Droplet generator DG-1";
const POINT = "nominal 5:1";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
  mkdirSync(SHOTS, { recursive: true });
});
afterAll(async () => {
  await browser?.close();
});

async function openPage(width: number, height: number): Promise<{ page: Page; close: () => Promise<void> }> {
  const context = await browser.newContext({ baseURL: BASE_URL, viewport: { width, height }, acceptDownloads: true });
  const page = await context.newPage();
  return { page, close: () => context.close() };
}

/** From the signed-in overview to the nominal analysis of a revision of the demo droplet generator, by clicking. */
async function openDemoAnalysis(page: Page, revision: number): Promise<void> {
  await page.getByRole("navigation").getByRole("link", { name: "Chips", exact: true }).first().click();
  await page.waitForURL(/\/chips$/);
  await page.getByTestId("chip-link").filter({ hasText: CHIP }).click();
  await page.getByTestId("revision-timeline").waitFor();
  await page.locator(`[data-testid="revision-entry"][data-revision="${revision}"]`).getByTestId("analysis-link").filter({ hasText: POINT }).click();
  await page.waitForURL(/\/analyses\/\d+/);
  await page.getByTestId("chip-drawing").waitFor();
  await page.locator("tr[data-segment]").first().waitFor();
}

type StoredAnalysis = { result: { segments: { id: string }[]; flags: { target: { kind: string; id?: string } }[]; ports: { name: string }[] } };

async function storedAnalysis(page: Page): Promise<StoredAnalysis> {
  const id = /\/analyses\/(\d+)/.exec(page.url())![1];
  const res = await page.request.get(`/api/v1/analyses/${id}`);
  expect(res.status()).toBe(200);
  return (await res.json()) as StoredAnalysis;
}

/** The regime map and the profile mount when scrolled into view (when-visible.tsx): scroll to the end and wait for them. */
async function revealLazyCharts(page: Page): Promise<void> {
  await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
  await page.getByRole("button", { name: "Draw profile" }).waitFor();
}

const legendCaption = (page: Page) => page.locator("figure figcaption").first().textContent();
const rowIds = (page: Page) => page.locator("tr[data-segment]").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-segment")));
const selectedRowIds = (page: Page) => page.locator("tr[data-segment][data-selected]").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-segment")));

describe("analysis view", () => {
  it("a designer colours, selects, filters, exports, profiles and compares", async () => {
    const { page, close } = await openPage(1440, 900);
    try {
      await signIn(page, "designer@brookmere.test");
      await openDemoAnalysis(page, 2);
      const stored = await storedAnalysis(page);
      const segments = stored.result.segments;
      expect(segments.length).toBeGreaterThan(1);

      // Colour by Re: the legend's label follows, and a dimensionless group carries no unit.
      const before = await legendCaption(page);
      expect(before).toMatch(/Pressure/);
      expect(before).toMatch(/\(.+\)/); // pressure carries its display unit
      await page.getByLabel("Colour by").selectOption("reynolds");
      await expect.poll(() => legendCaption(page)).toMatch(/^Reynolds number/);
      const after = await legendCaption(page);
      expect(after).not.toMatch(/\(/); // Re is dimensionless (its definition, ρUD/μ)
      expect(await page.getByTestId("chip-drawing").getAttribute("aria-label")).toContain("coloured by Reynolds number");

      // Table → drawing: clicking a row marks it selected and draws the highlight for the same segment.
      const pick = segments[Math.floor(segments.length / 2)].id;
      await page.locator(`tr[data-segment="${pick}"]`).click();
      await expect.poll(() => selectedRowIds(page)).toEqual([pick]);
      await expect.poll(() => page.getByTestId("selected-highlight").getAttribute("data-segment")).toBe(pick);
      expect(await page.getByTestId("selection-status").textContent()).toContain(pick);

      // Drawing → table: click the middle of the highlighted centreline (after clearing the selection).
      await page.getByTestId("chip-drawing").scrollIntoViewIfNeeded();
      const point = await page.getByTestId("selected-highlight").locator("path").last().evaluate((el) => {
        const p = el as SVGPathElement;
        const mid = p.getPointAtLength(p.getTotalLength() / 2);
        const m = p.getScreenCTM()!;
        return { x: mid.x * m.a + mid.y * m.c + m.e, y: mid.x * m.b + mid.y * m.d + m.f };
      });
      await page.getByRole("button", { name: "Clear selection" }).click();
      await expect.poll(() => page.getByTestId("selected-highlight").count()).toBe(0);
      await page.mouse.click(point.x, point.y);
      await expect.poll(() => selectedRowIds(page)).toEqual([pick]);
      await expect.poll(() => page.getByTestId("selected-highlight").getAttribute("data-segment")).toBe(pick);

      // Only flagged: the rows left are exactly the segments the stored flags name.
      const flagged = new Set(stored.result.flags.filter((f) => f.target.kind === "segment" && f.target.id).map((f) => f.target.id!));
      expect(flagged.size).toBeGreaterThan(0);
      expect(flagged.size).toBeLessThan(segments.length);
      await page.getByLabel("Only flagged").check();
      await expect.poll(async () => (await rowIds(page)).length).toBe(flagged.size);
      expect(new Set(await rowIds(page))).toEqual(flagged);

      // CSV export of exactly what is shown; parsed with d3-dsv (RFC 4180).
      const shown = await rowIds(page);
      const segmentTable = page.locator("table:has(tr[data-segment])");
      const headers = await segmentTable.locator("thead th").allTextContents();
      const shownCells = await segmentTable.locator("tbody tr[data-segment]").evaluateAll((rows) => rows.map((r) => [...r.querySelectorAll("td")].map((td) => td.textContent ?? "")));
      const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name: "Export CSV" }).click()]);
      expect(download.suggestedFilename()).toMatch(/\.csv$/);
      const text = readFileSync((await download.path())!, "utf8");
      expect(text.endsWith("\r\n")).toBe(true); // RFC 4180 record ends
      const [head, ...rows] = csvParseRows(text.trimEnd());
      expect(head.length).toBe(headers.length);
      expect(rows.map((r) => r[0])).toEqual(shown);
      // Each number in the file is the number on screen, to the screen's rounding (3 significant digits, common practice).
      let compared = 0;
      rows.forEach((r, i) =>
        r.forEach((cell, j) => {
          const a = Number(cell);
          const b = Number(shownCells[i][j].replace(/\u2212/g, "-").replace(/\s/g, ""));
          if (cell !== "" && Number.isFinite(a) && Number.isFinite(b)) {
            compared++;
            expect(Math.abs(a - b)).toBeLessThanOrEqual(Math.abs(b) * 5e-3 + 1e-12);
          }
        }),
      );
      expect(compared).toBeGreaterThanOrEqual(rows.length * 5); // most columns are numbers
      expect(head.some((h) => /\(µm\)$/.test(h))).toBe(true); // sizes carry µm (the default length unit)
      expect(head.some((h) => /\((mbar|kPa|Pa|bar|psi)\)$/.test(h))).toBe(true); // a pressure column carries its unit
      await page.getByLabel("Only flagged").uncheck();

      // Pressure profile between two ports: points appear, one per node on the path.
      await revealLazyCharts(page);
      // The regime map's threshold labels sit beside their dashed lines, not on them (readability, common practice).
      const labelGaps = await page.getByTestId("regime-chart").locator("g:has(> line[stroke-dasharray='5 3']) ").evaluateAll((groups) =>
        groups.map((g) => g.querySelector("text")!.getBoundingClientRect().left - g.querySelector("line")!.getBoundingClientRect().right),
      );
      expect(labelGaps.length).toBeGreaterThan(0);
      for (const gap of labelGaps) expect(gap).toBeGreaterThanOrEqual(0);
      await page.getByRole("button", { name: "Draw profile" }).click();
      const chart = page.getByTestId("pressure-profile");
      await chart.waitFor();
      expect(await chart.locator("circle").count()).toBeGreaterThanOrEqual(2);
      expect(await chart.getAttribute("aria-label")).toMatch(/^Pressure from \S+ to \S+: falls by/);

      // Keyboard reach: Tab from the top of the page reaches the quantity picker and the table.
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.locator("body").click({ position: { x: 2, y: 2 } });
      const reached = new Set<string>();
      for (let i = 0; i < 120 && reached.size < 2; i++) {
        await page.keyboard.press("Tab");
        const where = await page.evaluate(() => {
          const el = document.activeElement;
          if (!el) return "";
          if (el.closest("label")?.textContent?.startsWith("Colour by")) return "picker";
          if (el.closest("table tbody tr[data-segment]")) return "table";
          return "";
        });
        if (where) reached.add(where);
      }
      expect([...reached].sort()).toEqual(["picker", "table"]);

      await page.setViewportSize({ width: 1440, height: 900 });
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.screenshot({ path: `${SHOTS}/analysis-1440x900.png`, fullPage: true });

      // Compare revision 2 with revision 1: the compare link opens a table of changes.
      await page.getByRole("navigation", { name: "Compare with" }).getByRole("link", { name: /^Revision 1/ }).click();
      await page.waitForURL(/compare=\d+/);
      const compare = page.getByTestId("compare-view");
      await compare.waitFor();
      expect(await compare.getByRole("heading").first().textContent()).toMatch(/Changes from .*Revision 1.* to Revision 2/);
      expect(await compare.locator("table").count()).toBeGreaterThan(0);
      expect(await compare.locator("table tbody tr").count()).toBeGreaterThan(0);
      // Rev 2 widened the orifice from 40 to 55 µm (db/seed-chips.ts): at least one segment changed.
      expect(await compare.textContent()).toMatch(/[1-9]\d* changed/);
      expect(await compare.getByRole("table", { name: "Changed segments" }).count()).toBe(1);
      await revealLazyCharts(page);
      await page.evaluate(() => window.scrollTo(0, 0));
      const wide = await page.evaluate(() => document.documentElement.scrollWidth <= document.documentElement.clientWidth);
      expect(wide).toBe(true); // no sideways scroll at desktop width either
      await page.screenshot({ path: `${SHOTS}/compare-1440x900.png`, fullPage: true });
    } finally {
      await close();
    }
  });

  it("the tablet layout has no horizontal overflow", async () => {
    const { page, close } = await openPage(820, 1180);
    try {
      await signIn(page, "designer@brookmere.test");
      await openDemoAnalysis(page, 2);
      await page.getByLabel("Colour by").selectOption("reynolds");
      await expect.poll(() => legendCaption(page)).toMatch(/^Reynolds number/);
      await revealLazyCharts(page);
      await page.getByRole("button", { name: "Draw profile" }).click();
      await page.getByTestId("pressure-profile").waitFor();
      await page.evaluate(() => window.scrollTo(0, 0));
      // The document is no wider than the viewport (wide tables scroll inside their own box).
      const { scrollWidth, clientWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, clientWidth: document.documentElement.clientWidth }));
      expect(scrollWidth).toBeLessThanOrEqual(clientWidth);
      // The lumped model's cautions are on the page beside the numbers (lib/analysis/cautions.ts).
      const cautions = page.getByRole("complementary", { name: "Limits of these figures" });
      expect(await cautions.isVisible()).toBe(true);
      expect(await cautions.textContent()).toMatch(/lumped model/);
      await page.screenshot({ path: `${SHOTS}/analysis-820x1180.png`, fullPage: true });
    } finally {
      await close();
    }
  });
});
