"""Innermost stable circular orbit of a Kerr black hole (Bardeen, Press & Teukolsky 1972).

Dimensionless: radius in units of G M / c^2, energy per unit rest mass, angular momentum in units
of G M mu / c. The spin is signed relative to the orbit (a > 0 prograde, a < 0 retrograde).
"""

from __future__ import annotations

import numpy as np

from ._checks import dimensionless
from .registry import Method, register

METHOD = register(
    Method(
        id="bardeen-press-teukolsky-1972-isco",
        title="Innermost stable circular orbit of a Kerr black hole",
        citation="Bardeen J. M., Press W. H., Teukolsky S. A., 1972, ApJ 178, 347",
        formula="Z₁ = 1 + (1 − a²)^{1/3} [(1 + a)^{1/3} + (1 − a)^{1/3}], Z₂ = √(3a² + Z₁²), "
        "r = 3 + Z₂ − sign(a) √((3 − Z₁)(3 + Z₁ + 2Z₂)); E = √(1 − 2/(3r)); "
        "L = 2/(3√3) (1 + 2√(3r − 2))",
        validity="exact for circular equatorial geodesics, −1 ≤ a ≤ 1",
        accuracy="exact",
        quantities=("isco_radius", "isco_energy", "isco_angular_momentum"),
        limits={"spin": (-1.0, 1.0)},
    )
).id


def isco_radius(spin) -> np.ndarray:
    """ISCO radius r/M for signed spin a (Bardeen, Press & Teukolsky 1972); sign(0) = +1.

    |a| > 1 (no black hole) gives NaN.
    """
    a = dimensionless(spin, "spin")
    a = np.where(np.abs(a) <= 1, a, np.nan)
    z1 = 1 + np.cbrt(1 - a * a) * (np.cbrt(1 + a) + np.cbrt(1 - a))
    z2 = np.sqrt(3 * a * a + z1 * z1)
    sign = np.where(a < 0, -1.0, 1.0)
    return 3 + z2 - sign * np.sqrt(np.maximum(0.0, (3 - z1) * (3 + z1 + 2 * z2)))


def isco_energy(spin) -> np.ndarray:
    """Energy per unit rest mass at the ISCO, sqrt(1 - 2/(3 r)) (BPT 1972, ApJ 178, 347)."""
    return np.sqrt(1 - 2 / (3 * isco_radius(spin)))


def isco_angular_momentum(spin) -> np.ndarray:
    """Orbital angular momentum per unit mass at the ISCO, L/(M mu), magnitude (BPT 1972)."""
    return 2 / (3 * np.sqrt(3)) * (1 + 2 * np.sqrt(3 * isco_radius(spin) - 2))
