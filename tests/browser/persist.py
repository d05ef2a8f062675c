#!/usr/bin/env python3
"""Scenarios that last and travel, in headless Chromium: saving in the browser and reloading,
migrating and setting aside stored texts, hostile imports, the link, the file exports, the quote
sheet's page count, blocked and full storage, the offline copy of the served page, and the single
self-contained file opened from file://.

Usage: persist.py DIST_DIR

Serves DIST_DIR itself (with .ci/serve_dist.py), because the offline check stops the server. Every
page load is watched: a Content-Security-Policy violation, a console error or a request other than
the page's own navigation and service worker fails the test. Uses interact.py's WebDriver client.
"""

import base64
import json
import os
import subprocess
import sys
import tempfile
import time

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from interact import DEMO, REPO, Check, Cli, Driver, binary, browser_session, page_scenario, settled  # noqa: E402

PAYLOAD = '<script>window.__pwned = 1</script><img src="x" onerror="window.__pwned = 1">&amp;"\''
# Recorded in every document before its own scripts run (DevTools scripts are outside the CSP).
WATCH = """
window.__violations = [];
document.addEventListener('securitypolicyviolation',
  (e) => window.__violations.push(e.violatedDirective + ' ' + e.blockedURI));
"""
# Storage as a browser that blocks it shows it: reading window.localStorage throws.
BLOCKED = """
Object.defineProperty(window, 'localStorage', { get() { throw new DOMException('blocked', 'SecurityError'); } });
"""
# Storage that is full: every write throws.
FULL = """
Storage.prototype.setItem = function () { throw new DOMException('full', 'QuotaExceededError'); };
"""


class Server:
    """dist/ on a free port, stoppable."""

    def __init__(self, dist: str) -> None:
        self.dist = dist
        self.process = None
        self.url = ""

    def start(self) -> None:
        self.process = subprocess.Popen(
            [sys.executable, os.path.join(REPO, ".ci", "serve_dist.py"), self.dist, "0"],
            stdout=subprocess.PIPE, stderr=subprocess.DEVNULL, text=True,
        )
        line = self.process.stdout.readline()
        self.url = line.rsplit(" at ", 1)[-1].strip()
        if not self.url.startswith("http://"):
            raise Check(f"the test server did not start: {line!r}")

    def stop(self) -> None:
        if self.process:
            self.process.terminate()
            self.process.wait(timeout=10)
            self.process = None


def cdp(driver: Driver, cmd: str, params: dict) -> dict:
    return driver.call("POST", f"{driver.session}/goog/cdp/execute", {"cmd": cmd, "params": params})


def run_async(driver: Driver, source: str) -> object:
    """Run `source`, whose last argument is the callback, and return what it passes."""
    return driver.call("POST", f"{driver.session}/execute/async", {"script": source, "args": []})


def testids(driver: Driver, testid: str) -> list:
    return driver.script(
        "return Array.from(document.querySelectorAll(arguments[0])).map(e => e.textContent)",
        f'[data-testid="{testid}"]',
    )


def open_page(driver: Driver, url: str, allowed: tuple) -> None:
    """Load `url`, wait for a plan, and check the load: no CSP violation, no console error, no
    request but the navigation and the given others."""
    driver.requests()
    driver.open(url)
    driver.wait("a plan", lambda: driver.script('return !!document.querySelector(\'[data-testid="result-generator_count"]\')'))
    time.sleep(0.3)
    check_clean(driver, url, allowed)


def check_clean(driver: Driver, where: str, allowed: tuple = ()) -> None:
    violations = driver.script("return window.__violations")
    if violations is None:
        raise Check(f"{where}: the violation watcher did not run")
    if violations:
        raise Check(f"{where}: Content-Security-Policy violations: {violations}")
    if driver.script("return window.__pwned"):
        raise Check(f"{where}: a script from a scenario ran")
    strays = [url for url in driver.requests() if not any(url.startswith(a) for a in allowed)]
    if strays:
        raise Check(f"{where}: requests beyond the page's own: {strays}")
    errors = driver.console_errors()
    if errors:
        raise Check(f"{where}: console errors:\n  " + "\n  ".join(errors))


def saved_names(driver: Driver) -> list:
    return testids(driver, "saved-name")


def click(driver: Driver, testid: str) -> None:
    driver.click(f'[data-testid="{testid}"]')


def save_as(driver: Driver, name: str) -> None:
    driver.type_into("saved-name-input", name)
    click(driver, "save-new")
    driver.wait(f"{name!r} in the saved list", lambda: name in saved_names(driver))


def storage(driver: Driver) -> dict:
    return driver.script("const o = {}; for (let i = 0; i < localStorage.length; i++) { const k = localStorage.key(i); o[k] = localStorage.getItem(k); } return o;")


# -- the checks --------------------------------------------------------------------------------

def check_save_and_reload(driver: Driver, page: str, allowed: tuple) -> None:
    save_as(driver, "Beef line, first try")
    save_as(driver, "Beef line, first try")  # a second save with the same name is numbered
    if "Beef line, first try (2)" not in saved_names(driver):
        raise Check(f"the second save was not numbered: {saved_names(driver)}")
    open_page(driver, page, allowed)
    names = saved_names(driver)
    if sorted(names) != ["Beef line, first try", "Beef line, first try (2)"]:
        raise Check(f"after reload the saved list is {names}")
    # Rename, duplicate, delete on the second one; open the first.
    driver.type_into("saved-name-input", "Renamed line")
    driver.click('[data-testid="saved-item"]:first-child [data-testid="saved-rename"]')
    driver.wait("the rename", lambda: "Renamed line" in saved_names(driver))
    driver.click('[data-testid="saved-item"]:first-child [data-testid="saved-duplicate"]')
    driver.wait("the duplicate", lambda: "Renamed line (2)" in saved_names(driver))
    driver.click('[data-testid="saved-item"]:first-child [data-testid="saved-delete"]')
    driver.wait("the delete", lambda: "Renamed line (2)" not in saved_names(driver))
    open_page(driver, page, allowed)
    if sorted(saved_names(driver)) != ["Beef line, first try", "Renamed line"]:
        raise Check(f"rename, duplicate and delete did not last: {saved_names(driver)}")
    dates = testids(driver, "saved-item")
    if not all("created 20" in d and "changed 20" in d for d in dates):
        raise Check(f"the saved list shows no dates: {dates}")
    print("persist: saved scenarios survive a reload; rename, duplicate and delete last")


def check_migration(driver: Driver, page: str, allowed: tuple) -> None:
    demo_text = open(os.path.join(REPO, "demo-loads", "drying-sand-cores.json"), encoding="utf-8").read()
    planted = {
        "doubleprime.v1.scenario.legacy": demo_text,
        "doubleprime.v1.scenario.truncated": demo_text[:200],
        "doubleprime.v1.scenario.newer": demo_text.replace('"schema": 1', '"schema": 9', 1),
        "doubleprime.v1.scenario.foreign": '{"format": "someone-elses-app", "data": [1, 2]}',
        "unrelated-app.settings": "not ours, left alone",
    }
    before = storage(driver)
    driver.script("for (const [k, v] of Object.entries(arguments[0])) localStorage.setItem(k, v);", planted)
    open_page(driver, page, allowed)
    names = saved_names(driver)
    if json.loads(demo_text)["name"] not in names:
        raise Check(f"the older-schema save did not migrate: {names}")
    after = storage(driver)
    migrated = json.loads(after["doubleprime.v1.scenario.legacy"])
    if migrated.get("format") != "doubleprime-saved-scenario" or migrated.get("version") != 1:
        raise Check(f"the older-schema save was not rewritten in the envelope: {str(migrated)[:200]}")
    reasons = testids(driver, "aside-reason")
    if len(reasons) != 3:
        raise Check(f"expected 3 set-aside texts, the page lists {reasons}")
    kept = {json.loads(v)["key"]: json.loads(v)["text"] for k, v in after.items() if k.startswith("doubleprime.v1.set-aside.")}
    for key in ("doubleprime.v1.scenario.truncated", "doubleprime.v1.scenario.newer", "doubleprime.v1.scenario.foreign"):
        if kept.get(key) != planted[key]:
            raise Check(f"{key} was not kept whole under a set-aside key")
        if key in after:
            raise Check(f"{key} is still under its scenario key")
    if after.get("unrelated-app.settings") != planted["unrelated-app.settings"]:
        raise Check("another program's key was touched")
    for key, text in before.items():
        if after.get(key) != text:
            raise Check(f"a saved scenario changed while others were migrated: {key}")
    message = driver.text("saved-message")
    if "set aside" not in message or "brought up to date" not in message:
        raise Check(f"the migration is not reported: {message!r}")
    print(f"persist: an older save migrates; 3 unreadable texts set aside with reasons: {reasons[0][:60]}...")


def hostile_scenario(cli: Cli) -> str:
    scenario = json.load(open(os.path.join(REPO, "demo-loads", f"{DEMO}.json"), encoding="utf-8"))
    scenario["name"] = "Hostile " + PAYLOAD
    scenario["description"] = PAYLOAD
    scenario["project"] = {k: PAYLOAD for k in ("customer", "site", "author", "date", "reference", "notes")}
    scenario["site"]["currency"] = "<b>EUR</b>"
    scenario["product"] = {"custom": {
        "name": '<img src=x onerror="window.__pwned=1">', "density_kg_per_m3": 1000, "specific_heat_j_per_kg_k": 3500, "source": PAYLOAD,
        "dielectric": {"model": "constant", "eps_real": 50, "eps_imag": 15},
    }}
    scenario["inlet"]["temp_c"] = 5
    scenario["outlet"]["temp_c"] = 60
    scenario["process"] = "heating"
    text = json.dumps(scenario)
    cli.on_text("plan", text)  # the CLI must plan it, or the test would test nothing
    return text


def import_file(driver: Driver, directory: str, name: str, text: str) -> str:
    path = os.path.join(directory, name)
    with open(path, "w", encoding="utf-8") as file:
        file.write(text)
    driver.call("POST", f"{driver.session}/element/{driver.testid('import-json')}/value", {"text": path})
    return driver.wait(f"the import of {name}", lambda: name in driver.text("transfer-message") and driver.text("transfer-message"))


def check_hostile_imports(driver: Driver, cli: Cli, page: str, allowed: tuple) -> None:
    saved_before = storage(driver)
    names_before = saved_names(driver)
    demo_text = open(os.path.join(REPO, "demo-loads", f"{DEMO}.json"), encoding="utf-8").read()
    huge = json.loads(demo_text)
    huge["throughput_kg_per_h"] = 1e300
    huge["inlet"]["temp_c"] = -1e12
    huge["tunnel"]["zones"] = 4000000000
    with tempfile.TemporaryDirectory() as directory:
        refused = {
            "beyond-double.json": demo_text.replace('"schema": 1', '"schema": 1, "salt_pct": 1e999', 1),
            "wrong-schema.json": demo_text.replace('"schema": 1', '"schema": 42', 1),
            "truncated.json": demo_text[: len(demo_text) // 2],
            "markup.json": "<html><script>window.__pwned = 1</script></html>",
            "other-shape.json": '{"format": "someone-elses-app", "items": []}',
        }
        for name, text in refused.items():
            message = import_file(driver, directory, name, text)
            if "nothing changed" not in message:
                raise Check(f"{name} was not refused: {message!r}")
            settled(driver)
        # Readable but out of range: opened, and the form names every problem (the plan goes stale).
        message = import_file(driver, directory, "huge-and-negative.json", json.dumps(huge))
        if "Opened" not in message:
            raise Check(f"huge-and-negative.json did not open: {message!r}")
        problems = driver.wait("the problems of huge-and-negative.json", lambda: driver.script(
            "const s = document.querySelector('[data-testid=\"error-summary\"]'); return s && s.textContent"))
        for wanted in ("3 problems", "Throughput", "-1000000000000"):
            if wanted not in problems:
                raise Check(f"the out-of-range values are not named ({wanted!r}): {problems[:300]!r}")
        message = import_file(driver, directory, "hostile.json", hostile_scenario(cli))
        if "Opened hostile.json" not in message:
            raise Check(f"the hostile but valid file did not open: {message!r}")
        settled(driver)
    shown = driver.text("result-name")
    if "<script>" not in shown:
        raise Check(f"the hostile name is not shown as text: {shown!r}")
    markup = driver.script("return document.querySelectorAll('body script:not([type]), body img, .app-body b, .quote-sheet b').length")
    if markup:
        raise Check(f"the hostile text became {markup} elements")
    if saved_names(driver) != names_before or storage(driver) != saved_before:
        raise Check("an import changed the saved scenarios")
    save_as(driver, "Hostile " + PAYLOAD)
    open_page(driver, page, allowed)
    if ("Hostile " + PAYLOAD) not in saved_names(driver):
        raise Check(f"the hostile scenario did not save as text: {saved_names(driver)}")
    driver.click('[data-testid="saved-item"]:first-child [data-testid="saved-open"]')
    settled(driver)
    if "<script>" not in driver.text("result-name"):
        raise Check("the saved hostile scenario did not open")
    check_clean(driver, "after the hostile imports", allowed)
    driver.click('[data-testid="saved-item"]:first-child [data-testid="saved-delete"]')
    print(f"persist: {len(refused)} hostile files refused, one opened as text; nothing ran, saved scenarios intact")


CAPTURE = """
window.__blobs = [];
const made = URL.createObjectURL;
URL.createObjectURL = (blob) => { window.__blobs.push(blob); return made.call(URL, blob); };
"""


def last_blob(driver: Driver) -> str:
    return run_async(driver, "const done = arguments[arguments.length - 1]; window.__blobs[window.__blobs.length - 1].text().then(done);")


def check_link_and_files(driver: Driver, base: str, allowed: tuple) -> None:
    open_page(driver, base + "?demo=layered-meal-trays", allowed)
    original = json.loads(page_scenario(driver))
    driver.script(CAPTURE)
    click(driver, "export-json")
    exported = json.loads(last_blob(driver))
    if exported != original:
        raise Check("the exported JSON is not the page's scenario")
    click(driver, "export-csv")
    csv = last_blob(driver).splitlines()
    if not csv[0].startswith("zone,start [m],end [m]") or len(csv) != original["tunnel"]["zones"] + 1:
        raise Check(f"the zone CSV is wrong: {csv[:2]} ({len(csv)} lines)")
    click(driver, "share-link-make")
    link = driver.wait("the link", lambda: driver.script('const e = document.querySelector(\'[data-testid="share-link"]\'); return e && e.value'))
    if "#s1." not in link:
        raise Check(f"the link carries no scenario: {link!r}")
    # Opened where the default demo would otherwise open: the link must win.
    open_page(driver, base + "?x=1" + link[link.index("#"):], allowed)
    if json.loads(page_scenario(driver)) != original:
        raise Check("the link did not round-trip the scenario")
    print(f"persist: JSON export, zone CSV ({len(csv) - 1} zones) and the {len(link)}-character link round-trip")


def pdf_pages(driver: Driver, paper: tuple) -> tuple:
    """The page count and the text of the page printed to PDF on `paper` (inches)."""
    params = {"paperWidth": paper[0], "paperHeight": paper[1], "printBackground": False}
    data = base64.b64decode(cdp(driver, "Page.printToPDF", params)["data"])
    with tempfile.NamedTemporaryFile(suffix=".pdf", delete=False) as file:
        file.write(data)
    try:
        info = subprocess.run(["pdfinfo", file.name], capture_output=True, text=True, check=True).stdout
        text = subprocess.run(["pdftotext", file.name, "-"], capture_output=True, text=True, check=False).stdout
    finally:
        os.unlink(file.name)
    pages = int(next(line.split()[-1] for line in info.splitlines() if line.startswith("Pages:")))
    return pages, text


def check_print(driver: Driver, base: str, allowed: tuple) -> None:
    demos = sorted(name[:-5] for name in os.listdir(os.path.join(REPO, "demo-loads")) if name.endswith(".json"))
    counts = {}
    with open(os.path.join(REPO, "Cargo.toml"), encoding="utf-8") as file:
        version = next(line.split('"')[1] for line in file if line.startswith("version = "))
    for demo in demos:
        open_page(driver, f"{base}?demo={demo}", allowed)
        for paper_name, paper in (("A4", (8.27, 11.69)), ("Letter", (8.5, 11.0))):
            pages, text = pdf_pages(driver, paper)
            if not 1 <= pages <= 2:
                raise Check(f"{demo} prints on {pages} {paper_name} pages")
            for wanted in ("Project", "Inputs", "Plan", "Assumptions", "Warnings", "Safety cautions", f"Doubleprime {version}", "printed 20"):
                if wanted not in text:
                    raise Check(f"{demo}: the printed quote has no {wanted!r}")
            if "Scenario file" in text or "Start from a demo load" in text:
                raise Check(f"{demo}: the editor is printed")
            counts[f"{demo} {paper_name}"] = pages
    print(f"persist: the quote sheet prints on 1-2 pages (A4 and Letter): {sorted(set(counts.values()))} pages")


def check_blocked_and_full(driver: Driver, page: str, allowed: tuple) -> None:
    for name, script, wanted in (("blocked", BLOCKED, "blocks storage"), ("full", FULL, "refuses new saves")):
        added = cdp(driver, "Page.addScriptToEvaluateOnNewDocument", {"source": script})
        try:
            open_page(driver, page, allowed)
            notice = driver.text("storage-notice")
            if wanted not in notice:
                raise Check(f"storage {name}: the notice is {notice!r}")
            save_as(driver, f"Kept in memory ({name})")
            if name == "full" and "storage is full" not in driver.text("saved-message"):
                raise Check(f"a full storage is not reported: {driver.text('saved-message')!r}")
            settled(driver)
            check_clean(driver, f"storage {name}", allowed)
        finally:
            cdp(driver, "Page.removeScriptToEvaluateOnNewDocument", {"identifier": added["identifier"]})
    print("persist: blocked and full storage are reported; the page keeps working in memory")


def check_offline_copy(driver: Driver, server: Server, page: str, allowed: tuple) -> None:
    open_page(driver, page, allowed)
    kept = run_async(
        driver,
        "const done = arguments[arguments.length - 1];"
        "navigator.serviceWorker.ready.then(() => caches.match('./')).then((r) => r ? r.text() : '').then((t) => done(t.length), (e) => done(-1));",
    )
    if not kept or kept < 100000:
        raise Check(f"the service worker did not keep the page (cached {kept} characters)")
    server.stop()
    driver.open(page)
    settled(driver)
    if driver.script("return window.__violations").__len__():
        raise Check("violations on the offline reload")
    driver.requests()
    driver.console_errors()  # the failed network attempt behind the cached copy is expected
    print(f"persist: the served page keeps itself ({kept} characters) and reloads with the server stopped")


def check_single_file(driver: Driver, dist: str, cli: Cli) -> None:
    path = os.path.join(os.path.abspath(dist), "doubleprime-offline.html")
    url = "file://" + path + "?demo=drying-sand-cores"
    open_page(driver, url, ())
    plan = cli.run("plan", os.path.join(REPO, "demo-loads", "drying-sand-cores.json"))
    if driver.value("result-generator_count") != plan["generator_count"]:
        raise Check("the single file shows another plan than the CLI")
    size = os.path.getsize(path)
    print(f"persist: the single file ({size} bytes) opens from file:// and plans {plan['generator_count']} generators")


def run(driver: Driver, server: Server, dist: str, cli: Cli) -> None:
    base = server.url
    allowed = (base,)  # the page's own navigations and its service worker, nothing else
    cdp(driver, "Page.addScriptToEvaluateOnNewDocument", {"source": WATCH})
    driver.viewport(1366, 768)
    driver.requests()
    page = f"{base}?demo={DEMO}"
    open_page(driver, page, allowed)
    check_save_and_reload(driver, page, allowed)
    check_migration(driver, page, allowed)
    check_hostile_imports(driver, cli, page, allowed)
    check_link_and_files(driver, base, allowed)
    check_print(driver, base, allowed)
    check_blocked_and_full(driver, page, allowed)
    check_single_file(driver, dist, cli)
    check_offline_copy(driver, server, page, allowed)


def main() -> int:
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    sys.stdout.reconfigure(line_buffering=True)
    dist = sys.argv[1]
    started = time.monotonic()
    server = Server(dist)
    try:
        binary("PDFINFO", "pdfinfo")
        cli = Cli(os.environ.get("DOUBLEPRIME_CLI") or os.path.join(REPO, "target", "debug", "doubleprime"))
        with browser_session() as driver:
            try:
                server.start()
                run(driver, server, dist, cli)
            finally:
                server.stop()
    except Check as problem:
        print(f"persist: FAILED: {problem}", file=sys.stderr)
        return 1
    print(f"persist: all checks passed in {time.monotonic() - started:.0f} s")
    return 0


if __name__ == "__main__":
    sys.exit(main())
