#!/usr/bin/env bash
# Private PostgreSQL cluster for Parallax: start | stop | status | url.
# Listens on 127.0.0.1:$PARALLAX_DB_PORT only; the superuser password is random and lives in
# $PARALLAX_DATA_DIR/db-password (mode 600). Works as root (server runs as the postgres system user)
# and as a normal user. Idempotent.
set -euo pipefail

cmd="${1:-status}"
here="$(cd "$(dirname "$0")/.." && pwd)"
port="${PARALLAX_DB_PORT:-54329}"
data_root="${PARALLAX_DATA_DIR:-$here/.data}"
mode="${PARALLAX_DB_MODE:-normal}"   # "test" adds speed settings that trade durability away
mkdir -p "$data_root"
data_root="$(cd "$data_root" && pwd)"
pwfile="$data_root/db-password"
dirfile="$data_root/pg-dir"

log() { echo "[db] $*" >&2; }

find_bindir() {
  if [ -n "${PG_BINDIR:-}" ] && [ -x "$PG_BINDIR/initdb" ]; then echo "$PG_BINDIR"; return; fi
  if command -v pg_config >/dev/null 2>&1; then
    local b; b="$(pg_config --bindir 2>/dev/null || true)"
    if [ -n "$b" ] && [ -x "$b/initdb" ]; then echo "$b"; return; fi
  fi
  local newest
  newest="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)"
  if [ -n "$newest" ] && [ -x "$newest/initdb" ]; then echo "$newest"; return; fi
  if command -v initdb >/dev/null 2>&1; then dirname "$(command -v initdb)"; return; fi
  echo ""
}

install_pg() {
  if [ "$(id -u)" != "0" ]; then
    if command -v sudo >/dev/null 2>&1; then SUDO="sudo"; else
      log "PostgreSQL is not installed and this user cannot install it. Run: apt-get install -y postgresql-15"; exit 1
    fi
  else SUDO=""; fi
  log "PostgreSQL not found: installing Debian's package (once)"
  $SUDO mkdir -p /etc/postgresql-common/createcluster.d
  echo "create_main_cluster = false" | $SUDO tee /etc/postgresql-common/createcluster.d/parallax.conf >/dev/null
  $SUDO apt-get update -qq >/dev/null
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends postgresql-15 >/dev/null
}

bindir="$(find_bindir)"
if [ -z "$bindir" ]; then
  if [ "$cmd" = "start" ]; then install_pg; bindir="$(find_bindir)"; else log "PostgreSQL is not installed"; [ "$cmd" = "stop" ] && exit 0; exit 3; fi
fi

as_root=0; [ "$(id -u)" = "0" ] && as_root=1
run_pg() { if [ $as_root = 1 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi; }

# Can the postgres user reach $1? (every parent must be traversable)
reachable() { if [ $as_root = 1 ]; then (cd / && runuser -u postgres -- test -x "$1"); else return 0; fi; }

pick_pgdata() {
  if [ -f "$dirfile" ]; then cat "$dirfile"; return; fi
  local want="$data_root/pg"
  mkdir -p "$want"
  [ $as_root = 1 ] && chown postgres:postgres "$want"
  if reachable "$want"; then echo "$want"; else
    local alt="/tmp/parallax-pg-$(echo -n "$data_root" | sha1sum | cut -c1-10)"
    log "the postgres user cannot traverse $data_root; keeping the cluster in $alt instead"
    rmdir "$want" 2>/dev/null || true
    echo "$alt"
  fi
}

pgdata="$(pick_pgdata)"
echo "$pgdata" > "$dirfile"

is_up() { "$bindir/pg_isready" -q -h 127.0.0.1 -p "$port" >/dev/null 2>&1; }

case "$cmd" in
  start)
    if [ ! -s "$pwfile" ]; then (umask 077; head -c 24 /dev/urandom | base64 | tr -d '/+=' > "$pwfile"); fi
    chmod 600 "$pwfile"
    mkdir -p "$pgdata"
    if [ $as_root = 1 ]; then id postgres >/dev/null 2>&1 || useradd --system --home /var/lib/postgresql postgres; chown -R postgres:postgres "$pgdata"; chmod 700 "$pgdata"; fi
    if [ ! -f "$pgdata/PG_VERSION" ]; then
      log "initialising a new cluster in $pgdata"
      tmp_pw="$(mktemp)"; cp "$pwfile" "$tmp_pw"; [ $as_root = 1 ] && chown postgres "$tmp_pw"
      run_pg "$bindir/initdb" -D "$pgdata" -U postgres --pwfile="$tmp_pw" --auth-local=trust --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
      rm -f "$tmp_pw"
      {
        echo "listen_addresses = '127.0.0.1'"
        echo "unix_socket_directories = '$pgdata'"
        echo "max_connections = 200"
        if [ "$mode" = "test" ]; then echo "fsync = off"; echo "synchronous_commit = off"; echo "full_page_writes = off"; fi
      } > "$pgdata/parallax.conf"
      echo "include 'parallax.conf'" >> "$pgdata/postgresql.conf"
      [ $as_root = 1 ] && chown postgres:postgres "$pgdata/parallax.conf"
    fi
    if is_up; then
      if run_pg "$bindir/pg_ctl" -D "$pgdata" status >/dev/null 2>&1; then log "already running on 127.0.0.1:$port"; exit 0; fi
      log "port $port is taken by another server (not the cluster in $pgdata): set PARALLAX_DB_PORT"; exit 1
    fi
    # A stale pid file from a killed server would stop pg_ctl: it handles that itself.
    run_pg "$bindir/pg_ctl" -D "$pgdata" -o "-p $port" -l "$pgdata/server.log" -w -t 60 start >/dev/null || {
      log "start failed; last lines of $pgdata/server.log:"; tail -n 20 "$pgdata/server.log" >&2 || true; exit 1; }
    for _ in $(seq 1 50); do is_up && break; sleep 0.1; done
    is_up || { log "server did not become ready"; exit 1; }
    log "running on 127.0.0.1:$port (data in $pgdata)"
    ;;
  stop)
    if [ -f "$pgdata/PG_VERSION" ] && run_pg "$bindir/pg_ctl" -D "$pgdata" status >/dev/null 2>&1; then
      run_pg "$bindir/pg_ctl" -D "$pgdata" -m fast -w stop >/dev/null; log "stopped"
    else log "not running"; fi
    ;;
  status)
    if is_up; then echo "running on 127.0.0.1:$port (data in $pgdata)"; else echo "not running (data in $pgdata)"; exit 3; fi
    ;;
  *) echo "usage: db.sh start|stop|status" >&2; exit 2 ;;
esac
