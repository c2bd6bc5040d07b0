"""The context of ``index.html``: one row per sheet, the count of sheets and the exports.

The count comes from the events of the build, never from the catalogue's description; an
internal build also says how many of its sheets a public build leaves out (internal only, or
with an embargo date) and badges those rows. Rendering keeps no clock: a row is badged as
embargoed whenever its event has an ``embargo_until``, with that date, as the sheet itself does.
"""

from __future__ import annotations

from dataclasses import dataclass

import astropy.units as u

from factsheet import labels
from factsheet.i18n import _, decimal_text, ngettext
from factsheet.model import Derived, SiteFigure
from factsheet.notation import format_value
from factsheet.render.contexts import page_of
from factsheet.render.numbers import quantity_text, shown

#: The catalogue exports the index links to (site paths), with their format's name.
EXPORTS = (("data/catalogue.csv", "CSV"), ("data/catalogue.ecsv", "ECSV"))

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
    embargo = event.embargo_until.utc.isot[:16].replace("T", " ") if event.embargo_until else ""
    return IndexRow(
        id=event.id,
        title=event.title,
        page=page_of(event.id),
        date=event.time.utc.isot[:10],
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
