"""Time and peak memory of reading a large sky map and deriving its regions (not a test).

Run: ``python bench/bench_skymap.py``. Writes two synthetic float64 HEALPix maps into a temporary
folder (NSIDE 2048: 50 331 648 pixels, a 403 MB file; and NSIDE 1024), deleted afterwards. Each
map is then measured in a fresh subprocess, step by step: ``check_sky_map``,
``read_probabilities``, ``RankedMap`` with the 50 % and 90 % areas, ``levels_at`` for five
positions and ``level_grid`` (720 × 360). For each step: its wall time and the process's peak
resident memory so far (``resource.getrusage``'s ``ru_maxrss``). The budget is the interpreter
(about 150 MB) plus 2.5 times the map as float32.
"""

from __future__ import annotations

import json
import resource
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

ROOT = Path(__file__).resolve().parents[1]
NSIDES = (1024, 2048)
CHUNK = 1 << 20  # pixels computed and written at a time


def write_map(path: Path, nside: int) -> None:
    """A float64 map of two Gaussian blobs (invented positions), NESTED, one value per row,
    computed and written in chunks so the writer stays small too."""
    from astropy.io import fits
    from astropy_healpix import HEALPix

    grid = HEALPix(nside=nside, order="nested")
    centres = [_vector(63.0, -21.0), _vector(70.0, -18.0)]
    template = fits.BinTableHDU.from_columns([fits.Column(name="PROB", format="D", array=[0.0])])
    header = template.header
    header["NAXIS2"] = grid.npix
    for key, value in (("PIXTYPE", "HEALPIX"), ("ORDERING", "NESTED"), ("COORDSYS", "C"),
                       ("NSIDE", nside), ("INDXSCHM", "IMPLICIT")):  # fmt: skip
        header[key] = value
    stream = fits.StreamingHDU(path, header)
    for start in range(0, grid.npix, CHUNK):
        lon, lat = grid.healpix_to_lonlat(np.arange(start, min(start + CHUNK, grid.npix)))
        ra, dec = lon.to_value("rad"), lat.to_value("rad")
        v = np.stack([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)], axis=1)
        angle = np.degrees(np.arccos(np.clip(v @ np.transpose(centres), -1, 1)))
        values = np.exp(-(angle[:, 0] ** 2) / 8) + 0.4 * np.exp(-(angle[:, 1] ** 2) / 2)
        stream.write(values.astype(">f8").view(np.uint8))  # a table is written as bytes
    stream.close()


def _vector(ra: float, dec: float) -> np.ndarray:
    ra, dec = np.radians(ra), np.radians(dec)
    return np.array([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)])


def measure(path: str) -> list[tuple[str, float, float]]:
    """Each step's wall time (s) and the peak resident memory so far (MB); run in a fresh
    process so the peak is this map's alone."""
    import astropy.units as u

    from factsheet.load.skymap import Where, check_sky_map, read_probabilities
    from factsheet.physics.sky import RankedMap, level_grid, levels_at

    rows = [("imports", 0.0, _peak_mb())]
    state: dict = {}

    def step(name, func):
        start = time.perf_counter()
        func()
        rows.append((name, time.perf_counter() - start, _peak_mb()))

    def check():
        problems, warnings = [], []
        state["sky"] = check_sky_map(Path(path), problems, warnings, Where("bench.yaml", 1))
        assert not problems, problems

    def ranked():
        state["ranked"] = RankedMap(state["prob"], state["sky"].nside)
        state["areas"] = [state["ranked"].area(p) for p in (0.5, 0.9)]

    ra = [63.0, 64.0, 70.0, 200.0, 0.0] * u.deg
    dec = [-21.0, -22.0, -18.0, 40.0, -89.0] * u.deg
    order = lambda: state["sky"].ordering  # noqa: E731 - read once the map is checked
    step("check_sky_map", check)
    step("read_probabilities", lambda: state.update(prob=read_probabilities(state["sky"])))
    step("RankedMap + area(0.5), area(0.9)", ranked)
    step(
        "levels_at, 5 positions",
        lambda: levels_at(state["ranked"], state["prob"], order(), ra, dec),
    )
    step("level_grid 720 x 360", lambda: level_grid(state["ranked"], state["prob"], order()))
    return rows


def _peak_mb() -> float:
    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024  # kB on Linux


def _in_fresh_process(call: str) -> str:
    """Run ``call`` (an expression using this module) in a new interpreter; its last line.

    Everything heavy runs in children: Linux carries a parent's peak memory into a child's
    ``ru_maxrss`` at fork, so the parent stays small."""
    code = f"import json, sys; sys.path.insert(0, {str(ROOT)!r}); import bench.bench_skymap as b; "
    done = subprocess.run(
        [sys.executable, "-c", code + f"print(json.dumps({call}))"],
        capture_output=True,
        text=True,
        cwd=ROOT,
        check=True,
    )
    return json.loads(done.stdout.strip().splitlines()[-1])


def main() -> None:
    with tempfile.TemporaryDirectory(prefix="bench-skymap-") as folder:
        for nside in NSIDES:
            path = Path(folder) / f"map-{nside}.fits"
            start = time.perf_counter()
            _in_fresh_process(f"b.write_map(b.Path({str(path)!r}), {nside})")
            size = path.stat().st_size / 1e6
            print(f"\nNSIDE {nside}: {12 * nside**2:,} pixels, file {size:.0f} MB "
                  f"(written in {time.perf_counter() - start:.1f} s)")  # fmt: skip
            rows = _in_fresh_process(f"b.measure({str(path)!r})")
            budget = 150 + 2.5 * 4 * 12 * nside**2 / 2**20
            print(f"{'step':36} {'time (s)':>9} {'peak RSS (MB)':>14}")
            for name, seconds, peak in rows:
                print(f"{name:36} {seconds:9.2f} {peak:14.0f}")
            print(f"budget: {budget:.0f} MB (interpreter ~150 MB + 2.5 x the float32 map)")
            path.unlink()


if __name__ == "__main__":
    main()
