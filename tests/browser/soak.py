#!/usr/bin/env python3
"""A soak test of the served app in headless Chromium: 10,000 rapid edits of the scenario form.

Usage: soak.py BASE_URL

The edits (throughput, bed depth, belt width, inlet and outlet temperatures, zone count: valid
values in several spellings, and about one in eight refused so that the stale path runs too) are
set from inside the page in batches of ten, each edit an `input` and a `change` event on the field,
with a frame between batches so the page renders. One batch in four is typed: the microtasks run
after each edit, as the browser lets them between two input events, so the page plans every edit.
The others are bursts set in one go, as no person can, and the page plans only their last edit.

At checkpoints, right after the last edit's frame and without waiting, the figures on screen must
be the CLI's plan of the last valid input the page was given to plan (rebuilt here from the values
set), and the stale notice and the fields' messages must say whether the last input was refused.
After the warm-up (1,000 edits) and at the end, the form holds the same texts; between the two the
JS heap after a forced GC, the wasm linear memory (the page's `WebAssembly.Memory`, found with
DevTools `Runtime.queryObjects`, so the app carries no diagnostic of its own) and the DOM nodes and
listeners (`Performance.getMetrics`) must stop growing. Prints the figures and the edits per
second. Reads the page by value in scripts: a WebDriver element reference keeps its element, and
the detached tree around it, alive after the page redraws it. Uses interact.py's WebDriver client.

Environment: DOUBLEPRIME_CLI, CHROMIUM, CHROMEDRIVER as for interact.py.
"""

import json
import os
import random
import sys
import time

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from interact import DEMO, REPO, Check, Cli, Driver, browser_session, check_headline, page_scenario  # noqa: E402

EDITS = 10_000
# Edits per batch, and every how many batches one is typed: about 1,000 frames and 2,500 edits
# planned one by one (one plan and its render take some 10 to 15 ms here), a minute on 2 cores.
BATCH = 10
TYPED_EVERY = 4
# Each checkpoint's edit count, and whether the form then holds a refused value. The last segment
# comes back to the texts the warm-up (the first) left, so that memory is compared between two
# pages in the same state.
CHECKPOINTS = [(1_000, True), (4_000, False), (7_000, False), (EDITS, True)]
INVALID_SHARE = 0.12
SEED = 20261201

# What may still grow from the warm-up to the end, the form being the same at both: the JS heap by
# half plus 1 MiB (V8 sizes its spaces and caches compiled code lazily); the wasm memory by 1 MiB
# (16 pages: the allocator may still reach a new high-water mark once, but memory that grows with
# the edits is a leak); the DOM nodes by 200 (a detached part of the page kept alive, such as an
# old results summary, is about that size) and the listeners by 10.
HEAP_FACTOR, HEAP_ALLOWANCE_BYTES = 1.5, 1 << 20
WASM_ALLOWANCE_BYTES = 1 << 20
NODE_ALLOWANCE = 200
LISTENER_ALLOWANCE = 10


class Field:
    """One form field the soak edits: where it sits in the scenario, and how to make its texts."""

    def __init__(self, name: str, path: tuple, low: float, high: float, digits: int, refused: list) -> None:
        self.name = name  # the scenario field, as in the input's data-testid
        self.path = path
        self.low, self.high, self.digits = low, high, digits
        self.refused = refused

    def valid(self, rng: random.Random) -> tuple:
        """A valid value and one way a person might type it."""
        value = round(rng.uniform(self.low, self.high), self.digits)
        if self.digits == 0:
            value = int(value)
        text = str(value)
        spelling = rng.random()
        if spelling < 0.3 and self.digits > 0:
            text = text.replace(".", ",")  # a decimal comma
        elif spelling < 0.4 and isinstance(value, int) and value >= 1000:
            text = f"{value:,}".replace(",", " ")  # thousands set apart
        if text.startswith("-") and rng.random() < 0.3:
            text = "\u2212" + text[1:]  # a typographic minus
        return value, text


FIELDS = [
    Field("throughput_kg_per_h", ("throughput_kg_per_h",), 500, 9000, 0, ["0", "-100", "250000", "abc", "", "1,2.5"]),
    Field("tunnel.bed_depth_m", ("tunnel", "bed_depth_m"), 0.04, 0.16, 3, ["5", "0", "x", ""]),
    Field("tunnel.belt_width_m", ("tunnel", "belt_width_m"), 0.5, 1.5, 2, ["0", "20", "1..2", ""]),
    Field("inlet.temp_c", ("inlet", "temp_c"), -25, -12, 1, ["-100", "500", "abc", ""]),
    Field("outlet.temp_c", ("outlet", "temp_c"), -8, -3, 1, ["400", "-", ""]),
    Field("tunnel.zones", ("tunnel", "zones"), 2, 24, 0, ["0", "2.5", "1001", ""]),
]

# Sets the edits batch by batch, each batch followed by a frame and a task (so the page has
# rendered and every effect has run); in a typed batch an `await` after each edit lets the
# microtasks run. Reports, for typed and burst batches, the time from a batch's first edit to its
# frame: summed, median and longest. The inputs are looked up once per batch, in case one is redrawn.
EDIT_SCRIPT = """
const [batches, done] = arguments;
const channel = new MessageChannel();
let woken = null;
channel.port1.onmessage = () => woken();
const nextFrame = () => new Promise((resolve) => requestAnimationFrame(() => {
  woken = resolve;
  channel.port2.postMessage(0);
}));
(async () => {
  const times = {typed: [], burst: []};
  try {
    for (const [typed, edits] of batches) {
      const batchStarted = performance.now();
      const inputs = {};
      for (const [name, text] of edits) {
        const input = inputs[name] || (inputs[name] = document.querySelector(`[data-testid="input-${name}"]`));
        if (!input) throw new Error(`no input for ${name}`);
        input.value = text;
        input.dispatchEvent(new Event('input', {bubbles: true}));
        input.dispatchEvent(new Event('change', {bubbles: true}));
        if (typed) await null;
      }
      await nextFrame();
      times[typed ? 'typed' : 'burst'].push(performance.now() - batchStarted);
    }
  } catch (error) {
    done({error: String(error)});
    return;
  } finally {
    // A port with a listener lives as long as the page, and with it this script and its edits.
    channel.port1.onmessage = null;
    channel.port1.close();
  }
  const summary = {};
  for (const [kind, list] of Object.entries(times)) {
    list.sort((a, b) => a - b);
    summary[kind] = {batches: list.length, ms: list.reduce((a, b) => a + b, 0),
                     median_ms: list[list.length >> 1] || 0, longest_ms: list[list.length - 1] || 0};
  }
  done(summary);
})();
"""


class Form:
    """The form as the soak has set it, and the last valid input the page has planned: the plan
    the page must show. The page plans after each typed edit and at the end of each batch."""

    def __init__(self, demo: dict) -> None:
        self.entries = {}  # field name: (text, value), value None when refused
        for field in FIELDS:
            node = demo
            for part in field.path:
                node = node[part]
            self.entries[field.name] = (str(node), node)
        self.planned = dict(self.entries)

    def copy(self) -> "Form":
        copied = Form.__new__(Form)
        copied.entries, copied.planned = dict(self.entries), dict(self.planned)
        return copied

    def refused(self) -> set:
        return {name for name, (_, value) in self.entries.items() if value is None}

    def edit(self, field: Field, text: str, value: object) -> None:
        self.entries[field.name] = (text, value)

    def plan_point(self) -> None:
        if not self.refused():
            self.planned = dict(self.entries)

    def planned_values(self) -> dict:
        return {name: value for name, (_, value) in self.planned.items()}


def random_edit(rng: random.Random) -> tuple:
    field = rng.choice(FIELDS)
    if rng.random() < INVALID_SHARE:
        return field, rng.choice(field.refused), None
    value, text = field.valid(rng)
    return field, text, value


def segment_edits(rng: random.Random, count: int, stale: bool, back_to: Form) -> list:
    """`count` random edits ending as a checkpoint asks: on a refused value (`stale`), with every
    field valid, or (`back_to`) on the very texts of an earlier form, having given the page its
    planned input to plan first."""
    edits = [random_edit(rng) for _ in range(count)]
    if back_to is not None:
        # The planned input ends a batch, so the page plans it; the last batch refuses a field
        # first, then gives the fields that differ their texts of then, the refused ones last.
        by_name = {field.name: field for field in FIELDS}
        planned = [(by_name[name], text, value) for name, (text, value) in back_to.planned.items()]
        refused = sorted(back_to.refused())
        later = [(by_name[name],) + entry for name, entry in back_to.entries.items() if entry != back_to.planned[name]]
        later.sort(key=lambda edit: edit[2] is None)  # the refused texts last
        first = by_name[rng.choice(refused)]
        filler = [(first, rng.choice(first.refused), None)] * (BATCH - len(later))
        edits[-(BATCH + len(planned)):] = rng.sample(planned, len(planned)) + filler + later
    elif stale:
        field = rng.choice(FIELDS)
        edits[-1] = (field, rng.choice(field.refused), None)
    else:
        for index, field in enumerate(rng.sample(FIELDS, len(FIELDS))):
            value, text = field.valid(rng)
            edits[count - len(FIELDS) + index] = (field, text, value)
    return edits


def edit_plan(rng: random.Random, form: Form) -> list:
    """Segment by segment up to each checkpoint: its edit count, its batches as (typed, edits),
    and the form it leaves. The last segment comes back to the form the warm-up left, so that the
    memory is compared between two pages in the same state."""
    segments, done, batch_count, warm = [], 0, 0, None
    for until, stale in CHECKPOINTS:
        edits = segment_edits(rng, until - done, stale, warm if until == EDITS else None)
        batches = []
        for at in range(0, len(edits), BATCH):
            typed = batch_count % TYPED_EVERY == TYPED_EVERY - 1
            batch_count += 1
            for field, text, value in edits[at:at + BATCH]:
                form.edit(field, text, value)
                if typed:
                    form.plan_point()
            form.plan_point()
            batches.append((typed, edits[at:at + BATCH]))
        if bool(form.refused()) != stale:
            raise Check(f"the soak's own edit plan does not end as asked at {until}")
        snapshot = form.copy()
        if warm is None:
            warm = snapshot
        elif until == EDITS and (snapshot.entries, snapshot.planned) != (warm.entries, warm.planned):
            raise Check("the soak's own edit plan does not come back to the warm-up's form")
        segments.append((until, batches, snapshot))
        done = until
    return segments


def with_values(demo: dict, values: dict) -> dict:
    scenario = json.loads(json.dumps(demo))
    for field in FIELDS:
        node = scenario
        for part in field.path[:-1]:
            node = node[part]
        node[field.path[-1]] = values[field.name]
    return scenario


def cdp(driver: Driver, cmd: str, params: dict = None) -> dict:
    return driver.call("POST", f"{driver.session}/goog/cdp/execute", {"cmd": cmd, "params": params or {}})


def memory(driver: Driver) -> dict:
    """The page's memory after a forced GC: JS heap, wasm linear memory, DOM nodes, listeners."""
    cdp(driver, "HeapProfiler.collectGarbage")
    heap = cdp(driver, "Runtime.getHeapUsage")
    metrics = {m["name"]: m["value"] for m in cdp(driver, "Performance.getMetrics")["metrics"]}
    # The glue keeps its WebAssembly.Memory out of reach of page scripts; DevTools can list every
    # object with that prototype. The page has exactly one.
    group = {"objectGroup": "soak"}
    try:
        prototype = cdp(driver, "Runtime.evaluate", {"expression": "WebAssembly.Memory.prototype", **group})
        found = cdp(driver, "Runtime.queryObjects", {"prototypeObjectId": prototype["result"]["objectId"], **group})
        sizes = cdp(driver, "Runtime.callFunctionOn", {
            "objectId": found["objects"]["objectId"],
            "functionDeclaration": "function () { return this.map((m) => m.buffer.byteLength); }",
            "returnByValue": True,
        })["result"]["value"]
    finally:
        cdp(driver, "Runtime.releaseObjectGroup", group)
    if len(sizes) != 1:
        raise Check(f"expected one WebAssembly.Memory in the page, found {len(sizes)}")
    attached = driver.script(
        "const walker = document.createTreeWalker(document, NodeFilter.SHOW_ALL); let n = 1;"
        " while (walker.nextNode()) n++; return n"
    )
    return {"heap": heap["usedSize"], "wasm": sizes[0], "nodes": int(metrics["Nodes"]),
            "attached": attached, "listeners": int(metrics["JSEventListeners"])}


def mib(size: float) -> str:
    return f"{size / (1 << 20):.2f} MiB"


# What the checks read, in one script and by value: a WebDriver element reference would keep
# its element, and the whole detached tree around it, alive once the page redraws it.
SHOWN_SCRIPT = """
const q = (id) => document.querySelector(`[data-testid="${id}"]`);
const figures = {};
for (const e of document.querySelectorAll('[data-testid^="result-"][data-value]')) {
  figures[e.dataset.testid] = e.dataset.value;
}
return {stale: !!q('stale-notice'), status: q('plan-status').textContent, figures: figures,
        errors: Object.fromEntries(arguments[0].map((f) => [f, q(`error-${f}`).textContent.trim()]))};
"""


class Shown:
    """The figures on screen, read once; `value` as interact.py's Driver.value, for check_headline."""

    def __init__(self, driver: Driver) -> None:
        shown = driver.script(SHOWN_SCRIPT, [field.name for field in FIELDS])
        self.stale, self.status = shown["stale"], shown["status"]
        self.errors, self.figures = shown["errors"], shown["figures"]

    def value(self, testid: str) -> float:
        if testid not in self.figures:
            raise Check(f"the page shows no {testid}")
        return float(self.figures[testid])


def check_keeping_up(driver: Driver, cli: Cli, demo: dict, values: dict, refused: set, where: str) -> dict:
    """Right after the last edit's frame, no waiting: the page shows the plan of the last valid
    input, and says whether the last input was refused."""
    plan = cli.on_text("plan", json.dumps(with_values(demo, values)))
    stale = bool(refused)
    try:
        shown = Shown(driver)
        if shown.stale != stale or ("Out of date" in shown.status) != stale:
            raise Check(f"{where}: the last input was {'refused' if stale else 'valid'}, but the page shows"
                        f" stale notice {shown.stale}, status {shown.status!r}")
        if any(bool(message) != (name in refused) for name, message in shown.errors.items()):
            raise Check(f"{where}: refused {sorted(refused)}, but the messages read {shown.errors}")
        check_headline(shown, plan, where)
        if not stale:
            on_page = json.loads(page_scenario(driver))
            if with_values(on_page, values) != on_page:
                raise Check(f"{where}: the page's scenario file is not the last input ({values})")
    except Check as problem:
        # Behind, or wrong? Give the page time, and say which.
        time.sleep(5)
        try:
            check_headline(Shown(driver), plan, where)
            late = "the page caught up within 5 s, so it fell behind"
        except Check:
            late = "still wrong 5 s later"
        raise Check(f"{problem} ({late})") from None
    return plan


def run(driver: Driver, base_url: str, cli: Cli) -> None:
    started = time.monotonic()
    driver.call("POST", f"{driver.session}/timeouts", {"script": 300_000})
    driver.viewport(1366, 768)
    driver.open(base_url.rstrip("/") + f"/?demo={DEMO}")
    driver.wait("the plan", lambda: driver.script(
        'return !!document.querySelector(\'[data-testid="result-generator_count"]\')'))
    cdp(driver, "Performance.enable")
    with open(os.path.join(REPO, "demo-loads", f"{DEMO}.json"), encoding="utf-8") as file:
        demo = json.load(file)
    print(f"soak: opened ?demo={DEMO}: {memory_line(memory(driver))}")

    measured = {}
    totals = {kind: {"batches": 0, "ms": 0.0, "longest_ms": 0.0} for kind in ("typed", "burst")}
    done = 0
    for until, batches, form in edit_plan(random.Random(SEED), Form(demo)):
        sent = [[typed, [[field.name, text] for field, text, _ in edits]] for typed, edits in batches]
        result = driver.call("POST", f"{driver.session}/execute/async", {"script": EDIT_SCRIPT, "args": [sent]})
        if "error" in result:
            raise Check(f"editing up to {until}: {result['error']}")
        for kind, total in totals.items():
            total["batches"] += result[kind]["batches"]
            total["ms"] += result[kind]["ms"]
            total["longest_ms"] = max(total["longest_ms"], result[kind]["longest_ms"])
        segment_ms = result["typed"]["ms"] + result["burst"]["ms"]
        where = f"after {until} edits"
        plan = check_keeping_up(driver, cli, demo, form.planned_values(), form.refused(), where)
        measured[until] = memory(driver)
        refused = form.refused()
        print(f"soak: {where}: {(until - done) / segment_ms * 1000:.0f} edits/s;"
              f" {'stale, refused: ' + ', '.join(sorted(refused)) if refused else 'current'},"
              f" {plan['generator_count']} x {plan['generator_rating_kw']} kW as the CLI;"
              f" {memory_line(measured[until])}")
        done = until

    edit_ms = sum(total["ms"] for total in totals.values())
    rates = ", ".join(
        f"{kind} batches {total['batches'] * BATCH / total['ms'] * 1000:.0f} edits/s"
        f" (longest batch to its frame {total['longest_ms']:.0f} ms)"
        for kind, total in totals.items()
    )
    print(f"soak: {done} edits in {edit_ms / 1000:.1f} s, {done / edit_ms * 1000:.0f} edits/s; {rates}")

    warm, last = measured[CHECKPOINTS[0][0]], measured[EDITS]
    if last["attached"] != warm["attached"]:
        # The same texts in every field must give the same page; else the comparison means little.
        raise Check(f"the page holds {last['attached']} nodes after {EDITS} edits and {warm['attached']}"
                    " after the warm-up, for the same form")
    heap_limit = HEAP_FACTOR * warm["heap"] + HEAP_ALLOWANCE_BYTES
    limits = [
        ("JS heap", "heap", heap_limit, mib),
        ("wasm memory", "wasm", warm["wasm"] + WASM_ALLOWANCE_BYTES, mib),
        ("DOM nodes", "nodes", warm["nodes"] + NODE_ALLOWANCE, str),
        ("event listeners", "listeners", warm["listeners"] + LISTENER_ALLOWANCE, str),
    ]
    for name, key, limit, shown in limits:
        if last[key] > limit:
            raise Check(f"the page's {name} grew from {shown(warm[key])} after the warm-up to {shown(last[key])}"
                        f" after {EDITS} edits (limit {shown(limit)})")
    print("soak: memory holds after the warm-up: " + ", ".join(
        f"{name} {shown(warm[key])} -> {shown(last[key])} (limit {shown(limit)})"
        for name, key, limit, shown in limits))
    errors = driver.console_errors()
    if errors:
        raise Check("console errors:\n  " + "\n  ".join(errors))
    print(f"soak: no console errors; {time.monotonic() - started:.0f} s in the page")


def memory_line(measured: dict) -> str:
    return (f"JS heap {mib(measured['heap'])}, wasm memory {mib(measured['wasm'])}, {measured['nodes']} DOM nodes"
            f" ({measured['attached']} in the document), {measured['listeners']} event listeners")


def main() -> int:
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    sys.stdout.reconfigure(line_buffering=True)
    base_url = sys.argv[1]
    started = time.monotonic()
    try:
        cli = Cli(os.environ.get("DOUBLEPRIME_CLI") or os.path.join(REPO, "target", "debug", "doubleprime"))
        with browser_session() as driver:
            run(driver, base_url, cli)
    except Check as problem:
        print(f"soak: FAILED: {problem}", file=sys.stderr)
        return 1
    print(f"soak: all checks passed in {time.monotonic() - started:.0f} s")
    return 0


if __name__ == "__main__":
    sys.exit(main())
