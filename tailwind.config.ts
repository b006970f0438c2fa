import type { Config } from "tailwindcss";

// Workshop palette: high contrast under strong light; status is never colour alone.
export default {
  content: ["./app/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      // Each colour is a CSS variable (app/globals.css) so the bench's dim-bay palette can swap them.
      colors: {
        ink: "var(--c-ink)",
        paper: "var(--c-paper)",
        white: "var(--c-white)",
        steel: {
          50: "var(--c-steel-50)",
          100: "var(--c-steel-100)",
          300: "var(--c-steel-300)",
          500: "var(--c-steel-500)",
          700: "var(--c-steel-700)",
          900: "var(--c-steel-900)",
        },
        signal: { DEFAULT: "var(--c-signal)", dark: "var(--c-signal-dark)" },
        pass: { DEFAULT: "var(--c-pass)", light: "var(--c-pass-light)" },
        fail: { DEFAULT: "var(--c-fail)", light: "var(--c-fail-light)" },
        warn: { DEFAULT: "var(--c-warn)", light: "var(--c-warn-light)" },
      },
      fontFamily: {
        sans: ["var(--font-body)", "system-ui", "sans-serif"],
        mono: ["var(--font-figures)", "ui-monospace", "monospace"],
      },
      minHeight: { target: "64px" },
      minWidth: { target: "64px" },
    },
  },
} satisfies Config;
