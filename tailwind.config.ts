import type { Config } from "tailwindcss";

// Workshop palette: high contrast under strong light; status is never colour alone.
export default {
  content: ["./app/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: "#111418",
        paper: "#f7f5f0",
        steel: { 50: "#f1f3f5", 100: "#e2e6ea", 300: "#a9b3bd", 500: "#5b6773", 700: "#323b44", 900: "#161b20" },
        signal: { DEFAULT: "#ffb400", dark: "#8a5a00" },
        pass: { DEFAULT: "#0b6b2e", light: "#d9f2e1" },
        fail: { DEFAULT: "#a3120f", light: "#fbe0df" },
        warn: { DEFAULT: "#7a4b00", light: "#fff0cc" },
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
