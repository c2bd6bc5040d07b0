"""Unit checks at the call of every public physics function.

A value of the wrong dimension raises :class:`astropy.units.UnitsError` naming the argument and
the expected physical type, for example ``m1: expected a mass (e.g. 30 solMass), got 3.0 km``.
"""

from __future__ import annotations

from typing import NamedTuple

import astropy.units as u
import numpy as np

_EXPECTED = {
    "mass": (u.Msun, "30 solMass"),
    "length": (u.m, "400 Mpc"),
    "frequency": (u.Hz, "20 Hz"),
    "time": (u.s, "1 s"),
}


def require(value, physical_type: str, name: str) -> np.ndarray:
    """Return ``value`` as a float array in the SI-or-solar unit of ``physical_type``.

    Masses come back in solar masses, lengths in metres, frequencies in Hz, times in seconds.
    """
    unit, example = _EXPECTED[physical_type]
    if isinstance(value, u.UnitBase):
        value = 1.0 * value
    if not isinstance(value, u.Quantity) or not value.unit.is_equivalent(unit):
        got = f"{value}" if isinstance(value, u.Quantity) else f"{value!r} without a unit"
        raise u.UnitsError(f"{name}: expected a {physical_type} (e.g. {example}), got {got}")
    return np.asarray(value.to_value(unit), dtype=float)


def dimensionless(value, name: str) -> np.ndarray:
    """Return a plain float array from a number, array or dimensionless Quantity."""
    if isinstance(value, u.Quantity):
        if not value.unit.is_equivalent(u.dimensionless_unscaled):
            raise u.UnitsError(f"{name}: expected a dimensionless number, got {value}")
        return np.asarray(value.to_value(u.dimensionless_unscaled), dtype=float)
    return np.asarray(value, dtype=float)


def ordered(m1, m2, chi1z, chi2z):
    """Masses (solar masses) and aligned spins, relabelled so that the first body is the heavier.

    Returns float arrays ``(m1, m2, chi1z, chi2z)`` with ``m1 >= m2``, broadcast to one shape.
    """
    a = require(m1, "mass", "m1")
    b = require(m2, "mass", "m2")
    x = dimensionless(chi1z, "chi1z")
    y = dimensionless(chi2z, "chi2z")
    a, b, x, y = np.broadcast_arrays(a, b, x, y)
    swap = b > a
    return (
        np.where(swap, b, a),
        np.where(swap, a, b),
        np.where(swap, y, x),
        np.where(swap, x, y),
    )


class AlignedBinary(NamedTuple):
    """Dimensionless description of an aligned-spin binary, heavier body first."""

    q: np.ndarray  # m2/m1 <= 1
    eta: np.ndarray  # m1 m2 / M^2
    delta: np.ndarray  # (m1 - m2)/M >= 0
    chi1: np.ndarray  # aligned spin of the heavier body
    chi2: np.ndarray  # aligned spin of the lighter body
    s_hat: np.ndarray  # (chi1 m1^2 + chi2 m2^2)/(m1^2 + m2^2)
    s_tot: np.ndarray  # (chi1 m1^2 + chi2 m2^2)/M^2
    dchi: np.ndarray  # chi1 - chi2


def aligned_binary(m1, m2, chi1z, chi2z) -> AlignedBinary:
    """Check units, order the bodies and compute the combinations the remnant fits use."""
    a, b, x, y = ordered(m1, m2, chi1z, chi2z)
    total = a + b
    f1, f2 = a / total, b / total
    s_tot = x * f1 * f1 + y * f2 * f2
    return AlignedBinary(
        q=b / a,
        eta=f1 * f2,
        delta=f1 - f2,
        chi1=x,
        chi2=y,
        s_hat=s_tot / (f1 * f1 + f2 * f2),
        s_tot=s_tot,
        dchi=x - y,
    )
