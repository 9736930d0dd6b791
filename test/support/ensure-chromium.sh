#!/usr/bin/env bash
# Browser tests need Debian's Chromium. Install it when it is missing (as root), or say how in one line.
set -euo pipefail
browser="${CHROMIUM_PATH:-/usr/bin/chromium}"
if [ -x "$browser" ]; then exit 0; fi
if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
  echo "Chromium is missing: installing Debian's chromium package for the browser tests…"
  apt-get -o DPkg::Lock::Timeout=300 update -qq
  DEBIAN_FRONTEND=noninteractive apt-get -o DPkg::Lock::Timeout=300 install -y -qq chromium >/dev/null
  [ -x "$browser" ] && exit 0
fi
echo "Browser tests need Debian's Chromium: run 'sudo apt-get install -y chromium' (or set CHROMIUM_PATH), then npm test again." >&2
exit 1
