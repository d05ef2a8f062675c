#!/usr/bin/env bash
# The size report: builds the app (.ci/build-web.sh) and reports wasm, js, css and the
# single-file page, raw and gzipped, with what a browser transfers against the 250 KB budget.
# The figures also go to target/size-report.json (format in .ci/size_report.py).
set -euo pipefail
# shellcheck source=common.sh source-path=SCRIPTDIR
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$repo_root"

bash .ci/setup.sh --no-browser
mkdir -p target
SIZE_REPORT_JSON="$repo_root/target/size-report.json" bash .ci/build-web.sh
