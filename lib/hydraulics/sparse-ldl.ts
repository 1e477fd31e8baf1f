/**
 * Sparse symmetric positive-definite solve, A x = b, by LDLᵀ elimination on the
 * matrix graph in minimum-degree order.
 *
 * Written here instead of using mathjs because mathjs's sparse `lusolve` (LU with
 * partial pivoting on its CCS matrices) measured far too slow for chip-sized systems
 * (see bench/solve.ts: seconds at a few thousand unknowns, growing super-linearly),
 * while channel networks are sparse, nearly planar graphs whose minimum-degree
 * elimination creates little fill, so a direct factorisation is exact to rounding
 * and runs in time close to linear.
 */

export interface SymmetricSystem {
  n: number;
  /** Diagonal entries, length n. */
  diag: Float64Array;
  /** Strictly off-diagonal entries, each pair once (i ≠ j), symmetric. */
  rows: Int32Array;
  cols: Int32Array;
  values: Float64Array;
}

export interface LdlResult {
  x: Float64Array;
  /** Non-zeros of the factor L (below the diagonal). */
  factorNonZeros: number;
}

/** Lazy binary min-heap on (key, item) pairs; stale entries are skipped by the caller. */
class MinHeap {
  private keys: number[] = [];
  private items: number[] = [];
  get size(): number {
    return this.keys.length;
  }
  push(key: number, item: number): void {
    const k = this.keys;
    const it = this.items;
    let i = k.length;
    k.push(key);
    it.push(item);
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (k[p] <= key) break;
      k[i] = k[p];
      it[i] = it[p];
      i = p;
    }
    k[i] = key;
    it[i] = item;
  }
  /** Pop the smallest; returns [key, item]. */
  pop(): [number, number] {
    const k = this.keys;
    const it = this.items;
    const topK = k[0];
    const topI = it[0];
    const lastK = k.pop()!;
    const lastI = it.pop()!;
    const n = k.length;
    if (n > 0) {
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= n) break;
        const r = l + 1;
        const c = r < n && k[r] < k[l] ? r : l;
        if (k[c] >= lastK) break;
        k[i] = k[c];
        it[i] = it[c];
        i = c;
      }
      k[i] = lastK;
      it[i] = lastI;
    }
    return [topK, topI];
  }
}

/**
 * Solve the SPD system A x = b. Inputs are not modified.
 * Returns NaN-free output only for a positive-definite A; callers must make sure every
 * connected part of the graph has a Dirichlet (pressure) contribution on its diagonal.
 * @throws Error("not positive definite") if a pivot is not positive (a caller bug, not user input).
 */
export function solveSpdLdl(system: SymmetricSystem, b: Float64Array): LdlResult {
  const { n } = system;
  const adj: Map<number, number>[] = new Array(n);
  for (let i = 0; i < n; i++) adj[i] = new Map();
  const d = Float64Array.from(system.diag);
  for (let e = 0; e < system.rows.length; e++) {
    const i = system.rows[e];
    const j = system.cols[e];
    const v = system.values[e];
    adj[i].set(j, (adj[i].get(j) ?? 0) + v);
    adj[j].set(i, (adj[j].get(i) ?? 0) + v);
  }
  const eliminated = new Uint8Array(n);
  const heap = new MinHeap();
  for (let i = 0; i < n; i++) heap.push(adj[i].size, i);

  const order = new Int32Array(n);
  const colStart = new Int32Array(n + 1);
  let lIdx: Int32Array = new Int32Array(Math.max(16, system.rows.length * 2));
  let lVal: Float64Array = new Float64Array(lIdx.length);
  let nnz = 0;
  const nbrIdx: number[] = [];
  const nbrVal: number[] = [];

  for (let step = 0; step < n; step++) {
    let p = -1;
    while (heap.size > 0) {
      const [deg, item] = heap.pop();
      if (eliminated[item] || deg !== adj[item].size) continue;
      p = item;
      break;
    }
    if (p < 0) throw new Error("elimination order exhausted early");
    eliminated[p] = 1;
    order[step] = p;
    const pivot = d[p];
    if (!(pivot > 0)) throw new Error("not positive definite");
    nbrIdx.length = 0;
    nbrVal.length = 0;
    for (const [j, v] of adj[p]) {
      nbrIdx.push(j);
      nbrVal.push(v);
    }
    const m = nbrIdx.length;
    if (nnz + m > lIdx.length) {
      const grow = Math.max(lIdx.length * 2, nnz + m);
      const ni = new Int32Array(grow);
      ni.set(lIdx);
      lIdx = ni;
      const nv = new Float64Array(grow);
      nv.set(lVal);
      lVal = nv;
    }
    colStart[step] = nnz;
    for (let a = 0; a < m; a++) {
      const i = nbrIdx[a];
      const aip = nbrVal[a];
      lIdx[nnz] = i;
      lVal[nnz] = aip / pivot;
      nnz++;
      const row = adj[i];
      row.delete(p);
      // Schur complement: A_ij −= A_ip A_pj / A_pp (this is where fill appears).
      d[i] -= (aip * aip) / pivot;
      for (let c = a + 1; c < m; c++) {
        const j = nbrIdx[c];
        const upd = (aip * nbrVal[c]) / pivot;
        const cur = row.get(j);
        if (cur === undefined) {
          row.set(j, -upd);
          adj[j].set(i, -upd);
        } else {
          row.set(j, cur - upd);
          adj[j].set(i, cur - upd);
        }
      }
    }
    for (let a = 0; a < m; a++) heap.push(adj[nbrIdx[a]].size, nbrIdx[a]);
    adj[p] = new Map();
    d[p] = pivot;
  }
  colStart[n] = nnz;

  // Forward substitution with unit L, then the diagonal, then backward with Lᵀ.
  const y = Float64Array.from(b);
  for (let step = 0; step < n; step++) {
    const p = order[step];
    const yp = y[p];
    if (yp === 0) continue;
    for (let k = colStart[step]; k < colStart[step + 1]; k++) y[lIdx[k]] -= lVal[k] * yp;
  }
  for (let i = 0; i < n; i++) y[i] /= d[i];
  for (let step = n - 1; step >= 0; step--) {
    const p = order[step];
    let s = y[p];
    for (let k = colStart[step]; k < colStart[step + 1]; k++) s -= lVal[k] * y[lIdx[k]];
    y[p] = s;
  }
  return { x: y, factorNonZeros: nnz };
}

/** ‖A x − b‖₂ / ‖b‖₂ (or ‖A x‖ when b = 0), for the diagnostics. */
export function relativeResidual(system: SymmetricSystem, x: Float64Array, b: Float64Array): number {
  const r = new Float64Array(system.n);
  for (let i = 0; i < system.n; i++) r[i] = system.diag[i] * x[i] - b[i];
  for (let e = 0; e < system.rows.length; e++) {
    const i = system.rows[e];
    const j = system.cols[e];
    const v = system.values[e];
    r[i] += v * x[j];
    r[j] += v * x[i];
  }
  let rn = 0;
  let bn = 0;
  for (let i = 0; i < system.n; i++) {
    rn += r[i] * r[i];
    bn += b[i] * b[i];
  }
  return bn > 0 ? Math.sqrt(rn / bn) : Math.sqrt(rn);
}
