"""``factsheet new``: a commented event file to fill in.

The required values are left empty, so ``factsheet check`` points at each one until it is filled.
"""

from __future__ import annotations

from pathlib import Path

from factsheet.errors import InputError, Problem
from factsheet.load.scalars import SLUG

TEMPLATE = """\
# Fact sheet input for {id}. Fill in the values, then run `factsheet check`.
# Values with an interval: MEDIAN +PLUS -MINUS UNIT (bounds of the catalogue's credible
# interval, 90 % by default); exact values: VALUE UNIT. Units are astropy unit strings
# plus the aliases Msun, Mpc, Gpc and deg2. The format is described in docs/input-format.md.
id: {id}
title:            # a display title, e.g. "A heavy pair in the upper gap"
time:             # merger time, UTC, ISO 8601, e.g. "2034-04-12T07:26:41.2"
status: candidate # candidate, confirmed or retracted
frame: source     # frame of the masses below: source or detector

detection:
  network: []            # site labels, e.g. [A1, B1]
  snr:                   # network signal-to-noise ratio, e.g. 14.3
  false_alarm_rate:      # e.g. 1 / 80 yr
  sky_area:              # area of the 90 % credible region, e.g. 580 deg2

estimate:
  heavier:
    mass:                # e.g. 36 +5 -4 Msun
    spin:                # aligned spin component, -1..1, e.g. 0.1 +0.3 -0.3
  lighter:
    mass:                # e.g. 29 +4 -5 Msun
    spin:                # e.g. 0.0 +0.4 -0.4 (or give effective_spin instead of both)
  distance:              # luminosity distance, e.g. 440 +180 -170 Mpc

# Optional:
# samples: {id}.csv      # posterior samples; header cells 'path [unit]', e.g. heavier.mass [Msun]
# visibility: internal   # leave out of public builds
# embargo_until: "2034-05-01T00:00"
# host: {{smbh_mass: 1e8 Msun, orbit_radius: 700, disk_aspect_ratio: 0.01}}
# history: earlier estimates and changes of status, oldest first, each
#   {{date, label, note, estimate}} or {{date, label, note, status: retracted}} (or both)

summary: |
  A few plain sentences for the page.

caveats: []              # Markdown notes from the editors
"""


def write_new_event(event_id: str, folder: Path) -> Path:
    """Write ``<folder>/<id>.yaml`` from the template; never overwrite an existing file."""
    if not SLUG.match(event_id) or event_id.startswith("."):
        raise InputError(
            problems=[
                Problem(
                    "<command line>",
                    None,
                    "id",
                    f"invalid id {event_id!r} "
                    "(expected letters, digits, '.', '_' and '-', e.g. DX-0412)",
                )
            ]
        )
    path = folder / f"{event_id}.yaml"
    if folder.exists() and not folder.is_dir():
        raise InputError(problems=[Problem(folder, None, "", "is a file, not a folder")])
    try:
        folder.mkdir(parents=True, exist_ok=True)
        with path.open("x", encoding="utf-8") as handle:  # never overwrite an existing file
            handle.write(TEMPLATE.format(id=event_id))
    except FileExistsError:
        exists = Problem(path, None, "", "file exists; not overwriting it")
        raise InputError(problems=[exists]) from None
    except OSError as exc:
        where = exc.filename or folder
        message = f"cannot write the new event file here ({exc.strerror})"
        raise InputError(problems=[Problem(where, None, "", message)]) from None
    return path
