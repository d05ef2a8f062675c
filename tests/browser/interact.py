#!/usr/bin/env python3
"""Drives the served app in headless Chromium and checks it against the command-line tool.

Usage: interact.py BASE_URL

Speaks the W3C WebDriver protocol to chromedriver with the standard library only, so no test
package (and no browser download) is needed. The expected numbers come from the `doubleprime`
command-line tool on the same scenario (the page's own scenario file, read back from the page),
so the page, the core and the CLI cannot drift apart.

Environment:
  DOUBLEPRIME_CLI   the command-line tool (default: target/debug/doubleprime in the repository)
  REQUEST_LOG       the test server's request log; no request may appear in it after load
  SCREENSHOT_DIR    where the screenshots go (default: tests/screenshots in the repository)
  CHROMIUM, CHROMEDRIVER override the binaries.
"""

import base64
import contextlib
import json
import os
import shutil
import socket
import subprocess
import sys
import tempfile
import time
import urllib.error
import urllib.request

# Time for the wasm to load and for one recomputation to show, generous for a loaded CI machine.
WAIT_S = 30.0
REPO = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
DEMO = "tempering-beef-blocks"
# Relative tolerance between the page's numbers (wasm) and the CLI's (native): both run the same
# Rust code in IEEE doubles; only the maths library differs (last-bit differences in exp, pow).
RELATIVE_TOLERANCE = 1e-9

CHROMIUM_FLAGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--hide-scrollbars",
    "--force-color-profile=srgb",
    "--window-size=1366,768",
]

TAB = "\ue004"
ENTER = "\ue007"
SHIFT = "\ue008"


class Check(Exception):
    """A page that did not do what the test expected."""


def binary(env_name: str, *names: str) -> str:
    given = os.environ.get(env_name)
    found = shutil.which(given) if given else next(filter(None, map(shutil.which, names)), None)
    if not found:
        raise Check(f"{env_name}={given} is not an executable" if given else f"no {names[0]} found (set {env_name})")
    return found


def free_port() -> int:
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        return probe.getsockname()[1]


def close(actual: float, expected: float, what: str) -> None:
    scale = max(abs(expected), 1e-12)
    if abs(actual - expected) > RELATIVE_TOLERANCE * scale:
        raise Check(f"{what}: page {actual!r}, CLI {expected!r}")


class Cli:
    """The command-line tool: the reference for every number the page shows."""

    def __init__(self, path: str) -> None:
        if not os.access(path, os.X_OK):
            raise Check(f"no command-line tool at {path} (build it with cargo build, or set DOUBLEPRIME_CLI)")
        self.path = path

    def run(self, *args: str) -> dict:
        done = subprocess.run([self.path, *args], capture_output=True, text=True, check=False)
        if done.returncode != 0:
            raise Check(f"doubleprime {' '.join(args)} failed: {done.stderr.strip()}")
        return json.loads(done.stdout)

    def on_text(self, subcommand: str, scenario_text: str) -> dict:
        with tempfile.NamedTemporaryFile("w", suffix=".json", delete=False) as file:
            file.write(scenario_text)
        try:
            return self.run(subcommand, file.name)
        finally:
            os.unlink(file.name)


class Driver:
    """The WebDriver commands this test needs."""

    def __init__(self, port: int, shots: str = "") -> None:
        self.base = f"http://127.0.0.1:{port}"
        self.session = ""
        self.shots = shots

    def call(self, method: str, path: str, body: object = None) -> object:
        data = None if body is None else json.dumps(body).encode()
        request = urllib.request.Request(
            self.base + path, data=data, method=method, headers={"Content-Type": "application/json"}
        )
        try:
            with urllib.request.urlopen(request, timeout=120) as response:
                return json.load(response)["value"]
        except urllib.error.HTTPError as error:
            raise Check(f"WebDriver {method} {path}: {error.read().decode()[:500]}") from None

    def wait_ready(self) -> None:
        deadline = time.monotonic() + WAIT_S
        while time.monotonic() < deadline:
            try:
                if self.call("GET", "/status").get("ready"):
                    return
            except (OSError, Check):
                pass
            time.sleep(0.2)
        raise Check("chromedriver did not start")

    def start(self, chromium: str, profile_dir: str) -> None:
        options = {"binary": chromium, "args": CHROMIUM_FLAGS + [f"--user-data-dir={profile_dir}"]}
        capabilities = {
            "browserName": "chrome",
            "goog:chromeOptions": options,
            "goog:loggingPrefs": {"browser": "ALL", "performance": "ALL"},
        }
        value = self.call("POST", "/session", {"capabilities": {"alwaysMatch": capabilities}})
        self.session = f"/session/{value['sessionId']}"

    def stop(self) -> None:
        if self.session:
            self.call("DELETE", self.session)

    def open(self, url: str) -> None:
        self.call("POST", f"{self.session}/url", {"url": url})

    def script(self, source: str, *args: object) -> object:
        return self.call("POST", f"{self.session}/execute/sync", {"script": source, "args": list(args)})

    def find(self, selector: str) -> str:
        found = self.call("POST", f"{self.session}/element", {"using": "css selector", "value": selector})
        return next(iter(found.values()))

    def testid(self, testid: str) -> str:
        return self.find(f'[data-testid="{testid}"]')

    def text(self, testid: str) -> str:
        return self.call("GET", f"{self.session}/element/{self.testid(testid)}/text")

    def value(self, testid: str) -> float:
        """The exact number behind a shown figure (its data-value attribute)."""
        raw = self.call("GET", f"{self.session}/element/{self.testid(testid)}/attribute/data-value")
        if raw is None:
            raise Check(f"{testid} has no data-value")
        return float(raw)

    def click(self, selector: str) -> None:
        self.call("POST", f"{self.session}/element/{self.find(selector)}/click", {})

    def type_into(self, testid: str, text: str) -> None:
        element = f"{self.session}/element/{self.testid(testid)}"
        self.call("POST", f"{element}/clear", {})
        self.call("POST", f"{element}/value", {"text": text})

    def keys(self, *keys: str) -> None:
        """Press keys on the keyboard, one after the other (WebDriver actions)."""
        actions = []
        for key in keys:
            actions += [{"type": "keyDown", "value": key}, {"type": "keyUp", "value": key}]
        self.call("POST", f"{self.session}/actions", {"actions": [{"type": "key", "id": "keyboard", "actions": actions}]})

    def viewport(self, width: int, height: int) -> None:
        """Set the page's viewport exactly (the window's outer size would include browser chrome)."""
        metrics = {"width": width, "height": height, "deviceScaleFactor": 1, "mobile": False}
        self.call("POST", f"{self.session}/goog/cdp/execute", {"cmd": "Emulation.setDeviceMetricsOverride", "params": metrics})

    def media(self, feature: str, value: str) -> None:
        """Emulate a CSS media feature (prefers-color-scheme)."""
        params = {"features": [{"name": feature, "value": value}]}
        self.call("POST", f"{self.session}/goog/cdp/execute", {"cmd": "Emulation.setEmulatedMedia", "params": params})

    def screenshot(self, path: str) -> None:
        with open(path, "wb") as file:
            file.write(base64.b64decode(self.call("GET", f"{self.session}/screenshot")))

    def log(self, kind: str) -> list:
        return self.call("POST", f"{self.session}/se/log", {"type": kind})

    def console_errors(self) -> list:
        return [entry["message"] for entry in self.log("browser") if entry.get("level") == "SEVERE"]

    def requests(self) -> list:
        """URLs of the network requests since the last call: http, https and WebSocket ones
        (data: URLs are not requests, and chrome:// pages are the browser's own)."""
        urls = []
        for entry in self.log("performance"):
            message = json.loads(entry["message"])["message"]
            if message.get("method") in ("Network.requestWillBeSent", "Network.webSocketCreated"):
                params = message["params"]
                url = params["request"]["url"] if "request" in params else params.get("url", "")
                if url.split(":", 1)[0] in ("http", "https", "ws", "wss"):
                    urls.append(url)
        return urls

    def wait(self, what: str, test, timeout: float = WAIT_S):
        """Poll `test()` until it returns something truthy; its last problem is reported."""
        deadline = time.monotonic() + timeout
        last = None
        while time.monotonic() < deadline:
            try:
                result = test()
                if result:
                    return result
                last = result
            except Check as problem:
                last = problem
            time.sleep(0.1)
        raise Check(f"timed out waiting for {what} (last: {last})")

    def wait_text(self, testid: str, wanted: str) -> str:
        return self.wait(f"{testid} to contain {wanted!r}", lambda: wanted in self.text(testid) and self.text(testid))


@contextlib.contextmanager
def browser_session(shots: str = ""):
    """Headless Chromium driven through a chromedriver of its own, on a fresh profile; both stop
    when the block ends, however it ends. Raises Check when either binary is missing."""
    chromium = binary("CHROMIUM", "chromium", "chromium-browser", "google-chrome")
    chromedriver = binary("CHROMEDRIVER", "chromedriver")
    port = free_port()
    with tempfile.TemporaryDirectory() as profile_dir:
        process = subprocess.Popen([chromedriver, f"--port={port}"], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        driver = Driver(port, shots)
        try:
            driver.wait_ready()
            driver.start(chromium, profile_dir)
            yield driver
        finally:
            try:
                driver.stop()
            except (Check, OSError):
                pass
            process.terminate()
            process.wait(timeout=10)


# -- the page's own scenario and plan ---------------------------------------------------------

def page_scenario(driver: Driver) -> str:
    text = driver.script('return document.querySelector(\'[data-testid="scenario-json"]\').textContent')
    if not text or not text.lstrip().startswith("{"):
        raise Check(f"the page shows no scenario file: {text!r}")
    return text


def settled(driver: Driver) -> None:
    """Wait until the plan on screen is current (no stale notice, headline shown)."""
    driver.wait(
        "a current plan",
        lambda: driver.script(
            'return !document.querySelector(\'[data-testid="stale-notice"]\')'
            ' && !!document.querySelector(\'[data-testid="result-generator_count"]\')'
        ),
    )


def check_headline(driver: Driver, plan: dict, where: str) -> None:
    for testid, key in [
        ("generator_count", "generator_count"),
        ("generator_rating_kw", "generator_rating_kw"),
        ("mains_power_kw", "mains_power_kw"),
        ("absorbed_power_kw", "absorbed_power_kw"),
        ("forward_power_kw", "forward_power_kw"),
        ("tunnel_length_m", "tunnel_length_m"),
        ("belt_speed_m_per_min", "belt_speed_m_per_min"),
        ("residence_time_s", "residence_time_s"),
        ("specific_energy_kwh_per_kg", "specific_energy_kwh_per_kg"),
        ("cooling_water_l_per_min", "cooling_water_l_per_min"),
    ]:
        close(driver.value(f"result-{testid}"), plan[key], f"{where}: {testid}")
    close(driver.value("result-mains_kva"), plan["utilities"]["mains_kva"], f"{where}: kVA")
    close(driver.value("result-energy_cost_per_hour"), plan["utilities"]["energy_cost_per_hour"], f"{where}: cost")


def wait_for_plan(driver: Driver, cli: Cli, where: str) -> dict:
    """Wait for a current plan, then check the page against the CLI on the page's scenario."""
    settled(driver)
    plan = cli.on_text("plan", page_scenario(driver))
    driver.wait(
        f"{where}: the generator count of the CLI ({plan['generator_count']})",
        lambda: driver.value("result-generator_count") == plan["generator_count"],
    )
    check_headline(driver, plan, where)
    return plan


# -- the checks --------------------------------------------------------------------------------

def check_opening(driver: Driver, cli: Cli) -> dict:
    settled(driver)
    demo = cli.run("plan", os.path.join(REPO, "demo-loads", f"{DEMO}.json"))
    check_headline(driver, demo, "the demo as opened")
    print(f"interact: ?demo={DEMO} opens with the CLI's plan ({demo['generator_count']} x {demo['generator_rating_kw']} kW)")
    return demo


def check_tables(driver: Driver, plan: dict) -> None:
    driver.click('[data-testid="zones-toggle"]')
    rows = driver.script(
        "return Array.from(document.querySelectorAll('[data-testid=\"zones-row\"]')).map(r => ({"
        " temp: +r.querySelector('[data-testid=\"zones-temp_c\"]').dataset.value,"
        " kw: +r.querySelector('[data-testid=\"zones-absorbed_kw\"]').dataset.value}))"
    )
    zones = plan["zones"]
    if len(rows) != len(zones):
        raise Check(f"zone table has {len(rows)} rows, the plan {len(zones)} zones")
    for index, (row, zone) in enumerate(zip(rows, zones)):
        close(row["temp"], zone["temp_c"], f"zone {index + 1} temperature")
        close(row["kw"], zone["absorbed_kw"], f"zone {index + 1} absorbed kW")
    total = driver.script(
        "return +document.querySelector('[data-testid=\"zones-total\"] [data-testid=\"zones-absorbed_kw\"]').dataset.value"
    )
    close(total, plan["absorbed_power_kw"], "zone table total against the plan's absorbed power")
    close(sum(row["kw"] for row in rows), plan["absorbed_power_kw"], "sum of the zone rows")
    print(f"interact: zone table matches the plan ({len(rows)} zones, {total:.3f} kW in all)")

    freq = plan["frequency_mhz"]
    dp = driver.script(
        "const f = arguments[0];"
        "const row = Array.from(document.querySelectorAll('[data-testid=\"penetration-row\"]'))"
        ".find(r => Math.abs(+r.querySelector('[data-testid=\"penetration-freq_mhz\"]').dataset.value - f) < 1e-9);"
        "return row ? [+row.querySelector('[data-testid=\"penetration-dp_inlet\"]').dataset.value,"
        " +row.querySelector('[data-testid=\"penetration-dp_outlet\"]').dataset.value] : null",
        freq,
    )
    if not dp:
        raise Check(f"the penetration table has no row at {freq} MHz")
    close(dp[0], plan["dielectric_inlet"]["penetration_depth_m"], "Dp at the inlet in the penetration table")
    close(dp[1], plan["dielectric_outlet"]["penetration_depth_m"], "Dp at the outlet in the penetration table")
    print("interact: penetration-depth table matches the plan's inlet and outlet Dp")

    ranked = driver.script(
        "return Array.from(document.querySelectorAll('[data-testid=\"sensitivity-row\"]'))"
        ".map(r => +r.querySelector('[data-testid=\"sensitivity-rank\"]').dataset.value)"
    )
    if [row["rank"] for row in plan["sensitivity"]] != sorted(ranked) or len(ranked) != len(plan["sensitivity"]):
        raise Check(f"sensitivity table ranks {ranked}, plan {[row['rank'] for row in plan['sensitivity']]}")
    print(f"interact: sensitivity table lists the plan's {len(ranked)} rows in rank order")


def band_rows(driver: Driver) -> dict:
    return driver.script(
        "const out = {};"
        "for (const r of document.querySelectorAll('[data-testid^=\"band-row-\"]')) {"
        " const g = r.querySelector('[data-testid=\"band-generators\"]');"
        " out[r.dataset.testid.slice(9)] = {count: g ? +g.dataset.value : null, current: r.getAttribute('aria-current') === 'true'};"
        "} return out"
    )


def check_bands(driver: Driver, cli: Cli) -> None:
    compare = cli.on_text("compare", page_scenario(driver))
    shown = band_rows(driver)
    for band in compare["bands"]:
        key = f"{band['frequency_mhz']:g}"
        row = shown.get(key)
        if row is None:
            raise Check(f"no band-table row for {key} MHz; rows: {sorted(shown)}")
        if row["count"] != band.get("generator_count") or row["current"] != band["is_scenario_band"]:
            raise Check(f"band {key}: page {row}, CLI {band.get('generator_count')} current={band['is_scenario_band']}")
    print("interact: band table matches the CLI's compare")

    # Switching band in the form moves the plan and the marked row.
    driver.click('[data-testid="input-frequency_mhz"] option[value="2450"]')
    driver.wait("the 2450 MHz row to be marked", lambda: band_rows(driver).get("2450", {}).get("current"))
    plan = wait_for_plan(driver, cli, "after switching to 2450 MHz")
    if "2450" not in driver.text("result-generator_class"):
        raise Check(f"generator class after switching: {driver.text('result-generator_class')}")
    check_bands_current(driver, cli, "2450")
    # The table's own button plans in another band.
    driver.click('[data-testid="band-use-27.12"]')
    driver.wait("the 27.12 MHz row to be marked", lambda: band_rows(driver).get("27.12", {}).get("current"))
    plan = wait_for_plan(driver, cli, "after 'Use' on 27.12 MHz")
    print(f"interact: switching band updates plan and comparison (2450 MHz, then 27.12 MHz: {plan['generator_count']} x {plan['generator_rating_kw']} kW)")
    driver.click('[data-testid="input-frequency_mhz"] option[value="915"]')
    driver.wait("the 915 MHz row to be marked again", lambda: band_rows(driver).get("915", {}).get("current"))
    wait_for_plan(driver, cli, "back at 915 MHz")


def check_bands_current(driver: Driver, cli: Cli, band: str) -> None:
    compare = cli.on_text("compare", page_scenario(driver))
    current = [f"{b['frequency_mhz']:g}" for b in compare["bands"] if b["is_scenario_band"]]
    if current != [band]:
        raise Check(f"CLI marks {current} as the scenario band, expected {band}")
    rows = band_rows(driver)
    marked = [key for key, row in rows.items() if row["current"]]
    if marked != [band]:
        raise Check(f"page marks {marked}, expected {band}")


def check_typing(driver: Driver, cli: Cli, opening: dict) -> None:
    before = driver.value("result-generator_count")
    driver.type_into("input-throughput_kg_per_h", "9000")
    driver.wait("the generator count to change", lambda: driver.value("result-generator_count") != before)
    plan = wait_for_plan(driver, cli, "throughput 9000 kg/h")
    print(f"interact: typing a throughput changes the generator count ({before:g} -> {plan['generator_count']})")
    # A decimal comma reads like a point.
    driver.type_into("input-throughput_kg_per_h", "4500,5")
    driver.wait("the scenario to read 4500.5 kg/h", lambda: '"throughput_kg_per_h": 4500.5' in page_scenario(driver))
    wait_for_plan(driver, cli, "throughput 4500,5 kg/h")
    driver.type_into("input-throughput_kg_per_h", "3000")
    wait_for_plan(driver, cli, "throughput back at 3000 kg/h")
    print("interact: a decimal comma reads like a point (4500,5 kg/h)")


def check_invalid_field(driver: Driver, cli: Cli, shots: str) -> None:
    last = driver.value("result-generator_count")
    driver.type_into("input-tunnel.bed_depth_m", "abc")
    message = driver.wait_text("error-tunnel.bed_depth_m", "is not accepted")
    driver.wait("the stale notice", lambda: driver.script('return !!document.querySelector(\'[data-testid="stale-notice"]\')'))
    driver.wait_text("plan-status", "Out of date")
    if driver.value("result-generator_count") != last:
        raise Check("the last valid plan did not stay on screen")
    invalid = driver.script("return document.getElementById('field-tunnel-bed_depth_m').getAttribute('aria-invalid')")
    if invalid != "true":
        raise Check(f"aria-invalid is {invalid!r} on the refused field")
    summary = driver.text("error-summary")
    if "Bed depth" not in summary:
        raise Check(f"the problem list does not name the field: {summary!r}")
    print(f"interact: an unreadable field shows its message ({message!r}), the last plan stays, marked stale")
    driver.type_into("input-tunnel.bed_depth_m", "5")
    driver.wait_text("error-tunnel.bed_depth_m", "valid is 0.0005 to 2 m")
    driver.script("document.getElementById('field-tunnel-bed_depth_m').scrollIntoView({block: 'center'})")
    driver.screenshot(os.path.join(shots, "stale-1366x768.png"))
    print("interact: an out-of-range field shows the core's range with the unit")
    driver.type_into("input-tunnel.bed_depth_m", "0,1")
    wait_for_plan(driver, cli, "bed depth restored")
    print("interact: fixing the field brings the plan back up to date")


def check_explorer(driver: Driver, cli: Cli) -> None:
    driver.click('[data-testid="explorer-material"] option[value="water"]')
    driver.type_into("explorer-freq_mhz", "2450")
    driver.type_into("explorer-temp_c", "25")
    expected = cli.run("material", "water", "--freq-mhz", "2450", "--temp-c", "25")
    driver.wait("the explorer to show water", lambda: abs(driver.value("explorer-eps_real") - expected["eps_real"]) < 1e-6)
    close(driver.value("explorer-eps_real"), expected["eps_real"], "explorer eps'")
    close(driver.value("explorer-eps_imag"), expected["eps_imag"], "explorer eps''")
    close(driver.value("explorer-loss_tangent"), expected["loss_tangent"], "explorer loss tangent")
    close(driver.value("explorer-penetration_depth"), expected["penetration_depth_m"], "explorer Dp")
    if "Ellison" not in driver.text("explorer-source"):
        raise Check(f"explorer source: {driver.text('explorer-source')!r}")
    print(f"interact: material explorer matches `doubleprime material water` (eps' {expected['eps_real']:.3f})")


def check_cautions(driver: Driver) -> None:
    driver.click('[data-testid="nav-safety"]')
    top = driver.wait(
        "the cautions in view",
        lambda: driver.script(
            "const r = document.getElementById('safety').getBoundingClientRect();"
            "return r.top >= 0 && r.top < window.innerHeight ? r.top + 1 : 0"
        ),
    )
    codes = driver.script("return Array.from(document.querySelectorAll('[data-testid=\"caution\"]')).map(c => c.dataset.code)")
    required = ["exposure_and_leakage", "high_voltage", "interlocks", "arcing_and_fire", "thermal_runaway", "ceramic_dust", "local_codes"]
    missing = [code for code in required if code not in codes]
    if missing:
        raise Check(f"cautions missing: {missing}")
    print(f"interact: the header's Safety link brings the cautions into view (top at {top - 1:.0f} px), all {len(required)} standing cautions present")


def check_keyboard(driver: Driver) -> None:
    # From the top of the page: the skip link first, then the form.
    driver.keys(TAB)
    first = driver.script("return document.activeElement.className")
    if first != "app-skip":
        raise Check(f"the first Tab reaches {first!r}, not the skip link")
    driver.keys(ENTER, TAB)
    after_skip = driver.script("return document.activeElement.id")
    if after_skip != "demo-picker-select":
        raise Check(f"after the skip link, Tab reaches {after_skip!r}")
    # Walk the whole page with Tab: every stop must show a focus ring, and the key inputs and
    # the safety link must be reachable.
    seen = []
    unringed = []
    for _ in range(600):
        driver.keys(TAB)
        info = driver.script(
            "const e = document.activeElement; const s = getComputedStyle(e);"
            "const again = e.dataset.tabStop === '1'; e.dataset.tabStop = '1';"
            "return [e.id || e.dataset.testid || e.className || e.tagName, s.outlineStyle, parseFloat(s.outlineWidth) || 0, again]"
        )
        name, style, width, again = info
        # Past the last stop the focus leaves the page (body), then comes round to the top.
        if name == "BODY":
            continue
        if again:
            break
        seen.append(name)
        if style == "none" or width < 2:
            unringed.append(name)
    driver.script("for (const e of document.querySelectorAll('[data-tab-stop]')) delete e.dataset.tabStop")
    for wanted in ["field-throughput_kg_per_h", "field-frequency_mhz", "nav-safety", "field-tunnel-bed_depth_m", "explorer-material"]:
        if wanted not in seen:
            raise Check(f"{wanted} is not reachable with Tab; reached {len(seen)} stops: {seen}")
    if unringed:
        raise Check(f"no visible focus ring on: {unringed[:10]}")
    print(f"interact: keyboard: skip link, {len(seen)} Tab stops, each with a focus ring of 2 px or more")
    # Typing with the keyboard alone recomputes.
    driver.script("document.getElementById('field-throughput_kg_per_h').focus(); document.getElementById('field-throughput_kg_per_h').select()")
    before = driver.value("result-generator_count")
    driver.keys(*"12000")
    driver.wait("the plan to follow keyboard typing", lambda: driver.value("result-generator_count") != before)
    driver.script("document.getElementById('field-throughput_kg_per_h').select()")
    driver.keys(*"3000")
    driver.wait("the plan to return", lambda: driver.value("result-generator_count") == before)
    print("interact: keyboard typing alone drives the plan")


LABELS_SCRIPT = """
const bad = [];
for (const el of document.querySelectorAll('input, select, textarea')) {
  if (el.type === 'hidden') continue;
  const labelled = (el.labels && el.labels.length > 0) || el.getAttribute('aria-label') || el.getAttribute('aria-labelledby');
  if (!labelled) bad.push(el.id || el.outerHTML.slice(0, 80));
  for (const id of (el.getAttribute('aria-describedby') || '').split(/\\s+/).filter(Boolean)) {
    if (!document.getElementById(id)) bad.push((el.id || '?') + ' describedby missing ' + id);
  }
}
return bad;
"""

# WCAG 2.x relative luminance and contrast of every visible text against its background.
CONTRAST_SCRIPT = """
function rgb(c) { const m = c.match(/[\\d.]+/g); return m ? m.slice(0, 4).map(Number) : null; }
function lum(c) { const [r, g, b] = c.slice(0, 3).map(v => { v /= 255; return v <= 0.03928 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4); });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b; }
// SVG text sits on whatever shape was painted under its centre before it, else on the page.
function svgBackground(el) {
  const svg = el.ownerSVGElement; if (!svg) return null;
  const b = el.getBBox(); const cx = b.x + b.width / 2, cy = b.y + b.height / 2;
  let found = null;
  for (const r of svg.querySelectorAll('rect')) {
    if (r.closest('defs, clipPath') || !(r.compareDocumentPosition(el) & Node.DOCUMENT_POSITION_FOLLOWING)) continue;
    const rb = r.getBBox();
    if (cx < rb.x || cx > rb.x + rb.width || cy < rb.y || cy > rb.y + rb.height) continue;
    const c = rgb(getComputedStyle(r).fill);
    if (c && (c.length < 4 || c[3] > 0.5)) found = c;
  }
  return found;
}
function background(el) {
  if (el instanceof SVGElement) { const c = svgBackground(el); if (c) return c; }
  for (let e = el; e; e = e.parentElement) {
    if (e instanceof SVGElement && e.tagName !== 'svg') continue;
    const c = rgb(getComputedStyle(e).backgroundColor);
    if (c && (c.length < 4 || c[3] > 0.5)) return c;
  }
  return [255, 255, 255];
}
const failures = []; let checked = 0;
const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
const done = new Set();
while (walker.nextNode()) {
  const node = walker.currentNode; const el = node.parentElement;
  if (!el || done.has(el) || !node.textContent.trim()) continue;
  done.add(el);
  if (el.closest('[hidden], .visually-hidden, noscript, title, desc')) continue;
  if (el.getClientRects().length === 0) continue;
  const style = getComputedStyle(el);
  if (style.visibility === 'hidden' || style.display === 'none') continue;
  const fg = rgb(el instanceof SVGElement ? style.fill : style.color);
  if (!fg) continue;
  const bg = background(el);
  const [a, b] = [lum(fg), lum(bg)].sort((x, y) => y - x);
  const ratio = (a + 0.05) / (b + 0.05);
  const size = parseFloat(style.fontSize); const bold = parseInt(style.fontWeight) >= 700;
  const large = size >= 24 || (bold && size >= 18.66);
  checked++;
  if (ratio < (large ? 3 : 4.5)) failures.push(`${ratio.toFixed(2)} ${el.tagName}.${el.getAttribute('class') || ''}: ${node.textContent.trim().slice(0, 40)}`);
}
return [checked, failures.slice(0, 20)];
"""

ALTERNATIVES_SCRIPT = """
const bad = []; let charts = 0;
for (const svg of document.querySelectorAll('svg[role="img"]')) {
  charts++;
  const title = svg.querySelector('title'), desc = svg.querySelector('desc');
  const ids = (svg.getAttribute('aria-labelledby') || '').split(/\\s+/);
  if (!title || !title.textContent.trim() || !desc || desc.textContent.trim().length < 20) bad.push(svg.dataset.testid + ': no title or description');
  if (!ids.every(id => document.getElementById(id))) bad.push(svg.dataset.testid + ': aria-labelledby broken');
  const section = svg.closest('section');
  if (!section || !section.querySelector('table')) bad.push(svg.dataset.testid + ': no data table beside it');
}
return [charts, bad];
"""


def check_accessibility(driver: Driver) -> None:
    unlabelled = driver.script(LABELS_SCRIPT)
    if unlabelled:
        raise Check(f"inputs without labels or with broken descriptions: {unlabelled}")
    charts, bad = driver.script(ALTERNATIVES_SCRIPT)
    if bad or charts < 8:
        raise Check(f"{charts} charts; text alternatives: {bad}")
    checked, failures = driver.script(CONTRAST_SCRIPT)
    if failures:
        raise Check(f"text below WCAG AA contrast ({len(failures)} of {checked}): {failures}")
    # The same in the dark colour scheme.
    driver.media("prefers-color-scheme", "dark")
    try:
        time.sleep(0.3)
        driver.screenshot(os.path.join(driver.shots, "dark-1366x768.png"))
        dark_checked, dark_failures = driver.script(CONTRAST_SCRIPT)
    finally:
        driver.media("prefers-color-scheme", "light")
    if dark_failures:
        raise Check(f"dark scheme: text below WCAG AA contrast ({len(dark_failures)} of {dark_checked}): {dark_failures}")
    print(
        f"interact: every input labelled; {charts} charts with title, description and data table;"
        f" {checked} texts pass AA contrast in the light scheme, {dark_checked} in the dark one"
    )


def check_demo_and_custom(driver: Driver, cli: Cli) -> None:
    driver.click('[data-testid="demo-select"] option[value="drying-sand-cores"]')
    driver.click('[data-testid="demo-open"]')
    driver.wait_text("result-name", "sand cores")
    plan = wait_for_plan(driver, cli, "the drying demo opened from the list")
    expected = cli.run("plan", os.path.join(REPO, "demo-loads", "drying-sand-cores.json"))
    close(plan["mains_power_kw"], expected["mains_power_kw"], "the opened demo against its file")
    print(f"interact: opening a demo from the list gives its file's plan ({expected['generator_count']} generators)")
    driver.click('[data-testid="product-source-custom"]')
    driver.wait("the custom fields", lambda: driver.script("return !document.getElementById('field-product-custom-dielectric-eps_real').closest('[hidden]')"))
    driver.wait("the scenario to hold the user's material", lambda: '"custom"' in page_scenario(driver))
    plan = wait_for_plan(driver, cli, "a user-defined product")
    driver.type_into("input-product.custom.dielectric.eps_imag", "2,5")
    driver.wait("the loss factor to reach the scenario", lambda: '"eps_imag": 2.5' in page_scenario(driver))
    wait_for_plan(driver, cli, "a user-defined loss factor of 2,5")
    print("interact: a user-defined product plans as the CLI does")
    driver.click('[data-testid="product-source-library"]')
    driver.click('[data-testid="demo-select"] option[value="tempering-beef-blocks"]')
    driver.click('[data-testid="demo-open"]')
    driver.wait_text("result-name", "beef")
    wait_for_plan(driver, cli, "back to the opening demo")


# Start the design search, watch its progress from the page itself (a MutationObserver on the
# panel), and click Cancel as soon as it has moved part way: the slices yield to the browser with
# a zero-delay timeout, so the click lands before the next slice runs. With the argument 'edit' it
# edits the throughput instead, which must stop the search too.
SEARCH_START_AND_CANCEL = """
const done = arguments[arguments.length - 1];
const panel = document.getElementById('search');
const values = [];
const observer = new MutationObserver(() => {
  const bar = panel.querySelector('[data-testid="search-progress"]');
  if (!bar) return;
  const value = Number(bar.getAttribute('value')), max = Number(bar.getAttribute('max'));
  if (values[values.length - 1] !== value) values.push(value);
  if (value > 0 && value < max) {
    observer.disconnect();
    if (arguments[0] === 'edit') {
      const input = document.querySelector('[data-testid="input-throughput_kg_per_h"]');
      input.value = '3001';
      input.dispatchEvent(new Event('input', {bubbles: true}));
    } else {
      panel.querySelector('[data-testid="search-cancel"]').click();
    }
    done({values: values, max: max, cancelled: true});
  } else if (value >= max) {
    observer.disconnect();
    done({values: values, max: max, cancelled: false});
  }
});
observer.observe(panel, {subtree: true, childList: true, attributes: true, characterData: true});
panel.querySelector('[data-testid="search-start"]').click();
"""


def progress_value(driver: Driver) -> float:
    return float(driver.script('return document.querySelector(\'[data-testid="search-progress"]\').getAttribute("value")'))


def check_search(driver: Driver, cli: Cli) -> None:
    expected = cli.run("search", os.path.join(REPO, "demo-loads", f"{DEMO}.json"))
    total = expected["configurations"]
    scroll_to(driver, "search")
    seen = driver.call("POST", f"{driver.session}/execute/async", {"script": SEARCH_START_AND_CANCEL, "args": ["cancel"]})
    if not seen.get("cancelled"):
        raise Check(f"the search finished before it could be cancelled: {seen}")
    if int(seen["max"]) != total:
        raise Check(f"the search progress counts {seen['max']} configurations, the CLI {total}")
    if len(seen["values"]) < 2 or seen["values"][0] != 0:
        raise Check(f"the search progress did not move from 0: {seen['values']}")
    stopped_at = seen["values"][-1]
    time.sleep(1.0)
    if progress_value(driver) != stopped_at:
        raise Check(f"the search went on after Cancel: {stopped_at} then {progress_value(driver)}")
    driver.wait_text("search-progress-text", f"{int(stopped_at)} of {total} configurations")
    driver.wait_text("search-status", "Stopped")
    if driver.script('return !!document.querySelector(\'[data-testid="search-best"]\')'):
        raise Check("a cancelled search shows a table of best configurations")
    print(f"interact: search progress moved {seen['values']} of {total}, and Cancel stopped it with no results")

    driver.click('[data-testid="search-start"]')
    driver.wait("the search's best configurations", lambda: driver.script(
        'return !!document.querySelector(\'[data-testid="search-best"]\')'), timeout=120)
    driver.wait_text("search-progress-text", f"{total} of {total} configurations")
    rows = driver.script(
        "return Array.from(document.querySelectorAll('[data-testid=\"search-best-row\"]')).map(r => {"
        " const g = r.querySelector('[data-testid=\"search-best-generators\"]');"
        " return {cls: g.getAttribute('data-class'), count: Number(g.getAttribute('data-value')),"
        " belt: Number(r.querySelector('[data-testid=\"search-best-belt\"]').getAttribute('data-value')),"
        " bed: Number(r.querySelector('[data-testid=\"search-best-bed\"]').getAttribute('data-value'))}; })"
    )
    if len(rows) != len(expected["best"]):
        raise Check(f"the page shows {len(rows)} best configurations, the CLI {len(expected['best'])}")
    best = expected["best"][0]
    first = rows[0]
    if first["cls"] != best["generator_class"] or first["count"] != best["generator_count"]:
        raise Check(f"best configuration: page {first}, CLI {best['generator_class']} x {best['generator_count']}")
    close(first["belt"], best["belt_width_m"], "best configuration: belt width")
    close(first["bed"], best["bed_depth_m"], "best configuration: bed depth")
    if driver.shots:
        scroll_to(driver, "search")
        driver.screenshot(os.path.join(driver.shots, "search-1366x768.png"))
        driver.script("document.querySelector('[data-testid=\"chart-search-frontier\"]').scrollIntoView({block: 'start'})")
        time.sleep(0.2)
        driver.screenshot(os.path.join(driver.shots, "search-frontier-1366x768.png"))
    frontier = driver.script("return document.querySelectorAll('[data-testid=\"search-frontier-row\"]').length")
    if frontier != len(expected["frontier"]):
        raise Check(f"the page's frontier has {frontier} points, the CLI's {len(expected['frontier'])}")
    if not driver.script('return document.querySelector(\'[data-testid="chart-search-frontier"] desc\')?.textContent'):
        raise Check("the frontier chart has no text description")
    print(
        f"interact: the search ran to the end; best {best['generator_count']} x {best['generator_class']}, "
        f"belt {best['belt_width_m']} m, bed {best['bed_depth_m']} m, as the CLI's"
    )

    # An edit of the scenario stops a running search.
    seen = driver.call("POST", f"{driver.session}/execute/async", {"script": SEARCH_START_AND_CANCEL, "args": ["edit"]})
    if not seen.get("cancelled"):
        raise Check(f"the search finished before the scenario could be edited: {seen}")
    driver.wait_text("search-status", "the scenario changed")
    stopped_at = progress_value(driver)
    time.sleep(1.0)
    if progress_value(driver) != stopped_at:
        raise Check(f"the search went on after an edit: {stopped_at} then {progress_value(driver)}")
    if driver.script('return !!document.querySelector(\'[data-testid="search-best"]\')'):
        raise Check("a search stopped by an edit shows a table of best configurations")
    driver.type_into("input-throughput_kg_per_h", "3000")
    wait_for_plan(driver, cli, "throughput back at 3000 kg/h after the search")
    print(f"interact: editing the throughput stopped a running search at {stopped_at:g} of {total}")


def scroll_to(driver: Driver, element_id: str) -> None:
    driver.script(f"document.getElementById('{element_id}').scrollIntoView({{block: 'start'}})")
    time.sleep(0.2)


def take_screenshots(driver: Driver, shots: str) -> None:
    driver.script("document.querySelector('.app-results').scrollTop = 0; document.querySelector('.app-editor') && (document.querySelector('.app-editor').scrollTop = 0)")
    driver.screenshot(os.path.join(shots, "main-1366x768.png"))
    for name, element_id in [
        ("warnings", "warnings"),
        ("profiles", "zone-plot"),
        ("depth", "depth-plot"),
        ("permittivity", "permittivity-plot"),
        ("penetration", "penetration-plot"),
        ("bands", "bands"),
        ("sensitivity", "sensitivity"),
        ("materials", "materials"),
        ("safety", "safety"),
        ("form-tunnel", "tunnel"),
    ]:
        scroll_to(driver, element_id)
        driver.screenshot(os.path.join(shots, f"{name}-1366x768.png"))


def run(driver: Driver, base_url: str, cli: Cli, shots: str, request_log: str) -> None:
    driver.requests()  # the browser's own start page, before ours
    driver.viewport(1366, 768)
    driver.open(base_url.rstrip("/") + f"/?demo={DEMO}")
    driver.wait("the plan", lambda: driver.script('return !!document.querySelector(\'[data-testid="result-generator_count"]\')'))
    shown, booting = driver.script(
        "return [document.body.innerText.includes(arguments[0]), !!document.getElementById('boot-status')]",
        "Tempering frozen beef blocks at 915 MHz",
    )
    if not shown:
        raise Check(f"?demo={DEMO} opened, but its title is not on the page")
    if booting:
        raise Check("the app is running, but the boot message is still on the page")
    # The service worker keeps the page for offline reuse with one request of its own (sw.js
    # and the page): that is part of the load, so wait for it before counting.
    kept = driver.call("POST", f"{driver.session}/execute/async", {"script": (
        "const done = arguments[arguments.length - 1];"
        "navigator.serviceWorker.ready.then(() => caches.match('./')).then((r) => done(!!r), () => done(false));"
    ), "args": []})
    if not kept:
        raise Check("the service worker did not keep the page for offline reuse")
    time.sleep(0.5)
    loaded = driver.requests()
    base = base_url.rstrip("/") + "/"
    # The page is one self-contained file; its service worker script is the only other file.
    own = {"", "sw.js"}
    strays = [url for url in loaded if not url.startswith(base) or url[len(base):].split("?")[0] not in own]
    if strays:
        raise Check(f"loading requested more than the page's own files: {strays}")
    served_at_load = line_count(request_log)
    print(f"interact: load made {len(loaded)} requests, all the page's own files")

    check_keyboard(driver)
    opening = check_opening(driver, cli)
    check_accessibility(driver)
    take_screenshots(driver, shots)
    check_tables(driver, opening)
    check_search(driver, cli)
    scroll_to(driver, "zone-plot")
    driver.screenshot(os.path.join(shots, "zone-table-1366x768.png"))
    check_typing(driver, cli, opening)
    check_invalid_field(driver, cli, shots)
    check_bands(driver, cli)
    check_explorer(driver, cli)
    check_cautions(driver)
    check_demo_and_custom(driver, cli)

    driver.viewport(820, 1180)
    time.sleep(0.5)
    driver.script("window.scrollTo(0, 0)")
    driver.screenshot(os.path.join(shots, "tablet-820x1180.png"))
    scroll_to(driver, "results")
    driver.screenshot(os.path.join(shots, "tablet-results-820x1180.png"))
    scroll_to(driver, "zone-plot")
    driver.screenshot(os.path.join(shots, "tablet-profiles-820x1180.png"))
    width = driver.script("return document.documentElement.scrollWidth")
    if width > 830:
        raise Check(f"the tablet layout scrolls sideways: {width} px wide")
    print("interact: tablet layout (820 x 1180) fits without sideways scrolling")

    after = driver.requests()
    if after:
        raise Check(f"the page made network requests after load: {after}")
    if request_log and line_count(request_log) != served_at_load:
        raise Check(f"the server logged {line_count(request_log) - served_at_load} requests after load")
    print("interact: no network request after load (DevTools log" + (" and server log)" if request_log else ")"))

    errors = driver.console_errors()
    if errors:
        raise Check("console errors:\n  " + "\n  ".join(errors))
    print(f"interact: no console errors; screenshots in {os.path.relpath(shots, REPO)}")


def line_count(path: str) -> int:
    if not path:
        return 0
    with open(path, encoding="utf-8", errors="replace") as file:
        return sum(1 for line in file if '"GET ' in line)


def main() -> int:
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    # Line by line, so progress and failures interleave in order in CI logs.
    sys.stdout.reconfigure(line_buffering=True)
    base_url = sys.argv[1]
    shots = os.environ.get("SCREENSHOT_DIR") or os.path.join(REPO, "tests", "screenshots")
    os.makedirs(shots, exist_ok=True)
    started = time.monotonic()
    try:
        cli = Cli(os.environ.get("DOUBLEPRIME_CLI") or os.path.join(REPO, "target", "debug", "doubleprime"))
        with browser_session(shots) as driver:
            try:
                run(driver, base_url, cli, shots, os.environ.get("REQUEST_LOG", ""))
            except Check:
                try:
                    driver.screenshot(os.path.join(shots, "failure.png"))
                except (Check, OSError):
                    pass
                raise
    except Check as problem:
        print(f"interact: FAILED: {problem}", file=sys.stderr)
        return 1
    print(f"interact: all checks passed in {time.monotonic() - started:.0f} s")
    return 0


if __name__ == "__main__":
    sys.exit(main())
