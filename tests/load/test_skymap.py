"""Reading and checking HEALPix sky maps: every kind of bad map gets a clear error that names
the map, the event file's line and the key; good maps in either ordering and layout read the same.

Maps are written here with astropy.io.fits directly, as the HEALPix FITS convention lays them
out (Górski et al. 2005; a binary table with NSIDE, ORDERING, COORDSYS, PIXTYPE and INDXSCHM in
its header). NSIDE stays small so the tests stay fast.
"""

from __future__ import annotations

import hashlib
from pathlib import Path

import numpy as np
import pytest
from astropy.io import fits
from astropy_healpix import HEALPix
from helpers import VALID_EVENT

from factsheet.cache import event_key
from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.skymap import Where, check_sky_map, read_probabilities

NSIDE = 8
NPIX = 12 * NSIDE**2
SKY_AREA = "  sky_area: 580 deg2\n"
MAP_LINE = 10  # the line of sky_map when written after sky_area in VALID_EVENT


def blob(npix: int = NPIX) -> np.ndarray:
    """A map with a clear shape: probability falling with the pixel index, summing to 1."""
    x = np.exp(-np.arange(npix) / 40.0)
    return (x / x.sum()).astype(np.float32)


def write_map(path: Path, prob, nside: int = NSIDE, *, columns=None, **header) -> Path:
    """A HEALPix FITS map; ``header`` overrides (None removes) the usual keywords."""
    if columns is None:
        prob = np.asarray(prob)
        fmt = "E" if prob.ndim == 1 else f"{prob.shape[1]}E"
        if prob.dtype == np.float64:
            fmt = fmt.replace("E", "D")
        columns = [fits.Column(name="PROB", format=fmt, array=prob)]
    table = fits.BinTableHDU.from_columns(columns)
    keys = {
        "PIXTYPE": "HEALPIX",
        "ORDERING": "RING",
        "COORDSYS": "C",
        "NSIDE": nside,
        "INDXSCHM": "IMPLICIT",
    }
    keys.update(header)
    for name, value in keys.items():
        if value is not None:
            table.header[name] = value
    fits.HDUList([fits.PrimaryHDU(), table]).writeto(path, overwrite=True)
    return path


def check(path: Path):
    problems, warnings = [], []
    found = check_sky_map(path, problems, warnings, Where("ev.yaml", 10))
    return found, [str(p) for p in problems], [str(w) for w in warnings]


def only_problem(path: Path) -> str:
    found, problems, _ = check(path)
    assert found is None and len(problems) == 1, problems
    (problem,) = problems
    assert problem.startswith(f"ev.yaml:10: detection.sky_map: sky map {path}: "), problem
    return problem


# -- good maps -------------------------------------------------------------------------------


def test_a_ring_map_reads_normalised_as_float32(tmp_path):
    path = write_map(tmp_path / "m.fits", blob())
    sky, problems, warnings = check(path)
    assert not problems and not warnings
    assert (sky.nside, sky.ordering, sky.column) == (NSIDE, "RING", "PROB")
    assert sky.digest == hashlib.sha256(path.read_bytes()).hexdigest()
    prob = read_probabilities(sky)
    assert prob.dtype == np.float32 and prob.shape == (NPIX,)
    assert prob.sum(dtype=np.float64) == pytest.approx(1.0, rel=1e-6)
    np.testing.assert_allclose(prob, blob(), rtol=1e-6)


def test_ring_and_nested_files_of_one_map_read_the_same(tmp_path):
    ring = blob()
    nested = np.empty_like(ring)
    nested[HEALPix(nside=NSIDE).ring_to_nested(np.arange(NPIX))] = (
        ring  # astropy-healpix renumbering
    )
    a, *_ = check(write_map(tmp_path / "r.fits", ring))
    b, *_ = check(write_map(tmp_path / "n.fits", nested, ORDERING="NESTED"))
    assert (a.ordering, b.ordering) == ("RING", "NESTED")
    np.testing.assert_array_equal(read_probabilities(b), nested)
    np.testing.assert_array_equal(read_probabilities(b)[HEALPix(nside=NSIDE).ring_to_nested(np.arange(NPIX))],
                                  read_probabilities(a))  # fmt: skip


def test_rows_of_1024_values_read_as_one_per_row(tmp_path):
    nside = 16  # 3072 pixels: three rows of 1024
    prob = blob(12 * nside**2)
    wide = write_map(tmp_path / "w.fits", prob.reshape(-1, 1024), nside)
    narrow = write_map(tmp_path / "n.fits", prob, nside)
    assert fits.getheader(wide, 1)["TFORM1"] == "1024E"
    a, problems, _ = check(wide)
    assert not problems
    np.testing.assert_array_equal(read_probabilities(a), read_probabilities(check(narrow)[0]))


def test_double_precision_and_the_probability_column_among_others(tmp_path):
    prob = blob().astype(np.float64)
    columns = [
        fits.Column(name="prob", format="D", array=prob),
        fits.Column(name="DISTMEAN", format="D", array=np.full(NPIX, 100.0)),
    ]
    sky, problems, _ = check(write_map(tmp_path / "m.fits", None, columns=columns))
    assert not problems and sky.column == "prob"
    np.testing.assert_allclose(read_probabilities(sky), prob, rtol=1e-6)


def test_a_density_map_normalises_without_a_warning(tmp_path):
    density = blob() * NPIX / (4 * np.pi)  # probability per steradian
    column = fits.Column(name="PROBDENSITY", format="E", unit="sr-1", array=density)
    sky, problems, warnings = check(write_map(tmp_path / "d.fits", None, columns=[column]))
    assert not problems and not warnings
    np.testing.assert_allclose(read_probabilities(sky), blob(), rtol=1e-5)


def test_a_map_far_from_normalised_is_normalised_with_a_warning(tmp_path):
    path = write_map(tmp_path / "m.fits", 2.5 * blob())
    sky, problems, warnings = check(path)
    assert not problems
    (warning,) = warnings
    assert warning.startswith(f"ev.yaml:10: detection.sky_map: sky map {path}: ")
    assert "sum to 2.5, not 1; the map is normalised" in warning
    assert read_probabilities(sky).sum(dtype=np.float64) == pytest.approx(1.0, rel=1e-6)


def test_a_map_a_little_off_one_gets_no_warning(tmp_path):
    assert check(write_map(tmp_path / "m.fits", 1.005 * blob()))[2] == []


def test_a_file_changed_after_the_check_is_refused(tmp_path):
    path = write_map(tmp_path / "m.fits", blob())
    sky, *_ = check(path)
    write_map(path, blob()[::-1].copy())
    with pytest.raises(InputError, match="changed since it was checked") as info:
        read_probabilities(sky)
    assert str(path) in str(info.value)


# -- bad maps --------------------------------------------------------------------------------


def _fits_bytes(tmp_path: Path) -> bytes:
    return write_map(tmp_path / "good.fits", blob()).read_bytes()


@pytest.mark.parametrize(
    ("content", "words"),
    [
        (lambda _: b"", "the file is empty"),
        (lambda _: bytes(range(256)) * 40, "not a readable FITS file"),
        (lambda _: b"<!DOCTYPE html><html><body>Not found</body></html>\n", "not a readable FITS"),
        (lambda t: _fits_bytes(t)[:-4000], "the file is truncated: its table needs"),
        (lambda t: _fits_bytes(t)[:4000], "not a whole number of 2880-byte FITS blocks"),
    ],
    ids=["empty", "garbage", "html", "truncated-table", "truncated-header"],
)
def test_a_file_that_is_not_a_map(tmp_path, content, words):
    path = tmp_path / "m.fits"
    path.write_bytes(content(tmp_path))
    assert words in only_problem(path)


def test_a_fits_file_without_a_table(tmp_path):
    path = tmp_path / "m.fits"
    fits.PrimaryHDU(np.zeros((4, 4))).writeto(path)
    assert "no binary table in the file" in only_problem(path)


def test_several_columns_none_of_them_the_probability(tmp_path):
    columns = [fits.Column(name=n, format="E", array=blob()) for n in ("DISTMU", "DISTSIGMA")]
    problem = only_problem(write_map(tmp_path / "m.fits", None, columns=columns))
    assert "the table's columns are 'DISTMU', 'DISTSIGMA'" in problem
    assert "expected one named PROB or PROBABILITY" in problem


@pytest.mark.parametrize(
    ("header", "words"),
    [
        ({"NSIDE": None}, "NSIDE is missing"),
        ({"NSIDE": 12}, "NSIDE = 12 is not a power of 2 from 1 to 2048"),
        ({"NSIDE": 4096}, "NSIDE = 4096 is not a power of 2 from 1 to 2048"),
        ({"NSIDE": 4}, "768 pixels, but NSIDE 4 needs 12 × 4² = 192"),
        ({"ORDERING": "SPIRAL"}, "ORDERING = 'SPIRAL' in the table's header (expected RING or"),
        ({"ORDERING": None}, "no ORDERING in the table's header"),
        ({"COORDSYS": "G"}, "COORDSYS = 'G' (galactic): convert the map to equatorial"),
        ({"COORDSYS": "E"}, "COORDSYS = 'E' (ecliptic): convert the map to equatorial"),
        ({"INDXSCHM": "EXPLICIT"}, "a partial map (explicit pixel indices) is not read"),
    ],
    ids=[
        "no-nside",
        "nside-12",
        "nside-4096",
        "length",
        "ordering",
        "no-ordering",
        "galactic",
        "ecliptic",
        "explicit",
    ],
)
def test_a_bad_header(tmp_path, header, words):
    assert words in only_problem(write_map(tmp_path / "m.fits", blob(), **header))


def test_a_multi_order_map_is_refused(tmp_path):
    columns = [
        fits.Column(name="UNIQ", format="K", array=np.arange(4, 4 + NPIX)),
        fits.Column(name="PROBDENSITY", format="D", array=blob()),
    ]
    problem = only_problem(write_map(tmp_path / "m.fits", None, columns=columns))
    assert "a multi-order map (a UNIQ column) is not read" in problem


def test_a_column_of_text_is_refused(tmp_path):
    column = fits.Column(name="PROB", format="4A", array=np.array(["ab"] * NPIX))
    assert "expected numbers" in only_problem(
        write_map(tmp_path / "m.fits", None, columns=[column])
    )


@pytest.mark.parametrize(
    ("value", "words"),
    [
        (-0.25, "pixel 37 holds -0.25"),
        (np.nan, "pixel 37 holds nan"),
        (np.inf, "pixel 37 holds inf"),
    ],
)
def test_a_bad_value_names_the_first_bad_pixel(tmp_path, value, words):
    prob = blob()
    prob[[37, 200]] = value
    problem = only_problem(write_map(tmp_path / "m.fits", prob))
    assert words in problem and "expected finite probabilities, none negative" in problem


def test_a_map_of_zeros_is_refused(tmp_path):
    problem = only_problem(write_map(tmp_path / "m.fits", np.zeros(NPIX, np.float32)))
    assert "every pixel is zero" in problem


def test_a_folder_named_like_a_map_is_refused(tmp_path):
    (tmp_path / "m.fits").mkdir()
    assert "is a folder, not a regular file" in only_problem(tmp_path / "m.fits")


# -- the key in an event file ----------------------------------------------------------------


def _event(catalogue, sky_map: str, keep_area: bool = True) -> Path:
    text = VALID_EVENT.replace(
        SKY_AREA, (SKY_AREA if keep_area else "") + f"  sky_map: {sky_map}\n"
    )
    return catalogue({"ev.yaml": text})


def test_an_event_with_a_map_and_no_sky_area_loads(catalogue):
    folder = _event(catalogue, "ev-sky.fits", keep_area=False)
    write_map(folder / "ev-sky.fits", blob())
    (event,) = load_catalogue(folder).events
    assert event.detection.sky_area is None
    assert event.detection.sky_map.path == (folder / "ev-sky.fits").resolve()
    assert event.detection.sky_map.nside == NSIDE


def test_a_bad_map_names_the_event_file_line_and_key(catalogue):
    folder = _event(catalogue, "ev-sky.fits")
    (folder / "ev-sky.fits").write_bytes(b"<html>moved</html>")
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    (problem,) = [str(p) for p in info.value.problems]
    prefix = f"{folder / 'ev.yaml'}:{MAP_LINE}: detection.sky_map: sky map "
    assert problem.startswith(prefix) and "ev-sky.fits: not a readable FITS file" in problem


def test_a_missing_map_is_named(catalogue):
    with pytest.raises(InputError, match=r"sky map 'nowhere\.fits' not found"):
        load_catalogue(_event(catalogue, "nowhere.fits"))


def test_the_warning_reaches_the_catalogue(catalogue):
    folder = _event(catalogue, "ev-sky.fits")
    write_map(folder / "ev-sky.fits", 3 * blob())
    warnings = [str(w) for w in load_catalogue(folder).warnings]
    assert any("detection.sky_map" in w and "sum to 3, not 1" in w for w in warnings), warnings


def test_an_edited_map_changes_the_cache_key(catalogue):
    folder = _event(catalogue, "ev-sky.fits")
    write_map(folder / "ev-sky.fits", blob())
    first = load_catalogue(folder)
    write_map(folder / "ev-sky.fits", blob()[::-1].copy())
    second = load_catalogue(folder)
    keys = [event_key(c.events[0], c.settings) for c in (first, second)]
    assert keys[0] != keys[1]
