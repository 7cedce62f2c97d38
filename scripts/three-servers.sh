#!/usr/bin/env bash
# Three hull servers on one machine sharing one throwaway PostgreSQL store, for trying several servers without a
# container tool:
#   scripts/three-servers.sh start DIR [FIRST_PORT]   a PostgreSQL cluster in DIR/postgres (scripts/postgres-throwaway.sh)
#                                                     and servers on 127.0.0.1:FIRST_PORT..+2 (default 50561); prints
#                                                     their addresses; logs in DIR/server-N.log
#   scripts/three-servers.sh stop DIR                 stops the servers (SIGTERM, then SIGKILL after 15 s) and the
#                                                     cluster; then remove DIR
# Builds src/Hull.Server in Release first. Everything in the cluster is thrown away with DIR.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/local-servers.sh

case "${1:-}" in
  start) [[ -n "${2:-}" ]] || local_servers_usage "$0"; local_servers_start server "$2" "${3:-50561}" ;;
  stop) [[ -n "${2:-}" ]] || local_servers_usage "$0"; local_servers_stop server "$2" ;;
  *) local_servers_usage "$0" ;;
esac
