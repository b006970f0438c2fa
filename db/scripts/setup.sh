#!/usr/bin/env bash
# Set-up shared by `npm start` and `npm test`: install what is missing, start PostgreSQL,
# migrate, seed the demo workshop, and make sure .env.local has a session secret.
#   bash db/scripts/setup.sh          # for serving the app
#   bash db/scripts/setup.sh --test   # also Chromium and the test cluster
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$root"
export NEXT_TELEMETRY_DISABLED=1

bash db/scripts/install-deps.sh "$@"
bash db/scripts/pg.sh start dev
if [ "${1:-}" = "--test" ]; then bash db/scripts/pg.sh start test; fi
FAKE_PAYMENTS_WEBHOOK_URL=${FAKE_PAYMENTS_WEBHOOK_URL:-http://localhost:${PORT:-3000}/api/payments/webhook} bash tests/fakes/start-fakes.sh
npx tsx db/setup/cli/migrate.ts
npx tsx --conditions=react-server db/setup/cli/seed.ts

# Session secret for next-auth: kept in the git-ignored .env.local, made once per checkout.
if ! grep -qs '^NEXTAUTH_SECRET=' .env.local; then
  echo "NEXTAUTH_SECRET=$(node -e 'console.log(require("crypto").randomBytes(32).toString("base64url"))')" >> .env.local
fi
if ! grep -qs '^NEXTAUTH_URL=' .env.local; then
  echo "NEXTAUTH_URL=http://localhost:${PORT:-3000}" >> .env.local
fi
