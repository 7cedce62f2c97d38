#!/usr/bin/env bash
# Three hull servers on one machine sharing one throwaway PostgreSQL store, for trying several servers without a
# container tool:
#   scripts/three-servers.sh start DIR [FIRST_PORT]   a PostgreSQL cluster in DIR/postgres (scripts/postgres-throwaway.sh)
#                                                     and servers on 127.0.0.1:FIRST_PORT..+2 (default 50561); prints
#                                                     their addresses; logs in DIR/server-N.log
#   scripts/three-servers.sh stop DIR                 stops the servers (SIGTERM) and the cluster; then remove DIR
# Builds src/Hull.Server in Release first. Everything in the cluster is thrown away with DIR.
set -euo pipefail
cd "$(dirname "$0")/.."

action=${1:-}
dir=${2:-}
if [[ -z "$action" || -z "$dir" ]]; then
  echo "usage: $0 start DIR [FIRST_PORT] | stop DIR" >&2
  exit 64
fi

case "$action" in
  start)
    first_port=${3:-50561}
    mkdir -p "$dir"
    chmod 755 "$dir"
    dotnet build src/Hull.Server -c Release --nologo -v quiet >/dev/null
    mkdir -p "$dir/postgres"
    chmod 755 "$dir/postgres"
    connection="$(bash scripts/postgres-throwaway.sh start "$dir/postgres");Search Path=hull"
    for n in 0 1 2; do
      port=$((first_port + n))
      HULL_POSTGRES="$connection" nohup dotnet src/Hull.Server/bin/Release/net10.0/Hull.Server.dll --port "$port" \
        >"$dir/server-$n.log" 2>&1 &
      echo $! >"$dir/server-$n.pid"
    done
    for n in 0 1 2; do
      for _ in $(seq 1 120); do
        grep -q "hull server listening on" "$dir/server-$n.log" && break
        kill -0 "$(cat "$dir/server-$n.pid")" 2>/dev/null || { echo "server $n failed:" >&2; cat "$dir/server-$n.log" >&2; exit 1; }
        sleep 0.5
      done
      grep "hull server listening on" "$dir/server-$n.log" || { echo "server $n did not start in 60 s" >&2; exit 1; }
    done
    ;;
  stop)
    for n in 0 1 2; do
      if [[ -f "$dir/server-$n.pid" ]]; then
        kill -TERM "$(cat "$dir/server-$n.pid")" 2>/dev/null || true
        rm -f "$dir/server-$n.pid"
      fi
    done
    bash scripts/postgres-throwaway.sh stop "$dir/postgres"
    ;;
  *)
    echo "usage: $0 start DIR [FIRST_PORT] | stop DIR" >&2
    exit 64
    ;;
esac
