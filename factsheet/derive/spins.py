"""The bodies' spins per sample: aligned components, in-plane magnitudes and their angles.

The input gives each body's spin as its aligned component, as a magnitude with a tilt, or only
through the effective spin; a precession spin may add in-plane spin. Per sample this module
makes what the fits take: the aligned components ``chi_iz``, the in-plane magnitudes
``a_i sin(tilt_i)`` and the two angles no summary holds — the angle between the in-plane spins
and the phase of their difference at merger — drawn uniformly (common practice). A precession
spin alone is carried by the heavier body (the single-spin mapping it was built for), capped
where the aligned spin leaves less room than it asks. It also draws, for inputs without
in-plane spin, in-plane spins from their prior range (uniform up to what the aligned components
allow) to say how much they could change the results.
"""

from __future__ import annotations

from typing import NamedTuple

import astropy.units as u
import numpy as np

from factsheet.derive.sampling import BODY_SPINS, SPIN_VECTORS
from factsheet.physics import precession

#: Separate random stream for the angles, so adding them moves none of the other draws.
ANGLE_STREAM = 14


class SpinSamples(NamedTuple):
    """Per-sample spins of the two bodies, heavier first."""

    aligned: tuple[np.ndarray, np.ndarray]
    in_plane: tuple[np.ndarray, np.ndarray] | None  # None: the input says nothing in-plane
    azimuth_difference: np.ndarray  # angle between the in-plane spins, radians
    phase: np.ndarray  # angle of their difference at merger, radians
    prior_in_plane: tuple[np.ndarray, np.ndarray]  # drawn in-plane spins when none were given
    capped: np.ndarray | None = None  # 1 where the precession spin was capped to fit, else 0


def spin_samples(values: dict[str, np.ndarray], size: int, seed: int) -> SpinSamples:
    """The spins of every sample from the input's values by path (canonical units)."""
    rng = np.random.default_rng([seed, ANGLE_STREAM])
    azimuth, phase = rng.uniform(0.0, 2 * np.pi, (2, size))
    fractions = rng.uniform(0.0, 1.0, (2, size))
    aligned, in_plane = _components(values, size)
    capped = None
    if "precession_spin" in values:
        chi_p = values["precession_spin"]
        room = np.sqrt(np.maximum(0.0, 1 - aligned[0] ** 2))
        capped = (chi_p > room).astype(float)
        in_plane = (np.minimum(chi_p, room), np.zeros(size))
    prior = tuple(
        f * np.sqrt(np.maximum(0.0, 1 - a * a)) for f, a in zip(fractions, aligned, strict=True)
    )
    return SpinSamples(aligned, in_plane, azimuth, phase, (prior[0], prior[1]), capped)


def _components(values, size):
    """Aligned components and, when tilts are given, in-plane magnitudes of both bodies."""
    zero = np.zeros(size)
    if any(path in values for path in SPIN_VECTORS):
        aligned, in_plane = [], []
        for body, spin in zip(("heavier", "lighter"), BODY_SPINS, strict=True):
            if f"{body}.spin_magnitude" in values:
                z, perp = precession.spin_components(
                    values[f"{body}.spin_magnitude"], values[f"{body}.tilt"] * u.deg
                )
            else:
                z, perp = values.get(spin, zero), zero
            aligned.append(z)
            in_plane.append(perp)
        return (aligned[0], aligned[1]), (in_plane[0], in_plane[1])
    spins = [values.get(path) for path in BODY_SPINS]
    if "effective_spin" in values and all(x is None for x in spins):
        spins = [values["effective_spin"]] * 2
    chi1, chi2 = (zero if x is None else x for x in spins)
    return (chi1, chi2), None
