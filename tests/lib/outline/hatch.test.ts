/**
 * HATCH boundaries read as mask outlines. Fixtures written by ezdxf (tests/fixtures/outlines/generate.py):
 * the T mask (Shapely buffer of the centreline fixture) as a polyline path, and a stadium as an edge path of
 * lines and counter-clockwise arcs; expected values from the centreline original and Shapely.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { extractNetwork } from "@/lib/network/extract";
import { readDxf } from "@/lib/dxf/read";

const outDir = new URL("../../fixtures/outlines/", import.meta.url);
const lineDir = new URL("../../fixtures/layouts/", import.meta.url);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const outlines: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", outDir), "utf8")).fixtures;
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const originals: Record<string, any> = JSON.parse(readFileSync(new URL("expected.json", lineDir), "utf8")).fixtures;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("HATCH boundary paths", () => {
  it("a polyline-path hatch of the T mask gives the centreline original's three segments within 1 %", () => {
    const f = outlines["tee-hatch"];
    const net = extractNetwork(readFileSync(new URL(f.file, outDir)), f.conditions);
    const flow = net.layers.find((l) => l.name === "FLOW")!;
    expect(flow.byType).toEqual({ HATCH: 1 });
    expect(flow.style).toBe("outline");
    expect(net.warnings.map((w) => w.code)).not.toContain("entities_not_read");
    // Shapely noding of the centreline original (layouts/expected.json).
    const expected = (originals[f.original].segment_lengths_m as number[]).slice().sort((a, b) => a - b);
    const got = net.segments.map((s) => s.lengthM).sort((a, b) => a - b);
    expect(got).toHaveLength(expected.length);
    got.forEach((g, i) => expect(rel(g, expected[i])).toBeLessThan(0.01));
    for (const s of net.segments) expect(rel(s.widthM, f.width_m)).toBeLessThan(0.01);
  });

  it("an edge-path hatch (lines and arcs) is one closed path whose area is Shapely's, read as a 9 mm channel", () => {
    const f = outlines["stadium-hatch-edges"];
    const bytes = readFileSync(new URL(f.file, outDir));
    const d = readDxf(bytes, { chordToleranceM: 1e-7 });
    const paths = d.entities.filter((e) => e.kind === "path" && e.type === "HATCH");
    expect(paths).toHaveLength(1);
    const p = paths[0];
    expect(p.kind === "path" && p.closed).toBe(true);
    if (p.kind !== "path") return;
    expect(p.pieces.map((q) => q.kind)).toEqual(["line", "arc", "line", "arc"]);
    // Area of lines + half-discs (Green's theorem over the pieces): Shapely's round-capped buffer area within 0.1 %.
    let area = 0;
    for (const q of p.pieces) {
      if (q.kind === "line") area += (q.x0 * q.y1 - q.x1 * q.y0) / 2;
      else {
        const a1 = q.a0 + q.sweep;
        area += (q.r * q.r * q.sweep + q.cx * q.r * (Math.sin(a1) - Math.sin(q.a0)) - q.cy * q.r * (Math.cos(a1) - Math.cos(q.a0))) / 2;
      }
    }
    expect(rel(Math.abs(area), f.mask_area_um2)).toBeLessThan(1e-3);
    const net = extractNetwork(bytes, f.conditions);
    expect(net.segments).toHaveLength(1);
    // Shapely: centreline minus the port discs.
    expect(rel(net.segments[0].lengthM, f.segment_length_m)).toBeLessThan(0.01);
    expect(rel(net.segments[0].widthM, f.width_m)).toBeLessThan(0.01);
  });
});
