"""One quantity, one number: how every page prints a quantity of an event.

The sheet's table, its headline, the index, the history, the changes page, the feed, the
figures' labels and alt text and the sound's words all print a quantity through these
functions, so it reads the same everywhere: a value the editors gave keeps the digits they gave
it with, a derived one is rounded by its uncertainty (PDG rule), and energies and short times
are in the unit a reader expects (:func:`~factsheet.render.contexts.display_summary`).
"""

from __future__ import annotations

from factsheet.derive.event import input_name, measured_names
from factsheet.i18n import _
from factsheet.model import Derived, Summary
from factsheet.notation import (
    format_given,
    format_given_median,
    format_interval,
    format_median,
    format_value,
)
from factsheet.render.contexts import display_summary

AS_GIVEN = ("given", "fixed")


def value_text(s: Summary, kind: str = "derived") -> str:
    """A summary as the pages print it: an input value as the editors wrote it, else rounded
    by its uncertainty, or a bound when the median rounds to zero against a lower bound of
    zero (never "0.0 +0.5 −0.0")."""
    if kind in AS_GIVEN:
        return format_given(s.median, s.low, s.high, s.unit)
    text = format_interval(s.median, s.low, s.high, s.unit)
    at_zero = s.low == 0 or 0 <= s.low < 1e-9 * s.high
    if at_zero and s.high > 0 and format_median(s.median, s.low, s.high).strip("0.") == "":
        # TRANSLATORS: a value whose median rounds to zero, given as its upper bound
        return _("below {value}").format(value=format_value(s.high, s.unit, 2))
    return text


def kind_of(item: Derived, key: str) -> str:
    """How a quantity of the event came about: given, fixed, samples or derived."""
    return measured_names(item.event).get(key, "derived")


def shown(item: Derived, key: str) -> Summary:
    """The summary of a quantity in the unit the pages print it in."""
    return display_summary(item.quantities[key], item.settings.energy_units)


def quantity_text(item: Derived, key: str) -> str:
    """A quantity of an event as every page prints it, with its unit."""
    return value_text(shown(item, key), kind_of(item, key))


def median_text(item: Derived, key: str, scale: float = 1.0, unit: bool = False) -> str:
    """The median of a quantity exactly as :func:`quantity_text` prints it (times ``scale``,
    for a percentage), with or without its unit."""
    s = shown(item, key)
    values = (scale * s.median, scale * s.low, scale * s.high, s.unit if unit else "")
    if kind_of(item, key) in AS_GIVEN:
        return format_given_median(*values)
    return format_median(*values)


def estimate_texts(item: Derived) -> dict[str, str]:
    """The values of the event's current estimate as its sheet prints them, by estimate path
    (``heavier.mass``): the history, the changes page and the feed list them so."""
    frame = item.event.frame
    return {
        path: quantity_text(item, input_name(path, frame))
        for path in item.event.estimate.values()
        if input_name(path, frame) in item.quantities
    }
