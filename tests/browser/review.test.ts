// The whole review path in Chromium with the demo users (issue 7, "Done when"): the designer
// submits, the fluidics reviewer waives one flag and marks another must-fix, the designer puts
// a fixed analysis under review, the review passes, the fab liaison clears with password
// re-entry; the e-mails appear in the outbox; the cleared revision refuses edits.
// Data is built through the REST API with the signed-in session (no dependency on the demo seed's chips).
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { DEMO_PASSWORD, launch, Sessions, snap } from "./support";
import { TEE_LAYERS as LAYERS, teeForm as form, BOND_FLAG as BOND, PUMP_FLAG as PUMP } from "@/tests/support/tee-fixture";

let browser: Browser;
const sessions = new Sessions(() => browser);

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await sessions.closeAll();
  await browser?.close();
});



async function statusOf(page: Page): Promise<string | null> {
  return page.getByTestId("review-status").first().getAttribute("data-status");
}

async function waitForStatus(page: Page, status: string): Promise<void> {
  await page.waitForSelector(`[data-testid="review-status"][data-status="${status}"]`, { timeout: 20000 });
}

describe("review and sign-off, end to end", () => {
  it("runs designer → fluidics reviewer → designer's fix → pass → fab clearance, with mail and a frozen revision", async () => {
    // Designer: a chip, its revision, the layer map and a hard-driven operating point, through the API.
    const designer = await sessions.signedIn("designer@brookmere.test");
    const me = await (await designer.request.get("/api/v1/me")).json();
    const workspaceId = me.workspaces.find((w: { slug: string }) => w.slug === "brookmere").id;
    const chipRes = await designer.request.post(`/api/v1/workspaces/${workspaceId}/chips`, { data: { name: `Brookmere tee BT-${Date.now() % 100000}`, purpose: "Splitter for the review walk-through" } });
    expect(chipRes.status()).toBe(201);
    const chipId = (await chipRes.json()).chip.id as number;
    const bytes = readFileSync(path.resolve(__dirname, "../fixtures/layouts/tee-um-r2000.dxf"));
    const up = await designer.request.post(`/api/v1/chips/${chipId}/revisions`, {
      multipart: { file: { name: "tee-um-r2000.dxf", mimeType: "application/dxf", buffer: bytes }, note: "First cut" },
    });
    expect(up.status()).toBe(201);
    const revisionId = (await up.json()).revision.id as number;
    const rev = `/api/v1/chips/${chipId}/revisions/1`;
    expect((await designer.request.put(`${rev}/layer-map`, { data: { layers: LAYERS } })).status()).toBe(201);
    expect((await designer.request.post(`${rev}/operating-points`, { data: form("hard drive", "2000 uL/min") })).status()).toBe(201);
    const reviewUrl = `/w/brookmere/chips/${chipId}/revisions/1/review`;

    // 1. The designer submits with a note.
    await designer.goto(reviewUrl);
    expect(await statusOf(designer)).toBe("draft");
    await designer.getByTestId("chip-drawing").waitFor();
    await snap(designer, "review-draft-1440");
    const steps = designer.getByTestId("review-steps");
    await steps.getByLabel("What changed and why").fill("First cut of the splitter, driven hard to find the limits.");
    await steps.getByRole("button", { name: "Submit for review" }).click();
    await waitForStatus(designer, "with_fluidics");

    // 2. The fluidics reviewer finds it in the queue, waives the pump flag and marks the bond flag must-fix.
    const reviewer = await sessions.signedIn("reviewer@brookmere.test");
    await reviewer.goto("/w/brookmere/review");
    const row = reviewer.getByTestId("queue-fluidics").getByRole("link", { name: /revision 1/ }).last();
    await snap(reviewer, "review-queue-1440");
    await row.click();
    await reviewer.waitForURL(new RegExp(`${reviewUrl}$`));
    const pump = reviewer.locator(`li[data-flag-key="${PUMP}"]`);
    await pump.getByRole("radio", { name: /Waive/ }).check();
    await pump.getByRole("textbox", { name: "Justification" }).fill("The bench uses a 4 bar pressure controller for this run; the 2 bar pump limit does not apply.");
    await pump.getByRole("button", { name: "Record decision" }).click();
    await reviewer.waitForSelector(`li[data-flag-key="${PUMP}"][data-flag-status="waived"]`, { timeout: 20000 });
    const bond = reviewer.locator(`li[data-flag-key="${BOND}"]`);
    await bond.getByRole("radio", { name: "Must fix" }).check();
    await bond.getByRole("textbox", { name: "Justification" }).fill("Inlet pressure is above what the plasma bond holds; lower the flow.");
    await bond.getByRole("button", { name: "Record decision" }).click();
    await reviewer.waitForSelector(`li[data-flag-key="${BOND}"][data-flag-status="must_fix"]`, { timeout: 20000 });
    // A comment mentioning the designer, pinned to a segment picked on the drawing's flag list.
    await reviewer.getByPlaceholder(/Write a comment/).fill("@Tobiah Quill the inlet branch sees the full pressure; see the bond flag.");
    await reviewer.getByRole("button", { name: "Post comment" }).click();
    await reviewer.getByTestId("review-comment").first().waitFor({ timeout: 20000 });
    // Passing now is refused in plain words.
    await reviewer.getByTestId("review-steps").getByRole("button", { name: "Pass fluidics review" }).click();
    await reviewer.getByText(/cannot pass yet/).waitFor({ timeout: 20000 });
    await snap(reviewer, "review-screen-1440");

    // 3. The designer adds a fixed operating point and puts it under review.
    expect((await designer.request.post(`${rev}/operating-points`, { data: form("gentle", "200 uL/min") })).status()).toBe(201);
    await designer.goto(reviewUrl);
    await designer.getByTestId("review-steps").getByLabel("What you fixed").fill("Flow lowered to 200 µL/min.");
    await designer.getByTestId("review-steps").getByRole("button", { name: "Put under review" }).click();
    await designer.getByText("The newer analysis is now under review").waitFor({ timeout: 20000 });

    // 4. The reviewer sees both flags fixed and passes the fluidics review.
    await reviewer.goto(reviewUrl);
    await reviewer.waitForSelector(`li[data-flag-key="${BOND}"][data-flag-status="fixed"]`, { timeout: 20000 });
    await reviewer.getByTestId("review-steps").getByRole("button", { name: "Pass fluidics review" }).click();
    await waitForStatus(reviewer, "with_fab");

    // 5. The fab liaison clears it, first with a wrong password (refused), then signing correctly.
    const fab = await sessions.signedIn("fab@brookmere.test");
    await fab.goto("/w/brookmere/review");
    await fab.getByTestId("queue-fab").getByRole("link", { name: /revision 1/ }).last().click();
    await fab.waitForURL(new RegExp(`${reviewUrl}$`));
    const clear = fab.getByTestId("review-steps");
    await clear.getByRole("textbox", { name: /^Fab/ }).fill("Kestrel Foundry (invented)");
    await clear.getByLabel("Process").fill("PDMS soft lithography");
    await clear.getByLabel("Your password (signature)").fill("not-the-password");
    await clear.getByRole("button", { name: "Clear and sign" }).click();
    await fab.getByText(/re-enter your password correctly/).waitFor({ timeout: 20000 });
    expect(await statusOf(fab)).toBe("with_fab");
    await clear.getByRole("textbox", { name: /^Fab/ }).fill("Kestrel Foundry (invented)");
    await clear.getByLabel("Process").fill("PDMS soft lithography");
    await clear.getByLabel("Your password (signature)").fill(DEMO_PASSWORD);
    await clear.getByRole("button", { name: "Clear and sign" }).click();
    await waitForStatus(fab, "cleared");
    await fab.getByText(/Cleared for tape-out — this revision is frozen/).waitFor();
    await snap(fab, "review-cleared-1440");

    // 6. The cleared revision refuses edits (409 through the chips API).
    const frozen = await designer.request.post(`${rev}/operating-points`, { data: form("after clearance", "10 uL/min") });
    expect(frozen.status()).toBe(409);
    expect((await frozen.json()).error.code).toBe("revision_frozen");

    // 7. History: every step recorded, exportable as CSV.
    await fab.goto(`/w/brookmere/chips/${chipId}/revisions/1/history`);
    const actions = await fab.getByTestId("history-row").evaluateAll((rows) => rows.map((r) => r.getAttribute("data-action")));
    expect(actions.filter((a) => a?.startsWith("review."))).toEqual([
      "review.submitted",
      "review.flag_waived",
      "review.flag_must_fix",
      "review.commented",
      "review.analysis_updated",
      "review.fluidics_passed",
      "review.signature_failed",
      "review.cleared",
    ]);
    await snap(fab, "review-history-1440");
    const csv = await fab.request.get(`/api/v1/revisions/${revisionId}/audit?format=csv`);
    expect(csv.headers()["content-type"]).toMatch(/^text\/csv/);
    expect(await csv.text()).toContain("review.cleared");

    // 8. The e-mails, in the admin's outbox: review requested (fluidics, then fab), mentioned, cleared (designer and lead).
    const admin = await sessions.signedIn("admin@brookmere.test");
    await admin.goto("/w/brookmere/admin/outbox");
    const outbox = await admin.locator("main").innerText();
    const chipName = (await (await designer.request.get(`/api/v1/chips/${chipId}`)).json()).chip.name as string;
    expect(outbox).toContain(`Review requested: ${chipName} revision 1`);
    expect(outbox).toContain(`You were mentioned on ${chipName} revision 1`);
    expect(outbox).toContain(`Cleared for tape-out: ${chipName} revision 1`);
    expect(outbox).toContain("lead@brookmere.test");

    // 9. The designer's inbox shows the same events.
    await designer.goto("/w/brookmere/inbox");
    const kinds = await designer.getByTestId("inbox-item").evaluateAll((items) => items.map((i) => i.getAttribute("data-kind")));
    expect(kinds).toEqual(expect.arrayContaining(["mentioned", "cleared"]));
    await snap(designer, "inbox-1440");
  });
});
