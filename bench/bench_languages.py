"""What a second language costs: the same synthetic catalogue built in English alone and in
English and Spanish, each from scratch, in one run.

Usage: python bench/bench_languages.py [--events 60] [--jobs 2] [--workdir DIR]

A second language re-renders every page and redraws each figure with words in it (axis labels,
legends); the physics and the chirp sounds are made once. Prints the two builds' times, their
ratio, the seconds spent drawing figures in each, and the published bytes of each site.
"""

from __future__ import annotations

import argparse
import shutil
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))
from bench_build import clean, run
from synthetic import write_catalogue


def site_bytes(out: Path) -> int:
    return sum(p.stat().st_size for p in out.rglob("*") if p.is_file())


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--events", type=int, default=60)
    parser.add_argument("--jobs", type=int, default=2)
    parser.add_argument("--workdir", type=Path, default=None)
    args = parser.parse_args()
    work = args.workdir or Path(tempfile.mkdtemp(prefix="factsheet-bench-languages-"))
    one = write_catalogue(work / "one", args.events)
    two = write_catalogue(work / "two", args.events)
    settings = two / "catalogue.yaml"
    settings.write_text(settings.read_text() + "languages: [en, es]\n")

    results = {}
    for name, catalogue in (("en", one), ("en+es", two)):
        out = work / f"site-{name}"
        clean(out)
        results[name] = {**run(catalogue, out, args.jobs), "bytes": site_bytes(out)}
    a, b = results["en"], results["en+es"]
    print(f"events: {args.events}, workers: {args.jobs}")
    for name, r in results.items():
        print(
            f"{name:>6}: {r['seconds']:.1f} s, figures drawn in {r['figure_seconds']:.1f} s "
            f"(all workers), {r['bytes'] / 1e6:.1f} MB published"
        )
    print(
        f"two languages / one: time x{b['seconds'] / a['seconds']:.2f}, figure drawing "
        f"x{b['figure_seconds'] / a['figure_seconds']:.2f}, bytes x{b['bytes'] / a['bytes']:.2f} "
        "(physics and sounds are made once)"
    )
    if args.workdir is None:
        shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
