/**
 * Robustness on files nobody here wrote: every DXF in ../shared/dxf-corpus
 * (CAD exports of several versions from dxf-parser's public test data; not chip
 * layouts) is answered with a result or a clear LayoutError, its layers listed,
 * never a crash.
 */
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { DomainError, LayoutError } from "@/lib/errors";
import { extractNetwork } from "@/lib/network/extract";
import { surveyLayout } from "@/lib/network/survey";
import type { LayerSummary } from "@/lib/network/types";

const corpus = fileURLToPath(new URL("../../../../shared/dxf-corpus/", import.meta.url));
const files = existsSync(corpus) ? readdirSync(corpus).filter((f) => f.toLowerCase().endsWith(".dxf")).sort() : [];
if (files.length === 0) console.log(`DXF corpus not found at ${corpus}; the corpus cases are not generated.`);

/** Run fn; a result or a DomainError is an answer, anything else fails the test. */
function answer<T>(fn: () => T): { ok: true; value: T } | { ok: false; error: DomainError } {
  try {
    return { ok: true, value: fn() };
  } catch (e) {
    expect(e).toBeInstanceOf(DomainError);
    return { ok: false, error: e as DomainError };
  }
}

describe("DXF corpus", () => {
  it("the reader's own fixture answers the same way (always runs)", () => {
    const s = surveyLayout(readFileSync(new URL("../../fixtures/layouts/cross-r2000.dxf", import.meta.url)));
    expect(s.layers.map((l) => l.name)).toEqual(["CTRL", "FLOW", "PORTS", "TEXT"]);
    expect(s.layers.find((l) => l.name === "PORTS")!.proposedRole).toBe("port");
  });

  for (const file of files) {
    it(`${file}: survey lists layers; extraction answers with a network or a LayoutError`, () => {
      const bytes = readFileSync(corpus + file);
      const survey = answer(() => surveyLayout(bytes));
      if (!survey.ok) {
        // Only a file that cannot be read at all may fail the survey.
        expect(survey.error).toBeInstanceOf(LayoutError);
        expect(survey.error.message.length).toBeGreaterThan(20);
        return;
      }
      const layers = survey.value.layers;
      for (const l of layers) {
        expect(l.entities).toBe(Object.values(l.byType).reduce((a, b) => a + b, 0));
        expect(l.proposedRole).toBeDefined();
      }
      // 1) As uploaded (no conditions), 2) with units, 3) with every layer mapped by its proposed role and sizes given.
      const sized = Object.fromEntries(
        layers.map((l) => [l.name, l.proposedRole === "channel" ? { role: "channel" as const, width: "10 um", depth: "10 um" } : { role: l.proposedRole! }]),
      );
      for (const conditions of [{}, { units: "mm" as const }, { units: "mm" as const, layers: sized }]) {
        const r = answer(() => extractNetwork(bytes, conditions));
        if (r.ok) {
          expect(r.value.layers.length).toBe(layers.length);
          for (const s of r.value.segments) expect(Number.isFinite(s.lengthM) && s.lengthM > 0).toBe(true);
        } else {
          expect(r.error).toBeInstanceOf(LayoutError);
          expect(r.error.message).not.toMatch(/\bat .*\.ts:\d+/);
          const listed = (r.error.details as { layers?: LayerSummary[] } | undefined)?.layers;
          // The file was readable (the survey passed), so the error lists the layers for the mapping step.
          expect(listed?.map((l) => l.name)).toEqual(layers.map((l) => l.name));
        }
      }
    });
  }
});
