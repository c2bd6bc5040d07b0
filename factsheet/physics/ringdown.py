"""Ringdown of the remnant: the Kerr l = m = 2, n = 0 quasinormal mode.

Preferred: exact values from Leaver's continued fractions (Leaver 1985), tabulated once in
:mod:`._qnm_table` and interpolated. Cross-check and fallback: the Berti, Cardoso & Will 2006 fit.
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
        title="Kerr quasinormal mode (2,2,0), exact, Leaver continued fractions",
        citation="Leaver E. W., 1985, Proc. R. Soc. Lond. A 402, 285",
        formula="M ω solved from Leaver's angular and radial three-term recurrences (s = −2), "
        "tabulated once on j = 1 − u² (u uniform) and interpolated; f = Re(ω)/(2π), "
        "τ = 1/|Im(ω)|, ω scaled by G M_{f}/c³",
        validity="remnant spin 0 to 0.9999 (table range); a negative aligned spin is used as |j|",
        accuracy="interpolation better than 10^{−6} (relative); exact for an isolated Kerr "
        "black hole",
        quantities=("ringdown_frequency", "ringdown_damping_time"),
        limits={"remnant_spin": (0.0, 0.9999)},
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


def _spin(remnant_spin) -> np.ndarray:
    return np.abs(dimensionless(remnant_spin, "remnant_spin"))


def qnm_220(remnant_mass, remnant_spin) -> tuple[u.Quantity, u.Quantity]:
    """Kerr 220 mode (frequency [Hz], damping time [s]), exact (Leaver 1985), from a table.

    The mass sets the frame: a source-frame mass gives source-frame values. A negative aligned
    remnant spin is taken as |j| (the l = m mode is then counter-rotating with respect to the hole).
    Spins beyond the table (|j| > 0.9999) give NaN; the registry's limits flag them.
    """
    t_m = _mass_time(remnant_mass)
    j = _spin(remnant_spin)
    uu = np.sqrt(np.clip(1 - j, 0, None))
    inside = (j <= 1 - _qnm_table.U_LAST**2) & np.isfinite(j)
    args = (_qnm_table.U_FIRST, _qnm_table.U_LAST, np.where(inside, uu, 1.0))
    w_re = np.where(inside, interpolate_uniform(_qnm_table.REAL, *args), np.nan)
    w_im = np.where(inside, interpolate_uniform(_qnm_table.IMAG, *args), np.nan)
    frequency = w_re / (2 * np.pi * t_m) * u.Hz
    return frequency, t_m / np.abs(w_im) * u.s


def qnm_220_bcw06(remnant_mass, remnant_spin) -> tuple[u.Quantity, u.Quantity]:
    """Kerr 220 mode (frequency [Hz], damping time [s]) from the Berti-Cardoso-Will 2006 fit.

    A negative aligned remnant spin is taken as |j|.
    """
    t_m = _mass_time(remnant_mass)
    j = _spin(remnant_spin)
    big_f = 1.5251 - 1.1568 * (1 - j) ** 0.1292
    quality = 0.7000 + 1.4187 * (1 - j) ** -0.4990
    return big_f / (2 * np.pi * t_m) * u.Hz, 2 * quality * t_m / big_f * u.s
