/**
 * The network builder's internal stores: pieces kept in typed arrays come back with exactly the values put in
 * (IEEE doubles stored in a Float64Array are exact, ECMA-262 §25.1), and segment ends shared at a node only when
 * their coordinates are exactly those drawn (the expected values are the DXF text's own numbers).
 */
import { describe, expect, it } from "vitest";
import type { ArcPiece, LinePiece } from "@/lib/dxf/types";
import { extractNetwork } from "@/lib/network/extract";
import { PieceStore, WidthProfiles } from "@/lib/network/piece-store";

describe("PieceStore", () => {
  const line: LinePiece = { kind: "line", x0: -0, y0: 0.1 + 0.2, x1: 1e300, y1: -5e-324, w0: 3.25, w1: null };
  const arc: ArcPiece = { kind: "arc", cx: 12.5, cy: -7, r: Math.PI, a0: -Math.PI / 3, sweep: -1.25, w0: null, w1: 0 };

  it("returns pieces, lengths, layers, sources and curve radii exactly, past its first capacity", () => {
    const s = new PieceStore(1);
    for (let k = 0; k < 40; k++) s.push(k % 2 ? arc : line, k + 0.5, k % 3, k % 5, 1000 + k, k % 4 === 0 ? null : k / 7);
    expect(s.n).toBe(40);
    // No row has a width profile: the profile columns are never made (centreline layouts do not pay for them).
    expect([s.prof1.length, s.ps0.length, s.ps1.length, s.profileOf(7)]).toEqual([0, 0, 0, -1]);
    for (let k = 0; k < 40; k++) {
      const p = s.piece(k);
      expect(p).toEqual(k % 2 ? arc : line);
      if (!(k % 2)) expect(Object.is((p as LinePiece).x0, -0)).toBe(true);
      expect(s.len[k]).toBe(k + 0.5);
      expect(s.layer[k]).toBe(k % 3);
      expect(s.type[k]).toBe(k % 5);
      expect(s.src[k]).toBe(1000 + k);
      expect(s.curveRadius(k)).toBe(k % 4 === 0 ? null : k / 7);
    }
  });

  it("copies rows unchanged and parts with new geometry but the same layer, source and curve radius", () => {
    const a = new PieceStore(2);
    a.push(line, 2, 1, 2, 3, null);
    a.push(arc, 4, 5, 6, 7, 0.5);
    const b = new PieceStore(1);
    b.pushRow(a, 1);
    b.pushPart(a, 0, arc, 9);
    b.pushPart(a, 1, line, 8);
    expect(b.piece(0)).toEqual(arc);
    expect([b.len[0], b.layer[0], b.src[0], b.curveRadius(0)]).toEqual([4, 5, 7, 0.5]);
    expect(b.piece(1)).toEqual(arc);
    expect([b.len[1], b.layer[1], b.type[1], b.src[1], b.curveRadius(1)]).toEqual([9, 1, 2, 3, null]);
    expect(b.piece(2)).toEqual(line);
    expect([b.len[2], b.layer[2], b.type[2], b.src[2], b.curveRadius(2)]).toEqual([8, 5, 6, 7, 0.5]);
  });
});

describe("width profiles along straight pieces", () => {
  // A profile 0–10 long, widths 4 → 2 → 2 → 6 (linear between points; the expected values are that arithmetic).
  const table = () => {
    const t = new WidthProfiles();
    t.add(Float64Array.from([0, 2, 8, 10]), Float64Array.from([4, 2, 2, 6]));
    return t;
  };

  it("gives widths between its points and its points between two positions, in either direction", () => {
    const t = table();
    expect([t.widthAt(0, 0), t.widthAt(0, 1), t.widthAt(0, 5), t.widthAt(0, 9), t.widthAt(0, 10), t.widthAt(0, 12)]).toEqual([4, 3, 2, 4, 6, 6]);
    const f: number[] = [], w: number[] = [];
    expect(t.pointsBetween(0, 1, 9, f, w)).toBe(2);
    expect(f).toEqual([1 / 8, 7 / 8]);
    expect(w).toEqual([2, 2]);
    // Written from the start of the scratch arrays again (not appended).
    expect(t.pointsBetween(0, 10, 0, f, w)).toBe(2);
    expect(f).toEqual([0.2, 0.8]);
    expect(w).toEqual([2, 2]);
    expect(t.pointsBetween(0, 2, 8, f, w)).toBe(0);
  });

  it("a part of a profiled line keeps the profile over its own stretch, with the widths there at its ends", () => {
    const a = new PieceStore(1, table());
    a.pushProfiled(0, 0, 10, 0, 0, 0, 0, null, 0, 0, 10);
    expect([a.drawnW0(0), a.drawnW1(0)]).toEqual([4, 6]);
    const b = new PieceStore(1, a.profiles);
    b.pushPart(a, 0, { kind: "line", x0: 1, y0: 0, x1: 9, y1: 0, w0: 3.5, w1: 5.5 }, 8);
    b.pushRow(a, 0);
    expect([b.ps0[0], b.ps1[0], b.drawnW0(0), b.drawnW1(0)]).toEqual([1, 9, 3, 4]);
    expect([b.prof1[1], b.ps0[1], b.ps1[1]]).toEqual([1, 0, 10]);
    // Rows stored before the first profiled one, and plain rows after it, have none.
    const c = new PieceStore(1, a.profiles);
    c.push({ kind: "line", x0: 0, y0: 0, x1: 1, y1: 0, w0: 1, w1: 1 }, 1, 0, 0, 0, null);
    for (let k = 0; k < 20; k++) c.pushRow(a, 0);
    c.push({ kind: "line", x0: 0, y0: 0, x1: 1, y1: 0, w0: 1, w1: 1 }, 1, 0, 0, 0, null);
    expect([c.profileOf(0), c.profileOf(1), c.profileOf(20), c.profileOf(21)]).toEqual([-1, 0, 0, -1]);
    expect([c.ps0[20], c.ps1[20]]).toEqual([0, 10]);
  });

  it("an outline channel's segment carries the widths from its centreline's profile, not a straight line between its ends", () => {
    // A 2000 µm channel 100 µm wide with a 200 µm wide, 400 µm long chamber in its middle (µm), drawn as one closed
    // outline; ports at the two ends. Plane geometry: the segment's widest point is the chamber's 200 µm and its
    // narrowest the channel's 100 µm, and the mean width lies between them.
    const pts = [[0, -50], [800, -50], [800, -100], [1200, -100], [1200, -50], [2000, -50], [2000, 50], [1200, 50], [1200, 100], [800, 100], [800, 50], [0, 50]];
    const lw = ["0", "LWPOLYLINE", "8", "FLOW", "90", String(pts.length), "70", "1", ...pts.flatMap(([x, y]) => ["10", String(x), "20", String(y)])];
    const port = (x: number) => ["0", "CIRCLE", "8", "PORTS", "10", String(x), "20", "0", "30", "0", "40", "100"];
    const dxf = [...["0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "13", "0", "ENDSEC", "0", "SECTION", "2", "ENTITIES"], ...lw, ...port(0), ...port(2000), ...["0", "ENDSEC", "0", "EOF"]].join("\n");
    const net = extractNetwork(dxf, { layers: { FLOW: { role: "channel", depth: "50 um" }, PORTS: { role: "port" } } });
    expect(net.segments).toHaveLength(1);
    const s = net.segments[0];
    expect(s.maxWidthM! / 200e-6).toBeCloseTo(1, 2);
    expect(s.minWidthM! / 100e-6).toBeCloseTo(1, 2);
    expect(s.widthProfile!.sM.length).toBeGreaterThan(4);
    expect(s.widthM).toBeGreaterThan(100e-6);
    expect(s.widthM).toBeLessThan(200e-6);
  });
});

describe("segment ends at a node", () => {
  // A T junction at (1000, 0) µm: two ends drawn exactly there, one 0.1 nm off (within the 0.5 µm snap).
  const entity = (x0: number, y0: number, x1: number, y1: number) => ["0", "LINE", "8", "FLOW", "10", String(x0), "20", String(y0), "30", "0", "11", String(x1), "21", String(y1), "31", "0"];
  const port = (x: number, y: number) => ["0", "CIRCLE", "8", "PORTS", "10", String(x), "20", String(y), "30", "0", "40", "50"];
  const text = [
    ...["0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "13", "0", "ENDSEC", "0", "SECTION", "2", "ENTITIES"],
    ...entity(0, 0, 1000, 0),
    ...entity(1000.0001, 0, 2000, 0),
    ...entity(1000, 0, 1000, 1000),
    ...port(0, 0),
    ...port(2000, 0),
    ...port(1000, 1000),
    ...["0", "ENDSEC", "0", "EOF"],
  ].join("\n");
  const net = extractNetwork(text, { layers: { FLOW: { role: "channel", width: "100 um", depth: "50 um" }, PORTS: { role: "port" } } });
  const umToM = 1e-6;

  it("keep the coordinates drawn, shared only where they are exactly equal", () => {
    expect(net.segments).toHaveLength(3);
    const junctionEnds = net.segments.map((s) => s.path[s.path.length - 1]);
    const exact = junctionEnds.filter((p) => p[0] === 1000 * umToM);
    const off = junctionEnds.filter((p) => p[0] === 1000.0001 * umToM);
    expect(exact).toHaveLength(2);
    expect(off).toHaveLength(1);
    expect(exact[0]).toEqual([1000 * umToM, 0]);
    expect(off[0]).toEqual([1000.0001 * umToM, 0]);
    expect(exact[0]).toBe(exact[1]);
    expect(off[0]).not.toBe(exact[0]);
  });
});
