/**
 * A section cut short but closed with an EOF marker (issue 3): answered with a LayoutError naming the section, never
 * a read that does not end. dxf-parser's LAYER and VPORT table readers loop for ever on such a file and a synchronous
 * loop cannot be stopped from inside the test, so the reads run in a child process killed after a time limit.
 * Fixtures from tests/fixtures/layouts/generate.py (ezdxf); the expected answers are the reader's own contract
 * (common practice: a truncated upload is refused with what to do, not read in part).
 */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const arcCross = readFileSync(here("../../fixtures/layouts/arc-cross-r2018.dxf"), "utf8");
const blockArray = readFileSync(here("../../fixtures/layouts/block-array-r2018.dxf"), "utf8");
const EOF = "\n0\nEOF\n";

/** The text up to the line holding `word` (its n-th occurrence from the start, or the last when n < 0), then EOF. */
function cutBefore(text: string, word: string, n = 0): string {
  let at = n < 0 ? text.lastIndexOf(word) : text.indexOf(word);
  for (let k = 0; k < n; k++) at = text.indexOf(word, at + 1);
  expect(at).toBeGreaterThan(0);
  return text.slice(0, text.lastIndexOf("\n", at - 1)) + EOF;
}

type Outcome = { code?: string; message?: string; entities?: number; crash?: string };

/** Each text read by readDxf in a child process; a read still running after the time limit fails the test. */
function readInChild(texts: string[]): Outcome[] {
  const run = spawnSync(process.execPath, ["--import", "tsx", here("./support/read-in-child.ts")], {
    input: JSON.stringify(texts),
    encoding: "utf8",
    timeout: 60_000,
    killSignal: "SIGKILL",
  });
  const lines = run.stdout.split("\n").filter((l) => l !== "");
  if (run.error || run.status !== 0) {
    throw new Error(`the read of text ${lines.length + 1} of ${texts.length} did not end (${run.error?.message ?? run.stderr.slice(0, 300)})`);
  }
  return lines.map((l) => JSON.parse(l) as Outcome);
}

describe("sections without their end", () => {
  it("are refused with the section or block named, in a read that ends (TABLES, HEADER, BLOCKS, ENTITIES, OBJECTS, a block)", { timeout: 90_000 }, () => {
    const cases: [string, string, string, string][] = [
      // The file: 8,493 characters reach into the LAYER table.
      ["TABLES cut in the LAYER table", arcCross.slice(0, 8493) + EOF, "truncated_file", "TABLES"],
      ["HEADER cut", cutBefore(arcCross, "$INSUNITS"), "truncated_file", "HEADER"],
      ["BLOCKS cut inside a block (no ENDBLK, no ENDSEC)", cutBefore(blockArray, "ENDBLK", -1), "truncated_file", "BLOCKS"],
      ["ENTITIES cut before its ENDSEC", cutBefore(arcCross, "ENDSEC", 4), "truncated_file", "ENTITIES"],
      ["OBJECTS cut", cutBefore(arcCross, "ENDSEC", -1), "truncated_file", "OBJECTS"],
    ];
    // Which ENDSEC closes which section in the fixture (HEADER, CLASSES, TABLES, BLOCKS, ENTITIES, OBJECTS).
    const order = [...("\n" + arcCross).matchAll(/\n *0\n *SECTION\n *2\n(\w+)\n/g)].map((m) => m[1]);
    expect(order).toEqual(["HEADER", "CLASSES", "TABLES", "BLOCKS", "ENTITIES", "OBJECTS"]);
    // TABLES' ENDSEC lost: the next section starts inside it.
    const tablesEnd = arcCross.indexOf("ENDSEC", arcCross.search(/\n *2\nTABLES\n/));
    const noTablesEnd = arcCross.slice(0, tablesEnd) + "ENDTAB" + arcCross.slice(tablesEnd + "ENDSEC".length);
    // The last block's ENDBLK lost: dxf-parser reads the block on through the ENTITIES section.
    const lastEndblk = blockArray.lastIndexOf("ENDBLK");
    const noEndblk = blockArray.slice(0, lastEndblk) + "ENDBLX" + blockArray.slice(lastEndblk + "ENDBLK".length);
    const answers = readInChild([arcCross, ...cases.map((c) => c[1]), noTablesEnd, noEndblk]);
    expect(answers[0].entities).toBeGreaterThan(0);
    cases.forEach(([name, , code, section], k) => {
      const a = answers[k + 1];
      expect(a.code, name).toBe(code);
      expect(a.message, name).toContain(`ends in the middle of a section (${section} has no ENDSEC)`);
      expect(a.message, name).toContain("Upload the complete file again");
    });
    const last = answers[cases.length + 1];
    expect(last.code).toBe("unreadable_dxf");
    expect(last.message).toContain("TABLES section has no end (ENDSEC) before the next section starts");
    const block = answers[cases.length + 2];
    expect(block.code).toBe("unreadable_dxf");
    expect(block.message).toMatch(/block "[^"]+" has no end \(ENDBLK\) before the next block or the end of the BLOCKS section/);
  });
});
