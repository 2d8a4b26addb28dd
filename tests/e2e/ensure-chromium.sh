#!/usr/bin/env bash
# The browser tests drive Debian's Chromium; install it when it is missing (needs root and Debian's package lists).
set -euo pipefail
browser="${CHROMIUM_PATH:-/usr/bin/chromium}"
if [ -x "$browser" ]; then exit 0; fi
if [ "$(id -u)" != "0" ]; then
  echo "Chromium is missing at $browser. Install it with: sudo apt-get install -y chromium" >&2
  exit 1
fi
echo "Installing Debian Chromium for the browser tests"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq chromium >/dev/null
