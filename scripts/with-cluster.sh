#!/usr/bin/env bash
# Run a command against throwaway PostgreSQL clusters:
#   scripts/with-cluster.sh [--install] [--clusters N] COMMAND [ARGS...]
# Creates an unprivileged OS user (striae_pg) when run as root, initdb's N
# clusters (default 1) into one temporary directory, starts each on a private
# Unix socket of its own (no TCP), runs the command, and always stops the
# servers and removes the directory afterwards, whatever the command did.
#
# With --install, `make install` goes into a directory of the run's own
# (exported as STRIAE_DESTDIR) and every server finds striae there through
# Debian's extension_destdir setting, so the system's PostgreSQL is never
# touched and several checkouts can test at once.
#
# Exported for the command: PGHOST, PGPORT, PGUSER, PGDATABASE and
# STRIAE_PGDATA of cluster 1; STRIAE_CLUSTERS=N and, for each cluster k,
# STRIAE_HOST_k, STRIAE_PORT_k, STRIAE_PGDATA_k (several clusters: a
# coordinator and shards for postgres_fdw); STRIAE_SCRATCH, a directory the
# servers can read.
set -euo pipefail

INSTALL=0
N=1
while [ $# -gt 0 ]; do
  case "$1" in
    --install) INSTALL=1; shift ;;
    --clusters) N="$2"; shift 2 ;;
    *) break ;;
  esac
done
[[ "$N" =~ ^[1-9]$ ]] || { echo "with-cluster: --clusters takes 1 to 9" >&2; exit 2; }
[ $# -gt 0 ] || { echo "usage: with-cluster.sh [--install] [--clusters N] COMMAND [ARGS...]" >&2; exit 2; }
ROOT="$(cd "$(dirname "$0")/.." && pwd)"

PGBIN="$(pg_config --bindir)"
RUNAS=()
OSUSER="$(id -un)"
if [ "$(id -u)" -eq 0 ]; then
  OSUSER=striae_pg
  id -u "$OSUSER" >/dev/null 2>&1 || useradd --system --no-create-home --shell /usr/sbin/nologin "$OSUSER" 2>/dev/null ||
    id -u "$OSUSER" >/dev/null   # another run may have created it meanwhile
  RUNAS=(runuser -u "$OSUSER" --)
fi

TMP="$(mktemp -d /tmp/striae-cluster.XXXXXX)"
chmod 755 "$TMP"
[ "$OSUSER" != "$(id -un)" ] && chown "$OSUSER" "$TMP"
STARTED=()

cleanup() {
  for d in "${STARTED[@]}"; do
    "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$d" -m immediate stop >/dev/null 2>&1 || true
  done
  rm -rf "$TMP"
}
trap cleanup EXIT INT TERM

if [ $INSTALL -eq 1 ]; then
  DEST="$TMP/inst"
  make -s -C "$ROOT" install DESTDIR="$DEST" >"$TMP/install.log" 2>&1 ||
    { cat "$TMP/install.log" >&2; exit 1; }
  chmod -R a+rX "$DEST"
  export STRIAE_DESTDIR="$DEST"
fi

for k in $(seq 1 "$N"); do
  data="$TMP/data$k"
  sock="$TMP/sock$k"
  mkdir -p "$sock"
  [ "$OSUSER" != "$(id -un)" ] && chown "$OSUSER" "$sock"
  port=$(( 20000 + RANDOM % 20000 ))
  "${RUNAS[@]}" "$PGBIN/initdb" -D "$data" -U postgres --auth=trust -E UTF8 --locale=C.UTF-8 >"$TMP/initdb$k.log" 2>&1 ||
    { cat "$TMP/initdb$k.log" >&2; exit 1; }
  cat >>"$data/postgresql.conf" <<CONF
listen_addresses = ''
unix_socket_directories = '$sock'
port = $port
max_worker_processes = 8
max_parallel_workers = 4
max_parallel_workers_per_gather = 2
shared_buffers = 256MB
work_mem = 64MB
fsync = off
synchronous_commit = off
full_page_writes = off
CONF
  [ $INSTALL -eq 1 ] && echo "extension_destdir = '$DEST'" >>"$data/postgresql.conf"
  "${RUNAS[@]}" "$PGBIN/pg_ctl" -D "$data" -l "$TMP/server$k.log" -w -t 60 start >/dev/null ||
    { cat "$TMP/server$k.log" >&2; exit 1; }
  STARTED+=("$data")
  export "STRIAE_HOST_$k=$sock" "STRIAE_PORT_$k=$port" "STRIAE_PGDATA_$k=$data"
done

export PGHOST="$STRIAE_HOST_1" PGPORT="$STRIAE_PORT_1" PGUSER=postgres PGDATABASE=postgres
export STRIAE_PGDATA="$STRIAE_PGDATA_1" STRIAE_CLUSTERS="$N"
export STRIAE_SCRATCH="$TMP"   # readable by the server user too
set +e
"$@"
rc=$?
set -e
if [ $rc -ne 0 ]; then
  for k in $(seq 1 "$N"); do
    [ -f "$TMP/server$k.log" ] || continue
    echo "---- last lines of the server log of cluster $k ----" >&2
    tail -n 30 "$TMP/server$k.log" >&2
  done
fi
exit $rc
