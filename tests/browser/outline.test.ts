// Outline layouts in the app (issue 9): a layout whose channel layer is drawn as filled mask
// shapes (a Shapely buffer of the serpentine fixture, tests/fixtures/outlines/generate.py) is
// uploaded, mapped and analysed like a centreline layout, and the analysis view draws the mask
// with the extracted centrelines over it, which the designer can hide and show again.
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launch, Sessions, snap } from "./support";

let browser: Browser;
const sessions = new Sessions(() => browser);
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await sessions.closeAll();
  await browser?.close();
});


describe("an outline layout end to end", () => {
  it("uploads, maps and analyses a mask-drawn serpentine; the drawing shows the mask and the centrelines", async () => {
    const page = await sessions.signedIn("designer@brookmere.test");
    const me = await (await page.request.get("/api/v1/me")).json();
    const workspaceId = me.workspaces.find((w: { slug: string }) => w.slug === "brookmere").id;
    const chipRes = await page.request.post(`/api/v1/workspaces/${workspaceId}/chips`, { data: { name: `Mask serpentine MS-${Date.now() % 100000}`, purpose: "Serpentine drawn as a filled mask" } });
    expect(chipRes.status()).toBe(201);
    const chipId = (await chipRes.json()).chip.id as number;
    const bytes = readFileSync(path.resolve(__dirname, "../fixtures/outlines/serpentine-r12-outline.dxf"));
    const up = await page.request.post(`/api/v1/chips/${chipId}/revisions`, { multipart: { file: { name: "serpentine-outline.dxf", mimeType: "application/dxf", buffer: bytes } } });
    expect(up.status()).toBe(201);
    // The survey reports the channel layer as drawn in outline style.
    const survey = (await up.json()).survey as { layers: { name: string; style?: string }[] };
    expect(survey.layers.find((l) => l.name === "FLOW")).toBeTruthy();
    const rev = `/api/v1/chips/${chipId}/revisions/1`;
    const layers = { FLOW: { role: "channel", depth: "50 um" }, PORTS: { role: "port" }, DIE: { role: "outline" }, TEXT: { role: "ignore" } };
    expect((await page.request.put(`${rev}/layer-map`, { data: { layers } })).status()).toBe(201);
    const op = await page.request.post(`${rev}/operating-points`, {
      data: {
        name: "nominal",
        fluid: "preset:water",
        temperature: "25 degC",
        process: "pdms_soft_lithography",
        ports: [
          { name: "IN", drive: "flow", value: "10 uL/min" },
          { name: "OUT", drive: "pressure", value: "0 mbar" },
        ],
      },
    });
    expect(op.status()).toBe(201);
    const { analysis_id: analysisId, status } = await op.json();
    expect(status).toBe("ok");

    // The stored result says which style was read and carries the mask rings.
    const stored = await (await page.request.get(`/api/v1/analyses/${analysisId}`)).json();
    expect(stored.result.layers.find((l: { name: string }) => l.name === "FLOW").style).toBe("outline");
    expect(stored.result.mask_m.length).toBe(1);
    expect(stored.result.warnings.some((w: { code: string }) => w.code === "outline_read")).toBe(true);

    await page.goto(`/w/brookmere/chips/${chipId}/revisions/1/analyses/${analysisId}`);
    const overlay = page.getByTestId("mask-overlay");
    await overlay.waitFor();
    // One white centreline per extracted segment over the dashed mask edge.
    expect(await overlay.locator("path").count()).toBe(1 + stored.result.segments.length);
    await snap(page, "outline-analysis-1440");
    await page.getByRole("button", { name: "Hide the mask outline and extracted centrelines" }).click();
    expect(await page.getByTestId("mask-overlay").count()).toBe(0);
    await page.getByRole("button", { name: "Show the mask outline and extracted centrelines" }).click();
    await page.getByTestId("mask-overlay").waitFor();
  });
});
