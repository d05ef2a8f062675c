#!/usr/bin/env python3
"""The size report of a built app: wasm, js, css and the single-file page, raw and gzipped, and
what a browser transfers (the page and its service worker), against the 250 KB budget.

Usage: size_report.py PARTS_DIR DIST_DIR [--json FILE]

PARTS_DIR holds the parts before packing (the module, the glue, style/), DIST_DIR the packed
page and sw.js; .ci/build-web.sh prints this after every build and .ci/size-report.sh also
writes the JSON (format: {"files": {NAME: {"raw_bytes", "gzip_bytes"}}, "transferred_gzip_bytes",
"budget_gzip_bytes"}). Gzip is level 9, as a static server would send it.
"""

import argparse
import gzip
import json
import pathlib

BIN_NAME = "doubleprime-web"
# The project's budget for everything a browser transfers, gzipped (README, performance).
BUDGET_GZIP_BYTES = 250 * 1000


def sizes(paths: list) -> dict:
    raw = sum(path.stat().st_size for path in paths)
    gzipped = sum(len(gzip.compress(path.read_bytes(), compresslevel=9, mtime=0)) for path in paths)
    return {"raw_bytes": raw, "gzip_bytes": gzipped}


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("parts")
    parser.add_argument("dist")
    parser.add_argument("--json")
    args = parser.parse_args()
    parts, dist = pathlib.Path(args.parts), pathlib.Path(args.dist)
    files = {
        "wasm": sizes([parts / f"{BIN_NAME}_bg.wasm"]),
        "js": sizes([parts / f"{BIN_NAME}.js"]),
        "css": sizes(sorted((parts / "style").glob("*.css"))),
        "page": sizes([dist / "index.html"]),
        "sw": sizes([dist / "sw.js"]),
    }
    transferred = files["page"]["gzip_bytes"] + files["sw"]["gzip_bytes"]
    for name, figures in files.items():
        print(f"    {name:5} {figures['raw_bytes']:9d} bytes raw {figures['gzip_bytes']:9d} bytes gzipped")
    verdict = "within" if transferred <= BUDGET_GZIP_BYTES else "OVER"
    print(f"    transferred (page + sw): {transferred} bytes gzipped, {verdict} the {BUDGET_GZIP_BYTES} byte budget")
    if args.json:
        report = {"files": files, "transferred_gzip_bytes": transferred, "budget_gzip_bytes": BUDGET_GZIP_BYTES}
        pathlib.Path(args.json).write_text(json.dumps(report, indent=2) + "\n", encoding="utf-8")
        print(f"    written to {args.json}")


if __name__ == "__main__":
    main()
