"""The Atom feed of the catalogue's changes (``feed.xml``).

The entries are those of the changes page (:mod:`factsheet.render.history`), dated from the
inputs, never the build clock; an undated addition (an event whose inputs date none of its
estimates) carries the merger time, because every Atom entry needs a date, and its summary says
so. The feed is Atom 1.0 (IETF RFC 4287), written with :mod:`xml.etree.ElementTree`, which
escapes text; characters XML 1.0 forbids are dropped. Links are absolute under the catalogue's
``base_url`` and relative to the feed (at the site root) without one. Entry ids are
``urn:uuid:`` name-based UUIDs (IETF RFC 4122, version 5) of the event id, date, kind and
origin, so they are stable across builds. The catalogue's ``licence`` is the feed's ``rights``.
The feed's words (its subtitle, the entries' titles and summaries) are in the language in use
when it is written: one feed per language.
"""

from __future__ import annotations

import re
import uuid
import xml.etree.ElementTree as ET

from factsheet.i18n import _, current
from factsheet.model import Settings
from factsheet.render.history import ADDED, REVISED, ChangeEntry

ATOM = "http://www.w3.org/2005/Atom"
NAMESPACE = uuid.UUID("d573d04c-89f0-4b52-bf7c-69f004be1040")  # fixed: ids stay stable
EMPTY_FEED_DATE = "1970-01-01T00:00:00Z"  # a fixed date for a feed with no entries
_NOT_XML = re.compile("[^\t\n\r\x20-\ud7ff\ue000-\ufffd\U00010000-\U0010ffff]")


def entry_id(entry: ChangeEntry, language: str = "") -> str:
    """A stable Atom id: a name-based UUID (RFC 4122 version 5) of what identifies the entry
    (and its language, in the feed of a language other than the site's first)."""
    name = f"{entry.event_id}|{entry.timestamp}|{entry.kind}|{entry.origin}"
    if language:
        name += f"|{language}"
    return f"urn:uuid:{uuid.uuid5(NAMESPACE, name)}"


def entry_title(entry: ChangeEntry) -> str:
    # TRANSLATORS: a feed entry's title: "MER34-007 retracted: Retraction — <the event's title>";
    # {what} is what happened (added, revised, retracted...), {label} the step's label.
    return _("{event} {what}: {label} — {title}").format(
        event=entry.event_id, what=entry.what, label=entry.label, title=entry.title
    )


def entry_summary(entry: ChangeEntry) -> str:
    """Plain text: when the date is not the input's, the note, then the values (an addition),
    what changed (a revision) or the change of status."""
    undated = _(
        "The inputs give this estimate no date; the entry carries the merger time ({time})."
    ).format(time=entry.timestamp)
    lines = "; ".join(c.text for c in entry.changes)
    if entry.kind == ADDED:
        said = _("Values as given: {values}.").format(
            values=lines or _("no change in the listed values")
        )
    elif entry.kind == REVISED:
        said = _("Changes: {changes}.").format(changes=lines or _("no change in the listed values"))
    else:
        said = f"{lines or _('no change in the listed values')}."
    parts = ["" if entry.dated else undated, str(entry.note).strip(), said]
    return " ".join(p for p in parts if p)


def _site_link(base_url: str, path: str) -> str:
    return f"{base_url.rstrip('/')}/{path}" if base_url else path


def _add(parent: ET.Element, tag: str, text: str | None = None, **attrib: str) -> ET.Element:
    element = ET.SubElement(parent, tag, {k: _clean(v) for k, v in attrib.items()})
    if text is not None:
        element.text = _clean(text)
    return element


def _clean(text: str) -> str:
    """``text`` in the language in use (words kept for later, editors' texts by language),
    without the characters XML 1.0 forbids."""
    return _NOT_XML.sub("", str(text))


def atom_feed(entries: list[ChangeEntry], settings: Settings, base_url: str | None = None) -> bytes:
    """An Atom 1.0 document (RFC 4287) of ``entries``; links absolute when a base URL is set.

    ``base_url`` defaults to ``settings.base_url``; without one, links are relative to the
    feed's own place at the site root.
    """
    base = settings.base_url if base_url is None else base_url
    language = current()
    feed = ET.Element("feed", {"xmlns": ATOM, "xml:lang": language})
    # one feed per language: the first language's id is the one it always had
    name = "feed|" + str.__str__(settings.title)
    if language != settings.languages[0]:
        name += f"|{language}"
    _add(feed, "id", f"urn:uuid:{uuid.uuid5(NAMESPACE, name)}")
    _add(feed, "title", settings.title)
    _add(
        feed,
        "subtitle",
        _(
            "Additions, revisions and changes of status of the catalogue's events. Preliminary "
            "estimates can change."
        ),
    )
    if settings.licence:
        _add(feed, "rights", settings.licence, type="text")
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
        _add(item, "id", entry_id(entry, "" if language == settings.languages[0] else language))
        _add(item, "title", entry_title(entry), type="text")
        _add(item, "updated", entry.timestamp)
        _add(item, "link", rel="alternate", type="text/html", href=_site_link(base, entry.page))
        _add(item, "summary", entry_summary(entry), type="text")
    ET.indent(feed)
    return ET.tostring(feed, encoding="utf-8", xml_declaration=True) + b"\n"
