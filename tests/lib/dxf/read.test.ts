/**
 * Bad input is refused with a LayoutError naming what to fix (never a crash),
 * and the unit table matches ezdxf's decoding of $INSUNITS.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { LayoutError } from "@/lib/errors";
import { decodeLayout, MAX_LAYOUT_BYTES, readDxf } from "@/lib/dxf/read";
import { INSUNITS_TO_UNIT, METRES_PER_UNIT } from "@/lib/dxf/units";
import { extractNetwork } from "@/lib/network/extract";

const dir = new URL("../../fixtures/layouts/", import.meta.url);
const expected = JSON.parse(readFileSync(new URL("expected.json", dir), "utf8"));
const straight = readFileSync(new URL("straight-r2000.dxf", dir), "utf8");
const straightConditions = expected.fixtures["straight-r2000"].conditions;

function layoutErrorOf(fn: () => unknown): LayoutError {
  try {
    fn();
  } catch (e) {
    if (e instanceof LayoutError) return e;
    throw e;
  }
  throw new Error("expected a LayoutError");
}

/** A minimal hand-written DXF (R12 style: ENTITIES only). */
const minimal = (entities: string, header = "") =>
  ["0", "SECTION", "2", "HEADER", header, "0", "ENDSEC", "0", "SECTION", "2", "ENTITIES", entities, "0", "ENDSEC", "0", "EOF", ""].filter((l) => l !== "").join("\n") + "\n";
const line = (layer: string, x0: string, y0: string, x1: string, y1: string) => ["0", "LINE", "8", layer, "10", x0, "20", y0, "11", x1, "21", y1].join("\n");
const circle = (layer: string, x: string, y: string, r: string) => ["0", "CIRCLE", "8", layer, "10", x, "20", y, "40", r].join("\n");
const insunits = (code: number) => ["9", "$INSUNITS", "70", String(code)].join("\n");

describe("refused files", () => {
  it("empty file", () => {
    expect(layoutErrorOf(() => extractNetwork("", straightConditions)).code).toBe("empty_file");
    expect(layoutErrorOf(() => extractNetwork(new Uint8Array(0), straightConditions)).code).toBe("empty_file");
    expect(layoutErrorOf(() => extractNetwork("  \n\r\n ", straightConditions)).code).toBe("empty_file");
  });

  it("truncated file (cut mid-way, and cut inside the ENTITIES section)", () => {
    const half = straight.slice(0, Math.floor(straight.length / 2));
    const e = layoutErrorOf(() => extractNetwork(half, straightConditions));
    expect(e.code).toBe("truncated_file");
    expect(e.message).toMatch(/truncated/);
    expect(e.status).toBe(422);
    // Even when the text still ends with an EOF marker, a section cut short is reported as truncated.
    const cut = straight.slice(0, straight.indexOf("ENTITIES") + 40).replace(/\n[^\n]*$/, "\n") + "  0\nEOF\n";
    const mid = layoutErrorOf(() => extractNetwork(cut, straightConditions));
    expect(mid.code).toBe("truncated_file");
    expect(mid.message).toMatch(/middle of a section/);
  });

  it("binary DXF, asking for an ASCII export", () => {
    const bytes = new Uint8Array([...new TextEncoder().encode("AutoCAD Binary DXF\r\n"), 0x1a, 0x00, 0, 0, 2, 0]);
    const e = layoutErrorOf(() => extractNetwork(bytes, straightConditions));
    expect(e.code).toBe("binary_dxf");
    expect(e.message).toMatch(/ASCII DXF/);
  });

  it("DWG file, saying it is a DWG", () => {
    const bytes = new Uint8Array([...new TextEncoder().encode("AC1032"), 0, 0, 0, 0, 0, 0x1f, 0x31]);
    const e = layoutErrorOf(() => extractNetwork(bytes, straightConditions));
    expect(e.code).toBe("dwg_file");
    expect(e.message).toMatch(/DWG/);
  });

  it("over the size limit (25 MiB by default, configurable)", () => {
    expect(MAX_LAYOUT_BYTES).toBe(25 * 1024 * 1024);
    const e = layoutErrorOf(() => extractNetwork(straight, straightConditions, { maxBytes: 1000 }));
    expect(e.code).toBe("too_large");
    expect(layoutErrorOf(() => decodeLayout(new Uint8Array(MAX_LAYOUT_BYTES + 1))).code).toBe("too_large");
  });

  it("not a DXF at all", () => {
    expect(layoutErrorOf(() => extractNetwork("hello, this is a note\n", straightConditions)).code).toBe("not_dxf");
  });

  it("coordinates that are not finite numbers (NaN, overflow)", () => {
    const cond = { units: "um" as const, layers: { FLOW: { role: "channel" as const, width: "100 um", depth: "50 um" } } };
    const nan = layoutErrorOf(() => extractNetwork(minimal(line("FLOW", "0", "0", "nan", "0")), cond));
    expect(nan.code).toBe("non_finite_coordinates");
    expect(nan.message).toContain('layer "FLOW"');
    const inf = layoutErrorOf(() => extractNetwork(minimal(line("FLOW", "0", "1e999", "10", "0")), cond));
    expect(inf.code).toBe("non_finite_coordinates");
  });

  it("units unknown: asks for units; conditions.units overrides $INSUNITS", () => {
    const cond = { layers: { FLOW: { role: "channel" as const, width: "100 um", depth: "50 um" }, PORTS: { role: "port" as const } } };
    const text = minimal([line("FLOW", "0", "0", "10", "0"), circle("PORTS", "0", "0", "1"), circle("PORTS", "10", "0", "1")].join("\n"));
    const e = layoutErrorOf(() => extractNetwork(text, cond));
    expect(e.code).toBe("units_unknown");
    expect(e.message).toMatch(/"units"/);
    const feet = layoutErrorOf(() => extractNetwork(minimal(line("FLOW", "0", "0", "10", "0"), insunits(2)), cond));
    expect(feet.message).toContain("feet");
    const mm = extractNetwork(text, { ...cond, units: "mm" });
    expect(mm.units).toEqual({ drawing: "mm", source: "conditions", metresPerUnit: 1e-3 });
    expect(mm.segments[0].lengthM).toBeCloseTo(8e-3, 15);
    const fromHeader = extractNetwork(minimal([line("FLOW", "0", "0", "10", "0"), circle("PORTS", "0", "0", "1"), circle("PORTS", "10", "0", "1")].join("\n"), insunits(1)), cond);
    // 1 in = 25.4 mm exactly (international inch): 8 in of channel.
    expect(fromHeader.segments[0].lengthM).toBeCloseTo(8 * 0.0254, 15);
  });

  it("no channel layer: the error lists the layers with their counts", () => {
    const e = layoutErrorOf(() => extractNetwork(straight, { layers: { FLOW: { role: "control" }, PORTS: { role: "port" } } }));
    expect(e.code).toBe("no_channel_layer");
    expect(e.message).toContain("FLOW");
    const layers = (e.details as { layers: { name: string; entities: number }[] }).layers;
    expect(layers.find((l) => l.name === "FLOW")!.entities).toBe(1);
  });

  it("nothing connected to any port (no port layer; ports away from the channels)", () => {
    const noPorts = layoutErrorOf(() => extractNetwork(straight, { layers: { FLOW: straightConditions.layers.FLOW } }));
    expect(noPorts.code).toBe("nothing_connected");
    const cond = { units: "um" as const, layers: { FLOW: { role: "channel" as const, width: "100 um", depth: "50 um" }, PORTS: { role: "port" as const } } };
    const apart = layoutErrorOf(() => extractNetwork(minimal([line("FLOW", "0", "0", "1000", "0"), circle("PORTS", "5000", "5000", "100")].join("\n")), cond));
    expect(apart.code).toBe("nothing_connected");
  });

  it("a channel layer without width names the layer", () => {
    const e = layoutErrorOf(() => extractNetwork(straight, { layers: { FLOW: { role: "channel", depth: "50 um" }, PORTS: { role: "port" } } }));
    expect(e.code).toBe("width_missing");
    expect(e.message).toContain('"FLOW"');
  });
});

describe("channel layer styles", () => {
  it("closed shapes on a channel layer are read as outlines, said in a warning and in the layer's style", () => {
    const closed = ["0", "LWPOLYLINE", "8", "FLOW", "90", "4", "70", "1", "10", "0", "20", "-50", "10", "900", "20", "-50", "10", "900", "20", "50", "10", "0", "20", "50"].join("\n");
    const cond = { units: "um" as const, layers: { FLOW: { role: "channel" as const, width: "100 um", depth: "50 um" }, PORTS: { role: "port" as const } } };
    const text = minimal([closed, line("FLOW", "0", "500", "1000", "500"), circle("PORTS", "0", "500", "100"), circle("PORTS", "1000", "500", "100")].join("\n"), insunits(13));
    const net = extractNetwork(text, cond);
    expect(net.layers.find((l) => l.name === "FLOW")!.style).toBe("mixed");
    expect(net.warnings.map((w) => w.code)).toContain("outline_read");
    // The outline reaches no port, so only the centreline is a channel: 1000 µm less the two 100 µm port radii.
    expect(net.warnings.map((w) => w.code)).toContain("unconnected_channels");
    expect(net.segments).toHaveLength(1);
    expect(net.segments[0].lengthM).toBeCloseTo(800e-6, 12);
  });
});

describe("units", () => {
  it("every $INSUNITS code Stokeline takes decodes to the same unit in ezdxf", () => {
    // ezdxf.units.decode, written to expected.json by the fixture generator.
    const ezdxfDecode: Record<string, string | null> = expected.insunits_decode;
    const spelled: Record<string, string> = { µm: "um" };
    for (const [code, unit] of Object.entries(INSUNITS_TO_UNIT)) {
      const e = ezdxfDecode[code];
      expect(spelled[e as string] ?? e).toBe(unit);
    }
    // And every ezdxf unit Stokeline can express is mapped.
    for (const [code, e] of Object.entries(ezdxfDecode)) {
      const u = spelled[e as string] ?? e;
      if (u && u in METRES_PER_UNIT) expect(INSUNITS_TO_UNIT[Number(code)]).toBe(u);
    }
  });
});

describe("entities", () => {
  it("reads the fixture's entities on their layers and ignores nothing in model space", () => {
    const d = readDxf(straight, { chordToleranceM: 1e-7 });
    expect(d.units?.drawing).toBe("um");
    expect(d.layerCounts.get("FLOW")).toEqual({ LINE: 1 });
    expect(d.layerCounts.get("PORTS")).toEqual({ CIRCLE: 2 });
    expect(d.entities.filter((e) => e.kind === "text").map((e) => (e.kind === "text" ? e.text : "")).sort()).toEqual(["IN", "OUT"]);
  });

  it("paper-space entities (group 67 = 1) are ignored", () => {
    const ps = ["0", "LINE", "8", "FLOW", "67", "1", "10", "0", "20", "0", "11", "5", "21", "0"].join("\n");
    const d = readDxf(minimal([ps, line("FLOW", "0", "0", "1", "0")].join("\n"), insunits(13)), { chordToleranceM: 1e-7 });
    expect(d.layerCounts.get("FLOW")).toEqual({ LINE: 1 });
  });
});
