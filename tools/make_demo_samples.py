"""Write the demo catalogue's posterior-samples file, deterministically.

The demo event MER34-001 (``events_demo/mer34-001.yaml``) names ``mer34-001.ecsv`` under its
``samples`` key. The samples are invented: they are drawn here from a fixed-seed generator so
that a rerun rewrites the identical file. Run from anywhere:

    python tools/make_demo_samples.py

File layout (read by the loader, see docs/samples-files.md): an ECSV table written by astropy's
``Table.write``, one column per value named by the path of the value in an estimate, its unit
in the column's header entry (none for a dimensionless column, e.g. ``heavier.spin``), the
invented origin in the table's ``meta``; every row is one sample, values rounded to 5
significant digits.

How the samples are drawn (a toy model of how a compact-binary measurement looks, not a fit):
the source-frame chirp mass is tightly measured (normal, 2.5 % standard deviation), the mass
ratio q = m2/m1 is loose (beta distribution), and the components follow from
m1 = Mc (1 + q)^(1/5) / q^(3/5), m2 = q m1, so m1 >= m2 always. The aligned spins are broad
and tilted against the mass ratio (the mass-ratio--effective-spin degeneracy of the inspiral
phase, Cutler & Flanagan 1994, PRD 49, 2658 [recalled from memory]), kept within [-1, 1] by
redrawing. The luminosity distance is log-normal and independent of the rest.
"""

from __future__ import annotations

from pathlib import Path

import astropy.units as u
import numpy as np
from astropy.table import Table

SEED = 3401  # fixed: the file must not change between runs
N_SAMPLES = 2000
SIGNIFICANT_DIGITS = 5
OUT = Path(__file__).resolve().parent.parent / "events_demo" / "mer34-001.ecsv"

CHIRP_MASS = 26.5  # Msun, source frame, median of the invented measurement
CHIRP_MASS_REL_SD = 0.025
Q_BETA = (9.0, 2.6)  # beta-distribution shape parameters of q (mean ~0.78)
HEAVIER_SPIN = (0.05, 0.20)  # mean, standard deviation before the q tilt
LIGHTER_SPIN = (0.00, 0.33)
SPIN_Q_TILT = -0.35  # shift of the heavier body's spin per unit of q above its mean
DISTANCE_MEDIAN = 1290.0  # Mpc
DISTANCE_LOG_SD = 0.25

COLUMNS = {  # path of the value in an estimate: its unit ('' for a dimensionless value)
    "heavier.mass": "solMass",
    "lighter.mass": "solMass",
    "heavier.spin": "",
    "lighter.spin": "",
    "distance": "Mpc",
}
DESCRIPTION = "MER34-001 posterior samples invented for the factsheet demo (not a real measurement)"


def components_from_chirp(chirp_mass: np.ndarray, q: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """The bodies' masses from chirp mass and q = m2/m1 <= 1 (definition of the chirp mass)."""
    m1 = chirp_mass * (1.0 + q) ** 0.2 / q**0.6
    return m1, q * m1


def bounded_normal(rng: np.random.Generator, mean: np.ndarray, sd: float) -> np.ndarray:
    """Normal draws redrawn until inside [-1, 1] (rejection sampling of a truncated normal)."""
    mean = np.asarray(mean, dtype=float)
    out = rng.normal(mean, sd)
    bad = np.abs(out) > 1.0
    while bad.any():
        out[bad] = rng.normal(mean[bad], sd)
        bad = np.abs(out) > 1.0
    return out


def draw(rng: np.random.Generator, n: int) -> dict[str, np.ndarray]:
    """Draw n correlated samples of the toy model described in the module docstring."""
    chirp = CHIRP_MASS * (1.0 + CHIRP_MASS_REL_SD * rng.standard_normal(n))
    q = rng.beta(*Q_BETA, size=n)
    m1, m2 = components_from_chirp(chirp, q)
    spin1_mean = HEAVIER_SPIN[0] + SPIN_Q_TILT * (q - q.mean())
    spin1 = bounded_normal(rng, spin1_mean, HEAVIER_SPIN[1])
    spin2 = bounded_normal(rng, np.full(n, LIGHTER_SPIN[0]), LIGHTER_SPIN[1])
    distance = DISTANCE_MEDIAN * np.exp(DISTANCE_LOG_SD * rng.standard_normal(n))
    return dict(zip(COLUMNS, (m1, m2, spin1, spin2, distance), strict=True))


def write_ecsv(columns: dict[str, np.ndarray], path: Path) -> None:
    """Write the rounded samples (5 significant digits) as an ECSV table, units in its header."""
    table = Table(meta={"description": DESCRIPTION})
    for name, values in columns.items():
        rounded = np.array([float(f"{value:.{SIGNIFICANT_DIGITS}g}") for value in values])
        table[name] = rounded * u.Unit(COLUMNS[name]) if COLUMNS[name] else rounded
    table.write(path, format="ascii.ecsv", overwrite=True)


def summarise(columns: dict[str, np.ndarray], level: float = 0.9) -> None:
    """Print median and equal-tailed credible offsets, to copy into the event's estimate."""
    tail = 50.0 * (1.0 - level)
    for name, values in columns.items():
        low, mid, high = np.percentile(values, [tail, 50.0, 100.0 - tail])
        print(f"{name:28s} {mid:9.4g} +{high - mid:.3g} -{mid - low:.3g}")


def main() -> None:
    """Draw the samples with the fixed seed, write the ECSV table and print its summary."""
    columns = draw(np.random.default_rng(SEED), N_SAMPLES)
    write_ecsv(columns, OUT)
    summarise(columns)
    print(f"wrote {OUT} ({OUT.stat().st_size / 1024:.0f} kB)")


if __name__ == "__main__":
    main()
