# Shared by the .ci scripts (sourced, not run): paths, logging and the choice of wasm toolchain.
# shellcheck shell=bash disable=SC2034  # the variables are for the scripts that source this file

repo_root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
tools_dir="$repo_root/.tools"
wasm_bindgen_bin="$tools_dir/bin/wasm-bindgen"
wasm_opt_bin="$tools_dir/node_modules/.bin/wasm-opt"
binaryen_version="132"
debian_wasm_ld="/usr/lib/llvm-22/bin/wasm-ld"

log() { printf '==> %s\n' "$*"; }
fail() {
    printf 'error: %s\n' "$*" >&2
    exit 1
}

# The wasm-bindgen CLI must match the library version in Cargo.lock exactly, or the glue and the
# module disagree at run time.
wasm_bindgen_locked_version() {
    awk '/^name = "wasm-bindgen"$/ { getline; gsub(/version = |"/, ""); print; exit }' \
        "$repo_root/Cargo.lock"
}

# True when the active rustup (or other) toolchain already ships the wasm32 standard library.
rustup_has_wasm_target() {
    command -v rustc >/dev/null 2>&1 || return 1
    local sysroot
    sysroot="$(rustc --print sysroot 2>/dev/null)" || return 1
    [ -d "$sysroot/lib/rustlib/wasm32-unknown-unknown" ]
}

# Sets wasm_cargo (the cargo to call) and, on the Debian route, exports the variables that
# rebuild std for wasm from Debian's rust-web-src. Kept out of .cargo/config.toml so a laptop
# with `rustup target add wasm32-unknown-unknown` keeps its plain cargo.
select_wasm_toolchain() {
    if rustup_has_wasm_target; then
        wasm_cargo="cargo"
        wasm_route="rustup"
    else
        wasm_cargo="/usr/bin/cargo"
        wasm_route="debian"
        # /usr/bin first and RUSTC pinned: rustup's proxies in ~/.cargo/bin come first on PATH
        # and would otherwise hand Debian's cargo a rustc without the std sources.
        export PATH="/usr/bin:$PATH"
        export RUSTC=/usr/bin/rustc
        export RUSTDOC=/usr/bin/rustdoc
        export RUSTC_BOOTSTRAP=1
        export CARGO_UNSTABLE_BUILD_STD=std,panic_abort
        export CARGO_TARGET_WASM32_UNKNOWN_UNKNOWN_LINKER="$debian_wasm_ld"
    fi
}
