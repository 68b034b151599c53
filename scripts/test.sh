#!/usr/bin/env bash
# npm test: the whole check, as CI runs it (bash .ci/run). Sets up a PostgreSQL cluster of
# its own (separate from npm start's), then: format, lint, type-check, unit and API tests,
# client build, and browser tests against a server on port 4310. Every step runs even after
# a failure, so one report shows them all; the exit code is non-zero if any failed.
set -uo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$CW_REPO"

PG_TEST_PORT="${CW_PG_TEST_PORT:-54331}"
BROWSER_PORT="${CW_BROWSER_TEST_PORT:-4310}"
DB_NAME=chainwright_test
export CI="${CI:-}" NG_CLI_ANALYTICS=false
FAILED=()

stop_all_on_exit

# run_step NAME COMMAND...: runs one step, prints its result, remembers failures.
run_step() {
  local name="$1" started
  shift
  step "$name"
  started=$(date +%s)
  if "$@"; then
    note "ok: $name ($(($(date +%s) - started)) s)"
  else
    note "FAILED: $name ($(($(date +%s) - started)) s)"
    FAILED+=("$name")
  fi
}

# ---------------------------------------------------------------- set-up (fatal on failure)
set -e
ensure_node_modules
ensure_postgres_binaries
missing=()
# Fonts too: without recommended packages Chromium would have none to lay text out with.
command -v chromium >/dev/null || missing+=(chromium fonts-liberation fonts-dejavu-core)
command -v ngspice >/dev/null || missing+=(ngspice)
# The report's browser test reads the printed PDF back with poppler's pdftotext and pdfinfo.
command -v pdftotext >/dev/null || missing+=(poppler-utils)
if [ ${#missing[@]} -gt 0 ]; then
  step "Installing ${missing[*]} from Debian"
  apt_install "${missing[@]}"
fi
pg_up pg-test "$PG_TEST_PORT"
step "Creating a fresh test database"
db_drop "$DB_NAME"
db_create "$DB_NAME"
# The browser tests' server connects as the application role, as npm start's does; the API
# tests connect as the superuser, because each test file creates a schema of its own.
db_roles "$DB_NAME"
export CW_TEST_DATABASE_URL
CW_TEST_DATABASE_URL="$(pg_url "$DB_NAME")"
printf 'CW_TEST_DATABASE_URL=%s\n' "$CW_TEST_DATABASE_URL" >.data/test.env
chmod 600 .data/test.env
export CHROME_PATH="${CHROME_PATH:-$(command -v chromium)}"
set +e

# ---------------------------------------------------------------- checks
run_step "Format (prettier --check .)" npx prettier --check . --log-level warn
run_step "Lint (eslint .)" npx eslint . --max-warnings 0
run_step "Type-check server, shared, scripts, tests" npx tsc --noEmit -p tsconfig.server.json
run_step "Type-check client" npx tsc --noEmit -p tsconfig.app.json
# The client's specs: jest transpiles them without types (tsconfig.spec.json), so their types
# are checked here, resolved as the app resolves them.
run_step "Type-check client tests" npx tsc --noEmit -p tsconfig.spec-check.json
# The browser tests run callbacks inside the page, so they are checked with the DOM types.
run_step "Type-check browser tests" npx tsc --noEmit -p tsconfig.browser-check.json
# --forceExit: on a 2-core machine jest runs the files in its own process, and a handle some
# library leaves open after the last file (not yet traced) kept it from exiting.
JEST_RESULTS=.data/jest-results.json
rm -f "$JEST_RESULTS"
run_step "Unit and API tests (jest: engine, server, client)" \
  npx jest --ci --forceExit --json --outputFile="$JEST_RESULTS"
run_step "Client build (ng build)" npx ng build

browser_tests() {
  if [ ! -f jest.browser.config.js ]; then
    printf 'jest.browser.config.js is missing: the browser tests cannot run\n' >&2
    return 1
  fi
  DATABASE_URL="$APP_URL" CW_OWNER_DATABASE_URL="$OWNER_URL" \
    node --import tsx scripts/db.ts migrate seed || return 1
  # Browser tests sign in often from one address: lift the failed-sign-in limit for them.
  # Mail goes to the local catcher; the tests read what it caught from CW_MAIL_DIR.
  export CW_MAIL_DIR="$CW_REPO/.data/mail-test"
  rm -rf "$CW_MAIL_DIR"
  DATABASE_URL="$APP_URL" PORT="$BROWSER_PORT" CW_SIGNIN_LIMIT=100000 \
    CW_SMTP_PORT="${CW_SMTP_TEST_PORT:-2531}" start_node_ts server/main.ts
  if ! wait_for_http "http://127.0.0.1:$BROWSER_PORT/api/health"; then
    printf 'the server did not answer on port %s\n' "$BROWSER_PORT" >&2
    stop_node
    return 1
  fi
  # One study worker for the studies page's test.
  DATABASE_URL="$APP_URL" start_workers 1
  local rc=0
  BASE_URL="http://127.0.0.1:$BROWSER_PORT" npx jest -c jest.browser.config.js --ci || rc=$?
  stop_workers
  stop_node
  return $rc
}
run_step "Browser tests (server on :$BROWSER_PORT, jest -c jest.browser.config.js)" browser_tests

# ---------------------------------------------------------------- report
if [ ${#FAILED[@]} -gt 0 ]; then
  # The end of the log is what a CI summary shows: name the failed unit and API tests there.
  if printf '%s\n' "${FAILED[@]}" | grep -q '^Unit and API tests'; then
    node scripts/lib/jest-failures.cjs "$JEST_RESULTS"
  fi
  printf '\nnpm test FAILED in %d step(s):\n' "${#FAILED[@]}"
  printf '  - %s\n' "${FAILED[@]}"
  exit 1
fi
printf '\nnpm test passed: every step is green.\n'
