#!/usr/bin/env bash
# Runs `npm ci` when node_modules is missing or was installed from another package-lock.json.
set -euo pipefail
cd "$(dirname "$0")/.."
stamp=node_modules/.tallymark-lock.sha256
want=$(sha256sum package-lock.json | cut -d' ' -f1)
if [ -d node_modules ] && [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$want" ] && [ -x node_modules/.bin/nuxt ]; then
  exit 0
fi
echo "Installing npm packages (npm ci)..."
npm ci --no-audit --no-fund
echo "$want" > "$stamp"
