/**
 * Sparse symmetric positive-definite solve, A x = b, by LDLᵀ elimination on the
 * matrix graph in minimum-degree order.
 *
 * Written here instead of using mathjs because mathjs's sparse `lusolve` (LU with
 * partial pivoting) measured ~1.1 s on the 75,000-unknown system of bench/solve.ts's
 * 100,000-segment nozzle array, about 35× SciPy's spsolve (~31 ms) and far outside
 * the 2× target; this LDLᵀ solves the same system in ~20 ms (figures from
 * `npm run bench`, 2-core machine). Channel networks are sparse, nearly planar
 * graphs whose minimum-degree elimination creates little fill, so a direct
 * factorisation is exact to rounding and runs in close to linear time.
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

/**
 * Solve the SPD system A x = b. Inputs are not modified.
 * Returns NaN-free output only for a positive-definite A; callers must make sure every
 * connected part of the graph has a Dirichlet (pressure) contribution on its diagonal.
 * @throws Error("not positive definite") if a pivot is not positive (a caller bug, not user input).
 */
export function solveSpdLdl(system: SymmetricSystem, b: Float64Array): LdlResult {
  const { n } = system;
  // Elimination graph in one pool of (neighbour, value) blocks, one block per node with spare room; a block that
  // fills up moves to the end of the pool at twice the size. Chip graphs have low degree, so linear scans of a
  // block beat hashing, and minimum-degree order keeps fill small.
  const start = new Int32Array(n);
  const len = new Int32Array(n);
  const cap = new Int32Array(n);
  const deg0 = new Int32Array(n);
  for (let e = 0; e < system.rows.length; e++) {
    deg0[system.rows[e]]++;
    deg0[system.cols[e]]++;
  }
  let poolSize = 0;
  for (let i = 0; i < n; i++) {
    start[i] = poolSize;
    cap[i] = deg0[i] + 4;
    poolSize += cap[i];
  }
  let pIdx = new Int32Array(Math.max(16, poolSize * 2));
  let pVal = new Float64Array(pIdx.length);
  const relocate = (i: number) => {
    const newCap = cap[i] * 2;
    if (poolSize + newCap > pIdx.length) {
      const grow = Math.max(pIdx.length * 2, poolSize + newCap);
      const ni = new Int32Array(grow);
      ni.set(pIdx);
      pIdx = ni;
      const nv = new Float64Array(grow);
      nv.set(pVal);
      pVal = nv;
    }
    pIdx.copyWithin(poolSize, start[i], start[i] + len[i]);
    pVal.copyWithin(poolSize, start[i], start[i] + len[i]);
    start[i] = poolSize;
    cap[i] = newCap;
    poolSize += newCap;
  };
  const addTo = (i: number, j: number, v: number) => {
    const s0 = start[i];
    const s1 = s0 + len[i];
    for (let t = s0; t < s1; t++) {
      if (pIdx[t] === j) {
        pVal[t] += v;
        return;
      }
    }
    if (len[i] === cap[i]) relocate(i);
    const t = start[i] + len[i];
    pIdx[t] = j;
    pVal[t] = v;
    len[i]++;
  };
  const d = Float64Array.from(system.diag);
  for (let e = 0; e < system.rows.length; e++) {
    addTo(system.rows[e], system.cols[e], system.values[e]);
    addTo(system.cols[e], system.rows[e], system.values[e]);
  }

  // Degree buckets as doubly linked lists: O(1) moves when a degree changes.
  const head = new Int32Array(n + 1).fill(-1);
  const next = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  const bucketOf = new Int32Array(n);
  const link = (i: number, k: number) => {
    bucketOf[i] = k;
    prev[i] = -1;
    next[i] = head[k];
    if (head[k] >= 0) prev[head[k]] = i;
    head[k] = i;
  };
  const unlink = (i: number) => {
    const k = bucketOf[i];
    if (prev[i] >= 0) next[prev[i]] = next[i];
    else head[k] = next[i];
    if (next[i] >= 0) prev[next[i]] = prev[i];
  };
  for (let i = 0; i < n; i++) link(i, Math.min(len[i], n));
  let minDeg = 0;

  const order = new Int32Array(n);
  const colStart = new Int32Array(n + 1);
  let lIdx: Int32Array = new Int32Array(Math.max(16, system.rows.length * 2));
  let lVal: Float64Array = new Float64Array(lIdx.length);
  let nnz = 0;
  const nb: number[] = [];
  const nv: number[] = [];

  for (let step = 0; step < n; step++) {
    while (minDeg <= n && head[minDeg] < 0) minDeg++;
    if (minDeg > n) throw new Error("elimination order exhausted early");
    const p = head[minDeg];
    unlink(p);
    order[step] = p;
    const pivot = d[p];
    if (!(pivot > 0)) throw new Error("not positive definite");
    const m = len[p];
    nb.length = 0;
    nv.length = 0;
    for (let t = start[p]; t < start[p] + m; t++) {
      nb.push(pIdx[t]);
      nv.push(pVal[t]);
    }
    if (nnz + m > lIdx.length) {
      const grow = Math.max(lIdx.length * 2, nnz + m);
      const ni = new Int32Array(grow);
      ni.set(lIdx);
      lIdx = ni;
      const nvv = new Float64Array(grow);
      nvv.set(lVal);
      lVal = nvv;
    }
    colStart[step] = nnz;
    for (let a = 0; a < m; a++) {
      const i = nb[a];
      const aip = nv[a];
      lIdx[nnz] = i;
      lVal[nnz] = aip / pivot;
      nnz++;
      // Remove p from i's block (swap with the last entry).
      const s0 = start[i];
      const last = s0 + len[i] - 1;
      for (let t = s0; t <= last; t++) {
        if (pIdx[t] === p) {
          pIdx[t] = pIdx[last];
          pVal[t] = pVal[last];
          len[i]--;
          break;
        }
      }
      // Schur complement: A_ij −= A_ip A_pj / A_pp (this is where fill appears).
      d[i] -= (aip * aip) / pivot;
      for (let c = a + 1; c < m; c++) {
        const j = nb[c];
        const upd = -(aip * nv[c]) / pivot;
        addTo(i, j, upd);
        addTo(j, i, upd);
      }
    }
    for (let a = 0; a < m; a++) {
      const i = nb[a];
      const k = Math.min(len[i], n);
      if (k !== bucketOf[i]) {
        unlink(i);
        link(i, k);
      }
      if (k < minDeg) minDeg = k;
    }
    len[p] = 0;
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
