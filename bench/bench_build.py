"""Benchmark of whole builds on a synthetic catalogue; every figure is measured in one run.

Usage: python bench/bench_build.py [--events 200] [--memory-events 1000] [--workdir DIR]

Prints: full build time per event (1 worker), speed-up of 2 workers over 1, a no-op rebuild
and a one-edited-event rebuild as fractions of the full build, the share of the full build
spent drawing figures, and peak memory (main process and largest worker) at both sizes.
Targets (issue): speed-up >= 1.7, no-op <= 3 %, one edit <= 5 %, time outside figures
<= 15 %, peak memory <= 400 MB at 1000 events.
"""

from __future__ import annotations

import argparse
import json
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))
from synthetic import event_text, write_catalogue

RUNNER = """
import json, resource, sys, time
from factsheet.build import build
start = time.perf_counter()
r = build(sys.argv[1], sys.argv[2], jobs=int(sys.argv[3]))
print(json.dumps({"seconds": time.perf_counter() - start, "built": r.built, "reused": r.reused,
                  "figure_seconds": r.figure_seconds,
                  "rss_main_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
                  "rss_worker_mb": resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024}))
"""


def run(catalogue: Path, out: Path, jobs: int) -> dict:
    """One build in a fresh process (imports included, as a user sees it)."""
    done = subprocess.run(
        [sys.executable, "-c", RUNNER, str(catalogue), str(out), str(jobs)],
        capture_output=True,
        text=True,
        check=True,
    )
    return json.loads(done.stdout.strip().splitlines()[-1])


def clean(out: Path) -> None:
    shutil.rmtree(out, ignore_errors=True)
    shutil.rmtree(out.parent / f".factsheet-cache-{out.name}", ignore_errors=True)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--events", type=int, default=200)
    parser.add_argument("--memory-events", type=int, default=1000)
    parser.add_argument("--workdir", type=Path, default=None)
    args = parser.parse_args()
    work = args.workdir or Path(tempfile.mkdtemp(prefix="factsheet-bench-"))
    cat, out = write_catalogue(work / "catalogue", args.events), work / "site"

    clean(out)
    full = run(cat, out, 1)
    noop = run(cat, out, 1)
    edited = cat / "syn-00007.yaml"
    edited.write_text(event_text(7, __import__("numpy").random.default_rng(99)))
    edit = run(cat, out, 1)
    clean(out)
    two = run(cat, out, 2)
    n = args.events
    print(f"events: {n}")
    print(
        f"full build, 1 worker: {full['seconds']:.1f} s = {full['seconds'] / n * 1000:.0f} ms "
        "per event"
    )
    print(
        f"full build, 2 workers: {two['seconds']:.1f} s; "
        f"speed-up x{full['seconds'] / two['seconds']:.2f} (target >= 1.7)"
    )
    print(
        f"no-op rebuild: {noop['seconds']:.2f} s = {noop['seconds'] / full['seconds']:.1%} of the "
        f"full build (target <= 3 %; reused {noop['reused']})"
    )
    print(
        f"one edited event: {edit['seconds']:.2f} s = {edit['seconds'] / full['seconds']:.1%} of "
        f"the full build (target <= 5 %; reused {edit['reused']})"
    )
    share = full["figure_seconds"] / full["seconds"]
    print(
        f"drawing figures: {share:.0%} of the full build; outside figures {1 - share:.0%} "
        "(target <= 15 %)"
    )
    print(
        f"peak memory at {n}: main {full['rss_main_mb']:.0f} MB; with 2 workers: main "
        f"{two['rss_main_mb']:.0f} MB, largest worker {two['rss_worker_mb']:.0f} MB"
    )
    if args.memory_events:
        big, big_out = write_catalogue(work / "big", args.memory_events), work / "big-site"
        clean(big_out)
        mem = run(big, big_out, 2)
        print(
            f"peak memory at {args.memory_events} (2 workers): main {mem['rss_main_mb']:.0f} MB, "
            f"largest worker {mem['rss_worker_mb']:.0f} MB (target <= 400 MB); "
            f"{mem['seconds']:.0f} s"
        )
    if args.workdir is None:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
