#!/usr/bin/env bash
# Playwright's web server: a fresh e2e database on the test cluster, migrated and seeded with the
# demo workshop, then the production build served on $E2E_PORT (default 3100).
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$root"
env -u DATABASE_URL bash db/scripts/pg.sh start test
export DATABASE_URL="${E2E_DATABASE_URL:-$(bash db/scripts/pg.sh url test)/benchtag_e2e}"
npx tsx db/cli/reset-database.ts
npx tsx db/cli/migrate.ts
npx tsx db/cli/seed.ts
port=${E2E_PORT:-3100}
export NEXTAUTH_URL=http://localhost:$port
export NEXTAUTH_SECRET=${NEXTAUTH_SECRET:-e2e-only-secret-not-for-production}
exec npx next start -p "$port"
