/**
 * The text scanner's group values against the JavaScript number parser (parseFloat/parseInt, correctly rounded
 * per ECMA-262), which is what dxf-parser's scanner uses; and its end-of-input errors against dxf-parser's words.
 */
import { describe, expect, it } from "vitest";
import { TextScanner } from "@/lib/dxf/scanner";

/** Park–Miller minimal standard generator (Park & Miller, CACM 31(10), 1988). */
function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

const first = (text: string) => new TextScanner(text, 0, text.length).next();

describe("TextScanner", () => {
  it("reads coordinates exactly as parseFloat does (plain decimals, signs, blanks, exponents, junk)", () => {
    const rnd = lcg(20261202);
    const values = ["0", "-0", "-0.0", "0.", ".5", "-.5", "5.", "123456789012345", "1234567890123456", "  12.5  ", "\t-3.25", "1e5", "-2.5E-3", "12a", "", "-", ".", "007", "0.1", "0.3", "2.675", "9007199254740993", "nan", "1e999"];
    for (let k = 0; k < 20000; k++) {
      const digits = 1 + Math.floor(rnd() * 17);
      let s = "";
      for (let j = 0; j < digits; j++) s += String(Math.floor(rnd() * 10));
      const dot = Math.floor(rnd() * (digits + 1));
      s = s.slice(0, dot) + (rnd() < 0.8 ? "." : "") + s.slice(dot);
      values.push(rnd() < 0.5 ? "-" + s : s);
    }
    for (const v of values) {
      for (const code of ["10", " 20", "230"]) expect(Object.is(first(`${code}\n${v}\n`).value, parseFloat(v.trim())), `${code}: ${JSON.stringify(v)}`).toBe(true);
    }
  });

  it("reads codes and other values as dxf-parser does (parseInt of the code line, trimmed strings, integers, CRLF)", () => {
    expect(first("  8\r\nFLOW \r\n")).toEqual({ code: 8, value: "FLOW" });
    expect(first("70\n  1\n")).toEqual({ code: 70, value: 1 });
    expect(first("0x10\nA\n").code).toBe(parseInt("0x10"));
    expect(first("ÿÿÿ\n1.5\n").code).toBeNaN();
    expect(first("290\n1\n").value).toBe(true);
    expect(() => first("290\n2\n")).toThrow("String '2' cannot be cast to Boolean type");
  });

  it("rewinds, and ends with dxf-parser's errors", () => {
    const text = "10\n1.5\n20\n2.5\n0\nEOF\n";
    const s = new TextScanner(text, 0, text.length);
    expect(s.next().value).toBe(1.5);
    expect(s.next().value).toBe(2.5);
    s.rewind();
    expect(s.next()).toEqual({ code: 20, value: 2.5 });
    expect(s.next()).toEqual({ code: 0, value: "EOF" });
    expect(s.isEOF()).toBe(true);
    expect(() => s.next()).toThrow("Cannot call 'next' after EOF group has been read");
    // dxf-parser's scanner: a code line with no value line after it ends the input, naming that line.
    const cut = "10\n1.5\n20";
    const c = new TextScanner(cut, 0, cut.length);
    c.next();
    expect(() => c.next()).toThrow("Unexpected end of input: EOF group not read before end of file. Ended on code 20");
  });
});
