#!/usr/bin/env bash
# Browser smoke test of a served dist/: the page must show a plan the core computed in
# WebAssembly; then the full interaction test (tests/browser/interact.py, through chromedriver).
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

profile_dir="$(mktemp -d)"
dom_file="$profile_dir/dom.html"
trap 'rm -rf "$profile_dir"' EXIT

# Values index.html cannot contain: only the wasm core planning the demo load puts a generator
# count and the scenario's title on the page.
page_url="${base_url%/}/?demo=tempering-beef-blocks"

echo "smoke: loading $page_url in headless Chromium"
found=""
# Virtual time makes --dump-dom wait for the wasm to load; retry with a longer budget in case a
# slow machine needs more.
for budget_ms in 5000 15000 30000; do
    timeout 120 "$chromium" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
        --disable-background-networking --disable-component-update --disable-sync \
        --user-data-dir="$profile_dir/profile-$budget_ms" --virtual-time-budget="$budget_ms" \
        --dump-dom "$page_url" >"$dom_file" 2>"$profile_dir/chromium.log" || true
    count="$(sed -n 's/.*data-testid="result-generator_count" data-value="\([0-9]*\)".*/\1/p' "$dom_file" | head -n 1)"
    if [ -n "$count" ] && [ "$count" -gt 0 ]; then
        found=1
        break
    fi
    echo "smoke: no generator count after ${budget_ms} ms of virtual time"
done

if [ -z "$found" ]; then
    echo "smoke: FAILED: the page never showed a plan; the page was:" >&2
    head -c 4000 "$dom_file" >&2
    exit 1
fi
grep -q 'Tempering frozen beef blocks at 915 MHz' "$dom_file" || {
    echo "smoke: FAILED: the demo load named in the address is not shown" >&2
    exit 1
}
if grep -q 'id="boot-status"' "$dom_file"; then
    echo "smoke: FAILED: the boot message is still on the page" >&2
    exit 1
fi
echo "smoke: ok, the wasm core planned the demo load: $count generators"

python3 "$here/interact.py" "$base_url"
