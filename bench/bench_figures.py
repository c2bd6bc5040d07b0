"""What one of our figures costs against a floor, and how many bytes each kind takes, in one run.

Usage: python bench/bench_figures.py [--events 40] [--rounds 2] [--workdir DIR]

(a) The floor: a comparable line plot (5 × 3.4 in, one axes on a log y axis, three lines of 200
points, fixed tick locations with fixed labels, two axis names, a legend) drawn on one Figure
that is reused — the lines' data are replaced, nothing is re-created — and written to SVG with
text as text (``svg.fonttype: none``), as our figures are.

(b) Ours: every figure a synthetic event gets, made by :func:`factsheet.render.figures.
event_figures` (what :func:`factsheet.render.assets.event_files` calls in a build worker) for
``--events`` events of a synthetic catalogue (bench/synthetic.py) that were loaded and derived
as a build does; each figure is timed from its numbers to its bytes (draw and write).

Prints the mean milliseconds per figure of each kind, the mean over all of ours, the floor and
their ratio (target: ours ≤ 2 × the floor), and the mean bytes per figure kind (the sharing
image is a PNG, the others SVG). One warm-up event and one warm-up floor figure are drawn first
(font loading, first imports), as a build worker has done after its first event. ``--rounds``
draws everything that many times and keeps each figure's fastest time, and every time is the
CPU time of this process (``time.process_time``, also for the times ``event_figures`` records):
on a shared machine, other processes' load then counts far less than in wall-clock time.

The SVGs name the font ``'DejaVu Sans', sans-serif`` (the font matplotlib measured the text
with, then the generic family for a viewer without it); see factsheet/figures/style.py.
"""

from __future__ import annotations

import argparse
import io
import shutil
import statistics
import sys
import tempfile
import time
from collections import defaultdict
from pathlib import Path
from types import SimpleNamespace

import numpy as np

sys.path.insert(0, str(Path(__file__).parent))
from synthetic import write_catalogue


class Floor:
    """The comparable line plot, made once; :meth:`draw` replaces its lines' data and writes
    SVG bytes."""

    def __init__(self) -> None:
        import matplotlib
        from matplotlib.figure import Figure
        from matplotlib.ticker import FixedLocator, NullLocator

        self.rc = {"svg.fonttype": "none", "svg.hashsalt": "floor", "font.size": 11.5}
        with matplotlib.rc_context(self.rc):
            fig = Figure(figsize=(5.0, 3.4))
            fig.subplots_adjust(left=0.16, right=0.97, bottom=0.16, top=0.97)
            ax = fig.add_subplot()
            ax.set_yscale("log")
            ax.set_xlim(0, 10)
            ax.set_ylim(10, 1000)
            ax.xaxis.set_major_locator(FixedLocator([0, 2, 4, 6, 8, 10]))
            ax.set_xticklabels(["0", "2", "4", "6", "8", "10"])
            ax.yaxis.set_major_locator(FixedLocator([10, 20, 50, 100, 200, 500, 1000]))
            ax.set_yticklabels(["10", "20", "50", "100", "200", "500", "1000"])
            ax.yaxis.set_minor_locator(NullLocator())
            ax.set_xlabel("Time before merger (s)")
            ax.set_ylabel("Frequency (Hz)")
            self.x = np.linspace(0, 10, 200)
            self.lines = [ax.plot(self.x, self.x, label=f"line {k}")[0] for k in range(3)]
            ax.legend(loc="upper left")
            ax.grid(True)
        self.fig = fig

    def draw(self, seed: int) -> bytes:
        import matplotlib

        rng = np.random.default_rng(seed)
        for k, line in enumerate(self.lines):
            line.set_ydata(20 * (k + 1) * np.exp(self.x * rng.uniform(0.1, 0.3)))
        buffer = io.BytesIO()
        with matplotlib.rc_context(self.rc):
            self.fig.savefig(buffer, format="svg", metadata={"Date": None})
        return buffer.getvalue()


def derived_events(folder: Path, n: int) -> list:
    """``n`` synthetic events, loaded and derived as a build does."""
    from factsheet.derive import derive_event
    from factsheet.load import load_catalogue
    from factsheet.load.reference import reference_for

    write_catalogue(folder, n)
    catalogue = load_catalogue(folder)
    reference = reference_for(catalogue.settings)
    return [derive_event(e, catalogue.settings, reference) for e in catalogue.events]


def kind_of(path: str, event_id: str) -> str:
    """``masses.svg`` of ``events/SYN-00001-masses.svg``."""
    return path.rsplit("/", 1)[-1].removeprefix(event_id + "-")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--events", type=int, default=40)
    parser.add_argument("--rounds", type=int, default=2)
    parser.add_argument("--workdir", type=Path, default=None)
    args = parser.parse_args()
    work = args.workdir or Path(tempfile.mkdtemp(prefix="factsheet-bench-figures-"))

    from factsheet.i18n import SOURCE, use_language
    from factsheet.render import figures

    items = derived_events(work / "catalogue", args.events + 1)
    figures.time = SimpleNamespace(perf_counter=time.process_time)  # CPU time: see the docstring
    floor = Floor()
    floor.draw(0)  # warm-up
    with use_language(SOURCE):
        figures.event_figures(items[0])
    items = items[1:]

    ours: dict[tuple[int, str], float] = {}
    sizes: dict[str, list[int]] = defaultdict(list)
    floor_ms: list[float] = []
    for r in range(args.rounds):
        for n, item in enumerate(items):
            start = time.process_time()
            floor.draw(n)  # one floor figure per event, interleaved: same machine state
            floor_ms.append(1e3 * (time.process_time() - start))
            with use_language(SOURCE):
                drawn = figures.event_figures(item)
            for fig in drawn:
                kind = kind_of(fig.path, item.event.id)
                key = (n, kind)
                ours[key] = min(ours.get(key, float("inf")), 1e3 * fig.seconds)
                if r == 0:
                    sizes[kind].append(len(fig.svg))
    floor_best = sorted(floor_ms)[: len(items)]  # the fastest of the floor's draws, as for ours
    by_kind: dict[str, list[float]] = defaultdict(list)
    for (_n, kind), ms in ours.items():
        by_kind[kind].append(ms)

    print(f"events: {len(items)}, rounds: {args.rounds} (fastest kept)")
    print(f"{'figure':<18}{'count':>6}{'mean ms':>10}{'mean bytes':>12}")
    for kind in sorted(by_kind):
        times = by_kind[kind]
        print(
            f"{kind:<18}{len(times):>6}{statistics.mean(times):>10.1f}"
            f"{statistics.mean(sizes[kind]):>12.0f}"
        )
    svg_times = [ms for kind, times in by_kind.items() if kind.endswith(".svg") for ms in times]
    all_times = [ms for times in by_kind.values() for ms in times]
    floor_mean = statistics.mean(floor_best)
    print(f"floor (reused line plot, SVG): {floor_mean:.1f} ms, {len(floor.draw(0))} bytes")
    print(
        f"ours, mean of every figure: {statistics.mean(all_times):.1f} ms = "
        f"x{statistics.mean(all_times) / floor_mean:.2f} the floor (target <= 2)"
    )
    print(
        f"ours, mean of the SVG figures: {statistics.mean(svg_times):.1f} ms = "
        f"x{statistics.mean(svg_times) / floor_mean:.2f} the floor"
    )
    per_event = sum(sum(s) for s in sizes.values()) / len(items)
    print(f"figure bytes per event: {per_event / 1e3:.1f} kB (share PNG included)")
    if args.workdir is None:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
