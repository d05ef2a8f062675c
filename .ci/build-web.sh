#!/usr/bin/env bash
# Builds the browser app into dist/: one self-contained page (the wasm module, its wasm-bindgen
# glue and the styles inside it; the demo loads are embedded in the wasm), served as
# dist/index.html with its service worker dist/sw.js, and the same page as
# dist/doubleprime-offline.html for opening by double-click. Run .ci/setup.sh first.
#
# WEB_TARGET_DIR overrides the cargo target directory (default target/web, kept between runs so
# rebuilds are incremental; separate from target/ so a native build never waits on its lock).
set -euo pipefail
# shellcheck source=common.sh source-path=SCRIPTDIR
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$repo_root"

build_started=$SECONDS
target_dir="${WEB_TARGET_DIR:-$repo_root/target/web}"
dist_dir="$repo_root/dist"
bin_name="doubleprime-web"

[ -x "$wasm_bindgen_bin" ] || fail "no wasm-bindgen in .tools: run .ci/setup.sh"
[ -x "$wasm_opt_bin" ] || fail "no wasm-opt in .tools: run .ci/setup.sh"
bindgen_version="$(wasm_bindgen_locked_version)"
[ "$("$wasm_bindgen_bin" --version)" = "wasm-bindgen $bindgen_version" ] ||
    fail "wasm-bindgen in .tools is not $bindgen_version (Cargo.lock): run .ci/setup.sh"

# Every stylesheet must be linked from the page, or it would be copied and silently unused.
for css in style/*.css; do
    [ -e "$css" ] || continue
    grep -q "href=\"$css\"" index.html || fail "$css is not linked from index.html"
done

select_wasm_toolchain
# Size: the Debian route rebuilds std from source with RUSTC_BOOTSTRAP, so two unstable flags can
# drop what the page never shows, in std too: panic locations (file and line strings) and Debug
# formatting (every message that echoes user text uses doubleprime::error::quoted, not `{:?}`).
# Together they took 16.8 KB raw, 6.8 KB gzipped off the module when added (wasm-opt -Oz after).
if [ "$wasm_route" = "debian" ]; then
    export RUSTFLAGS="${RUSTFLAGS:-} -Zlocation-detail=none -Zfmt-debug=none"
fi
cargo_flags=(--release --target wasm32-unknown-unknown --features web --bin "$bin_name"
    --target-dir "$target_dir")
# In CI the committed Cargo.lock must already be complete.
if [ "${CI:-}" = "true" ]; then cargo_flags+=(--locked); fi
log "cargo build: $bin_name for wasm32 ($wasm_route toolchain, target dir ${target_dir#"$repo_root"/})"
cargo_started=$SECONDS
"$wasm_cargo" build "${cargo_flags[@]}"
log "cargo build: $((SECONDS - cargo_started)) s"

# The parts (module, glue, shell, styles) are assembled in target/, then packed into one page in a
# staging directory that is swapped in at the end, so a failed build never leaves a half-written
# dist/ behind for a running server.
parts="$target_dir/dist-parts"
staging="$target_dir/dist-staging"
rm -rf "$parts" "$staging"
mkdir -p "$parts/style" "$staging"

log "wasm-bindgen --target web"
"$wasm_bindgen_bin" "$target_dir/wasm32-unknown-unknown/release/$bin_name.wasm" \
    --out-dir "$parts" --target web --no-typescript

log "wasm-opt -Oz (binaryen $binaryen_version)"
wasm_file="$parts/${bin_name}_bg.wasm"
"$wasm_opt_bin" -Oz "$wasm_file" -o "$wasm_file.opt"
mv "$wasm_file.opt" "$wasm_file"

cp index.html "$parts/"
cp style/*.css "$parts/style/"

# The served page is the self-contained one: its policy allows no connections (connect-src
# 'none'), so the module cannot be fetched and travels inside the page.
log "packing one self-contained page (.ci/build_single_file.py)"
python3 .ci/build_single_file.py "$parts" "$staging/index.html"
cp "$staging/index.html" "$staging/doubleprime-offline.html"
cp src/web/sw.js "$staging/"

rm -rf "$dist_dir"
mv "$staging" "$dist_dir"

log "sizes: the parts, and the one page that holds them (.ci/size_report.py)"
python3 .ci/size_report.py "$parts" "$dist_dir" ${SIZE_REPORT_JSON:+--json "$SIZE_REPORT_JSON"}
log "build-web done in $((SECONDS - build_started)) s"
