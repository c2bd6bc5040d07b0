"""Ringdown of the remnant: the dominant Kerr l = |m| = 2, n = 0 quasinormal mode.

The remnant spin is signed along the orbital angular momentum. Spinning with the orbit (j >= 0)
the dominant mode is the co-rotating l = m = 2 one; spinning against it (j < 0) the orbit's
m = 2 pattern turns against the hole, so the dominant mode is the counter-rotating one of a hole
of spin |j| (lower frequency, slightly faster damping). Both branches are exact values from
Leaver's continued fractions (Leaver 1985), tabulated once in :mod:`._qnm_table` and
interpolated. Cross-check: the Berti, Cardoso & Will 2006 fit of the co-rotating branch.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np
from astropy.constants import GM_sun, c

from . import _qnm_table
from ._checks import dimensionless, require
from ._interpolate import interpolate_uniform
from .registry import Method, register

LEAVER = register(
    Method(
        id="leaver-1985-kerr-qnm-220",
        title="Kerr quasinormal mode ℓ = 2, n = 0, co- or counter-rotating, exact, Leaver "
        "continued fractions",
        citation="Leaver E. W., 1985, Proc. R. Soc. Lond. A 402, 285",
        formula="M ω solved from Leaver's angular and radial three-term recurrences (s = −2) for "
        "both branches, tabulated once on |χ_{f}| = 1 − u² (u uniform) and interpolated: the "
        "co-rotating mode (m = 2) when the remnant spins with the orbit (χ_{f} ≥ 0), the "
        "counter-rotating mode (m = −2) of a hole of spin |χ_{f}| when it spins against it "
        "(χ_{f} < 0); f = Re(ω)/(2π), τ = 1/|Im(ω)|, ω scaled by G M_{f}/c³",
        validity="remnant spin −0.9999 to 0.9999 (table range), both signs",
        accuracy="interpolation better than 10^{−6} (relative); exact for an isolated Kerr "
        "black hole",
        quantities=("ringdown_frequency", "ringdown_damping_time"),
        limits={"remnant_spin": (-0.9999, 0.9999)},
    )
)
BCW06 = register(
    Method(
        id="berti-cardoso-will-2006-qnm-fit",
        title="Kerr quasinormal mode (2,2,0), fit of Berti, Cardoso & Will",
        citation="Berti E., Cardoso V., Will C. M., 2006, Phys. Rev. D 73, 064030",
        arxiv="gr-qc/0512160",
        formula="M ω_{R} = 1.5251 − 1.1568 (1 − j)^{0.1292}; Q = 0.7 + 1.4187 (1 − j)^{−0.4990}; "
        "τ = 2Q/ω_{R}",
        validity="remnant spin 0 to 0.99",
        accuracy="within 2 % in frequency and 1 % in quality factor of the exact values",
        quantities=("ringdown_frequency", "ringdown_damping_time"),
        limits={"remnant_spin": (0.0, 0.99)},
    )
)
METHOD = LEAVER.id
FALLBACK_METHOD = BCW06.id


def _mass_time(remnant_mass) -> np.ndarray:
    """G M_f / c^3 in seconds, from GM_sun (IAU 2015 B3)."""
    m = require(remnant_mass, "mass", "remnant_mass")
    return m * (GM_sun / c**3).to_value(u.s)


def _table_mode(j: np.ndarray) -> np.ndarray:
    """Interpolated M omega at signed spins j: co-rotating for j >= 0, counter-rotating below."""
    size = np.abs(j)
    inside = (size <= 1 - _qnm_table.U_LAST**2) & np.isfinite(j)
    uu = np.where(inside, np.sqrt(np.clip(1 - size, 0, None)), 1.0)
    grid = (_qnm_table.U_FIRST, _qnm_table.U_LAST, uu)
    counter = j < 0
    w_re = np.where(
        counter,
        interpolate_uniform(_qnm_table.COUNTER_REAL, *grid),
        interpolate_uniform(_qnm_table.REAL, *grid),
    )
    w_im = np.where(
        counter,
        interpolate_uniform(_qnm_table.COUNTER_IMAG, *grid),
        interpolate_uniform(_qnm_table.IMAG, *grid),
    )
    return np.where(inside, w_re + 1j * w_im, complex(np.nan, np.nan))


def qnm_220(remnant_mass, remnant_spin) -> tuple[u.Quantity, u.Quantity]:
    """Dominant l = 2, n = 0 Kerr mode (frequency [Hz], damping time [s]), exact, from a table.

    Leaver 1985 (Proc. R. Soc. A 402, 285), both branches tabulated by ``tools/make_qnm_table.py``.
    ``remnant_spin`` is signed along the orbital angular momentum: j >= 0 gives the co-rotating
    l = m = 2 mode, j < 0 the counter-rotating mode of a hole of spin |j| (the two meet at j = 0).
    The mass sets the frame: a source-frame mass gives source-frame values. Spins beyond the table
    (|j| > 0.9999) give NaN; the registry's limits flag them.
    """
    t_m = _mass_time(remnant_mass)
    omega = _table_mode(dimensionless(remnant_spin, "remnant_spin"))
    frequency = omega.real / (2 * np.pi * t_m) * u.Hz
    return frequency, t_m / np.abs(omega.imag) * u.s


def qnm_220_bcw06(remnant_mass, remnant_spin) -> tuple[u.Quantity, u.Quantity]:
    """Co-rotating Kerr 220 mode (frequency [Hz], damping time [s]), Berti-Cardoso-Will 2006 fit.

    The fit covers the co-rotating branch only (PRD 73, 064030, j from 0 to 0.99): a negative
    remnant spin, whose dominant mode is the counter-rotating one, gives NaN.
    """
    t_m = _mass_time(remnant_mass)
    j = dimensionless(remnant_spin, "remnant_spin")
    j = np.where(j >= 0, j, np.nan)
    big_f = 1.5251 - 1.1568 * (1 - j) ** 0.1292
    quality = 0.7000 + 1.4187 * (1 - j) ** -0.4990
    return big_f / (2 * np.pi * t_m) * u.Hz, 2 * quality * t_m / big_f * u.s
