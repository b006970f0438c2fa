#!/usr/bin/env bash
# Installs what Benchtag needs and is missing on this machine: Debian packages (PostgreSQL, and for
# the test command Chromium + ffmpeg) and the npm packages from package-lock.json. Idempotent.
#   bash db/scripts/install-deps.sh          # for serving the app
#   bash db/scripts/install-deps.sh --test   # also the browser for Playwright
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$root"

want=()
ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1 || want+=(postgresql)
if [ "${1:-}" = "--test" ]; then
  [ -x /usr/bin/chromium ] || want+=(chromium)
  command -v ffmpeg >/dev/null 2>&1 || want+=(ffmpeg)
fi
if [ ${#want[@]} -gt 0 ]; then
  if [ "$(id -u)" != 0 ]; then echo "install-deps: need root to apt-get install ${want[*]}" >&2; exit 1; fi
  echo "[deps] apt-get install ${want[*]}" >&2
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${want[@]}" >/dev/null
fi

# npm: never let Playwright fetch a browser; Debian's Chromium is used instead.
export PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1
stamp=node_modules/.benchtag-lock-hash
hash=$(sha1sum package-lock.json | cut -c1-40)
if [ ! -d node_modules ] || [ "$(cat "$stamp" 2>/dev/null)" != "$hash" ]; then
  echo "[deps] npm ci" >&2
  npm ci --no-audit --no-fund --loglevel=error
  echo "$hash" > "$stamp"
fi
