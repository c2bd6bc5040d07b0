"""Remnants of first-generation black-hole mergers, for comparing a body in the
pair-instability gap with the picture of an earlier merger (a reasoning aid).

Stars are not expected to leave black holes inside the pair-instability gap, but the remnant of
an earlier merger can lie there, spinning at about 0.7 (Gerosa & Berti 2017, PRD 95, 124046;
Fishbach, Holz & Farr 2017, ApJL 840, L24). First-generation pairs are drawn under stated
assumptions — both masses uniform between :data:`MIN_MASS` and the gap's lower edge, spins of
magnitude uniform in 0–:data:`MAX_NATAL_SPIN` with isotropic directions, of which the
aligned-spin fits use the component along the orbit — and run through the remnant fits of
:mod:`.remnant`. The numbers of the assumptions are common practice, not measurements.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from . import remnant
from .registry import Method, register

MIN_MASS = 5.0  # M⊙: the lightest black holes stars are thought to leave (common practice)
MAX_NATAL_SPIN = 0.2  # small spins of black holes born from stars (common practice)
PAIRS = 4000

METHOD = register(
    Method(
        id="second-generation-comparison",
        title="Could a body come from an earlier merger? (a reasoning aid)",
        citation="Gerosa D., Berti E., 2017, Phys. Rev. D 95, 124046; Fishbach M., Holz D. E., "
        "Farr W. M., 2017, ApJL 840, L24",
        arxiv="1703.06223",
        formula="first-generation pairs: m₁, m₂ uniform in 5 M⊙ to the gap's lower edge, spin "
        "magnitudes uniform in 0–0.2 with isotropic directions; their remnants from the sheet's "
        "fits; the remnant spin's component along a next orbit = χ_f cos θ, cos θ uniform",
        validity="bodies more likely than not in or above the pair-instability gap; the "
        "first-generation assumptions are common practice, not measurements",
        accuracy="a comparison, not a probability that the body is a merger remnant",
        quantities=("second_generation",),
        provenance="the 5 M⊙ floor and the 0.2 natal-spin bound are common practice; the "
        "arXiv id is recalled from memory",
    )
).id


def first_generation_remnants(
    gap_edge: float, rng: np.random.Generator, n: int = PAIRS
) -> tuple[np.ndarray, np.ndarray]:
    """Masses (M⊙) and spin magnitudes of the remnants of ``n`` first-generation pairs."""
    masses = rng.uniform(MIN_MASS, gap_edge, (2, n))
    m1, m2 = masses.max(axis=0) * u.Msun, masses.min(axis=0) * u.Msun
    magnitude = rng.uniform(0, MAX_NATAL_SPIN, (2, n))
    aligned = magnitude * rng.uniform(-1, 1, (2, n))  # isotropic: the cosine is uniform
    c1, c2 = aligned
    spin = remnant.remnant_spin_jf17(m1, m2, c1, c2) + remnant.remnant_spin_hbr16(m1, m2, c1, c2)
    erad = remnant.radiated_fraction_jf17(m1, m2, c1, c2)
    erad = (erad + remnant.radiated_fraction_bmr12(m1, m2, c1, c2)) / 2
    return ((m1 + m2) * (1 - erad)).to_value(u.Msun), np.abs(spin / 2)
