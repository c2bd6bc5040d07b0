"""The build, stage by stage: load, select, derive, render, publish.

Everything is loaded, checked, derived and rendered in memory before anything is written, and
the site is swapped in whole at the end.
"""

from __future__ import annotations

import os
import time as clock
from dataclasses import dataclass
from pathlib import Path

from astropy.time import Time

from factsheet.derive import Derived, derive_event
from factsheet.load import load_catalogue
from factsheet.model import Catalogue, Event
from factsheet.publish import publish
from factsheet.render import render_site

AUDIENCES = ("public", "internal")


@dataclass(frozen=True)
class BuildReport:
    """What a build did, for the one-line summary."""

    built: int
    withheld_internal: int
    withheld_embargo: int
    seconds: float
    out: Path


def build_time() -> Time:
    """The build's clock: ``SOURCE_DATE_EPOCH`` when set (reproducible builds), else now."""
    epoch = os.environ.get("SOURCE_DATE_EPOCH")
    return Time(int(epoch), format="unix") if epoch else Time.now()


def select_events(catalogue: Catalogue, audience: str, now: Time) -> tuple[list[Event], int, int]:
    """The events an audience may see, and how many were withheld as internal or embargoed."""
    if audience == "internal":
        return list(catalogue.events), 0, 0
    internal = [e for e in catalogue.events if e.visibility == "internal"]
    embargoed = [
        e
        for e in catalogue.events
        if e.visibility != "internal" and e.embargo_until is not None and e.embargo_until > now
    ]
    hidden = {e.id for e in internal + embargoed}
    return [e for e in catalogue.events if e.id not in hidden], len(internal), len(embargoed)


def build(
    catalogue_dir: str | Path, out: str | Path, audience: str = "public", force: bool = False
) -> BuildReport:
    """Build the site for ``catalogue_dir`` into ``out``."""
    start = clock.perf_counter()
    catalogue = load_catalogue(catalogue_dir)
    events, internal, embargoed = select_events(catalogue, audience, build_time())
    derived: list[Derived] = [derive_event(e, catalogue.settings) for e in events]
    site = render_site(derived, catalogue.settings, audience)
    publish(site, Path(out), force=force)
    return BuildReport(len(derived), internal, embargoed, clock.perf_counter() - start, Path(out))
