"""The typed records passed between the stages, all frozen.

``load`` makes a :class:`Catalogue` of :class:`Event` objects (each with its current
:class:`Estimate` and history), ``derive`` turns one event into a :class:`Derived` record of
:class:`Summary` values, caveats, bands and windows, and the build caches one
:class:`EventBundle` (the derived record and its figure and sound files) per event for
``render``. Nothing here computes physics or reads files.
"""

from __future__ import annotations

import functools
import hashlib
from collections.abc import Mapping
from dataclasses import dataclass, field, fields
from pathlib import Path
from typing import Any

import astropy.units as u
import numpy as np
from astropy.time import Time

from factsheet.errors import Problem
from factsheet.i18n import Text
from factsheet.physics.counterparts import Window

SOURCE = "source"
DETECTOR = "detector"


# -- values given in the input -------------------------------------------------------------


@functools.cache
def _unit(text: str) -> u.UnitBase:
    """The astropy unit ``text`` names, parsed once (every event then shares it)."""
    return u.Unit(text)


@dataclass(frozen=True, slots=True)
class Interval:
    """A given value: a median with the offsets to the bounds of its credible interval.

    An exact value (``4 km``, ``1 / 80 yr``) has both offsets zero.
    """

    median: float
    plus: float
    minus: float
    unit: u.UnitBase

    @property
    def exact(self) -> bool:
        return self.plus == 0 and self.minus == 0

    @property
    def quantity(self) -> u.Quantity:
        return self.median * self.unit

    @property
    def low(self) -> float:
        return self.median - self.minus

    @property
    def high(self) -> float:
        return self.median + self.plus

    def to(self, unit: u.UnitBase | str) -> Interval:
        unit = _unit(unit) if isinstance(unit, str) else unit
        factor = self.unit.to(unit)
        return Interval(self.median * factor, self.plus * factor, self.minus * factor, unit)

    def canonical(self) -> str:
        """A stable text form, used to seed the random draws from the content."""
        return f"{self.median!r} +{self.plus!r} -{self.minus!r} {self.unit.to_string()}"


@dataclass(frozen=True, slots=True)
class Limits:
    """Guards against input that no real catalogue needs; raise them in catalogue.yaml."""

    max_file_bytes: int = 2_000_000
    max_depth: int = 32
    max_aliases: int = 100
    max_sample_rows: int = 1_000_000


@dataclass(frozen=True, slots=True)
class Settings:
    """Catalogue-wide settings from ``catalogue.yaml``, with the documented defaults."""

    title: str = Text("Gravitational-wave fact sheets")  # in the page's language
    description: str = ""
    base_url: str = ""
    cosmology: str = "Planck18"
    credible_level: float = 0.9
    samples: int = 4000
    low_frequency: u.Quantity = field(default_factory=lambda: 20.0 * u.Hz)
    arm_length: u.Quantity = field(default_factory=lambda: 4.0 * u.km)
    mass_bands: dict[str, Any] = field(default_factory=dict)
    comparisons: dict[str, Any] = field(default_factory=dict)
    energy_units: str = "SI"
    # 12 km: current radius estimates span about 11-13 km (from memory)
    neutron_star_radius: u.Quantity = field(default_factory=lambda: 12.0 * u.km)
    # thresholds of the low-significance and large-sky-area caveats (common practice)
    low_significance_rate: u.Quantity = field(default_factory=lambda: 1.0 / u.yr)
    large_sky_area: u.Quantity = field(default_factory=lambda: 1000.0 * u.deg**2)
    limits: Limits = field(default_factory=Limits)
    licence: str = ""  # licence of the pages and exports (text, e.g. "CC BY 4.0")
    citation: str = ""  # how to cite the catalogue (Markdown)
    # magnifications of the automatic what-if-lensed panel (METHODS: 4, 25 and 100 by default)
    what_if_lensed: tuple[float, ...] = (4.0, 25.0, 100.0)
    # languages of the site: the first at the root, each other under <lang>/ (DESIGN 5.1)
    languages: tuple[str, ...] = ("en",)

    def fingerprint(self) -> str:
        """A stable text form of the settings that change derived numbers or event files."""
        return "|".join(
            str(x)
            for x in (
                self.cosmology,
                self.credible_level,
                self.samples,
                self.low_frequency.to_value(u.Hz),
                self.arm_length.to_value(u.m),
                sorted(self.mass_bands.items()),
                sorted(self.comparisons.items()),
                self.energy_units,
                self.neutron_star_radius.to_value(u.km),
                self.low_significance_rate.to_value(1 / u.yr),
                self.large_sky_area.to_value(u.deg**2),
                self.what_if_lensed,
                self.languages,  # a bundle holds each language's figures
                sorted(getattr(self.title, "versions", {"": self.title}).items()),  # on the
                # share card of every event
            )
        )


# -- one event ---------------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Body:
    """One of the two bodies of an estimate: its mass (absent when the estimate gives the chirp
    mass instead) and, when given, its spin as the aligned component (``spin``) or as a
    magnitude with its tilt to the orbital angular momentum."""

    mass: Interval | None = None
    spin: Interval | None = None
    spin_magnitude: Interval | None = None
    tilt: Interval | None = None  # degrees


#: The paths of an estimate's values, in a fixed order (also the samples-file column names).
ESTIMATE_PATHS = (
    "heavier.mass",
    "lighter.mass",
    "heavier.spin",
    "lighter.spin",
    "heavier.spin_magnitude",
    "heavier.tilt",
    "lighter.spin_magnitude",
    "lighter.tilt",
    "effective_spin",
    "precession_spin",
    "distance",
    "redshift",
)


@dataclass(frozen=True, slots=True)
class Estimate:
    """One set of parameter values of an event: the current one, or one in its history."""

    heavier: Body
    lighter: Body
    distance: Interval
    effective_spin: Interval | None = None
    redshift: Interval | None = None
    precession_spin: Interval | None = None
    chirp_mass: Interval | None = None  # in the event's frame, like the masses
    mass_ratio: Interval | None = None  # lighter / heavier, 0 < q <= 1

    def values(self) -> dict[str, Interval]:
        """Every given value by its path (``heavier.mass``, ``distance``, ...), in path order."""
        found = {
            "heavier.mass": self.heavier.mass,
            "lighter.mass": self.lighter.mass,
            "heavier.spin": self.heavier.spin,
            "lighter.spin": self.lighter.spin,
            "heavier.spin_magnitude": self.heavier.spin_magnitude,
            "heavier.tilt": self.heavier.tilt,
            "lighter.spin_magnitude": self.lighter.spin_magnitude,
            "lighter.tilt": self.lighter.tilt,
            "effective_spin": self.effective_spin,
            "precession_spin": self.precession_spin,
            "distance": self.distance,
            "redshift": self.redshift,
            "chirp_mass": self.chirp_mass,
            "mass_ratio": self.mass_ratio,
        }
        return {path: value for path, value in found.items() if value is not None}

    def __contains__(self, path: object) -> bool:
        return path in self.values()

    def __getitem__(self, path: str) -> Interval:
        return self.values()[path]

    def canonical(self) -> str:
        return ";".join(f"{k}={v.canonical()}" for k, v in sorted(self.values().items()))


@dataclass(frozen=True, slots=True)
class SkyMapFile:
    """A HEALPix probability map as checked by the load stage: where it is and how it is laid
    out. The probabilities are read again where they are used (a map can hold 50 million
    pixels, too many to keep for every event of a catalogue).

    ``digest`` is the SHA-256 of the file's bytes; ``ordering`` is ``RING`` or ``NESTED``;
    ``column`` names the probability column of the file's table.
    """

    path: Path
    digest: str
    nside: int
    ordering: str
    column: str


@dataclass(frozen=True, slots=True)
class Detection:
    """What the search reported: the sites, the signal-to-noise ratio, significance, sky area
    and the sky map."""

    network: tuple[str, ...] = ()
    snr: float | None = None
    false_alarm_rate: u.Quantity | None = None
    sky_area: u.Quantity | None = None
    sky_map: SkyMapFile | None = None


@dataclass(frozen=True, slots=True)
class CounterpartCandidate:
    """A transient reported by observers: its name, position (equatorial, degrees), time and
    the editors' note."""

    name: str
    ra: u.Quantity
    dec: u.Quantity
    time: Time
    note: str = ""


@dataclass(frozen=True, slots=True)
class Host:
    """Disk of an active galactic nucleus hosting the merger."""

    smbh_mass: u.Quantity
    orbit_radius: float  # in gravitational radii of the central black hole
    disk_aspect_ratio: float | None = None


@dataclass(frozen=True, slots=True)
class HistoryEntry:
    """One dated step of the event's history: an earlier estimate, a change of status, or both.

    At least one of ``estimate`` and ``status`` is set (the load stage sees to it).
    """

    date: Time
    label: str
    note: str = ""
    estimate: Estimate | None = None
    status: str | None = None  # the event's status from this date on (candidate, ...)


@dataclass(frozen=True, slots=True)
class SamplesFile:
    """A posterior-samples file as read and checked by the load stage.

    ``values`` maps estimate paths to samples in canonical units (solMass, Mpc, dimensionless),
    heavier body first in every sample; ``digest`` is the SHA-256 of the file's bytes.
    """

    path: Path
    digest: str
    values: Mapping[str, np.ndarray] = field(compare=False, repr=False)


@dataclass(frozen=True, slots=True)
class Event:
    """One validated event file.

    The editors' texts — ``title``, ``summary``, ``internal_notes`` and each of ``caveats`` —
    are :class:`~factsheet.i18n.Editorial` values when loaded: a ``str`` whose value is the
    original (the first version given, which the exports carry) and which shows, in a language
    context, the editors' version in that language or the original where they gave none.
    """

    id: str
    title: str  # Editorial when loaded (the id when the file gives no title)
    time: Time
    estimate: Estimate
    source: Path
    source_digest: str = ""  # SHA-256 of the file's bytes, as read by the load stage
    # SHA-256 of what the file says apart from the editors' words no number, figure or sound
    # uses (its summary and internal notes): the build cache's key, so such an edit redraws
    # nothing
    content_digest: str = ""
    line: int = 1
    status: str = "confirmed"
    frame: str = SOURCE
    detection: Detection = field(default_factory=Detection)
    history: tuple[HistoryEntry, ...] = ()
    samples: SamplesFile | None = None
    counterpart_candidates: tuple[CounterpartCandidate, ...] = ()
    host: Host | None = None
    what_if_lensed: tuple[float, ...] | None = None  # magnifications asked for; None: automatic
    visibility: str = "public"
    embargo_until: Time | None = None
    internal_notes: str = ""  # Editorial when loaded, like summary and each of caveats
    summary: str = ""
    caveats: tuple[str, ...] = ()
    key_lines: dict[str, int] = field(default_factory=dict, compare=False, repr=False)

    def line_of(self, key: str) -> int:
        """The line of a key (top-level, or a path into the estimate such as
        ``estimate.heavier.mass``) in the event's file; the id's line if absent."""
        return self.key_lines.get(key, self.line)

    def seed(self) -> int:
        """Random seed from the content that determines the numbers (not the prose)."""
        text = f"{self.id}|{self.frame}|{self.estimate.canonical()}"
        return int.from_bytes(hashlib.sha256(text.encode()).digest()[:8], "little")


@dataclass(frozen=True, slots=True)
class Catalogue:
    """A validated catalogue: its settings and its events, sorted by merger time."""

    root: Path
    settings: Settings
    events: tuple[Event, ...]
    warnings: tuple[Problem, ...] = ()  # fatal only in strict mode
    skipped: tuple[tuple[Path, str], ...] = ()  # files and folders not read, with the reason


# -- packaged reference data -----------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Edge:
    """One mass-band edge with its source and the spread of the literature."""

    key: str
    label: str
    value: u.Quantity
    source: str
    spread: str = ""
    overridden: bool = False


@dataclass(frozen=True, slots=True)
class MassBands:
    """The mass-band edges in increasing order, plus the intermediate-mass threshold."""

    neutron_star_max: Edge
    lower_gap_top: Edge
    pair_instability_lower: Edge
    pair_instability_upper: Edge
    intermediate_mass_min: Edge

    def edges(self) -> tuple[Edge, ...]:
        """All edges, lowest first."""
        return tuple(getattr(self, f.name) for f in fields(self))

    def quantities(self) -> dict[str, u.Quantity]:
        """Edge key to mass, the form :func:`factsheet.physics.bands.band_probabilities` takes."""
        return {edge.key: edge.value for edge in self.edges()}


@dataclass(frozen=True, slots=True)
class WindowSpec:
    """A rest-frame counterpart window: delays after the merger, band, scenario and basis."""

    key: str
    band: str
    scenario: str
    start: u.Quantity
    end: u.Quantity
    basis: str


@dataclass(frozen=True, slots=True)
class Comparison:
    """A comparison object: an energy (J) or a luminosity (W) with its source."""

    key: str
    label: str
    kind: str
    value: u.Quantity
    source: str
    low: u.Quantity | None = None
    high: u.Quantity | None = None
    overridden: bool = False


@dataclass(frozen=True, slots=True)
class Reference:
    """All reference data of one build."""

    mass_bands: MassBands
    windows: tuple[WindowSpec, ...]
    comparisons: tuple[Comparison, ...]

    def energies(self) -> dict[str, u.Quantity]:
        """Comparison energies by key."""
        return {c.key: c.value for c in self.comparisons if c.kind == "energy"}

    def luminosities(self) -> dict[str, u.Quantity]:
        """Comparison luminosities by key."""
        return {c.key: c.value for c in self.comparisons if c.kind == "luminosity"}

    def comparison_labels(self) -> dict[str, str]:
        return {c.key: c.label for c in self.comparisons}


# -- what derive finds ---------------------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class Summary:
    """Median and the bounds of the credible interval at ``level`` of one quantity."""

    median: float
    low: float
    high: float
    unit: str
    level: float
    frame: str | None = None
    fit_spread: float | None = None
    methods: tuple[str, ...] = ()

    @property
    def quantity(self) -> u.Quantity:
        """The median as an astropy Quantity (``88.0 solMass``)."""
        return self.median * u.Unit(self.unit)

    @property
    def bounds(self) -> u.Quantity:
        """The bounds of the credible interval as a Quantity of two values (low, high)."""
        return [self.low, self.high] * u.Unit(self.unit)

    def as_dict(self) -> dict:
        data: dict[str, Any] = {
            "median": self.median,
            "low": self.low,
            "high": self.high,
            "unit": self.unit,
        }
        if self.frame:
            data["frame"] = self.frame
        if self.fit_spread is not None:
            data["fit_spread"] = self.fit_spread
        data["methods"] = list(self.methods)
        return data


@dataclass(frozen=True, slots=True)
class Caveat:
    """One caveat: a stable code, a level (info, notice, warning) and plain text.

    The text of a caveat derive makes is a kept message (:class:`factsheet.i18n.Text`): its
    ``str`` value is the English wording, which comparisons and the exports see, while
    ``str()``, formatting and HTML escaping give it in the language in use. An editorial
    caveat's text is the editors' own (:class:`factsheet.i18n.Editorial`).

    ``concerns`` names the quantities (keys of :attr:`Derived.quantities`) whose rows the
    caveat bears on, so a sheet can mark those rows; a caveat about the whole sheet has none.
    """

    code: str
    level: str
    text: str
    editorial: bool = False
    concerns: tuple[str, ...] = ()  # quantity keys of the rows it bears on (empty: the sheet)

    def as_dict(self) -> dict[str, Any]:
        data: dict[str, Any] = {"code": self.code, "level": self.level, "text": self.text}
        if self.editorial:
            data["editorial"] = True
        if self.concerns:
            data["concerns"] = list(self.concerns)
        return data


@dataclass(frozen=True, slots=True)
class Comparisons:
    """The median energy radiated and peak luminosity against the comparison objects."""

    energy: Mapping[str, float] = field(default_factory=dict)  # ratio by comparison key
    luminosity: Mapping[str, float] = field(default_factory=dict)
    sun_years: u.Quantity | None = None  # time the Sun needs to emit the energy radiated


@dataclass(frozen=True, slots=True)
class SecondGeneration:
    """A body compared with the remnants of first-generation mergers (a reasoning aid):
    their mass, spin magnitude and spin component along a new orbit, and the shares of the
    body's mass and (when given) spin samples inside those ranges."""

    subject: str  # heavier or lighter
    mass: Summary
    spin: Summary
    spin_along: Summary
    mass_inside: float
    spin_inside: float | None

    def as_dict(self) -> dict[str, Any]:
        return {
            "subject": self.subject,
            "remnant_mass": self.mass.as_dict(),
            "remnant_spin": self.spin.as_dict(),
            "remnant_spin_along_orbit": self.spin_along.as_dict(),
            "mass_inside": self.mass_inside,
            "spin_inside": self.spin_inside,
        }

    @classmethod
    def from_fields(cls, data: dict[str, Any]) -> SecondGeneration:
        """The record from ``dataclasses.asdict`` of one (the build cache's form)."""

        def summary(d: dict[str, Any]) -> Summary:
            return Summary(**{**d, "methods": tuple(d["methods"])})

        return cls(
            str(data["subject"]),
            summary(data["mass"]),
            summary(data["spin"]),
            summary(data["spin_along"]),
            float(data["mass_inside"]),
            None if data["spin_inside"] is None else float(data["spin_inside"]),
        )


@dataclass(frozen=True, slots=True)
class LensedCase:
    """The source if a lens magnified the signal ``magnification`` times: true distance,
    redshift and source-frame masses summarised from the samples, and the mass-band
    probabilities of each subject (``heavier``, ``lighter``, ``remnant``) at those masses."""

    magnification: float
    distance: Summary
    redshift: Summary
    heavier_mass: Summary
    lighter_mass: Summary
    remnant_mass: Summary | None
    mass_bands: Mapping[str, Mapping[str, float]]  # subject -> band -> probability


@dataclass(frozen=True, slots=True)
class Lensing:
    """The what-if-lensed panel: one case per magnification, and why it was made (``event``:
    the event's own list; ``automatic``: a body is probably in or above the pair-instability
    gap, with the catalogue's magnifications). ``beyond`` lists magnifications left out because
    they put the source beyond the redshift table."""

    origin: str
    cases: tuple[LensedCase, ...]
    beyond: tuple[float, ...] = ()


@dataclass(frozen=True, slots=True)
class SkyMapSummary:
    """What the sheet says of a sky map: the 50 % and 90 % credible areas, the area at the
    catalogue's credible level, and the most probable position.

    ``levels`` is the map's credible level on a grid of ``height`` × ``width`` cells (rows of
    declination from −90°, columns of right ascension from 0°) for the figures; it is not kept
    in the build's cache (empty there).
    """

    nside: int
    ordering: str
    area_50: u.Quantity
    area_90: u.Quantity
    area: u.Quantity  # at the catalogue's credible level
    peak_ra: u.Quantity
    peak_dec: u.Quantity
    levels: np.ndarray = field(default_factory=lambda: np.empty((0, 0)), compare=False, repr=False)


@dataclass(frozen=True, slots=True)
class CandidateReading:
    """A counterpart candidate read against the sheet: the sky map's credible level at its
    position (None without a map), its delay after the merger in the observer's frame and in
    the source frame (a summary over the redshift samples), and the keys of the counterpart
    windows it falls in."""

    candidate: CounterpartCandidate
    credible_level: float | None
    delay: u.Quantity  # days, observer frame; negative before the merger
    delay_source: Summary  # days, source frame
    windows: tuple[str, ...] = ()


@dataclass(frozen=True, slots=True)
class Derived:
    """Everything derived for one event: summaries, classes, bands, windows and caveats.

    ``samples`` holds the per-sample Quantities behind the summaries (empty in the build's
    cached bundles, which need only the summaries).
    """

    event: Event
    settings: Settings
    reference: Reference
    quantities: Mapping[str, Summary]
    caveats: tuple[Caveat, ...]
    source_class: str
    class_probabilities: Mapping[str, float]
    mass_bands: Mapping[str, Mapping[str, float]]  # subject -> band -> probability
    intermediate_mass: Mapping[str, float]  # subject -> probability of >= the threshold
    disruption_probability: float | None = None
    windows: tuple[Window, ...] = ()
    no_window_reason: str = ""
    comparisons: Comparisons = field(default_factory=Comparisons)
    other_methods: tuple[str, ...] = ()  # methods behind the class, bands, windows, comparisons
    second_generation: tuple[SecondGeneration, ...] = ()  # bodies in or above the gap
    lensing: Lensing | None = None  # the what-if-lensed panel, when asked for or automatic
    sky_map: SkyMapSummary | None = None
    candidates: tuple[CandidateReading, ...] = ()
    samples: Mapping[str, u.Quantity] = field(default_factory=dict, compare=False, repr=False)

    @property
    def credible_level(self) -> float:
        return self.settings.credible_level

    def summary(self, name: str) -> Summary:
        """The summary of one quantity (KeyError if this event has none)."""
        return self.quantities[name]


# -- what a build makes of an event ---------------------------------------------------------------


@dataclass(frozen=True, slots=True)
class FigureInfo:
    """What a page needs to show a figure: its site path, alt text and caption."""

    path: str
    alt: str
    caption: str


@dataclass(frozen=True, slots=True)
class SiteFigure:
    """One drawn figure: its site-relative path, SVG bytes, alt text and caption."""

    path: str
    svg: bytes
    alt: str
    caption: str
    seconds: float = 0.0

    @property
    def info(self) -> FigureInfo:
        return FigureInfo(self.path, self.alt, self.caption)


@dataclass(frozen=True, slots=True)
class Audio:
    """The chirp sound of a sheet: its site path, how it was made (in words, with the numbers as
    the sheet's table prints them) and its length in seconds (the shifted copy has the same);
    and, when the sound lies below what small speakers play, the path and words of a copy
    shifted up into their range (None and "" otherwise)."""

    path: str
    description: str
    duration_s: float
    shifted_path: str | None = None
    shifted_description: str = ""


@dataclass(frozen=True, slots=True)
class EventBundle:
    """A derived event (samples dropped) and its figure and sound files, ready for the pages.

    The figures are drawn once per language of the site (their words are in it) and listed by
    language; a figure that comes out the same in every language (one with no words) is
    published once, and every language lists the first language's file. The sound has no
    words: one for all languages."""

    derived: Derived
    figures: Mapping[
        str, tuple[FigureInfo, ...]
    ]  # by language: figures with words are per language
    audio: Audio
    files: Mapping[str, bytes] = field(default_factory=dict, repr=False)
    figure_seconds: float = 0.0
    key: str = ""  # the build cache's key of this event, set by the cache
    # the event's pages, made where it was drawn: memo key to files (see factsheet.build)
    pages: Mapping[str, Mapping[str, bytes]] = field(default_factory=dict, repr=False)
