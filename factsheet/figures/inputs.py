"""Plain inputs of the figure functions: numbers already computed elsewhere, nothing derived here.

Masses given as floats are in solar masses and distances in megaparsecs; an astropy Quantity is
accepted wherever a float is and converted to those units before drawing.
"""

from __future__ import annotations

from typing import NamedTuple

import astropy.units as u
import numpy as np
from matplotlib.figure import Figure

Number = float | u.Quantity


class Drawing(NamedTuple):
    """A finished figure and the alt text that states its content in words."""

    figure: Figure
    alt: str


class IntervalItem(NamedTuple):
    """One quantity with its median and the bounds (not offsets) of its credible interval."""

    label: str
    median: float
    low: float
    high: float
    unit_str: str
    level: float  # the credible level of the interval, e.g. 0.9
    shown: str = ""  # the interval as the sheet's table prints it; drawn and spoken as given


class ComparisonItem(NamedTuple):
    """One row of a comparison: a value (with interval bounds for the merger's own, equal to
    the value for a reference object) in the figure's unit, and the text that names it."""

    name: str
    median: float
    low: float
    high: float
    shown: str  # the value as the sheet prints it (the merger's: its interval, as in the table)
    own: bool = False  # the merger's own row


class Track(NamedTuple):
    """A gravitational-wave frequency track, sampled by the caller, and its marked frequencies."""

    time_to_merger_s: np.ndarray
    frequency_hz: np.ndarray
    f_low_hz: float
    f_isco_hz: float
    f_ringdown_hz: float | None = None
    tau_ringdown_s: float | None = None
    texts: dict[str, str] | None = None  # the numbers as the sheet prints them, by quantity key
    note: str = ""  # a sentence drawn in the figure (e.g. that the inspiral ends below the band)


class WindowItem(NamedTuple):
    """A counterpart window in days relative to the merger (negative = before); ``band`` is a key
    of :data:`factsheet.labels.WINDOW_BANDS`."""

    name: str
    band: str
    start_days: float
    end_days: float


class HistoryItem(NamedTuple):
    """One quantity of one dated estimate, with its median and interval bounds."""

    label: str
    date_iso: str
    quantity_label: str
    median: float
    low: float
    high: float
    unit: str | u.UnitBase
    shown: str = ""  # the value as the sheet's history list prints it; spoken as given


class PlaneItem(NamedTuple):
    """One event on the mass plane: medians and interval bounds of the heavier (m1) and the
    lighter (m2) body."""

    id: str
    m1_median: Number
    m1_low: Number
    m1_high: Number
    m2_median: Number
    m2_low: Number
    m2_high: Number
    status: str
    source_class: str


class DistanceItem(NamedTuple):
    """One event on the distance–mass view: luminosity distance and total source-frame mass."""

    id: str
    distance_median: Number
    distance_low: Number
    distance_high: Number
    total_mass_median: Number
    total_mass_low: Number
    total_mass_high: Number
    status: str
