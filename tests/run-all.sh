#!/usr/bin/env bash
# Every test Benchtag has: lint and format checks, typecheck, unit, integration (real PostgreSQL),
# then the production build and Playwright in Debian's Chromium against it. Run through `npm test` (set-up first).
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
cd "$root"
export NEXT_TELEMETRY_DISABLED=1 PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1

echo "== lint (ESLint)"
npx eslint .
echo "== format (Prettier)"
npx prettier --check .
echo "== typecheck"
npx tsc --noEmit -p .
echo "== unit"
npx vitest run --project unit
echo "== integration"
npx vitest run --project integration
echo "== build"
npm run build
echo "== end-to-end (Playwright, Chromium)"
npx playwright test
