"""Could a body in the pair-instability gap be the remnant of an earlier merger? A reasoning
aid with a caveat, not a verdict.

Stars are not expected to leave black holes inside the pair-instability gap, but the remnant of
an earlier merger can lie there, spinning at about 0.7 (Gerosa & Berti 2017, PRD 95, 124046;
Fishbach, Holz & Farr 2017, ApJL 840, L24). To compare a body with that picture, first-generation
pairs are drawn under stated assumptions and run through the sheet's own remnant fits:

* both masses uniform between :data:`MIN_MASS` and the lower edge of the pair-instability gap
  (the catalogue's mass bands), the heavier first;
* spins of magnitude uniform in 0–:data:`MAX_NATAL_SPIN` with isotropic directions, of which the
  aligned-spin fits use the component along the orbit;
* the remnant's spin direction isotropic relative to the orbit of its next merger, so its
  component along that orbit is the magnitude times a uniform cosine (a dynamical encounter).

Both numbers are common practice for such estimates, not measurements. The comparison reports
the second-generation mass and spin ranges and the share of the body's samples inside them.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet.derive.summaries import summarise
from factsheet.model import Reference, SecondGeneration
from factsheet.physics import remnant
from factsheet.physics.registry import Method, register

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
        provenance="the 5 M⊙ floor and the 0.2 natal-spin bound are common practice; the "
        "arXiv id is recalled from memory",
    )
).id
SUBJECTS = {"heavier": "heavier_mass", "lighter": "lighter_mass"}
SPINS = {"heavier": "heavier_spin", "lighter": "lighter_spin"}


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


def second_generation(
    s: dict[str, u.Quantity],
    bands: dict[str, dict[str, float]],
    ref: Reference,
    level: float,
    seed: int,
    spins_given: frozenset[str] = frozenset(),
) -> tuple[SecondGeneration, ...]:
    """The comparison for each body probably in or above the pair-instability gap;
    ``spins_given`` names the bodies whose spin the input gives (an assumed spin is not
    compared)."""
    edges = ref.mass_bands.quantities()
    gap_edge = edges["pair_instability_lower"].to_value(u.Msun)
    subjects = [
        subject
        for subject in SUBJECTS
        if bands.get(subject, {}).get("pair_instability_gap", 0)
        + bands.get(subject, {}).get("above_gap", 0)
        > 0.5
    ]
    if not subjects:
        return ()
    rng = np.random.default_rng(seed)
    masses, spins = first_generation_remnants(gap_edge, rng)
    along = spins * rng.uniform(-1, 1, spins.size)  # the component along the next orbit
    found = []
    for subject in subjects:
        mass_2g = summarise(masses * u.Msun, level)
        along_2g = summarise(along * u.one, level)
        body = s[SUBJECTS[subject]].to_value(u.Msun)
        inside_mass = float(np.mean((body >= mass_2g.low) & (body <= mass_2g.high)))
        inside_spin = None
        if subject in spins_given:
            chi = s[SPINS[subject]].value
            inside_spin = float(np.mean((chi >= along_2g.low) & (chi <= along_2g.high)))
        found.append(
            SecondGeneration(
                subject,
                mass_2g,
                summarise(spins * u.one, level),
                along_2g,
                inside_mass,
                inside_spin,
            )
        )
    return tuple(found)
