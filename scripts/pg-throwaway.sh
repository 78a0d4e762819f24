#!/usr/bin/env bash
# A throwaway PostgreSQL cluster for tests and benches: initdb into a temporary folder, start it on a
# free port (TCP on 127.0.0.1, unix socket inside the folder), run a command with TEST_DATABASE_URL
# set, then stop the cluster and remove the folder (also on failure, Ctrl-C or SIGTERM).
#
#   bash scripts/pg-throwaway.sh -- npx vitest run --project server-pg   # run a command against it
#   bash scripts/pg-throwaway.sh                                         # print the URL, keep it until Ctrl-C
#
# The URL names the maintenance database `postgres` of a superuser `varsmith` (trust authentication on
# loopback only); the tests create one database per app they boot. Durability is switched off
# (fsync, synchronous_commit, full_page_writes): the cluster lives for one run.
# PostgreSQL's binaries: PG_BIN, else the newest /usr/lib/postgresql/*/bin (Debian), else
# `pg_config --bindir`. initdb refuses root: as root the cluster runs as the `postgres` account
# (Debian's package creates it) or, when absent, a system account `varsmith-pg` created here.
# Exit status: the command's; 3 when no PostgreSQL binaries are found (the message says why).
set -euo pipefail

if [ "${1:-}" = "--" ]; then shift; fi

find_bin() {
  if [ -n "${PG_BIN:-}" ] && [ -x "$PG_BIN/initdb" ]; then echo "$PG_BIN"; return; fi
  local newest
  newest=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
  if [ -n "$newest" ] && [ -x "$newest/initdb" ]; then echo "$newest"; return; fi
  if command -v pg_config >/dev/null 2>&1 && [ -x "$(pg_config --bindir)/initdb" ]; then pg_config --bindir; return; fi
  echo ""
}

bin=$(find_bin)
if [ -z "$bin" ]; then
  echo "pg-throwaway: no PostgreSQL server binaries (initdb, pg_ctl) found; install Debian's postgresql or set PG_BIN" >&2
  exit 3
fi

as_owner=()
owner=$(id -un)
base=${TMPDIR:-/tmp}
if [ "$(id -u)" = "0" ]; then
  base=/tmp # the cluster's account must reach the folder; root's TMPDIR may sit under /root
  owner=postgres
  if ! id -u "$owner" >/dev/null 2>&1; then
    owner=varsmith-pg
    id -u "$owner" >/dev/null 2>&1 || useradd --system --no-create-home --shell /usr/sbin/nologin "$owner"
  fi
  as_owner=(runuser -u "$owner" --)
fi

dir=$(mktemp -d "$base/varsmith-pg.XXXXXX")
chmod 700 "$dir"
[ "${#as_owner[@]}" -eq 0 ] || chown "$owner" "$dir"

waiter=""
cleanup() {
  local status=$?
  trap - EXIT INT TERM
  [ -z "$waiter" ] || kill "$waiter" 2>/dev/null || true
  if [ -f "$dir/data/postmaster.pid" ]; then
    "${as_owner[@]}" "$bin/pg_ctl" -D "$dir/data" -m immediate -w stop >/dev/null 2>&1 || true
  fi
  rm -rf "$dir"
  exit "$status"
}
trap cleanup EXIT
trap 'exit 130' INT
trap 'exit 143' TERM

port=$(node -e "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close();})")
"${as_owner[@]}" "$bin/initdb" -D "$dir/data" -U varsmith --auth=trust -E UTF8 --no-locale --no-sync >"$dir/initdb.log" 2>&1 \
  || { cat "$dir/initdb.log" >&2; exit 1; }
options="-p $port -k $dir -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off"
"${as_owner[@]}" "$bin/pg_ctl" -D "$dir/data" -o "$options" -l "$dir/server.log" -w -t 60 start >/dev/null \
  || { cat "$dir/server.log" >&2; exit 1; }

export TEST_DATABASE_URL="postgres://varsmith@127.0.0.1:$port/postgres"
echo "pg-throwaway: PostgreSQL $("$bin/postgres" --version | awk '{print $3}') on $TEST_DATABASE_URL (folder $dir)" >&2

if [ $# -eq 0 ]; then
  echo "TEST_DATABASE_URL=$TEST_DATABASE_URL"
  echo "pg-throwaway: running until Ctrl-C or SIGTERM; the cluster and its folder are removed then" >&2
  sleep infinity &
  waiter=$!
  wait "$waiter"
else
  "$@"
fi
