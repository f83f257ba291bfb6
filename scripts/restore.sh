#!/usr/bin/env bash
# npm run restore -- <file>: replaces the app's database with a backup from npm run backup, after checking
# that the file is a complete dump. See scripts/lib/backup.ts.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ $# -lt 1 ] || [ -z "${1:-}" ]; then
  echo "Usage: npm run restore -- <backup.sql.gz>   (backups are in .data/backups/; nothing was changed)" >&2
  exit 2
fi
bash scripts/ensure-system.sh
exec node --import tsx scripts/restore.ts "$@"
