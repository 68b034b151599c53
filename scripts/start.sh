#!/usr/bin/env bash
# npm start: sets up everything on a fresh Debian machine (npm packages, PostgreSQL, the
# database, migrations, demo data, the client build) and serves Chainwright on
# http://127.0.0.1:4300 (PORT overrides). Ctrl-C stops the server and PostgreSQL; the next
# start reuses the data in .data/.
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$CW_REPO"

PORT="${PORT:-4300}"
PG_CLUSTER_PORT="${CW_PG_PORT:-54330}"
SMTP_PORT="${CW_SMTP_PORT:-2530}"
DB_NAME=chainwright

stop_all_on_exit

ensure_node_modules
ensure_postgres_binaries
pg_up pg "$PG_CLUSTER_PORT"
db_create "$DB_NAME"
step "Setting up the database roles (owner for migrations, application role for the server)"
db_roles "$DB_NAME"
# The server connects as the application role; migrations run as the owner.
export DATABASE_URL="$APP_URL" CW_OWNER_DATABASE_URL="$OWNER_URL"
# For `npm run db:migrate`, db:backup and friends in another terminal while this one serves.
printf 'DATABASE_URL=%s\nCW_OWNER_DATABASE_URL=%s\n' "$DATABASE_URL" "$CW_OWNER_DATABASE_URL" >.data/dev.env
chmod 600 .data/dev.env

step "Applying migrations and demo data"
node --import tsx scripts/db.ts migrate seed

if [ ! -f angular.json ]; then
  note "angular.json is missing: the client is not set up yet; serving the API only"
elif client_build_stale; then
  step "Building the client (npx ng build)"
  # A broken client build should not keep the API from starting: say so and go on with
  # the previous build, if any.
  npx ng build || note "WARNING: the client build failed (messages above); serving the previous build, if any"
else
  note "Client build is up to date"
fi

# A session secret kept across restarts, so sign-ins survive a restart.
if [ ! -s .data/session-secret ]; then
  head -c 32 /dev/urandom | od -An -tx1 | tr -d ' \n' >.data/session-secret
  chmod 600 .data/session-secret
fi

# Production runs compiled JavaScript: the server and its analysis thread as esbuild bundles.
step "Bundling the server (esbuild)"
node --import tsx scripts/build-server.ts

step "Starting Chainwright"
export PORT CW_SMTP_PORT="$SMTP_PORT" CW_MAIL_DIR="$CW_REPO/.data/mail"
export CW_SESSION_SECRET
CW_SESSION_SECRET="$(cat .data/session-secret)"
# The garbage collector's options, and why, are in scripts/lib/server-v8-flags.
mapfile -t V8_FLAGS < <(grep -v '^#' scripts/lib/server-v8-flags | grep .)
node --enable-source-maps "${V8_FLAGS[@]}" dist/server/main.js &
NODE_PID=$!
if ! wait_for_http "http://127.0.0.1:$PORT/api/health"; then
  die "the server did not answer on port $PORT (see its messages above)"
fi
# Study workers (Monte Carlo, band, optimiser) beside the server: CW_WORKERS=0 for none.
WORKERS="${CW_WORKERS:-1}"
if [ "$WORKERS" -gt 0 ]; then
  step "Starting $WORKERS study worker(s)"
  start_workers "$WORKERS" bundled
fi

cat <<EOF

  Chainwright is running in DEMO mode:  http://127.0.0.1:$PORT
  (demo accounts with a published password, mail caught locally: never expose this to a
  network; README.md "Production mode" says how to run it for real)

  Demo sign-ins (password for all three: demo-receiver-2026)
    owner@chainwright.test    owner of "Demo receivers", site admin
    editor@chainwright.test   editor
    viewer@chainwright.test   viewer

  Mail the app sends is written to .data/mail/
  Press Ctrl-C to stop the server and PostgreSQL.

EOF
wait "$NODE_PID" || true
