#!/usr/bin/env bash
# Installs the Debian packages Tallymark needs when they are missing (run as root on Debian 12).
# Usage: ensure-system.sh [--browser]   (--browser adds Chromium for the browser tests)
set -euo pipefail
want=()
command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || want+=(mariadb-server)
command -v mariadb >/dev/null 2>&1 || want+=(mariadb-client)
[ -f /usr/share/iso-codes/json/iso_3166-3.json ] || want+=(iso-codes)
[ -d /usr/share/fonts/truetype/dejavu ] || want+=(fonts-dejavu-core)
if [ "${1:-}" = "--browser" ]; then
  [ -x /usr/bin/chromium ] || want+=(chromium)
fi
if [ ${#want[@]} -eq 0 ]; then exit 0; fi
if [ "$(id -u)" != "0" ]; then
  echo "Tallymark needs these Debian packages: ${want[*]}. Install them as root: apt-get install ${want[*]}" >&2
  exit 1
fi
echo "Installing Debian packages: ${want[*]}"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq --no-install-recommends "${want[@]}"
