#!/usr/bin/env bash
# Browser test of a served dist/: tests/browser/interact.py through chromedriver, which first
# waits (in real time) for a plan the core computed in WebAssembly, then checks the page against
# the CLI. An earlier `chromium --dump-dom --virtual-time-budget` check here was dropped: in 2 and
# 4 of 6 loads (a new build and an old one) it dumped the page before the app had started, most
# likely because virtual time does not wait for work off the main thread (the module's
# decompression and compilation).
#
#   tests/browser/smoke.sh http://127.0.0.1:PORT/
#
# CHROMIUM and CHROMEDRIVER override the browser and driver (default: from PATH).
set -euo pipefail

base_url="${1:?usage: smoke.sh BASE_URL}"
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
chromium="${CHROMIUM:-$(command -v chromium || command -v chromium-browser || command -v google-chrome || true)}"
[ -n "$chromium" ] || {
    echo "smoke: no Chromium found (set CHROMIUM)" >&2
    exit 1
}

python3 "$here/interact.py" "$base_url"
