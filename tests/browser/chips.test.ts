// The chips-and-revisions flow in a real browser (issue 5, "Done when"): a designer creates a
// chip, uploads a DXF, maps its layers, sets an operating point and reaches the result;
// uploads a changed revision; the history shows both; the same file again is "already
// revision 1". A lead sees the chips but no upload or edit control.
// Layout fixtures: tests/fixtures/layouts (authored with ezdxf by generate.py).
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE_URL, launch, signIn, snap } from "./support";

const fixture = (name: string) => fileURLToPath(new URL(`../fixtures/layouts/${name}`, import.meta.url));
// Unique per run, so the test also passes against a database kept from an earlier run.
const CHIP = `Browser flow chip ${Date.now().toString(36)}`;

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function page1440(): Promise<{ page: Page; close: () => Promise<void> }> {
  const context = await browser.newContext({ baseURL: BASE_URL, viewport: { width: 1440, height: 900 } });
  const page = await context.newPage();
  return { page, close: () => context.close() };
}

async function mapTeeLayers(page: Page, expectRemembered: boolean) {
  await page.getByRole("heading", { name: /Map the layers of revision/ }).waitFor();
  // Every layer of the file is listed with the role the reader proposes from its contents preselected
  // (lines → channel, circles → port, text → ignore; tee fixtures per tests/fixtures/layouts/expected.json).
  expect(await page.getByTestId("layer-row").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-layer")))).toEqual(["FLOW", "PORTS", "TEXT"]);
  for (const [layer, role] of [["FLOW", "channel"], ["PORTS", "port"], ["TEXT", "ignore"]] as const) {
    expect(await page.getByLabel(`Role of ${layer}`).inputValue()).toBe(role);
  }
  expect(await page.locator('[data-layer="FLOW"]').textContent()).toContain("2 LINE");
  const flow = page.locator('[data-testid="layer-row"][data-layer="FLOW"]');
  // Thumbnails: one SVG per layer with something drawn.
  expect(await flow.locator("svg[role=img] path").count()).toBeGreaterThan(0);
  if (expectRemembered) {
    expect(await flow.getByLabel("Depth").inputValue()).toBe("50 um");
    expect(await flow.getByText("remembered from the previous revision").count()).toBe(1);
  } else {
    await flow.getByLabel("Depth").fill("50 um");
    await flow.getByLabel("Default width").fill("100 um");
  }
}

describe("chips and revisions", () => {
  it("a designer goes from a new chip to an analysis result, then uploads a changed revision", async () => {
    const { page, close } = await page1440();
    try {
      await signIn(page, "designer@brookmere.test");
      await page.goto("/w/brookmere/chips");
      // The seeded demo chips are listed with their worst flag (db/seed-chips.ts).
      const demoChips = ["Droplet generator DG-1", "Gradient generator GG-3", "Serpentine mixer SM-2"];
      for (const name of demoChips) expect(await page.getByTestId("chip-link").filter({ hasText: name }).count()).toBe(1);
      await snap(page, "chips-list");

      // Search in the URL.
      // Search by name or purpose, kept in the URL: "mixer" is in SM-2's name and GG-3's purpose.
      await page.getByLabel("Search chips").fill("mixer");
      await page.waitForURL(/q=mixer/);
      await expect.poll(() => page.getByTestId("chip-link").allTextContents()).toEqual(["Serpentine mixer SM-2", "Gradient generator GG-3"]);
      await page.getByLabel("Search chips").fill("droplet");
      await page.waitForURL(/q=droplet/);
      await expect.poll(() => page.getByTestId("chip-link").allTextContents()).toEqual(["Droplet generator DG-1"]);
      // Sorting by name, also in the URL.
      await page.getByLabel("Search chips").fill("");
      await page.getByRole("button", { name: /^Chip/ }).click();
      await page.waitForURL(/sort=name&dir=asc/);
      await expect
        .poll(async () => {
          const names = await page.getByTestId("chip-link").allTextContents();
          return names.length >= 3 && names.join("|") === [...names].sort((a, b) => a.localeCompare(b)).join("|");
        })
        .toBe(true);

      await page.getByRole("button", { name: "New chip" }).first().click();
      // Field-level error from the shared schema, in plain words.
      await page.getByRole("button", { name: "Create chip" }).click();
      await page.getByText("Give the chip a name.").waitFor();
      await page.getByLabel("Name").fill(CHIP);
      await page.getByLabel("Purpose").fill("Tee junction used to check the upload flow.");
      await page.getByRole("button", { name: "Create chip" }).click();
      await page.waitForURL(/\/chips\/\d+\/upload\?first=1$/);
      const chipUrl = new URL(page.url()).pathname.replace(/\/upload$/, "");

      // A wrong file type is refused in the browser before sending.
      await page.getByTestId("file-input").setInputFiles({ name: "notes.txt", mimeType: "text/plain", buffer: Buffer.from("not a layout") });
      await page.getByTestId("upload-problem").getByText("is not a .dxf file").waitFor();

      await page.getByTestId("file-input").setInputFiles(fixture("tee-um-r2000.dxf"));
      await page.getByLabel("What changed and why").fill("First layout: a symmetric tee.");
      expect(await page.getByTestId("upload-limit").textContent()).toContain("MiB");
      await snap(page, "chips-upload");
      await page.getByRole("button", { name: "Upload revision" }).click();
      await page.waitForURL(/\/revisions\/1\/layers$/);

      await mapTeeLayers(page, false);
      await snap(page, "chips-mapping");
      await page.getByRole("button", { name: "Save layer mapping" }).click();
      await page.waitForURL(/\/revisions\/1\?mapped=1$/);

      // The operating point form lists the layout's ports.
      const form = page.getByTestId("operating-point-form");
      await form.waitFor();
      expect(await page.getByTestId("port-row").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-port")))).toEqual(["A", "B", "C"]);
      await page.getByLabel("How port A is driven").selectOption("flow");
      await page.getByLabel("Value at port A").fill("10 uL/min");
      await page.getByLabel("Value at port B").fill("0 mbar");
      await page.getByLabel("Value at port C").fill("0 mbar");
      // A unit that does not fit is refused field by field before anything is sent.
      await page.getByLabel("Temperature").fill("25 kg");
      await page.getByRole("button", { name: "Save and analyse" }).click();
      expect(await page.locator("#op-temperature-error").textContent()).toMatch(/temperature/i);
      await page.getByLabel("Temperature").fill("25 degC");
      await page.getByLabel("Name", { exact: true }).fill("nominal 10 uL/min");
      await snap(page, "chips-operating-point");
      await page.getByRole("button", { name: "Save and analyse" }).click();
      await page.waitForURL(/\/revisions\/1\/analyses\/\d+$/);
      await page.getByTestId("chip-drawing").waitFor();
      await page.waitForTimeout(500);
      await snap(page, "chips-result");

      // A changed revision: the depth is remembered from revision 1.
      await page.goto(`${chipUrl}/upload`);
      await page.getByTestId("file-input").setInputFiles(fixture("tee-mm-r2000.dxf"));
      await page.getByLabel("What changed and why").fill("Redrawn in millimetres with longer arms.");
      await page.getByRole("button", { name: "Upload revision" }).click();
      await page.waitForURL(/\/revisions\/2\/layers$/);
      await mapTeeLayers(page, true);
      await page.getByRole("button", { name: "Save layer mapping" }).click();
      await page.waitForURL(/\/revisions\/2\?mapped=1$/);

      // The history shows both revisions, newest first, with their notes.
      await page.goto(chipUrl);
      const entries = page.getByTestId("revision-entry");
      expect(await entries.evaluateAll((els) => els.map((e) => e.getAttribute("data-revision")))).toEqual(["2", "1"]);
      expect(await page.getByTestId("revision-note").allTextContents()).toEqual(["Redrawn in millimetres with longer arms.", "First layout: a symmetric tee."]);
      expect(await page.getByTestId("analysis-link").count()).toBe(1);
      await snap(page, "chips-history");

      // The same file again: "already revision 1", with a link to it.
      await page.goto(`${chipUrl}/upload`);
      await page.getByTestId("recent-revisions").waitFor();
      await page.getByTestId("file-input").setInputFiles(fixture("tee-um-r2000.dxf"));
      await page.getByRole("button", { name: "Upload revision" }).click();
      const problem = page.getByTestId("upload-problem");
      await problem.getByText("Already revision 1", { exact: true }).waitFor();
      expect(await problem.getByText("already revision 1 of").count()).toBe(1);
      expect(await problem.getByRole("link", { name: "Open revision 1" }).getAttribute("href")).toBe(`${chipUrl}/revisions/1`);
      await snap(page, "chips-duplicate");
    } finally {
      await close();
    }
  });

  it("a lead sees the chips and their analyses but no upload or edit control", async () => {
    const { page, close } = await page1440();
    try {
      await signIn(page, "lead@brookmere.test");
      await page.goto("/w/brookmere/chips");
      expect(await page.getByTestId("chip-row").count()).toBeGreaterThanOrEqual(3);
      expect(await page.getByRole("button", { name: "New chip" }).count()).toBe(0);
      await page.getByRole("link", { name: "Serpentine mixer SM-2" }).click();
      await page.getByTestId("revision-timeline").waitFor();
      expect(await page.getByRole("link", { name: "Upload a revision" }).count()).toBe(0);
      const chipUrl = new URL(page.url()).pathname;
      await page.goto(`${chipUrl}/revisions/2`);
      expect(await page.getByTestId("operating-point-form").count()).toBe(0);
      expect(await page.getByText("Device designers add operating points").count()).toBe(1);
      // Opening the upload address directly is refused by the server.
      await page.goto(`${chipUrl}/upload`);
      await page.getByRole("heading", { name: "You can’t open this page" }).waitFor();
      expect(await page.getByTestId("drop-zone").count()).toBe(0);
    } finally {
      await close();
    }
  });

  it("settings: everyone reads the sources; a fluidics reviewer can override a threshold", async () => {
    const { page, close } = await page1440();
    try {
      await signIn(page, "reviewer@brookmere.test");
      await page.goto("/w/brookmere/settings");
      expect(await page.getByTestId("preset-fluids").getByText("IAPWS", { exact: false }).count()).toBeGreaterThan(0);
      expect(await page.getByTestId("workspace-fluids").getByText("Carrier oil + 2 % surfactant (lab batch)").count()).toBe(1);
      // Reviewers edit thresholds but not process limits.
      expect(await page.getByText("Set your fab’s limits").count()).toBe(0);
      const row = page.locator('[data-rule="re_inertial"]');
      await row.getByLabel(/Workspace threshold for/).fill("2");
      await row.getByLabel(/Why, for/).fill("");
      await row.getByRole("button", { name: "Save" }).click();
      await row.getByText("Say why the threshold differs").waitFor();
      await row.getByLabel(/Why, for/).fill("Our bends are gentle; inertia matters above Re 2 in our bench data.");
      await row.getByRole("button", { name: "Save" }).click();
      await row.getByText("now uses 2").waitFor();
      // Saved: after a reload the override shows as the current value.
      await page.reload();
      expect(await page.locator('[data-rule="re_inertial"]').getByLabel(/Workspace threshold for/).inputValue()).toBe("2");
      await snap(page, "settings");
    } finally {
      await close();
    }
  });
});
