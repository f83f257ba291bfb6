#!/usr/bin/env bash
# npm run dev: the same services as npm start, with the Nuxt dev server (hot reload) instead of a build.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-system.sh
bash scripts/ensure-deps.sh
exec node --import tsx scripts/start.ts --dev "$@"
