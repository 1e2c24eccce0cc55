import type { Config } from "tailwindcss";

/**
 * Ballast's palette: a calm paper page, deep ink for text and structure, one warm accent (brass) kept for
 * the next action, and plain status colours that always travel with a word or an icon.
 */
const config: Config = {
  content: ["./app/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: "#f7f5f0", raised: "#fdfcf9", sunk: "#efece4" },
        ink: { DEFAULT: "#1c2733", soft: "#3d4a57", muted: "#5b6570", line: "#d8d3c7" },
        brass: { DEFAULT: "#925816", dark: "#84500f", light: "#f3e6d3" },
        ok: { DEFAULT: "#2f6b3f", bg: "#e4efe6" },
        caution: { DEFAULT: "#8a5a00", bg: "#f6ecd4" },
        alert: { DEFAULT: "#a2332b", bg: "#f6e1de" },
      },
      fontFamily: {
        sans: ["var(--font-ballast)", "system-ui", "sans-serif"],
      },
    },
  },
};

export default config;
