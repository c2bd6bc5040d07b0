"""The masses of a draw from the chirp mass and the mass ratio, when the estimate gives them.

A summary usually measures the chirp mass far more narrowly than either mass: drawing the two
masses independently would widen it several times. When the estimate gives ``chirp_mass``, the
draws keep it: the chirp mass is drawn from its own interval and the mass ratio from its own
(``mass_ratio``), from the ratio of the given masses, or from an assumed range, and each
sample's masses follow by inverting the definitions (Cutler & Flanagan 1994, PRD 49, 2658):

    Mc = (m1 m2)^(3/5) / (m1 + m2)^(1/5),  q = m2 / m1 <= 1
    m1 = Mc (1 + q)^(1/5) q^(-3/5),        m2 = q m1

Everything is in the event's frame (the chirp mass follows ``frame`` like the masses).
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np

from factsheet.model import Estimate, Event, Interval

#: The mass ratio assumed when the estimate gives neither it nor the masses: uniform between
#: these. An assumption of this project, stated on the sheet, not a measurement.
ASSUMED_MASS_RATIO = (0.1, 1.0)

#: How the mass ratio of the draws is found, by :func:`mass_ratio_source`.
GIVEN, FROM_MASSES, ASSUMED = "given", "from-masses", "assumed"

Draw = Callable[[str, Interval], np.ndarray]


def masses_from_chirp_mass(
    chirp_mass: np.ndarray, ratio: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    """The heavier and lighter masses of a chirp mass and a mass ratio q = m2/m1 <= 1, in the
    chirp mass's unit (inverse of Cutler & Flanagan 1994's definition, see the module)."""
    heavier = chirp_mass * (1 + ratio) ** 0.2 * ratio**-0.6
    return heavier, ratio * heavier


def through_chirp_mass(estimate: Estimate) -> bool:
    """Whether the masses of the draws come from the chirp mass."""
    return estimate.chirp_mass is not None


def mass_ratio_source(estimate: Estimate) -> str:
    """Where the mass ratio of the draws comes from: the estimate's ``mass_ratio``, the ratio of
    its two masses, or the assumed range :data:`ASSUMED_MASS_RATIO`."""
    if estimate.mass_ratio is not None:
        return GIVEN
    if estimate.heavier.mass is not None and estimate.lighter.mass is not None:
        return FROM_MASSES
    return ASSUMED


def draw_masses(
    estimate: Estimate, n: int, draw: Draw, rng: np.random.Generator
) -> dict[str, np.ndarray]:
    """The masses, chirp mass and mass ratio of ``n`` draws through the chirp mass, by path.

    ``draw(path, value)`` draws one summary value inside its range. With the masses but no mass
    ratio, each draw takes the ratio of the two masses drawn independently (the lighter over
    the heavier), so the pair keeps the given chirp mass and the masses' ratio."""
    assert estimate.chirp_mass is not None
    chirp = draw("chirp_mass", estimate.chirp_mass)
    source = mass_ratio_source(estimate)
    if source == GIVEN:
        assert estimate.mass_ratio is not None
        ratio = draw("mass_ratio", estimate.mass_ratio)
    elif source == FROM_MASSES:
        assert estimate.heavier.mass is not None and estimate.lighter.mass is not None
        a, b = (
            draw("heavier.mass", estimate.heavier.mass),
            draw("lighter.mass", estimate.lighter.mass),
        )
        ratio = np.minimum(a, b) / np.maximum(a, b)
    else:
        ratio = rng.uniform(*ASSUMED_MASS_RATIO, n)
    heavier, lighter = masses_from_chirp_mass(chirp, ratio)
    return {
        "heavier.mass": heavier,
        "lighter.mass": lighter,
        "chirp_mass": chirp,
        "mass_ratio": ratio,
    }


def kept_by_samples_file(event: Event) -> set[str]:
    """The mass values a samples file stands for: its masses fix the chirp mass and the ratio,
    so the summary's are not drawn beside them."""
    if event.samples is None:
        return set()
    return {"chirp_mass", "mass_ratio"}
