/**
 * Layer previews for the mapping step, checked against the layout fixtures'
 * expected values (tests/fixtures/layouts/generate.py): port centres from
 * ezdxf's block explosion, die bounds from Shapely.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { MAX_PREVIEW_POINTS_PER_LAYER, previewLayers } from "@/lib/chips/preview";
import { LayoutError } from "@/lib/errors";

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/layouts/${name}`, import.meta.url));
const expected = JSON.parse(readFileSync(new URL("../../fixtures/layouts/expected.json", import.meta.url), "utf8")).fixtures;

describe("previewLayers", () => {
  it("places the port circles of an inserted block array where ezdxf puts them (block-array-r2018)", () => {
    const preview = previewLayers(fixture("block-array-r2018.dxf"));
    const ports = preview.layers.find((l) => l.name === "PORTS");
    expect(ports).toBeDefined();
    const got = ports!.circles.map(([x, y]) => [x, y]).sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    // Source: ezdxf virtual_entities()/multi_insert() in generate.py → expected.json port_centres_m.
    const want = (expected["block-array-r2018"].port_centres_m as number[][]).slice().sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    expect(got.length).toBe(want.length);
    got.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(want[i][0], 9);
      expect(p[1]).toBeCloseTo(want[i][1], 9);
    });
    expect(preview.unitsKnown).toBe(true);
  });

  it("gives the die outline layer the bounds Shapely computes (die-lines-r2000)", () => {
    const preview = previewLayers(fixture("die-lines-r2000.dxf"));
    const die = preview.layers.find((l) => l.name === "DIE")!;
    // Source: Shapely Polygon bounds of the die corners → expected.json bounds_m [minx, miny, maxx, maxy].
    const [minX, minY, maxX, maxY] = expected["die-lines-r2000"].bounds_m as number[];
    expect(die.bounds!.minX).toBeCloseTo(minX, 9);
    expect(die.bounds!.minY).toBeCloseTo(minY, 9);
    expect(die.bounds!.maxX).toBeCloseTo(maxX, 9);
    expect(die.bounds!.maxY).toBeCloseTo(maxY, 9);
    expect(die.paths.length).toBeGreaterThan(0);
    // The whole drawing's bounds contain every layer's.
    for (const l of preview.layers) {
      if (!l.bounds) continue;
      expect(l.bounds.minX).toBeGreaterThanOrEqual(preview.bounds!.minX);
      expect(l.bounds.maxY).toBeLessThanOrEqual(preview.bounds!.maxY);
    }
  });

  it("samples the serpentine's bends so its drawn length matches the closed form (serpentine-r12)", () => {
    const preview = previewLayers(fixture("serpentine-r12.dxf"), "um");
    const flow = preview.layers.find((l) => l.name === "FLOW")!;
    const ports = preview.layers.find((l) => l.name === "PORTS")!;
    let drawnM = 0;
    for (const p of flow.paths) for (let i = 2; i < p.length; i += 2) drawnM += Math.hypot(p[i] - p[i - 2], p[i + 1] - p[i - 1]);
    // Source: expected.json closed_form_length_m = 22 mm + 4·π·0.3 mm, measured outside the port discs
    // (Shapely difference); the drawn centreline also runs one port radius into each of the two port discs.
    const closedFormM = expected["serpentine-r12"].closed_form_length_m as number;
    const radiusM = ports.circles[0][2];
    expect(ports.circles).toHaveLength(2);
    // Chords of 48 per turn fall short of each semicircle by π·r·θ²/24 with θ = 2π/48 (≈ 0.7 µm for r = 0.3 mm): 4 bends < 5 µm.
    expect(drawnM).toBeLessThan(closedFormM + 2 * radiusM);
    expect(closedFormM + 2 * radiusM - drawnM).toBeLessThan(5e-6);
  });

  it("keeps a layer with many vertices under the point budget, and says it simplified it", () => {
    // A generated zig-zag of 3 × budget vertices on one LWPOLYLINE (R12-style POLYLINE text built by hand).
    const n = MAX_PREVIEW_POINTS_PER_LAYER * 3;
    const lines = ["0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "13", "0", "ENDSEC", "0", "SECTION", "2", "ENTITIES"];
    for (let i = 0; i < n - 1; i++) {
      lines.push("0", "LINE", "8", "ZIG", "10", String(i * 10), "20", String((i % 2) * 10), "11", String((i + 1) * 10), "21", String(((i + 1) % 2) * 10));
    }
    lines.push("0", "ENDSEC", "0", "EOF");
    const preview = previewLayers(lines.join("\n"));
    const zig = preview.layers.find((l) => l.name === "ZIG")!;
    const points = zig.paths.reduce((s, p) => s + p.length / 2, 0);
    expect(points).toBeLessThanOrEqual(MAX_PREVIEW_POINTS_PER_LAYER);
    expect(points).toBeGreaterThan(MAX_PREVIEW_POINTS_PER_LAYER / 2);
    expect(zig.simplified).toBe(true);
    // Bounds are of the full layer, before thinning.
    expect(zig.bounds!.maxX).toBeCloseTo((n - 1) * 10e-6, 9);
  });

  it("refuses a file that is not a DXF with the reader's plain-words error", () => {
    expect(() => previewLayers("hello, this is not a drawing")).toThrow(LayoutError);
  });
});
