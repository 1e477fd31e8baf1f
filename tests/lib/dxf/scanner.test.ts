/**
 * The text scanner's group values against the JavaScript number parser (parseFloat/parseInt, correctly rounded
 * per ECMA-262), which is what dxf-parser's scanner uses; value types by the DXF reference's table of group code value
 * types; its failures as LayoutErrors in our words.
 */
import { describe, expect, it } from "vitest";
import { TextScanner } from "@/lib/dxf/scanner";
import { LayoutError } from "@/lib/errors";

/** Park–Miller minimal standard generator (Park & Miller, CACM 31(10), 1988). */
function lcg(seed: number) {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

function layoutErrorOf(fn: () => unknown): LayoutError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(LayoutError);
    return e as LayoutError;
  }
  throw new Error("expected a LayoutError");
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
    expect(first("290\n0\n").value).toBe(false);
    const flag = layoutErrorOf(() => first("290\n2\n"));
    expect(flag.code).toBe("unreadable_dxf");
    expect(flag.message).toContain('yes/no group (code 290) whose value is "2" instead of 0 or 1');
  });

  it("types values by the DXF reference's group code ranges (text, real, integer, flag; unassigned codes kept as text)", () => {
    // DXF reference, "Group code value types": 40-59 real, 60-79 and 90-99 integer, 100 text, 1071 32-bit integer.
    expect(first("40\n2.5\n").value).toBe(2.5);
    expect(first("62\n 7\n").value).toBe(7);
    expect(first("90\n12\n").value).toBe(12);
    expect(first("100\nAcDbLine\n").value).toBe("AcDbLine");
    expect(first("1071\n3\n").value).toBe(3);
    expect(first("1040\n0.5\n").value).toBe(0.5);
    // 80-89, 150-159 and codes past 1071 are assigned no type there: the text as written.
    expect(first("85\n3\n").value).toBe("3");
    expect(first("155\n1.5\n").value).toBe("1.5");
    expect(first("2000\n1\n").value).toBe("1");
    expect(first("-1\nX\n").value).toBe("X");
  });

  it("rewinds, and ends with a truncated_file LayoutError (cut before the EOF group, or asked for more after it)", () => {
    const text = "10\n1.5\n20\n2.5\n0\nEOF\n";
    const s = new TextScanner(text, 0, text.length);
    expect(s.next().value).toBe(1.5);
    expect(s.next().value).toBe(2.5);
    s.rewind();
    expect(s.next()).toEqual({ code: 20, value: 2.5 });
    expect(s.next()).toEqual({ code: 0, value: "EOF" });
    expect(s.isEOF()).toBe(true);
    expect(layoutErrorOf(() => s.next()).code).toBe("truncated_file");
    // A code line with no value line after it: the file was cut there.
    const cut = "10\n1.5\n20";
    const c = new TextScanner(cut, 0, cut.length);
    c.next();
    const e = layoutErrorOf(() => c.next());
    expect(e.code).toBe("truncated_file");
    expect(e.message).toBe("The DXF ends in the middle of a section: the file is truncated. Upload the complete file again.");
  });
});
