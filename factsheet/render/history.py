"""How an event's estimate changed: the sheet's history list and the catalogue's change entries.

Every date comes from the inputs, never from the build clock. The rule of the changes page and
the feed:

* An event is *added* with its first estimate: the earliest ``history`` entry, or the current
  ``estimate`` when the event has no history; dated by that entry's ``date``, or the merger
  time when there is no history.
* Each later ``history`` entry is a *revision*, dated by its own ``date``.
* The current ``estimate`` of an event with history is a *revision* too, unless it equals
  the latest history entry (then nothing was revised). The inputs give the current estimate no
  date, so it is listed at the latest history date — the earliest it can have been issued — and
  its note says so.
* No estimate is dated before the merger: a date given to the day (``2034-05-11``) is taken as
  the merger time when the merger fell later that day.

Entries are sorted newest first; ties keep the later estimate first, then the event id in order.
Values are labelled by :func:`factsheet.labels.estimate_value`, so a detector-frame input says so
here exactly as in the history figure.
"""

from __future__ import annotations

from dataclasses import dataclass

from astropy.time import Time

from factsheet import labels
from factsheet.model import Derived, Estimate, Event, Interval
from factsheet.notation import format_interval, unit_text

ADDED, REVISED = "added", "revised"
CURRENT_LABEL = "Current estimate"
FIRST_LABEL = "First estimate"  # an event without history: its one estimate is also its first
UNDATED_NOTE = (
    "The inputs give no date for the current estimate; it is listed at the date of the latest "
    "dated estimate before it."
)
#: The values of an estimate that the history and the changes list, in order.
LISTED = (
    "heavier.mass",
    "lighter.mass",
    "distance",
    "heavier.spin",
    "lighter.spin",
    "effective_spin",
)


@dataclass(frozen=True)
class HistoryStep:
    """One estimate on the sheet: its values, and what changed from the one before."""

    label: str
    date: str
    note: str
    values: tuple[tuple[str, str], ...]
    changes: tuple[tuple[str, str, str], ...]  # (value, old, new)


def _text(value: Interval) -> str:
    return format_interval(value.median, value.low, value.high, value.unit.to_string())


def history_steps(event: Event) -> list[HistoryStep]:
    """Each estimate, oldest first, with what changed from the one before (old → new)."""
    if not event.history:
        return []
    estimates = [(h.label, h.date.utc.isot[:10], h.note, h.estimate) for h in event.history]
    estimates.append((CURRENT_LABEL, "", "", event.estimate))
    steps, before = [], None
    for label, date, note, estimate in estimates:
        given = estimate.values()
        values = tuple(
            (labels.estimate_value(p, event.frame), _text(given[p])) for p in LISTED if p in given
        )
        changes = []
        if before is not None:
            for path in LISTED:
                old = _text(before[path]) if path in before else "not given"
                new = _text(given[path]) if path in given else "not given"
                if old != new:
                    changes.append((labels.estimate_value(path, event.frame), old, new))
        steps.append(HistoryStep(label, date, note, values, tuple(changes)))
        before = given
    return steps


@dataclass(frozen=True)
class Change:
    """One value's median before and after a revision (None: not given)."""

    path: str
    label: str
    old: float | None
    new: float | None
    unit: str
    initial: bool = False  # a value of the first estimate: no "old"

    @property
    def text(self) -> str:
        """``m₁: 97 → 91 M⊙`` (``m₁: 97 M⊙`` for a first estimate)."""
        unit = f" {unit_text(self.unit)}" if unit_text(self.unit) else ""
        if self.initial:
            return f"{self.label}: {_number(self.new)}{unit}"
        return f"{self.label}: {_number(self.old)} → {_number(self.new)}{unit}"


@dataclass(frozen=True)
class ChangeEntry:
    """One addition or revision of an event's estimate."""

    event_id: str
    title: str
    date: Time
    kind: str
    label: str
    note: str
    changes: tuple[Change, ...]
    origin: str  # "history" or "current": which input the estimate comes from
    sequence: int  # position of the estimate in the event's history, oldest first

    @property
    def page(self) -> str:
        return f"events/{self.event_id}.html"

    @property
    def timestamp(self) -> str:
        """The date as RFC 3339 text in UTC (``2034-05-11T09:14:36.520Z``)."""
        return self.date.utc.isot + "Z"

    @property
    def day(self) -> str:
        return self.date.utc.isot[:10]


def _number(value: float | None) -> str:
    return "not given" if value is None else f"{value:.10g}".replace("-", "−")


def changes_between(
    before: Estimate | None, after: Estimate, frame: str = "source"
) -> tuple[Change, ...]:
    """Old → new medians of the listed values (all values given, for a first estimate)."""
    out = []
    old_values = {} if before is None else before.values()
    new_values = after.values()
    for path in LISTED:
        old, new = old_values.get(path), new_values.get(path)
        if new is None and old is None:
            continue
        unit = (new or old).unit
        old_v = None if old is None else old.to(unit).median
        new_v = None if new is None else new.median
        if before is None or old_v != new_v:
            label = labels.estimate_value(path, frame)
            out.append(Change(path, label, old_v, new_v, unit.to_string(), before is None))
    return tuple(out)


def _estimates(event: Event) -> list[tuple[Time, str, str, Estimate, str]]:
    """The event's estimates, oldest first: (date, label, note, estimate, origin)."""
    if not event.history:
        return [(event.time, FIRST_LABEL, "", event.estimate, "current")]
    out = [(h.date, h.label, h.note, h.estimate, "history") for h in event.history]
    if event.estimate.canonical() != event.history[-1].estimate.canonical():
        out.append((event.history[-1].date, CURRENT_LABEL, UNDATED_NOTE, event.estimate, "current"))
    return out


def event_entries(event: Event) -> list[ChangeEntry]:
    """The addition and revisions of one event, oldest first (dating rule in the module doc)."""
    entries, before = [], None
    for i, (date, label, note, estimate, origin) in enumerate(_estimates(event)):
        when = date if date > event.time else event.time
        kind = ADDED if before is None else REVISED
        entries.append(
            ChangeEntry(
                event.id,
                event.title,
                when,
                kind,
                label,
                note,
                changes_between(before, estimate, event.frame),
                origin,
                i,
            )
        )
        before = estimate
    return entries


def change_entries(derived: list[Derived]) -> list[ChangeEntry]:
    """Every addition and revision of the catalogue, newest first, deterministic."""
    entries = [e for item in derived for e in event_entries(item.event)]
    entries.sort(key=lambda e: e.event_id)
    entries.sort(key=lambda e: (e.timestamp, e.sequence), reverse=True)
    return entries
