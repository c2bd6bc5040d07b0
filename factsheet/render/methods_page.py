"""The context of the methods page: every registered method with the events that used it, and
the reference data (mass-band edges, counterpart time scales, comparison objects).

The page is for the public, so its texts are decided here: formulas set in Unicode with real
superscripts and subscripts (the registry marks them ``^{...}`` and ``_{...}``), arXiv ids as
links to their abstracts, rest-frame delays in the units people use ("60 days to 1 year"), and
sources only: how a value was obtained (the ``provenance`` notes of the registry and the data
files) stays with the maintainers. The words are in the language in use (the context is built
inside ``factsheet.i18n.use_language``); formulas and references stay as they are written.

The registry (:mod:`factsheet.physics`, which imports nothing of the interface) and the packaged
reference data keep their texts in English; they are translated here, each English text being its
own message: a method's title, range of validity and accuracy, and the sources, spreads and bases
of the reference data (``tools/messages.py`` extracts them from the registry's source and the
data files). A text given in ``catalogue.yaml`` is not in the catalogues and is shown as written.
"""

from __future__ import annotations

import re
import unicodedata
from dataclasses import dataclass

from markupsafe import Markup, escape

from factsheet import labels
from factsheet.i18n import _, decimal_text, ngettext
from factsheet.model import Derived, Reference, WindowSpec
from factsheet.notation import format_value
from factsheet.physics.registry import METHODS, Method

ARXIV_URL = "https://arxiv.org/abs/"
_ARXIV = re.compile(r"arXiv:\s?(\d{4}\.\d{4,5}|[a-z-]+(?:\.[A-Z]{2})?/\d{7})(v\d+)?")
_SCRIPT = re.compile(r"([\^_])\{([^{}]*)\}")


@dataclass(frozen=True)
class MethodEntry:
    method: Method
    events: tuple[str, ...]
    title: str  # in the language in use
    citation: Markup  # the source, with its arXiv id as a link
    formula: Markup  # Unicode, with <sup> and <sub>
    validity: Markup
    accuracy: Markup


@dataclass(frozen=True)
class WindowScale:
    name: str
    spec: WindowSpec
    delay: str  # the rest-frame delays in words: "60 days to 1 year"
    basis: Markup


@dataclass(frozen=True)
class SourcedValue:
    """A reference value as the page shows it: label, value, source and the literature's spread."""

    label: str
    value: str
    source: Markup
    spread: Markup
    overridden: bool


@dataclass(frozen=True)
class MethodsPage:
    """The context of ``methods.html``."""

    methods: tuple[MethodEntry, ...]
    reference: Reference
    window_scales: tuple[WindowScale, ...]
    levels: tuple[float, ...]
    edges: tuple[SourcedValue, ...]
    comparisons: tuple[SourcedValue, ...]


def methods_page(derived: list[Derived], reference: Reference) -> MethodsPage:
    """Every registered method with the events that used it, and the reference data."""
    used: dict[str, set[str]] = {}
    for item in derived:
        ids = {m for summary in item.quantities.values() for m in summary.methods}
        for method_id in ids | set(item.other_methods):
            used.setdefault(method_id, set()).add(item.event.id)
    entries = sorted(
        (method_entry(m, tuple(sorted(used.get(m.id, ())))) for m in METHODS.values()),
        key=lambda e: (not e.events, _collation(e.title), e.title),
    )
    scales = tuple(
        WindowScale(labels.WINDOWS[w.key].name, w, delay_range(w), linked(translated(w.basis)))
        for w in reference.windows
    )
    levels = tuple(sorted({d.settings.credible_level for d in derived}))
    edges = tuple(
        SourcedValue(
            e.label,
            _value(e.value.to("solMass")),
            linked(translated(e.source)),
            linked(translated(e.spread)),
            e.overridden,
        )
        for e in reference.mass_bands.edges()
    )
    comparisons = tuple(
        SourcedValue(
            c.label,
            _value(c.value),
            linked(translated(c.source)),
            Markup(""),
            c.overridden,
        )
        for c in reference.comparisons
    )
    return MethodsPage(tuple(entries), reference, scales, levels, edges, comparisons)


def translated(text: str) -> str:
    """A text of the registry or the reference data in the language in use (the English text is
    the message); an empty text stays empty."""
    return _(text) if text else text


def _collation(title: str) -> str:
    """A title as the page orders it: letters without their accents ("Órbita" among the O's)."""
    decomposed = unicodedata.normalize("NFD", title.casefold())
    return "".join(c for c in decomposed if not unicodedata.combining(c))


def _value(q) -> str:
    """A reference value to three significant figures. As a Python float: with numpy's float64,
    a division by a large power of ten leaves a mantissa of 0.999… (read "1.000 × 10⁴⁴")."""
    return format_value(float(q.value), q.unit.to_string(), 3)


def method_entry(method: Method, events: tuple[str, ...]) -> MethodEntry:
    """A registered method's texts as the page sets them."""
    citation = method.citation
    if method.arxiv and f"arXiv:{method.arxiv}" not in citation:
        citation += f" (arXiv:{method.arxiv})"
    return MethodEntry(
        method,
        events,
        translated(method.title),
        linked(citation),
        scripts(method.formula),
        scripts(translated(method.validity)),
        scripts(translated(method.accuracy)),
    )


def linked(text: str) -> Markup:
    """``text`` escaped, with each ``arXiv:ID`` a link to the abstract."""

    def link(m: re.Match[str]) -> str:
        return f'<a href="{ARXIV_URL}{m.group(1)}">arXiv:{m.group(1)}</a>'

    return Markup(_ARXIV.sub(link, str(escape(text))))


def scripts(text: str) -> Markup:
    """``text`` escaped, with ``^{...}`` and ``_{...}`` set as superscripts and subscripts."""

    def tag(m: re.Match[str]) -> str:
        name = "sup" if m.group(1) == "^" else "sub"
        return f"<{name}>{m.group(2)}</{name}>"

    return Markup(_SCRIPT.sub(tag, str(escape(text))))


#: Units of a delay, largest first: (seconds, name, from how many seconds it is used); a year
#: from 360 days.
_UNITS = (
    (365.25 * 86400, "year", 360 * 86400),
    (86400, "day", 86400),
    (3600, "hour", 3600),
    (60, "minute", 100),
    (1, "second", 0),
)


def delay_words(seconds: float) -> tuple[float, str]:
    """A delay's size to two significant figures and its unit: (60.0, "day")."""
    x = abs(seconds)
    for size, unit, from_ in _UNITS:
        if x >= from_:
            return float(f"{x / size:.2g}"), unit
    return 0.0, "second"


def _number(value: float) -> str:
    """A delay's size as written in the language in use: ``8.3`` / ``8,3``."""
    return decimal_text(value, len(f"{value:g}".partition(".")[2]))


def _amount(value: float, unit: str) -> str:
    """``60 days``, ``1 year``: a delay's size with its unit in words."""
    n = _number(value)
    if unit == "year":
        return ngettext("{n} year", "{n} years", value).format(n=n)
    if unit == "day":
        return ngettext("{n} day", "{n} days", value).format(n=n)
    if unit == "hour":
        return ngettext("{n} hour", "{n} hours", value).format(n=n)
    if unit == "minute":
        return ngettext("{n} minute", "{n} minutes", value).format(n=n)
    return ngettext("{n} second", "{n} seconds", value).format(n=n)


def delay_range(spec: WindowSpec) -> str:
    """A rest-frame window in words: "6 hours to 3 days", "3 to 14 days", "1 second before to
    10 seconds after"."""
    start, end = (float(q.to_value("s")) for q in (spec.start, spec.end))
    (n0, u0), (n1, u1) = delay_words(start), delay_words(end)
    first, last = _amount(n0, u0), _amount(n1, u1)
    if start < 0:
        if end > 0:
            return _("{first} before to {last} after").format(first=first, last=last)
        return _("{first} before to {last} before").format(first=first, last=last)
    if u0 == u1:  # one unit: "3 to 14 days", "1 to 3 years"
        first = _number(n0)
    # TRANSLATORS: a range of delays, "6 hours to 3 days" or, in one unit, "3 to 14 days".
    return _("{first} to {last}").format(first=first, last=last)
