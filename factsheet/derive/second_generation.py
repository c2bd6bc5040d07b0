"""Could a body in the pair-instability gap be the remnant of an earlier merger? A reasoning
aid with a caveat, not a verdict (:mod:`factsheet.physics.second_generation` draws the
first-generation remnants and states the assumptions).

The remnant's spin direction is taken as isotropic relative to the orbit of its next merger (a
dynamical encounter), so its component along that orbit is the magnitude times a uniform
cosine. The comparison reports the second-generation mass and spin ranges and the share of the
body's samples inside them.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet.derive.summaries import summarise
from factsheet.model import Reference, SecondGeneration
from factsheet.physics.second_generation import first_generation_remnants

SUBJECTS = {"heavier": "heavier_mass", "lighter": "lighter_mass"}
SPINS = {"heavier": "heavier_spin", "lighter": "lighter_spin"}


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
        second_mass = summarise(masses * u.Msun, level)
        second_along = summarise(along * u.one, level)
        body = s[SUBJECTS[subject]].to_value(u.Msun)
        inside_mass = float(np.mean((body >= second_mass.low) & (body <= second_mass.high)))
        inside_spin = None
        if subject in spins_given:
            chi = s[SPINS[subject]].value
            inside_spin = float(np.mean((chi >= second_along.low) & (chi <= second_along.high)))
        found.append(
            SecondGeneration(
                subject,
                second_mass,
                summarise(spins * u.one, level),
                second_along,
                inside_mass,
                inside_spin,
            )
        )
    return tuple(found)
