#!/usr/bin/env bash
# Playwright's web server: a fresh e2e database on the test cluster, migrated and seeded with the
# demo workshop, then the production build served on $E2E_PORT (default 3100).
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$root"
export NEXT_TELEMETRY_DISABLED=1
env -u DATABASE_URL bash db/scripts/pg.sh start test
export DATABASE_URL="${E2E_DATABASE_URL:-$(bash db/scripts/pg.sh url test)/benchtag_e2e}"
npx tsx db/setup/cli/reset-database.ts
npx tsx db/setup/cli/migrate.ts
npx tsx --conditions=react-server db/setup/cli/seed.ts
port=${E2E_PORT:-3100}
# Local fakes (maildev, s3rver, payments) and the app pointed at them; the webhook URL registered.
bash tests/fakes/start-fakes.sh
export SMTP_URL="smtp://127.0.0.1:${FAKE_SMTP_PORT:-1025}" S3_ENDPOINT="http://127.0.0.1:${FAKE_S3_PORT:-4569}" S3_BUCKET=${S3_BUCKET:-benchtag}
export STRIPE_API_BASE="http://127.0.0.1:${FAKE_PAYMENTS_PORT:-12111}" STRIPE_SECRET_KEY=${STRIPE_SECRET_KEY:-sk_test_benchtag_local}
export STRIPE_WEBHOOK_SECRET=${STRIPE_WEBHOOK_SECRET:-whsec_benchtag_local}
npx tsx --conditions=react-server tests/fakes/register-webhook.ts "http://localhost:$port/api/payments/webhook"
export NEXTAUTH_URL=http://localhost:$port
export NEXTAUTH_SECRET=${NEXTAUTH_SECRET:-e2e-only-secret-not-for-production}
# A local test server with the demo's public secrets and plain http: not a production start
# (instrumentation.ts refuses those). server.mjs stamps each request's connection address and
# writes its pid, so the security tests can read the server's memory (/proc/<pid>/status).
mkdir -p tests/e2e/.generated
export PORT=$port BENCHTAG_LOCAL_DEMO=1 BENCHTAG_PID_FILE="$root/tests/e2e/.generated/server.pid"
exec node server.mjs
