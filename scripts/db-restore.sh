#!/usr/bin/env bash
# npm run db:restore -- FILE: replaces everything in the product's database with the backup
# FILE (made by npm run db:backup), in one transaction: if any part fails, nothing changes.
# Then applies migrations newer than the backup and grants the application role its rights.
# Stop the server first. Connects as the owner role (CW_OWNER_DATABASE_URL, else DATABASE_URL).
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$CW_REPO"
load_dev_env
FILE="${1:-}"
[ -n "$FILE" ] && [ -f "$FILE" ] || die "name the backup to restore: npm run db:restore -- .data/backups/<file>.dump"
URL="${CW_OWNER_DATABASE_URL:-${DATABASE_URL:-}}"
[ -n "$URL" ] || die "set CW_OWNER_DATABASE_URL (or DATABASE_URL), or run npm start once so .data/dev.env has it"
ensure_postgres_binaries

step "Restoring $FILE (this replaces the database's contents)"
"$PG_BIN/pg_restore" --clean --if-exists --no-owner --no-privileges --single-transaction \
  --exit-on-error --dbname="$URL" "$FILE"
step "Applying newer migrations and the application role's rights"
CW_OWNER_DATABASE_URL="$URL" node --import tsx scripts/db.ts migrate
note "Restored. Everyone signs in again."
