"""Shared fixtures."""

from __future__ import annotations

from pathlib import Path

import pytest
from helpers import write_catalogue

from factsheet.build import build
from factsheet.resources import demo_dir


@pytest.fixture
def catalogue(tmp_path: Path):
    """A factory: ``catalogue({"a.yaml": text, ...})`` gives a catalogue folder."""
    return lambda files: write_catalogue(tmp_path / "cat", files)


@pytest.fixture(scope="session")
def demo_site(tmp_path_factory) -> Path:
    """The demo catalogue built once for every test that only reads it (public audience)."""
    out = tmp_path_factory.mktemp("demo") / "site"
    build(demo_dir(), out)
    return out
