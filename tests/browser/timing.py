#!/usr/bin/env python3
"""The browser timing harness: how fast the built page is in headless Chromium, beside the native
build doing the same work. It reports; it asserts no time (a loaded machine is slow, not wrong).

Usage: timing.py DIST_DIR --cli DOUBLEPRIME [--budget-ms MS] [--loads N] [--out FILE]

- The workloads: the page's timing mode (`?timing=MS`) runs the core's shared workloads
  (src/timing.rs: three plans, a band comparison, a 10,400-configuration design search) in
  WebAssembly against performance.now(); `doubleprime timing --budget-ms MS` runs the very same
  code natively. The table gives both medians and their ratio (wasm / native).
- First plan on screen: N loads of `?demo=tempering-beef-blocks` from a local server, each in a
  fresh tab state (cache and service worker cleared, so every load fetches the whole page), read
  from the page's performance marks, in ms from navigation start: `doubleprime-module-unpacked`
  (the boot script has the module's bytes), `doubleprime-wasm-started` (its main runs),
  `doubleprime-first-plan` (the app mounted with its plan in the page) and
  `doubleprime-first-plan-frame` (the frame that shows it), beside the navigation's own figures.

The figures go to stdout as a table and to --out as JSON (default target/browser-timing.json).
Uses interact.py's WebDriver client and persist.py's server.
"""

import argparse
import json
import os
import statistics
import subprocess
import sys
import time

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from interact import DEMO, REPO, Check, Driver, binary, browser_session  # noqa: E402
from persist import Server, cdp  # noqa: E402

# The budgets of the project (README, performance section): reported against, never asserted.
BUDGETS_MS = {
    "plan_tempering_200_zones": 1.0,
    "plan_layered_200_zones": 1.0,
    "search_10400_configurations": 1000.0,
    "first_plan_frame": 300.0,
}
MARKS = ("doubleprime-module-unpacked", "doubleprime-wasm-started", "doubleprime-first-plan",
         "doubleprime-first-plan-frame")


def load_timings(driver: Driver, url: str) -> dict:
    """One cold load of `url`: milliseconds from navigation start to each mark and paint."""
    cdp(driver, "Network.clearBrowserCache", {})
    cdp(driver, "Storage.clearDataForOrigin", {"origin": url.split("/?")[0], "storageTypes": "service_workers,cache_storage"})
    driver.open("about:blank")
    driver.open(url)
    found = driver.wait(
        "the first-plan marks",
        lambda: driver.script(
            "const m = arguments[0].map(n => performance.getEntriesByName(n)[0]);"
            "return m.every(Boolean) ? m.map(e => e.startTime) : null",
            list(MARKS),
        ),
    )
    navigation = driver.script(
        "const n = performance.getEntriesByType('navigation')[0];"
        "const p = performance.getEntriesByName('first-contentful-paint')[0];"
        "return {response_end: n.responseEnd, dom_content_loaded: n.domContentLoadedEventEnd,"
        " transfer_bytes: n.transferSize, first_contentful_paint: p ? p.startTime : null}"
    )
    if not driver.script('return !!document.querySelector(\'[data-testid="result-generator_count"]\')'):
        raise Check("the first-plan mark is set but no plan is on the page")
    marks = dict(zip(("module_unpacked", "wasm_started", "first_plan", "first_plan_frame"), found))
    return {**marks, **navigation}


def wasm_workloads(driver: Driver, base: str, budget_ms: float, timeout_s: float) -> dict:
    driver.open(f"{base}?timing={budget_ms:g}")
    state = driver.wait(
        "the timing report",
        lambda: driver.script(
            "const r = document.getElementById('timing-report'); return r && r.dataset.state !== 'running' && r.dataset.state"
        ),
        timeout=timeout_s,
    )
    text = driver.script("return document.getElementById('timing-report').textContent")
    if state != "done":
        raise Check(f"the page refused the timing run: {text}")
    return json.loads(text)


def native_workloads(cli: str, budget_ms: float) -> dict:
    done = subprocess.run([cli, "timing", "--budget-ms", f"{budget_ms:g}"], capture_output=True, text=True, check=False)
    if done.returncode != 0:
        raise Check(f"doubleprime timing failed: {done.stderr.strip()}")
    return json.loads(done.stdout)


def verdict(key: str, value_ms: float) -> str:
    budget = BUDGETS_MS.get(key)
    if budget is None:
        return ""
    return f"{'within' if value_ms <= budget else 'OVER'} {budget:g} ms"


def report(wasm: dict, native: dict, loads: list) -> dict:
    native_by_key = {w["key"]: w for w in native["workloads"]}
    rows = []
    print(f"{'workload':34} {'wasm ms':>10} {'native ms':>10} {'ratio':>6}  budget (browser)")
    for w in wasm["workloads"]:
        n = native_by_key.get(w["key"])
        if n is None:
            raise Check(f"the native run has no workload {w['key']}")
        ratio = w["median_ms"] / n["median_ms"] if n["median_ms"] > 0 else None
        rows.append({"key": w["key"], "description": w["description"], "wasm_median_ms": w["median_ms"],
                     "native_median_ms": n["median_ms"], "wasm_over_native": ratio,
                     "wasm_iterations": w["iterations"], "native_iterations": n["iterations"]})
        ratio_text = f"{ratio:6.2f}" if ratio is not None else "     -"
        print(f"{w['key']:34} {w['median_ms']:10.4f} {n['median_ms']:10.4f} {ratio_text}  {verdict(w['key'], w['median_ms'])}")
    summary = {}
    for key in ("response_end", "dom_content_loaded", "first_contentful_paint", "module_unpacked", "wasm_started",
                "first_plan", "first_plan_frame"):
        values = [load[key] for load in loads if load.get(key) is not None]
        if values:
            summary[key] = {"median_ms": statistics.median(values), "min_ms": min(values), "max_ms": max(values)}
    print(f"\nfirst plan, {len(loads)} cold loads from a local server (ms from navigation start):")
    for key, figures in summary.items():
        print(f"  {key:24} median {figures['median_ms']:8.1f}  min {figures['min_ms']:8.1f}  max {figures['max_ms']:8.1f}"
              f"  {verdict(key, figures['median_ms'])}")
    return {"workloads": rows, "first_plan_loads": loads, "first_plan_summary": summary,
            "budget_ms_per_workload": wasm["budget_ms_per_workload"], "budgets_ms": BUDGETS_MS}


def run(driver: Driver, server: Server, args: argparse.Namespace) -> dict:
    loads = [load_timings(driver, f"{server.url}?demo={DEMO}") for _ in range(args.loads)]
    # Five workloads, each its budget plus the warm-up; generous for a loaded machine.
    timeout_s = 60.0 + 5 * (args.budget_ms / 1000.0) * 4
    wasm = wasm_workloads(driver, server.url, args.budget_ms, timeout_s)
    native = native_workloads(args.cli, args.budget_ms)
    return report(wasm, native, loads)


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("dist")
    parser.add_argument("--cli", required=True, help="the doubleprime command-line tool (a release build for real figures)")
    parser.add_argument("--budget-ms", type=float, default=500.0, help="time per workload, each side (default 500)")
    parser.add_argument("--loads", type=int, default=5, help="cold page loads for the first-plan figure (default 5)")
    parser.add_argument("--out", default=os.path.join(REPO, "target", "browser-timing.json"))
    args = parser.parse_args()
    if not 1 <= args.budget_ms <= 60000:
        parser.error(f"--budget-ms = {args.budget_ms:g} is not accepted: valid is 1 to 60000")
    if not 1 <= args.loads <= 100:
        parser.error(f"--loads = {args.loads} is not accepted: valid is 1 to 100")
    sys.stdout.reconfigure(line_buffering=True)
    server = Server(args.dist)
    try:
        if not os.access(args.cli, os.X_OK):
            raise Check(f"no command-line tool at {args.cli}")
        with browser_session() as driver:
            try:
                server.start()
                started = time.monotonic()
                result = run(driver, server, args)
            finally:
                server.stop()
        chromium = binary("CHROMIUM", "chromium", "chromium-browser", "google-chrome")
        result["chromium"] = subprocess.run([chromium, "--version"], capture_output=True, text=True).stdout.strip()
        os.makedirs(os.path.dirname(os.path.abspath(args.out)), exist_ok=True)
        with open(args.out, "w", encoding="utf-8") as file:
            json.dump(result, file, indent=2)
        print(f"\ntiming: report written to {args.out} ({time.monotonic() - started:.0f} s)")
    except Check as problem:
        print(f"timing: FAILED: {problem}", file=sys.stderr)
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
