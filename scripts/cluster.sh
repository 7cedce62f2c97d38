#!/usr/bin/env bash
# A three-member cluster on one machine, on loopback, over one throwaway PostgreSQL (store and membership), for
# trying the cluster without a container tool:
#   scripts/cluster.sh start DIR [FIRST_PORT]   PostgreSQL in DIR/postgres (scripts/postgres-throwaway.sh) and members
#                                               answering gRPC on 127.0.0.1:FIRST_PORT..+2 (default 50561), peers on
#                                               50651..50653, gateways on 50751..50753; prints their addresses; logs
#                                               in DIR/member-N.log
#   scripts/cluster.sh stop DIR                 stops the members (SIGTERM, then SIGKILL after 15 s) and PostgreSQL,
#                                               and removes DIR
# Builds src/Hull.Server in Release first.
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
    mkdir -p "$dir/postgres"
    chmod 755 "$dir" "$dir/postgres"
    dotnet build src/Hull.Server -c Release --nologo -v quiet >/dev/null
    connection="$(bash scripts/postgres-throwaway.sh start "$dir/postgres");Search Path=hull"
    for n in 0 1 2; do
      HULL_POSTGRES="$connection" nohup dotnet src/Hull.Server/bin/Release/net10.0/Hull.Server.dll --port $((first_port + n)) \
        --cluster trial --peer-port $((50651 + n)) --gateway-port $((50751 + n)) >"$dir/member-$n.log" 2>&1 &
      echo $! >"$dir/member-$n.pid"
    done
    for n in 0 1 2; do
      for _ in $(seq 1 120); do
        grep -q "hull server listening on" "$dir/member-$n.log" && break
        kill -0 "$(cat "$dir/member-$n.pid")" 2>/dev/null || { echo "member $n failed:" >&2; cat "$dir/member-$n.log" >&2; exit 1; }
        sleep 0.5
      done
      grep "hull server listening on" "$dir/member-$n.log" || { echo "member $n did not start in 60 s" >&2; exit 1; }
    done
    ;;
  stop)
    for n in 0 1 2; do
      [[ -f "$dir/member-$n.pid" ]] && kill -TERM "$(cat "$dir/member-$n.pid")" 2>/dev/null || true
    done
    for n in 0 1 2; do
      if [[ -f "$dir/member-$n.pid" ]]; then
        pid=$(cat "$dir/member-$n.pid")
        for _ in $(seq 1 30); do kill -0 "$pid" 2>/dev/null || break; sleep 0.5; done
        kill -KILL "$pid" 2>/dev/null || true
        rm -f "$dir/member-$n.pid"
      fi
    done
    bash scripts/postgres-throwaway.sh stop "$dir/postgres"
    rm -rf "$dir"
    ;;
  *)
    echo "usage: $0 start DIR [FIRST_PORT] | stop DIR" >&2
    exit 64
    ;;
esac
