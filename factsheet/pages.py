"""Page contexts that need prose or cross-event views: headline sentences, the history of
estimates and the methods page. Decisions live here, not in the templates."""

from __future__ import annotations

from dataclasses import dataclass

import astropy.units as u

from factsheet.derive import Derived
from factsheet.formatting import format_interval, format_value
from factsheet.model import Parameters
from factsheet.physics.registry import METHODS, Method
from factsheet.reference import Reference

BODIES = {
    "BBH": "Two black holes",
    "BNS": "Two neutron stars",
    "NSBH": "A black hole and a neutron star",
}
HISTORY_KEYS = {
    "mass_1": "m₁",
    "mass_2": "m₂",
    "luminosity_distance": "distance",
    "spin_1z": "spin 1",
    "spin_2z": "spin 2",
    "chi_eff": "χ_eff",
}


def history_labels(frame: str) -> dict[str, str]:
    """Labels of the input parameters, saying so when the masses were given in the detector frame
    (the estimates keep the frame of the input; the sheet's numbers are source-frame)."""
    if frame != "detector":
        return HISTORY_KEYS
    return {
        k: f"{v} (detector frame)" if k.startswith("mass") else v for k, v in HISTORY_KEYS.items()
    }


def _about(value: float) -> str:
    return format_value(value, "", 2)


def headline(item: Derived) -> list[str]:
    """Two or three plain sentences from the numbers, for the top of a sheet."""
    q = item.quantities
    years = item.lookback_time.to_value(u.Gyr)
    when = (
        f"about {_about(years)} billion years ago"
        if years >= 1
        else f"about {_about(years * 1000)} million years ago"
    )
    text = [
        f"{BODIES.get(item.source_class, 'Two compact objects')} of about "
        f"{_about(q['mass_1'].median)} and {_about(q['mass_2'].median)} times the mass of "
        f"the Sun merged {when}; the waves reached the detectors on "
        f"{item.event.time.utc.isot[:10]}."
    ]
    if "final_mass" in q:
        spin = q["final_spin"].median
        text.append(
            f"They left a single black hole of about {_about(q['final_mass'].median)} "
            f"solar masses, spinning at {abs(spin):.0%} of the maximum a black hole "
            f"can have, and radiated about {_about(q['radiated_mass'].median)} solar "
            "masses of energy as gravitational waves."
        )
    ratios = item.comparisons
    if "sun_years" in ratios and "luminosity" in ratios:
        sun = ratios["sun_years"].to_value(u.yr)
        galaxy = ratios["luminosity"].get("milky_way")
        line = f"The Sun would need about {format_value(sun, '', 2)} years to emit that energy"
        if galaxy:
            line += (
                f"; at its peak the merger put out {format_value(galaxy, '', 2)} times "
                "the light of all the stars in the Milky Way, as gravitational waves"
            )
        text.append(line + ".")
    elif item.windows:
        text.append(
            "A neutron star was involved, so light could follow: the counterpart "
            "windows below say when to look."
        )
    return text


@dataclass(frozen=True)
class HistoryStep:
    label: str
    date: str
    note: str
    values: list[tuple[str, str]]
    changes: list[tuple[str, str, str]]  # (parameter, old, new)


def _text(parameters: Parameters, key: str) -> str:
    est = parameters[key]
    return format_interval(est.median, est.low, est.high, est.unit.to_string())


def history_steps(item: Derived) -> list[HistoryStep]:
    """Each estimate, oldest first, with what changed from the one before (old → new)."""
    estimates = [(h.label, h.date.utc.isot[:10], h.note, h.parameters) for h in item.event.history]
    if not estimates:
        return []
    estimates.append(("Current estimate", "", "", item.event.parameters))
    steps, before, labels = [], None, history_labels(item.event.frame)
    for label, date, note, params in estimates:
        values = [(labels[k], _text(params, k)) for k in labels if k in params]
        changes = []
        if before is not None:
            for k in labels:
                old = _text(before, k) if k in before else "not given"
                new = _text(params, k) if k in params else "not given"
                if old != new:
                    changes.append((labels[k], old, new))
        steps.append(HistoryStep(label, date, note, values, changes))
        before = params
    return steps


@dataclass(frozen=True)
class MethodEntry:
    method: Method
    events: list[str]


def methods_context(derived: list[Derived], reference: Reference) -> dict:
    """Every registered method with the events that used it, and the reference data."""
    used: dict[str, set[str]] = {}
    for item in derived:
        ids = {m for summary in item.quantities.values() for m in summary.methods}
        for method_id in ids | set(item.other_methods):
            used.setdefault(method_id, set()).add(item.event.id)
    entries = [
        MethodEntry(m, sorted(used.get(m.id, ())))
        for m in sorted(METHODS.values(), key=lambda m: (not used.get(m.id), m.title))
    ]
    return {
        "methods": entries,
        "reference": reference,
        "levels": sorted({d.settings.credible_level for d in derived}),
    }
