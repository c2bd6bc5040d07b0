"""Derive one event without building a site (for notebooks and scripts).

>>> from factsheet.api import derive
>>> result = derive({"id": "X-1", "time": "2034-01-01T00:00:00",
...                  "estimate": {"heavier": {"mass": "36 +5 -4 Msun"},
...                               "lighter": {"mass": "29 +4 -5 Msun"},
...                               "distance": "440 +180 -170 Mpc"}})
>>> result.source_class
'BBH'
>>> result.summary("remnant_mass").unit
'solMass'
>>> result.summary("remnant_mass").quantity.unit
Unit("solMass")

``result.samples`` holds every per-sample Quantity, ``result.quantities`` the summaries (median,
credible bounds and level, fit spread, methods) and ``result.caveats`` the caveats. The keys are
those of the JSON export (docs/json-export.md); docs/api.md has more examples.
"""

from __future__ import annotations

import tempfile
from dataclasses import replace
from pathlib import Path
from typing import Any

import yaml

from factsheet.derive import derive_event
from factsheet.errors import InputError
from factsheet.load import load_event, load_settings
from factsheet.model import Derived, Settings

#: How a problem of an event given as a mapping names where it is (the key path follows).
MAPPING = "<event mapping>"


def derive(
    event: str | Path | dict[str, Any], settings: Settings | str | Path | None = None
) -> Derived:
    """Derive one event from a YAML file path or a mapping with the event keys.

    ``settings`` is a :class:`~factsheet.model.Settings`, a path to a ``catalogue.yaml``, or
    None for the defaults. Invalid input raises :class:`~factsheet.errors.InputError` listing
    every problem.
    """
    problems: list = []
    if isinstance(settings, str | Path):
        settings = load_settings(Path(settings), problems)
    settings = settings or Settings()
    if isinstance(event, dict):
        with tempfile.TemporaryDirectory() as folder:
            path = Path(folder) / "event.yaml"
            path.write_text(yaml.safe_dump(event, sort_keys=False), encoding="utf-8")
            loaded = load_event(path, path.parent, settings, problems)
        # the temporary file is gone: name the mapping and the key path, not its lines
        problems = [replace(p, file=MAPPING, line=None) for p in problems]
    else:
        path = Path(event)
        loaded = load_event(path, path.parent, settings, problems)
    if problems or loaded is None:
        raise InputError(problems=problems)
    return derive_event(loaded, settings)
