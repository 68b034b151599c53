#!/usr/bin/env bash
# npm run db:backup [-- FILE]: writes a backup of the product's database with pg_dump (custom
# format) to FILE, by default .data/backups/chainwright-<UTC time>.dump. Connects as the
# owner role (CW_OWNER_DATABASE_URL, else DATABASE_URL; npm start leaves both in .data/dev.env).
# Sessions and sign-in counters are left out: a restore signs everyone out.
set -euo pipefail
source "$(dirname "$0")/lib/common.sh"
cd "$CW_REPO"
load_dev_env
URL="${CW_OWNER_DATABASE_URL:-${DATABASE_URL:-}}"
[ -n "$URL" ] || die "set CW_OWNER_DATABASE_URL (or DATABASE_URL), or run npm start once so .data/dev.env has it"
ensure_postgres_binaries

FILE="${1:-$CW_REPO/.data/backups/chainwright-$(date -u +%Y%m%dT%H%M%SZ).dump}"
mkdir -p "$(dirname "$FILE")"
step "Backing up the database to $FILE"
"$PG_BIN/pg_dump" --format=custom --no-owner --no-privileges \
  --exclude-table-data=user_session --exclude-table-data=rate_limit_hit \
  --file="$FILE" --dbname="$URL"
chmod 600 "$FILE"
note "Done: $(du -h "$FILE" | cut -f1) in $FILE"
note "Restore it with: npm run db:restore -- $FILE"
