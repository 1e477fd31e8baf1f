import { describe, expect, it } from "vitest";
import { createColourScale, NO_DATA_COLOUR, rampColour, spansDecades } from "@/lib/analysis/colour-scales";

// Reference colours: the scales' published tables as shipped in matplotlib
// (lib/matplotlib/_cm_listed.py, `_viridis_data` and `_cividis_data`, 256 entries),
// read with Debian's python3-matplotlib 3.6.3: `matplotlib.colormaps[name].colors[i]`.
// Viridis: van der Walt & Smith (2015); cividis: Nuñez, Anderton & Renslow, PLoS ONE 13, e0199239 (2018).
const MPL: Record<"viridis" | "cividis", Record<number, [number, number, number]>> = {
  viridis: {
    0: [0.267004, 0.004874, 0.329415],
    64: [0.229739, 0.322361, 0.545706],
    128: [0.127568, 0.566949, 0.550556],
    192: [0.369214, 0.788888, 0.382914],
    255: [0.993248, 0.906157, 0.143936],
  },
  cividis: {
    0: [0.0, 0.135112, 0.304751],
    64: [0.263738, 0.307831, 0.422789],
    128: [0.488697, 0.485318, 0.471008],
    192: [0.736488, 0.680629, 0.424028],
    255: [0.995737, 0.909344, 0.217772],
  },
};

function hexToUnit(hex: string): [number, number, number] {
  const n = Number.parseInt(hex.slice(1), 16);
  return [((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255];
}

// sRGB decoding: IEC 61966-2-1:1999 (piecewise 0.04045 / 12.92 / 2.4 curve).
function linear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

// Relative luminance Y of linear sRGB (D65): IEC 61966-2-1 matrix row 2.
function luminance([r, g, b]: [number, number, number]): number {
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

// CIE 1976 lightness L* from Y/Yn: CIE 15:2004, with the (6/29)^3 linear segment.
function lightness(y: number): number {
  const e = (6 / 29) ** 3;
  const f = y > e ? Math.cbrt(y) : y / (3 * (6 / 29) ** 2) + 4 / 29;
  return 116 * f - 16;
}

function lStar(hex: string): number {
  const [r, g, b] = hexToUnit(hex);
  return lightness(luminance([linear(r), linear(g), linear(b)]));
}

// Simulated dichromat vision: Machado, Oliveira & Fernandes, IEEE TVCG 15, 1291 (2009),
// severity 1.0 matrices on linear RGB (coefficients from memory).
const PROTAN = [
  [0.152286, 1.052583, -0.204868],
  [0.114503, 0.786281, 0.099216],
  [-0.003882, -0.048116, 1.051998],
];
const DEUTAN = [
  [0.367322, 0.860646, -0.227968],
  [0.280085, 0.672501, 0.047413],
  [-0.01182, 0.04294, 0.968881],
];

function simulatedLStar(hex: string, m: number[][]): number {
  const [r, g, b] = hexToUnit(hex).map(linear) as [number, number, number];
  const s = m.map((row) => Math.min(1, Math.max(0, row[0] * r + row[1] * g + row[2] * b))) as [number, number, number];
  return lightness(luminance(s));
}

describe("the lightness helper used by these tests", () => {
  // CIE 15:2004: white is L* = 100, black 0; Y = 0.18 ("18 % grey") is L* ≈ 49.5 (from memory: 49.496).
  it("matches the CIE definition's anchor points", () => {
    expect(lightness(1)).toBeCloseTo(100, 10);
    expect(lightness(0)).toBeCloseTo(0, 10);
    expect(lightness(0.18)).toBeCloseTo(49.496, 2);
  });
});

describe("rampColour", () => {
  // d3's viridis is the 256-entry table sampled at floor(t·256); 8-bit rounding → within 1/255.
  it.each([0, 64, 128, 192, 255])("viridis entry %i matches matplotlib's table", (i) => {
    const t = i === 255 ? 1 : i / 256;
    const got = hexToUnit(rampColour("viridis", t));
    MPL.viridis[i].forEach((ref, k) => expect(Math.abs(got[k] - ref)).toBeLessThanOrEqual(1 / 255 + 1e-9));
  });

  // d3's cividis is a polynomial fit of the table (d3-scale-chromatic docs: "an approximation"); its
  // largest deviation is in the top end's blue channel (0.270 against 0.218), so 0.06 of full scale is allowed.
  it.each([0, 64, 128, 192, 255])("cividis entry %i is within the fit's tolerance of matplotlib's table", (i) => {
    const t = i / 255;
    const got = hexToUnit(rampColour("cividis", t));
    MPL.cividis[i].forEach((ref, k) => expect(Math.abs(got[k] - ref)).toBeLessThanOrEqual(0.06));
  });

  it.each(["viridis", "cividis"] as const)("%s lightness rises monotonically, so it reads in greyscale", (scheme) => {
    const ls = Array.from({ length: 65 }, (_, i) => lStar(rampColour(scheme, i / 64)));
    for (let i = 1; i < ls.length; i++) expect(ls[i]).toBeGreaterThan(ls[i - 1]);
    // A usable greyscale range: the ends differ by more than 60 L* units (common practice for sequential maps).
    expect(ls[64] - ls[0]).toBeGreaterThan(60);
  });

  it.each(["viridis", "cividis"] as const)("%s stays ordered in lightness for protanopes and deuteranopes", (scheme) => {
    for (const m of [PROTAN, DEUTAN]) {
      const ls = Array.from({ length: 33 }, (_, i) => simulatedLStar(rampColour(scheme, i / 32), m));
      for (let i = 1; i < ls.length; i++) expect(ls[i]).toBeGreaterThan(ls[i - 1]);
    }
  });
});

describe("spansDecades", () => {
  // Threshold: more than two decades (max/min > 100) and all positive — common practice, and the
  // same rule lib/analysis/quantities.ts applies.
  it("chooses log only for positive values spanning more than two decades", () => {
    expect(spansDecades([1e-3, 0.5, 1])).toBe(true);
    expect(spansDecades([1, 50, 100])).toBe(false);
    expect(spansDecades([1, 101])).toBe(true);
    expect(spansDecades([0, 1e-3, 10])).toBe(false);
    expect(spansDecades([-5, 1e-3, 10])).toBe(false);
    expect(spansDecades([3])).toBe(false);
    expect(spansDecades([null, undefined, Number.NaN, 1e-6, 1])).toBe(true);
  });
});

describe("createColourScale", () => {
  it("maps a linear quantity by its fraction of the range", () => {
    const s = createColourScale([100, 200, 300]);
    expect(s.kind).toBe("linear");
    expect(s.domain).toEqual([100, 300]);
    expect(s.position(100)).toBe(0);
    expect(s.position(250)).toBeCloseTo(0.75, 12);
    expect(s.position(1000)).toBe(1);
    expect(s.colour(100)).toBe(rampColour("viridis", 0));
    expect(s.colour(300)).toBe(rampColour("viridis", 1));
  });

  // On a log axis the geometric mean of the ends sits halfway (definition of a logarithmic scale).
  it("switches to log for a quantity spanning decades and puts decades evenly", () => {
    const s = createColourScale([1e-4, 3e-2, 1]);
    expect(s.kind).toBe("log");
    expect(s.position(1e-2)).toBeCloseTo(0.5, 12);
    expect(s.position(1e-3)).toBeCloseTo(0.25, 12);
    expect(s.ticks(5)).toEqual(expect.arrayContaining([1e-4, 1e-3, 1e-2, 1e-1, 1]));
  });

  it("keeps a forced log scale usable when zeros are present (clamped low) and honours log: false", () => {
    const s = createColourScale([0, 1e-3, 10], { log: true, scheme: "cividis" });
    expect(s.kind).toBe("log");
    expect(s.domain).toEqual([1e-3, 10]);
    expect(s.position(0)).toBe(0);
    expect(s.colour(10)).toBe(rampColour("cividis", 1));
    expect(createColourScale([1e-4, 1], { log: false }).kind).toBe("linear");
  });

  it("gives missing values the no-data colour and a constant set the middle of the ramp", () => {
    const s = createColourScale([5, 5, null]);
    expect(s.colour(null)).toBe(NO_DATA_COLOUR);
    expect(s.colour(Number.NaN)).toBe(NO_DATA_COLOUR);
    expect(s.position(5)).toBe(0.5);
    expect(s.ticks()).toEqual([5]);
    expect(createColourScale([]).position(1)).toBe(0.5);
  });

  it("gives legend stops from the bottom to the top of the ramp", () => {
    const stops = createColourScale([1, 2]).stops(5);
    expect(stops.map((x) => x.offset)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(stops[0].colour).toBe(rampColour("viridis", 0));
    expect(stops[4].colour).toBe(rampColour("viridis", 1));
  });
});
