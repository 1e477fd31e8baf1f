/**
 * Hydraulics benchmark (printed figures, never asserted):
 * 1. a 100,000-segment droplet-nozzle array: Stokeline's sparse LDLᵀ vs SciPy's spsolve on the same system;
 * 2. mathjs's sparse lusolve on the same system (why the engine has its own solver);
 * 3. the full hydraulics + rules on a 10,000-segment chip.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { create, all } from "mathjs";
import type { ChannelNetwork, NetworkNode, NetworkSegment } from "../lib/network/types";
import type { Conditions } from "../lib/analysis/conditions";
import { solveSpdLdl, relativeResidual, type SymmetricSystem } from "../lib/hydraulics/sparse-ldl";
import { solveHydraulics } from "../lib/hydraulics/solve-hydraulics";
import { evaluateFlags } from "../lib/rules";

/**
 * A parallel array of droplet nozzles: a supply rail and a collector rail joined by `n` nozzles, each a
 * narrow orifice then a wider channel (4 segments per nozzle pitch: 2 rail pieces, orifice, channel).
 */
export function nozzleArray(n: number): ChannelNetwork {
  const nodes: NetworkNode[] = [];
  const segments: NetworkSegment[] = [];
  const pitch = 200e-6;
  const node = (id: string, x: number, y: number, port: string | null = null) => nodes.push({ id, xM: x, yM: y, kind: port ? "port" : "junction", port });
  const seg = (id: string, from: string, to: string, lengthM: number, widthM: number, depthM: number, a: [number, number], b: [number, number]) =>
    segments.push({ id, layer: "CHANNELS", from, to, lengthM, widthM, endWidthM: widthM, depthM, section: "rectangular", minBendRadiusM: null, path: [a, b] });
  for (let k = 0; k < n; k++) {
    const x = k * pitch;
    node(`s${k}`, x, 2e-3, k === 0 ? "IN" : null);
    node(`m${k}`, x, 1e-3);
    node(`c${k}`, x, 0, k === n - 1 ? "OUT" : null);
    // Orifices vary slightly along the array, as fabricated ones do.
    seg(`o${k}`, `s${k}`, `m${k}`, 1e-3, 20e-6 * (1 + 0.1 * Math.sin(k)), 25e-6, [x, 2e-3], [x, 1e-3]);
    seg(`n${k}`, `m${k}`, `c${k}`, 1e-3, 60e-6, 25e-6, [x, 1e-3], [x, 0]);
    if (k > 0) {
      seg(`rs${k}`, `s${k - 1}`, `s${k}`, pitch, 150e-6, 25e-6, [x - pitch, 2e-3], [x, 2e-3]);
      seg(`rc${k}`, `c${k - 1}`, `c${k}`, pitch, 150e-6, 25e-6, [x - pitch, 0], [x, 0]);
    }
  }
  const ports = [
    { name: "IN", node: "s0", xM: 0, yM: 2e-3, radiusM: 50e-6 },
    { name: "OUT", node: `c${n - 1}`, xM: (n - 1) * pitch, yM: 0, radiusM: 50e-6 },
  ];
  return {
    units: { drawing: "um", source: "conditions", metresPerUnit: 1e-6 },
    nodes,
    segments,
    ports,
    warnings: [],
    layers: [],
    outline: [],
    bounds: { minXM: 0, minYM: 0, maxXM: (n - 1) * pitch, maxYM: 2e-3 },
    mappingProposed: false,
  };
}

/** The reduced Kirchhoff system of a network with its port pressures fixed, as the engine assembles it. */
function kirchhoffSystem(net: ChannelNetwork, conductance: Float64Array, fixed: Map<string, number>): { system: SymmetricSystem; rhs: Float64Array } {
  const index = new Map<string, number>();
  for (const nd of net.nodes) if (!fixed.has(nd.id)) index.set(nd.id, index.size);
  const m = index.size;
  const diag = new Float64Array(m);
  const rhs = new Float64Array(m);
  const rows: number[] = [];
  const cols: number[] = [];
  const vals: number[] = [];
  net.segments.forEach((s, k) => {
    const g = conductance[k];
    const a = index.get(s.from);
    const b = index.get(s.to);
    if (a !== undefined) diag[a] += g;
    if (b !== undefined) diag[b] += g;
    if (a !== undefined && b !== undefined) {
      rows.push(a);
      cols.push(b);
      vals.push(-g);
    } else if (a !== undefined) rhs[a] += g * fixed.get(s.to)!;
    else if (b !== undefined) rhs[b] += g * fixed.get(s.from)!;
  });
  return { system: { n: m, diag, rows: Int32Array.from(rows), cols: Int32Array.from(cols), values: Float64Array.from(vals) }, rhs };
}

function time<T>(f: () => T, repeats = 3): { ms: number; value: T } {
  let best = Infinity;
  let value!: T;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    value = f();
    best = Math.min(best, performance.now() - t0);
  }
  return { ms: best, value };
}

const SCIPY_SCRIPT = `
import sys, time, numpy as np, scipy.sparse as sp
from scipy.sparse.linalg import spsolve
d = sys.argv[1]
n = int(open(d + "/n").read())
diag = np.fromfile(d + "/diag.bin"); rows = np.fromfile(d + "/rows.bin", dtype=np.int32); cols = np.fromfile(d + "/cols.bin", dtype=np.int32)
vals = np.fromfile(d + "/vals.bin"); rhs = np.fromfile(d + "/rhs.bin")
r = np.concatenate([np.arange(n), rows, cols]); c = np.concatenate([np.arange(n), cols, rows]); v = np.concatenate([diag, vals, vals])
A = sp.csc_matrix((v, (r, c)), shape=(n, n))
best = 1e9
for _ in range(3):
    t0 = time.perf_counter(); x = spsolve(A, rhs); best = min(best, time.perf_counter() - t0)
x.tofile(d + "/x.bin")
print(best * 1000)
`;

const CONDITIONS: Conditions = { fluid: { preset: "water", temperature: "25 degC" }, ports: { IN: { pressure: "500 mbar" }, OUT: { pressure: "0 Pa" } } } as Conditions;

export async function run(): Promise<void> {
  // 1. 100,000 segments.
  const nozzles = 25_001;
  const big = nozzleArray(nozzles);
  console.log(`nozzle array: ${big.segments.length} segments, ${big.nodes.length} nodes`);
  const full = time(() => solveHydraulics(big, CONDITIONS), 2);
  console.log(`solveHydraulics (sections + assembly + solve + groups + totals): ${full.ms.toFixed(0)} ms; residual ${full.value.diagnostics.residualRel.toExponential(2)}`);
  const g = Float64Array.from(full.value.segments, (s) => 1 / s.resistancePaSPerM3);
  const { system, rhs } = kirchhoffSystem(big, g, new Map([["s0", 5e4], [`c${nozzles - 1}`, 0]]));
  const ours = time(() => solveSpdLdl(system, rhs), 3);
  console.log(`Stokeline sparse LDLᵀ on the ${system.n}-unknown system: ${ours.ms.toFixed(1)} ms (factor non-zeros ${ours.value.factorNonZeros}, residual ${relativeResidual(system, ours.value.x, rhs).toExponential(2)})`);

  if (existsSync("/usr/bin/python3")) {
    const dir = mkdtempSync(join(tmpdir(), "stokeline-bench-"));
    try {
      writeFileSync(join(dir, "n"), String(system.n));
      writeFileSync(join(dir, "diag.bin"), Buffer.from(system.diag.buffer));
      writeFileSync(join(dir, "rows.bin"), Buffer.from(system.rows.buffer));
      writeFileSync(join(dir, "cols.bin"), Buffer.from(system.cols.buffer));
      writeFileSync(join(dir, "vals.bin"), Buffer.from(system.values.buffer));
      writeFileSync(join(dir, "rhs.bin"), Buffer.from(rhs.buffer));
      writeFileSync(join(dir, "solve.py"), SCIPY_SCRIPT);
      const out = execFileSync("/usr/bin/python3", [join(dir, "solve.py"), dir], { encoding: "utf8" });
      const scipyMs = Number(out.trim().split("\n").at(-1));
      const { readFileSync } = await import("node:fs");
      const xs = new Float64Array(readFileSync(join(dir, "x.bin")).buffer.slice(0));
      let worst = 0;
      let scale = 0;
      for (let i = 0; i < xs.length; i++) {
        worst = Math.max(worst, Math.abs(xs[i] - ours.value.x[i]));
        scale = Math.max(scale, Math.abs(xs[i]));
      }
      console.log(`SciPy spsolve (SuperLU) on the same system: ${scipyMs.toFixed(1)} ms`);
      console.log(`ratio Stokeline / SciPy: ${(ours.ms / scipyMs).toFixed(2)} (target ≤ 2); largest difference ${(worst / scale).toExponential(2)} of the largest pressure`);
    } catch (e) {
      console.log(`SciPy comparison skipped: ${(e as Error).message.split("\n")[0]}`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  } else {
    console.log("SciPy comparison skipped: /usr/bin/python3 not found");
  }

  // 2. mathjs sparse lusolve (LU with partial pivoting) on the same 100,000-segment system, from its CCS arrays.
  {
    const math = create(all, {});
    const colsOf: Map<number, number>[] = Array.from({ length: system.n }, () => new Map());
    for (let i = 0; i < system.n; i++) colsOf[i].set(i, system.diag[i]);
    for (let e = 0; e < system.rows.length; e++) {
      colsOf[system.cols[e]].set(system.rows[e], system.values[e]);
      colsOf[system.rows[e]].set(system.cols[e], system.values[e]);
    }
    const values: number[] = [];
    const index: number[] = [];
    const ptr: number[] = [0];
    for (const col of colsOf) {
      for (const [r, v] of [...col.entries()].sort((x, y) => x[0] - y[0])) {
        index.push(r);
        values.push(v);
      }
      ptr.push(index.length);
    }
    // mathjs builds a SparseMatrix from its CCS arrays; the constructor is not in its public typings.
    const SparseMatrixCtor = (math as unknown as { SparseMatrix: new (data: unknown) => ReturnType<typeof math.sparse> }).SparseMatrix;
    const A = new SparseMatrixCtor({ values, index, ptr, size: [system.n, system.n] });
    const bm = math.matrix(Array.from(rhs, (v) => [v]));
    const tm = time(() => math.lusolve(A, bm), 1);
    console.log(`mathjs sparse lusolve on the same system: ${tm.ms.toFixed(0)} ms (${(tm.ms / ours.ms).toFixed(0)}× the LDLᵀ)`);
  }

  // 3. Full analysis of a 10,000-segment chip: hydraulics + every rule (PDMS process, cells, pump limit).
  const chip = nozzleArray(2_501);
  const cond = { ...CONDITIONS, process: "pdms_soft_lithography", cells: true, pump: { max_pressure: "2 bar" } } as Conditions;
  const t = time(() => {
    const h = solveHydraulics(chip, cond);
    return evaluateFlags(chip, h, cond);
  }, 3);
  console.log(`hydraulics + rules, ${chip.segments.length} segments: ${t.ms.toFixed(0)} ms (${t.value.length} flags; target well under 1000 ms)`);
}
