"""Strict checks from day one: ruff lint and format over the checkout, mypy over the schema and
the physics (the files listed under [tool.mypy] in pyproject.toml) — STYLE.md point 12."""

import shutil
import subprocess
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]


@pytest.mark.parametrize("command", [["check", "."], ["format", "--check", "."]])
def test_ruff(command):
    ruff = shutil.which("ruff")
    if ruff is None:
        pytest.fail("ruff is missing: pip install -e '.[test]'")
    done = subprocess.run([ruff, *command], cwd=ROOT, capture_output=True, text=True)
    assert done.returncode == 0, done.stdout + done.stderr


def test_mypy():
    mypy = shutil.which("mypy")
    if mypy is None:
        pytest.fail("mypy is missing: pip install -e '.[test]'")
    done = subprocess.run([mypy], cwd=ROOT, capture_output=True, text=True)
    assert done.returncode == 0, done.stdout + done.stderr
