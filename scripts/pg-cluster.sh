#!/usr/bin/env bash
# bash scripts/pg-cluster.sh start NAME PORT | stop NAME | remove NAME
# A throwaway PostgreSQL cluster of its own in .data/NAME (for tests that must stop and start
# their database, e.g. the outage test), never the one npm start or npm test use.
# `start` prints the superuser URL of its `postgres` database as the last line: CW_PG_URL=...
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$CW_REPO"
action="${1:-}" name="${2:-}"
case "$name" in
  pg | pg-test | "") die "name a cluster of its own (not pg or pg-test): $0 start NAME PORT" ;;
esac
base="$(pg_base_dir "$name")"
case "$action" in
  start)
    ensure_postgres_binaries
    pg_up "$name" "${3:?give the port}" >&2
    echo "CW_PG_URL=$(pg_url postgres)"
    ;;
  stop) pg_stop_dir "$base/data" ;;
  remove)
    pg_stop_dir "$base/data"
    rm -rf "$base"
    ;;
  *) die "actions: start NAME PORT, stop NAME, remove NAME" ;;
esac
