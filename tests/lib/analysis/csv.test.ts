/**
 * CSV writer against RFC 4180 §2 (the examples of rules 1, 4, 6 and 7) and,
 * independently, against Python's standard csv module (excel dialect, the
 * RFC 4180 style: CRLF, QUOTE_MINIMAL) run with /usr/bin/python3: its writer
 * must produce the same bytes and its reader must get the same fields back.
 * Formula guarding follows OWASP's "CSV Injection" page.
 */
import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { CsvExportError, formatCsv, segmentsToCsv } from "@/lib/analysis/csv";
import type { AnalyzeJson, AnalyzeSegmentJson } from "@/lib/analysis/serialize";

function python(script: string, input: string): string {
  return execFileSync("/usr/bin/python3", ["-c", script], { input, encoding: "utf8" });
}

describe("RFC 4180 §2", () => {
  it("rule 1: each record ends with CRLF (aaa,bbb,ccc CRLF zzz,yyy,xxx CRLF)", () => {
    expect(formatCsv([["aaa", "bbb", "ccc"], ["zzz", "yyy", "xxx"]])).toBe("aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n");
  });

  it("rule 4: spaces are part of a field and kept", () => {
    expect(formatCsv([[" aaa", "bbb ", "c c"]])).toBe(" aaa,bbb ,c c\r\n");
  });

  it('rule 6: fields with a line break, a quote or a comma are enclosed in quotes ("aaa","b CRLF bb","ccc")', () => {
    expect(formatCsv([["aaa", "b\r\nbb", "ccc"]])).toBe('aaa,"b\r\nbb",ccc\r\n');
    expect(formatCsv([["a,b", "c"]])).toBe('"a,b",c\r\n');
  });

  it('rule 7: a quote inside a quoted field is doubled ("aaa","b""bb","ccc")', () => {
    expect(formatCsv([["aaa", 'b"bb', "ccc"]])).toBe('aaa,"b""bb",ccc\r\n');
  });
});

describe("agrees with Python's csv module", () => {
  const rows = [
    ["Segment", "Width (µm)", "Note"],
    ["s1", "100", 'said "wide"'],
    ["s2, left", "0.00123", "line one\nline two"],
    ["s3", "12.3e-6", "plain"],
    ["s4", "", "trailing space "],
  ];

  it("writes the same bytes as csv.writer (excel dialect)", () => {
    const ours = formatCsv(rows, { guardFormulas: false });
    const theirs = python(
      "import csv,io,json,sys\nrows=json.load(sys.stdin)\nb=io.StringIO(newline='')\ncsv.writer(b).writerows(rows)\nsys.stdout.write(json.dumps(b.getvalue()))",
      JSON.stringify(rows),
    );
    expect(ours).toBe(JSON.parse(theirs));
  });

  it("reads back to the same fields with csv.reader", () => {
    const ours = formatCsv(rows, { guardFormulas: false });
    const back = python("import csv,io,json,sys\ns=json.load(sys.stdin)\nprint(json.dumps(list(csv.reader(io.StringIO(s, newline='')))))", JSON.stringify(ours));
    expect(JSON.parse(back)).toEqual(rows);
  });
});

describe("cells", () => {
  it("writes numbers as JavaScript prints them, empty for null, NaN and Infinity", () => {
    expect(formatCsv([[1.5e-11, 0, -2, null, undefined, Number.NaN, Infinity, true]])).toBe("1.5e-11,0,-2,,,,,true\r\n");
  });

  it("guards text a spreadsheet would run as a formula, but not plain numbers (OWASP CSV Injection)", () => {
    expect(formatCsv([["=HYPERLINK(\"http://x\")", "+1+2", "@SUM(A1)", "-1.5e-3", "-", "ok"]])).toBe(
      `"'=HYPERLINK(""http://x"")",'+1+2,'@SUM(A1),-1.5e-3,'-,ok\r\n`,
    );
  });
});

describe("segmentsToCsv: exactly the columns and rows shown", () => {
  const seg = (id: string, width: number, re: number): AnalyzeSegmentJson => ({
    id, layer: "CHANNELS", from: `${id}a`, to: `${id}b`, length_m: 0.005, width_m: width, end_width_m: width, min_width_m: width, max_width_m: width,
    depth_m: 5e-5, section: "rectangular", min_bend_radius_m: null, path_m: [[0, 0], [0.005, 0]], reynolds: re, flow_m3_per_s: 1e-9 / 60,
  });
  const doc = {
    nodes: [],
    segments: [seg("s1", 100e-6, 0.25), seg("s2", 250e-6, 12.5), seg("s3", 50e-6, 0.0042)],
  } as unknown as AnalyzeJson;

  it("puts units in the headers and values in the member's units, in the table's order", () => {
    const csv = segmentsToCsv(doc, ["width", "flow", "reynolds"], { length: "mm" }, { segmentIds: ["s2", "s1"] });
    expect(csv).toBe(
      "Segment,Layer,Width (mm),Flow rate (µL/min),Reynolds number Re\r\n" +
        "s2,CHANNELS,0.250,1.00,12.5\r\n" +
        "s1,CHANNELS,0.100,1.00,0.250\r\n",
    );
  });

  it("can export every digit instead of the displayed precision", () => {
    const csv = segmentsToCsv(doc, ["width"], {}, { segmentIds: ["s3"], precision: "full" });
    expect(csv.split("\r\n")[1]).toBe(`s3,CHANNELS,${50e-6 * 1e6}`);
  });

  it("refuses ids the analysis does not have (400)", () => {
    expect(() => segmentsToCsv(doc, ["width"], {}, { segmentIds: ["s9"] })).toThrow(CsvExportError);
    try {
      segmentsToCsv(doc, ["width"], {}, { segmentIds: ["s9"] });
    } catch (e) {
      expect((e as CsvExportError).status).toBe(400);
      expect((e as Error).message).toMatch(/s9/);
    }
  });
});
