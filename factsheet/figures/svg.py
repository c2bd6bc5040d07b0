"""SVG output that is byte-identical across runs and processes, and carries no links or dates.

Every text is written as plain text (no mathtext, no TeX), whatever characters it holds.
"""

from __future__ import annotations

import io
import re

import matplotlib
from matplotlib.figure import Figure

from factsheet.figures.style import RC, plain_text

# What matplotlib writes before the drawing that we do not want: the DTD reference (a URL) and
# the RDF metadata block (namespace URLs and, unless suppressed, a date and a version).
_DOCTYPE = re.compile(rb"<!DOCTYPE svg[^>]*>\s*")
_METADATA = re.compile(rb"\s*<metadata>.*?</metadata>", re.S)
_NO_METADATA = {"Date": None, "Creator": None, "Type": None, "Format": None}


def to_svg(figure: Figure, close: bool = True) -> bytes:
    """The figure as SVG bytes (fixed hash salt, no date or creator); clears it when ``close``."""
    buffer = io.BytesIO()
    with matplotlib.rc_context(RC):
        plain_text(figure)
        figure.savefig(
            buffer, format="svg", facecolor=figure.get_facecolor(), metadata=_NO_METADATA
        )
    if close:
        release(figure)
    data = _DOCTYPE.sub(b"", buffer.getvalue(), count=1)
    return _METADATA.sub(b"", data, count=1)


def release(figure: Figure) -> None:
    """Empty ``figure``: its Axes taken out without resetting each first (what
    ``Figure.clear`` does, at the cost of re-making every tick of an Axes that is thrown
    away), then the figure's own artists."""
    for ax in tuple(figure.axes):
        figure.delaxes(ax)
    figure.clear()
