/**
 * LWPOLYLINE vertices as the DXF reference lays them out (LWPOLYLINE: vertex count 90, then per vertex 10/20, optional
 * 40/41/42 and, from R2010 on, a vertex identifier 91). The fixture is ezdxf's (tests/fixtures/layouts/generate.py);
 * the expected drawing is the reader's own reading of the unmodified fixture.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDxf } from "@/lib/dxf/read";
import { LayoutError } from "@/lib/errors";

const tapered = readFileSync(new URL("../../fixtures/layouts/tapered-r2000.dxf", import.meta.url), "utf8");
const read = (text: string) => readDxf(text, { chordToleranceM: 1e-7, units: "um" });

/** The fixture's lines with fn applied to the lines of its first LWPOLYLINE (its groups after the type line). */
function editPolyline(fn: (groups: string[][]) => string[][]): string {
  const lines = tapered.split("\n");
  const at = lines.findIndex((l, i) => l.trim() === "LWPOLYLINE" && lines[i - 1].trim() === "0");
  let end = at + 1;
  while (lines[end].trim() !== "0") end += 2;
  const groups: string[][] = [];
  for (let k = at + 1; k < end; k += 2) groups.push([lines[k], lines[k + 1]]);
  return [...lines.slice(0, at + 1), ...fn(groups).flat(), ...lines.slice(end)].join("\n");
}

describe("LWPOLYLINE vertices", () => {
  it("vertex identifiers (group 91 after each vertex) leave the drawing as it is", () => {
    const withIds = editPolyline((groups) => {
      const out: string[][] = [];
      let vertex = 0;
      groups.forEach((g, k) => {
        out.push(g);
        const nextCode = groups[k + 1]?.[0].trim();
        if (vertex > 0 && (nextCode === "10" || nextCode === undefined)) out.push([" 91", String(vertex)]);
        if (g[0].trim() === "10") vertex++;
      });
      expect(out.filter((g) => g[0].trim() === "91")).toHaveLength(2);
      return out;
    });
    const plain = read(tapered);
    expect(plain.entities.some((e) => e.type === "LWPOLYLINE")).toBe(true);
    expect(read(withIds).entities).toEqual(plain.entities);
  });

  it("a vertex lost from the list is refused as incomplete, naming the declared and listed counts", () => {
    const lost = editPolyline((groups) => {
      const second = groups.findIndex((g, k) => g[0].trim() === "10" && k > groups.findIndex((h) => h[0].trim() === "10"));
      return groups.slice(0, second);
    });
    let error: unknown = null;
    try {
      read(lost);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(LayoutError);
    expect((error as LayoutError).code).toBe("entity_incomplete");
    expect((error as LayoutError).message).toContain("declares 2 vertices but lists 1");
  });
});
