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
  # sky_map: {id}-sky.fits   # optional HEALPix FITS probability map (docs/sky-maps.md)

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
# counterpart_candidates:   # transients reported by observers, each read against the sky
#   - {{name: Flare F-1, ra: 47.3 deg, dec: -21.6 deg, time: "2034-04-25T03:00", note: ...}}
# what_if_lensed: [4, 25, 100]   # magnifications for the what-if-lensed panel ([] for none)
# history: earlier estimates and changes of status, oldest first, each
#   {{date, label, note, estimate}} or {{date, label, note, status: retracted}} (or both)

summary: |
  A few plain sentences for the page.

caveats: []              # Markdown notes from the editors
# On a site in several languages, each text may be given per language, the site's first
# language first: summary: {{en: ..., es: ...}} (docs/input-format.md)
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


# -- factsheet init: a new catalogue folder -----------------------------------------------------

SETTINGS_TEMPLATE = """\
# Settings of this catalogue. Every key is optional: remove the "# " before a key to set it.
# The values shown are the defaults (or examples); docs/settings.md describes each key.
title: {title}

# description: |                  # Markdown shown at the top of the index page
#   What this catalogue is, who keeps it and how to reach them.
# base_url: https://example.org/sheets/   # where the site is published (feed, link previews)
# licence: CC BY 4.0              # shown in every page's footer and in the exports
# citation: |                     # how to cite the catalogue (Markdown), on every sheet
#   Your group (2034). Title of the catalogue.
# cosmology: Planck18             # astropy cosmology for redshifts and source-frame masses
# credible_level: 0.9             # probability held by every quoted interval
# samples: 4000                   # samples drawn per event from its summary values
# low_frequency: 20 Hz            # lower edge of the detectors' band
# arm_length: 4 km                # for the arm-length-change comparison
# energy_units: SI                # SI (J, W) or cgs (erg, erg/s)
# neutron_star_radius: 12 km      # assumed for the tidal-disruption estimate
# low_significance_rate: 1 / yr   # false-alarm rate above which a sheet calls an event marginal
# large_sky_area: 1000 deg2       # sky area above which a sheet says the region is large
# mass_bands: {{}}                  # overrides of the packaged mass-band edges
# comparisons: {{}}                 # overrides or additions to the comparison objects
# what_if_lensed: [4, 25, 100]    # magnifications of the automatic what-if-lensed panel
"""

EXAMPLE_EVENT = """\
# An example event to overwrite with your own (the values are invented, plausible ones).
# Copy this file for each event, or write a blank one with `factsheet new ID`.
# Values: MEDIAN +PLUS -MINUS UNIT (the bounds of the catalogue's credible interval) or
# VALUE UNIT for an exact value; docs/input-format.md describes every key.
id: EXAMPLE-001
title: An example pair of black holes
time: "2034-01-15T03:12:45.6"     # merger time, UTC (in quotes)
status: candidate                 # candidate, confirmed or retracted
detection:
  network: [A1, B1]               # your sites' labels
  snr: 11.8                       # network signal-to-noise ratio
  false_alarm_rate: 1 / 40 yr
  sky_area: 900 deg2              # area of the 90 % credible region
estimate:
  heavier:
    mass: 32 +6 -5 Msun
    spin: 0.1 +0.4 -0.4           # aligned component, -1..1
  lighter:
    mass: 24 +5 -6 Msun
    spin: 0.0 +0.5 -0.5
  distance: 1200 +500 -450 Mpc    # luminosity distance
summary: |
  A few plain sentences for the page: what was seen, and why it matters.
caveats: []                       # Markdown notes from the editors
"""

README_TEMPLATE = """\
# {title}

A factsheet catalogue: `catalogue.yaml` holds the settings, every other `*.yaml` file one event.

Next: overwrite `example-001.yaml` with your first event (or add one with
`factsheet new ID -d {folder}`), then `factsheet check {folder}` to validate,
`factsheet build {folder} -o site` to build the site into `site/`, and
`factsheet serve {folder}` to preview it while you edit.
"""


def init_catalogue(folder: Path) -> list[Path]:
    """A new catalogue folder that checks and builds as it is: settings with every key
    commented, one example event to overwrite and a README saying what to do next. Refuses a
    folder that exists and is not empty (nothing is ever overwritten)."""
    if folder.exists() and (not folder.is_dir() or any(folder.iterdir())):
        what = "is a file" if not folder.is_dir() else "exists and is not empty"
        message = f"{what}; give a new folder (nothing is overwritten)"
        raise InputError(problems=[Problem(folder, None, "", message)])
    title = folder.name.replace("-", " ").replace("_", " ").strip() or "My catalogue"
    files = {
        "catalogue.yaml": SETTINGS_TEMPLATE.format(title=_yaml_text(title.capitalize())),
        "example-001.yaml": EXAMPLE_EVENT,
        "README.md": README_TEMPLATE.format(title=title.capitalize(), folder=folder),
    }
    try:
        folder.mkdir(parents=True, exist_ok=True)
        for name, text in files.items():
            with (folder / name).open("x", encoding="utf-8") as handle:
                handle.write(text)
    except OSError as exc:
        where = exc.filename or folder
        message = f"cannot write the new catalogue here ({exc.strerror})"
        raise InputError(problems=[Problem(where, None, "", message)]) from None
    return [folder / name for name in files]


def _yaml_text(text: str) -> str:
    """A title as a double-quoted YAML string."""
    return '"' + text.replace("\\\\", "\\\\\\\\").replace('"', '\\\\"') + '"'
