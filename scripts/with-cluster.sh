#!/usr/bin/env bash
# Run a command against a throwaway PostgreSQL cluster:
#   scripts/with-cluster.sh [--install] COMMAND [ARGS...]
# With --install, `make install` goes into a directory of the cluster's own
# (exported as STRIAE_DESTDIR) and the server finds striae there through
# Debian's extension_destdir setting, so the system's PostgreSQL is never
# touched and several checkouts can test at once.
# Creates an unprivileged OS user (striae_pg) when run as root, initdb's into a
# temporary directory, starts the server on a private Unix socket (no TCP),
# exports PGHOST, PGPORT, PGUSER, PGDATABASE and STRIAE_PGDATA for the
# command, and always stops the server and removes the directory afterwards.
set -euo pipefail

INSTALL=0
if [ "${1:-}" = "--install" ]; then INSTALL=1; shift; fi
ROOT="$(cd "$(dirname "$0")/.." && pwd)"

PGBIN="$(pg_config --bindir)"
RUNAS=()
OSUSER="$(id -un)"
if [ "$(id -u)" -eq 0 ]; then
  OSUSER=striae_pg
  id -u "$OSUSER" >/dev/null 2>&1 || useradd --system --no-create-home --shell /usr/sbin/nologin "$OSUSER"
  RUNAS=(runuser -u "$OSUSER" --)
fi

TMP="$(mktemp -d /tmp/striae-cluster.XXXXXX)"
chmod 755 "$TMP"
DATA="$TMP/data"
SOCK="$TMP/sock"
mkdir -p "$SOCK"
[ "$OSUSER" != "$(id -un)" ] && chown "$OSUSER" "$TMP" "$SOCK"
PORT=$(( 20000 + RANDOM % 20000 ))

cleanup() {
  "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$DATA" -m immediate stop >/dev/null 2>&1 || true
  rm -rf "$TMP"
}
trap cleanup EXIT INT TERM

"${RUNAS[@]}" "$PGBIN/initdb" -D "$DATA" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$TMP/initdb.log" 2>&1 ||
  { cat "$TMP/initdb.log" >&2; exit 1; }
cat >>"$DATA/postgresql.conf" <<CONF
listen_addresses = ''
unix_socket_directories = '$SOCK'
port = $PORT
max_worker_processes = 8
max_parallel_workers = 4
max_parallel_workers_per_gather = 2
shared_buffers = 256MB
work_mem = 64MB
fsync = off
synchronous_commit = off
full_page_writes = off
CONF
if [ $INSTALL -eq 1 ]; then
  DEST="$TMP/inst"
  make -s -C "$ROOT" install DESTDIR="$DEST" >"$TMP/install.log" 2>&1 ||
    { cat "$TMP/install.log" >&2; exit 1; }
  chmod -R a+rX "$DEST"
  echo "extension_destdir = '$DEST'" >>"$DATA/postgresql.conf"
  export STRIAE_DESTDIR="$DEST"
fi
"${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$DATA" -l "$TMP/server.log" -w -t 60 start >/dev/null ||
  { cat "$TMP/server.log" >&2; exit 1; }

export PGHOST="$SOCK" PGPORT="$PORT" PGUSER=postgres PGDATABASE=postgres STRIAE_PGDATA="$DATA"
export STRIAE_SCRATCH="$TMP"   # readable by the server user too
set +e
"$@"
rc=$?
set -e
if [ $rc -ne 0 ] && [ -f "$TMP/server.log" ]; then
  echo "---- last lines of the server log ----" >&2
  tail -n 30 "$TMP/server.log" >&2
fi
exit $rc
