/**
 * Disjoint sets over 0…n−1 with path compression, on a typed array: the
 * layout reader uses it to merge snapped endpoints and the solver to find
 * connected parts. Hand-written because it is ten lines and a package would
 * cost more than it saves. The smaller index always becomes the root, so
 * results do not depend on the order of unions.
 */
export class UnionFind {
  readonly parent: Int32Array;

  constructor(n: number) {
    this.parent = new Int32Array(n);
    for (let i = 0; i < n; i++) this.parent[i] = i;
  }

  find(i: number): number {
    let r = i;
    while (this.parent[r] !== r) r = this.parent[r];
    while (this.parent[i] !== r) {
      const next = this.parent[i];
      this.parent[i] = r;
      i = next;
    }
    return r;
  }

  /** Join the sets of a and b (the smaller root index becomes the root). */
  union(a: number, b: number): void {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent[Math.max(ra, rb)] = Math.min(ra, rb);
  }
}
