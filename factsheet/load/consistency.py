"""Warnings: input that is valid but probably not what the editor meant.

They are printed by ``factsheet check`` and ``factsheet build`` and become errors with
``--strict``. Each names the file, line and key like an error does.
"""

from __future__ import annotations

import numpy as np

from factsheet.errors import Problem
from factsheet.model import Event

COMPARED = ("heavier.mass", "lighter.mass", "distance")


def consistency_warnings(event: Event) -> list[Problem]:
    """Every warning about one validated event."""
    return [
        *_history_dates(event),
        *_status_agrees(event),
        *_embargo(event),
        *_samples_agree(event),
    ]


def _warn(event: Event, key: str, message: str) -> Problem:
    """A warning at the line of ``key``, or of its top-level key when that line is unknown."""
    line = event.key_lines.get(key) or event.line_of(key.split(".")[0].split("[")[0])
    return Problem(event.source, line, key, message)


def _history_dates(event: Event) -> list[Problem]:
    merger_day = event.time.utc.isot[:10]
    return [
        _warn(
            event,
            f"history[{i}].date",
            f"history entry '{h.label}' is dated "
            f"{h.date.utc.isot[:10]}, before the merger ({merger_day})",
        )
        for i, h in enumerate(event.history)
        if h.date.utc.isot[:10] < merger_day
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
