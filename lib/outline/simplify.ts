/**
 * Douglas–Peucker simplification, the stack walk shared by the outline reader's two simplifiers (a centreline's
 * shape and width together, and its shape alone). Own code: a dozen lines, the criterion is each caller's.
 */

/**
 * Mark in keep[0..n) the points to keep: both ends, then recursively the point worstBetween(i, j) names for each
 * run i…j still to check (−1 when every point strictly between is within tolerance of the straight run).
 * @param stack scratch array, emptied here.
 */
export function douglasPeucker(n: number, keep: Uint8Array, stack: number[], worstBetween: (i: number, j: number) => number): void {
  keep.fill(0, 0, n);
  if (n === 0) return;
  keep[0] = keep[n - 1] = 1;
  stack.length = 0;
  if (n > 2) stack.push(0, n - 1);
  while (stack.length) {
    const j = stack.pop()!, i = stack.pop()!;
    const k = worstBetween(i, j);
    if (k >= 0) {
      keep[k] = 1;
      stack.push(i, k, k, j);
    }
  }
}
