#!/usr/bin/env python3
"""Types into the served page in headless Chromium and checks what the wasm core answers.

Usage: interact.py BASE_URL

Speaks the W3C WebDriver protocol to chromedriver with the standard library only, so no test
package (and no browser download) is needed. CHROMIUM and CHROMEDRIVER override the binaries.
"""

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
WAIT_S = 20.0

CHROMIUM_FLAGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    "--window-size=1366,768",
]


class Check(Exception):
    """A page that did not do what the test expected."""


def binary(env_name: str, *names: str) -> str:
    found = os.environ.get(env_name) or next(filter(None, map(shutil.which, names)), None)
    if not found:
        raise Check(f"no {names[0]} found (set {env_name})")
    return found


def free_port() -> int:
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        return probe.getsockname()[1]


class Driver:
    """The few WebDriver commands this test needs."""

    def __init__(self, port: int) -> None:
        self.base = f"http://127.0.0.1:{port}"
        self.session = ""

    def call(self, method: str, path: str, body: object = None) -> object:
        data = None if body is None else json.dumps(body).encode()
        request = urllib.request.Request(
            self.base + path, data=data, method=method,
            headers={"Content-Type": "application/json"},
        )
        try:
            with urllib.request.urlopen(request, timeout=60) as response:
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
            "goog:loggingPrefs": {"browser": "ALL"},
        }
        value = self.call("POST", "/session", {"capabilities": {"alwaysMatch": capabilities}})
        self.session = f"/session/{value['sessionId']}"

    def stop(self) -> None:
        if self.session:
            self.call("DELETE", self.session)

    def open(self, url: str) -> None:
        self.call("POST", f"{self.session}/url", {"url": url})

    def element(self, testid: str) -> str:
        found = self.call(
            "POST", f"{self.session}/element",
            {"using": "css selector", "value": f'[data-testid="{testid}"]'},
        )
        return next(iter(found.values()))

    def text(self, testid: str) -> str:
        return self.call("GET", f"{self.session}/element/{self.element(testid)}/text")

    def type_into(self, testid: str, text: str) -> None:
        element = f"{self.session}/element/{self.element(testid)}"
        self.call("POST", f"{element}/clear", {})
        self.call("POST", f"{element}/value", {"text": text})

    def console_errors(self) -> list:
        entries = self.call("POST", f"{self.session}/se/log", {"type": "browser"})
        return [entry["message"] for entry in entries if entry.get("level") == "SEVERE"]

    def wait_text(self, testid: str, wanted: str) -> None:
        deadline = time.monotonic() + WAIT_S
        shown = None
        while time.monotonic() < deadline:
            try:
                shown = self.text(testid)
            except Check:
                shown = None  # not rendered yet
            if shown is not None and wanted in shown:
                return
            time.sleep(0.1)
        raise Check(f"{testid} shows {shown!r}, expected it to contain {wanted!r}")


def run(driver: Driver, base_url: str) -> None:
    driver.open(base_url.rstrip("/") + "/?demo=smoke-check")
    driver.wait_text("penetration-depth", "12.9 mm")
    print("interact: opening values give Dp = 12.9 mm")

    # A decimal comma reads like a point.
    driver.type_into("eps-imag", "13,4")
    driver.wait_text("penetration-depth", "12.9 mm")
    # Constant eps*: Dp scales as 1/f, 12.883 mm x 2450/915 = 34.49 mm (also `doubleprime dielectric`).
    driver.type_into("freq-mhz", "915")
    driver.wait_text("penetration-depth", "34.5 mm")
    # At 27.12 MHz the depth passes 1 m and the unit follows: 1.1638 m.
    driver.type_into("freq-mhz", "27,12")
    driver.wait_text("penetration-depth", "1.16 m")
    print("interact: typing recomputes (915 MHz -> 34.5 mm, 27,12 MHz -> 1.16 m)")

    # Bad input: the core's own message, naming the field and the valid range.
    driver.type_into("freq-mhz", "400000")
    driver.wait_text("penetration-depth", "not computed")
    driver.wait_text(
        "input-problems",
        "freq_mhz = 400000 is not accepted: valid is more than 0 and at most 300000",
    )
    driver.type_into("eps-real", "abc")
    driver.wait_text("input-problems", 'eps_real = "abc" is not accepted')
    print("interact: bad input shows the core's messages")

    errors = driver.console_errors()
    if errors:
        raise Check("console errors:\n  " + "\n  ".join(errors))
    print("interact: no console errors")


def main() -> int:
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    # Line by line, so progress and failures interleave in order in CI logs.
    sys.stdout.reconfigure(line_buffering=True)
    base_url = sys.argv[1]
    try:
        chromium = binary("CHROMIUM", "chromium", "chromium-browser", "google-chrome")
        chromedriver = binary("CHROMEDRIVER", "chromedriver")
    except Check as problem:
        print(f"interact: FAILED: {problem}", file=sys.stderr)
        return 1
    port = free_port()
    with tempfile.TemporaryDirectory() as profile_dir:
        driver_process = subprocess.Popen(
            [chromedriver, f"--port={port}"],
            stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
        )
        driver = Driver(port)
        try:
            driver.wait_ready()
            driver.start(chromium, profile_dir)
            run(driver, base_url)
        except Check as problem:
            print(f"interact: FAILED: {problem}", file=sys.stderr)
            return 1
        finally:
            try:
                driver.stop()
            except (Check, OSError):
                pass
            driver_process.terminate()
            driver_process.wait(timeout=10)
    return 0


if __name__ == "__main__":
    sys.exit(main())
