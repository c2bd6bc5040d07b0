"""Figures of the fact sheets and the catalogue index: draw given numbers, return SVG-ready Figures.

Each public function takes numbers computed elsewhere and returns a ``Drawing`` (a matplotlib
``Figure`` made without pyplot, and its alt text); ``to_svg`` turns a Figure into reproducible SVG;
``share_png`` draws a sheet's sharing image (PNG).
"""

from factsheet.figures.catalogue import distance_mass, mass_plane
from factsheet.figures.event import comparison_points, component_intervals
from factsheet.figures.inputs import (
    ComparisonItem,
    DistanceItem,
    Drawing,
    HistoryItem,
    IntervalItem,
    PlaneItem,
    Track,
    WindowItem,
)
from factsheet.figures.share import ShareBody, ShareCard, share_png
from factsheet.figures.sky import (
    SkyMark,
    SkyRegions,
    SkyTexts,
    close_up_box,
    sky_figure,
    sky_thumbnail,
)
from factsheet.figures.svg import to_svg
from factsheet.figures.timeline import history, window_timeline
from factsheet.figures.track import frequency_track

__all__ = [
    "ComparisonItem",
    "DistanceItem",
    "Drawing",
    "HistoryItem",
    "IntervalItem",
    "PlaneItem",
    "ShareBody",
    "ShareCard",
    "SkyMark",
    "SkyRegions",
    "SkyTexts",
    "Track",
    "WindowItem",
    "close_up_box",
    "comparison_points",
    "component_intervals",
    "distance_mass",
    "frequency_track",
    "history",
    "mass_plane",
    "share_png",
    "sky_figure",
    "sky_thumbnail",
    "to_svg",
    "window_timeline",
]
