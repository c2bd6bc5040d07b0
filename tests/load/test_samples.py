"""The samples-file reader: header cells ``path [unit]``, checked rows, unknown columns ignored."""

import subprocess
import sys

import pytest
from helpers import VALID_EVENT

from factsheet.cli import main
from factsheet.errors import InputError
from factsheet.load import load_catalogue
from factsheet.load.samples import read_samples

HEADER = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]"


def write(tmp_path, text, name="s.csv"):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def test_samples_csv_with_units_in_header(tmp_path):
    path = write(
        tmp_path,
        "# comment\nheavier.mass [kg],lighter.mass [Msun],distance [Gpc],heavier.spin\n"
        "3.97682e31,10,1.5,0.2\n3.97682e31,12,1.0,0.1\n",
    )
    s = read_samples(path).values
    # 3.97682e31 kg = 20 x 1.98841e30 kg, the solar mass (IAU 2015 / CODATA)
    assert s["heavier.mass"][0] == pytest.approx(20.0, rel=1e-4)
    assert s["distance"].tolist() == [1500.0, 1000.0]
    assert s["heavier.spin"].tolist() == [0.2, 0.1]


@pytest.mark.parametrize(
    ("text", "line", "words"),
    [
        ("heavier.mass [Msun],lighter.mass [Msun]\n1,1\n", 1, "missing column(s): distance"),
        ("heavier.mass [Mpc],lighter.mass [Msun],distance [Mpc]\n1,1,1\n", 1, "not a mass"),
        (
            f"{HEADER},heavier.tilt [deg]\n1,1,1,50\n",
            1,
            "heavier.tilt: needs the column heavier.spin_magnitude too",
        ),
        (
            f"{HEADER},heavier.spin_magnitude,heavier.tilt\n1,1,1,0.5,0.5\n",
            1,
            "heavier.tilt: unit none is not an angle (e.g. 'heavier.tilt [deg]')",
        ),
        (f"{HEADER}\n1,1,1\n2,x,1\n", 3, "not a number"),
        (f"{HEADER}\n1,1\n", 2, "2 cells, expected 3"),
        (f"{HEADER}\n1,-1,1\n", 2, "physical range"),
        (f"{HEADER}\n1,nan,1\n", 2, "physical range"),
        (f"{HEADER}\n", 2, "no sample rows"),
        (
            f"{HEADER},effective_spin,heavier.spin\n30,20,400,0.1,0.1\n",
            1,
            "effective_spin: give either effective_spin or the bodies' spin columns, not both",
        ),
    ],
)
def test_bad_samples_files_name_line(tmp_path, text, line, words):
    path = write(tmp_path, text)
    with pytest.raises(InputError) as info:
        read_samples(path)
    (problem,) = [str(p) for p in info.value.problems]
    assert problem.startswith(f"{path}:{line}:") and words in problem


@pytest.mark.parametrize(
    ("content", "words"),
    [(b"\xff\xfe\x00\x01", "NUL bytes"), (b"\xff\xfe\x01\n", "not UTF-8")],
)
def test_binary_samples_file(tmp_path, content, words):
    path = tmp_path / "s.csv"
    path.write_bytes(content)
    with pytest.raises(InputError, match=words):
        read_samples(path)


def test_unknown_column_is_ignored_with_a_warning(tmp_path):
    path = write(tmp_path, f"{HEADER},bogus\n30,20,400,7\n32,21,410,8\n")
    warnings = []
    s = read_samples(path, warnings=warnings).values
    assert set(s) == {"heavier.mass", "lighter.mass", "distance"}
    assert s["heavier.mass"].tolist() == [30.0, 32.0] and s["distance"].tolist() == [400.0, 410.0]
    (warning,) = [str(w) for w in warnings]
    assert warning.startswith(f"{path}:1: ") and "'bogus'" in warning and "ignored" in warning


def test_text_column_under_an_unknown_name_does_not_break_reading(tmp_path):
    path = write(tmp_path, f'note,{HEADER}\nfirst draw,30,20,400\n"second, quoted",31,20,400\n')
    warnings = []
    s = read_samples(path, warnings=warnings).values
    assert s["heavier.mass"].tolist() == [30.0, 31.0] and s["lighter.mass"].tolist() == [20.0, 20.0]
    assert len(warnings) == 1 and "'note'" in str(warnings[0])


def test_check_prints_the_unknown_column_warning(catalogue, tmp_path, capsys):
    rows = "".join(f"{36 + i % 3},{29 - i % 2},{440 + i},{i}\n" for i in range(20))
    folder = catalogue(
        {"a.yaml": VALID_EVENT + "samples: s.csv\n", "s.csv": f"{HEADER},bogus\n{rows}"}
    )
    (warning,) = [str(w) for w in load_catalogue(folder).warnings]
    assert "s.csv:1:" in warning and "'bogus'" in warning
    assert main(["check", str(folder)]) == 0
    err = capsys.readouterr().err
    assert "warning:" in err and "'bogus'" in err and "ignored" in err
    assert main(["check", "--strict", str(folder)]) == 1


def test_header_cell_with_a_control_character_is_refused(tmp_path):
    path = write(tmp_path, f"{HEADER},note\x1b[2J\n30,20,400,1\n")
    with pytest.raises(InputError) as info:
        read_samples(path)
    (problem,) = [str(p) for p in info.value.problems]
    assert problem.startswith(f"{path}:1: header: column 4's name contains a control character")


def test_distances_beyond_the_redshift_table_are_refused_by_row(tmp_path):
    # d_L(z = 1000) is 1.388e7 Mpc under Planck18 (astropy); 1.39e7 Mpc lies beyond it
    path = write(tmp_path, f"{HEADER}\n30,20,400\n30,20,1.39e7\n30,20,2e7\n")
    read_samples(path)  # without a cosmology, only the physical range is checked
    with pytest.raises(InputError) as info:
        read_samples(path, cosmology="Planck18")
    (problem,) = [str(p) for p in info.value.problems]
    assert problem.startswith(f"{path}:3: distance: distance 1.39e+07 Mpc lies beyond")
    with pytest.raises(InputError, match=":4: distance: distance 2e"):  # WMAP9: 1.3997e7 Mpc
        read_samples(path, cosmology="WMAP9")


def test_swapped_bodies_are_relabelled_in_place(tmp_path):
    path = write(
        tmp_path, f"{HEADER},heavier.spin,lighter.spin\n20,30,400,0.1,0.2\n30,20,400,0.3,0.4\n"
    )
    s = read_samples(path).values
    assert s["heavier.mass"].tolist() == [30, 30] and s["lighter.mass"].tolist() == [20, 20]
    assert s["heavier.spin"].tolist() == [0.2, 0.3] and s["lighter.spin"].tolist() == [0.1, 0.4]


MEMORY_SCRIPT = """
import resource, sys
from pathlib import Path
from factsheet.load.samples import read_samples
from factsheet.physics.cosmology import distance_limit
distance_limit("Planck18")  # the cosmology's modules and table, loaded before the baseline
before = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
samples = read_samples(Path(sys.argv[1]), cosmology="Planck18")
after = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
print(len(samples.values["distance"]), (after - before) * 1024)
"""


def test_a_million_rows_are_read_in_bounded_memory(tmp_path):
    # 1 000 000 rows of 5 columns read and 3 ignored: what is kept is 5 columns of 8-byte
    # floats and an 8-byte line number per row, 48 MB; the peak may exceed it by half at most
    # (ru_maxrss in KiB on Linux)
    rows = 1_000_000
    row = "36.5,29.25,0.125,-0.25,440.5,-1234.5678,3.14159,12345\n"
    header = (
        "heavier.mass [Msun],lighter.mass [Msun],heavier.spin,lighter.spin,distance [Mpc],"
        "log_likelihood,phase,step\n"
    )
    path = tmp_path / "big.csv"
    with path.open("w") as handle:
        handle.write(header)
        for _ in range(rows // 1000):
            handle.write(row * 1000)
    result = subprocess.run(
        [sys.executable, "-c", MEMORY_SCRIPT, str(path)], capture_output=True, text=True
    )
    assert result.returncode == 0, result.stderr
    count, growth = (int(x) for x in result.stdout.split())
    kept = rows * (5 + 1) * 8
    assert count == rows and growth < 1.5 * kept, f"peak grew by {growth / 2**20:.0f} MiB"
