/**
 * Time to interactive of the analysis view's chip drawing for a 10,000-segment
 * chip in headless Chromium: bundle AnalysisWorkbench with esbuild, compile the
 * app's Tailwind CSS, load the page with a solved grid network, and time from
 * navigation to the first click on a channel answering with a highlight.
 * Printed, never asserted. Export: run().
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { loadavg, tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { ChannelNetwork, NetworkNode, NetworkSegment } from "../lib/network/types";
import { solveHydraulics } from "../lib/hydraulics/solve-hydraulics";
import { toAnalyzeJson, type AnalyzeJson } from "../lib/analysis/serialize";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

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

/**
 * A cols×rows ladder grid of 50 µm × 20 µm rectangular channels at 200 µm
 * pitch: (cols−1)·rows + cols·(rows−1) segments, inlet at one corner, outlet at
 * the opposite. Invented geometry for timing only.
 */
export function gridNetwork(cols: number, rows: number): ChannelNetwork {
  const pitchM = 200e-6;
  const nodes: NetworkNode[] = [];
  const segments: NetworkSegment[] = [];
  const id = (c: number, r: number) => `n${r * cols + c}`;
  for (let r = 0; r < rows; r++)
    for (let c = 0; c < cols; c++) {
      const port = c === 0 && r === 0 ? "IN" : c === cols - 1 && r === rows - 1 ? "OUT" : null;
      nodes.push({ id: id(c, r), xM: c * pitchM, yM: r * pitchM, kind: port ? "port" : "junction", port });
    }
  const add = (a: [number, number], b: [number, number]) => {
    const n = segments.length;
    segments.push({
      id: `s${n + 1}`,
      layer: "FLOW",
      from: id(a[0], a[1]),
      to: id(b[0], b[1]),
      lengthM: pitchM,
      widthM: 50e-6,
      endWidthM: 50e-6,
      depthM: 20e-6,
      section: "rectangular",
      minBendRadiusM: null,
      path: [
        [a[0] * pitchM, a[1] * pitchM],
        [b[0] * pitchM, b[1] * pitchM],
      ],
    });
  };
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols - 1; c++) add([c, r], [c + 1, r]);
  for (let r = 0; r < rows - 1; r++) for (let c = 0; c < cols; c++) add([c, r], [c, r + 1]);
  const max = [(cols - 1) * pitchM, (rows - 1) * pitchM];
  return {
    units: { drawing: "um", source: "conditions", metresPerUnit: 1e-6 },
    nodes,
    segments,
    ports: [
      { name: "IN", node: id(0, 0), xM: 0, yM: 0, radiusM: 150e-6 },
      { name: "OUT", node: id(cols - 1, rows - 1), xM: max[0], yM: max[1], radiusM: 150e-6 },
    ],
    warnings: [],
    layers: [{ name: "FLOW", role: "channel", entities: segments.length, byType: { LINE: segments.length } }],
    outline: [],
    bounds: { minXM: -300e-6, minYM: -300e-6, maxXM: max[0] + 300e-6, maxYM: max[1] + 300e-6 },
    mappingProposed: false,
  };
}

/** Solve a network with water and one flow-driven inlet and serialise it like the app does. */
export function solvedDocument(network: ChannelNetwork, inlet = "IN", flow = "10 uL/min"): AnalyzeJson {
  const hydraulics = solveHydraulics(network, { ports: { [inlet]: { flow } } });
  return toAnalyzeJson(network, hydraulics, []);
}

/**
 * Bundle a page rendering AnalysisWorkbench with `window.__PROPS__` (esbuild,
 * React from the repo's node_modules) and compile the app's Tailwind CSS.
 * Returns the page's HTML (script and style inline) for page.setContent.
 */
export async function buildWorkbenchPage(part: "workbench" | "drawing" = "workbench"): Promise<string> {
  const { build } = await import("esbuild");
  const dir = mkdtempSync(path.join(tmpdir(), "stokeline-view-"));
  try {
    const entry = path.join(dir, "entry.tsx");
    const comp = (f: string) => JSON.stringify(path.join(ROOT, "components/analysis", f));
    writeFileSync(
      entry,
      part === "workbench"
        ? `import { createRoot } from "react-dom/client";
import { AnalysisWorkbench } from ${comp("index.ts")};
performance.mark("bundle-start");
const props = JSON.parse(document.getElementById("props")!.textContent!) as Parameters<typeof AnalysisWorkbench>[0];
createRoot(document.getElementById("root")!).render(<AnalysisWorkbench {...props} />);
`
        : // The drawing alone, coloured by pressure as the workbench first shows it.
          `import { createRoot } from "react-dom/client";
import { useState } from "react";
import { ChipDrawing } from ${comp("chip-drawing.tsx")};
import { createColourScale } from ${JSON.stringify(path.join(ROOT, "lib/analysis/colour-scales.ts"))};
performance.mark("bundle-start");
const props = JSON.parse(document.getElementById("props")!.textContent!);
const a = props.analysis;
const p = new Map(a.nodes.map((n: { id: string; pressure_Pa?: number }) => [n.id, n.pressure_Pa ?? 0]));
const v = new Map(a.segments.map((s: { id: string; from: string; to: string }) => [s.id, ((p.get(s.from) as number) + (p.get(s.to) as number)) / 2]));
const scale = createColourScale(v.values());
function Only() {
  const [sel, setSel] = useState<string | null>(null);
  return <ChipDrawing analysis={a} colourOf={(id) => scale.colour(v.get(id) as number)} colourKey="p" selectedId={sel} onSelect={setSel} markers={[]} describe={(id) => id} label="drawing" />;
}
createRoot(document.getElementById("root")!).render(<Only />);
`,
    );
    const out = await build({
      entryPoints: [entry],
      bundle: true,
      write: false,
      format: "iife",
      jsx: "automatic",
      minify: process.env.BENCH_NO_MINIFY !== "1",
      target: "es2022",
      nodePaths: [path.join(ROOT, "node_modules")],
      tsconfig: path.join(ROOT, "tsconfig.json"),
      define: { "process.env.NODE_ENV": '"production"' },
      logLevel: "error",
    });
    const js = out.outputFiles[0].text;
    const css = await compileCss();
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><style>${css}</style></head><body class="p-4"><div id="root"></div><script type="application/json" id="props">/*PROPS*/</script><script>${js.replace(/<\/script/g, "<\\/script")}</script></body></html>`;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

async function compileCss(): Promise<string> {
  const postcss = (await import("postcss")).default;
  const tailwind = (await import("@tailwindcss/postcss")).default;
  const from = path.join(ROOT, "app/globals.css");
  const result = await postcss([tailwind({ base: ROOT })]).process(readFileSync(from, "utf8"), { from });
  return result.css;
}

/** Put the props into the page built by buildWorkbenchPage (as JSON, the way a server page embeds its payload). */
export function withProps(html: string, props: unknown): string {
  return html.replace("/*PROPS*/", () => JSON.stringify(props).replace(/</g, "\\u003c"));
}

/** Serve one HTML page on 127.0.0.1 (a free port); returns its URL and a closer. */
export async function servePage(html: string): Promise<{ url: string; close: () => Promise<void> }> {
  const { createServer } = await import("node:http");
  const server = createServer((_req, res) => {
    res.writeHead(200, { "content-type": "text/html; charset=utf-8" });
    res.end(html);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const address = server.address() as { port: number };
  return { url: `http://127.0.0.1:${address.port}/`, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

export async function run(): Promise<void> {
  const cols = 72;
  const rows = 72;
  let t = performance.now();
  const network = gridNetwork(cols, rows);
  const doc = solvedDocument(network);
  console.log(`grid ${cols}×${rows}: ${doc.segments.length} segments, solved and serialised in ${(performance.now() - t).toFixed(0)} ms`);
  for (const part of ["drawing", "workbench"] as const) {
    t = performance.now();
    const html = withProps(await buildWorkbenchPage(part), { analysis: doc, labels: { chip: "Bench grid", revision: "r1" } });
    console.log(`${part}: page bundled with CSS in ${(performance.now() - t).toFixed(0)} ms (${(html.length / 1e6).toFixed(1)} MB with data)`);
    await timePage(html, part, doc.segments.length);
  }
}

async function timePage(html: string, part: string, segments: number): Promise<void> {
  const { chromium } = await import("playwright-core");
  const served = await servePage(html);
  const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: CHROMIUM_ARGS });
  try {
    const figures: number[] = [];
    for (let i = 0; i < 3; i++) {
      const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
      const t0 = performance.now();
      await page.goto(served.url, { waitUntil: "commit" });
      const host = page.locator('[data-testid="chip-drawing"]');
      await host.waitFor();
      const mode = await host.getAttribute("data-render-mode");
      const box = (await host.boundingBox())!;
      // The first click on a channel that answers with the highlight marks "interactive".
      await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
      await page.locator('[data-testid="selected-highlight"]').waitFor({ state: "attached", timeout: 20000 });
      const tti = performance.now() - t0;
      // Page-side figures from the navigation's own clock (a string: tsx would wrap a function with helpers the page lacks).
      const marks = (await page.evaluate(`(() => {
        const nav = performance.getEntriesByType("navigation")[0];
        return { response: nav.responseEnd, bundleStart: performance.getEntriesByName("bundle-start")[0].startTime, now: performance.now() };
      })()`)) as { response: number; bundleStart: number; now: number };
      figures.push(marks.now);
      console.log(
        `  run ${i + 1}: ${mode} mode, interactive ${marks.now.toFixed(0)} ms after navigation start ` +
          `(HTML received ${marks.response.toFixed(0)} ms, app script started ${marks.bundleStart.toFixed(0)} ms; ` +
          `harness round trip ${tti.toFixed(0)} ms)`,
      );
      await page.close();
    }
    figures.sort((a, b) => a - b);
    console.log(
      `  ${part}: median time to interactive for ${segments} segments ${figures[1].toFixed(0)} ms ` +
        `(goal: under 1000 ms on this machine; 1-minute load average ${loadavg()[0].toFixed(1)} on ${(await import("node:os")).cpus().length} cores)`,
    );
  } finally {
    await browser.close();
    await served.close();
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  await run();
}
