"""Samples files as ECSV and FITS tables: the same values as the CSV file, the same checks.

Every table here is written with astropy's ``Table.write`` (ECSV and FITS), so the files are
what astropy users produce; the values are invented.
"""

from __future__ import annotations

import hashlib
import os
import re
import subprocess
import sys
from pathlib import Path

import astropy.units as u
import numpy as np
import pytest
from astropy.io import fits
from astropy.io.fits import connect as fits_connect
from astropy.table import MaskedColumn, Table
from helpers import VALID_EVENT

from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.samples import read_samples
from factsheet.model import Limits

# the same five samples in every format; the first two rows have their bodies swapped
MASSES = ([20.0, 31.5, 36.25, 40.0, 33.0], [30.0, 22.0, 29.5, 28.75, 30.5])
SPINS = ([0.1, -0.2, 0.05, 0.3, 0.0], [0.4, 0.25, -0.1, 0.0, 0.12])
DISTANCES = [410.0, 455.5, 1290.0, 980.25, 700.0]
CSV = (
    "heavier.mass [Msun],lighter.mass [Msun],heavier.spin,lighter.spin,distance [Mpc],note\n"
    + "".join(
        f"{m1},{m2},{s1},{s2},{d},draw {i}\n"
        for i, (m1, m2, s1, s2, d) in enumerate(zip(*MASSES, *SPINS, DISTANCES, strict=True))
    )
)


def samples_table() -> Table:
    table = Table()
    table["heavier.mass"] = MASSES[0] * u.Msun
    table["lighter.mass"] = MASSES[1] * u.Msun
    table["heavier.spin"] = SPINS[0]
    table["lighter.spin"] = SPINS[1]
    table["distance"] = DISTANCES * u.Mpc
    table["note"] = [f"draw {i}" for i in range(len(DISTANCES))]
    return table


def write(table: Table, path, **options):
    kind = "fits" if path.suffix in (".fits", ".fit") else "ascii.ecsv"
    table.write(path, format=kind, overwrite=True, **options)
    return path


def problem_of(path, **options) -> str:
    with pytest.raises(InputError) as info:
        read_samples(path, **options)
    (problem,) = [str(p) for p in info.value.problems]
    return problem


@pytest.mark.parametrize("suffix", [".ecsv", ".fits", ".fit"])
def test_a_table_written_by_astropy_reads_as_its_csv_twin(tmp_path, suffix):
    (tmp_path / "s.csv").write_text(CSV, encoding="utf-8")
    twin = read_samples(tmp_path / "s.csv").values
    path = write(samples_table(), tmp_path / f"s{suffix}")
    warnings = []
    samples = read_samples(path, warnings=warnings)
    assert set(samples.values) == set(twin)
    for name, values in twin.items():
        assert samples.values[name].tolist() == values.tolist(), name  # exact: same floats
    assert samples.values["heavier.mass"].tolist() == [30.0, 31.5, 36.25, 40.0, 33.0]
    assert samples.values["heavier.spin"][:2].tolist() == [0.4, -0.2]  # spins follow bodies
    assert samples.digest == hashlib.sha256(path.read_bytes()).hexdigest()
    (warning,) = [str(w) for w in warnings]
    line = 1 if suffix != ".ecsv" else 9  # the note's entry in the ECSV datatype list
    assert warning.startswith(f"{path}:{line}: column 'note': unknown column, ignored")


@pytest.mark.parametrize("suffix", [".ecsv", ".fits"])
def test_units_come_from_the_table_metadata(tmp_path, suffix):
    table = Table()
    # 3.97682e31 kg = 20 x 1.98841e30 kg, the nominal solar mass (IAU 2015 B3 with CODATA G)
    table["heavier.mass"] = [3.97682e31] * u.kg
    table["lighter.mass"] = [12.0] * u.Msun
    table["distance"] = [1.5] * u.Gpc
    table["heavier.tilt"] = [np.pi / 2] * u.rad
    table["heavier.spin_magnitude"] = [0.5]
    samples = read_samples(write(table, tmp_path / f"s{suffix}")).values
    assert samples["heavier.mass"][0] == pytest.approx(20.0, rel=1e-4)
    assert samples["distance"].tolist() == [1500.0]
    assert samples["heavier.tilt"][0] == pytest.approx(90.0, rel=1e-12)  # degrees


def test_an_ecsv_file_with_commas_comments_and_quoted_text(tmp_path):
    path = write(samples_table(), tmp_path / "s.ecsv", delimiter=",")
    lines = path.read_text(encoding="utf-8").splitlines(keepends=True)
    body = lines.index("heavier.mass,lighter.mass,heavier.spin,lighter.spin,distance,note\n")
    lines.insert(body + 3, "\n")
    lines.insert(body + 3, "# a comment between rows\n")
    lines[body + 1] = lines[body + 1].replace("draw 0", '"draw, the first, # not a comment"')
    path.write_text("".join(lines), encoding="utf-8")
    samples = read_samples(path).values
    assert samples["distance"].tolist() == DISTANCES
    # rows after the comment keep their own line numbers
    lines[-1] = lines[-1].replace("700.0", "-700.0")
    path.write_text("".join(lines), encoding="utf-8")
    assert problem_of(path).startswith(f"{path}:{len(lines)}: distance: value -700 outside")


def ecsv_with(tmp_path, table: Table, edit=None):
    path = write(table, tmp_path / "s.ecsv")
    if edit:
        path.write_text(edit(path.read_text(encoding="utf-8")), encoding="utf-8")
    return path


def minimal(**columns) -> Table:
    table = Table()
    table["heavier.mass"] = [30.0, 31.0] * u.Msun
    table["lighter.mass"] = [20.0, 21.0] * u.Msun
    table["distance"] = [400.0, 410.0] * u.Mpc
    for name, column in columns.items():
        table[name] = column
    return table


# The ECSV lines: 1 '# %ECSV', 2 '# ---', 3 '# datatype:', 4.. one entry per column, then
# '# schema' and the names line (7 and 8 for three columns), then the rows (9 and 10; with a
# fourth column, 10 and 11).
ECSV_CASES = [
    ("missing", Table(minimal().columns[:2]), 3, "header", "missing column(s): distance"),
    ("wrong unit", minimal(distance=[1.0, 2.0] * u.Msun), 6, "distance", "not a length"),
    ("no unit", minimal(**{"heavier.mass": [30.0, 31.0]}), 4, "heavier.mass", "unit none"),
    ("text", minimal(redshift=["a", "b"]), 7, "redshift", "datatype string is not a number"),
    ("bool", minimal(redshift=[True, False]), 7, "redshift", "datatype bool is not a number"),
    ("range", minimal(redshift=[0.1, -0.2]), 11, "redshift", "value -0.2 outside the physical"),
    ("nan", minimal(redshift=[0.1, np.nan]), 11, "redshift", "value nan outside the physical"),
    ("inf", minimal(redshift=[np.inf, 0.1]), 10, "redshift", "value inf outside the physical"),
    (
        "masked",
        minimal(redshift=MaskedColumn([0.1, 0.2], mask=[False, True])),
        11,
        "redshift",
        "a masked (empty) value",
    ),
    ("not yet", minimal(chirp_mass=[26.0, 26.1] * u.Msun), 7, "chirp_mass", "not supported yet"),
    (
        "spin rule",
        minimal(**{"heavier.tilt": [10.0, 20.0] * u.deg}),
        7,
        "heavier.tilt",
        "needs the column heavier.spin_magnitude too",
    ),
]


@pytest.mark.parametrize(
    ("table", "line", "key", "words"), [c[1:] for c in ECSV_CASES], ids=[c[0] for c in ECSV_CASES]
)
def test_bad_ecsv_tables_name_line_and_column(tmp_path, table, line, key, words):
    path = ecsv_with(tmp_path, table)
    found = problem_of(path)
    assert found.startswith(f"{path}:{line}: {key}: ") and words in found, found


FITS_CASES = [
    ("missing", Table(minimal().columns[:2]), "header", "missing column(s): distance"),
    ("wrong unit", minimal(distance=[1.0, 2.0] * u.Msun), "distance", "not a length"),
    ("no unit", minimal(**{"heavier.mass": [30.0, 31.0]}), "heavier.mass", "unit none"),
    ("text", minimal(redshift=["a", "b"]), "redshift", "a column of text, not of numbers"),
    ("bool", minimal(redshift=[True, False]), "redshift", "logical values, not of numbers"),
    ("array", minimal(redshift=[[0.1, 0.2], [0.3, 0.4]]), "redshift", "a column of arrays"),
    ("range", minimal(redshift=[0.1, -0.2]), "redshift", "row 2: value -0.2 outside the"),
    ("nan", minimal(redshift=[0.1, np.nan]), "redshift", "row 2: value nan outside the"),
    (
        "masked",
        minimal(redshift=MaskedColumn([1, 2], mask=[False, True], dtype="i4")),
        "redshift",
        "row 2: a masked value",
    ),
    ("not yet", minimal(mass_ratio=[0.7, 0.8]), "mass_ratio", "not supported yet"),
    (
        "spin rule",
        minimal(effective_spin=[0.1, 0.1], **{"heavier.spin": [0.1, 0.2]}),
        "effective_spin",
        "give either effective_spin or the bodies' spin columns, not both",
    ),
]


@pytest.mark.parametrize(
    ("table", "key", "words"), [c[1:] for c in FITS_CASES], ids=[c[0] for c in FITS_CASES]
)
def test_bad_fits_tables_name_the_column_and_row(tmp_path, table, key, words):
    path = write(table, tmp_path / "s.fits")
    found = problem_of(path)
    assert found.startswith(f"{path}:1: {key}: ") and words in found, found


@pytest.mark.parametrize("suffix", [".ecsv", ".fits"])
def test_too_many_rows(tmp_path, suffix):
    path = write(minimal(), tmp_path / f"s{suffix}")
    found = problem_of(path, limits=Limits(max_sample_rows=1))
    where = f"{path}:10: row: " if suffix == ".ecsv" else f"{path}:1: row: row 2: "
    assert found.startswith(where) and "more than 1 rows" in found, found


@pytest.mark.parametrize(
    ("suffix", "line", "words"),
    [(".ecsv", 9, "row: no sample rows after the header"), (".fits", 1, "row: the table has no")],
)
def test_an_empty_table(tmp_path, suffix, line, words):
    path = write(minimal()[:0], tmp_path / f"s{suffix}")
    assert problem_of(path).startswith(f"{path}:{line}: {words}")


@pytest.mark.parametrize(
    ("name", "content", "words"),
    [
        ("s.ecsv", b"\x89\x00\xff\x13garbage", "file: the file contains NUL bytes"),
        ("s.ecsv", b"# %ECSV 1.0\n\xff\xfe\n", "file: samples file is not UTF-8 text"),
        ("s.ecsv", b"heavier.mass [Msun],distance [Mpc]\n1,1\n", "file: not an ECSV file"),
        ("s.ecsv", b"# %ECSV 1.0\n# ---\n# [unclosed\nx\n", "file: the header is not valid ECSV"),
        ("s.ecsv", b"# %ECSV 1.0\n# ---\n# schema: x\nx\n", "file: the header has no datatype"),
        ("s.fits", b"<html><body>a page</body></html>\n", "file: not a FITS table (No SIMPLE"),
        ("s.fits", b"\x00\x01garbage", "file: not a FITS table"),
        ("s.fits", b"", "file: not a FITS table"),
    ],
)
def test_a_file_that_is_not_the_format_its_suffix_says(tmp_path, name, content, words):
    path = tmp_path / name
    path.write_bytes(content)
    found = problem_of(path)
    assert found.startswith(f"{path}:") and words in found, found


def test_an_image_fits_file_has_no_table(tmp_path):
    path = tmp_path / "s.fits"
    fits.PrimaryHDU(np.zeros((4, 4))).writeto(path)
    assert "not a FITS table (No table found)" in problem_of(path)


def test_an_ecsv_row_with_a_word_or_a_missing_cell(tmp_path):
    path = ecsv_with(tmp_path, minimal(), lambda text: text.replace("31.0 21.0 410.0", "31.0 x"))
    assert problem_of(path).startswith(f"{path}:10: row: 2 cells, expected 3")
    path = ecsv_with(tmp_path, minimal(), lambda text: text.replace("21.0", "many"))
    assert problem_of(path).startswith(f"{path}:10: lighter.mass: not a number: 'many'")


def test_an_ecsv_names_line_that_disagrees_with_the_header(tmp_path):
    path = ecsv_with(tmp_path, minimal(), lambda text: text.replace("distance\n", "dist\n"))
    assert problem_of(path).startswith(f"{path}:8: file: the column names line does not match")


def test_a_long_ecsv_line_is_refused_with_its_line(tmp_path):
    path = ecsv_with(tmp_path, minimal(), lambda text: text.replace("410.0", "410." + "0" * 5000))
    assert problem_of(path).startswith(f"{path}:10: file: a line longer than 4096 bytes")


def test_an_unknown_suffix_lists_the_formats(tmp_path):
    path = tmp_path / "s.txt"
    path.write_text("x", encoding="utf-8")
    assert problem_of(path) == (
        f"{path}: file: suffix '.txt' is not a samples format: samples files end in .csv, "
        ".ecsv, .fits or .fit"
    )
    assert "decompress it first" in problem_of(tmp_path / "s.fits.gz")


@pytest.mark.parametrize("name", ["s.ecsv", "s.fits"])
def test_only_a_regular_file_is_opened(tmp_path, name):
    os.mkfifo(tmp_path / name)  # opening a FIFO for reading would block for ever
    assert "named pipe" in problem_of(tmp_path / name)


def test_fits_columns_are_read_through_a_memory_map(tmp_path, monkeypatch):
    opened = []
    real = fits_connect.fits_open

    def spy(*args, **options):
        opened.append(options.get("memmap"))
        return real(*args, **options)

    monkeypatch.setattr(fits_connect, "fits_open", spy)  # what Table.read opens FITS with
    samples = read_samples(write(samples_table(), tmp_path / "s.fits")).values
    assert opened == [True]
    for values in samples.values():  # native 8-byte copies, not views of the mapped file
        assert values.dtype == np.dtype("=f8") and values.flags.owndata and values.flags.writeable


def test_an_event_names_an_ecsv_samples_file(catalogue, tmp_path):
    table = Table()
    table["heavier.mass"] = [36.0 + i % 3 for i in range(20)] * u.Msun
    table["lighter.mass"] = [29.0 - i % 2 for i in range(20)] * u.Msun
    table["distance"] = [440.0 + i for i in range(20)] * u.Mpc
    folder = catalogue({"a.yaml": VALID_EVENT + "samples: s.ecsv\n"})
    write(table, folder / "s.ecsv")
    loaded = load_catalogue(folder)  # raises on any problem
    assert not loaded.warnings
    (event,) = loaded.events
    assert event.samples.values["distance"].tolist() == table["distance"].value.tolist()


MEMORY_SCRIPT = """
import sys
from pathlib import Path
from factsheet.load.samples import read_samples

def status(field):  # kB, from /proc/self/status
    with open("/proc/self/status") as handle:
        return next(int(line.split()[1]) for line in handle if line.startswith(field + ":"))

read_samples(Path(sys.argv[2]))  # a small file first: the modules load before the baseline
with open("/proc/self/clear_refs", "w") as handle:
    handle.write("5")  # the peak resident size starts again from the current one
before = status("VmRSS")
samples = read_samples(Path(sys.argv[1]))
print(len(samples.values["distance"]), (status("VmHWM") - before) * 1024)
"""


@pytest.mark.skipif(not os.path.exists("/proc/self/clear_refs"), reason="Linux /proc only")
def test_a_million_ecsv_rows_are_read_in_bounded_memory(tmp_path):
    # 1 000 000 rows, 5 columns read and 2 ignored: the columns kept are 40 MB of 8-byte
    # floats; the peak may exceed them by half at most (astropy's own reader needs ~29 times)
    rows = 1_000_000
    small = write(samples_table(), tmp_path / "small.ecsv")
    header = write(samples_table()[:0], tmp_path / "head.ecsv").read_text(encoding="utf-8")
    path = tmp_path / "big.ecsv"
    with path.open("w", encoding="utf-8") as handle:
        handle.write(header.replace("note\n", "note log_likelihood\n").replace(
            "- {name: note, datatype: string}",
            "- {name: note, datatype: string}\n# - {name: log_likelihood, datatype: float64}",
        ))  # fmt: skip
        for _ in range(rows // 1000):
            handle.write('36.5 29.25 0.125 -0.25 440.5 "a draw" -1234.5678\n' * 1000)
    result = subprocess.run(
        [sys.executable, "-c", MEMORY_SCRIPT, str(path), str(small)], capture_output=True, text=True
    )
    assert result.returncode == 0, result.stderr
    count, growth = (int(x) for x in result.stdout.split())
    kept = rows * 5 * 8
    assert count == rows and growth < 1.5 * kept, f"peak grew by {growth / 2**20:.0f} MiB"


def test_the_documented_examples_write_and_read_the_same_samples(tmp_path, monkeypatch):
    page = (Path(__file__).resolve().parents[2] / "docs" / "samples-files.md").read_text("utf-8")
    (csv_text,) = re.findall(r"^```csv\n(.*?)^```$", page, re.M | re.S)
    (ecsv_text,) = re.findall(r"^```ecsv\n(.*?)^```$", page, re.M | re.S)
    (code,) = re.findall(r"^```python\n(.*?)^```$", page, re.M | re.S)
    monkeypatch.chdir(tmp_path)
    exec(compile(code, "samples-files.md", "exec"), {})  # writes dx0412.ecsv and dx0412.fits
    assert Path("dx0412.ecsv").read_text(encoding="utf-8") == ecsv_text
    Path("dx0412.csv").write_text(csv_text, encoding="utf-8")
    Path("shown.ecsv").write_text(ecsv_text, encoding="utf-8")
    expected = read_samples(Path("dx0412.csv")).values
    for name in ("shown.ecsv", "dx0412.ecsv", "dx0412.fits"):
        warnings = []
        values = read_samples(Path(name), warnings=warnings).values
        assert not warnings
        for path, column in expected.items():
            assert values[path].tolist() == column.tolist(), (name, path)
