#!/usr/bin/env bash
# Starts (or stops) a throwaway PostgreSQL 15 cluster on a free loopback port for the tests.
#   .ci/postgres.sh start DIR   -> prints "export HEADWATER_TEST_PG_URL=...; export HEADWATER_TEST_PG_USER=...; ..."
#   .ci/postgres.sh stop DIR
# The cluster lives in DIR (created; owned by the postgres user when run as root, because initdb refuses root).
set -euo pipefail
action=${1:?start or stop}
dir=${2:?cluster directory}
bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1)
[ -x "$bin/initdb" ] || { echo "postgres.sh: no PostgreSQL server binaries under /usr/lib/postgresql" >&2; exit 1; }

as_owner() {
  if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}

case "$action" in
start)
  mkdir -p "$dir"
  [ "$(id -u)" = 0 ] && chown postgres "$dir"
  if [ ! -f "$dir/data/PG_VERSION" ]; then
    as_owner "$bin/initdb" -D "$dir/data" -U headwater --auth=trust -E UTF8 --locale=C.UTF-8 >"$dir/initdb.log" 2>&1 \
      || { cat "$dir/initdb.log" >&2; exit 1; }
  fi
  # Members of headwater_password_login must give their password (tests of wrong credentials); the rest is trust.
  hba="$dir/data/pg_hba.conf"
  grep -q headwater_password_login "$hba" || as_owner sed -i '1i host all +headwater_password_login 127.0.0.1/32 scram-sha-256' "$hba"
  if [ -f "$dir/port" ] && as_owner "$bin/pg_ctl" -D "$dir/data" status >/dev/null 2>&1; then
    port=$(cat "$dir/port")  # already running (a second start in the same folder): reuse it
  else
    port=$(python3 -c 'import socket; s=socket.socket(); s.bind(("127.0.0.1",0)); print(s.getsockname()[1])')
    as_owner "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w \
      -o "-c listen_addresses=127.0.0.1 -p $port -k $dir -c max_connections=200 -c fsync=off" start >/dev/null \
      || { cat "$dir/server.log" >&2; exit 1; }
  fi
  echo "$port" >"$dir/port"
  echo "export HEADWATER_TEST_PG_URL=jdbc:postgresql://127.0.0.1:$port/postgres"
  echo "export HEADWATER_TEST_PG_USER=headwater"
  echo "export HEADWATER_TEST_PG_HOST=127.0.0.1"
  echo "export HEADWATER_TEST_PG_PORT=$port"
  ;;
stop)
  [ -f "$dir/data/PG_VERSION" ] && as_owner "$bin/pg_ctl" -D "$dir/data" -m fast stop >/dev/null 2>&1 || true
  ;;
*) echo "postgres.sh: start or stop" >&2; exit 2 ;;
esac
