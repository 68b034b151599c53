#!/usr/bin/env bash
# npm run test:db [-- stop]: starts (or stops) the PostgreSQL cluster the API tests use, so
# a single test file can run on its own:  npx jest test/api/chains.test.ts
# The cluster is separate from the one `npm start` uses; its URL goes to .data/test.env.
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$CW_REPO"
PG_TEST_PORT="${CW_PG_TEST_PORT:-54331}"

if [ "${1:-}" = stop ]; then
  base="$(pg_base_dir pg-test)"
  as_pg "$PG_BIN/pg_ctl" -D "$base/data" -m fast -w stop
  exit 0
fi
ensure_node_modules
ensure_postgres_binaries
pg_up pg-test "$PG_TEST_PORT"
db_create chainwright_test
printf 'CW_TEST_DATABASE_URL=%s\n' "$(pg_url chainwright_test)" >.data/test.env
chmod 600 .data/test.env
note "Test database ready; stop it with: npm run test:db -- stop"
