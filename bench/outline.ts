/**
 * Outline reader speed: the same invented grid chip (n × n junctions at 400 µm
 * pitch, 50 µm channels, 2·n·(n−1) ≥ 2,000 channels, ports at the corners)
 * drawn once as centreline LINEs and once as its filled mask (one outer
 * square with (n−1)² square holes), both through extractNetwork. Prints both
 * times, the ratio (target under 3×, issue 9) and the segment counts.
 * Printed, never asserted: the cold first run, the median of the next 15, and,
 * after 15 more (JIT warmed), the medians of 31 and the median of their 31
 * paired ratios (each outline run over the centreline run just before it: on
 * this shared machine the speed drifts between runs, and a pair sees one
 * state). Export: run().
 */
import { readDxf } from "../lib/dxf/read";
import type { CircleEntity, PathEntity } from "../lib/dxf/types";
import { extractNetwork } from "../lib/network/extract";
import { extractMedialAxis } from "../lib/outline/medial-axis";
import { ringsOf } from "../lib/outline/read";

const PITCH_UM = 400;
const WIDTH_UM = 50;
const PORT_R_UM = 150;

function header(): string[] {
  return ["0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "13", "0", "ENDSEC", "0", "SECTION", "2", "ENTITIES"];
}

function ports(out: string[], n: number) {
  const far = (n - 1) * PITCH_UM;
  for (const [x, y] of [[0, 0], [far, 0], [0, far], [far, far]]) out.push("0", "CIRCLE", "8", "PORTS", "10", String(x), "20", String(y), "30", "0", "40", String(PORT_R_UM));
  out.push("0", "ENDSEC", "0", "EOF");
}

/** Centreline grid: one LINE per channel. */
export function gridCentrelines(n: number): string {
  const out = header();
  const line = (x0: number, y0: number, x1: number, y1: number) => out.push("0", "LINE", "8", "FLOW", "10", String(x0), "20", String(y0), "30", "0", "11", String(x1), "21", String(y1), "31", "0");
  for (let i = 0; i < n; i++)
    for (let j = 0; j + 1 < n; j++) {
      line(j * PITCH_UM, i * PITCH_UM, (j + 1) * PITCH_UM, i * PITCH_UM);
      line(i * PITCH_UM, j * PITCH_UM, i * PITCH_UM, (j + 1) * PITCH_UM);
    }
  ports(out, n);
  return out.join("\n") + "\n";
}

/** The same grid as a mask: the outer square grown by half a width, each cell's opening a square hole. */
export function gridOutline(n: number): string {
  const out = header();
  const rect = (x0: number, y0: number, x1: number, y1: number) =>
    out.push("0", "LWPOLYLINE", "8", "FLOW", "90", "4", "70", "1", "10", String(x0), "20", String(y0), "10", String(x1), "20", String(y0), "10", String(x1), "20", String(y1), "10", String(x0), "20", String(y1));
  const h = WIDTH_UM / 2;
  const far = (n - 1) * PITCH_UM;
  rect(-h, -h, far + h, far + h);
  for (let i = 0; i + 1 < n; i++) for (let j = 0; j + 1 < n; j++) rect(i * PITCH_UM + h, j * PITCH_UM + h, (i + 1) * PITCH_UM - h, (j + 1) * PITCH_UM - h);
  ports(out, n);
  return out.join("\n") + "\n";
}

/** Runs per median: on this shared 2-core machine medians of 5 swung the ratio by half (15 as in bench/geometry.ts). */
const RUNS = 15;
/** Runs per median once warm: medians of 15 still swung the ratio by ±20 % from one bench run to the next. */
const WARM_RUNS = 31;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export async function run(): Promise<void> {
  const n = 33;
  const channels = 2 * n * (n - 1);
  const lineText = gridCentrelines(n);
  const maskText = gridOutline(n);
  const lineConditions = { layers: { FLOW: { role: "channel" as const, width: `${WIDTH_UM} um`, depth: "20 um" }, PORTS: { role: "port" as const } } };
  const maskConditions = { layers: { FLOW: { role: "channel" as const, depth: "20 um" }, PORTS: { role: "port" as const } } };
  // Each run keeps only its figures: a network held while the other path runs would be that run's garbage-collector
  // work (it did hold the centreline network through every outline run, and not the other way round).
  const time = (text: string, cond: typeof lineConditions | typeof maskConditions) => {
    const t0 = performance.now();
    const net = extractNetwork(text, cond);
    const ms = performance.now() - t0;
    return { ms, segments: net.segments.length, note: net.warnings.find((w) => w.code === "outline_read")?.message ?? "" };
  };
  // First (cold) run of each, then the median of RUNS alternating runs. The medial axis is a long stretch of code
  // the JIT optimises over several runs, so a second median follows after RUNS more alternating runs per path (a
  // long-lived server's state); both paths get exactly the same runs.
  const first = [time(lineText, lineConditions).ms, time(maskText, maskConditions).ms];
  let lineSegs = 0, maskSegs = 0;
  let note = "";
  const alternate = (runs: number) => {
    const lineMs: number[] = [];
    const maskMs: number[] = [];
    const pairs: number[] = [];
    for (let k = 0; k < runs; k++) {
      const a = time(lineText, lineConditions);
      const b = time(maskText, maskConditions);
      lineMs.push(a.ms);
      maskMs.push(b.ms);
      pairs.push(b.ms / a.ms);
      lineSegs = a.segments;
      maskSegs = b.segments;
      note = b.note;
    }
    return [median(lineMs), median(maskMs), median(pairs)];
  };
  const [l, m] = alternate(RUNS);
  alternate(RUNS);
  const [lw, mw, pw] = alternate(WARM_RUNS);
  console.log(`grid ${n} × ${n}: ${channels} channels; centreline DXF ${(lineText.length / 1048576).toFixed(2)} MiB, outline DXF ${(maskText.length / 1048576).toFixed(2)} MiB`);
  console.log(`first (cold) run: centreline ${first[0].toFixed(0)} ms, outline ${first[1].toFixed(0)} ms`);
  console.log(`centreline path : ${l.toFixed(0)} ms (median of ${RUNS}), ${lineSegs} segments`);
  console.log(`outline path    : ${m.toFixed(0)} ms (median of ${RUNS}), ${maskSegs} segments`);
  console.log(`ratio outline / centreline: ${(m / l).toFixed(2)}× (target < 3×)`);
  console.log(`after ${RUNS} more runs each: centreline ${lw.toFixed(1)} ms, outline ${mw.toFixed(1)} ms (medians of ${WARM_RUNS}), ratio ${(mw / lw).toFixed(2)}×; median of the ${WARM_RUNS} paired ratios ${pw.toFixed(2)}×`);
  console.log(note);

  // The mask's medial axis alone, by each reader: the walls paired (what the outline path above used) and the
  // Voronoi diagram of wall samples (what a mask with chambers, tapers or posts gets), on the same rings.
  const drawing = readDxf(maskText, { chordToleranceM: 1e-7 });
  const rings = ringsOf(drawing.entities.filter((e): e is PathEntity | CircleEntity => e.layer === "FLOW" && e.kind !== "text"));
  const axisMs = (pairedWalls: boolean) => {
    const ts: number[] = [];
    for (let k = 0; k < RUNS; k++) {
      const t0 = performance.now();
      extractMedialAxis(rings, undefined, { pairedWalls });
      ts.push(performance.now() - t0);
    }
    return median(ts);
  };
  axisMs(true);
  axisMs(false);
  const [pa, vo] = [axisMs(true), axisMs(false)];
  console.log(`medial axis alone (median of ${RUNS}, warm): paired walls ${pa.toFixed(1)} ms, Voronoi of wall samples ${vo.toFixed(1)} ms (${(vo / pa).toFixed(1)}× the paired reading)`);
}
