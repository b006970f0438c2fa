// ESLint (flat config): JavaScript and TypeScript rules (typescript-eslint, without type
// information, to keep `npm run lint` quick), the Next.js plugin's core-web-vitals rules, the
// rules of hooks, and
// eslint-config-prettier last so nothing here argues with the formatter (`npm run format`).
import js from "@eslint/js";
import nextPlugin from "@next/eslint-plugin-next";
import prettier from "eslint-config-prettier";
import reactHooks from "eslint-plugin-react-hooks";
import { defineConfig, globalIgnores } from "eslint/config";
import tseslint from "typescript-eslint";

export default defineConfig(
  globalIgnores([
    "node_modules/",
    ".next/",
    ".data/",
    "public/",
    "test-results/",
    "playwright-report/",
    "next-env.d.ts",
    "tests/e2e/.generated/",
  ]),
  js.configs.recommended,
  tseslint.configs.recommended,
  nextPlugin.configs["core-web-vitals"],
  {
    // the two rules of hooks, for the React code (the plugin's compiler rules are left out)
    files: ["app/**/*.{ts,tsx}", "lib/client/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: { "react-hooks/rules-of-hooks": "error", "react-hooks/exhaustive-deps": "warn" },
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrorsIgnorePattern: "^_" }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports", disallowTypeAnnotations: false }],
    },
  },
  {
    // plain Node scripts (fakes, serwist config)
    files: ["**/*.js", "**/*.cjs", "**/*.mjs"],
    languageOptions: { globals: { process: "readonly", console: "readonly", URL: "readonly", Buffer: "readonly" } },
  },
  prettier,
);
