#!/usr/bin/env bash
# npm test: the same self-setup with a throwaway database, then lint, type-check and every test.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-system.sh --browser
bash scripts/ensure-deps.sh
exec node --import tsx scripts/test.ts "$@"
