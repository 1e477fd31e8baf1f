// The brief's content model (lib/reports/brief.ts) and its PDF (lib/reports/pdf.ts). The
// analysis documents come from the real pipeline on committed layout fixtures. Worked values:
// straight-r2000 at 10 µL/min needs 1868.14 Pa at IN (tests/lib/analysis/analyze.test.ts, from
// REFERENCES §1 and §3). Viridis end colours #440154 and #fde725 are matplotlib's published
// viridis table endpoints (van der Walt & Smith 2015). PDF text is read back with pdfjs-dist.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { analyzeLayout } from "@/lib/analysis/analyze";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { buildBrief, formatUtc, type BriefInput } from "@/lib/reports/brief";
import { pdfSafeText, renderBriefPdf } from "@/lib/reports/pdf";
import { looksLikePdf, pdfText } from "./pdf-text";

const dir = new URL("../../fixtures/layouts/", import.meta.url);
const dxf = (name: string) => readFileSync(fileURLToPath(new URL(name, dir)), "utf8");
const LAYERS = { DIE: { role: "outline" }, FLOW: { depth: "50 um", role: "channel", width: "100 um" }, PORTS: { role: "port" }, TEXT: { role: "ignore" } };
const water = { preset: "water", temperature: "25 degC" };
const SHA = "0f".repeat(32);
const NOW = new Date("2026-12-01T21:07:30Z");
const AT = new Date("2026-11-30T10:00:00Z");

function input(over: Partial<BriefInput> = {}, conditions: Record<string, unknown> = { pump: { max_pressure: "10 mbar" }, process: "pdms_soft_lithography" }): BriefInput {
  const doc = analyzeLayout(dxf("straight-r2000.dxf"), { layers: LAYERS, fluid: water, ports: { IN: { flow: "10 uL/min" }, OUT: { pressure: "0 Pa" } }, ...conditions });
  return {
    workspaceName: "Brookmere Biofluidics",
    chip: { id: 1, name: "Straight test chip", purpose: "A single channel." },
    revision: { id: 1, number: 3, fileName: "straight.dxf", sha256: SHA, uploadedAt: AT, uploaderName: "Tobiah Quill", note: "", reviewState: "with_fluidics", reviewStateSince: AT },
    analysis: { id: 7, operatingPointName: "nominal", createdAt: AT, underReview: true, conditions, doc },
    dispositions: [],
    clearance: null,
    history: [
      { at: AT, actor: "Tobiah Quill", action: "revision.uploaded", details: { fileName: "straight.dxf", sha256: SHA } },
      { at: AT, actor: null, action: "report.share_viewed", details: {} },
    ],
    ...over,
  };
}

describe("buildBrief", () => {
  it("holds the required pressure against the pump limit: 1868 Pa against 10 mbar is over", () => {
    const brief = buildBrief(input(), NOW);
    const p = brief.figures.find((f) => f.label === "Required inlet pressure")!;
    expect(p.value).toBe("18.7 mbar"); // 1868.14 Pa = 18.68 mbar
    expect(p.status).toBe("over");
    expect(p.limit).toContain("pump 10.0 mbar (187 %)");
    expect(brief.figures.find((f) => f.label === "Throughput")!.value).toBe("10.0 µL/min");
  });

  it("marks a figure near its limit above 80 % and ok below (common practice margin)", () => {
    expect(buildBrief(input({}, { pump: { max_pressure: "20 mbar" } }), NOW).figures[0].status).toBe("near"); // 18.7 / 20 = 93 %
    expect(buildBrief(input({}, { pump: { max_pressure: "100 mbar" } }), NOW).figures[0].status).toBe("ok");
    expect(buildBrief(input({}, {}), NOW).figures[0].status).toBe("none");
  });

  it("colours the drawing by mean pressure on viridis: the inlet branch darkest-to-lightest ends at the ramp's ends", () => {
    const conditions = { ports: { A: { flow: "100 uL/min" }, B: { pressure: "0 Pa" }, C: { pressure: "0 Pa" } } };
    const doc = analyzeLayout(dxf("tee-um-r2000.dxf"), { layers: LAYERS, fluid: water, ...conditions });
    const brief = buildBrief(input({ analysis: { id: 8, operatingPointName: "tee", createdAt: AT, underReview: false, conditions, doc } }), NOW);
    const d = brief.drawing!;
    expect(d.segments).toHaveLength(doc.segments.length);
    const colours = d.segments.map((s) => s.colour);
    expect(colours).toContain("#fde725"); // highest mean pressure: the inlet arm
    expect(colours).toContain("#440154"); // lowest
    // Drawing units are µm with y flipped (components/analysis/drawing-geometry.ts): x = x_m·1e6, y = −y_m·1e6.
    expect(d.segments[0].points[0]).toEqual([doc.segments[0].path_m[0][0] * 1e6, -doc.segments[0].path_m[0][1] * 1e6]);
    expect(d.segments[0].widthUm).toBeCloseTo(100, 9);
    expect(d.legend.ticks.length).toBeGreaterThan(1);
    expect(d.legend.noData).toBe(false);
    expect(brief.analysis?.basis).toMatch(/not yet submitted/);
  });

  it("carries the cautions, the SHA-256 and the generation time (UTC) for every page, and leaves sharing events out of the history", () => {
    const brief = buildBrief(input(), NOW);
    expect(brief.cautions).toEqual(MODEL_CAUTIONS);
    expect(brief.footer).toContain(SHA);
    expect(brief.footer).toContain("generated 2026-12-01 21:07 UTC");
    expect(formatUtc(NOW)).toBe("2026-12-01 21:07 UTC");
    expect(brief.history.map((h) => h.text)).toEqual([`Uploaded straight.dxf (SHA-256 ${SHA.slice(0, 12)}…).`]);
  });

  it("lists flags with their dispositions and waiver justifications, blocking first; clearance shows whether its digest matches", () => {
    const base = buildBrief(input(), NOW);
    expect(base.flags.find((f) => f.severity === "block")?.standingLabel).toBe("Open — needs a waiver or a fix");
    const doc = input().analysis!.doc;
    const pumpFlag = doc.flags.find((f) => f.code === "pump_pressure_max")!;
    const key = `${pumpFlag.code}|${pumpFlag.target.kind}|${pumpFlag.target.id ?? "*"}`;
    const justification = "Bench runs use a 1 bar controller for this chip, not the syringe pump.";
    const brief = buildBrief(
      input({
        dispositions: [{ flagKey: key, decision: "waived", justification, value: pumpFlag.value, analysisId: 7, at: AT, byName: "Ilse Varga" }],
        clearance: { byName: "Dario Penwright", at: AT, fabName: "Kestrel Foundry (invented)", process: "PDMS", fileSha256: "1".repeat(64), analysisId: 7 },
      }),
      NOW,
    );
    const waived = brief.flags.find((f) => f.standing === "waived")!;
    expect(waived).toMatchObject({ justification, decidedBy: "Ilse Varga", decidedAt: "2026-11-30 10:00 UTC", standingLabel: "Accepted with a waiver" });
    const rank: Record<string, number> = { block: 0, warn: 1, info: 2, none: 3 };
    const ranks = brief.flags.map((f) => rank[f.severity]);
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
    expect(brief.clearance?.matchesRevision).toBe(false);
  });

  it("says so plainly when no analysis succeeded", () => {
    const brief = buildBrief(input({ analysis: null }), NOW);
    expect(brief.figures).toHaveLength(1);
    expect(brief.figures[0].note).toMatch(/No successful analysis/);
    expect(brief.drawing).toBeNull();
    expect(brief.flags).toEqual([]);
  });
});

describe("renderBriefPdf", () => {
  it("writes a PDF whose every page carries the SHA-256 and generation time, with the cautions in full", async () => {
    const brief = buildBrief(input(), NOW);
    const bytes = await renderBriefPdf(brief);
    expect(looksLikePdf(bytes)).toBe(true);
    const { pages, all } = await pdfText(bytes);
    for (const p of pages) {
      const flat = p.replace(/\s+/g, " ");
      expect(flat).toContain(SHA);
      expect(flat).toContain("generated 2026-12-01 21:07 UTC");
    }
    const flat = all.replace(/\s+/g, " ");
    for (const c of MODEL_CAUTIONS) expect(flat).toContain(c);
    expect(flat).toContain("Read before relying on these figures");
    expect(flat).toContain("Straight test chip");
    expect(flat).toContain("18.7 mbar");
  });

  it("spells symbols the embedded Latin fonts lack, and keeps those they have", () => {
    expect(pdfSafeText("Re ≈ 2 → turbulent, Δp ≤ 5 kPa")).toBe("Re ~ 2 -> turbulent, delta p <= 5 kPa");
    expect(pdfSafeText("12 µL/min · 3 mm² — “ok”")).toBe("12 µL/min · 3 mm² — “ok”");
    expect(pdfSafeText("漢")).toBe("?");
  });
});
