#!/usr/bin/env bash
# npm run backup: a compressed mariadb-dump of the app's database into .data/backups/<UTC time>.sql.gz
# (DATABASE_URL when set, else the private MariaDB of npm start). See scripts/lib/backup.ts.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-system.sh
exec node --import tsx scripts/backup.ts "$@"
