#!/usr/bin/env bash
# npm start: install what is missing, start the private MariaDB and mail catcher, migrate, seed, build, serve.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-system.sh
bash scripts/ensure-deps.sh
exec node --import tsx scripts/start.ts "$@"
