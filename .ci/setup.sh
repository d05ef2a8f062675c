#!/usr/bin/env bash
# Installs what building and testing Doubleprime needs, and only what is missing.
#
#   bash .ci/setup.sh               everything: wasm toolchain, wasm-bindgen, wasm-opt, browser
#   bash .ci/setup.sh --no-browser  skip the headless-browser test tools (enough to build and serve)
#
# System packages come from apt on Debian (as root, or through sudo). Elsewhere the script only
# checks and says what is missing. wasm-bindgen-cli and binaryen go into .tools/ in the repo, so
# nothing outside the project changes version under another project's feet.
set -euo pipefail
# shellcheck source=common.sh source-path=SCRIPTDIR
source "$(dirname "${BASH_SOURCE[0]}")/common.sh"
cd "$repo_root"

want_browser=1
for arg in "$@"; do
    case "$arg" in
        --no-browser) want_browser=0 ;;
        *) fail "unknown option $arg (known: --no-browser)" ;;
    esac
done

setup_started=$SECONDS
missing_packages=()

# need_package PACKAGE: queue a Debian package unless dpkg says it is installed.
need_package() {
    if ! dpkg-query -W -f='${Status}' "$1" 2>/dev/null | grep -q 'install ok installed'; then
        missing_packages+=("$1")
    fi
}

# need_command COMMAND PACKAGE: queue PACKAGE when COMMAND is not on PATH. Used where another
# source may provide the command (node and npm from NodeSource, python from pyenv, ...).
need_command() {
    if ! command -v "$1" >/dev/null 2>&1; then
        missing_packages+=("$2")
    fi
}

is_debian() { [ -f /etc/debian_version ] && command -v apt-get >/dev/null 2>&1; }

# --- System packages -------------------------------------------------------------------------

need_command cc build-essential
need_command gzip gzip
need_command python3 python3
need_command node nodejs
need_command npm npm
# zopfli packs the module inside the page about 4 % smaller than gzip -9 (build_single_file.py
# falls back to gzip without it).
need_command zopfli zopfli
if is_debian; then
    need_package ca-certificates
fi

if ! command -v cargo >/dev/null 2>&1; then
    # No rustup toolchain at all: Debian's Rust then serves the native build and tests too.
    log "no cargo on PATH: using Debian's Rust for native builds as well"
    need_package rustc-web
    need_package cargo-web
    need_package rust-web-clippy
    need_package rustfmt-web
fi

if rustup_has_wasm_target; then
    log "wasm32 target: from the active toolchain ($(rustc --version))"
else
    log "wasm32 target: not in the active toolchain; using Debian's Rust with std built from source"
    if is_debian; then
        need_package rustc-web
        need_package cargo-web
        need_package rust-web-src
        need_package lld-22
    fi
fi

if [ "$want_browser" = 1 ]; then
    if is_debian; then
        need_package chromium
        need_package chromium-driver
        need_package fonts-liberation
        need_package poppler-utils
    else
        need_command pdftoppm poppler-utils
        command -v chromium >/dev/null 2>&1 || [ -n "${CHROMIUM:-}" ] || missing_packages+=("chromium")
    fi
fi

if [ "${#missing_packages[@]}" -gt 0 ]; then
    # Remove duplicates (rustc-web can be queued twice) while keeping the order.
    mapfile -t missing_packages < <(printf '%s\n' "${missing_packages[@]}" | awk '!seen[$0]++')
    if ! is_debian; then
        fail "missing: ${missing_packages[*]}; install them with your package manager (this script installs only on Debian)"
    fi
    if [ "$(id -u)" = 0 ]; then
        as_root=()
    elif command -v sudo >/dev/null 2>&1; then
        as_root=(sudo)
    else
        fail "missing Debian packages ${missing_packages[*]}, and neither root nor sudo is available"
    fi
    log "installing Debian packages: ${missing_packages[*]}"
    "${as_root[@]}" apt-get update -qq
    "${as_root[@]}" env DEBIAN_FRONTEND=noninteractive \
        apt-get install -y -qq --no-install-recommends "${missing_packages[@]}"
else
    log "system packages: all present"
fi

if ! rustup_has_wasm_target; then
    if ! [ -x /usr/bin/cargo ] || ! [ -d /usr/lib/rustlib/src/rust/library ] || ! [ -x "$debian_wasm_ld" ]; then
        fail "no wasm32 toolchain: run 'rustup target add wasm32-unknown-unknown' or, on Debian, install rustc-web cargo-web rust-web-src lld-22"
    fi
fi

# --- wasm-bindgen CLI, pinned to Cargo.lock ---------------------------------------------------

bindgen_version="$(wasm_bindgen_locked_version)"
[ -n "$bindgen_version" ] || fail "no wasm-bindgen entry in Cargo.lock"
installed_bindgen=""
if [ -x "$wasm_bindgen_bin" ]; then
    installed_bindgen="$("$wasm_bindgen_bin" --version 2>/dev/null | awk '{print $2}')"
fi
if [ "$installed_bindgen" = "$bindgen_version" ]; then
    log "wasm-bindgen $bindgen_version: present in .tools"
else
    log "wasm-bindgen: installing wasm-bindgen-cli $bindgen_version into .tools (a few minutes from cold)"
    install_started=$SECONDS
    # The native cargo builds the tool. No --locked: the CLI's own lock file can name crate
    # versions that the registry mirror does not carry yet.
    native_cargo=cargo
    command -v cargo >/dev/null 2>&1 || native_cargo=/usr/bin/cargo
    "$native_cargo" install --quiet wasm-bindgen-cli --version "=$bindgen_version" \
        --root "$tools_dir" --force
    log "wasm-bindgen: installed in $((SECONDS - install_started)) s"
fi

# --- wasm-opt from npm's binaryen (never Debian's binaryen, which corrupts wasm-bindgen output) -

# wasm_opt_version: what the installed wasm-opt reports ("wasm-opt version 132 (version_132)").
wasm_opt_version() { "$wasm_opt_bin" --version 2>/dev/null || true; }
if [ -x "$wasm_opt_bin" ] && [[ "$(wasm_opt_version)" == *"version $binaryen_version "* ]]; then
    log "wasm-opt (binaryen $binaryen_version): present in .tools"
else
    log "wasm-opt: installing npm binaryen@$binaryen_version into .tools"
    mkdir -p "$tools_dir"
    npm install --prefix "$tools_dir" --no-audit --no-fund --loglevel=error \
        "binaryen@$binaryen_version" >/dev/null
    [[ "$(wasm_opt_version)" == *"version $binaryen_version "* ]] ||
        fail "wasm-opt in .tools does not report version $binaryen_version"
fi

log "setup done in $((SECONDS - setup_started)) s"
