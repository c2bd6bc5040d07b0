"""What if the signal was magnified by a lens: the source at each magnification, per sample.

Which magnifications: the event's own ``what_if_lensed`` list when it gives one (``[]`` for
none); otherwise, when the heavier or the lighter body is probably (at least
:data:`PROBABLY`) in or above the pair-instability gap, the catalogue's ``what_if_lensed``
(4, 25 and 100 unless set). A retracted event gets no automatic panel. For each magnification
the true distance, redshift and source-frame masses of both bodies and the remnant are computed
on the same samples as every other number (:func:`factsheet.physics.lensing.lensed_source`)
and summarised, with the mass-band probabilities at those masses.
"""

from __future__ import annotations

from collections.abc import Mapping

import astropy.units as u

from factsheet.derive.caveats import general, listed
from factsheet.derive.summaries import summarise
from factsheet.i18n import Later, Plural, Text
from factsheet.model import SOURCE, Caveat, Event, LensedCase, Lensing, Reference, Settings
from factsheet.physics import bands, lensing

#: A body is "probably" in or above the gap when at least this fraction of its samples is.
PROBABLY = 0.5
#: The bands at or above the pair-instability gap's lower edge.
HEAVY_BANDS = ("pair_instability_gap", "above_gap")
SUBJECTS = ("heavier", "lighter", "remnant")
CAVEAT = "lensing-what-if"


def magnifications(
    event: Event, settings: Settings, mass_bands: Mapping[str, Mapping[str, float]]
) -> tuple[tuple[float, ...], str]:
    """The magnifications of the event's panel and why (``event`` or ``automatic``); none
    (and "") when it has no panel."""
    if event.what_if_lensed is not None:
        return event.what_if_lensed, "event" if event.what_if_lensed else ""
    if event.status == "retracted" or not settings.what_if_lensed:
        return (), ""
    if any(heavy(mass_bands.get(body, {})) >= PROBABLY for body in ("heavier", "lighter")):
        return settings.what_if_lensed, "automatic"
    return (), ""


def heavy(probabilities: Mapping[str, float]) -> float:
    """The probability of a mass in or above the pair-instability gap."""
    return sum(probabilities.get(band, 0.0) for band in HEAVY_BANDS)


def what_if_lensed(
    event: Event,
    settings: Settings,
    reference: Reference,
    s: Mapping[str, u.Quantity],
    mass_bands: Mapping[str, Mapping[str, float]],
) -> tuple[Lensing | None, list[Caveat]]:
    """The panel (None when the event has none) and its caveats: that the lens is hypothetical,
    and which magnifications put the source beyond the redshift table."""
    wanted, origin = magnifications(event, settings, mass_bands)
    if not wanted:
        return None, []
    level, edges = settings.credible_level, reference.mass_bands.quantities()
    z = s["redshift"].value
    detector = {
        "heavier": s["heavier_mass_detector"],
        "lighter": s["lighter_mass_detector"],
        **({"remnant": s["remnant_mass"] * (1 + z)} if "remnant_mass" in s else {}),
    }
    cases, beyond = [], []
    for mu in wanted:
        try:
            found = lensing.lensed_source(
                s["distance"], list(detector.values()), mu, settings.cosmology
            )
        except ValueError:
            beyond.append(mu)
            continue
        masses = dict(zip(detector, found.masses, strict=True))
        cases.append(_case(found, masses, level, edges))
    notes = [hypothetical_caveat(origin)]
    if beyond:
        notes.append(beyond_caveat(beyond))
    return Lensing(origin, tuple(cases), tuple(beyond)), notes


def _case(
    found: lensing.LensedSource,
    masses: dict[str, u.Quantity],
    level: float,
    edges: Mapping[str, u.Quantity],
) -> LensedCase:
    """The summaries of one magnification and the band probabilities of its masses."""
    method = (lensing.METHOD,)
    summary = {k: summarise(m, level, SOURCE, method) for k, m in masses.items()}
    return LensedCase(
        magnification=found.magnification,
        distance=summarise(found.distance, level, None, method),
        redshift=summarise(found.redshift * u.one, level, None, method),
        heavier_mass=summary["heavier"],
        lighter_mass=summary["lighter"],
        remnant_mass=summary.get("remnant"),
        mass_bands={k: bands.band_probabilities(m, edges) for k, m in masses.items()},
    )


def hypothetical_caveat(origin: str) -> Caveat:
    """The honest note: the panel assumes a lens that nobody has seen."""
    if origin == "automatic":
        text = Text(
            "The what-if-lensed numbers are shown because a body is probably in or above the "
            "pair-instability gap. They assume a magnification: no lens is known for this event "
            "unless the editors' own notes say so, and the sheet's other numbers assume there is "
            "none."
        )
    else:
        text = Text(
            "The what-if-lensed numbers are shown because the editors asked for it. They assume "
            "a magnification: no lens is known for this event unless the editors' own notes say "
            "so, and the sheet's other numbers assume there is none."
        )
    return Caveat(CAVEAT, "info", text)


def beyond_caveat(beyond: list[float]) -> Caveat:
    """Magnifications that put the source beyond the redshift table (z = 1000) are left out."""
    factors = tuple(Later(general, float(mu)) for mu in beyond)
    return Caveat(
        "lensing-beyond-table",
        "notice",
        # TRANSLATORS: English says "those magnifications" for one or more; choose by {n}.
        Plural(
            "Magnified {factors} times, the source would lie beyond redshift 1000, where the "
            "redshift table ends: those magnifications are left out.",
            "Magnified {factors} times, the source would lie beyond redshift 1000, where the "
            "redshift table ends: those magnifications are left out.",
            len(factors),
            factors=Later(listed, factors, "numbers"),
        ),
    )
