#!/usr/bin/env bash
# One-time set-up of a fresh Debian machine (run as root): the reference
# simulator and the browser that the tests drive, then the exact npm packages.
set -euo pipefail
cd "$(dirname "$0")/.."
need=()
command -v ngspice >/dev/null 2>&1 || need+=(ngspice)
command -v chromium >/dev/null 2>&1 || need+=(chromium)
if [ ${#need[@]} -gt 0 ]; then
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq "${need[@]}" fonts-dejavu-core
fi
npm ci --no-audit --no-fund
