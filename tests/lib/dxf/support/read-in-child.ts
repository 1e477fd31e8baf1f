/**
 * Reads each layout text given on stdin (a JSON array) with readDxf and prints one outcome line per text as soon as
 * it is read, so a test in another process can kill a read that never ends and know which text it was.
 */
import { readFileSync } from "node:fs";
import { readDxf } from "../../../../lib/dxf/read";
import { LayoutError } from "../../../../lib/errors";

const texts = JSON.parse(readFileSync(0, "utf8")) as string[];
for (const text of texts) {
  let line: string;
  try {
    const drawing = readDxf(text, { chordToleranceM: 1e-7, units: "um" });
    line = JSON.stringify({ entities: drawing.entities.length });
  } catch (e) {
    line = JSON.stringify(e instanceof LayoutError ? { code: e.code, message: e.message } : { crash: String(e) });
  }
  process.stdout.write(line + "\n");
}
