"""Recoil ("kick") of the remnant of a non-precessing black-hole merger, in km/s.

Mass-asymmetry term of González et al. 2007 and spin term of Lousto & Zlochower 2008, combined as
in Campanelli, Lousto, Zlochower & Merritt 2007. These papers label the smaller body "1"; here
the first body is the heavier one, so the labels are converted at the boundary.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from ._checks import AlignedBinary, aligned_binary, dimensionless, require
from .precession import in_plane_difference
from .registry import Method, register

METHOD = register(
    Method(
        id="gonzalez-2007-lousto-zlochower-2008-kick",
        title="Recoil velocity, non-precessing spins",
        citation="González J. A., Sperhake U., Brügmann B., Hannam M., Husa S., 2007, Phys. Rev. "
        "Lett. 98, 091101 (mass term); Lousto C. O., Zlochower Y., 2008, Phys. Rev. D 77, "
        "044028 (spin term); form of Campanelli M., Lousto C. O., Zlochower Y., Merritt D., "
        "2007, ApJ Letters 659, L5",
        arxiv="gr-qc/0610154",
        formula="v_{m} = A η² (1 − q)/(1 + q) (1 + B η), v_{⊥} = H η²/(1 + q) (χ_{big} − "
        "q χ_{small}), |v| = |v_{m} + v_{⊥} e^{iξ}|; A = 1.2 × 10⁴ km/s, B = −0.93, "
        "H = 6.9 × 10³ km/s, ξ = 145°",
        validity="mass ratio 0.25 to 1 (mass term); spins aligned with the orbit",
        accuracy="mass term within 6 %; largest non-spinning kick 175.2 ± 11 km/s",
        quantities=("kick_velocity",),
        limits={
            "mass_ratio": (0.25, 1.0),
            "heavier_spin": (-1.0, 1.0),
            "lighter_spin": (-1.0, 1.0),
        },
    )
).id

SUPERKICK_METHOD = register(
    Method(
        id="lousto-2012-superkick",
        title="Recoil velocity, in-plane spins (out-of-plane term)",
        citation="Lousto C. O., Zlochower Y., Dotti M., Volonteri M., 2012, Phys. Rev. D 85, "
        "084015; form of Campanelli M., Lousto C. O., Zlochower Y., Merritt D., 2007, "
        "ApJ Letters 659, L5",
        arxiv="1201.1923",
        formula="v_{∥} = 16 η²/(1 + q) [V₁₁ + V_{A} S̃ + V_{B} S̃² + V_{C} S̃³] |χ⃗_{big,⊥} − "
        "q χ⃗_{small,⊥}| cos φ, S̃ = 2 (χ_{big} + q² χ_{small})/(1 + q)², |v| = "
        "√(|v_{m} + v_{⊥} e^{iξ}|² + v_{∥}²); V₁₁ = 3677.76, V_{A} = 2481.21, V_{B} = 1792.45, "
        "V_{C} = 1506.52 km/s; the unknown phase φ at merger is drawn uniformly",
        validity="in-plane spins of either body; mass ratio 0.25 to 1 for the mass term",
        accuracy="not stated here; the phase at merger is unknown and dominates the spread",
        quantities=("kick_velocity",),
        limits={
            "mass_ratio": (0.25, 1.0),
            "heavier_spin": (-1.0, 1.0),
            "lighter_spin": (-1.0, 1.0),
        },
        provenance="coefficients recalled from memory of the paper's fit",
    )
).id

_A = 1.2e4 * u.km / u.s
_B = -0.93
_H = 6.9e3 * u.km / u.s
_XI = 145 * u.deg


#: Lousto, Zlochower, Dotti & Volonteri 2012 coefficients of the out-of-plane term, km/s.
_V11, _VA, _VB, _VC = 3677.76, 2481.21, 1792.45, 1506.52


def kick_velocity(m1, m2, chi1z, chi2z) -> u.Quantity:
    """Recoil speed in km/s (González et al. 2007 + Lousto & Zlochower 2008), aligned spins."""
    return _in_plane_kick(aligned_binary(m1, m2, chi1z, chi2z), 0.0) * (u.km / u.s)


def kick_velocity_precessing(
    m1, m2, chi1z, chi2z, in_plane1, in_plane2, azimuth_difference, phase
) -> u.Quantity:
    """Recoil speed in km/s with in-plane spins: the aligned-spin terms of
    :func:`kick_velocity` and the out-of-plane term of Lousto et al. 2012 (PRD 85, 084015).

    ``in_plane_i`` are the in-plane spin magnitudes, ``azimuth_difference`` the angle between
    the in-plane spins and ``phase`` the angle of their difference at merger (radians); the
    bodies in either order, spins following. No in-plane spin gives :func:`kick_velocity`."""
    x = dimensionless(in_plane1, "in_plane1")
    y = dimensionless(in_plane2, "in_plane2")
    swap = require(m2, "mass", "m2") > require(m1, "mass", "m1")
    big, small = np.where(swap, y, x), np.where(swap, x, y)
    b = aligned_binary(m1, m2, chi1z, chi2z)
    dphi = dimensionless(azimuth_difference, "azimuth_difference")
    # papers' alpha_2 (larger body) is our body 1: |alpha2_perp - q alpha1_perp|
    difference = in_plane_difference(big, small, b.q, dphi)
    s_par = 2 * (b.chi1 + b.q**2 * b.chi2) / (1 + b.q) ** 2
    scale = _V11 + _VA * s_par + _VB * s_par**2 + _VC * s_par**3
    v_par = 16 * b.eta**2 / (1 + b.q) * scale * difference * np.cos(phase)
    return _in_plane_kick(b, v_par) * (u.km / u.s)


def _in_plane_kick(b: AlignedBinary, v_par) -> np.ndarray:
    q, eta = b.q, b.eta  # q = m_small/m_big, the papers' q
    v_m = _A.to_value(u.km / u.s) * eta**2 * (1 - q) / (1 + q) * (1 + _B * eta)
    # papers' alpha_2 (larger body) is our chi1, their alpha_1 (smaller body) our chi2
    v_perp = _H.to_value(u.km / u.s) * eta**2 / (1 + q) * (b.chi1 - q * b.chi2)
    xi = _XI.to_value(u.rad)
    in_plane = np.hypot(v_m + v_perp * np.cos(xi), v_perp * np.sin(xi))
    return np.hypot(in_plane, v_par)
