"""How the index page behaves with a large catalogue, in headless Chromium, from one run.

Usage: python bench/bench_index.py [--rows 10000 1600] [--loads 3] [--repeats 5] [--workdir DIR]

For each size, synthetic rows (invented designations and values, made as the render code's
``IndexRow`` records, not by building that many events, which would take an hour) go through
the same code as a build: ``render.site.index_files`` writes ``index.html`` (the first page of
rows in its HTML) and ``index-rows.js`` (every row as data), next to a copy of ``static/``.
The page is opened from ``file://`` in Debian's chromium driven by Playwright, and the script
prints, each against its target (first paint < 1.5 s, sort and filter < 200 ms):

- first paint: the ``first-contentful-paint`` entry of the Paint Timing API, the median of
  ``--loads`` loads, each in a fresh browser context (no cache); beside it, when the table's
  script has run (``domContentLoadedEventEnd`` of the navigation entry: deferred scripts run
  before it) and the bytes of the page and of its rows file;
- sort: from a click on a column's sort button until a task after the next frame (a
  ``requestAnimationFrame`` callback, then a ``setTimeout`` task: the new page of rows has been
  styled, laid out and painted), by a numeric column (heavier mass) and by designation; each
  click toggles the order;
- filter: the same, from an ``input``/``change`` event on a control until a task after the
  next frame: a designation fragment in the filter box, a status, and clearing the box;
- page: the pager's "next" button, for comparison (drawing a page of rows, no sorting).

Each interaction is repeated ``--repeats`` times in one loaded page, after the page has gone
idle once (as it has by the time a reader acts; the script prepares the filter's texts and the
designations' order then); the median is printed against the target, with the range. At the
largest size it also measures the first paint of the other way to give the page its rows — the
same JSON embedded in the page as ``<script type="application/json">`` (read by a small script
of the benchmark's own) — so that the choice of a separate ``index-rows.js`` is measured, not
assumed. Times are milliseconds on a shared machine (the load average is printed first):
compare them within a run.
"""

from __future__ import annotations

import argparse
import json
import os
import shutil
import statistics
import sys
import tempfile
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from factsheet.i18n import use_language
from factsheet.model import Settings
from factsheet.notation import format_interval, format_value
from factsheet.render.environment import make_environment
from factsheet.render.index_page import Cell, IndexCount, IndexPage, IndexRow
from factsheet.render.site import Renderer, index_files
from factsheet.resources import templates_dir

CHROMIUM = "/usr/bin/chromium"
ARGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
]
TARGETS = {"first paint": 1500.0, "sort": 200.0, "filter": 200.0}  # ms, from the issue

FRAME = "() => new Promise(done => requestAnimationFrame(() => setTimeout(done, 0)))"
CLICK = f"""async selector => {{
  const button = document.querySelector(selector);
  const start = performance.now();
  button.click();
  await ({FRAME})();
  return performance.now() - start;
}}"""
TYPE = f"""async ([selector, value, kind]) => {{
  const control = document.querySelector(selector);
  const start = performance.now();
  control.value = value;
  control.dispatchEvent(new Event(kind, {{bubbles: true}}));
  await ({FRAME})();
  return performance.now() - start;
}}"""
PAINT = """() => new Promise(done => {
  const found = () => performance.getEntriesByName('first-contentful-paint')[0];
  const finish = () => {
    const nav = performance.getEntriesByType('navigation')[0];
    done([found() ? found().startTime : -1, nav.domContentLoadedEventEnd]);
  };
  if (found()) { finish(); } else {
    new PerformanceObserver(finish).observe({type: 'paint', buffered: true});
  }
})"""


def cell(median: float, spread: float, unit: str) -> Cell:
    """A number as the table prints one: median, bounds rounded by the uncertainty, unit."""
    return Cell(f"{format_interval(median, median - spread, median + 1.2 * spread)} {unit}", median)


def synthetic_rows(n: int, seed: int = 17) -> tuple[IndexRow, ...]:
    """``n`` invented rows of every class and status, some without a remnant or a sky area."""
    rng = np.random.default_rng(seed)
    rows = []
    for i in range(n):
        kind = ("BBH", "BBH", "BBH", "NSBH", "BNS")[i % 5]
        holes = kind == "BBH"
        heavy = float(rng.uniform(8, 90) if holes else rng.uniform(1.3, 12))
        light = heavy * float(rng.uniform(0.2, 1.0)) if holes else float(rng.uniform(1.1, 1.8))
        area = float(rng.integers(20, 3000))
        status = "candidate" if i % 17 == 5 else "retracted" if i % 53 == 7 else "confirmed"
        rows.append(
            IndexRow(
                id=f"SYN-{i:05d}",
                title=f"Invented event number {i}",
                page=f"events/SYN-{i:05d}.html",
                date=f"2035-{1 + i % 12:02d}-{1 + i % 28:02d}",
                status=status,
                source_class=kind,
                visibility="public",
                embargo_until="",
                band_flags=() if holes else ("neutron star",),
                heavier_mass=cell(heavy, 0.12 * heavy, "M⊙"),
                lighter_mass=cell(light, 0.15 * light, "M⊙"),
                remnant_mass=cell(0.95 * (heavy + light), 3, "M⊙") if holes else None,
                energy_radiated=cell(float(rng.uniform(1, 9)) * 1e47, 1e47, "J") if holes else None,
                distance=cell(float(rng.uniform(40, 6000)), 300, "Mpc"),
                sky=Cell(f"{format_value(area, '', 2)} deg²", area) if i % 9 else None,
            )
        )
    return tuple(rows)


def write_site(folder: Path, n: int) -> dict[str, int]:
    """The index page of ``n`` synthetic rows, its rows file and the static files, in
    ``folder``; returns the bytes of the two files."""
    settings = Settings(title="Invented benchmark catalogue")
    rows = synthetic_rows(n)
    with use_language("en"):
        renderer = Renderer(make_environment(), settings, "public", "", "en")
        files = index_files(renderer, IndexPage(rows, "", (), IndexCount(n, 0, 0)))
    folder.mkdir(parents=True, exist_ok=True)
    for name, content in files.items():
        (folder / name).write_bytes(content)
    shutil.copytree(templates_dir() / "static", folder / "static", dirs_exist_ok=True)
    return {name: len(content) for name, content in files.items()}


def embed(folder: Path) -> Path:
    """A copy of the page with its rows embedded as JSON instead of loaded from index-rows.js."""
    page = (folder / "index.html").read_text(encoding="utf-8")
    script = (folder / "index-rows.js").read_text(encoding="utf-8")
    data = script.split(" = ", 1)[1].rstrip().rstrip(";")
    json.loads(data)  # the rows file is one JSON value
    (folder / "embedded-rows.js").write_text(
        "window.factsheetIndexRows = "
        "JSON.parse(document.getElementById('catalogue-rows').textContent);\n",
        encoding="utf-8",
    )
    tag = '<script src="index-rows.js" defer></script>'
    assert tag in page
    inline = data.replace("</", "<\\/")
    page = page.replace(
        tag,
        f'<script type="application/json" id="catalogue-rows">{inline}</script>\n'
        '<script src="embedded-rows.js" defer></script>',
    )
    target = folder / "embedded.html"
    target.write_text(page, encoding="utf-8")
    return target


def first_paint(browser, url: str, loads: int) -> tuple[float, float]:
    paints, ready = [], []
    for _ in range(loads):
        context = browser.new_context(viewport={"width": 1280, "height": 900})
        page = context.new_page()
        page.goto(url, wait_until="load")
        fcp, dcl = page.evaluate(PAINT)
        paints.append(fcp)
        ready.append(dcl)
        context.close()
    return statistics.median(paints), statistics.median(ready)


def verdict(name: str, ms: float) -> str:
    target = TARGETS.get(name, TARGETS["sort"])
    return f"{ms:7.1f} ms  (target < {target:.0f} ms: {'ok' if ms < target else 'OVER'})"


IDLE = "() => new Promise(done => requestIdleCallback(() => done(), {timeout: 5000}))"
HEAD = "#catalogue thead th[data-key={}] button"
# (kind, what, the action repeated: a selector to click, or [control, values, event])
CASES = (
    ("sort", "by heavier mass (numeric)", HEAD.format("heavier_mass")),
    ("sort", "by designation", HEAD.format("id")),
    (
        "filter",
        "text (a designation's start)",
        ["#catalogue-filter", ["syn-01", "syn-02"], "input"],
    ),
    ("filter", "status", ["#catalogue-status", ["candidate", "retracted"], "change"]),
    ("filter", "cleared", ["#catalogue-filter", ["", "syn-0"], "input"]),
)


def interactions(browser, url: str, repeats: int) -> list[tuple[str, str, list[float]]]:
    """Each case ``repeats`` times in one loaded page (a sort button toggles the order; a
    filter alternates between two values), after the page has gone idle once, as it has by the
    time a reader acts on it."""
    context = browser.new_context(viewport={"width": 1280, "height": 900})
    page = context.new_page()
    errors: list[str] = []
    page.on("pageerror", lambda e: errors.append(str(e)))
    page.goto(url, wait_until="load")
    page.wait_for_selector(".table-controls")
    page.evaluate(IDLE)
    found = []
    for kind, what, action in CASES:
        times = []
        for k in range(repeats):
            if isinstance(action, str):
                times.append(page.evaluate(CLICK, action))
            else:
                control, values, event = action
                times.append(page.evaluate(TYPE, [control, values[k % 2], event]))
        if kind == "filter":  # the next case starts from the whole table
            page.evaluate(TYPE, [action[0], "", action[2]])
        found.append((kind, what, times))
    times = [page.evaluate(CLICK, ".table-pager-top .page-next") for _ in range(repeats)]
    found.append(("page", "next page", times))
    shown = page.evaluate("document.querySelectorAll('#catalogue tbody tr').length")
    context.close()
    if errors:
        raise SystemExit(f"page errors: {errors}")
    if shown > 100:
        raise SystemExit(f"the table holds {shown} rows, more than a page")
    return found


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rows", type=int, nargs="+", default=[10000, 1600])
    parser.add_argument("--loads", type=int, default=3)
    parser.add_argument("--repeats", type=int, default=5)
    parser.add_argument("--workdir", type=Path, default=None)
    args = parser.parse_args()
    from playwright.sync_api import sync_playwright

    work = args.workdir or Path(tempfile.mkdtemp(prefix="factsheet-bench-index-"))
    load = ", ".join(f"{x:.1f}" for x in os.getloadavg())
    print(f"load average at the start: {load} on {os.cpu_count()} cores (times scale with it)")
    with sync_playwright() as p:
        browser = p.chromium.launch(executable_path=CHROMIUM, args=ARGS)
        for n in args.rows:
            folder = work / f"rows-{n}"
            sizes = write_site(folder, n)
            url = (folder / "index.html").as_uri()
            fcp, ready = first_paint(browser, url, args.loads)
            print(
                f"{n} rows: index.html {sizes['index.html'] / 1e3:.0f} kB, "
                f"index-rows.js {sizes['index-rows.js'] / 1e6:.2f} MB"
            )
            print(
                f"  first paint              {verdict('first paint', fcp)}; "
                f"table script done at {ready:.0f} ms"
            )
            for kind, what, times in interactions(browser, url, args.repeats):
                print(
                    f"  {kind:6} {what:29} {verdict(kind, statistics.median(times))}"
                    f"  [{min(times):.0f}–{max(times):.0f}]"
                )
            if n == max(args.rows):
                embedded, ready_embedded = first_paint(browser, embed(folder).as_uri(), args.loads)
                print(
                    f"  rows embedded in the page as JSON instead: first paint {embedded:.1f} ms, "
                    f"script done at {ready_embedded:.0f} ms "
                    f"(index-rows.js: {fcp:.1f} ms, {ready:.0f} ms)"
                )
        browser.close()
    if args.workdir is None:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
