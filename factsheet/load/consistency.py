"""Warnings: input that is valid but probably not what the editor meant.

They are printed by ``factsheet check`` and ``factsheet build`` and become errors with
``--strict``. Each names the file, line and key like an error does.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet.errors import Problem
from factsheet.model import Estimate, Event
from factsheet.notation import utc_iso
from factsheet.physics import inspiral

COMPARED = ("heavier.mass", "lighter.mass", "distance")


def consistency_warnings(event: Event) -> list[Problem]:
    """Every warning about one validated event."""
    return [
        *_history_dates(event),
        *_status_agrees(event),
        *_embargo(event),
        *_samples_agree(event),
        *_masses_agree(event),
    ]


def _warn(event: Event, key: str, message: str) -> Problem:
    """A warning at the line of ``key``, or of its top-level key when that line is unknown."""
    line = event.key_lines.get(key) or event.line_of(key.split(".")[0].split("[")[0])
    return Problem(event.source, line, key, message)


def _history_dates(event: Event) -> list[Problem]:
    merger_day = utc_iso(event.time)[:10]
    return [
        _warn(
            event,
            f"history[{i}].date",
            f"history entry '{h.label}' is dated "
            f"{utc_iso(h.date)[:10]}, before the merger ({merger_day})",
        )
        for i, h in enumerate(event.history)
        if utc_iso(h.date)[:10] < merger_day
    ]


def _status_agrees(event: Event) -> list[Problem]:
    """The event's ``status`` should be the one its latest change of status set."""
    changes = [(i, h) for i, h in enumerate(event.history) if h.status is not None]
    if not changes or changes[-1][1].status == event.status:
        return []
    i, last = changes[-1]
    return [
        _warn(
            event,
            "status",
            f"the status is '{event.status}' but the latest change of status in the history "
            f"(history[{i}], '{last.label}') says '{last.status}'; pages show '{event.status}' "
            f"(expected status: {last.status}, or a later history entry with status: "
            f"{event.status})",
        )
    ]


def _embargo(event: Event) -> list[Problem]:
    if event.embargo_until is not None and event.embargo_until < event.time:
        return [
            _warn(
                event,
                "embargo_until",
                "the embargo ends before the merger time, so it "
                "never withholds anything (expected a time after the merger)",
            )
        ]
    return []


def _samples_agree(event: Event) -> list[Problem]:
    """The samples file's medians should lie inside the summary's intervals."""
    if event.samples is None:
        return []
    found = []
    given, values = event.estimate.values(), event.samples.values
    for path in COMPARED:
        if path not in given or path not in values or given[path].exact:
            continue
        value = given[path]
        median = float(np.median(values[path]))
        if not value.low <= median <= value.high:
            found.append(
                _warn(
                    event,
                    f"estimate.{path}",
                    f"the samples file's median "
                    f"{median:.4g} lies outside this summary interval "
                    f"({value.low:.4g}–{value.high:.4g}); is it the right file?",
                )
            )
    return found


#: Given masses are written to two or three digits: a chirp mass or mass ratio computed from
#: their medians may stray this far (relative) outside the given interval before it is a warning.
MASS_SLACK = 0.02


def _masses_agree(event: Event) -> list[Problem]:
    """With the chirp mass and both masses given, the chirp mass of the masses' medians should
    lie in the chirp mass's interval, and their ratio in the mass ratio's when that is given:
    near a narrow chirp mass the medians of the two masses and of the ratio belong to nearly
    the same draws, so a real summary passes."""
    estimates = [("estimate", event.estimate)] + [
        (f"history[{i}].estimate", h.estimate) for i, h in enumerate(event.history) if h.estimate
    ]
    return [problem for where, e in estimates for problem in _masses_disagree(event, where, e)]


def _masses_disagree(event: Event, where: str, estimate: Estimate) -> list[Problem]:
    m1, m2 = estimate.heavier.mass, estimate.lighter.mass
    if estimate.chirp_mass is None or m1 is None or m2 is None:
        return []
    a, b = (m.to(u.Msun).median for m in (m1, m2))
    implied = {
        "chirp_mass": float(inspiral.chirp_mass(a * u.Msun, b * u.Msun).to_value(u.Msun)),
        "mass_ratio": b / a,
    }
    found = []
    for name, value in implied.items():
        given = getattr(estimate, name)
        if given is None:
            continue
        given = given.to(u.Msun) if name == "chirp_mass" else given
        slack = MASS_SLACK * value
        if not given.low - slack <= value <= given.high + slack:
            what = "chirp mass" if name == "chirp_mass" else "mass ratio"
            unit = " Msun" if name == "chirp_mass" else ""
            found.append(
                _warn(
                    event,
                    f"{where}.{name}",
                    f"the masses' medians ({a:.4g} and {b:.4g} Msun) have a {what} of "
                    f"{value:.4g}{unit}, outside this interval ({given.low:.4g}–"
                    f"{given.high:.4g}{unit}); the draws follow the {what}, the table shows "
                    "the masses as given (fix one, or leave the masses out)",
                )
            )
    return found
