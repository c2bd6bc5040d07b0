"""The sheet's "what if it was magnified by a lens" panel: a small table, the plain conclusion
and the honest caveat, from the cases derive found (:class:`~factsheet.model.Lensing`).

Each row prints its numbers by the rules every other number follows
(:func:`factsheet.render.numbers.value_text`: rounded by the uncertainty); the first row is the
event as measured, without a lens, as the sheet's own table prints it. A body's verdict at a
magnification is the band it probably (at least half of its samples) lies in, relative to the
pair-instability gap; the conclusion names the smallest listed magnification that puts both
bodies below the gap, or says that none of them does.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

from factsheet import labels
from factsheet.i18n import N_, _
from factsheet.model import Caveat, Derived, FigureInfo, LensedCase
from factsheet.notation import unit_text
from factsheet.render import numbers
from factsheet.render.contexts import converted
from factsheet.render.sound import exact

#: Caveats the panel says itself (the sheet places them here, not in the boxes).
LENSING_NOTES = ("lensing-what-if", "lensing-beyond-table")
BELOW = ("neutron_star", "lower_gap", "stellar_black_hole")
PROBABLY = 0.5
#: Where a body probably lies, relative to the pair-instability gap, in a table cell (one body,
#: named by its symbol; translate with ``_`` where shown).
WHERE = {
    "below": N_("{body} below the gap"),
    "in": N_("{body} in the gap"),
    "above": N_("{body} above the gap"),
    "edge": N_("{body} at the gap's edge"),
}
#: Both bodies in the same place.
WHERE_BOTH = {
    "below": N_("both below the gap"),
    "in": N_("both in the gap"),
    "above": N_("both above the gap"),
    "edge": N_("both at the gap's edge"),
}
BODIES = ("heavier", "lighter")
#: Distances in the panel are in Gpc: magnified ones run to tens of thousands of Mpc.
DISTANCE_UNIT = "Gpc"


@dataclass(frozen=True)
class LensRow:
    """One magnification (or the event as measured): its numbers as printed and, per body,
    where it probably lies relative to the pair-instability gap."""

    magnification: str  # "4", or the words for no lens
    distance: str
    redshift: str
    heavier: str
    lighter: str
    remnant: str  # "" when the sheet gives no remnant
    where: str  # "both below the gap", "m₁ in the gap, m₂ below the gap", ...
    measured: bool = False  # the event as measured, without a lens


@dataclass(frozen=True)
class LensPanel:
    """The context of the panel: the rows, the conclusion, the caveats, the figure."""

    rows: tuple[LensRow, ...]
    conclusion: str
    notes: tuple[str, ...]  # the honest caveat first, then any left-out magnification
    gap: str  # the gap's edges as used, "45–130 M⊙"
    remnant: bool  # whether the table has a remnant column
    figures: tuple[FigureInfo, ...]


def where(bands: Mapping[str, float]) -> str:
    """Where a mass probably lies: ``below``, ``in`` or ``above`` the gap, or at an ``edge``."""
    below = sum(bands.get(b, 0.0) for b in BELOW)
    for key, p in (("below", below), ("in", bands.get("pair_instability_gap", 0.0))):
        if p >= PROBABLY:
            return key
    return "above" if bands.get("above_gap", 0.0) >= PROBABLY else "edge"


def where_text(found: dict[str, str]) -> str:
    """Both bodies' places in a table cell, in the language in use."""
    if found["heavier"] == found["lighter"]:
        return _(WHERE_BOTH[found["heavier"]])
    return ", ".join(
        _(WHERE[found[b]]).format(body=labels.QUANTITIES[f"{b}_mass"].short) for b in BODIES
    )


def _row(item: Derived, case: LensedCase) -> LensRow:
    text = numbers.value_text
    found = {b: where(case.mass_bands[b]) for b in BODIES}
    return LensRow(
        magnification_text(case.magnification),
        text(converted(case.distance, DISTANCE_UNIT)),
        text(case.redshift),
        text(case.heavier_mass),
        text(case.lighter_mass),
        text(case.remnant_mass) if case.remnant_mass else "",
        where_text(found),
    )


def _measured(item: Derived) -> LensRow:
    """The event as its sheet prints it, without a lens."""
    q = item.quantities
    found = {b: where(item.mass_bands[b]) for b in BODIES}
    shown = {k: numbers.quantity_text(item, k) if k in q else "" for k in _KEYS}
    kind = numbers.kind_of(item, "distance")
    shown["distance"] = numbers.value_text(converted(q["distance"], DISTANCE_UNIT), kind)
    return LensRow(
        _("none (as measured)"), *(shown[k] for k in _KEYS), where_text(found), measured=True
    )


_KEYS = ("distance", "redshift", "heavier_mass", "lighter_mass", "remnant_mass")


def conclusion(cases: tuple[LensedCase, ...]) -> str:
    """The plain conclusion: the smallest listed magnification that puts both bodies below the
    gap, and what the one before it would leave; or that none of them does (in the language
    in use)."""
    places = [{b: where(c.mass_bands[b]) for b in BODIES} for c in cases]
    first = next((i for i, p in enumerate(places) if set(p.values()) == {"below"}), None)
    if first is None:
        last, p = cases[-1], places[-1]
        left = [b for b in BODIES if p[b] != "below"]
        if len(left) == 2:
            text = _(
                "Even magnified {times}, the heavier body and the lighter body would probably "
                "not lie below the pair-instability gap."
            )
        elif left == ["heavier"]:
            text = _(
                "Even magnified {times}, the heavier body would probably not lie below the "
                "pair-instability gap."
            )
        else:
            text = _(
                "Even magnified {times}, the lighter body would probably not lie below the "
                "pair-instability gap."
            )
        return text.format(times=_times(last))
    said = _(
        "Magnified {times}, both bodies would probably lie below the pair-instability gap."
    ).format(times=_times(cases[first]))
    if first == 0:
        return said
    before, p = cases[first - 1], places[first - 1]
    left = [b for b in BODIES if p[b] != "below"]
    if len(left) == 2:
        then = _("Magnified {times}, neither would yet.")
    elif left == ["heavier"]:
        then = _("Magnified {times}, the heavier body would not yet.")
    else:
        then = _("Magnified {times}, the lighter body would not yet.")
    return f"{said} {then.format(times=_times(before))}"


def _times(case: LensedCase) -> str:
    # TRANSLATORS: a magnification: "25 times" (magnified 25 times).
    return _("{mu} times").format(mu=magnification_text(case.magnification))


def magnification_text(mu: float) -> str:
    """A magnification as the editors or the catalogue gave it (an exact input number), with
    the decimal sign of the language in use."""
    return exact(mu)


def lens_panel(
    item: Derived, caveats: list[Caveat], figures: tuple[FigureInfo, ...]
) -> LensPanel | None:
    """The panel of a sheet, or None when the event has none (or is retracted)."""
    found = item.lensing
    if found is None or not found.cases or item.event.status == "retracted":
        return None
    edges = item.reference.mass_bands
    low, high = (
        e.value.to_value("solMass")
        for e in (edges.pair_instability_lower, edges.pair_instability_upper)
    )
    gap = f"{exact(low)}–{exact(high)} {unit_text('solMass')}"
    rows = (_measured(item), *(_row(item, c) for c in found.cases))
    notes = tuple(c.text for c in caveats if c.code in LENSING_NOTES)
    has_remnant = any(r.remnant for r in rows)
    lens_figures = tuple(f for f in figures if f.path.endswith("-lensing.svg"))
    return LensPanel(rows, conclusion(found.cases), notes, gap, has_remnant, lens_figures)
