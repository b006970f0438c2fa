#!/usr/bin/env bash
# PostgreSQL lifecycle for Benchtag: a private cluster on 127.0.0.1, data in a git-ignored folder.
#   bash db/scripts/pg.sh start [name]   start (or find running) cluster; prints its DATABASE_URL base
#   bash db/scripts/pg.sh stop  [name]   stop it cleanly
#   bash db/scripts/pg.sh status [name]
# name: "dev" (port 54329, default) or "test" (port 54339, fsync off). Server tools run as the
# `postgres` user when we are root, because initdb refuses root.
# When DATABASE_URL is set by the caller, nothing is started: that server is used as it is.
set -euo pipefail

cmd=${1:-start}
name=${2:-dev}
root=$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)

case "$name" in
  dev) port=${BENCHTAG_PG_PORT:-54329} ;;
  test) port=${BENCHTAG_TEST_PG_PORT:-54339} ;;
  *) echo "pg.sh: unknown cluster name '$name' (dev|test)" >&2; exit 2 ;;
esac

log() { echo "[pg:$name] $*" >&2; }

ensure_server_installed() {
  # Runs the tools rather than looking for them; install-deps repairs or installs when they fail.
  PGBIN=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1 || true)
  if [ -z "$PGBIN" ] || ! "$PGBIN/initdb" --version >/dev/null 2>&1 || ! "$PGBIN/pg_ctl" --version >/dev/null 2>&1; then
    log "PostgreSQL server tools do not run; running install-deps"
    bash "$root/db/scripts/install-deps.sh"
    PGBIN=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -1)
  fi
}

# The data folder lives in .data/ of the checkout unless the postgres user cannot reach it
# (a checkout under /root); then under /var/tmp keyed by the checkout path.
data_dir() {
  local base="$root/.data"
  mkdir -p "$base"
  if [ "$(id -u)" = 0 ] && ! runuser -u postgres -- test -x "$base" 2>/dev/null; then
    base="/var/tmp/benchtag-$(echo -n "$root" | md5sum | cut -c1-12)"
    mkdir -p "$base"
  fi
  echo "$base/pg-$name"
}

RUNAS=()
[ "$(id -u)" = 0 ] && RUNAS=(runuser -u postgres --)

if [ -n "${DATABASE_URL:-}" ] && [ "$cmd" = start ]; then
  log "DATABASE_URL is set; using that server"
  exit 0
fi

PGDATA=$(data_dir)

case "$cmd" in
  start)
    ensure_server_installed
    if [ ! -f "$PGDATA/PG_VERSION" ]; then
      log "initialising cluster in $PGDATA"
      mkdir -p "$PGDATA"
      [ "$(id -u)" = 0 ] && chown postgres:postgres "$PGDATA"
      chmod 700 "$PGDATA"
      "${RUNAS[@]}" "$PGBIN/initdb" -D "$PGDATA" -U benchtag --auth=trust -E UTF8 --locale=C.UTF-8 >/dev/null
      {
        echo "listen_addresses = '127.0.0.1'"
        echo "port = $port"
        echo "unix_socket_directories = '$PGDATA'"
        echo "max_connections = 200"
        if [ "$name" = test ]; then echo "fsync = off"; echo "synchronous_commit = off"; echo "full_page_writes = off"; fi
      } >> "$PGDATA/postgresql.conf"
    fi
    if "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1 && [ "$(sed -n 4p "$PGDATA/postmaster.pid" 2>/dev/null)" != "$port" ]; then
      log "running on another port; restarting on $port"
      "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" -m fast -w stop >/dev/null
    fi
    if "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1; then
      log "already running on 127.0.0.1:$port"
    else
      # The port is given at every start, so BENCHTAG_*PG_PORT wins over the one written at init.
      "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" -l "$PGDATA/server.log" -o "-p $port" -w -t 60 start >/dev/null
      log "started on 127.0.0.1:$port"
    fi
    ;;
  stop)
    ensure_server_installed
    if [ -f "$PGDATA/PG_VERSION" ] && "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" status >/dev/null 2>&1; then
      "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" -m fast -w stop >/dev/null
      log "stopped"
    else
      log "not running"
    fi
    ;;
  status)
    ensure_server_installed
    "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$PGDATA" status
    ;;
  url)
    echo "postgres://benchtag@127.0.0.1:$port"
    ;;
  *) echo "pg.sh: unknown command '$cmd' (start|stop|status|url)" >&2; exit 2 ;;
esac
