"""Time and peak memory of reading a million-row samples file in each format: prints a table.

Run: ``python bench/bench_samples.py [ROWS]``. One file per format (CSV, ECSV, FITS) holds the
same invented samples: seven columns, five of them read (two masses, two aligned spins, the
distance) and two ignored. Each read runs in a fresh Python process, which reports the time
of ``read_samples`` and how far its peak resident memory grew during the read (Linux: the
peak is reset through ``/proc/self/clear_refs`` and read as ``VmHWM``; ``ru_maxrss`` would
carry the peak of the parent process that wrote the files);
the columns kept are five arrays of 8-byte floats. For comparison, the last line reads the
ECSV file with astropy's own reader (``Table.read``), which the samples reader does not use
for the body of an ECSV file.
"""

from __future__ import annotations

import subprocess
import sys
import tempfile
from pathlib import Path

import astropy.units as u
import numpy as np
from astropy.table import Table

READ = """
import sys, time
from pathlib import Path
from factsheet.load.samples import read_samples
from astropy.table import Table
import astropy.io.fits, astropy.io.ascii.ecsv  # modules loaded before the baseline

def status(field):  # kB in /proc/self/status
    with open("/proc/self/status") as handle:
        return next(int(l.split()[1]) for l in handle if l.startswith(field + ":"))

with open("/proc/self/clear_refs", "w") as handle:
    handle.write("5")  # reset the peak resident size to the current one
before = status("VmRSS")
start = time.perf_counter()
if sys.argv[2] == "samples":
    rows = len(read_samples(Path(sys.argv[1])).values["distance"])
else:
    rows = len(Table.read(sys.argv[1], format="ascii.ecsv"))
seconds = time.perf_counter() - start
print(rows, seconds, (status("VmHWM") - before) * 1024)
"""


def invented_table(rows: int) -> Table:
    """Invented samples of one binary, two extra columns that the reader ignores."""
    rng = np.random.default_rng(34)
    table = Table()
    table["heavier.mass"] = rng.normal(36, 3, rows).clip(30) * u.Msun
    table["lighter.mass"] = rng.normal(29, 3, rows).clip(5, 30) * u.Msun
    table["heavier.spin"] = rng.uniform(-0.5, 0.5, rows)
    table["lighter.spin"] = rng.uniform(-0.5, 0.5, rows)
    table["distance"] = rng.normal(440, 50, rows).clip(100) * u.Mpc
    table["log_likelihood"] = rng.normal(-20, 3, rows)
    table["phase"] = rng.uniform(0, 6.28, rows)
    return table


def write_csv(table: Table, path: Path) -> None:
    header = [f"{n} [{c.unit}]" if c.unit else n for n, c in table.columns.items()]
    data = np.column_stack([np.asarray(c) for c in table.columns.values()])
    with path.open("w") as handle:
        handle.write(",".join(header) + "\n")
        np.savetxt(handle, data, delimiter=",", fmt="%.17g")


def measure(path: Path, how: str) -> tuple[int, float, int]:
    result = subprocess.run(
        [sys.executable, "-c", READ, str(path), how], capture_output=True, text=True, check=True
    )
    rows, seconds, growth = result.stdout.split()
    return int(rows), float(seconds), int(growth)


def main(rows: int) -> None:
    table = invented_table(rows)
    kept = 5 * 8 * rows
    with tempfile.TemporaryDirectory() as folder:
        paths = {name: Path(folder) / f"samples.{name}" for name in ("csv", "ecsv", "fits")}
        write_csv(table, paths["csv"])
        table.write(paths["ecsv"], format="ascii.ecsv")
        table.write(paths["fits"], format="fits")
        print(f"{rows} rows, 7 columns, 5 read: kept {kept / 2**20:.0f} MiB of 8-byte floats")
        print(f"{'format':<22} {'file MB':>8} {'time s':>7} {'peak MiB':>9} {'x kept':>7}")
        cases = [(n, p, "samples") for n, p in paths.items()]
        cases.append(("ecsv, astropy reader", paths["ecsv"], "astropy"))
        for name, path, how in cases:
            count, seconds, growth = measure(path, how)
            assert count == rows, (name, count)
            size = path.stat().st_size / 1e6
            print(
                f"{name:<22} {size:>8.0f} {seconds:>7.2f} {growth / 2**20:>9.0f} "
                f"{growth / kept:>7.2f}"
            )


if __name__ == "__main__":
    main(int(sys.argv[1]) if len(sys.argv) > 1 else 1_000_000)
