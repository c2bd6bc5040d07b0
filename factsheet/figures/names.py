"""Names of events beside their markers on the catalogue's figures, only where there is room.

A name is tried at a few spots around its marker, in display points, and kept at the first spot
where it covers no other name, no marker and nothing else the caller reserved, inside the axes.
Markers are drawn above names, so no marker is ever hidden; the figures' alt text says how many
events were named, and the index table lists them all.
"""

from __future__ import annotations

import numpy as np

from factsheet.figures import style

#: Where a name may sit beside its marker: offset in pt and the text's alignment.
_SPOTS = (
    (6, 3, "left", "bottom"),
    (-6, 3, "right", "bottom"),
    (6, -3, "left", "top"),
    (-6, -3, "right", "top"),
    (0, 8, "center", "bottom"),
    (0, -8, "center", "top"),
)
MARKER_PT = 5.0  # half the size of the room a marker keeps free of names
GLYPH_EM = 0.65  # DejaVu Sans's widest common glyphs (capitals, digits), in ems: names fit


def _overlaps(box, boxes) -> bool:
    x0, y0, x1, y1 = box
    return any(x0 < b[2] and b[0] < x1 and y0 < b[3] and b[1] < y1 for b in boxes)


def _name_box(x: float, y: float, spot: tuple, width: float, height: float) -> tuple:
    dx, dy, ha, va = spot
    left = x + dx - {"left": 0, "right": width, "center": width / 2}[ha]
    bottom = y + dy - (height if va == "top" else 0)
    return (left, bottom, left + width, bottom + height)


def place(
    ax, xs: np.ndarray, ys: np.ndarray, ids: list[str], order: list[int], taken: list[tuple]
) -> list[int]:
    """Name the events in ``order`` where a name fits beside its marker without covering
    another name, any marker or ``taken`` (boxes in pt); return the events named. Markers are
    drawn above names, so no marker is ever hidden."""
    scale = 72 / ax.figure.dpi
    points = ax.transData.transform(np.column_stack([xs[:, 0], ys[:, 0]])) * scale
    frame = ax.bbox.extents * scale
    boxes = [(x - MARKER_PT, y - MARKER_PT, x + MARKER_PT, y + MARKER_PT) for x, y in points]
    boxes += taken
    named = []
    for i in order:
        width, height = len(ids[i]) * GLYPH_EM * style.FONT, 1.2 * style.FONT
        for spot in _SPOTS:
            box = _name_box(*points[i], spot, width, height)
            inside = frame[0] <= box[0] and box[2] <= frame[2] and frame[1] <= box[1]
            if inside and box[3] <= frame[3] and not _overlaps(box, boxes):
                boxes.append(box)
                named.append(i)
                ax.annotate(
                    ids[i],
                    (xs[i, 0], ys[i, 0]),
                    xytext=spot[:2],
                    textcoords="offset points",
                    ha=spot[2],
                    va=spot[3],
                    fontsize=style.FONT,
                    color=style.INK,
                    zorder=2.5,
                )
                break
    return named


def order(statuses: list[str], chosen: list[int]) -> list[int]:
    """Candidates and retracted events first (their markers say least), then the others."""
    rank = {"candidate": 0, "retracted": 1}
    return sorted(chosen, key=lambda i: (rank.get(statuses[i], 2), i))
