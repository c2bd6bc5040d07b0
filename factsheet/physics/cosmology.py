"""Luminosity distance to redshift, and the source and detector frames.

d_L(z) comes from astropy's cosmology (Hogg 1999 definitions); it is tabulated once per cosmology
on a geometric redshift grid from z = 1e-9 to z = 1000 and inverted with a cubic spline of ln z
against ln d_L, good to ~1e-11 relative, fast enough for 10^5 samples. Below the table's lower
end the linear Hubble law z = H0 d_L / c holds to better than 1e-9 relative (the next term of
the series is (1 - q0) z^2 / 2). Distances beyond d_L(z = 1000) are an input error: the loader
refuses them (:func:`distance_limit`) and the sampler truncates its draws there.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np
from astropy import constants as _constants

from . import _distance_limits
from ._checks import dimensionless, require
from .registry import Method, register

Z_MIN, Z_MAX, N_GRID = 1e-9, 1000.0, 2000

METHOD = register(
    Method(
        id="luminosity-distance-inversion",
        title="Redshift from luminosity distance in a flat ΛCDM cosmology",
        citation="Planck Collaboration, 2020, A&A 641, A6 (Planck18 parameters, through astropy); "
        "Hogg D. W., 1999, arXiv:astro-ph/9905116 (distance definitions)",
        formula="d_{L} = (1 + z) (c/H₀) ∫₀^{z} dz′/E(z′); inverted by a cubic spline of ln z "
        "against ln d_{L} on a geometric grid 10^{−9} ≤ z ≤ 1000, and by the linear Hubble law "
        "z = H₀ d_{L}/c below z = 10^{−9}; m_{src} = m_{det}/(1 + z)",
        validity="any distance up to d_{L}(z = 1000)",
        accuracy="within 10^{−10} (relative) of astropy's inversion on the grid; the linear law "
        "below it within 10^{−9}",
        quantities=("redshift",),
        limits={"redshift": (0.0, Z_MAX)},
    )
).id


class _Table:
    """ln z as a cubic spline of ln(d_L / m) between the grid's ends, and the Hubble law's
    H0 / c (per metre) below them."""

    def __init__(self, cosmo) -> None:
        z = np.geomspace(Z_MIN, Z_MAX, N_GRID)
        d = cosmo.luminosity_distance(z).to_value(u.m)
        from scipy.interpolate import CubicSpline  # scipy loads only when a table is made

        self.spline = CubicSpline(np.log(d), np.log(z))
        self.low, self.high = float(d[0]), float(d[-1])
        self.hubble = float((cosmo.H0 / _constants.c).to_value(1 / u.m))


_TABLES: dict[str, _Table] = {}


def _resolve(cosmology):
    """An astropy cosmology from an instance or a realisation name such as ``"Planck18"``."""
    from astropy import cosmology as _cosmology  # loads scipy: only when a distance is needed

    if isinstance(cosmology, str):
        return _cosmology.default_cosmology.validate(cosmology)
    if not isinstance(cosmology, _cosmology.Cosmology):
        raise TypeError(f"cosmology: expected an astropy Cosmology or a name, got {cosmology!r}")
    return cosmology


def _table(cosmology) -> _Table:
    """The table of ``cosmology``, built once per cosmology (keyed by its parameters)."""
    cosmo = _resolve(cosmology)
    key = repr(cosmo)
    if key not in _TABLES:
        _TABLES[key] = _Table(cosmo)
    return _TABLES[key]


def distance_limit(cosmology) -> u.Quantity:
    """d_L(z = 1000) in ``cosmology``, in Mpc: the largest distance turned into a redshift."""
    return (_table(cosmology).high * u.m).to(u.Mpc)


def named_distance_limit(name: str) -> float:
    """d_L(z = 1000) in Mpc of the cosmology astropy ships as ``name``, from the table made
    once by ``tools/make_distance_limits.py`` (no astropy cosmology or scipy is loaded); any
    other name is computed (:func:`distance_limit`)."""
    found = _distance_limits.LIMITS_M.get(name)
    if found is None:
        return float(distance_limit(name).to_value(u.Mpc))
    return float((found * u.m).to_value(u.Mpc))


def redshift_at_distance(distance, cosmology) -> np.ndarray:
    """Redshift at luminosity distance d_L in ``cosmology`` (astropy; Hogg 1999), vectorised.

    ``cosmology`` is an astropy Cosmology or a realisation name ("Planck18"). Any positive
    distance up to d_L(z = 1000) is accepted; a distance that is not positive and finite, or
    beyond d_L(z = 1000), raises ValueError.
    """
    d = require(distance, "length", "distance")
    table = _table(cosmology)
    top = table.high * (1 + 1e-12)  # a value given as d_L(z = 1000) in Mpc, after rounding
    good = np.isfinite(d) & (d > 0) & (d <= top)
    if not np.all(good):
        worst = (np.atleast_1d(d)[~np.atleast_1d(good)][0] * u.m).to(u.Mpc)
        hi = (table.high * u.m).to(u.Mpc)
        raise ValueError(
            f"distance: {worst:.6g} is outside the redshift table "
            f"(above 0 and up to {hi:.4g}, z = {Z_MAX:g})"
        )
    inside = np.clip(d, table.low, table.high)
    z = np.exp(table.spline(np.log(inside)))
    return np.where(d < table.low, d * table.hubble, z)


def to_source_frame(mass, z) -> u.Quantity:
    """Source-frame mass m_det/(1+z) in solar masses (cosmological redshift of masses)."""
    return require(mass, "mass", "mass") / (1 + dimensionless(z, "z")) * u.Msun


def to_detector_frame(mass, z) -> u.Quantity:
    """Detector-frame (redshifted) mass (1+z) m_src in solar masses."""
    return require(mass, "mass", "mass") * (1 + dimensionless(z, "z")) * u.Msun
