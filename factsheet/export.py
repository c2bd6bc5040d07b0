"""Shape derived events for the outside world: the JSON contract and the page contexts.

``event_json`` follows DESIGN.md section 6 (a contract other tools read); the page contexts are
documented in DEVELOPERS.md.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import astropy.units as u

from factsheet.derive import Derived, Summary
from factsheet.formatting import format_value
from factsheet.model import Event

# Quantities shown on a sheet, in order: key -> (label, group). Keys absent for an event
# (for example remnant numbers of a neutron-star pair) are skipped.
QUANTITY_LABELS: dict[str, tuple[str, str]] = {
    "mass_1": ("Primary mass m₁", "measured"),
    "mass_2": ("Secondary mass m₂", "measured"),
    "luminosity_distance": ("Luminosity distance", "measured"),
    "chi_eff": ("Effective spin χ_eff", "measured"),
    "spin_1z": ("Aligned spin of body 1", "measured"),
    "spin_2z": ("Aligned spin of body 2", "measured"),
    "redshift": ("Redshift z", "derived"),
    "total_mass": ("Total mass", "derived"),
    "chirp_mass": ("Chirp mass", "derived"),
    "mass_ratio": ("Mass ratio q = m₂/m₁", "derived"),
    "mass_1_detector": ("Primary mass (detector frame)", "derived"),
    "mass_2_detector": ("Secondary mass (detector frame)", "derived"),
    "chirp_mass_detector": ("Chirp mass (detector frame)", "derived"),
    "final_mass": ("Remnant mass", "remnant"),
    "final_spin": ("Remnant spin", "remnant"),
    "radiated_mass": ("Mass-energy radiated", "remnant"),
    "radiated_energy": ("Energy radiated", "remnant"),
    "peak_luminosity": ("Peak luminosity", "remnant"),
    "kick_velocity": ("Recoil kick", "remnant"),
    "ringdown_frequency": ("Ringdown frequency (observed)", "signal"),
    "ringdown_damping_time": ("Ringdown damping time (observed)", "signal"),
    "isco_frequency": ("ISCO frequency, end of inspiral (observed)", "signal"),
    "time_in_band": ("Time in band (leading order)", "signal"),
    "cycles_in_band": ("Cycles in band (leading order)", "signal"),
    "strain_amplitude": ("Peak strain, optimally oriented (leading order)", "signal"),
    "arm_length_change": ("Arm-length change per arm (leading order)", "signal"),
}

# The quantity keys of the JSON contract (DESIGN.md section 6), in order.
CONTRACT_QUANTITIES = (
    "mass_1", "mass_2", "total_mass", "chirp_mass", "mass_ratio", "chi_eff",
    "luminosity_distance", "redshift", "final_mass", "final_spin", "radiated_mass",
    "radiated_energy", "peak_luminosity", "kick_velocity", "ringdown_frequency",
    "ringdown_damping_time", "isco_frequency", "time_in_band",
)  # fmt: skip
# Keys the JSON export carries when the event has them: the contract, then extras.
JSON_KEYS = (
    *CONTRACT_QUANTITIES, "spin_1z", "spin_2z", "mass_1_detector", "mass_2_detector",
    "total_mass_detector", "chirp_mass_detector", "cycles_in_band", "strain_amplitude",
    "arm_length_change",
)  # fmt: skip


@dataclass(frozen=True)
class QuantityRow:
    key: str
    label: str
    group: str
    summary: Summary


def time_utc(event: Event) -> str:
    return event.time.utc.isot


def event_json(item: Derived) -> dict:
    """The ``data/<id>.json`` document of one event (DESIGN.md section 6)."""
    q = item.quantities
    return {
        "id": item.event.id,
        "title": item.event.title,
        "status": item.event.status,
        "time_utc": time_utc(item.event),
        "source_class": item.source_class,
        "source_class_probabilities": item.class_probabilities,
        "disruption_probability": item.disruption_probability,
        "detection": detection_json(item.event),
        "credible_level": item.credible_level,
        "cosmology": item.settings.cosmology,
        "quantities": {k: q[k].as_dict() for k in JSON_KEYS if k in q},
        "mass_bands": item.mass_bands,
        "counterpart_windows": [window_json(w) for w in item.windows],
        "caveats": [c.as_dict() for c in item.caveats],
    }


def detection_json(event: Event) -> dict:
    """What the detection summary states: detectors, SNR, false-alarm rate, sky area."""
    far, sky = event.false_alarm_rate, event.sky_area
    return {
        "detectors": list(event.detectors),
        "snr": event.snr,
        "false_alarm_rate": None
        if far is None
        else {"value": far.to_value(1 / u.yr), "unit": "1 / yr"},
        "sky_area": None if sky is None else {"value": sky.to_value(u.deg**2), "unit": "deg2"},
    }


def detection_rows(item: Derived) -> list[tuple[str, str]]:
    """The detection facts as (label, text) rows for the sheet."""
    event, rows = item.event, []
    if event.detectors:
        rows.append(("Detectors", ", ".join(event.detectors)))
    if event.snr is not None:
        rows.append(("Network signal-to-noise ratio", f"{event.snr:g}"))
    if event.false_alarm_rate is not None:
        rate = event.false_alarm_rate.to_value(1 / u.yr)
        text = f"one per {format_value(1 / rate, 'yr', 2)} of data" if rate > 0 else "zero"
        rows.append(("False-alarm rate", text))
    if event.sky_area is not None:
        rows.append(
            (
                "Sky area (credible region)",
                format_value(event.sky_area.to_value(u.deg**2), "deg2", 2),
            )
        )
    probs = ", ".join(f"{k} {p:.0%}" for k, p in item.class_probabilities.items() if p > 0)
    rows.append(("Source class", f"{item.source_class} ({probs})"))
    if item.disruption_probability is not None:
        rows.append(
            (
                "Neutron star torn apart",
                f"probability {item.disruption_probability:.0%} "
                f"(radius {item.settings.neutron_star_radius.to_value(u.km):g} km assumed)",
            )
        )
    return rows


def window_json(window) -> dict:
    """One counterpart window: UTC bounds as ISO 8601 strings."""
    return {
        "name": window.name,
        "start_utc": window.start.utc.isot,
        "end_utc": window.end.utc.isot,
        "band": window.band,
        "scenario": window.scenario,
        "basis": window.basis,
        "text": window.plain,
    }


CGS_UNITS = {"J": "erg", "W": "erg / s"}


def display_summary(summary: Summary, energy_units: str = "SI") -> Summary:
    """A summary in the unit a reader expects: milliseconds for short times, erg in cgs."""
    if summary.unit == "s" and abs(summary.median) < 1:
        return converted(summary, "ms")
    if energy_units == "cgs" and summary.unit in CGS_UNITS:
        return converted(summary, CGS_UNITS[summary.unit])
    return summary


def converted(summary: Summary, unit: str) -> Summary:
    """The same summary in another unit of the same dimension."""
    factor = u.Unit(summary.unit).to(unit)
    spread = None if summary.fit_spread is None else summary.fit_spread * factor
    return replace(
        summary,
        median=summary.median * factor,
        low=summary.low * factor,
        high=summary.high * factor,
        unit=unit,
        fit_spread=spread,
    )


def quantity_rows(item: Derived) -> list[QuantityRow]:
    return [
        QuantityRow(
            k, label, group, display_summary(item.quantities[k], item.settings.energy_units)
        )
        for k, (label, group) in QUANTITY_LABELS.items()
        if k in item.quantities
    ]


def event_row(item: Derived) -> dict:
    """One row of the index table."""
    q = item.quantities
    return {
        "id": item.event.id,
        "title": item.event.title,
        "page": f"events/{item.event.id}.html",
        "date": item.event.time.utc.isot[:10],
        "status": item.event.status,
        "source_class": item.source_class,
        "mass_1": q["mass_1"],
        "mass_2": q["mass_2"],
        "final_mass": q.get("final_mass"),
        "radiated_energy": q.get("radiated_energy"),
        "distance": q["luminosity_distance"],
        "band_flags": band_flags(item),
        "visibility": item.event.visibility,
    }


FLAG_BANDS = {
    "lower_gap": "lower gap",
    "pair_instability_gap": "pair-instability gap",
    "neutron_star": "neutron star",
    "intermediate_mass": "intermediate mass",
}


def band_flags(item: Derived, threshold: float = 0.5) -> list[str]:
    """Short labels for notable bands a component (or, for intermediate mass, the remnant) is
    more likely than not to be in."""
    flags = []
    for band, label in FLAG_BANDS.items():
        bodies = ("final_mass",) if band == "intermediate_mass" else ("mass_1", "mass_2")
        if any(item.mass_bands.get(b, {}).get(band, 0) > threshold for b in bodies):
            flags.append(label)
    return flags


BAND_LABELS = {
    "neutron_star": "neutron star",
    "lower_gap": "lower mass gap",
    "black_hole": "black hole",
    "pair_instability_gap": "pair-instability gap",
    "above_gap": "above the gap",
    "intermediate_mass": "intermediate mass (≥ 100 M⊙)",
}
BAND_SUBJECTS = {"mass_1": "Primary (m₁)", "mass_2": "Secondary (m₂)", "final_mass": "Remnant"}


def band_rows(item: Derived) -> list[dict]:
    """Mass-band probabilities as table rows: subject, then one cell per band."""
    return [
        {"subject": BAND_SUBJECTS[name], "cells": [(BAND_LABELS[b], p) for b, p in probs.items()]}
        for name, probs in item.mass_bands.items()
    ]


def comparison_rows(item: Derived) -> list[dict]:
    """Energy and luminosity against the comparison objects, largest ratio first."""
    ref = item.reference
    labels = {c.key: c.label for c in ref.comparisons} if ref else {}
    rows = []
    for kind in ("energy", "luminosity"):
        for key, ratio in sorted(item.comparisons.get(kind, {}).items(), key=lambda kv: -kv[1]):
            rows.append({"kind": kind, "label": labels.get(key, key), "ratio": ratio})
    return rows


def event_context(item: Derived, previous: Derived | None, following: Derived | None) -> dict:
    """The template context of one event page."""
    return {
        "detection": detection_rows(item),
        "bands": band_rows(item),
        "band_edges": item.reference.mass_bands.edges() if item.reference else (),
        "windows": [window_json(w) for w in item.windows],
        "no_window_reason": item.no_window_reason,
        "comparison_rows": comparison_rows(item),
        "sun_years": item.comparisons.get("sun_years"),
        "event": item.event,
        "item": item,
        "time_utc": time_utc(item.event),
        "rows": quantity_rows(item),
        "caveats": item.caveats,
        "previous": previous
        and {"id": previous.event.id, "page": f"events/{previous.event.id}.html"},
        "next": following
        and {"id": following.event.id, "page": f"events/{following.event.id}.html"},
        "json_path": f"data/{item.event.id}.json",
    }
