#!/usr/bin/env bash
# The browser tests drive Debian's Chromium. Install it when it is missing and we may (root with
# apt-get); otherwise say what to do. CHROMIUM_PATH points the tests at another build.
set -euo pipefail
browser="${CHROMIUM_PATH:-/usr/bin/chromium}"
[ -x "$browser" ] && exit 0
if [ "$(id -u)" = 0 ] && command -v apt-get >/dev/null; then
  echo "Installing Debian's chromium for the browser tests…"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -qq
  apt-get install -y -qq chromium >/dev/null
else
  echo "The browser tests need Chromium at $browser: run 'sudo apt-get install chromium' or set CHROMIUM_PATH." >&2
  exit 1
fi
