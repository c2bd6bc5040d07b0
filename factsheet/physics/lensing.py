"""What if the signal was magnified by a gravitational lens (docs/methods.md, lensing).

A lens that magnifies the energy flux by μ multiplies the strain by √μ and leaves the shape of
the waveform — hence the detector-frame masses — unchanged (Wang, Stebbins & Turner 1996, PRL 77,
2875). The luminosity distance inferred without the lens is then too small by √μ, so the source
lies farther away and at a higher redshift, and every source-frame mass is smaller:

    d_true = √μ · d_inferred,   z_true = z(d_true),   m_source = m_detector / (1 + z_true).

Broadhurst, Diego & Smoot 2018 (arXiv:1802.05273) read heavy mergers this way. Applied per
sample; the redshift comes from the catalogue's cosmology through the fast redshift table of
:mod:`factsheet.physics.cosmology`.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from typing import NamedTuple

import astropy.units as u
import numpy as np

from ._checks import dimensionless, require
from .cosmology import redshift_at_distance, to_source_frame
from .registry import Method, register

#: At most this many magnifications in one panel: a what-if table, not a scan.
MAX_MAGNIFICATIONS = 6
#: The largest magnification accepted: an input guard (a source on a lens's caustic can be
#: magnified without bound in the geometric-optics limit, but wave optics and the source's
#: size cap real magnifications far below this).
MAX_MAGNIFICATION = 10_000.0

METHOD = register(
    Method(
        id="lensing-magnification",
        title="Source frame of a signal magnified by a gravitational lens",
        citation="Wang Y., Stebbins A. & Turner E. L., 1996, PRL 77, 2875 (amplitude ∝ √μ, "
        "waveform shape unchanged); Broadhurst T., Diego J. M. & Smoot G., 2018, "
        "arXiv:1802.05273 (heavy mergers read as magnified lighter ones)",
        formula="d_{true} = √μ · d_{L}; z_{true} = z(d_{true}) in the catalogue's cosmology; "
        "m_{src} = m_{det}/(1 + z_{true}) for both bodies and the remnant, per sample",
        validity="geometric optics, one image of magnification μ > 1; says nothing about "
        "whether a lens exists",
        accuracy="as the redshift inversion (better than 10^{−9} relative); the answer is only "
        "as good as the assumed magnification",
        arxiv="1802.05273",
        quantities=("what_if_lensed",),
        provenance="formulas recalled from memory of both papers; check values computed here "
        "with astropy's z_at_value (Planck18)",
    )
).id


class LensedSource(NamedTuple):
    """Per-sample values of one magnification: true distance (Mpc), redshift and source-frame
    masses (solar masses) in the order the detector-frame masses were given."""

    magnification: float
    distance: u.Quantity
    redshift: np.ndarray
    masses: tuple[u.Quantity, ...]


def check_magnifications(values: Iterable[object]) -> tuple[float, ...]:
    """Magnifications as floats, checked: each a finite number above 1 and at most
    :data:`MAX_MAGNIFICATION`, at most :data:`MAX_MAGNIFICATIONS` of them, none repeated.
    Returned in increasing order. Raises ValueError saying which value is wrong and why."""
    found: list[float] = []
    items = list(values)
    if len(items) > MAX_MAGNIFICATIONS:
        raise ValueError(
            f"{len(items)} magnifications given, at most {MAX_MAGNIFICATIONS} (a short list "
            "such as [4, 25, 100])"
        )
    for i, raw in enumerate(items, start=1):
        if isinstance(raw, bool) or not isinstance(raw, int | float | np.number):
            raise ValueError(f"magnification {i}: expected a number such as 25, got {raw!r}")
        mu = float(raw)
        if not math.isfinite(mu):
            raise ValueError(f"magnification {i}: must be finite, got {mu}")
        if mu <= 1:
            raise ValueError(
                f"magnification {i}: {mu:g} is not above 1 (a lens that magnifies the flux "
                "μ times has μ > 1; μ = 1 is no lens)"
            )
        if mu > MAX_MAGNIFICATION:
            raise ValueError(
                f"magnification {i}: {mu:g} is above {MAX_MAGNIFICATION:g}, beyond any "
                "magnification a lens gives a merger's signal"
            )
        if mu in found:
            raise ValueError(f"magnification {i}: {mu:g} is listed twice")
        found.append(mu)
    return tuple(sorted(found))


def true_distance(distance, magnification) -> u.Quantity:
    """The luminosity distance of a source whose signal a lens magnified μ times, in Mpc:
    √μ times the distance inferred without the lens (Wang, Stebbins & Turner 1996)."""
    d = require(distance, "length", "distance")
    mu = dimensionless(magnification, "magnification")
    if np.any(~np.isfinite(mu) | (mu <= 0)):
        raise ValueError(f"magnification: expected a positive finite number, got {mu}")
    return (np.sqrt(mu) * d * u.m).to(u.Mpc)


def lensed_source(distance, detector_masses, magnification: float, cosmology) -> LensedSource:
    """Distance, redshift and source-frame masses per sample if a lens magnified the signal μ
    times (docs/methods.md, lensing): ``d_true = √μ d``, ``z_true = z(d_true)`` in
    ``cosmology`` (an astropy Cosmology or a realisation name), ``m_det / (1 + z_true)``.

    ``detector_masses`` is a sequence of detector-frame mass samples (the bodies, the remnant),
    each broadcastable with ``distance``. A true distance beyond the redshift table
    (d_L(z = 1000)) raises ValueError naming the magnification.
    """
    mu = check_magnifications([magnification])[0]
    d_true = true_distance(distance, mu)
    try:
        z = redshift_at_distance(d_true, cosmology)
    except ValueError as exc:
        raise ValueError(f"magnification {mu:g}: the true {exc}") from None
    masses = tuple(to_source_frame(m, z) for m in detector_masses)
    return LensedSource(mu, d_true, np.asarray(z, dtype=float), masses)
