"""Shared fixtures."""

from __future__ import annotations

from pathlib import Path

import pytest
from helpers import write_catalogue


@pytest.fixture
def catalogue(tmp_path: Path):
    """A factory: ``catalogue({"a.yaml": text, ...})`` gives a catalogue folder."""
    return lambda files: write_catalogue(tmp_path / "cat", files)
