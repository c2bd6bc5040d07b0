"""What turns numbers into a sheet a reader can act on: class, mass bands, disruption,
counterpart windows and comparisons, each with the caveats it calls for."""

from __future__ import annotations

from dataclasses import dataclass

import astropy.units as u

from factsheet.caveats import Caveat
from factsheet.model import Event
from factsheet.physics import bands, comparisons, counterparts, disruption
from factsheet.reference import Reference

EDGE_NAMES = {
    "neutron_star_max": "the maximum neutron-star mass",
    "lower_gap_top": "the top of the lower mass gap",
    "pair_instability_lower": "the lower edge of the pair-instability gap",
    "pair_instability_upper": "the upper edge of the pair-instability gap",
}


@dataclass(frozen=True)
class Classification:
    source_class: str
    probabilities: dict[str, float]
    disruption_probability: float | None  # NSBH only
    remnant_baryon_mass: u.Quantity | None  # samples, NSBH only
    ns_radius: u.Quantity | None = None  # the assumed radius, NSBH only


def classify(s: dict[str, u.Quantity], ref: Reference, ns_radius: u.Quantity) -> Classification:
    """Source class from the masses and the neutron-star bound; disruption for NSBH."""
    ns_max = ref.mass_bands.neutron_star_max.value
    probs = bands.source_class_probabilities(s["mass_1"], s["mass_2"], ns_max)
    label = bands.source_class(s["mass_1"], s["mass_2"], ns_max)
    if label != "NSBH":
        return Classification(label, probs, None, None)
    rem = disruption.remnant_baryon_mass(s["mass_1"], s["mass_2"], s["spin_1z"].value, ns_radius)
    return Classification(label, probs, disruption.disruption_probability(rem), rem, ns_radius)


def mass_bands(s: dict[str, u.Quantity], ref: Reference) -> tuple[dict, list[Caveat]]:
    """Band probabilities of each component and the remnant, with straddle caveats."""
    edges = ref.mass_bands.quantities()
    result, notes = {}, []
    for name in ("mass_1", "mass_2", "final_mass"):
        if name not in s:
            continue
        probs = bands.band_probabilities(s[name], edges, remnant=name == "final_mass")
        result[name] = probs
        for edge in bands.straddles(probs):
            notes.append(
                Caveat(
                    "band-straddles-edge",
                    "notice",
                    f"The {_NAMES[name]} straddles {EDGE_NAMES[edge]} "
                    f"({edges[edge].to_value(u.Msun):g} M⊙); that edge is itself "
                    "uncertain in the literature, so the band labels are soft.",
                )
            )
    return result, notes


_NAMES = {"mass_1": "primary mass", "mass_2": "secondary mass", "final_mass": "remnant mass"}


def remnant_allowed(c: Classification) -> tuple[bool, Caveat | None]:
    """Whether the black-hole remnant fits apply, and the caveat that says why not (or why)."""
    if c.source_class == "BNS":
        return False, Caveat(
            "neutron-star-remnant",
            "notice",
            "Both bodies are most likely "
            "neutron stars: the black-hole fits for the remnant, radiated "
            "energy, peak luminosity, kick and ringdown do not apply, so those "
            "numbers are not given.",
        )
    if c.source_class == "NSBH" and (c.disruption_probability or 0) >= 0.05:
        return False, Caveat(
            "neutron-star-disrupted",
            "notice",
            "The neutron star is likely "
            f"torn apart before it plunges (probability "
            f"{c.disruption_probability:.0%} by the Foucart, Hinderer & Nissanke "
            f"2018 fit, neutron-star radius {c.ns_radius.to_value(u.km):g} km assumed): "
            "black-hole remnant fits do not "
            "apply, so remnant numbers are not given.",
        )
    if c.source_class == "NSBH":
        return True, Caveat(
            "neutron-star-plunges",
            "info",
            "The neutron star most likely plunges whole into the black hole (probability of "
            f"disruption {c.disruption_probability:.0%} by the Foucart, Hinderer & Nissanke 2018 "
            f"fit, neutron-star radius {c.ns_radius.to_value(u.km):g} km assumed), so the "
            "black-hole remnant fits are a fair approximation (tidal effects neglected).",
        )
    return True, None


def windows(
    event: Event,
    z: float,
    c: Classification,
    kick_samples: u.Quantity | None,
    total_mass: float,
    ref: Reference,
    level: float,
) -> tuple[list, str, list[Caveat]]:
    """Counterpart windows in UTC, the reason when there are none, and their caveats."""
    disrupted = c.source_class == "BNS" or (c.disruption_probability or 0) >= 0.05
    if disrupted:
        found = counterparts.rest_frame_windows(event.time, z, ref.windows)
        return found, "", [_planning_caveat()]
    if event.host is not None and kick_samples is not None:
        host = event.host
        found = counterparts.agn_windows(
            event.time,
            z,
            host.smbh_mass,
            host.orbit_radius,
            total_mass * u.Msun,
            kick_samples,
            host.disk_aspect_ratio,
            level,
        )
        return found, "", [_planning_caveat()]
    empty, reason = counterparts.vacuum_windows()
    return empty, reason, []


def _planning_caveat() -> Caveat:
    return Caveat(
        "counterpart-windows-planning-aid",
        "info",
        "Counterpart windows are a "
        "planning aid built from typical time scales, not a prediction that "
        "anything will be seen.",
    )


def comparison_values(
    energy: u.Quantity | None, peak: u.Quantity | None, ref: Reference, energy_units: str
) -> dict:
    """Ratios of the median radiated energy and peak luminosity to the comparison objects."""
    out: dict = {}
    if energy is not None:
        out["energy"] = {
            k: float(v) for k, v in comparisons.energy_ratios(energy, ref.energies()).items()
        }
        out["sun_years"] = comparisons.emission_time(energy).to(u.yr)
        out["energy_value"] = comparisons.in_energy_units(energy, energy_units)
    if peak is not None:
        out["luminosity"] = {
            k: float(v) for k, v in comparisons.luminosity_ratios(peak, ref.luminosities()).items()
        }
        out["luminosity_value"] = comparisons.in_energy_units(peak, energy_units)
    return out


def methods_used(c: Classification, found_windows: list, compared: dict) -> tuple[str, ...]:
    """Ids of the registered methods behind the class, bands, disruption, windows, comparisons."""
    ids = [bands.SOURCE_CLASS, bands.MASS_BANDS]
    if c.disruption_probability is not None:
        ids += [disruption.REMNANT_MASS, disruption.BARYON_MASS]
    scenarios = {w.scenario for w in found_windows}
    if scenarios - {"agn_disk"}:
        ids.append(counterparts.REST_FRAME_WINDOW)
    if "agn_disk" in scenarios:
        ids.append(counterparts.AGN_DISK)
    if compared:
        ids.append(comparisons.COMPARISON)
    return tuple(ids)


def significance_caveats(
    event: Event, far_threshold: u.Quantity, sky_threshold: u.Quantity
) -> list[Caveat]:
    """Low significance and large sky area (thresholds are common practice, not a standard)."""
    notes = []
    far = event.false_alarm_rate
    if far is not None and far > far_threshold:
        per = (1 / far).to(u.yr).value
        notes.append(
            Caveat(
                "low-significance",
                "warning",
                f"The false-alarm rate is high "
                f"(one per {per:.2g} years of data): noise could produce a signal "
                "like this one, so treat it as marginal.",
            )
        )
    if event.sky_area is not None and event.sky_area > sky_threshold:
        notes.append(
            Caveat(
                "large-sky-area",
                "notice",
                f"The source is localised only to "
                f"{event.sky_area.to_value(u.deg**2):.0f} square degrees, a large "
                "area to search for a counterpart.",
            )
        )
    return notes
