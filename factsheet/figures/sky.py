"""The all-sky figure and its index thumbnail: a sky map's 50 % and 90 % credible regions on an
equal-area Mollweide projection of equatorial coordinates, centred on right ascension 0h with
right ascension increasing to the left (east left, as the sky is seen from inside).

Both draw a grid of credible levels (rows of declination from −90° up, columns of right ascension
from 0° up, cell centres): a cell is inside the region of level p when its level is at most p.
The contours are traced on the grid in longitude and latitude, padded by one wrapped column on
each side and by a row at each pole, so that a region across 0h or over a pole closes where it
should; their vertices are then projected and drawn as plain paths (the projection's axes would
interpolate every segment and make the file large).
"""

from __future__ import annotations

import math
from typing import NamedTuple

import contourpy
import matplotlib as mpl
import numpy as np
from matplotlib.axes import Axes
from matplotlib.lines import Line2D
from matplotlib.patches import Ellipse, Patch, PathPatch
from matplotlib.path import Path
from matplotlib.projections.geo import MollweideAxes
from matplotlib.transforms import Affine2D

from factsheet.figures import style
from factsheet.figures.inputs import Drawing
from factsheet.i18n import _

INNER, OUTER = 0.5, 0.9  # the credible levels drawn
CENTRE_RA = 0.0  # degrees: the map's central meridian
HALF_WIDTH, HALF_HEIGHT = 2 * math.sqrt(2), math.sqrt(2)  # the projection's ellipse, unit sphere
RA_HOURS = (0, 3, 6, 9, 15, 18, 21)  # labelled meridians (12h is the map's edge)
DECS = (-60, -30, 0, 30, 60)  # labelled parallels
CANDIDATE_MARKERS = ("^", "s", "D", "v", "P", "X", "p", "h")
NAME_WIDTH = 24  # characters of a legend name before it wraps (two columns in the width)
THUMB_CELL = 4  # grid cells merged into one along each axis for the thumbnail
CLOSE_UP_SPAN = 40.0  # degrees of sky: a 90 % region no wider nor taller gets a close-up
CLOSE_UP_MIN_HALF = 3.0  # degrees: the close-up shows at least 6° × 6°
CLOSE_UP_SIZE = 1.8  # inches: the close-up's square panel
CLOSE_UP_LEFT = 0.62  # inches left of it, for the declinations
CLOSE_UP_BELOW = 0.3  # inches below it, for the right ascensions
NAME_WIDTH_BESIDE = 17  # characters of a legend name beside the close-up before it wraps
RA_STEPS_MIN = (1, 2, 5, 10, 15, 20, 30, 60, 120, 180)  # minutes of time between RA ticks
DEC_STEPS = (1, 2, 5, 10, 15, 20)  # degrees between declination ticks
_PROJECT = MollweideAxes.MollweideTransform(1)


class SkyMark(NamedTuple):
    """A marked position (degrees) and its name; ``note`` is what the sheet prints of it (a
    candidate's credible level, e.g. "at the 42 % level"), spoken in the alt text as given."""

    name: str
    ra: float
    dec: float
    note: str = ""


class SkyRegions(NamedTuple):
    """The credible areas as the sheet prints them ("230 deg²")."""

    area_50: str
    area_90: str


class SkyTexts(NamedTuple):
    """The words the figure shows and says: legend names of the 50 % (``inner``) and 90 %
    (``outer``) regions, and the alt text's opening (what the map is of)."""

    inner: str
    outer: str
    lead: str


def project(ra, dec) -> tuple[np.ndarray, np.ndarray]:
    """Projected x, y of positions in degrees (unit sphere): right ascension east of the centre
    lies left of it (x < 0)."""
    return _project_east((np.asarray(ra, float) - CENTRE_RA + 180.0) % 360.0 - 180.0, dec)


def _project_east(east, dec) -> tuple[np.ndarray, np.ndarray]:
    """Projected x, y of positions ``east`` degrees east of the centre (−180° to 180°)."""
    lon = -np.radians(np.asarray(east, float))
    lat = np.radians(np.asarray(dec, float))
    xy = _PROJECT.transform_non_affine(np.column_stack([np.ravel(lon), np.ravel(lat)]))
    return xy[:, 0].reshape(np.shape(lon)), xy[:, 1].reshape(np.shape(lat))


# --- contours ----------------------------------------------------------------------------------


def _padded(levels: np.ndarray):
    """The grid as longitude east of the centre (−180° to 180°, decreasing RA to the right is
    handled by ``project``), one wrapped column each side and a row at each pole holding the
    lowest level next to it (a pole is inside a region when a cell beside it is)."""
    rows, cols = levels.shape
    ra = (np.arange(cols) + 0.5) * 360.0 / cols
    dec = (np.arange(rows) + 0.5) * 180.0 / rows - 90.0
    lon = (ra - CENTRE_RA + 180.0) % 360.0 - 180.0
    order = np.argsort(lon, kind="stable")
    lon, grid = lon[order], levels[:, order]
    lon = np.concatenate([[lon[-1] - 360.0], lon, [lon[0] + 360.0]])
    grid = np.concatenate([grid[:, -1:], grid, grid[:, :1]], axis=1)
    dec = np.concatenate([[-90.0], dec, [90.0]])
    grid = np.concatenate([np.full((1, cols + 2), grid[0].min()), grid,
                           np.full((1, cols + 2), grid[-1].min())])  # fmt: skip
    return lon, dec, grid.astype(np.float64)


def _to_xy(lon_dec: np.ndarray) -> np.ndarray:
    """Contour vertices (longitude east of the centre, declination) projected, the padding's
    longitudes brought back onto the map's edge."""
    x, y = _project_east(np.clip(lon_dec[:, 0], -180.0, 180.0), lon_dec[:, 1])
    return np.column_stack([x, y])


def region_paths(
    levels: np.ndarray, level: float, tolerance: float
) -> tuple[Path | None, list[np.ndarray]]:
    """The region of credible ``level`` as one filled Path and its outline as projected lines
    (pieces along the map's edge left out: there the map cuts the region, it does not end),
    each simplified to within ``tolerance`` (projected units)."""
    lon, dec, grid = _padded(levels)
    gen = contourpy.contour_generator(
        lon, dec, grid, line_type=contourpy.LineType.Separate,
        fill_type=contourpy.FillType.OuterCode,
    )  # fmt: skip
    points, codes = gen.filled(-1.0, level)
    rings = [
        ring
        for p, c in zip(points, codes, strict=True)
        for ring in np.split(_to_xy(p), np.flatnonzero(c == Path.MOVETO)[1:])
    ]
    fill = Path.make_compound_path(*(_ring(r, tolerance) for r in rings)) if rings else None
    lines = [
        _simplified(piece, tolerance) for line in gen.lines(level) for piece in _off_edge(line)
    ]
    return fill, lines


def _simplified(xy: np.ndarray, tolerance: float) -> np.ndarray:
    """A polyline with the vertices that bend it by less than ``tolerance`` dropped
    (matplotlib's own path simplifier, whose threshold is in transformed units)."""
    scale = mpl.rcParams["path.simplify_threshold"] / tolerance
    path = Path(xy).cleaned(Affine2D().scale(scale), simplify=True)
    return path.vertices[path.codes != Path.STOP] / scale


def _ring(xy: np.ndarray, tolerance: float) -> Path:
    verts = _simplified(xy, tolerance)
    codes = np.full(len(verts), Path.LINETO, dtype=Path.code_type)
    codes[0], codes[-1] = Path.MOVETO, Path.CLOSEPOLY
    return Path(verts, codes)


def _off_edge(line: np.ndarray) -> list[np.ndarray]:
    """A contour line split where it runs in the padding beyond the map's edge, projected."""
    inside = np.abs(line[:, 0]) < 180.0
    pieces, start = [], None
    for k, ok in enumerate(np.append(inside, False)):
        if ok and start is None:
            start = max(k - 1, 0)
        elif not ok and start is not None:
            piece = line[start : min(k + 1, len(line))]
            if len(piece) > 1:
                pieces.append(_to_xy(piece))
            start = None
    return pieces


def coarse(levels: np.ndarray, cell: int) -> np.ndarray:
    """The grid with ``cell`` × ``cell`` blocks merged to their lowest level, so a region never
    shrinks out of sight (it may grow by up to a block)."""
    rows, cols = levels.shape
    r, c = rows // cell, cols // cell
    return levels[: r * cell, : c * cell].reshape(r, cell, c, cell).min(axis=(1, 3))


# --- drawing -----------------------------------------------------------------------------------


def _sky_axes(ax: Axes) -> Ellipse:
    """An empty map: the projection's ellipse (returned, to clip to) and nothing else."""
    ax.set_aspect("equal")
    ax.set_axis_off()
    edge = Ellipse((0, 0), 2 * HALF_WIDTH, 2 * HALF_HEIGHT, facecolor=style.AXES_FACE,
                   edgecolor=style.INK, linewidth=0.8, zorder=0)  # fmt: skip
    ax.add_patch(edge)
    return edge


def _regions(ax: Axes, levels: np.ndarray, edge: Ellipse, line_width: float, tol: float) -> None:
    """The 90 % and 50 % regions, filled and outlined, simplified to ``tol`` points."""
    to_points = ax.get_position().width * ax.figure.get_figwidth() * 72 / (2 * HALF_WIDTH)
    for level, z in ((OUTER, 1), (INNER, 2)):
        key = "outer" if level == OUTER else "inner"
        fill, lines = region_paths(levels, level, tol / to_points)
        if fill is not None:
            patch = PathPatch(fill, facecolor=style.SKY[f"{key}_fill"], lw=0, zorder=z)
            ax.add_patch(patch)
            patch.set_clip_path(edge)
        for xy in lines:
            (line,) = ax.plot(*xy.T, color=style.SKY[f"{key}_line"], lw=line_width, zorder=z + 0.5)
            line.set_clip_path(edge)


def _graticule(ax: Axes, labels: bool) -> None:
    """Parallels and meridians in the grid colour; with ``labels``, the hours along the equator
    and the declinations at the map's left edge."""
    lat = np.linspace(-90, 90, 61)
    for hours in [*RA_HOURS, 12]:
        x, y = project(np.full_like(lat, hours * 15.0), lat)
        ax.plot(x, y, color=style.GRID, lw=0.6, zorder=0.5)
        if labels and hours != 12:
            ax.annotate(f"{hours}h", (x[30], 0), xytext=(0, 2), textcoords="offset points",
                        ha="center", va="bottom", fontsize=style.FONT, zorder=4)  # fmt: skip
    for dec in DECS:
        _, y = project(0.0, dec)
        x = HALF_WIDTH * math.sqrt(max(0.0, 1 - (float(y) / HALF_HEIGHT) ** 2))
        ax.plot([-x, x], [y, y], color=style.GRID, lw=0.6, zorder=0.5)
        if labels:
            text = f"{dec}°".replace("-", "−")
            ax.annotate(text, (-x, y), xytext=(-3, 0), textcoords="offset points",
                        ha="right", va="center", fontsize=style.FONT, color=style.INK)  # fmt: skip


@style.styled
def sky_figure(
    levels: np.ndarray,
    regions: SkyRegions,
    candidates: list[SkyMark],
    peak: SkyMark | None,
    texts: SkyTexts,
) -> Drawing:
    """The credible regions of a sky map on the whole sky, the most probable position and each
    counterpart candidate marked with its own shape; the legend names them below the map."""
    names = [
        texts.inner,
        texts.outer,
        *(m.name for m in [peak] if m),
        *(c.name for c in candidates),
    ]
    map_w = style.WIDTH - 0.62
    box = close_up_box(levels)
    if box is None:  # the map, and the legend in two columns below it
        width = NAME_WIDTH
        legend_h = _legend_height([style.wrapped(name, width) for name in names])
        below = legend_h
    else:  # the map, and below it the close-up with the legend in one column at its right
        width = NAME_WIDTH_BESIDE
        legend_h = _legend_height([style.wrapped(name, width) for name in names], columns=1)
        below = max(CLOSE_UP_SIZE + CLOSE_UP_BELOW + 0.1, legend_h + CLOSE_UP_BELOW)
    height = map_w / 2 + 0.2 + below
    fig = style.new_figure(style.WIDTH, height, (0, 1, 0, 1))
    ax = fig.add_axes((0.56 / style.WIDTH, (below + 0.08) / height,
                       map_w / style.WIDTH, (map_w / 2 + 0.06) / height))  # fmt: skip
    edge = _sky_axes(ax)
    ax.set_xlim(-HALF_WIDTH * 1.01, HALF_WIDTH * 1.01)
    ax.set_ylim(-HALF_HEIGHT * 1.02, HALF_HEIGHT * 1.02)
    _graticule(ax, labels=True)
    _regions(ax, levels, edge, 1.2, 0.25)
    handles = [
        Patch(
            facecolor=style.SKY[f"{key}_fill"],
            edgecolor=style.SKY[f"{key}_line"],
            label=style.wrapped(name, width),
        )
        for key, name in (("inner", texts.inner), ("outer", texts.outer))
    ]
    if peak is not None:
        handles.append(_mark(ax, peak, "*", style.SKY["peak"], 11, width))
    for k, c in enumerate(candidates):
        marker = CANDIDATE_MARKERS[k % len(CANDIDATE_MARKERS)]
        handles.append(_mark(ax, c, marker, style.AXES_FACE, 7, width))
    legend = {"frameon": False, "fontsize": style.FONT, "handletextpad": 0.4}
    if box is None:
        fig.legend(handles=handles, loc="upper center", bbox_to_anchor=(0.5, legend_h / height),
                   ncol=2, columnspacing=1.2, borderaxespad=0.1, **legend)  # fmt: skip
    else:
        _box_outline(ax, box)
        top = CLOSE_UP_BELOW + CLOSE_UP_SIZE
        near = fig.add_axes((CLOSE_UP_LEFT / style.WIDTH, CLOSE_UP_BELOW / height,
                             CLOSE_UP_SIZE / style.WIDTH, CLOSE_UP_SIZE / height))  # fmt: skip
        _close_up(near, levels, box, peak, candidates)
        beside = (CLOSE_UP_LEFT + CLOSE_UP_SIZE + 0.12) / style.WIDTH
        fig.legend(handles=handles, loc="upper left", bbox_to_anchor=(beside, top / height),
                   ncol=1, borderaxespad=0.0, **legend)  # fmt: skip
    return Drawing(fig, _alt(levels, regions, candidates, peak, texts, box))


def _legend_height(names: list[str], columns: int = 2) -> float:
    """Inches taken by the legend (filled column by column), a row 0.26 in and each further
    line of a wrapped name 0.19 in."""
    per = math.ceil(len(names) / columns)
    split = [names[k : k + per] for k in range(0, len(names), per)]
    return 0.1 + max(sum(0.26 + 0.19 * n.count("\n") for n in column) for column in split)


def _mark(ax: Axes, mark: SkyMark, marker: str, face: str, size: float, width: int) -> Line2D:
    x, y = project(mark.ra, mark.dec)
    name = style.wrapped(mark.name, width)
    (line,) = ax.plot([float(x)], [float(y)], marker=marker, ms=size, mfc=face, mec=style.INK,
                      mew=0.9, ls="none", zorder=5, label=name)  # fmt: skip
    return line


@style.styled
def sky_thumbnail(levels: np.ndarray, candidates: list[SkyMark]) -> Drawing:
    """A small all-sky outline with the 90 % and 50 % regions and the candidates as dots, no
    text: for the index table. The grid is merged into coarser cells to keep the file small."""
    fig = style.new_figure(1.6, 0.9, (0, 1, 0, 1))
    ax = fig.add_axes((0.02, 0.04, 0.96, 0.92))
    edge = _sky_axes(ax)
    ax.set_xlim(-HALF_WIDTH * 1.02, HALF_WIDTH * 1.02)
    ax.set_ylim(-HALF_HEIGHT * 1.03, HALF_HEIGHT * 1.03)
    _regions(ax, coarse(levels, THUMB_CELL), edge, 0.8, 0.5)
    x, y = project([c.ra for c in candidates], [c.dec for c in candidates])
    ax.plot(x, y, "o", ms=2.5, mfc=style.INK, mec=style.INK, ls="none", zorder=5)
    level, where = f"{OUTER:.0%}", extent_words(levels, OUTER)
    if candidates:
        alt = _("Sky map: the {level} credible region lies {where}; candidates marked: {names}.")
    else:
        alt = _("Sky map: the {level} credible region lies {where}.")
    names = ", ".join(str(c.name) for c in candidates)
    return Drawing(fig, alt.format(level=level, where=where, names=names).replace("%", " %"))


def _alt(levels, regions: SkyRegions, candidates, peak, texts: SkyTexts, box=None) -> str:
    lead = _(
        "{lead}: an all-sky map in equatorial coordinates, right ascension increasing to the "
        "left. The {inner} covers {area_50} and the {outer} covers {area_90}; the {outer} lies "
        "{where}."
    )
    parts = [
        lead.format(
            lead=texts.lead,
            inner=texts.inner,
            outer=texts.outer,
            area_50=regions.area_50,
            area_90=regions.area_90,
            where=extent_words(levels, OUTER),
        )
    ]
    if box is not None:
        close_up = _(
            "Below it, a close-up {size} across, centred on right ascension {ra} and "
            "declination {dec}, draws the regions and the marks larger."
        )
        size = f"{2 * box.half:.0f}°"
        parts.append(close_up.format(size=size, ra=hours_minutes(box.ra), dec=_deg(box.dec)))
    if peak is not None:
        name = str(peak.name)
        name = name[:1].upper() + name[1:]
        if peak.note:
            parts.append(_("{name} marked ({note}).").format(name=name, note=peak.note))
        else:
            parts.append(_("{name} marked.").format(name=name))
    if candidates:
        said = [f"{c.name} ({c.note})" if c.note else str(c.name) for c in candidates]
        parts.append(_("Candidates marked: {names}.").format(names="; ".join(said)))
    return " ".join(parts)


# --- the close-up of a small region ------------------------------------------------------------


class CloseUp(NamedTuple):
    """A square patch of sky (degrees): its centre and half its side, measured on the sky."""

    ra: float
    dec: float
    half: float


def close_up_box(levels: np.ndarray) -> CloseUp | None:
    """The patch around the 90 % region when that region is small enough to vanish on the whole
    sky (at most CLOSE_UP_SPAN degrees each way) and away from the poles; else None."""
    e = extent(levels, OUTER)
    if e is None or e.ra_from is None:
        return None
    arc = (e.ra_to - e.ra_from) % 360.0
    dec = (e.dec_low + e.dec_high) / 2
    span = max(arc * math.cos(math.radians(dec)), e.dec_high - e.dec_low)
    half = max(CLOSE_UP_MIN_HALF, 0.65 * span)
    if span > CLOSE_UP_SPAN or abs(dec) + half > 80.0:
        return None
    return CloseUp((e.ra_from + arc / 2) % 360.0, dec, half)


def _east_of(ra, centre: float) -> np.ndarray:
    """Degrees of right ascension east of ``centre`` (−180° to 180°)."""
    return (np.asarray(ra, float) - centre + 180.0) % 360.0 - 180.0


def _box_outline(ax: Axes, box: CloseUp) -> None:
    """The close-up's patch outlined on the whole-sky map."""
    half_ra = box.half / math.cos(math.radians(box.dec))
    side = np.linspace(-1.0, 1.0, 21)
    east = np.concatenate([side, np.ones(21), side[::-1], -np.ones(21)]) * half_ra
    dec = box.dec + np.concatenate([-np.ones(21), side, np.ones(21), side[::-1]]) * box.half
    x, y = project(box.ra + east, dec)
    ax.plot(x, y, color=style.INK, lw=0.8, zorder=4)


def _close_up(ax: Axes, levels: np.ndarray, box: CloseUp, peak, candidates) -> None:
    """The regions and marks on the patch, right ascension increasing to the left, the patch's
    side the same length of sky both ways (the axes are square)."""
    rows, cols = levels.shape
    half_ra = box.half / math.cos(math.radians(box.dec))
    east = _east_of((np.arange(cols) + 0.5) * 360.0 / cols, box.ra)
    dec = (np.arange(rows) + 0.5) * 180.0 / rows - 90.0
    columns = np.flatnonzero(np.abs(east) <= half_ra + 1.0)
    columns = columns[np.argsort(east[columns], kind="stable")]
    rows_kept = np.abs(dec - box.dec) <= box.half + 1.0
    grid = levels[np.ix_(rows_kept, columns)].astype(np.float64)
    x, y = east[columns], dec[rows_kept]
    ax.set_facecolor(style.AXES_FACE)
    for level, key, z in ((OUTER, "outer", 1), (INNER, "inner", 2)):
        ax.contourf(x, y, grid, levels=[-1.0, level], colors=[style.SKY[f"{key}_fill"]], zorder=z)
        ax.contour(x, y, grid, levels=[level], colors=[style.SKY[f"{key}_line"]],
                   linewidths=1.2, zorder=z + 0.5)  # fmt: skip
    if peak is not None:
        ax.plot([float(_east_of(peak.ra, box.ra))], [peak.dec], marker="*", ms=13,
                mfc=style.SKY["peak"], mec=style.INK, mew=0.9, ls="none", zorder=5)  # fmt: skip
    for k, c in enumerate(candidates):
        ax.plot([float(_east_of(c.ra, box.ra))], [c.dec],
                marker=CANDIDATE_MARKERS[k % len(CANDIDATE_MARKERS)], ms=9, mfc=style.AXES_FACE,
                mec=style.INK, mew=1.0, ls="none", zorder=5)  # fmt: skip
    ax.set_xlim(half_ra, -half_ra)  # east, increasing right ascension, to the left
    ax.set_ylim(box.dec - box.half, box.dec + box.half)
    _close_up_ticks(ax, box, half_ra)
    ax.grid(color=style.GRID, lw=0.6, zorder=0.5)
    ax.tick_params(labelsize=style.FONT, length=3)


def _close_up_ticks(ax: Axes, box: CloseUp, half_ra: float) -> None:
    """Declination every few degrees; right ascension every few minutes of time, labelled
    "10h20m" (whole hours "10h"), about as far apart on the sky as the declination ticks."""
    dec_step = next((s for s in DEC_STEPS if 2 * box.half / s <= 5), DEC_STEPS[-1])
    low = math.ceil((box.dec - box.half) / dec_step) * dec_step
    decs = np.arange(low, box.dec + box.half + 1e-9, dec_step)
    ax.set_yticks(decs, [_deg(d) for d in decs])
    minutes = next((m for m in RA_STEPS_MIN if 2 * half_ra / (m / 4) <= 3), RA_STEPS_MIN[-1])
    step = minutes / 4.0  # degrees
    first = math.ceil((box.ra - half_ra) / step) * step
    ras = np.arange(first, box.ra + half_ra + 1e-9, step)
    ax.set_xticks(_east_of(ras, box.ra), [hours_minutes(r) for r in ras])


def hours_minutes(ra: float) -> str:
    """Right ascension in degrees as "10h20m" (to the minute; whole hours "10h")."""
    total = round((ra % 360.0) * 4) % (24 * 60)
    hours, minutes = divmod(total, 60)
    return f"{hours}h{minutes:02d}m" if minutes else f"{hours}h"


# --- where a region lies, in words ---------------------------------------------------------------


class Extent(NamedTuple):
    """Where a region lies: its right ascension arc in degrees (``ra_from`` eastward to ``ra_to``,
    None when it spans every right ascension), its declination range and the share of its area
    south of the equator."""

    ra_from: float | None
    ra_to: float | None
    dec_low: float
    dec_high: float
    south: float


def extent(levels: np.ndarray, level: float) -> Extent | None:
    """The smallest right ascension arc holding the region (the complement of the widest run of
    empty columns, taken round the circle), its declination range, and its southern share."""
    inside = levels <= level
    if not inside.any():
        return None
    rows, cols = levels.shape
    dec = (np.arange(rows) + 0.5) * 180.0 / rows - 90.0
    weight = (inside * np.cos(np.radians(dec))[:, None]).sum(axis=1)
    south = float(weight[dec < 0].sum() / weight.sum())
    used = np.flatnonzero(inside.any(axis=1))
    dec_low, dec_high = float(dec[used[0]] - 90.0 / rows), float(dec[used[-1]] + 90.0 / rows)
    filled = inside.any(axis=0)
    if filled.all():
        return Extent(None, None, dec_low, dec_high, south)
    start, gap = _widest_gap(filled)
    first = (start + gap) % cols  # the first filled column after the widest gap
    last = (start - 1) % cols
    step = 360.0 / cols
    return Extent(first * step, (last + 1) * step, dec_low, dec_high, south)


def _widest_gap(filled: np.ndarray) -> tuple[int, int]:
    """Start and length of the longest run of False, round the circle."""
    doubled = np.concatenate([filled, filled])
    best, run_start, best_start = 0, None, 0
    for k, f in enumerate(doubled):
        if not f and run_start is None:
            run_start = k
        if f and run_start is not None:
            if k - run_start > best:
                best, best_start = k - run_start, run_start
            run_start = None
    return best_start % len(filled), min(best, len(filled))


def extent_words(levels: np.ndarray, level: float) -> str:
    """E.g. "mostly in the southern sky, between right ascension 2h and 5h and declination
    −40° and −10°" (hours and 5° steps rounded outward)."""
    e = extent(levels, level)
    if e is None:
        return _("nowhere on the grid")
    dec_low = 5 * math.floor(e.dec_low / 5)
    dec_high = 5 * math.ceil(e.dec_high / 5)
    wraps = e.ra_from is not None and e.ra_to < e.ra_from
    hours = None
    if e.ra_from is not None:
        hours = (math.floor(e.ra_from / 15), math.ceil(e.ra_to / 15))
        if hours[1] - hours[0] + 24 * wraps >= 24:
            hours = None  # the arc rounds to the whole circle
    if hours is None and dec_high >= 90 and dec_low > -90:
        return _("around the north celestial pole, north of declination {dec}").format(
            dec=_deg(dec_low)
        )
    if hours is None and dec_low <= -90 and dec_high < 90:
        return _("around the south celestial pole, south of declination {dec}").format(
            dec=_deg(dec_high)
        )
    if hours is None:
        words = _("{hemisphere}, at every right ascension and declination {low} to {high}")
        first = last = ""
    else:
        first, last = f"{hours[0] % 24}h", f"{hours[1] % 24}h"
        if wraps:
            words = _(
                "{hemisphere}, between right ascension {first} and {last} (across 0h) and "
                "declination {low} to {high}"
            )
        else:
            words = _(
                "{hemisphere}, between right ascension {first} and {last} and declination {low} "
                "to {high}"
            )
    return words.format(
        hemisphere=_hemisphere(e.south),
        first=first,
        last=last,
        low=_deg(dec_low),
        high=_deg(dec_high),
    )


def _deg(value: float) -> str:
    return f"{value:.0f}°".replace("-", "−")


def _hemisphere(south: float) -> str:
    if south >= 0.95:
        return _("in the southern sky")
    if south <= 0.05:
        return _("in the northern sky")
    if south >= 0.6:
        return _("mostly in the southern sky")
    if south <= 0.4:
        return _("mostly in the northern sky")
    return _("on both sides of the celestial equator")
