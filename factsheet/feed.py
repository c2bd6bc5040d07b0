"""What was added or revised, and when: the entries of ``changes.html`` and ``feed.xml``.

Every date comes from the inputs, never from the build clock. The rule:

* An event is *added* with its first estimate: the earliest ``history`` entry, or the current
  ``parameters`` when the event has no history; dated by that entry's ``date``, or the merger
  time when there is no history.
* Each later ``history`` entry is a *revision*, dated by its own ``date``.
* The current ``parameters`` of an event with history are a *revision* too, unless they equal
  the latest history entry (then nothing was revised). The inputs give the current estimate no
  date, so it is listed at the latest history date — the earliest it can have been issued — and
  its note says so.
* No estimate is dated before the merger: a date given to the day (``2034-05-11``) is taken as
  the merger time when the merger fell later that day.

Entries are sorted newest first; ties keep the later estimate first, then the event id in order.
The feed is Atom 1.0 (IETF RFC 4287), written with :mod:`xml.etree.ElementTree`, which escapes
text; characters XML 1.0 forbids are dropped. Entry ids are ``urn:uuid:`` name-based UUIDs (IETF
RFC 4122, version 5) of the event id, date, kind and origin, so they are stable across builds.
"""

from __future__ import annotations

import re
import uuid
import xml.etree.ElementTree as ET
from dataclasses import dataclass

from astropy.time import Time

from factsheet.derive import Derived
from factsheet.formatting import unit_text
from factsheet.model import Event, Parameters, Settings
from factsheet.pages import history_labels

ADDED, REVISED = "added", "revised"
CURRENT_LABEL = "Current estimate"
FIRST_LABEL = "First estimate"  # an event without history: its one estimate is also its first
UNDATED_NOTE = (
    "The inputs give no date for the current estimate; it is listed at the date of the latest "
    "dated estimate before it."
)
ATOM = "http://www.w3.org/2005/Atom"
NAMESPACE = uuid.UUID("d573d04c-89f0-4b52-bf7c-69f004be1040")  # fixed: ids stay stable
EMPTY_FEED_DATE = "1970-01-01T00:00:00Z"  # a fixed date for a feed with no entries
_NOT_XML = re.compile("[^\t\n\r\x20-\ud7ff\ue000-\ufffd\U00010000-\U0010ffff]")


@dataclass(frozen=True)
class Change:
    """One input parameter's median before and after a revision (None: not given)."""

    key: str
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
    before: Parameters | None, after: Parameters, frame: str = "source"
) -> tuple[Change, ...]:
    """Old → new medians of the main input parameters (all values given, for a first estimate)."""
    out = []
    for key, label in history_labels(frame).items():
        old = None if before is None else before.values.get(key)
        new = after.values.get(key)
        if new is None and old is None:
            continue
        unit = (new or old).unit
        old_v = None if old is None else old.to(unit).median
        new_v = None if new is None else new.median
        if before is None or old_v != new_v:
            out.append(Change(key, label, old_v, new_v, unit.to_string(), before is None))
    return tuple(out)


def _estimates(event: Event) -> list[tuple[Time, str, str, Parameters, str]]:
    """The event's estimates, oldest first: (date, label, note, parameters, origin)."""
    if not event.history:
        return [(event.time, FIRST_LABEL, "", event.parameters, "current")]
    out = [(h.date, h.label, h.note, h.parameters, "history") for h in event.history]
    if event.parameters.canonical() != event.history[-1].parameters.canonical():
        out.append(
            (event.history[-1].date, CURRENT_LABEL, UNDATED_NOTE, event.parameters, "current")
        )
    return out


def event_entries(event: Event) -> list[ChangeEntry]:
    """The addition and revisions of one event, oldest first (dating rule in the module doc)."""
    entries, before = [], None
    for i, (date, label, note, params, origin) in enumerate(_estimates(event)):
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
                changes_between(before, params, event.frame),
                origin,
                i,
            )
        )
        before = params
    return entries


def change_entries(derived: list[Derived]) -> list[ChangeEntry]:
    """Every addition and revision of the catalogue, newest first, deterministic."""
    entries = [e for item in derived for e in event_entries(item.event)]
    entries.sort(key=lambda e: e.event_id)
    entries.sort(key=lambda e: (e.timestamp, e.sequence), reverse=True)
    return entries


def entry_id(entry: ChangeEntry) -> str:
    """A stable Atom id: a name-based UUID (RFC 4122 version 5) of what identifies the entry."""
    name = f"{entry.event_id}|{entry.timestamp}|{entry.kind}|{entry.origin}"
    return f"urn:uuid:{uuid.uuid5(NAMESPACE, name)}"


def entry_title(entry: ChangeEntry) -> str:
    return f"{entry.event_id} {entry.kind}: {entry.label} — {entry.title}"


def entry_summary(entry: ChangeEntry) -> str:
    """Plain text: the note, then the values (first estimate) or what changed."""
    lead = "Values" if entry.kind == ADDED else "Changes"
    lines = "; ".join(c.text for c in entry.changes) or "no change in the main parameters"
    parts = [entry.note.strip(), f"{lead} (medians as given): {lines}."]
    return " ".join(p for p in parts if p)


def _site_link(base_url: str, path: str) -> str:
    return f"{base_url.rstrip('/')}/{path}" if base_url else path


def _add(parent: ET.Element, tag: str, text: str | None = None, **attrib: str) -> ET.Element:
    element = ET.SubElement(parent, tag, {k: _clean(v) for k, v in attrib.items()})
    if text is not None:
        element.text = _clean(text)
    return element


def _clean(text: str) -> str:
    return _NOT_XML.sub("", text)


def atom_feed(entries: list[ChangeEntry], settings: Settings, base_url: str | None = None) -> bytes:
    """An Atom 1.0 document (RFC 4287) of ``entries``; links absolute when a base URL is set.

    ``base_url`` defaults to ``settings.base_url``; without one, links are relative to the
    feed's own place at the site root.
    """
    base = settings.base_url if base_url is None else base_url
    feed = ET.Element("feed", {"xmlns": ATOM})
    _add(feed, "id", f"urn:uuid:{uuid.uuid5(NAMESPACE, 'feed|' + settings.title)}")
    _add(feed, "title", settings.title)
    _add(
        feed,
        "subtitle",
        "Additions and revisions of the catalogue's estimates. Preliminary estimates can change.",
    )
    _add(feed, "updated", max((e.timestamp for e in entries), default=EMPTY_FEED_DATE))
    _add(_add(feed, "author"), "name", settings.title)
    _add(feed, "link", rel="alternate", type="text/html", href=_site_link(base, "changes.html"))
    if base:
        _add(
            feed, "link", rel="self", type="application/atom+xml", href=_site_link(base, "feed.xml")
        )
    _add(feed, "generator", "factsheet")
    for entry in entries:
        item = _add(feed, "entry")
        _add(item, "id", entry_id(entry))
        _add(item, "title", entry_title(entry), type="text")
        _add(item, "updated", entry.timestamp)
        _add(item, "link", rel="alternate", type="text/html", href=_site_link(base, entry.page))
        _add(item, "summary", entry_summary(entry), type="text")
    ET.indent(feed)
    return ET.tostring(feed, encoding="utf-8", xml_declaration=True) + b"\n"
