import { describe, expect, it } from "vitest";
import { grownCopy } from "@/lib/typed-arrays";

describe("grownCopy", () => {
  it("keeps the array's kind and contents and zero-fills the new room", () => {
    const f = grownCopy(Float64Array.of(1.5, -0, 3), 5);
    expect(f).toBeInstanceOf(Float64Array);
    expect([...f]).toEqual([1.5, -0, 3, 0, 0]);
    expect(Object.is(f[1], -0)).toBe(true);
    const i = grownCopy(Int32Array.of(-7, 2 ** 31 - 1), 3);
    expect(i).toBeInstanceOf(Int32Array);
    expect([...i]).toEqual([-7, 2 ** 31 - 1, 0]);
    const u = grownCopy(Uint8Array.of(255), 2);
    expect(u).toBeInstanceOf(Uint8Array);
    expect([...u]).toEqual([255, 0]);
  });

  it("is a copy: writing to it leaves the original alone", () => {
    const a = Float64Array.of(1, 2);
    const b = grownCopy(a, 4);
    b[0] = 9;
    expect(a[0]).toBe(1);
  });
});
