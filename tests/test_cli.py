"""The command line: exit codes, one clean line per problem, no tracebacks for bad input."""

import subprocess
import sys

from helpers import VALID_EVENT

from factsheet.cli import main
from factsheet.load import load_catalogue


def run(*args, cwd=None):
    return subprocess.run(
        [sys.executable, "-m", "factsheet.cli", *map(str, args)],
        capture_output=True,
        text=True,
        cwd=cwd,
    )


def test_check_lists_every_problem_and_exits_1(catalogue):
    folder = catalogue({"a.yaml": VALID_EVENT.replace("Msun", "Mpc"), "b.yaml": "- 1\n"})
    result = run("check", folder)
    assert result.returncode == 1
    assert "Traceback" not in result.stderr
    lines = result.stderr.strip().splitlines()
    assert f"error: {folder / 'a.yaml'}:12: estimate.heavier.mass: " in lines[0]
    assert any(f"{folder / 'b.yaml'}:1:" in line for line in lines)
    assert lines[-1] == "3 problems found"


def test_check_valid_catalogue(catalogue, capsys):
    assert main(["check", str(catalogue({"a.yaml": VALID_EVENT}))]) == 0
    assert "no problems found" in capsys.readouterr().out


def test_build_bad_input_keeps_earlier_site(catalogue, tmp_path):
    folder = catalogue({"a.yaml": VALID_EVENT})
    out = tmp_path / "out"
    assert main(["build", str(folder), "-o", str(out)]) == 0
    before = {p: p.read_bytes() for p in out.rglob("*") if p.is_file()}
    (folder / "a.yaml").write_text(VALID_EVENT.replace("36 +5", "x +5"))
    result = run("build", folder, "-o", out)
    assert result.returncode == 1 and "a.yaml:12: estimate.heavier.mass" in result.stderr
    assert "Traceback" not in result.stderr
    assert {p: p.read_bytes() for p in out.rglob("*") if p.is_file()} == before


def test_new_writes_a_template_that_checks_once_filled(tmp_path, capsys):
    assert main(["new", "DX-0001", "-d", str(tmp_path)]) == 0
    path = tmp_path / "DX-0001.yaml"
    assert main(["check", str(tmp_path)]) == 1  # required values still empty
    err = capsys.readouterr().err
    assert "estimate.heavier.mass: empty: write a value" in err and "time: empty" in err
    assert "estimate.lighter.mass: empty: write a value" in err
    text = path.read_text()
    for key, value in [
        ("title:", 'title: "A filled pair"'),
        ("time:", 'time: "2034-01-02T03:04:05"'),
        ("  heavier:\n    mass:", "  heavier:\n    mass: 30 +3 -3 Msun"),
        ("  lighter:\n    mass:", "  lighter:\n    mass: 20 +3 -3 Msun"),
        ("  distance:", "  distance: 500 +100 -100 Mpc"),
    ]:
        text = text.replace(key + " ", value + "  #", 1)
    path.write_text(text)
    assert main(["check", str(tmp_path)]) == 0, capsys.readouterr().err
    assert load_catalogue(tmp_path).events[0].id == "DX-0001"
    assert main(["new", "DX-0001", "-d", str(tmp_path)]) == 1  # never overwrites


def test_new_rejects_unsafe_id(tmp_path):
    assert main(["new", "../x", "-d", str(tmp_path)]) == 1


def test_help_for_each_command():
    for command in ("build", "check", "new"):
        result = run(command, "--help")
        assert result.returncode == 0 and "usage: factsheet" in result.stdout


def test_skipped_files_are_named(catalogue, capsys):
    cat = catalogue(
        {
            "a.yaml": VALID_EVENT,
            ".github/workflows/ci.yml": "on: push\n",
            ".hidden.yaml": "anything: 1\n",
        }
    )
    assert main(["check", str(cat)]) == 0
    err = capsys.readouterr().err
    assert "skipped: " in err and ".github" in err and ".hidden.yaml" in err
