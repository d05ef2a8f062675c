#!/usr/bin/env bash
# Everything CI checks, in order: setup, format, lints, native tests, the wasm build, and the
# built page in headless Chromium. Exits non-zero at the first failure.
set -euo pipefail
# shellcheck source=common.sh source-path=SCRIPTDIR
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$repo_root"

test_started=$SECONDS
# step NAME COMMAND...: run one step with its name and duration in the log.
steps_passed=0
step() {
    local name="$1" started=$SECONDS
    shift
    log "$name"
    "$@"
    steps_passed=$((steps_passed + 1))
    log "$name: ok ($((SECONDS - started)) s)"
}

# In CI the committed Cargo.lock must already be complete.
locked=()
if [ "${CI:-}" = "true" ]; then locked=(--locked); fi

step "setup" bash .ci/setup.sh
step "cargo fmt --check" cargo fmt --all -- --check
step "cargo clippy" cargo clippy "${locked[@]}" --all-targets -- -D warnings
step "cargo test" cargo test "${locked[@]}"
# The browser code, linted and unit-tested natively (Leptos builds for the host too), so one
# command serves the rustup and the Debian routes alike: about 3 minutes from cold, together.
step "cargo clippy --features web" cargo clippy "${locked[@]}" --features web --all-targets -- -D warnings
step "cargo test --features web (browser code, native)" \
    cargo test "${locked[@]}" --features web --bin doubleprime-web
step "wasm build" bash .ci/build-web.sh

server_dir="$(mktemp -d)"
server_pid=""
stop_server() {
    if [ -n "$server_pid" ]; then
        kill "$server_pid" 2>/dev/null || true
        wait "$server_pid" 2>/dev/null || true
    fi
    rm -rf "$server_dir"
}
trap stop_server EXIT

# Port 0: the server takes a free port and names it on its first line.
python3 .ci/serve_dist.py dist 0 >"$server_dir/out" 2>"$server_dir/requests.log" &
server_pid=$!
base_url=""
for _ in $(seq 100); do
    base_url="$(sed -n 's/^serving .* at \(http:[^ ]*\)$/\1/p' "$server_dir/out")"
    [ -n "$base_url" ] && break
    kill -0 "$server_pid" 2>/dev/null || fail "the test server exited: $(cat "$server_dir/requests.log")"
    sleep 0.1
done
[ -n "$base_url" ] || fail "the test server did not start"
# The browser test checks the page's numbers against the command-line tool that `cargo test`
# built, and the server's request log for requests after load.
cli_bin="$(cargo metadata --format-version 1 --no-deps |
    python3 -c 'import json, sys; print(json.load(sys.stdin)["target_directory"])')/debug/doubleprime"
step "cargo build (the CLI the browser test compares with)" cargo build "${locked[@]}" --bin doubleprime
step "browser tests at $base_url" env DOUBLEPRIME_CLI="$cli_bin" REQUEST_LOG="$server_dir/requests.log" \
    bash tests/browser/smoke.sh "$base_url"
# Saving, importing, the link, the exports, the printed quote, blocked storage, the offline copy
# and the single file from file://. It serves dist/ itself, since one check stops the server.
step "browser tests: scenarios that last and travel" env DOUBLEPRIME_CLI="$cli_bin" \
    python3 tests/browser/persist.py dist
# 10,000 rapid edits of the form: the plan on screen keeps up with the last valid input, and the
# JS heap, the wasm memory and the DOM stop growing after a warm-up (about a minute).
step "browser tests: soak of 10,000 edits" env DOUBLEPRIME_CLI="$cli_bin" \
    python3 tests/browser/soak.py "$base_url"

# The timing harness, briefly (20 ms a workload, two loads, the debug CLI): proves it runs from a
# clean clone. Its figures are reported only; `bash .ci/browser-timing.sh` gives the real ones.
step "browser timing harness (report only)" \
    python3 tests/browser/timing.py dist --cli "$cli_bin" --budget-ms 20 --loads 2 --out "$repo_root/target/browser-timing-quick.json"

log "all checks passed in $((SECONDS - test_started)) s"
# The plain closing line CI reads: every step above ran and passed (set -e stops at the first failure).
echo "checks: $steps_passed passed, 0 failed"
