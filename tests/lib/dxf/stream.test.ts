/**
 * The streamed read of the ENTITIES section (our group scanner and lean handlers, each entity walked as it is
 * read) against dxf-parser itself: the same drawing, or the same error, as when dxf-parser parses the whole
 * text first (where that parse stops on dxf-parser's own scanner, the same stop in our words); and the lean LINE/ARC/CIRCLE/LWPOLYLINE handlers read the same values as dxf-parser's stock ones.
 * The reference is dxf-parser 1.1.2 (the package the reader is built on); damaged copies are cut and garbled
 * with deterministic pseudo-random choices so a failure can be replayed.
 */
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { isDeepStrictEqual } from "node:util";
import DxfParser from "dxf-parser";
import { describe, expect, it } from "vitest";
import { LeanArc, LeanCircle, LeanLine, LeanLwpolyline } from "@/lib/dxf/handlers";
import { readDxf } from "@/lib/dxf/read";
import { LayoutError } from "@/lib/errors";

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const folders = [here("../../fixtures/layouts/"), here("../../fixtures/outlines/"), here("../../../db/demo-layouts/"), here("../../../../shared/dxf-corpus/")];
const files = folders.filter(existsSync).flatMap((d) => readdirSync(d).filter((f) => f.toLowerCase().endsWith(".dxf")).sort().map((f) => d + f));

/** Park–Miller minimal standard generator (Park & Miller, CACM 31(10), 1988). */
function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

/**
 * Where the whole-text parse stops on dxf-parser's own scanner (a yes/no group that is not 0 or 1, a group asked for
 * after the EOF marker), the streamed read stops on ours at the same group and answers in our words.
 */
const DXF_PARSER_SCANNER_WORDS: [RegExp, { code: string; message: RegExp }][] = [
  [/cannot be cast to Boolean type/, { code: "unreadable_dxf", message: /yes\/no group \(code \d+\) whose value is .* instead of 0 or 1/ }],
  [/Cannot call 'next' after EOF group/, { code: "truncated_file", message: /^The DXF ends in the middle of a section: the file is truncated/ }],
];

/** The streamed read answers a damaged copy as the whole-text parse does (in our words where dxf-parser's scanner spoke). */
function expectSameAnswer(text: string) {
  const streamed = outcome(text, true) as { code?: string; message?: string };
  const whole = outcome(text, false) as { code?: string; message?: string };
  const ours = DXF_PARSER_SCANNER_WORDS.find(([words]) => typeof whole.message === "string" && words.test(whole.message));
  if (!ours || isDeepStrictEqual(streamed, whole)) {
    expect(streamed).toEqual(whole);
    return;
  }
  expect(streamed.code, `${streamed.message} / ${whole.message}`).toBe(ours[1].code);
  expect(streamed.message).toMatch(ours[1].message);
}

function outcome(text: string, streamEntities: boolean): unknown {
  try {
    return readDxf(text, { chordToleranceM: 1e-7, units: "um", streamEntities });
  } catch (e) {
    if (e instanceof LayoutError) return { code: e.code, message: e.message };
    throw e;
  }
}

describe("streamed ENTITIES read", () => {
  it("finds the fixtures", () => {
    expect(files.length).toBeGreaterThan(30);
  });

  for (const file of files) {
    const name = file.split("/").slice(-2).join("/");
    it(`${name}: the same drawing as dxf-parser's whole-text parse, also with other line ends, cut short and garbled`, () => {
      const text = readFileSync(file, "utf8");
      expect(outcome(text, true)).toEqual(outcome(text, false));
      // Other line ends and padding (DXF allows blanks around codes and values): CRLF, some lines CRLF, lone CR, padded.
      const lf = text.replace(/\r\n/g, "\n");
      for (const variant of [lf.replace(/\n/g, "\r\n"), lf.split("\n").map((l, i) => (i % 3 === 0 ? l + "\r" : l)).join("\n"), lf.replace(/\n/g, "\r"), lf.split("\n").map((l) => `  ${l} `).join("\n")]) {
        expect(outcome(variant, true)).toEqual(outcome(variant, false));
      }
      const rnd = lcg(text.length);
      for (let k = 0; k < 12; k++) {
        // Cut inside the ENTITIES section, then closed with an EOF marker so the parser, not the EOF check, meets the cut.
        const from = Math.max(0, text.lastIndexOf("ENTITIES"));
        const cut = text.slice(0, from + Math.floor(rnd() * (text.length - from))) + "\n0\nEOF\n";
        expectSameAnswer(cut);
      }
      const lines = text.split("\n");
      const junk = ["", "nan", "1e999", "-", "ÿÿÿ", "0", "SECTION", "EOF", "  8", "ENDSEC", "ENDBLK", "VERTEX", "SEQEND", "  10", "LINE", "ENTITIES", "1.5", "101"];
      for (let k = 0; k < 30; k++) {
        const copy = [...lines];
        copy[Math.floor(rnd() * (copy.length - 4))] = junk[Math.floor(rnd() * junk.length)];
        const garbled = copy.join("\n");
        expectSameAnswer(garbled);
      }
    });
  }
});

describe("lean handlers", () => {
  const fields = ["type", "layer", "handle", "inPaperSpace", "vertices", "center", "radius", "startAngle", "endAngle", "extrusionDirectionZ", "width", "shape"] as const;
  const pick = (e: Record<string, unknown>) => {
    const out: Record<string, unknown> = {};
    for (const f of fields) {
      if (e[f] === undefined) continue;
      // The stock LINE keeps its extrusion as a point; ARC and LWPOLYLINE keep z alone, as the lean ones do.
      out[f] = f === "vertices" ? (e[f] as Record<string, unknown>[]).map((v) => ({ x: v.x, y: v.y, z: v.z, bulge: v.bulge, startWidth: v.startWidth, endWidth: v.endWidth })) : e[f];
    }
    if (e.type === "LINE" && e.extrusionDirection) out.extrusionZ = (e.extrusionDirection as { z?: number }).z;
    return out;
  };
  const read = (text: string, lean: boolean) => {
    const parser = new DxfParser();
    if (lean) for (const h of [LeanLine, LeanArc, LeanCircle, LeanLwpolyline]) parser.registerEntityHandler(h as never);
    const dxf = parser.parseSync(text)!;
    const all = [...(dxf.entities ?? []), ...Object.values(dxf.blocks ?? {}).flatMap((b) => b.entities ?? [])];
    return all.filter((e) => ["LINE", "ARC", "CIRCLE", "LWPOLYLINE"].includes(e.type)).map((e) => pick(e as never));
  };

  it("read the same values as dxf-parser's stock LINE, ARC, CIRCLE and LWPOLYLINE handlers on every fixture", () => {
    let compared = 0;
    const quiet = console.log;
    console.log = () => undefined;
    try {
      for (const file of files) {
        const text = readFileSync(file, "utf8");
        const stock = read(text, false);
        expect(read(text, true), file).toEqual(stock);
        compared += stock.length;
      }
    } finally {
      console.log = quiet;
    }
    expect(compared).toBeGreaterThan(200);
  });

  it("an LWPOLYLINE vertex whose y group is garbled is reported as incomplete (dxf-parser's stock handler loops for ever on it)", () => {
    const text = readFileSync(here("../../fixtures/layouts/tapered-r2000.dxf"), "utf8");
    const lines = text.split("\n");
    const at = lines.findIndex((l, i) => l.trim() === "LWPOLYLINE" && lines[i - 1].trim() === "0");
    const y = lines.findIndex((l, i) => i > at && l.trim() === "20" && lines[i - 2].trim() === "10");
    expect(y).toBeGreaterThan(at);
    lines[y] = "ENTITIES";
    const e = outcome(lines.join("\n"), true) as { code: string; message: string };
    expect(e.code).toBe("entity_incomplete");
    expect(e.message).toContain("LWPOLYLINE");
    expect(outcome(lines.join("\n"), false)).toEqual(e);
  });
});
