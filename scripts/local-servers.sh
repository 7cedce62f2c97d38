#!/usr/bin/env bash
# Three hull servers on loopback over one throwaway PostgreSQL store, shared by scripts/three-servers.sh (replicas)
# and scripts/cluster.sh (cluster members): source it, then
#   local_servers_start NAME DIR FIRST_PORT [SERVER ARGUMENTS...]   and   local_servers_stop NAME DIR
# NAME names the log and pid files (DIR/NAME-N.log); a server argument PORT{+n} is PORT, PORT+1, PORT+2. start builds
# src/Hull.Server in Release, starts PostgreSQL in DIR/postgres (scripts/postgres-throwaway.sh) and the servers on
# 127.0.0.1:FIRST_PORT..+2 (default 50561), and prints their addresses; stop sends SIGTERM, then SIGKILL after 15 s,
# and stops PostgreSQL.

local_servers_usage() {
  echo "usage: $1 start DIR [FIRST_PORT] | stop DIR" >&2
  exit 64
}

local_servers_start() {
  local name=$1 dir=$2 first_port=$3
  shift 3
  mkdir -p "$dir/postgres"
  chmod 755 "$dir" "$dir/postgres"
  dotnet build src/Hull.Server -c Release --nologo -v quiet >/dev/null
  local connection
  connection="$(bash scripts/postgres-throwaway.sh start "$dir/postgres");Search Path=hull"
  local n arg args
  for n in 0 1 2; do
    args=()
    for arg in "$@"; do
      if [[ $arg =~ ^([0-9]+)\{\+n\}$ ]]; then args+=($((BASH_REMATCH[1] + n))); else args+=("$arg"); fi
    done
    HULL_POSTGRES="$connection" nohup dotnet src/Hull.Server/bin/Release/net10.0/Hull.Server.dll --port $((first_port + n)) "${args[@]}" \
      >"$dir/$name-$n.log" 2>&1 &
    echo $! >"$dir/$name-$n.pid"
  done
  for n in 0 1 2; do
    for _ in $(seq 1 120); do
      grep -q "hull server listening on" "$dir/$name-$n.log" && break
      kill -0 "$(cat "$dir/$name-$n.pid")" 2>/dev/null || { echo "$name $n failed:" >&2; cat "$dir/$name-$n.log" >&2; exit 1; }
      sleep 0.5
    done
    grep "hull server listening on" "$dir/$name-$n.log" || { echo "$name $n did not start in 60 s" >&2; exit 1; }
  done
}

local_servers_stop() {
  local name=$1 dir=$2 n pid
  for n in 0 1 2; do
    [[ -f "$dir/$name-$n.pid" ]] && kill -TERM "$(cat "$dir/$name-$n.pid")" 2>/dev/null || true
  done
  for n in 0 1 2; do
    if [[ -f "$dir/$name-$n.pid" ]]; then
      pid=$(cat "$dir/$name-$n.pid")
      for _ in $(seq 1 30); do kill -0 "$pid" 2>/dev/null || break; sleep 0.5; done
      kill -KILL "$pid" 2>/dev/null || true
      rm -f "$dir/$name-$n.pid"
    fi
  done
  bash scripts/postgres-throwaway.sh stop "$dir/postgres"
}
