"""Remnant of a black-hole merger: remnant spin and radiated energy fits.

The functions live in :mod:`.remnant_spin` and :mod:`.radiated`; this module gathers them and the
method ids ``derive`` records. Results are dimensionless; remnant mass = M (1 - E_rad).
"""

from __future__ import annotations

from .radiated import BMR12_ERAD, JF17_ERAD, radiated_fraction_bmr12, radiated_fraction_jf17
from .remnant_spin import (
    BR09_SPIN,
    HBR16_GENERIC_RMS,
    HBR16_GENERIC_SPIN,
    HBR16_SPIN,
    JF17_SPIN,
    remnant_spin_br09,
    remnant_spin_hbr16,
    remnant_spin_hbr16_generic,
    remnant_spin_jf17,
)

REMNANT_SPIN_METHODS = (JF17_SPIN, HBR16_SPIN)
#: For precessing spins: the generic HBR16 form alone (JF17 is for aligned spins only).
PRECESSING_SPIN_METHODS = (HBR16_GENERIC_SPIN,)
CROSS_CHECK_SPIN_METHOD = BR09_SPIN
RADIATED_METHODS = (JF17_ERAD, BMR12_ERAD)

__all__ = [
    "BMR12_ERAD",
    "BR09_SPIN",
    "CROSS_CHECK_SPIN_METHOD",
    "HBR16_GENERIC_RMS",
    "HBR16_GENERIC_SPIN",
    "HBR16_SPIN",
    "JF17_ERAD",
    "JF17_SPIN",
    "PRECESSING_SPIN_METHODS",
    "RADIATED_METHODS",
    "REMNANT_SPIN_METHODS",
    "radiated_fraction_bmr12",
    "radiated_fraction_jf17",
    "remnant_spin_br09",
    "remnant_spin_hbr16",
    "remnant_spin_hbr16_generic",
    "remnant_spin_jf17",
]
