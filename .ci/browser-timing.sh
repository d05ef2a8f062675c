#!/usr/bin/env bash
# The browser timing harness: builds the app and a release command-line tool, then times the
# shared workloads in headless Chromium (WebAssembly) and natively, and the first plan on screen
# (tests/browser/timing.py). Reports, asserts no time. Arguments go to timing.py, e.g.
#   bash .ci/browser-timing.sh --budget-ms 1000 --loads 10
# The figures also go to target/browser-timing.json.
set -euo pipefail
# shellcheck source=common.sh source-path=SCRIPTDIR
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$repo_root"

bash .ci/setup.sh
bash .ci/build-web.sh
locked=()
if [ "${CI:-}" = "true" ]; then locked=(--locked); fi
cargo build "${locked[@]}" --release --bin doubleprime
python3 tests/browser/timing.py dist --cli "$repo_root/target/release/doubleprime" "$@"
