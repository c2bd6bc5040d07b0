"""Luminosity distance to redshift, and the source and detector frames.

d_L(z) comes from astropy's cosmology (Hogg 1999 definitions); it is tabulated once per cosmology
on a geometric redshift grid and inverted with a cubic spline of ln z against ln d_L, good to
~1e-11 relative, fast enough for 10^5 samples. Distances outside the grid are an input error.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np
from astropy import cosmology as _cosmology
from scipy.interpolate import CubicSpline

from ._checks import dimensionless, require
from .registry import Method, register

METHOD = register(
    Method(
        id="luminosity-distance-inversion",
        title="Redshift from luminosity distance in a flat Lambda-CDM cosmology",
        citation="Planck Collaboration, 2020, A&A 641, A6 (Planck18 parameters, through astropy); "
        "Hogg D. W., 1999, astro-ph/9905116 (distance definitions)",
        formula="d_L = (1+z) (c/H0) integral_0^z dz'/E(z'); inverted by a cubic spline of ln z "
        "against ln d_L on a geometric grid 1e-6 <= z <= 20; m_src = m_det/(1+z)",
        validity="distances between d_L(z = 1e-6) and d_L(z = 20)",
        accuracy="within 1e-10 relative of astropy's z_at_value",
        quantities=("redshift",),
        limits={"redshift": (1e-6, 20.0)},
    )
).id

Z_MIN, Z_MAX, N_GRID = 1e-6, 20.0, 1000
_SPLINES: dict[str, tuple[CubicSpline, float, float]] = {}


def _resolve(cosmology):
    """An astropy cosmology from an instance or a realisation name such as ``"Planck18"``."""
    if isinstance(cosmology, str):
        return _cosmology.default_cosmology.validate(cosmology)
    if not isinstance(cosmology, _cosmology.Cosmology):
        raise TypeError(f"cosmology: expected an astropy Cosmology or a name, got {cosmology!r}")
    return cosmology


def _spline(cosmology) -> tuple[CubicSpline, float, float]:
    """ln z as a cubic spline of ln(d_L / m), built once per cosmology (keyed by its parameters)."""
    cosmo = _resolve(cosmology)
    key = repr(cosmo)
    if key not in _SPLINES:
        z = np.geomspace(Z_MIN, Z_MAX, N_GRID)
        ln_d = np.log(cosmo.luminosity_distance(z).to_value(u.m))
        _SPLINES[key] = (CubicSpline(ln_d, np.log(z)), ln_d[0], ln_d[-1])
    return _SPLINES[key]


def redshift_at_distance(distance, cosmology) -> np.ndarray:
    """Redshift at luminosity distance d_L in ``cosmology`` (astropy; Hogg 1999), vectorised.

    ``cosmology`` is an astropy Cosmology or a realisation name ("Planck18"). A distance outside
    d_L(1e-6)..d_L(20) raises ValueError.
    """
    d = require(distance, "length", "distance")
    spline, low, high = _spline(cosmology)
    ln_d = np.log(d, where=d > 0, out=np.full(d.shape, -np.inf))
    bad = ~((ln_d >= low) & (ln_d <= high))
    if np.any(bad):
        worst = (np.atleast_1d(d)[np.atleast_1d(bad)][0] * u.m).to(u.Mpc)
        lo, hi = (np.exp([low, high]) * u.m).to(u.Mpc)
        raise ValueError(
            f"distance: {worst:.6g} is outside the redshift table "
            f"({lo:.3g} to {hi:.4g}, z = {Z_MIN:g} to {Z_MAX:g})"
        )
    return np.exp(spline(ln_d))


def to_source_frame(mass, z) -> u.Quantity:
    """Source-frame mass m_det/(1+z) in solar masses (cosmological redshift of masses)."""
    return require(mass, "mass", "mass") / (1 + dimensionless(z, "z")) * u.Msun


def to_detector_frame(mass, z) -> u.Quantity:
    """Detector-frame (redshifted) mass (1+z) m_src in solar masses."""
    return require(mass, "mass", "mass") * (1 + dimensionless(z, "z")) * u.Msun
