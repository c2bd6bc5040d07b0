"""Warnings: input that is valid but probably not what the editor meant.

They are printed by ``factsheet check`` and ``factsheet build`` and become errors with
``--strict``. Each names the file, line and key like an error does.
"""

from __future__ import annotations

import numpy as np

from factsheet.errors import Problem
from factsheet.model import Event

COMPARED = ("mass_1", "mass_2", "luminosity_distance")


def consistency_warnings(
    event: Event, samples: dict[str, np.ndarray] | None = None
) -> list[Problem]:
    """Every warning about one validated event (``samples``: its samples file, as read)."""
    return [*_history_dates(event), *_embargo(event), *_samples_agree(event, samples)]


def _warn(event: Event, key: str, message: str) -> Problem:
    return Problem(event.source, event.line_of(key.split(".")[0].split("[")[0]), key, message)


def _history_dates(event: Event) -> list[Problem]:
    merger_day = event.time.utc.isot[:10]
    return [
        _warn(
            event,
            f"history[{i}].date",
            f"estimate '{h.label}' is dated "
            f"{h.date.utc.isot[:10]}, before the merger ({merger_day})",
        )
        for i, h in enumerate(event.history)
        if h.date.utc.isot[:10] < merger_day
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


def _samples_agree(event: Event, values: dict[str, np.ndarray] | None) -> list[Problem]:
    """The samples file's medians should lie inside the summary's intervals."""
    if values is None:
        return []
    found = []
    for name in COMPARED:
        if name not in event.parameters or name not in values or event.parameters[name].exact:
            continue
        est = event.parameters[name]
        median = float(np.median(values[name]))
        if not est.low <= median <= est.high:
            found.append(
                _warn(
                    event,
                    f"parameters.{name}",
                    f"the samples file's median "
                    f"{median:.4g} lies outside this summary interval "
                    f"({est.low:.4g}–{est.high:.4g}); is it the right file?",
                )
            )
    return found
