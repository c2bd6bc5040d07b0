"""Write a synthetic catalogue of valid events of every class, for the build benchmark.

Usage: python bench/synthetic.py FOLDER N [--seed S]

Values are drawn from broad invented ranges (no real event's numbers); about 10 % neutron-star
pairs, 15 % mixed pairs and 75 % black-hole pairs, a few with histories, hosts and candidates.
"""

from __future__ import annotations

import argparse
from pathlib import Path

import numpy as np

SETTINGS = """title: Synthetic benchmark catalogue (invented)
cosmology: Planck18
credible_level: 0.9
samples: 4000
low_frequency: 20 Hz
"""


def _interval(value: float, frac: float, unit: str, digits: int = 3) -> str:
    plus, minus = value * frac, value * frac * 0.8
    return f"{value:.{digits}g} +{plus:.2g} -{minus:.2g} {unit}".strip()


def event_text(i: int, rng: np.random.Generator) -> str:
    kind = rng.choice(["BNS", "NSBH", "BBH"], p=[0.1, 0.15, 0.75])
    if kind == "BNS":
        m1, m2, dist = rng.uniform(1.3, 1.9), rng.uniform(1.1, 1.3), rng.uniform(40, 250)
    elif kind == "NSBH":
        m1, m2, dist = rng.uniform(4, 15), rng.uniform(1.2, 1.8), rng.uniform(150, 900)
    else:
        m1 = rng.uniform(8, 90)
        m2, dist = m1 * rng.uniform(0.2, 1.0), rng.uniform(300, 6000)
    spin = rng.uniform(-0.3, 0.6)
    day = 1 + i % 28
    lines = [
        f"id: SYN-{i:05d}",
        f"title: Synthetic event {i}",
        f'time: "2035-{1 + (i // 28) % 12:02d}-{day:02d}T{i % 24:02d}:{i % 60:02d}:07.5"',
        f"status: {'candidate' if i % 17 == 5 else 'confirmed'}",
        "estimate:",
        "  heavier:",
        f"    mass: {_interval(m1, 0.15, 'Msun')}",
        f"    spin: {spin:.2f} +0.2 -0.2",
        "  lighter:",
        f"    mass: {_interval(m2, 0.15, 'Msun')}",
        f"    spin: {spin / 2:.2f} +0.3 -0.3",
        f"  distance: {_interval(dist, 0.4, 'Mpc')}",
        "detection:",
        f"  false_alarm_rate: 1 / {rng.integers(2, 5000)} yr",
        f"  snr: {rng.uniform(8, 30):.1f}",
        "  network: [S1, S2]",
        f"  sky_area: {rng.integers(20, 3000)} deg2",
        f"summary: Synthetic event number {i}, generated for the benchmark.",
    ]
    if kind == "BBH" and i % 40 == 3:
        lines.append("host: {smbh_mass: 1e8 Msun, orbit_radius: 700, disk_aspect_ratio: 0.01}")
    if i % 10 == 1:
        lines += [
            "history:",
            '  - date: "2036-01-01"',
            "    label: rapid estimate",
            "    estimate:",
            f"      heavier: {{mass: {_interval(m1 * 1.1, 0.3, 'Msun')}}}",
            f"      lighter: {{mass: {_interval(m2 * 0.9, 0.3, 'Msun')}}}",
            f"      distance: {_interval(dist * 1.2, 0.5, 'Mpc')}",
        ]
    return "\n".join(lines) + "\n"


def write_catalogue(folder: Path, n: int, seed: int = 1) -> Path:
    """Write ``n`` synthetic events and a catalogue.yaml into ``folder``."""
    folder.mkdir(parents=True, exist_ok=True)
    (folder / "catalogue.yaml").write_text(SETTINGS)
    rng = np.random.default_rng(seed)
    for i in range(n):
        (folder / f"syn-{i:05d}.yaml").write_text(event_text(i, rng))
    return folder


if __name__ == "__main__":
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("folder", type=Path)
    parser.add_argument("n", type=int)
    parser.add_argument("--seed", type=int, default=1)
    args = parser.parse_args()
    write_catalogue(args.folder, args.n, args.seed)
