"""The context of ``index.html``: one row per sheet, the count of sheets and the exports, and
the index's rows as data (``index-rows.js``).

The count comes from the events of the build, never from the catalogue's description; an
internal build also says how many of its sheets a public build leaves out (internal only, or
with an embargo date) and badges those rows. Rendering keeps no clock: a row is badged as
embargoed whenever its event has an ``embargo_until``, with that date, as the sheet itself does.

The page's HTML holds the first :data:`PAGE_SIZE` rows (the whole table of a small catalogue);
every row is in ``index-rows.js`` beside the page, from which ``static/catalogue.js`` sorts,
filters and pages the table (:func:`rows_script`).
"""

from __future__ import annotations

import json
from collections.abc import Callable, Mapping
from dataclasses import dataclass, field

import astropy.units as u

from factsheet import labels
from factsheet.i18n import _, decimal_text, grouping, localized, ngettext, pgettext
from factsheet.model import Derived, SiteFigure
from factsheet.notation import format_value, utc_iso
from factsheet.render.contexts import page_of
from factsheet.render.numbers import quantity_text, shown

#: The catalogue exports the index links to (site paths), with their format's name.
EXPORTS = (("data/catalogue.csv", "CSV"), ("data/catalogue.ecsv", "ECSV"))

#: Rows the index page holds in its HTML, and rows per page of the scripted table.
PAGE_SIZE = 100

#: The file beside each language's index page that holds every row of its table as data.
ROWS_FILE = "index-rows.js"

#: The global that ``index-rows.js`` assigns its one JSON value to (read by catalogue.js).
ROWS_GLOBAL = "factsheetIndexRows"

#: The fields of a row in ``index-rows.js``, in order (:func:`rows_data`).
ROW_FIELDS = (
    "id", "href", "status", "class", "date", "title", "title_lang", "withheld", "bands",
    "heavier_mass", "lighter_mass", "remnant_mass", "energy_radiated", "distance", "sky",
    "sky_thumbnail",
)  # fmt: skip

#: Bands the index flags for a body (and intermediate mass for any subject) when more likely
#: than not.
FLAGGED_BANDS = ("neutron_star", "lower_gap", "pair_instability_gap")


@dataclass(frozen=True)
class IndexRow:
    id: str
    title: str
    page: str
    date: str
    status: str
    source_class: str
    visibility: str
    embargo_until: str  # "YYYY-MM-DD HH:MM" (UTC) or ""
    band_flags: tuple[str, ...]
    heavier_mass: Cell | None
    lighter_mass: Cell | None
    remnant_mass: Cell | None
    energy_radiated: Cell | None
    distance: Cell | None
    sky: Cell | None = None  # the 90 % sky area: the sky map's, else the one given
    sky_thumbnail: str = ""  # site path of the sky map's small figure, or ""

    @property
    def withheld(self) -> str:
        """Why a public build leaves this row out, in words ("" when it does not)."""
        if self.visibility == "internal":
            return labels.INTERNAL_ONLY
        if self.embargo_until:
            return _("embargoed until {time} UTC").format(time=self.embargo_until)
        return ""


@dataclass(frozen=True)
class IndexCount:
    """How many sheets the index holds; in an internal build, how many of them a public build
    leaves out."""

    sheets: int
    internal: int
    embargoed: int

    @property
    def text(self) -> str:
        """``This catalogue holds 13 fact sheets.`` (internal builds name what is withheld)."""
        n = decimal_text(self.sheets, 0)
        if not (self.internal or self.embargoed):
            return ngettext(
                "This catalogue holds {n} fact sheet.",
                "This catalogue holds {n} fact sheets.",
                self.sheets,
            ).format(n=n)
        words = {
            "total": ngettext("{n} fact sheet", "{n} fact sheets", self.sheets).format(n=n),
            "internal": ngettext("{n} internal only", "{n} internal only", self.internal).format(
                n=decimal_text(self.internal, 0)
            ),
            "embargoed": ngettext(
                "{n} with an embargo date", "{n} with an embargo date", self.embargoed
            ).format(n=decimal_text(self.embargoed, 0)),
        }
        if self.internal and self.embargoed:
            text = _(
                "This catalogue holds {total}, {internal} and {embargoed}: a public build leaves "
                "out internal sheets, and embargoed ones until their embargo ends."
            )
        elif self.internal:
            text = _(
                "This catalogue holds {total}, {internal}: a public build leaves out internal "
                "sheets, and embargoed ones until their embargo ends."
            )
        else:
            text = _(
                "This catalogue holds {total}, {embargoed}: a public build leaves out internal "
                "sheets, and embargoed ones until their embargo ends."
            )
        return text.format(**words)


@dataclass(frozen=True)
class IndexPage:
    """The context of ``index.html``."""

    rows: tuple[IndexRow, ...]
    description: str
    index_figures: tuple[SiteFigure, ...]
    count: IndexCount
    exports: tuple[tuple[str, str], ...] = EXPORTS  # (site path, format name)
    page_size: int = PAGE_SIZE  # rows in the page's HTML, and per page of the scripted table
    rows_file: str = ROWS_FILE  # every row as data, beside the page
    # the rows the page's HTML holds: the first page_size in the catalogue's order
    first_rows: tuple[IndexRow, ...] = field(init=False)
    # when the HTML holds only some rows, what a reader without the script is told ("" else)
    partial_note: str = field(init=False)

    def __post_init__(self) -> None:
        first = self.rows[: self.page_size]
        object.__setattr__(self, "first_rows", first)
        note = ""
        if len(first) < len(self.rows):
            note = ngettext(
                "Without its script this page lists only the first {shown} of the {total} fact "
                "sheet, in the catalogue's order.",
                "Without its script this page lists only the first {shown} of the {total} fact "
                "sheets, in the catalogue's order.",
                len(self.rows),
            ).format(shown=decimal_text(len(first), 0), total=decimal_text(len(self.rows), 0))
        object.__setattr__(self, "partial_note", note)


@dataclass(frozen=True)
class Cell:
    """A number of the table as the sheets print it, and the value it sorts by."""

    text: str
    sort: float


def cell(item: Derived, key: str) -> Cell | None:
    """A quantity of the event as every page prints it (:mod:`factsheet.render.numbers`)."""
    if key not in item.quantities:
        return None
    return Cell(quantity_text(item, key), shown(item, key).median)


def sky_cell(item: Derived) -> Cell | None:
    """The 90 % sky area as the sheet says it: the map's when there is one, else the given."""
    found = item.sky_map.area_90 if item.sky_map is not None else item.event.detection.sky_area
    if found is None:
        return None
    area = float(found.to_value(u.deg**2))
    return Cell(f"{format_value(area, '', 2)} deg²", area)


def sky_thumbnail(event_id: str) -> str:
    """Where the small sky figure of an event with a sky map is published."""
    return f"events/{event_id}-sky-small.svg"


def band_flags(item: Derived, threshold: float = 0.5) -> tuple[str, ...]:
    """Short labels of the notable bands a body is more likely than not to be in, and of
    intermediate mass when a body or the remnant probably is."""
    flags = [
        labels.BANDS[band]
        for band in FLAGGED_BANDS
        if any(item.mass_bands.get(b, {}).get(band, 0) > threshold for b in ("heavier", "lighter"))
    ]
    if any(p > threshold for p in item.intermediate_mass.values()):
        flags.append(labels.INTERMEDIATE_MASS)
    return tuple(flags)


def index_row(item: Derived, audience: str = "public") -> IndexRow:
    """One row of the index table, numbers in the units the sheets use; visibility and embargo
    only in an internal build (a public build's page carries no trace of them)."""
    event = item.event
    internal = audience == "internal"
    embargo = utc_iso(event.embargo_until)[:16].replace("T", " ") if event.embargo_until else ""
    return IndexRow(
        id=event.id,
        title=event.title,
        page=page_of(event.id),
        date=utc_iso(event.time)[:10],
        status=event.status,
        source_class=item.source_class,
        visibility=event.visibility if internal else "public",
        embargo_until=embargo if internal else "",
        band_flags=band_flags(item),
        heavier_mass=cell(item, "heavier_mass"),
        lighter_mass=cell(item, "lighter_mass"),
        remnant_mass=cell(item, "remnant_mass"),
        energy_radiated=cell(item, "energy_radiated"),
        distance=cell(item, "distance"),
        sky=sky_cell(item),
        sky_thumbnail=sky_thumbnail(event.id) if item.sky_map is not None else "",
    )


def index_page(
    derived: list[Derived], description: str, figures: list[SiteFigure], audience: str
) -> IndexPage:
    rows = tuple(index_row(d, audience) for d in derived)
    internal = sum(r.visibility == "internal" for r in rows)
    embargoed = sum(r.visibility != "internal" and bool(r.embargo_until) for r in rows)
    return IndexPage(rows, description, tuple(figures), IndexCount(len(rows), internal, embargoed))


def rows_data(
    page: IndexPage, link: Callable[[str], str], original: Callable[[object], str]
) -> dict[str, object]:
    """Every row of the index as the page's HTML writes it, as data for ``catalogue.js``, in
    the language in use: texts as shown (numbers with the language's decimal sign), each
    number with the value it sorts by, and the words the rows are made of.

    ``link`` makes a site path relative to the index page (the ``url`` filter); ``original``
    gives the language of a title shown in its original language for want of a version in the
    page's (the ``original_language`` filter), or "". A row is a list of :data:`ROW_FIELDS`; a
    number is ``[text, sort value]`` or null.
    """

    def number(found: Cell | None) -> list[object] | None:
        return None if found is None else [str(found.text), float(found.sort)]

    rows = []
    for row in page.rows:
        title_lang = original(row.title)
        rows.append(
            [
                row.id,
                link(row.page),
                row.status,
                row.source_class,
                row.date,
                str.__str__(row.title) if title_lang else str(localized(row.title)),
                title_lang,
                str(row.withheld),
                ", ".join(str(flag) for flag in row.band_flags),
                number(row.heavier_mass),
                number(row.lighter_mass),
                number(row.remnant_mass),
                number(row.energy_radiated),
                number(row.distance),
                number(row.sky),
                link(row.sky_thumbnail) if row.sky_thumbnail else "",
            ]
        )
    group, min_digits = grouping()
    return {
        "format": 1,
        "page_size": page.page_size,
        "digits": {"group": group, "min_digits": min_digits},
        "words": row_words(),
        "fields": list(ROW_FIELDS),
        "rows": rows,
    }


def row_words() -> dict[str, object]:
    """The words the table's rows are made of, in the language in use (the same messages as
    the rows of ``index.html``); ``{event}`` and ``{area}`` are filled in by the script."""
    return {
        "status": {
            status: pgettext("event status", status)
            for status in ("confirmed", "candidate", "retracted")
        },
        "classes": {code: str(name) for code, name in labels.CLASS_NAMES.items()},
        "not_computed": _("not computed for this pair"),
        "not_given": _("not given"),
        "sky_alt": _("Sky map of %(event)s: its 90 %% region covers %(area)s")
        % {"event": "{event}", "area": "{area}"},
    }


def rows_script(data: Mapping[str, object]) -> bytes:
    """``index-rows.js``: one JSON value assigned to a global, read by ``catalogue.js``.

    A script rather than a ``.json`` file because a page opened from ``file://`` may not fetch
    a file (and the pages' content policy allows no fetch at all), while a ``<script src>`` of
    the site's own loads from disk as over http. Keys in a fixed order, no floats formatted by
    the locale: two builds write the same bytes.
    """
    text = json.dumps(data, ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    head = "// factsheet: every row of the index table, as data for static/catalogue.js.\n"
    return f"{head}window.{ROWS_GLOBAL} = {text};\n".encode()
