"""Warnings for valid but suspicious input, fatal with --strict."""

from helpers import VALID_EVENT

from factsheet.cli import main
from factsheet.load import load_catalogue
from factsheet.resources import demo_dir

SAMPLES = "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n{rows}"


def messages(folder) -> list[str]:
    return [str(w) for w in load_catalogue(folder).warnings]


def test_demo_is_clean_in_strict_mode(capsys):
    assert load_catalogue(demo_dir()).warnings == ()
    assert main(["check", "--strict", str(demo_dir())]) == 0


def test_history_dated_before_the_merger(catalogue):
    text = VALID_EVENT + (
        'history:\n  - date: "2034-04-01"\n    label: early\n    estimate:\n'
        "      heavier: {mass: 30 +3 -3 Msun}\n      lighter: {mass: 20 +3 -3 Msun}\n"
        "      distance: 400 +100 -100 Mpc\n"
    )
    (warning,) = messages(catalogue({"a.yaml": text}))
    assert ":19: history[0].date: " in warning and "before the merger" in warning


def test_embargo_ending_before_the_merger(catalogue):
    (warning,) = messages(
        catalogue({"a.yaml": VALID_EVENT + 'embargo_until: "2030-01-01T00:00"\n'})
    )
    assert ":19: embargo_until: " in warning


def test_samples_that_disagree_with_the_summary(catalogue):
    rows = "".join(f"{60 + i % 3},{50 + i % 2},{900 + i}\n" for i in range(20))
    folder = catalogue(
        {"a.yaml": VALID_EVENT + "samples: s.csv\n", "s.csv": SAMPLES.format(rows=rows)}
    )
    found = messages(folder)
    assert any("estimate.heavier.mass" in w and "right file" in w for w in found)
    assert any("estimate.distance" in w for w in found)


def test_strict_makes_warnings_fatal(catalogue, tmp_path, capsys):
    folder = catalogue({"a.yaml": VALID_EVENT + 'embargo_until: "2030-01-01T00:00"\n'})
    assert main(["check", str(folder)]) == 0
    assert "warning:" in capsys.readouterr().err
    assert main(["check", "--strict", str(folder)]) == 1
    assert main(["build", "--strict", str(folder), "-o", str(tmp_path / "out")]) == 1
    assert not (tmp_path / "out").exists()
    assert main(["build", str(folder), "-o", str(tmp_path / "out"), "-j", "1"]) == 0
