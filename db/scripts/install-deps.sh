#!/usr/bin/env bash
# Installs what Benchtag needs and is missing on this machine, and checks that each tool it relies
# on actually RUNS (a tool can be on the PATH yet fail to start when its Debian package was
# unpacked but never configured). Idempotent; says what it did.
#   bash db/scripts/install-deps.sh          # for serving the app: PostgreSQL, npm packages
#   bash db/scripts/install-deps.sh --test   # also Debian's Chromium for Playwright
# Steps: 1) repair a half-configured package state (dpkg --configure -a, apt-get -f install);
# 2) install or reinstall the Debian packages whose tools do not run; 3) npm ci when the lock changed.
set -euo pipefail
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)
cd "$root"
export DEBIAN_FRONTEND=noninteractive

say() { echo "[deps] $*" >&2; }
is_root() { [ "$(id -u)" = 0 ]; }

pg_bin() { ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1; }
# Each check runs the tool, so a present-but-broken install counts as missing.
postgres_runs() {
  local bin
  bin=$(pg_bin) || return 1
  [ -n "$bin" ] && "$bin/initdb" --version >/dev/null 2>&1 && "$bin/pg_ctl" --version >/dev/null 2>&1 &&
    "$bin/postgres" --version >/dev/null 2>&1 && psql --version >/dev/null 2>&1 && id postgres >/dev/null 2>&1
}
chromium_runs() { [ -x /usr/bin/chromium ] && timeout 60 /usr/bin/chromium --headless --no-sandbox --version >/dev/null 2>&1; }

# Packages left unpacked but not configured (dpkg status other than "ii"/"rc"/"un"), e.g. after an
# interrupted install: their tools may fail to start (a library alternative never set up).
half_configured() { dpkg-query -W -f='${db:Status-Abbrev} ${binary:Package}\n' 2>/dev/null | awk '$1 !~ /^(ii|rc|un|pn)$/ {print $2}'; }

repair_packages() {
  local broken
  broken=$(half_configured | head -50 || true)
  if [ -n "$broken" ]; then
    if ! is_root; then say "packages are half-configured ($(echo "$broken" | wc -l) of them); run as root: dpkg --configure -a"; return 1; fi
    say "repairing $(half_configured | wc -l) half-configured Debian packages (dpkg --configure -a; apt-get -f install)"
    local out
    out=$(dpkg --configure -a 2>&1) || { say "dpkg --configure -a reported a problem (apt-get -f install follows):"; echo "$out" | tail -5 >&2; }
    out=$(apt-get -f install -y -qq 2>&1) || { say "apt-get -f install reported a problem:"; echo "$out" | tail -5 >&2; }
    local left
    left=$(half_configured | wc -l)
    say "package repair done; $left package(s) still not configured"
  fi
}

apt_updated=0
apt_install() {
  if ! is_root; then say "need root to apt-get install $*"; exit 1; fi
  if [ "$apt_updated" = 0 ]; then say "apt-get update"; apt-get update -qq; apt_updated=1; fi
  say "apt-get install $*"
  apt-get install -y -qq "$@" >/dev/null
}

# Make sure a tool runs: repair the package state, then install, then reinstall as a last resort.
ensure() {
  local label=$1 check=$2
  shift 2
  if "$check"; then say "$label: runs"; return 0; fi
  repair_packages || true
  if "$check"; then say "$label: runs (after repairing the package state)"; return 0; fi
  apt_install "$@"
  if "$check"; then say "$label: runs (installed)"; return 0; fi
  say "$label still does not run; reinstalling $*"
  apt_install --reinstall "$@"
  if "$check"; then say "$label: runs (reinstalled)"; return 0; fi
  say "$label does not run after install and reinstall; see the output of the check above"
  exit 1
}

ensure "PostgreSQL server tools" postgres_runs postgresql
if [ "${1:-}" = "--test" ]; then ensure "Chromium (/usr/bin/chromium)" chromium_runs chromium; fi

# npm: never let Playwright fetch a browser; Debian's Chromium is used instead. No telemetry
# (the machine may have no outside network).
export PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1 NEXT_TELEMETRY_DISABLED=1
stamp=node_modules/.benchtag-lock-hash
hash=$(sha1sum package-lock.json | cut -c1-40)
if [ ! -d node_modules ] || [ "$(cat "$stamp" 2>/dev/null)" != "$hash" ]; then
  say "npm ci"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$hash" > "$stamp"
else
  say "npm packages match package-lock.json"
fi
