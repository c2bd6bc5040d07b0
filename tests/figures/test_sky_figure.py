"""The all-sky figure and its thumbnail, drawn from level grids of small invented HEALPix maps.

The maps are made here with astropy_healpix and ranked by the project's own physics
(``RankedMap``, ``level_grid``), as a sheet's are. Independent checks: Mollweide's projection is
equal-area and puts the equator at x = (2√2/π) λ, y = 0 and the poles at y = ±√2 on the unit
sphere (Snyder 1987, "Map Projections — A Working Manual", USGS Professional Paper 1395, pp.
249–252; recalled from memory), so a region's projected area in the figure is its solid angle in
steradians; and a narrow Gaussian blob on the sky holds probability 1 − exp(−R²/2σ²) within
angular radius R (the Rayleigh distribution, flat-sky limit), so its 90 % region is a disc of
radius σ√(2 ln 10). All positions and names are invented.
"""

from __future__ import annotations

import math
import xml.etree.ElementTree as ET

import astropy.units as u
import numpy as np
import pytest
from astropy_healpix import HEALPix
from figures.test_figure_readability import (
    PHONE_COLUMN_PX,
    contrast,
    font_px,
    text_styles,
    view_width,
)
from helpers import check_compact
from matplotlib.path import Path
from matplotlib.projections.geo import MollweideAxes

from factsheet.figures import (
    SkyMark,
    SkyRegions,
    SkyTexts,
    sky_figure,
    sky_thumbnail,
    style,
    to_svg,
)
from factsheet.figures.sky import close_up_box, hours_minutes, region_paths
from factsheet.physics.sky import RankedMap, level_grid

SVG = "{http://www.w3.org/2000/svg}"
NSIDE = 64
TEXTS = SkyTexts("50 % region", "90 % region", "Where the invented merger Q-7 lies")
THUMB_BYTES = 8000


def separation(nside: int, ra0: float, dec0: float) -> np.ndarray:
    """Angular distance (degrees) of every RING pixel centre from (ra0, dec0)."""
    lon, lat = HEALPix(nside=nside, order="ring").healpix_to_lonlat(np.arange(12 * nside**2))
    cos = np.sin(lat.rad) * math.sin(math.radians(dec0)) + np.cos(lat.rad) * math.cos(
        math.radians(dec0)
    ) * np.cos(lon.rad - math.radians(ra0))
    return np.degrees(np.arccos(np.clip(cos, -1.0, 1.0)))


def blob(ra0: float, dec0: float, sigma: float) -> np.ndarray:
    p = np.exp(-0.5 * (separation(NSIDE, ra0, dec0) / sigma) ** 2)
    return p / p.sum()


def arc() -> np.ndarray:
    """A ring 40° across with one brighter side, the shape a two-site network gives."""
    ring = np.exp(-0.5 * ((separation(NSIDE, 120, 10) - 40) / 3) ** 2)
    p = ring * (1 + np.cos(np.radians(separation(NSIDE, 150, 30)))) ** 3
    return p / p.sum()


MAPS = {
    "compact": lambda: blob(45, -35, 3),
    "arc": arc,
    "broad": lambda: blob(200, 20, 40),
    "across 0h": lambda: blob(0, 10, 5),
    "across 12h": lambda: blob(180, -20, 5),
    "near a pole": lambda: blob(40, -87, 6),
}


@pytest.fixture(scope="module")
def skies() -> dict[str, tuple[RankedMap, np.ndarray]]:
    out = {}
    for name, make in MAPS.items():
        prob = make()
        ranked = RankedMap(prob, NSIDE)
        out[name] = ranked, level_grid(ranked, prob, "RING")
    return out


def regions(ranked: RankedMap) -> SkyRegions:
    return SkyRegions(f"{ranked.area(0.5).value:.0f} deg²", f"{ranked.area(0.9).value:.0f} deg²")


CANDIDATES = [
    SkyMark("AT-Q7a", 90.0, 0.0, "at the 62 % level"),
    SkyMark("Flare $b$", 270.0, 0.0, "outside the 90 % region"),
    SkyMark("Q7-north", 10.0, 90.0, "outside the 90 % region"),
]
PEAK = SkyMark("Most probable position", 45.0, -35.0)


def draw(grid, ranked, candidates=CANDIDATES, peak=PEAK):
    return sky_figure(grid, regions(ranked), candidates, peak, TEXTS)


def ring_area(path: Path) -> float:
    """Signed shoelace area summed over a compound path's closed rings (holes cancel)."""
    total = 0.0
    for ring in path.to_polygons(closed_only=True):
        x, y = ring[:, 0], ring[:, 1]
        total += 0.5 * float(np.dot(x, np.roll(y, -1)) - np.dot(y, np.roll(x, -1)))
    return abs(total)


def unprojected(xy: np.ndarray) -> np.ndarray:
    """(RA east of the centre, Dec) in degrees of projected points: x is minus longitude."""
    lonlat = MollweideAxes.InvertedMollweideTransform(1).transform_non_affine(xy)
    return np.degrees(np.column_stack([-lonlat[:, 0], lonlat[:, 1]]))


# --- the SVG: parses, text as text, sizes, colours ---------------------------------------------


@pytest.mark.parametrize("name", ["compact", "arc", "broad"])
def test_svg_parses_with_text_as_text_at_readable_sizes(skies, name):
    ranked, grid = skies[name]
    svg = to_svg(draw(grid, ranked).figure)
    root = ET.fromstring(svg)
    assert view_width(root) == pytest.approx(style.WIDTH * 72)
    assert b"DejaVuSans-" not in svg and b"<tspan" not in svg  # no glyph outlines, no mathtext
    styles = text_styles(root)
    assert styles and all(s["font-family"] == "'DejaVu Sans', sans-serif" for s in styles)
    sizes = [font_px(s) for s in styles]
    assert min(sizes) >= style.FONT
    assert min(sizes) * PHONE_COLUMN_PX / view_width(root) >= 11
    drawn = ["".join(node.itertext()) for node in root.iter(f"{SVG}text")]
    assert {"0h", "3h", "21h", "−60°", "0°", "60°"} <= set(drawn)
    assert "Flare $b$" in drawn and TEXTS.inner in drawn and TEXTS.outer in drawn


@pytest.mark.parametrize("name", ["compact", "arc", "broad"])
def test_compact_svg_draws_what_matplotlib_wrote(skies, name, monkeypatch):
    ranked, grid = skies[name]
    check_compact(lambda: draw(grid, ranked).figure, monkeypatch)


def test_sky_colours_keep_their_contrast():
    sky = style.SKY  # WCAG 2.1: 3:1 for graphics (SC 1.4.11), 4.5:1 for text (SC 1.4.3)
    assert contrast(sky["outer_line"], style.AXES_FACE) >= 3
    assert contrast(sky["outer_line"], sky["outer_fill"]) >= 3
    assert contrast(sky["inner_line"], sky["outer_fill"]) >= 3
    assert contrast(sky["inner_line"], sky["inner_fill"]) >= 3
    for fill in (sky["outer_fill"], sky["inner_fill"]):  # hour labels may lie on a region
        assert contrast(style.INK, fill) >= 4.5


# --- where things are drawn --------------------------------------------------------------------


def test_candidates_sit_at_their_projected_positions_east_to_the_left(skies):
    ranked, grid = skies["compact"]
    fig = draw(grid, ranked).figure
    ax = fig.axes[0]  # the whole sky; the compact map also gets a close-up below it
    marks = {  # legend labels may wrap beside the close-up
        line.get_label().replace("\n", " "): line
        for line in ax.lines
        if line.get_marker() not in ("None", "")
    }
    placed = {name: (marks[name].get_xdata()[0], marks[name].get_ydata()[0]) for name in marks}
    root2 = math.sqrt(2)  # Snyder 1987: x = (2√2/π) λ on the equator, y = ±√2 at the poles
    assert placed["AT-Q7a"] == pytest.approx((-root2, 0.0), abs=1e-9)  # RA 6h: left of 0h
    assert placed["Flare $b$"] == pytest.approx((root2, 0.0), abs=1e-9)  # RA 18h: right
    assert placed["Q7-north"] == pytest.approx((0.0, root2), abs=1e-9)
    x, y = placed["Most probable position"]
    assert x < 0 and y < 0  # 3h east of the centre, south of the equator
    shapes = [marks[c.name].get_marker() for c in CANDIDATES]
    assert len(set(shapes)) == len(shapes)  # each candidate its own shape


@pytest.mark.parametrize("name", ["compact", "broad", "across 0h", "across 12h", "near a pole"])
def test_filled_regions_cover_their_credible_areas(skies, name):
    # Mollweide is equal-area with the whole sphere (4π sr) as an ellipse of area 4π, so the
    # filled region's projected area is its solid angle; a region cut or doubled at 0h, 12h or
    # a pole would miss by far more than the grid's and the pixels' few per cent
    ranked, grid = skies[name]
    for level in (0.5, 0.9):
        fill, _ = region_paths(grid, level, tolerance=1e-4)
        expected = ranked.area(level).to_value(u.sr)
        assert ring_area(fill) == pytest.approx(expected, rel=0.06), level


@pytest.mark.parametrize(("name", "ra", "dec"), [("across 0h", 0, 10), ("across 12h", 180, -20)])
def test_outline_of_a_blob_is_the_gaussian_disc_even_across_a_seam(skies, name, ra, dec):
    # flat-sky Gaussian of σ = 5°: the 90 % region is the disc of radius σ √(2 ln 10) ≈ 10.7°
    _, grid = skies[name]
    _, lines = region_paths(grid, 0.9, tolerance=1e-4)
    points = unprojected(np.concatenate(lines))
    east, lat = np.radians(points[:, 0]), np.radians(points[:, 1])
    cos = np.sin(lat) * math.sin(math.radians(dec)) + np.cos(lat) * math.cos(
        math.radians(dec)
    ) * np.cos(east - math.radians((ra + 180) % 360 - 180))
    radius = np.degrees(np.arccos(np.clip(cos, -1, 1)))
    assert radius == pytest.approx(5 * math.sqrt(2 * math.log(10)), abs=1.0)  # a pixel ≈ 0.9°
    for line in lines:  # the outline crosses the map's edge (12h); it never runs along it
        lon, lat = unprojected(line).T
        on_edge = np.abs(lon) > 179.99
        along = on_edge[1:] & on_edge[:-1] & (np.abs(np.diff(lat)) > 0.01)
        assert not along.any()
    crossings = sum(int((np.abs(unprojected(line)[:, 0]) > 179.99).any()) for line in lines)
    assert crossings == (2 if ra == 180 else 0)  # one piece on each side of the map


# --- the close-up of a small region -----------------------------------------------------------


def test_only_a_small_region_away_from_the_poles_gets_a_close_up(skies):
    box = close_up_box(skies["compact"][1])
    assert box is not None
    assert (box.ra, box.dec) == pytest.approx((45, -35), abs=1.0)
    # the 90 % disc of a σ = 3° blob has radius σ √(2 ln 10) ≈ 6.4°: all of it in the patch
    assert box.half > 3 * math.sqrt(2 * math.log(10)) + 1
    for name in ("arc", "broad", "near a pole"):
        assert close_up_box(skies[name][1]) is None, name
    assert len(draw(*reversed(skies["broad"])).figure.axes) == 1


def test_close_up_outline_is_the_gaussian_disc_with_east_to_the_left(skies):
    ranked, grid = skies["compact"]
    drawing = draw(grid, ranked)
    near = drawing.figure.axes[1]
    left, right = near.get_xlim()
    assert left > 0 > right  # x is degrees east of the centre: increasing RA to the left
    ra0 = close_up_box(grid).ra
    outline = near.collections[1]  # the 90 % region's line, drawn after its fill
    points = np.concatenate([p.vertices for p in outline.get_paths() if len(p.vertices)])
    ra, dec = np.radians(ra0 + points[:, 0]), np.radians(points[:, 1])
    cos = np.sin(dec) * math.sin(math.radians(-35)) + np.cos(dec) * math.cos(
        math.radians(-35)
    ) * np.cos(ra - math.radians(45))
    radius = np.degrees(np.arccos(np.clip(cos, -1, 1)))
    assert radius == pytest.approx(3 * math.sqrt(2 * math.log(10)), abs=0.5)  # Rayleigh, σ = 3°
    labels = [t.get_text() for t in near.get_xticklabels()]
    assert labels and all("h" in text for text in labels)
    assert "close-up" in drawing.alt and "3h00m" not in drawing.alt


@pytest.mark.parametrize(
    ("degrees", "text"), [(0.0, "0h"), (152.578, "10h10m"), (359.9, "0h"), (15.25, "1h01m")]
)
def test_hours_minutes(degrees, text):
    # 15° of right ascension is one hour, 0.25° one minute of time (IAU definition of RA units)
    assert hours_minutes(degrees) == text


# --- the alt text ------------------------------------------------------------------------------


def test_alt_text_names_the_areas_the_place_and_each_candidate(skies):
    ranked, grid = skies["compact"]
    alt = draw(grid, ranked).alt
    shown = regions(ranked)
    assert shown.area_50 in alt and shown.area_90 in alt and TEXTS.lead in alt
    assert "in the southern sky, between right ascension 2h and 4h" in alt
    for c in CANDIDATES:
        assert f"{c.name} ({c.note})" in alt


def test_alt_text_of_a_region_across_0h_gives_the_short_arc(skies):
    ranked, grid = skies["across 0h"]
    alt = draw(grid, ranked).alt
    assert "between right ascension 23h and 1h (across 0h)" in alt
    assert "24h" not in alt and "every right ascension" not in alt


def test_alt_text_of_a_region_over_a_pole_names_the_pole(skies):
    ranked, grid = skies["near a pole"]
    alt = draw(grid, ranked, [], None).alt
    assert "around the south celestial pole, south of declination" in alt
    assert "Candidates" not in alt


def test_alt_text_of_a_region_across_12h(skies):
    ranked, grid = skies["across 12h"]
    assert "between right ascension 11h and 13h" in draw(grid, ranked).alt


# --- the thumbnail -----------------------------------------------------------------------------


@pytest.mark.parametrize("name", ["compact", "arc", "broad", "near a pole"])
def test_thumbnail_is_small_has_no_text_and_says_where(skies, name):
    _, grid = skies[name]
    drawing = sky_thumbnail(grid, CANDIDATES[:2])
    svg = to_svg(drawing.figure)
    root = ET.fromstring(svg)
    assert not list(root.iter(f"{SVG}text"))
    assert len(svg) < THUMB_BYTES, len(svg)
    assert "credible region lies" in drawing.alt and "AT-Q7a" in drawing.alt


def test_thumbnail_alt_text_of_a_region_across_0h(skies):
    _, grid = skies["across 0h"]
    assert "between right ascension 23h and 1h" in sky_thumbnail(grid, []).alt


def test_legend_with_long_names_stays_inside_the_figure(skies):
    ranked, grid = skies["arc"]
    names = ["A transient with a rather long reported name", "AT-2", "Third candidate", "4", "5"]
    marks = [SkyMark(name, 90.0 + 5 * k, 10.0) for k, name in enumerate(names)]
    fig = draw(grid, ranked, marks).figure
    to_svg(fig, close=False)  # lays the figure out
    renderer = fig._get_renderer()
    (legend,) = fig.legends
    box, page = legend.get_window_extent(renderer), fig.bbox
    assert page.y0 <= box.y0 and box.y1 <= fig.axes[0].get_window_extent(renderer).y0 + 1
    assert page.x0 <= box.x0 and box.x1 <= page.x1
