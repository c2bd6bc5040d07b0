"""Figures of the fact sheets and the catalogue index: draw given numbers, return SVG-ready Figures.

Each public function takes numbers computed elsewhere and returns a ``Drawing`` (a matplotlib
``Figure`` made without pyplot, and its alt text); ``to_svg`` turns a Figure into reproducible SVG.
"""

from factsheet.figures.catalogue import distance_mass, mass_plane
from factsheet.figures.event import comparison_bars, component_intervals
from factsheet.figures.inputs import (
    DistanceItem,
    Drawing,
    HistoryItem,
    IntervalItem,
    PlaneItem,
    Track,
    WindowItem,
)
from factsheet.figures.svg import to_svg
from factsheet.figures.timeline import history, window_timeline
from factsheet.figures.track import frequency_track

__all__ = [
    "DistanceItem",
    "Drawing",
    "HistoryItem",
    "IntervalItem",
    "PlaneItem",
    "Track",
    "WindowItem",
    "comparison_bars",
    "component_intervals",
    "distance_mass",
    "frequency_track",
    "history",
    "mass_plane",
    "to_svg",
    "window_timeline",
]
