#!/usr/bin/env bash
# The browser tests drive Debian's Chromium (never a downloaded browser build). Install it when
# it is missing and we may (CI runs as root); otherwise say what to do.
set -euo pipefail
chromium="${CHROMIUM_PATH:-/usr/bin/chromium}"
if [ -x "$chromium" ]; then exit 0; fi
if [ "$(id -u)" -eq 0 ] && command -v apt-get >/dev/null; then
	echo "Installing Debian's chromium for the browser tests…"
	apt-get update -qq
	DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
	exit 0
fi
echo "The browser tests need Chromium at $chromium: run 'sudo apt-get install chromium' (or set CHROMIUM_PATH)." >&2
exit 1
