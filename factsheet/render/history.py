"""How an event changed: the sheet's history list and the catalogue's change entries.

Every date comes from the inputs, never from the build clock. The rule of the changes page and
the feed:

* An event is *added* with its first estimate: the first ``history`` entry that has an
  ``estimate``, dated by that entry's ``date``. An event with no earlier estimate in its history
  is added with its current ``estimate``, which the inputs give no date: that addition is
  *undated*. The changes page lists undated additions apart, under the merger date (labelled as
  the merger date), and the feed, whose entries need a date, gives them the merger time and says
  so in the entry.
* Each later ``history`` estimate is a *revision*, dated by its own ``date``.
* The current ``estimate`` of an event with earlier estimates is a *revision* too, unless it
  equals the latest of them (then nothing was revised). Having no date of its own, it is listed
  at the date of that latest estimate — the earliest it can have been issued — and its note
  says so.
* A ``history`` entry with a ``status`` that differs from the status before it is a *change of
  status* (``retracted``, ``confirmed``, ``candidate``), an entry of its own dated by its entry's
  ``date``. A status given with the first estimate is the event's status when it was added,
  shown with that addition.
* No entry is dated before the merger: a date given to the day (``2034-05-11``) on the day of the
  merger is taken as the merger time; the day shown is still the input's.

Dated entries are sorted newest first; ties keep the later step first, then the event id in
order. Values are written exactly as the sheet's tables write them (with the digits they
were given with, :func:`factsheet.notation.format_given`, in the table's units), and labelled
by :func:`factsheet.labels.estimate_value`, so a detector-frame input says so here exactly as in
the history figure.

The words are in the language in use when the sheet, the changes page or the feed is made
(the labels of our own steps are kept messages, shown in the language of the page).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

from astropy.time import Time

from factsheet import labels
from factsheet.i18n import Text, _, pgettext
from factsheet.load.schema import value_key
from factsheet.model import Derived, Estimate, Event, Interval
from factsheet.notation import format_given, utc_iso
from factsheet.render.numbers import estimate_texts

ADDED, REVISED = "added", "revised"
CURRENT_LABEL = Text("Current estimate")
FIRST_LABEL = Text("First estimate")  # the current estimate of an event with no earlier estimate
UNDATED_NOTE = Text(
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
    "precession_spin",
    "chirp_mass",
    "mass_ratio",
)


def value_text(value: Interval, path: str = "") -> str:
    """A given value as the sheet's table writes it: in the table's unit, with the digits it
    was given with (``88 +17 −14 M⊙``; see :mod:`factsheet.render.numbers`)."""
    unit = value_key(path).canonical_unit if path else ""
    if unit:
        value = value.to(unit)
    return format_given(value.median, value.low, value.high, value.unit.to_string())


def _listed(
    estimate: Estimate, frame: str, shown: Mapping[str, str] | None = None
) -> dict[str, tuple[str, str]]:
    """Path -> (label, text) of the listed values an estimate gives; ``shown`` overrides the
    text of the values the sheet prints (the current estimate: as its table prints them, which
    for a samples file is the file's summary)."""
    given, shown = estimate.values(), shown or {}
    return {
        p: (labels.estimate_value(p, frame), shown.get(p) or value_text(given[p], p))
        for p in LISTED
        if p in given
    }


@dataclass(frozen=True)
class Change:
    """One value (or the status) before and after a step, as text; ``old`` is None for the
    values of a first estimate and for a first recorded status."""

    path: str  # an estimate path (``heavier.mass``) or ``status``
    label: str
    old: str | None
    new: str

    @property
    def text(self) -> str:
        """``m₁: 97 +28 −20 M⊙ → 91 +19 −15 M⊙`` (``m₁: 97 +28 −20 M⊙`` with no old value)."""
        if self.old is None:
            # TRANSLATORS: a value of an estimate: "m₁: 97 +28 −20 M⊙".
            return _("{label}: {value}").format(label=self.label, value=self.new)
        # TRANSLATORS: a value that changed: "m₁: 97 +28 −20 M⊙ → 91 +19 −15 M⊙".
        return _("{label}: {old} → {new}").format(label=self.label, old=self.old, new=self.new)


def changes_between(
    before: Estimate | None,
    after: Estimate,
    frame: str = "source",
    shown: Mapping[str, str] | None = None,
) -> tuple[Change, ...]:
    """The listed values that changed (all values given, for a first estimate); ``shown``: the
    texts of ``after`` as the sheet prints them, when it is the current estimate."""
    old = {} if before is None else _listed(before, frame)
    new = _listed(after, frame, shown)
    out = []
    for path in LISTED:
        if path not in old and path not in new:
            continue
        label = (new.get(path) or old[path])[0]
        was = labels.NOT_GIVEN if path not in old else old[path][1]
        now = labels.NOT_GIVEN if path not in new else new[path][1]
        if before is None:
            out.append(Change(path, label, None, now))
        elif was != now:
            out.append(Change(path, label, was, now))
    return tuple(out)


def status_text(status: str) -> str:
    """An event's status (``retracted``) in words, in the language in use."""
    words = {
        "candidate": pgettext("status", "candidate"),
        "confirmed": pgettext("status", "confirmed"),
        "retracted": pgettext("status", "retracted"),
    }
    return words.get(status, status)


def status_row(old: str | None, new: str) -> Change:
    """The status before and after a step (``old`` None: the first status recorded)."""
    return Change(
        "status", labels.STATUS, None if old is None else status_text(old), status_text(new)
    )


@dataclass(frozen=True)
class Step:
    """One step of an event's story: an estimate or a change of status, in order."""

    date: Time | None  # None: the inputs give it no date
    label: str
    note: str
    origin: str  # "history" or "current": which input the step comes from
    estimate: Estimate | None = None
    status: str | None = None  # an estimate's status when it was added; or the status changed to
    old_status: str | None = None  # a change of status: the status before it, when recorded

    @property
    def is_status_change(self) -> bool:
        return self.estimate is None


def event_steps(event: Event) -> list[Step]:
    """The event's estimates and changes of status, oldest first (rule in the module doc)."""
    steps: list[Step] = []
    if not any(h.estimate is not None for h in event.history):
        steps.append(Step(None, FIRST_LABEL, "", "current", event.estimate))
    status: str | None = None
    for h in event.history:
        if h.estimate is not None:
            initial = h.status if not steps else None  # the status it was added with
            steps.append(Step(h.date, h.label, h.note, "history", h.estimate, initial))
            status = initial or status
        if h.status is not None and h.status != status:
            steps.append(Step(h.date, h.label, h.note, "history", None, h.status, status))
        status = h.status or status
    estimates = [i for i, s in enumerate(steps) if s.estimate is not None]
    last = steps[estimates[-1]]
    if last.origin == "history" and event.estimate.canonical() != last.estimate.canonical():
        current = Step(last.date, CURRENT_LABEL, UNDATED_NOTE, "current", event.estimate)
        steps.insert(estimates[-1] + 1, current)
    return steps


# -- the sheet's history list ------------------------------------------------------------------


@dataclass(frozen=True)
class HistoryStep:
    """One step on the sheet: its values, and what changed from the step before."""

    label: str
    date: str
    note: str
    values: tuple[tuple[str, str], ...]  # (value, text)
    changes: tuple[tuple[str, str, str], ...]  # (value, old, new)


def history_steps(event: Event, shown: Mapping[str, str] | None = None) -> list[HistoryStep]:
    """Each estimate and change of status, oldest first, with what changed (old → new); the
    current estimate last, also when it repeats the latest earlier one, its values as ``shown``
    (the sheet's texts by estimate path). Empty without history."""
    if not event.history:
        return []
    steps = event_steps(event)
    if not any(s.origin == "current" for s in steps):
        steps.append(Step(None, CURRENT_LABEL, "", "current", event.estimate))
    out, before = [], None
    for step in steps:
        date = "" if step.date is None or step.origin == "current" else utc_iso(step.date)[:10]
        note = "" if step.origin == "current" else step.note
        if step.is_status_change:
            status = status_text(step.status)
            old = status_text(step.old_status) if step.old_status else labels.NOT_RECORDED
            values = ((labels.STATUS, status),)
            changes = ((labels.STATUS, old, status),)
        else:
            texts = shown if step.origin == "current" else None
            values = tuple(
                (c.label, c.new) for c in changes_between(None, step.estimate, event.frame, texts)
            )
            if step.status:
                values += ((labels.STATUS, status_text(step.status)),)
            found = (
                () if before is None else changes_between(before, step.estimate, event.frame, texts)
            )
            changes = tuple((c.label, c.old or "", c.new) for c in found)
            before = step.estimate
        out.append(HistoryStep(step.label, date, note, values, changes))
    return out


# -- the changes page and the feed -----------------------------------------------------------


@dataclass(frozen=True)
class ChangeEntry:
    """One addition, revision or change of status of an event."""

    event_id: str
    title: str
    date: Time  # the step's date; for an undated addition, the merger time
    kind: str  # added, revised, or the new status (retracted, confirmed, candidate)
    label: str
    note: str
    changes: tuple[Change, ...]
    origin: str  # "history" or "current": which input the step comes from
    sequence: int  # position of the step in the event's story, oldest first
    dated: bool = True  # False: the inputs give no date; ``date`` is the merger time
    # the date as RFC 3339 text in UTC (``2034-05-11T09:14:36.520Z``), made once: the changes
    # are sorted by it and the feed writes it
    timestamp: str = field(init=False, repr=False)

    def __post_init__(self) -> None:
        object.__setattr__(self, "timestamp", utc_iso(self.date) + "Z")

    @property
    def page(self) -> str:
        return f"events/{self.event_id}.html"

    @property
    def day(self) -> str:
        return self.timestamp[:10]

    @property
    def what(self) -> str:
        """What happened, in words: ``added``, ``revised``, ``retracted``, ..."""
        return labels.CHANGE_KINDS[self.kind]


def event_entries(event: Event, shown: Mapping[str, str] | None = None) -> list[ChangeEntry]:
    """The addition, revisions and changes of status of one event, oldest first (the current
    estimate's values as ``shown`` on the sheet, by estimate path)."""
    entries, before = [], None
    for i, step in enumerate(event_steps(event)):
        when = event.time if step.date is None or step.date < event.time else step.date
        if step.is_status_change:
            kind, changes = step.status, (status_row(step.old_status, step.status),)
        else:
            kind = ADDED if before is None else REVISED
            texts = shown if step.origin == "current" else None
            changes = changes_between(before, step.estimate, event.frame, texts)
            if step.status:
                changes += (status_row(None, step.status),)
            before = step.estimate
        entries.append(
            ChangeEntry(
                event.id,
                event.title,
                when,
                kind,
                step.label,
                step.note,
                changes,
                step.origin,
                i,
                step.date is not None,
            )
        )
    return entries


def change_entries(derived: list[Derived]) -> list[ChangeEntry]:
    """Every change of the catalogue: the dated ones newest first, then the undated additions
    by merger time, newest first; deterministic."""
    entries = [e for item in derived for e in event_entries(item.event, estimate_texts(item))]
    entries.sort(key=lambda e: e.event_id)
    entries.sort(key=lambda e: (e.dated, e.timestamp, e.sequence), reverse=True)
    return entries


@dataclass(frozen=True)
class ChangesPage:
    """The context of ``changes.html``: the dated entries newest first, then the undated
    additions (events whose inputs date none of their estimates) by merger date."""

    entries: tuple[ChangeEntry, ...]
    undated: tuple[ChangeEntry, ...]


def changes_page(entries: list[ChangeEntry]) -> ChangesPage:
    """The changes page of the catalogue's entries (:func:`change_entries`)."""
    return ChangesPage(
        tuple(e for e in entries if e.dated), tuple(e for e in entries if not e.dated)
    )
