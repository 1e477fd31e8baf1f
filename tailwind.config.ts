import type { Config } from "tailwindcss";

// Stokeline's own palette: deep "ink" blues for structure, a "stream" teal for
// action, and three flag tones chosen to stay distinct for colour-blind readers
// (blue / amber / vermilion, after the Okabe–Ito set) and in greyscale by lightness.
export default {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: { 50: "#f3f6f9", 100: "#e3e9f0", 200: "#c5d1de", 300: "#9aaec4", 400: "#6b86a3", 500: "#4a6685", 600: "#37506c", 700: "#293d54", 800: "#1c2b3d", 900: "#111c29" },
        stream: { 50: "#ecfbf8", 100: "#cff5ee", 300: "#6fdcc9", 500: "#14a38b", 600: "#0e8572", 700: "#0c6a5c", 800: "#0b5249" },
        note: { 100: "#dcecfb", 600: "#0b62b0", 800: "#0a4577" },
        heed: { 100: "#fdf0d5", 600: "#a86400", 800: "#6e4100" },
        halt: { 100: "#fbe3dc", 600: "#b8321a", 800: "#7c2110" },
      },
      fontFamily: {
        sans: ["var(--font-plex-sans)", "system-ui", "sans-serif"],
        mono: ["var(--font-plex-mono)", "ui-monospace", "monospace"],
      },
    },
  },
} satisfies Config;
