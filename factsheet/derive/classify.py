"""What kind of binary this was: source class, tidal disruption, mass bands, and whether the
black-hole remnant fits apply — each with the caveats it calls for."""

from __future__ import annotations

from dataclasses import dataclass

import astropy.units as u

from factsheet import labels
from factsheet.derive.caveats import general, listed, sentence_start, share
from factsheet.i18n import Later, Plural, Text
from factsheet.model import Caveat, Reference
from factsheet.physics import bands, disruption

#: The mass of each band subject, among the samples.
SUBJECT_MASSES = {"heavier": "heavier_mass", "lighter": "lighter_mass", "remnant": "remnant_mass"}

#: Each mass-band edge (the fields of the reference data's mass bands) inside a sentence, with
#: its article: "the" and its label in :data:`factsheet.labels.EDGES`, as one message, so that
#: another language can give the article the edge's gender.
EDGES_IN_SENTENCE = {
    "neutron_star_max": Text("the maximum neutron-star mass"),
    "lower_gap_top": Text("the top of the lower mass gap"),
    "pair_instability_lower": Text("the lower edge of the pair-instability gap"),
    "pair_instability_upper": Text("the upper edge of the pair-instability gap"),
    "intermediate_mass_min": Text("the lower bound of intermediate-mass black holes"),
}


@dataclass(frozen=True)
class Classification:
    source_class: str
    probabilities: dict[str, float]
    disruption_probability: float | None  # NSBH only
    remnant_baryon_mass: u.Quantity | None  # samples, NSBH only
    ns_radius: u.Quantity | None = None  # the assumed radius, NSBH only

    @property
    def disrupted(self) -> bool:
        """A neutron star is torn apart: both are neutron stars, or the star is likely disrupted."""
        return self.source_class == "BNS" or (self.disruption_probability or 0) >= 0.05


def classify(s: dict[str, u.Quantity], ref: Reference, ns_radius: u.Quantity) -> Classification:
    """Source class from the masses and the neutron-star bound; disruption for NSBH."""
    ns_max = ref.mass_bands.neutron_star_max.value
    m1, m2 = s["heavier_mass"], s["lighter_mass"]
    probs = bands.source_class_probabilities(m1, m2, ns_max)
    label = bands.source_class(m1, m2, ns_max)
    if label != "NSBH":
        return Classification(label, probs, None, None)
    rem = disruption.remnant_baryon_mass(m1, m2, s["heavier_spin"].value, ns_radius)
    return Classification(label, probs, disruption.disruption_probability(rem), rem, ns_radius)


def mass_bands(
    s: dict[str, u.Quantity], ref: Reference
) -> tuple[dict[str, dict[str, float]], dict[str, float], list[Caveat]]:
    """Band probabilities and the intermediate-mass probability of each subject (the two bodies
    and, when there is one, the remnant), with a caveat for each band edge a mass straddles."""
    edges = ref.mass_bands.quantities()
    found, intermediate, straddled = {}, {}, []
    for subject, key in SUBJECT_MASSES.items():
        if key not in s:
            continue
        probs = bands.band_probabilities(s[key], edges)
        found[subject] = probs
        intermediate[subject] = bands.intermediate_mass_probability(s[key], edges)
        straddled += [(key, edge) for edge in bands.straddles(probs)]
    return found, intermediate, _straddle_notes(straddled, edges)


def _straddle_notes(straddled: list[tuple[str, str]], edges: dict[str, u.Quantity]) -> list[Caveat]:
    """One caveat for every band edge a mass straddles, naming each mass and its edge."""
    if not straddled:
        return []
    parts = tuple(
        Text(
            "{mass} straddles {edge} ({value} M⊙)",
            mass=labels.QUANTITIES[key].in_prose,
            edge=EDGES_IN_SENTENCE[edge],
            value=Later(general, float(edges[edge].to_value(u.Msun))),
        )
        for key, edge in straddled
    )
    return [
        Caveat(
            "band-straddles-edge",
            "notice",
            Plural(
                "{straddles}: that edge is uncertain in the literature, so the band labels are "
                "soft.",
                "{straddles}: these edges are uncertain in the literature, so the band labels "
                "are soft.",
                len(parts),
                straddles=Later(sentence_start, Later(listed, parts, "clauses")),
            ),
            concerns=tuple(dict.fromkeys(key for key, _ in straddled)),
        )
    ]


def remnant_allowed(c: Classification) -> tuple[bool, Caveat | None]:
    """Whether the black-hole remnant fits apply, and the caveat that says why not (or why)."""
    if c.source_class == "BNS":
        return False, Caveat(
            "neutron-star-remnant",
            "notice",
            Text(
                "Both bodies are most likely neutron stars: the black-hole fits for the remnant, "
                "radiated energy, peak luminosity, kick and ringdown do not apply, so those "
                "numbers are not given."
            ),
        )
    if c.source_class == "NSBH" and c.disrupted:
        return False, Caveat(
            "neutron-star-disrupted",
            "notice",
            Text(
                "The neutron star is likely torn apart before it plunges (probability "
                "{probability} by the Foucart, Hinderer & Nissanke 2018 fit, neutron-star radius "
                "{radius} km assumed): black-hole remnant fits do not apply, so remnant numbers "
                "are not given.",
                probability=Later(share, c.disruption_probability),
                radius=Later(general, float(c.ns_radius.to_value(u.km))),
            ),
        )
    if c.source_class == "NSBH":
        return True, Caveat(
            "neutron-star-plunges",
            "info",
            Text(
                "The neutron star most likely plunges whole into the black hole (probability of "
                "disruption {probability} by the Foucart, Hinderer & Nissanke 2018 fit, "
                "neutron-star radius {radius} km assumed), so the black-hole remnant fits are a "
                "fair approximation (tidal effects neglected).",
                probability=Later(share, c.disruption_probability),
                radius=Later(general, float(c.ns_radius.to_value(u.km))),
            ),
        )
    return True, None
