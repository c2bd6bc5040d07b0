"""The input keys, declared once: kind, physical type, limits and one-line meaning.

The loader checks every file against these tables, ``factsheet new`` writes its scaffold from
them, and docs/input-format.md describes the same keys. The key names are a contract (input
format version 2). A key of kind ``unsupported`` would be named so the schema is whole while its
feature is not built yet: ``check`` says so instead of ignoring it (no key is of that kind
now).

The editors' texts (``title``, ``summary``, ``caveats``, ``internal_notes``) are each one text
or a mapping of language code to text; the loader makes them
:class:`~factsheet.i18n.Editorial` values.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import astropy.units as u


@dataclass(frozen=True)
class Key:
    """One input key: how to read it and what it means."""

    kind: str  # text, slug, time, choice, interval, quantity, number, labels, markdown, ...
    meaning: str
    required: bool = False
    physical_type: str | None = None  # astropy physical type for intervals and quantities
    example: str = ""
    choices: tuple[str, ...] = ()
    low: float | None = None  # exclusive lower bound (in the canonical unit)
    high: float | None = None  # inclusive upper bound
    low_inclusive: bool = False
    high_inclusive: bool = True
    canonical_unit: str = ""
    range_note: str = ""  # why the range ends where it does, for the message


#: The whole sky, 4 pi steradians, in square degrees (41 252.96 deg2; astropy units).
WHOLE_SKY_DEG2 = float((4 * math.pi * u.sr).to_value(u.deg**2))
_WHOLE_SKY = f"the whole sky is {WHOLE_SKY_DEG2:.2f} deg2"


def unsupported(meaning: str, instead: str) -> Key:
    """A key of the format whose feature is not built yet; ``instead`` says what works today."""
    return Key("unsupported", meaning, example=instead)


def spin_key(meaning: str, example: str) -> Key:
    """A dimensionless spin component from -1 to 1."""
    return Key(
        "interval", meaning, False, "dimensionless", example, low=-1.0, high=1.0, low_inclusive=True
    )


EVENT_KEYS: dict[str, Key] = {
    "id": Key("slug", "slug used in URLs, unique in the catalogue", True, example="DX-0412"),
    "title": Key(
        "editorial_text",
        "display title: one text, or one per language ({en: ..., es: ...})",
        example="A heavy pair in the upper gap",
    ),
    "time": Key("time", "merger time, UTC, ISO 8601", True, example="2034-04-12T07:26:41.2"),
    "status": Key(
        "choice",
        "candidate, confirmed or retracted",
        choices=("candidate", "confirmed", "retracted"),
    ),
    "frame": Key("choice", "frame of the given masses", choices=("source", "detector")),
    "detection": Key("detection", "what the search reported: network, snr, significance, sky"),
    "estimate": Key("estimate", "the current estimate: the two bodies, spins and distance", True),
    "samples": Key(
        "path",
        "posterior samples (.csv, .ecsv or .fits table), relative to this file",
        example="a.ecsv",
    ),
    "counterpart_candidates": Key(
        "candidates",
        "transients reported by observers, each {name, ra, dec, time, note}",
        example='[{name: Flare F-1, ra: 47.3 deg, dec: -21.6 deg, time: "2034-04-25T03:00"}]',
    ),
    "host": Key("host", "host environment for counterpart windows (disk of an active nucleus)"),
    "what_if_lensed": Key(
        "magnifications",
        "magnifications for the what-if-lensed panel, each above 1 ([] for no panel)",
        example="[4, 25, 100]",
    ),
    "visibility": Key("choice", "public or internal", choices=("public", "internal")),
    "embargo_until": Key("time", "UTC time before which a public build leaves the event out"),
    "history": Key(
        "history",
        "earlier estimates and changes of status, oldest first, each {date, label, note, "
        "estimate, status}",
    ),
    "summary": Key(
        "editorial_markdown", "Markdown text for the page: one text, or one per language"
    ),
    "caveats": Key(
        "editorial_list",
        "list of Markdown texts written by the editors, each one text or one per language",
    ),
    "internal_notes": Key(
        "editorial_markdown",
        "Markdown shown only in internal builds: one text, or one per language",
    ),
}

DETECTION_KEYS: dict[str, Key] = {
    "network": Key("labels", "site labels (free text)", example="[A1, B1, C1]"),
    "snr": Key("number", "network signal-to-noise ratio", example="14.3", low=0.0),
    "false_alarm_rate": Key(
        "quantity",
        "false-alarm rate",
        physical_type="frequency",
        example="1 / 80 yr",
        low=0.0,
        low_inclusive=True,
        canonical_unit="1/yr",
    ),
    "sky_area": Key(
        "quantity",
        "area of the 90 % credible sky region",
        physical_type="solid angle",
        example="580 deg2",
        low=0.0,
        high=WHOLE_SKY_DEG2,
        canonical_unit="deg2",
        range_note=_WHOLE_SKY,
    ),
    "sky_map": Key(
        "sky_map",
        "HEALPix FITS probability map (equatorial), relative to this file",
        example="a-sky.fits",
    ),
}

ESTIMATE_KEYS: dict[str, Key] = {
    "heavier": Key("body", "the heavier body: mass and spin (the mass optional with chirp_mass)"),
    "lighter": Key("body", "the lighter body: mass and spin (the mass optional with chirp_mass)"),
    "effective_spin": spin_key(
        "effective spin (both bodies' aligned spins are taken equal to it)", "0.05 +0.1 -0.1"
    ),
    "precession_spin": Key(
        "interval",
        "effective precession spin, 0 to 1, beside the bodies' aligned spins or effective_spin",
        False,
        "dimensionless",
        "0.4 +0.3 -0.3",
        low=0.0,
        high=1.0,
        low_inclusive=True,
    ),
    "chirp_mass": Key(
        "interval",
        "chirp mass, in the frame of the masses: the masses are then drawn through it",
        False,
        "mass",
        "31.2 +1.1 -1.0 Msun",
        low=0.0,
        canonical_unit="solMass",
    ),
    "mass_ratio": Key(
        "interval",
        "mass ratio, lighter / heavier, above 0 and at most 1 (with chirp_mass)",
        False,
        "dimensionless",
        "0.74 +0.2 -0.25",
        low=0.0,
        high=1.0,
    ),
    "distance": Key(
        "interval",
        "luminosity distance",
        True,
        "length",
        "440 +180 -170 Mpc",
        low=0.0,
        canonical_unit="Mpc",
    ),
    "redshift": Key(
        "interval",
        "redshift (derived from the distance when absent)",
        False,
        "dimensionless",
        "0.09 +0.03 -0.03",
        low=0.0,
    ),
}

BODY_KEYS: dict[str, Key] = {
    "mass": Key(
        "interval",
        "mass (required unless the estimate gives chirp_mass)",
        False,
        "mass",
        "36 +5 -4 Msun",
        low=0.0,
        canonical_unit="solMass",
    ),
    "spin": spin_key("spin component along the orbital angular momentum, -1 to 1", "0.1 +0.2 -0.2"),
    "spin_magnitude": Key(
        "interval",
        "spin magnitude, 0 to 1, with its tilt (instead of spin)",
        False,
        "dimensionless",
        "0.4 +0.4 -0.3",
        low=0.0,
        high=1.0,
        low_inclusive=True,
    ),
    "tilt": Key(
        "interval",
        "angle of the spin to the orbital angular momentum, 0 to 180 deg, with spin_magnitude",
        False,
        "angle",
        "60 +40 -40 deg",
        low=0.0,
        high=180.0,
        low_inclusive=True,
        canonical_unit="deg",
        range_note="0 deg is along the orbit, 180 deg against it",
    ),
}

#: A history entry needs a date and a label, and an estimate, a status, or both.
HISTORY_KEYS: dict[str, Key] = {
    "date": Key("time", "when this estimate or change of status was issued", True, "2034-04-12"),
    "label": Key(
        "editorial_text",
        "short name of the step: one text, or one per language",
        True,
        example="Rapid estimate",
    ),
    "note": Key("editorial_markdown", "what this step was: one text, or one per language"),
    "estimate": Key("estimate", "the values of this estimate"),
    "status": Key(
        "choice",
        "the event's status from this date on: candidate, confirmed or retracted",
        example="retracted",
        choices=("candidate", "confirmed", "retracted"),
    ),
}

#: At most this many counterpart candidates on one sheet: a short list of reported transients.
MAX_CANDIDATES = 20

#: One counterpart candidate: a transient reported by observers.
CANDIDATE_KEYS: dict[str, Key] = {
    "name": Key("text", "the transient's name as reported", True, example="Flare F-1"),
    "ra": Key(
        "quantity",
        "right ascension (equatorial, J2000)",
        True,
        "angle",
        "47.3 deg",
        low=0.0,
        high=360.0,
        low_inclusive=True,
        high_inclusive=False,
        canonical_unit="deg",
    ),
    "dec": Key(
        "quantity",
        "declination (equatorial, J2000)",
        True,
        "angle",
        "-21.6 deg",
        low=-90.0,
        high=90.0,
        low_inclusive=True,
        canonical_unit="deg",
    ),
    "time": Key("time", "when the transient was seen, UTC", True, example="2034-04-25T03:00"),
    "note": Key(
        "editorial_markdown", "what was reported (Markdown): one text, or one per language"
    ),
}

HOST_KEYS: dict[str, Key] = {
    "smbh_mass": Key(
        "quantity",
        "mass of the central black hole",
        True,
        "mass",
        "1e8 Msun",
        low=0.0,
        canonical_unit="solMass",
    ),
    "orbit_radius": Key(
        "number",
        "orbit radius of the binary in gravitational radii of the central black hole",
        True,
        example="700",
        low=0.0,
    ),
    "disk_aspect_ratio": Key(
        "number",
        "disk half-thickness over radius, H/a",
        False,
        example="0.01",
        low=0.0,
    ),
}

CATALOGUE_KEYS: dict[str, Key] = {
    "title": Key(
        "editorial_text",
        "title of the catalogue site: one text, or one per language ({en: ..., es: ...})",
        example="First season",
    ),
    "description": Key(
        "editorial_markdown",
        "Markdown shown on the index page: one text, or one per language",
    ),
    "base_url": Key(
        "url",
        "absolute http:// or https:// URL of the published site, for the feed",
        example="https://example.org/sheets/",
    ),
    "cosmology": Key("cosmology", "astropy cosmology realisation", example="Planck18"),
    "credible_level": Key(
        "number",
        "credible level of the intervals",
        example="0.9",
        low=0.0,
        high=1.0,
        high_inclusive=False,
    ),
    "samples": Key("count", "samples drawn per event", example="4000"),
    "low_frequency": Key(
        "quantity",
        "low-frequency edge of the detector band",
        physical_type="frequency",
        example="20 Hz",
        low=0.0,
        canonical_unit="Hz",
    ),
    "arm_length": Key(
        "quantity",
        "detector arm length for the arm-length-change comparison",
        physical_type="length",
        example="4 km",
        low=0.0,
        canonical_unit="m",
    ),
    "mass_bands": Key("mapping", "overrides of the packaged mass-band edges"),
    "comparisons": Key("mapping", "overrides or additions to the packaged comparison objects"),
    "energy_units": Key("choice", "units for energies on pages", choices=("SI", "cgs")),
    "neutron_star_radius": Key(
        "quantity",
        "assumed neutron-star radius for the tidal-disruption estimate",
        physical_type="length",
        example="12 km",
        low=0.0,
        canonical_unit="km",
    ),
    "low_significance_rate": Key(
        "quantity",
        "false-alarm rate above which a sheet calls the event marginal",
        physical_type="frequency",
        example="1 / yr",
        low=0.0,
        canonical_unit="1/yr",
    ),
    "large_sky_area": Key(
        "quantity",
        "sky area above which a sheet says the localisation is poor",
        physical_type="solid angle",
        example="1000 deg2",
        low=0.0,
        high=WHOLE_SKY_DEG2,
        canonical_unit="deg2",
        range_note=_WHOLE_SKY,
    ),
    "limits": Key(
        "limits", "guards on input size: max_file_bytes, max_depth, max_aliases, max_sample_rows"
    ),
    "licence": Key(
        "editorial_text",
        "licence of the pages and exports, shown in the footer: one text, or one per language",
        example="CC BY 4.0",
    ),
    "citation": Key(
        "editorial_markdown",
        "how to cite the catalogue (Markdown), shown on every sheet: one text, or one per language",
    ),
    "languages": Key(
        "languages",
        "languages of the site, each one factsheet ships; the first at the site's root",
        example="[en, es]",
    ),
    "what_if_lensed": Key(
        "magnifications",
        "magnifications of the what-if-lensed panel of a body probably in or above the "
        "pair-instability gap, each above 1 ([] for no automatic panel)",
        example="[4, 25, 100]",
    ),
}


def value_key(path: str) -> Key:
    """The key of one value of an estimate by its path (``heavier.mass``, ``distance``)."""
    body, _, name = path.rpartition(".")
    return BODY_KEYS[name] if body else ESTIMATE_KEYS[name]


def physical_range(path: str) -> tuple[float, float]:
    """The physical range of an estimate value (samples are drawn and checked inside it)."""
    key = value_key(path)
    low = -math.inf if key.low is None else key.low
    high = math.inf if key.high is None else key.high
    return low, high
