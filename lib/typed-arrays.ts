/**
 * Growing typed arrays: the engine keeps large working sets (channel pieces, wall samples) in typed arrays,
 * which have a fixed length; this copies one into a larger array of the same kind.
 */
type Growable = Float64Array | Int32Array | Uint8Array;

/** A copy of a in a new array of the same kind with room for capacity elements (the rest zero). */
export function grownCopy<T extends Growable>(a: T, capacity: number): T {
  const b = new (a.constructor as new (n: number) => T)(capacity);
  b.set(a);
  return b;
}
