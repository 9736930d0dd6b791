#!/usr/bin/env bash
# The push-down tests run every generated query on a real PostgreSQL server. Install Debian's postgresql package
# when it is missing (as root), or say how in one line. The test run starts its own throw-away cluster.
set -euo pipefail
bin="${LURK_PG_BIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)}"
if [ -n "$bin" ] && [ -x "$bin/initdb" ] && [ -x "$bin/pg_ctl" ]; then exit 0; fi
if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
  echo "PostgreSQL is missing: installing Debian's postgresql package for the push-down tests…"
  apt-get -o DPkg::Lock::Timeout=300 update -qq
  DEBIAN_FRONTEND=noninteractive apt-get -o DPkg::Lock::Timeout=300 install -y -qq postgresql >/dev/null
  bin="$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)"
  [ -n "$bin" ] && [ -x "$bin/initdb" ] && exit 0
fi
echo "The push-down tests need a PostgreSQL server: run 'sudo apt-get install -y postgresql', then npm test again." >&2
exit 1
