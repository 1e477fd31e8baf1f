/**
 * Douglas–Peucker simplification, the stack walk shared by the outline reader's two simplifiers (a centreline's
 * shape and width together, and its shape alone). Own code: a dozen lines, the criterion is each caller's.
 */

/**
 * Mark in keep[0..n) the points to keep: both ends, then recursively the point worstBetween(i, j) names for each
 * run i…j still to check (−1 when every point strictly between is within tolerance of the straight run).
 * @param stack scratch array, used from its start and never shortened (so it keeps its storage between calls).
 */
export function douglasPeucker(n: number, keep: Uint8Array, stack: number[], worstBetween: (i: number, j: number) => number): void {
  keep.fill(0, 0, n);
  if (n === 0) return;
  keep[0] = keep[n - 1] = 1;
  let top = 0;
  if (n > 2) {
    stack[top++] = 0;
    stack[top++] = n - 1;
  }
  while (top > 0) {
    const j = stack[--top], i = stack[--top];
    const k = worstBetween(i, j);
    if (k >= 0) {
      keep[k] = 1;
      stack[top++] = i;
      stack[top++] = k;
      stack[top++] = k;
      stack[top++] = j;
    }
  }
}
