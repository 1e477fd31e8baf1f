/**
 * Layout reader speed and memory: a synthetic chip of more than 20,000 channel
 * entities (a grid network of LINEs with bulged LWPOLYLINE rungs, ports at the
 * corners), generated here as DXF text. Times the whole geometry path
 * (extractNetwork: parse + blocks + topology + segments) against the bare
 * dxf-parser parse of the same text, and the heap the result holds against the
 * file size. Targets (issue 3): ratio ≤ 1.5×, heap < 10× the file.
 */
import { PerformanceObserver, type PerformanceEntry } from "node:perf_hooks";
import v8 from "node:v8";
import os from "node:os";
import vm from "node:vm";
import DxfParser from "dxf-parser";
import { extractNetwork } from "../lib/network/extract";

// A collectable heap for the memory figure, without a command-line flag.
v8.setFlagsFromString("--expose-gc");
const gc = vm.runInNewContext("gc") as () => void;

const PITCH_UM = 400;
/** Timed runs of each side; medians of this many. */
const RUNS = 15;

/** DXF text of an n × n grid network: 2·n·(n−1) channel entities plus four port circles. */
export function syntheticGridDxf(n: number): { text: string; entities: number } {
  const out: string[] = ["0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "13", "0", "ENDSEC", "0", "SECTION", "2", "ENTITIES"];
  let entities = 0;
  const line = (x0: number, y0: number, x1: number, y1: number) => {
    out.push("0", "LINE", "8", "FLOW", "10", String(x0), "20", String(y0), "30", "0", "11", String(x1), "21", String(y1), "31", "0");
    entities++;
  };
  const bulged = (x0: number, y0: number, x1: number, y1: number) => {
    out.push("0", "LWPOLYLINE", "8", "FLOW", "90", "2", "70", "0", "10", String(x0), "20", String(y0), "42", "0.15", "10", String(x1), "20", String(y1));
    entities++;
  };
  for (let i = 0; i < n; i++) {
    for (let j = 0; j + 1 < n; j++) {
      line(j * PITCH_UM, i * PITCH_UM, (j + 1) * PITCH_UM, i * PITCH_UM);
      if ((i + j) % 4 === 0) bulged(i * PITCH_UM, j * PITCH_UM, i * PITCH_UM, (j + 1) * PITCH_UM);
      else line(i * PITCH_UM, j * PITCH_UM, i * PITCH_UM, (j + 1) * PITCH_UM);
    }
  }
  const far = (n - 1) * PITCH_UM;
  for (const [x, y] of [[0, 0], [far, 0], [0, far], [far, far]]) out.push("0", "CIRCLE", "8", "PORTS", "10", String(x), "20", String(y), "30", "0", "40", "150");
  out.push("0", "ENDSEC", "0", "EOF");
  return { text: out.join("\n") + "\n", entities };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export async function run(): Promise<void> {
  const { text, entities } = syntheticGridDxf(102);
  const conditions = { layers: { FLOW: { role: "channel" as const, width: "100 um", depth: "50 um" }, PORTS: { role: "port" as const } } };
  const bytes = new TextEncoder().encode(text);
  const fileMiB = bytes.byteLength / 1048576;

  // Warm up both paths (JIT), then alternate them so machine load falls on both alike.
  new DxfParser().parseSync(text);
  const net = extractNetwork(bytes, conditions);
  const parseMs: number[] = [];
  const extractMs: number[] = [];
  const stageMs = new Map<string, number[]>();
  // Garbage-collector pauses, for the figures only: entries are delivered after the loop, then matched to each run's time span.
  const gcEntries: PerformanceEntry[] = [];
  const gcObserver = new PerformanceObserver((list) => gcEntries.push(...list.getEntries()));
  gcObserver.observe({ entryTypes: ["gc"] });
  const parseSpans: [number, number][] = [];
  const extractSpans: [number, number][] = [];
  for (let k = 0; k < RUNS; k++) {
    let t0 = performance.now();
    new DxfParser().parseSync(text);
    parseMs.push(performance.now() - t0);
    parseSpans.push([t0, performance.now()]);
    t0 = performance.now();
    let prev = t0;
    extractNetwork(bytes, conditions, {
      onStage: (stage) => {
        const t = performance.now();
        (stageMs.get(stage) ?? stageMs.set(stage, []).get(stage)!).push(t - prev);
        prev = t;
      },
    });
    extractMs.push(performance.now() - t0);
    extractSpans.push([t0, performance.now()]);
  }
  await new Promise((resolve) => setTimeout(resolve, 20));
  gcObserver.disconnect();
  const gcIn = ([a, b]: [number, number]) => gcEntries.filter((g) => g.startTime >= a && g.startTime < b).reduce((sum, g) => sum + g.duration, 0);

  // Memory: heap retained by the result, and the largest heap seen during one extract, sampled at every stage end and
  // inside the long stages (every 1,024 entities read, every 1,024 segments built). Once as the process holds it
  // (collected garbage or not), once with a full collection before each sample (the live heap); beside them, what the
  // bare parse alone holds (its result is the DXF object).
  gc();
  const parseBefore = process.memoryUsage().heapUsed;
  const parsed = new DxfParser().parseSync(text);
  const parseHeldMiB = (process.memoryUsage().heapUsed - parseBefore) / 1048576;
  if (!parsed) console.log("warning: bare parse returned nothing");
  // Typed arrays keep their contents outside the JavaScript heap (ArrayBuffer backing stores): counted beside it.
  const peakOf = (collect: boolean) => {
    gc();
    const m0 = process.memoryUsage();
    const before = m0.heapUsed;
    const beforeAll = m0.heapUsed + m0.arrayBuffers;
    let peak = before;
    let peakAll = beforeAll;
    let samples = 0;
    const sample = () => {
      if (collect) gc();
      samples++;
      const m = process.memoryUsage();
      peak = Math.max(peak, m.heapUsed);
      peakAll = Math.max(peakAll, m.heapUsed + m.arrayBuffers);
    };
    const result = extractNetwork(bytes, conditions, { onStage: sample, onSample: sample });
    gc();
    return { peakMiB: (peak - before) / 1048576, peakAllMiB: (peakAll - beforeAll) / 1048576, retainedMiB: (process.memoryUsage().heapUsed - before) / 1048576, samples, result };
  };
  const held = peakOf(false);
  const live = peakOf(true);
  const kept = live.result;
  const retainedMiB = live.retainedMiB;

  const p = median(parseMs);
  const e = median(extractMs);
  console.log(`synthetic grid: ${entities.toLocaleString("en")} channel entities, ${fileMiB.toFixed(2)} MiB of DXF text`);
  console.log(`network: ${net.segments.length.toLocaleString("en")} segments, ${net.nodes.length.toLocaleString("en")} nodes, ${net.ports.length} ports`);
  console.log(`bare dxf-parser parse : ${p.toFixed(0)} ms (median of ${RUNS}; best ${Math.min(...parseMs).toFixed(0)})`);
  console.log(`whole extract path    : ${e.toFixed(0)} ms (median of ${RUNS}; best ${Math.min(...extractMs).toFixed(0)})`);
  console.log(`ratio extract / parse : ${(e / p).toFixed(2)}× (target ≤ 1.5×)`);
  const ownParse = [...stageMs].filter(([s]) => s.startsWith("dxf-parser parse")).reduce<number[]>((acc, [, ms]) => ms.map((v, k) => v + (acc[k] ?? 0)), []);
  const rest = extractMs.map((ms, k) => ms - (ownParse[k] ?? 0));
  console.log(`whole path minus its own dxf-parser stage (HEADER and BLOCKS; ENTITIES are read by our scanner): ${median(rest).toFixed(0)} ms median = ${(median(rest) / p).toFixed(2)}× the bare parse`);
  console.log(`garbage-collector pauses per run (median): bare parse ${median(parseSpans.map(gcIn)).toFixed(1)} ms, whole extract path ${median(extractSpans.map(gcIn)).toFixed(1)} ms`);
  console.log(`load average (1, 5, 15 min): ${os.loadavg().map((l) => l.toFixed(2)).join(", ")} on ${os.cpus().length} cores`);
  console.log("stages (median ms):");
  for (const [stage, ms] of stageMs) console.log(`  ${median(ms).toFixed(1).padStart(7)}  ${stage}`);
  console.log(`heap retained by the network: ${retainedMiB.toFixed(1)} MiB = ${(retainedMiB / fileMiB).toFixed(1)}× the file`);
  console.log(`heap peak during one extract, live (full collection before each of ${live.samples} samples at stage ends and every 1,024 entities/segments): ${live.peakMiB.toFixed(1)} MiB = ${(live.peakMiB / fileMiB).toFixed(1)}× the file`);
  console.log(`heap + ArrayBuffer memory (typed arrays), peak during one extract, live (same samples): ${live.peakAllMiB.toFixed(1)} MiB = ${(live.peakAllMiB / fileMiB).toFixed(1)}× the file (target < 10×)`);
  console.log(`heap peak during one extract, as held (same ${held.samples} samples, no forced collection: includes garbage not yet collected): ${held.peakMiB.toFixed(1)} MiB = ${(held.peakMiB / fileMiB).toFixed(1)}× the file`);
  console.log(`for scale, heap right after a bare dxf-parser parse (before any collection): ${parseHeldMiB.toFixed(1)} MiB = ${(parseHeldMiB / fileMiB).toFixed(1)}× the file`);
  if (kept.segments.length !== net.segments.length) console.log("warning: runs disagree");
}
