#!/usr/bin/env bash
# A throwaway PostgreSQL cluster for tests and trials: a fresh data directory, loopback only, trust authentication
# for the user "hull", no fsync (nothing in it is meant to outlive the run).
#   scripts/postgres-throwaway.sh start DIR   initdb in DIR/data, start on a free loopback port; prints the
#                                             connection string (also written to DIR/connection)
#   scripts/postgres-throwaway.sh stop DIR    stop it (the caller removes DIR)
# Needs Debian's postgresql package (initdb and pg_ctl under /usr/lib/postgresql/*/bin). PostgreSQL refuses to run
# as root, so as root the cluster runs as the "postgres" user the package creates.
set -euo pipefail

action=${1:-}
dir=${2:-}
if [[ -z "$action" || -z "$dir" ]]; then
  echo "usage: $0 start|stop DIR" >&2
  exit 64
fi

bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
if [[ -z "$bin" || ! -x "$bin/initdb" ]]; then
  echo "$0: PostgreSQL's initdb was not found under /usr/lib/postgresql/*/bin; install Debian's postgresql package" >&2
  exit 69
fi

as_owner() {
  if [[ $(id -u) -eq 0 ]]; then
    runuser -u postgres -- "$@"
  else
    "$@"
  fi
}

case "$action" in
  start)
    mkdir -p "$dir"
    if [[ $(id -u) -eq 0 ]]; then
      id postgres >/dev/null 2>&1 || { echo "$0: running as root, but there is no 'postgres' user to run the cluster as" >&2; exit 69; }
      chown postgres "$dir"
    fi
    as_owner "$bin/initdb" -D "$dir/data" -U hull -A trust -E UTF8 --locale=C.UTF-8 --no-sync >"$dir/initdb.log" 2>&1 \
      || { echo "$0: initdb failed:" >&2; cat "$dir/initdb.log" >&2; exit 1; }
    # A free port: bind port 0 on loopback and take what the kernel gives (released just before PostgreSQL binds it).
    port=$(/usr/bin/python3 -c 'import socket; s = socket.socket(); s.bind(("127.0.0.1", 0)); print(s.getsockname()[1])')
    as_owner "$bin/pg_ctl" -D "$dir/data" -l "$dir/server.log" -w -t 60 \
      -o "-p $port -k $dir -c listen_addresses=127.0.0.1 -c fsync=off -c synchronous_commit=off -c full_page_writes=off -c max_connections=400" \
      start >/dev/null \
      || { echo "$0: PostgreSQL did not start:" >&2; cat "$dir/server.log" >&2; exit 1; }
    connection="Host=127.0.0.1;Port=$port;Username=hull;Database=postgres"
    echo "$connection" >"$dir/connection"
    echo "$connection"
    ;;
  stop)
    if [[ -f "$dir/data/postmaster.pid" ]]; then
      as_owner "$bin/pg_ctl" -D "$dir/data" -m immediate -w -t 60 stop >/dev/null
    fi
    ;;
  *)
    echo "usage: $0 start|stop DIR" >&2
    exit 64
    ;;
esac
