/**
 * Damaged files answer with a network or a LayoutError, never a crash: the
 * committed fixtures cut at many places and with lines garbled (deterministic
 * pseudo-random choices, so a failure can be replayed). Common practice for
 * parser robustness; no outside reference.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { DomainError } from "@/lib/errors";
import { extractNetwork } from "@/lib/network/extract";

const dir = new URL("../../fixtures/layouts/", import.meta.url);
const fixtures = JSON.parse(readFileSync(new URL("expected.json", dir), "utf8")).fixtures;

/** Park–Miller minimal standard generator (Park & Miller, CACM 31(10), 1988). */
function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

function answers(text: string, conditions: unknown): "network" | string {
  try {
    extractNetwork(text, conditions as never);
    return "network";
  } catch (e) {
    expect(e).toBeInstanceOf(DomainError);
    expect((e as DomainError).message.length).toBeGreaterThan(10);
    return (e as DomainError).code;
  }
}

describe("damaged layouts", () => {
  for (const name of ["block-array-r2018", "serpentine-r12", "spline-r2000", "tapered-polyline-r12"]) {
    it(`${name}: cut short at 25 places`, () => {
      const f = fixtures[name];
      const text = readFileSync(new URL(f.file, dir), "utf8");
      const rnd = lcg(name.length * 7919);
      const codes = new Set<string>();
      for (let k = 0; k < 25; k++) codes.add(answers(text.slice(0, Math.floor(rnd() * text.length)), f.conditions));
      // A file cut short never passes as a whole network.
      expect(codes.has("network")).toBe(false);
    });

    it(`${name}: 60 copies with one line garbled`, () => {
      const f = fixtures[name];
      const lines = readFileSync(new URL(f.file, dir), "utf8").split("\n");
      const rnd = lcg(name.length * 104729);
      const junk = ["", "nan", "1e999", "-", "ÿÿÿ", "0", "SECTION", "EOF", "999999999999", "  8", "ENDSEC", "ENDBLK", "VERTEX", "SEQEND", "  10"];
      for (let k = 0; k < 60; k++) {
        const copy = [...lines];
        copy[Math.floor(rnd() * (copy.length - 4))] = junk[Math.floor(rnd() * junk.length)];
        answers(copy.join("\n"), f.conditions);
      }
    });
  }

  // Regressions: dxf-parser's TABLES reader looped forever on these (the reader now leaves TABLES out).
  it("a table record whose name is garbled (R12 LAYER table) still answers", () => {
    const f = fixtures["tapered-polyline-r12"];
    const lines = readFileSync(new URL(f.file, dir), "utf8").split("\n");
    const tableAt = lines.findIndex((l, i) => l.trim() === "TABLE" && lines[i + 2]?.trim() === "LAYER");
    const recordAt = lines.findIndex((l, i) => i > tableAt + 3 && l.trim() === "LAYER" && lines[i - 1].trim() === "0");
    expect(recordAt).toBeGreaterThan(0);
    lines[recordAt] = "ÿÿÿ";
    expect(answers(lines.join("\n"), f.conditions)).toBe("network");
  });

  it("a table whose ENDTAB lost its group code still answers", () => {
    const f = fixtures["spline-r2000"];
    const lines = readFileSync(new URL(f.file, dir), "utf8").split("\n");
    const endtab = lines.findIndex((l) => l.trim() === "ENDTAB");
    lines[endtab - 1] = "SECTION";
    expect(answers(lines.join("\n"), f.conditions)).toBe("network");
  });
});
