// Contrast of the colour pairs the shell and forms use, computed from tailwind.config.ts with
// the WCAG 2.1 relative-luminance and contrast-ratio definitions (W3C, WCAG 2.1 §1.4.3 and
// §1.4.11; thresholds 4.5:1 for body text, 3:1 for large text and UI component boundaries).
import { describe, expect, it } from "vitest";
import config from "@/tailwind.config";

const colors = config.theme.extend.colors as Record<string, Record<string, string>>;
const hex = (name: string): string => {
  if (name.startsWith("#")) return name;
  if (name === "white") return "#ffffff";
  const [family, shade] = name.split("-");
  const value = colors[family]?.[shade];
  if (!value) throw new Error(`no colour ${name} in tailwind.config.ts`);
  return value;
};

// WCAG 2.1 definition of relative luminance (sRGB, 0.03928 threshold as written in the standard).
function luminance(color: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(color.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(hex(a)), luminance(hex(b))].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe("palette contrast (WCAG 2.1 AA)", () => {
  it("matches the standard's own reference points: black on white is 21:1, white on white 1:1", () => {
    expect(contrast("#000000", "white")).toBeCloseTo(21, 6);
    expect(contrast("white", "white")).toBe(1);
  });

  it.each([
    ["ink-900", "ink-50"], // body text
    ["ink-600", "ink-50"], // leads and hints on the page background
    ["ink-500", "white"], // small dates in panels
    ["stream-700", "white"], // links
    ["stream-700", "ink-50"],
    ["white", "stream-700"], // primary buttons
    ["halt-800", "halt-100"], // error notices
    ["heed-800", "heed-100"],
    ["note-800", "note-100"],
    ["stream-800", "stream-50"],
    ["ink-800", "ink-100"], // role badges
    ["halt-800", "white"], // field errors, danger buttons
  ])("text %s on %s reaches 4.5:1", (fg, bg) => {
    expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
  });

  it.each([
    ["ink-400", "white"], // input and quiet-button borders
    ["stream-600", "white"], // focus outline
    ["stream-600", "ink-50"],
  ])("UI boundary %s on %s reaches 3:1", (fg, bg) => {
    expect(contrast(fg, bg)).toBeGreaterThanOrEqual(3);
  });
});
