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
source scripts/local-servers.sh

case "${1:-}" in
  start)
    [[ -n "${2:-}" ]] || local_servers_usage "$0"
    local_servers_start member "$2" "${3:-50561}" --cluster trial --peer-port '50651{+n}' --gateway-port '50751{+n}'
    ;;
  stop)
    [[ -n "${2:-}" ]] || local_servers_usage "$0"
    local_servers_stop member "$2"
    rm -rf "$2"
    ;;
  *) local_servers_usage "$0" ;;
esac
