#!/usr/bin/env bash
# npm run db:seed: seeds the demo team into the database (the private one unless DATABASE_URL is set).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-system.sh
bash scripts/ensure-deps.sh
exec node --import tsx scripts/seed.ts "$@"
