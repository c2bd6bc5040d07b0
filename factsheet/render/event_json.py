"""The ``data/<id>.json`` document of one event: the export contract (version 2) other tools read.

``docs/json-export.md`` describes every key. Quantities carry the median and the bounds (not
offsets) of the credible interval, with astropy unit strings; mass bands are keyed by subject
(``heavier``, ``lighter``, ``remnant``) and partition the mass axis; ``intermediate_mass`` is
the separate probability of a mass at or above the intermediate-mass threshold.
"""

from __future__ import annotations

from typing import Any

import astropy.units as u

from factsheet.labels import WINDOWS
from factsheet.model import Derived, Detection, LensedCase
from factsheet.notation import utc_iso
from factsheet.physics.counterparts import Window

#: The version of this contract (docs/json-export.md); it changes when a key is renamed or removed.
FORMAT_VERSION = 2
#: The quantity keys of the contract, in order; the ECSV and CSV tables carry the same.
CONTRACT_QUANTITIES = (
    "heavier_mass", "lighter_mass", "total_mass", "chirp_mass", "mass_ratio", "effective_spin",
    "precession_spin",
    "heavier_spin", "lighter_spin", "distance", "redshift", "remnant_mass", "remnant_spin",
    "radiated_mass", "energy_radiated", "peak_luminosity", "kick_velocity",
    "ringdown_frequency", "ringdown_damping_time", "isco_frequency", "time_in_band",
)  # fmt: skip
#: Keys the JSON carries when the event has them: the contract, then the detector-frame twins
#: and the other signal quantities.
JSON_QUANTITIES = (
    *CONTRACT_QUANTITIES, "heavier_mass_detector", "lighter_mass_detector",
    "total_mass_detector", "chirp_mass_detector", "cycles_in_band", "strain_amplitude",
    "arm_length_change", "lookback_time",
)  # fmt: skip


def event_json(item: Derived) -> dict[str, Any]:
    """The JSON document of one event."""
    q, event = item.quantities, item.event
    return {
        "format_version": FORMAT_VERSION,
        "id": event.id,
        "title": event.title,
        "status": event.status,
        "time_utc": utc_iso(event.time),
        "source_class": item.source_class,
        "source_class_probabilities": dict(item.class_probabilities),
        "disruption_probability": item.disruption_probability,
        "credible_level": item.credible_level,
        "cosmology": item.settings.cosmology,
        "detection": detection_json(event.detection),
        "quantities": {k: q[k].as_dict() for k in JSON_QUANTITIES if k in q},
        "mass_bands": {subject: dict(bands) for subject, bands in item.mass_bands.items()},
        "intermediate_mass": dict(item.intermediate_mass),
        "counterpart_windows": [window_json(w) for w in item.windows],
        **sky_json(item),
        **({} if item.lensing is None else {"what_if_lensed": lensed_json(item)}),
        "caveats": [c.as_dict() for c in item.caveats],
    } | _second_generation(item)


def _second_generation(item: Derived) -> dict[str, Any]:
    """The comparison with first-generation remnants, for bodies in or above the gap."""
    if not item.second_generation:
        return {}
    return {"second_generation": [g.as_dict() for g in item.second_generation]}


def lensed_json(item: Derived) -> list[dict[str, Any]]:
    """The what-if-lensed cases, one per magnification (present only when the event has the
    panel): the true distance and source-frame masses as quantity summaries, the redshift's
    median (its bounds in ``redshift_interval``), and the mass-band probabilities there."""
    assert item.lensing is not None
    return [_case_json(case, item.lensing.origin) for case in item.lensing.cases]


def _case_json(case: LensedCase, origin: str) -> dict[str, Any]:
    masses = {
        "heavier_mass": case.heavier_mass,
        "lighter_mass": case.lighter_mass,
        "remnant_mass": case.remnant_mass,
    }
    return {
        "magnification": case.magnification,
        "distance": case.distance.as_dict(),
        "redshift": case.redshift.median,
        "redshift_interval": {"low": case.redshift.low, "high": case.redshift.high},
        **{k: s.as_dict() for k, s in masses.items() if s is not None},
        "mass_bands": {subject: dict(bands) for subject, bands in case.mass_bands.items()},
        "origin": origin,
    }


def detection_json(found: Detection) -> dict[str, Any]:
    """What the search reported: network, SNR, false-alarm rate, sky area (null when absent)."""
    far, sky = found.false_alarm_rate, found.sky_area
    return {
        "network": list(found.network),
        "snr": found.snr,
        "false_alarm_rate": None
        if far is None
        else {"value": far.to_value(1 / u.yr), "unit": "1 / yr"},
        "sky_area": None if sky is None else {"value": sky.to_value(u.deg**2), "unit": "deg2"},
    }


def _degrees(angle: u.Quantity) -> dict[str, Any]:
    return {"value": float(angle.to_value(u.deg)), "unit": "deg"}


def _square_degrees(area: u.Quantity) -> dict[str, Any]:
    return {"value": float(area.to_value(u.deg**2)), "unit": "deg2"}


def sky_json(item: Derived) -> dict[str, Any]:
    """The sky map's areas and most probable position, and each counterpart candidate read
    against the map, the merger time and the windows (each key only when the input has it)."""
    out: dict[str, Any] = {}
    found = item.sky_map
    if found is not None:
        out["sky_map"] = {
            "nside": found.nside,
            "ordering": found.ordering,
            "area_50": _square_degrees(found.area_50),
            "area_90": _square_degrees(found.area_90),
            "area_at_credible_level": _square_degrees(found.area),
            "peak": {"ra": _degrees(found.peak_ra), "dec": _degrees(found.peak_dec)},
        }
    if item.candidates:
        out["counterpart_candidates"] = [
            {
                "name": r.candidate.name,
                "ra": _degrees(r.candidate.ra),
                "dec": _degrees(r.candidate.dec),
                "time_utc": utc_iso(r.candidate.time),
                "note": r.candidate.note,
                "credible_level": r.credible_level,
                "delay": {"value": float(r.delay.to_value(u.d)), "unit": "d"},
                "delay_source": r.delay_source.as_dict(),
                "in_window": WINDOWS[r.windows[0]].name if r.windows else None,
                "windows": list(r.windows),
            }
            for r in item.candidates
        ]
    return out


def window_json(window: Window) -> dict[str, str]:
    """One counterpart window: its key and name, UTC bounds as ISO 8601 strings, band and
    scenario keys, its basis and a plain sentence."""
    return {
        "key": window.key,
        "name": WINDOWS[window.key].name,
        "start_utc": utc_iso(window.start),
        "end_utc": utc_iso(window.end),
        "band": window.band,
        "scenario": window.scenario,
        "basis": window.basis,
        "text": WINDOWS[window.key].plain,
    }
