#!/usr/bin/env python3
"""Builds one self-contained HTML page from a built dist/: the wasm-bindgen glue, the wasm module
(gzipped and base64-encoded) and the styles all inside it, for opening by double-click from a USB
stick with no server and no network.

Usage: build_single_file.py DIST_DIR OUTPUT.html

Browsers refuse ES-module imports and wasm fetches from file:// pages, so nothing may be fetched:
the module is decompressed in the page with DecompressionStream('gzip') and handed to the glue's
async init as bytes (not initSync, which Chromium refuses on the main thread above 8 MB). The
page's Content-Security-Policy names the one inline script and each inline style by hash, allows
'wasm-unsafe-eval' for the module, and allows no connections at all (connect-src 'none'); only
the service worker script beside a served page may load (worker-src 'self').
"""

import base64
import gzip
import hashlib
import pathlib
import re
import shutil
import subprocess
import sys
import tempfile

BIN_NAME = "doubleprime-web"


def sha256_source(text: str) -> str:
    return "'sha256-" + base64.b64encode(hashlib.sha256(text.encode("utf-8")).digest()).decode() + "'"


def gzip_module(wasm: bytes) -> bytes:
    """The module in gzip format: by zopfli when installed (.ci/setup.sh installs it; about 4 %
    smaller, a few seconds), else by gzip -9. Either is what DecompressionStream('gzip') reads."""
    zopfli = shutil.which("zopfli")
    if zopfli:
        with tempfile.TemporaryDirectory() as scratch:
            path = pathlib.Path(scratch) / "module.wasm"
            path.write_bytes(wasm)
            done = subprocess.run([zopfli, "--gzip", "-c", str(path)], capture_output=True, check=False)
            if done.returncode == 0 and gzip.decompress(done.stdout) == wasm:
                return done.stdout
            print(f"build_single_file: zopfli failed ({done.stderr.decode()[:200]}); using gzip -9", file=sys.stderr)
    return gzip.compress(wasm, compresslevel=9, mtime=0)


def main() -> None:
    if len(sys.argv) != 3:
        sys.exit(__doc__)
    dist = pathlib.Path(sys.argv[1])
    output = pathlib.Path(sys.argv[2])
    glue = (dist / f"{BIN_NAME}.js").read_text(encoding="utf-8")
    wasm = (dist / f"{BIN_NAME}_bg.wasm").read_bytes()
    shell = (dist / "index.html").read_text(encoding="utf-8")

    # The glue ends with `export { initSync, __wbg_init as default };` and exports its classes;
    # inside one inline module those exports are harmless, and __wbg_init is in scope.
    if "async function __wbg_init(" not in glue:
        sys.exit("build_single_file: the wasm-bindgen glue has no __wbg_init; its layout changed")
    packed = base64.b64encode(gzip_module(wasm)).decode("ascii")
    boot = """
const status = document.getElementById('boot-status');
async function unpackModule() {
  const packed = document.getElementById('doubleprime-module').textContent.trim();
  // The browser's own base64 decoder where it has one; else a plain loop (a mapping callback
  // per character, as Uint8Array.from takes, costs about 40 ms on this half-megabyte).
  let bytes;
  if (typeof Uint8Array.fromBase64 === 'function') {
    bytes = Uint8Array.fromBase64(packed);
  } else {
    const text = atob(packed);
    bytes = new Uint8Array(text.length);
    for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  }
  const stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream('gzip'));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}
// The served page keeps itself for offline reuse (sw.js); file:// has no service workers.
if ('serviceWorker' in navigator && location.protocol !== 'file:') {
  navigator.serviceWorker.register('sw.js').catch((error) => console.warn('no offline copy:', error));
}
// Marks for the timing harness (tests/browser/timing.py): the module unpacked, then the app's own.
unpackModule()
  .then((bytes) => {
    performance.mark('doubleprime-module-unpacked');
    return __wbg_init({ module_or_path: bytes });
  })
  .then(() => status?.remove())
  .catch((error) => {
    console.error(error);
    if (status) {
      status.textContent = `Doubleprime could not start in this browser: ${error}`;
      status.classList.add('boot-status-failed');
    }
  });
"""
    script = glue + "\n" + boot

    # Inline every linked stylesheet, in the page's order, each as its own <style> with a hash.
    styles = []
    def inline_style(match: "re.Match[str]") -> str:
        css = (dist / match.group(1)).read_text(encoding="utf-8")
        styles.append(css)
        return f"<style>{css}</style>"
    page = re.sub(r'<link rel="stylesheet" href="([^"]+)">', inline_style, shell)
    page = re.sub(r'\s*<script type="module" src="boot.js"></script>', "", page)

    csp = "; ".join([
        "default-src 'none'",
        f"script-src {sha256_source(script)} 'wasm-unsafe-eval'",
        "style-src " + " ".join(sha256_source(css) for css in styles) if styles else "style-src 'none'",
        "img-src data:",
        "connect-src 'none'",
        # The service worker script, when the page is served (sw.js beside it).
        "worker-src 'self'",
        "base-uri 'none'",
        "form-action 'none'",
    ])
    page, count = re.subn(r'<meta http-equiv="Content-Security-Policy"\s+content="[^"]*">',
                          f'<meta http-equiv="Content-Security-Policy" content="{csp}">', page)
    if count != 1:
        sys.exit("build_single_file: index.html must hold exactly one Content-Security-Policy meta tag")
    # The module travels as text in a non-executed script block; base64 has no '<' to escape.
    payload = f'<script type="application/octet-stream" id="doubleprime-module">{packed}</script>\n'
    page = page.replace("</body>", payload + f"<script type=\"module\">{script}</script>\n</body>")
    output.write_text(page, encoding="utf-8")


if __name__ == "__main__":
    main()
