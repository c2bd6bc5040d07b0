"""Every target of a large catalogue, measured from one run on synthetic catalogues.

Usage: python bench/bench_scale.py [--sizes 200 1600] [--speedup-events 200]
                                   [--memory-events 10000] [--skip-index]
                                   [--skip-figures] [--workdir DIR]

For each size N (synthetic events of every class, bench/synthetic.py; files dated an hour back,
as a catalogue edited earlier is), each build in a fresh process with the default number of
workers (the cores the process may run on), imports included, as a user runs it:

- full build from nothing: seconds, ms per event, peak memory of the main process and of the
  largest worker;
- no-op rebuild (target: within 1.5 % of the full build);
- one event's estimate edited (target: within 4 %), and one event's summary edited (no figure
  and no sound drawn: the report must say every event was reused);
- published bytes per event (target: at most 150 KB), by kind of file, and the cache's bytes
  (JSON only: no file is kept twice);
- two full builds byte-identical, and the site of ``--jobs 1`` equal to the default's.

Then: the speed-up of a full build of ``--speedup-events`` events with 2 workers and with all
cores over 1 (target: at least 1.7 with 2), the main process's memory per event between the two
sizes and what that extrapolates to at 10 000 events, and the main process's peak measured in a
full build of ``--memory-events`` events whose workers draw no figure and make no sound (target:
under 400 MB at 10 000; a full 10 000-event build with figures takes over half an hour here, and
what the main process holds does not depend on them), and the figure cost against its floor
(``bench/bench_figures.py``) and the 10 000-row index (``bench/bench_index.py``), each run as
its own script and its summary lines repeated.
"""

from __future__ import annotations

import argparse
import hashlib
import json
import os
import shutil
import subprocess
import sys
import tempfile
import time
from collections import defaultdict
from pathlib import Path

import numpy as np

HERE = Path(__file__).parent
sys.path.insert(0, str(HERE))
from synthetic import event_text, write_catalogue  # noqa: E402

RUNNER = """
import json, resource, sys, time
start = time.perf_counter()
from factsheet.build import build
jobs = int(sys.argv[3]) or None
r = build(sys.argv[1], sys.argv[2], jobs=jobs)
print(json.dumps({"seconds": time.perf_counter() - start, "built": r.built, "reused": r.reused,
                  "figure_seconds": r.figure_seconds,
                  "rss_main_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
                  "rss_worker_mb": resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024}))
"""


#: A build whose workers derive and render but draw no figure and make no sound: what the main
#: process holds does not depend on them (they pass through it to disk one event at a time),
#: so this measures its memory at a size whose full build would take hours here.
UNDRAWN = """
import factsheet.build
from factsheet.model import Audio

def undrawn(item, languages):
    sound = f"events/{item.event.id}.wav"  # an empty file where the sound would be
    return {language: () for language in languages}, Audio(sound, "", 0.0), {sound: b""}, 0.0

factsheet.build.event_files = undrawn
"""


def run(catalogue: Path, out: Path, jobs: int = 0, drawn: bool = True) -> dict:
    """One build in a fresh process (0 jobs: the default)."""
    code = RUNNER if drawn else UNDRAWN + RUNNER
    done = subprocess.run(
        [sys.executable, "-c", code, str(catalogue), str(out), str(jobs)],
        capture_output=True,
        text=True,
        check=False,
    )
    if done.returncode:
        raise SystemExit(f"build failed:\n{done.stderr[-3000:]}")
    return json.loads(done.stdout.strip().splitlines()[-1])


def clean(out: Path) -> None:
    shutil.rmtree(out, ignore_errors=True)
    for name in (f".factsheet-cache-{out.name}", f".factsheet-lock-{out.name}"):
        path = out.parent / name
        shutil.rmtree(path, ignore_errors=True) if path.is_dir() else path.unlink(missing_ok=True)


def age(folder: Path, seconds: float = 3600) -> None:
    then = time.time() - seconds
    for path in folder.iterdir():
        os.utime(path, (then, then))


def hashes(folder: Path) -> dict[str, str]:
    return {
        p.relative_to(folder).as_posix(): hashlib.sha256(p.read_bytes()).hexdigest()
        for p in sorted(folder.rglob("*"))
        if p.is_file()
    }


def sizes(folder: Path) -> dict[str, int]:
    found: dict[str, int] = defaultdict(int)
    for p in folder.rglob("*"):
        if p.is_file():
            found[p.suffix.lstrip(".") or p.name] += p.stat().st_size
    return dict(found)


def verdict(ok: bool) -> str:
    return "met" if ok else "NOT met"


def one_size(work: Path, n: int) -> dict:
    cat = write_catalogue(work / f"catalogue-{n}", n)
    age(cat)
    out = work / f"site-{n}"
    clean(out)
    full = run(cat, out)
    first = hashes(out)
    noop = run(cat, out)
    same = hashes(out) == first
    one = min(7, n - 2)
    (cat / f"syn-{one:05d}.yaml").write_text(event_text(one, np.random.default_rng(99)))
    edit = run(cat, out)
    text = cat / f"syn-{min(11, n - 1):05d}.yaml"
    text.write_text(text.read_text().replace("generated for the benchmark", "edited by hand"))
    summary = run(cat, out)
    published = sizes(out)
    cache = sum(p.stat().st_size for p in (work / f".factsheet-cache-{out.name}").rglob("*"))
    f = full["seconds"]
    print(f"\n== {n} synthetic events ==")
    print(
        f"full build: {f:.1f} s = {f / n * 1000:.0f} ms per event; peak memory: main "
        f"{full['rss_main_mb']:.0f} MB, largest worker {full['rss_worker_mb']:.0f} MB"
    )
    print(
        f"no-op rebuild: {noop['seconds']:.2f} s = {noop['seconds'] / f:.2%} of the full build "
        f"(target <= 1.5 %: {verdict(noop['seconds'] / f <= 0.015)}); reused {noop['reused']}; "
        f"site unchanged: {same}"
    )
    print(
        f"one estimate edited: {edit['seconds']:.2f} s = {edit['seconds'] / f:.2%} "
        f"(target <= 4 %: {verdict(edit['seconds'] / f <= 0.04)}); reused {edit['reused']}"
    )
    print(
        f"one summary edited: {summary['seconds']:.2f} s = {summary['seconds'] / f:.2%}; reused "
        f"{summary['reused']} of {n} (no figure or sound drawn: "
        f"{verdict(summary['reused'] == n)})"
    )
    total = sum(published.values())
    kinds = ", ".join(
        f"{k} {v / n / 1000:.1f}" for k, v in sorted(published.items(), key=lambda kv: -kv[1])
    )
    print(
        f"published: {total / n / 1000:.1f} KB per event (target <= 150 KB: "
        f"{verdict(total / n <= 150_000)}); by kind, KB per event: {kinds}"
    )
    print(f"cache: {cache / n / 1000:.1f} KB per event (JSON records only)")
    return {"n": n, "full": full, "cat": cat}


def speedup(work: Path, n: int) -> None:
    cat = write_catalogue(work / f"speed-{n}", n)
    age(cat)
    cores = len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else os.cpu_count()
    times, sites = {}, {}
    for jobs in sorted({1, 2, cores or 1}):
        out = work / f"speed-site-{jobs}"
        clean(out)
        times[jobs] = run(cat, out, jobs)["seconds"]
        sites[jobs] = hashes(out)
    again = work / "speed-site-again"
    clean(again)
    run(cat, again, 2)
    print(f"\n== speed-up, full build of {n} events (this machine: {cores} cores) ==")
    for jobs, seconds in times.items():
        print(f"--jobs {jobs}: {seconds:.1f} s, speed-up x{times[1] / seconds:.2f}")
    if 2 in times:
        ok = times[1] / times[2] >= 1.7
        print(f"speed-up with 2 workers: x{times[1] / times[2]:.2f} (target >= 1.7: {verdict(ok)})")
    identical = all(s == sites[1] for s in sites.values())
    print(
        f"--jobs 1 equal to --jobs N: {identical}; two builds byte-identical: "
        f"{hashes(again) == sites[2] if 2 in sites else 'n/a'}"
    )


def memory(results: list[dict]) -> None:
    if len(results) < 2:
        return
    a, b = results[0], results[-1]
    ma, mb = a["full"]["rss_main_mb"], b["full"]["rss_main_mb"]
    slope = (mb - ma) / (b["n"] - a["n"])
    at = mb + slope * (10_000 - b["n"])
    print(
        f"\n== memory == main process: {ma:.0f} MB at {a['n']}, {mb:.0f} MB at {b['n']} events: "
        f"{slope * 1000:.0f} kB per event; extrapolated (a straight line, not measured) to 10 000 "
        f"events: {at:.0f} MB (target < 400 MB: {verdict(at < 400)})"
    )


def measured_memory(work: Path, n: int) -> None:
    """The main process's peak in a full build of ``n`` events whose workers draw nothing."""
    cat = write_catalogue(work / f"catalogue-{n}", n)
    age(cat)
    out = work / f"site-{n}-undrawn"
    clean(out)
    found = run(cat, out, drawn=False)
    print(
        f"\n== memory, measured == a full build of {n} events whose workers draw no figure and "
        f"no sound ({found['seconds']:.0f} s): main process peak {found['rss_main_mb']:.0f} MB "
        f"(target < 400 MB at 10 000: {verdict(n < 10_000 or found['rss_main_mb'] < 400)}), "
        f"largest worker {found['rss_worker_mb']:.0f} MB"
    )
    clean(out)


def script(name: str, args: list[str]) -> None:
    path = HERE / name
    if not path.exists():
        print(f"\n== {name}: not present ==")
        return
    print(f"\n== {name} {' '.join(args)} ==", flush=True)
    subprocess.run([sys.executable, str(path), *args], check=False)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="+", default=[200, 1600])
    parser.add_argument("--speedup-events", type=int, default=200)
    parser.add_argument("--skip-index", action="store_true")
    parser.add_argument("--skip-figures", action="store_true")
    parser.add_argument(
        "--memory-events",
        type=int,
        default=10_000,
        help="events of the build whose main-process memory is measured (0: none)",
    )
    parser.add_argument("--workdir", type=Path, default=None)
    args = parser.parse_args()
    work = args.workdir or Path(tempfile.mkdtemp(prefix="factsheet-scale-"))
    work.mkdir(parents=True, exist_ok=True)
    print(f"load average at start: {os.getloadavg()[0]:.1f}", flush=True)
    results = [one_size(work, n) for n in args.sizes]
    memory(results)
    if args.memory_events:
        measured_memory(work, args.memory_events)
    if args.speedup_events:
        speedup(work, args.speedup_events)
    if not args.skip_figures:
        script("bench_figures.py", [])
    if not args.skip_index:
        script("bench_index.py", ["--rows", "10000"])
    if args.workdir is None:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
