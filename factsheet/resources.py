"""Find the folders that ship with factsheet: the templates and the demo catalogue.

In an installed wheel they live inside the package (``factsheet/templates``); in a checkout or
an editable install they are the top-level ``templates/`` and ``events_demo/`` beside the package.
"""

from __future__ import annotations

from pathlib import Path

PACKAGE = Path(__file__).resolve().parent


def shipped_folder(name: str, package: Path = PACKAGE) -> Path:
    """The packaged copy of ``name`` if the wheel holds one, else the checkout's top-level one."""
    for candidate in (package / name, package.parent / name):
        if candidate.is_dir():
            return candidate
    raise FileNotFoundError(f"factsheet's {name}/ folder is missing from {package} and its parent")


def templates_dir() -> Path:
    return shipped_folder("templates")


def demo_dir() -> Path:
    return shipped_folder("events_demo")
