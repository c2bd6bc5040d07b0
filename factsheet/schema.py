"""The input keys, declared once: kind, physical type, limits and one-line meaning.

The loader checks every file against these tables; ``factsheet new`` and the README's input
reference are written from the same meanings. Key names are a contract (DESIGN.md section 4).
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Key:
    """One input key: how to read it and what it means."""

    kind: str  # text, slug, time, choice, estimate, quantity, number, labels, markdown, ...
    meaning: str
    required: bool = False
    physical_type: str | None = None  # astropy physical type for estimates and quantities
    example: str = ""
    choices: tuple[str, ...] = ()
    low: float | None = None  # exclusive lower bound (in the canonical unit)
    high: float | None = None  # inclusive upper bound
    low_inclusive: bool = False
    high_inclusive: bool = True
    canonical_unit: str = ""


EVENT_KEYS: dict[str, Key] = {
    "id": Key("slug", "slug used in URLs, unique in the catalogue", True, example="DX-0412"),
    "title": Key("text", "display title", example="A heavy pair in the upper gap"),
    "time": Key("time", "merger time, UTC, ISO 8601", True, example="2034-04-12T07:26:41.2"),
    "status": Key(
        "choice",
        "candidate, confirmed or retracted",
        choices=("candidate", "confirmed", "retracted"),
    ),
    "frame": Key("choice", "frame of the given masses", choices=("source", "detector")),
    "parameters": Key("parameters", "the current estimate", True),
    "history": Key("history", "earlier estimates, each {date, label, note, parameters}"),
    "samples": Key("path", "CSV of posterior samples, relative to this file", example="a.csv"),
    "false_alarm_rate": Key(
        "quantity",
        "false-alarm rate",
        physical_type="frequency",
        example="1 / 80 yr",
        low=0.0,
        low_inclusive=True,
        canonical_unit="1/yr",
    ),
    "snr": Key("number", "network signal-to-noise ratio", example="14.3", low=0.0),
    "detectors": Key("labels", "list of site labels (free text)", example="[A1, B1, C1]"),
    "sky_area": Key(
        "quantity",
        "area of the credible sky region",
        physical_type="solid angle",
        example="580 deg2",
        low=0.0,
        canonical_unit="deg2",
    ),
    "host": Key("host", "host environment for counterpart windows (disk of an active nucleus)"),
    "visibility": Key("choice", "public or internal", choices=("public", "internal")),
    "embargo_until": Key("time", "UTC time before which a public build leaves the event out"),
    "internal_notes": Key("markdown", "Markdown shown only in internal builds"),
    "summary": Key("markdown", "Markdown text for the page"),
    "caveats": Key("markdown_list", "list of Markdown strings written by the editor"),
}

PARAMETER_KEYS: dict[str, Key] = {
    "mass_1": Key(
        "estimate",
        "mass of the heavier component",
        True,
        "mass",
        "36 +5 -4 Msun",
        low=0.0,
        canonical_unit="solMass",
    ),
    "mass_2": Key(
        "estimate",
        "mass of the lighter component",
        True,
        "mass",
        "29 +4 -5 Msun",
        low=0.0,
        canonical_unit="solMass",
    ),
    "spin_1z": Key(
        "estimate",
        "aligned spin component of the heavier body",
        False,
        "dimensionless",
        "0.1 +0.2 -0.2",
        low=-1.0,
        high=1.0,
        low_inclusive=True,
    ),
    "spin_2z": Key(
        "estimate",
        "aligned spin component of the lighter body",
        False,
        "dimensionless",
        "0.0 +0.3 -0.3",
        low=-1.0,
        high=1.0,
        low_inclusive=True,
    ),
    "chi_eff": Key(
        "estimate",
        "effective spin (used for both aligned components when they are not given)",
        False,
        "dimensionless",
        "0.05 +0.1 -0.1",
        low=-1.0,
        high=1.0,
        low_inclusive=True,
    ),
    "luminosity_distance": Key(
        "estimate",
        "luminosity distance",
        True,
        "length",
        "440 +180 -170 Mpc",
        low=0.0,
        canonical_unit="Mpc",
    ),
    "redshift": Key(
        "estimate",
        "redshift (derived from the distance when absent)",
        False,
        "dimensionless",
        "0.09 +0.03 -0.03",
        low=0.0,
    ),
}

HISTORY_KEYS: dict[str, Key] = {
    "date": Key("time", "when this estimate was issued", True, example="2034-04-12"),
    "label": Key("text", "short name of the estimate", True, example="rapid estimate"),
    "note": Key("markdown", "what this estimate was"),
    "parameters": Key("parameters", "the parameters of this estimate", True),
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
    "title": Key("text", "title of the catalogue site", example="First season"),
    "description": Key("markdown", "Markdown shown on the index page"),
    "base_url": Key("text", "absolute URL of the published site, for the feed"),
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
        canonical_unit="deg2",
    ),
    "limits": Key(
        "limits", "guards on input size: max_file_bytes, max_depth, max_aliases, max_sample_rows"
    ),
}
