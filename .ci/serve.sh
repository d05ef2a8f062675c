#!/usr/bin/env bash
# Builds the browser app and serves it on http://127.0.0.1:8080 (PORT overrides the port).
set -euo pipefail
# shellcheck source=common.sh source-path=SCRIPTDIR
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$repo_root"

port="${PORT:-8080}"
bash .ci/setup.sh --no-browser
bash .ci/build-web.sh

# Point at the first demo load when there is one, so the link opens a ready scenario.
url="http://127.0.0.1:$port/"
first_demo="$(find demo-loads -maxdepth 1 -name '*.json' 2>/dev/null | sort | head -n 1)"
if [ -n "$first_demo" ]; then
    url="${url}?demo=$(basename "$first_demo" .json)"
fi
log "open $url (any demo: ?demo=NAME, NAME from demo-loads/NAME.json); Ctrl+C stops"

# Only where a desktop session can show a window; never fail over it.
if [ -n "${DISPLAY:-}" ] && command -v xdg-open >/dev/null 2>&1; then
    (sleep 1 && xdg-open "$url" >/dev/null 2>&1) &
fi
exec python3 .ci/serve_dist.py dist "$port"
