"""Derive stage: run the physics over one event's samples and summarise.

All quantities are computed sample by sample on the same draws (from the summary intervals or
the samples file), then summarised as a median and the bounds of the catalogue's credible
interval. Which methods produced each quantity is recorded alongside it. Deterministic: the
random seed comes from the event's content.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import astropy.units as u
import numpy as np
from astropy.cosmology import realizations

from factsheet import caveats as cv
from factsheet import derive_context as ctx
from factsheet.derive_remnant import Computed, inspiral_quantities, remnant_quantities
from factsheet.model import Event, Settings
from factsheet.physics import cosmology, inspiral
from factsheet.reference import Reference, load_reference
from factsheet.samples import LIMITS, draw, draw_parameters, read_samples_csv

SOURCE = "source"
DETECTOR = "detector"


@dataclass(frozen=True)
class Summary:
    """Median and credible bounds of one quantity, with the methods behind it."""

    median: float
    low: float
    high: float
    unit: str
    frame: str | None = None
    fit_spread: float | None = None
    methods: tuple[str, ...] = ()

    def as_dict(self) -> dict:
        data = {"median": self.median, "low": self.low, "high": self.high, "unit": self.unit}
        if self.frame:
            data["frame"] = self.frame
        if self.fit_spread is not None:
            data["fit_spread"] = self.fit_spread
        data["methods"] = list(self.methods)
        return data


@dataclass
class Derived:
    """Everything derived for one event: samples, summaries, methods and caveats."""

    event: Event
    settings: Settings
    samples: dict[str, u.Quantity] = field(default_factory=dict)
    quantities: dict[str, Summary] = field(default_factory=dict)
    caveats: list[cv.Caveat] = field(default_factory=list)
    source_class: str = ""
    class_probabilities: dict[str, float] = field(default_factory=dict)
    disruption_probability: float | None = None
    mass_bands: dict[str, dict[str, float]] = field(default_factory=dict)
    windows: list = field(default_factory=list)
    no_window_reason: str = ""
    comparisons: dict = field(default_factory=dict)
    reference: Reference | None = None
    lookback_time: u.Quantity | None = None  # at the median redshift, for the prose
    other_methods: tuple[str, ...] = ()  # methods behind the class, bands, windows, comparisons

    @property
    def credible_level(self) -> float:
        return self.settings.credible_level

    def summary(self, name: str) -> Summary:
        """The summary of one quantity (KeyError if this event has none)."""
        return self.quantities[name]


def summarise(
    values: u.Quantity,
    level: float,
    frame: str | None = None,
    methods: tuple[str, ...] = (),
    fit_spread: u.Quantity | None = None,
) -> Summary:
    """Median and the equal-tailed credible interval of ``values`` at ``level``."""
    q = u.Quantity(values)
    low, med, high = np.percentile(q.value, [50 * (1 - level), 50, 50 * (1 + level)])
    spread = None if fit_spread is None else float(u.Quantity(fit_spread).to_value(q.unit))
    return Summary(float(med), float(low), float(high), q.unit.to_string(), frame, spread, methods)


def base_samples(event: Event, settings: Settings) -> dict[str, np.ndarray]:
    """Samples of the input parameters in canonical units (solMass, Mpc, dimensionless)."""
    n, level = settings.samples, settings.credible_level
    if event.samples is None:
        values = draw_parameters(event.parameters, n, level, event.seed())
    else:
        values = read_samples_csv(event.samples, settings.limits.max_sample_rows)
        rng = np.random.default_rng(event.seed())
        size = len(values["mass_1"])
        for name in ("spin_1z", "spin_2z", "chi_eff", "redshift"):
            if name not in values and name in event.parameters:
                values[name] = draw(event.parameters[name], size, level, LIMITS[name], rng)
    return _aligned_spins(values)


def _aligned_spins(values: dict[str, np.ndarray]) -> dict[str, np.ndarray]:
    size = len(values["mass_1"])
    if "chi_eff" in values and "spin_1z" not in values and "spin_2z" not in values:
        values["spin_1z"] = values["spin_2z"] = values["chi_eff"]
    values.setdefault("spin_1z", np.zeros(size))
    values.setdefault("spin_2z", np.zeros(size))
    return values


_REFERENCES: dict[str, Reference] = {}


def reference_for(settings: Settings) -> Reference:
    """The packaged reference data with the catalogue's overrides (read once per overrides)."""
    overrides = {"mass_bands": settings.mass_bands, "comparisons": settings.comparisons}
    key = repr(overrides)
    if key not in _REFERENCES:
        _REFERENCES[key] = load_reference(overrides)
    return _REFERENCES[key]


def derive_event(event: Event, settings: Settings, reference: Reference | None = None) -> Derived:
    """Derive every quantity of one event from its estimate and the catalogue settings."""
    result = Derived(event, settings, reference=reference or reference_for(settings))
    _derive_base(result)
    _derive_physics(result)
    return result


def _derive_base(result: Derived) -> None:
    event, settings = result.event, result.settings
    values = base_samples(event, settings)
    distance = values["luminosity_distance"] * u.Mpc
    if "redshift" in values:
        z = values["redshift"]
    else:
        z = cosmology.redshift_at_distance(distance, settings.cosmology)
    given = {k: values[k] * u.Msun for k in ("mass_1", "mass_2")}
    if event.frame == DETECTOR:
        src = {k: cosmology.to_source_frame(m, z) for k, m in given.items()}
    else:
        src = given
    m1, m2 = src["mass_1"], src["mass_2"]
    s = result.samples
    s.update(
        mass_1=m1,
        mass_2=m2,
        spin_1z=values["spin_1z"] * u.one,
        spin_2z=values["spin_2z"] * u.one,
        luminosity_distance=distance,
        redshift=np.asarray(z) * u.one,
    )
    s["total_mass"] = m1 + m2
    s["chirp_mass"] = inspiral.chirp_mass(m1, m2)
    s["mass_ratio"] = inspiral.mass_ratio(m1, m2) * u.one
    s["chi_eff"] = inspiral.effective_spin(m1, m2, values["spin_1z"], values["spin_2z"]) * u.one
    for name in ("mass_1", "mass_2", "total_mass", "chirp_mass"):
        s[f"{name}_detector"] = cosmology.to_detector_frame(s[name], z)
    _summarise_base(result)
    result.caveats.extend(cv.input_caveats(event, settings.cosmology))


def _derive_physics(result: Derived) -> None:
    s, ref, settings = result.samples, result.reference, result.settings
    level = settings.credible_level
    c = ctx.classify(s, ref, settings.neutron_star_radius)
    result.source_class, result.class_probabilities = c.source_class, c.probabilities
    result.disruption_probability = c.disruption_probability
    computed = Computed()
    allowed, note = ctx.remnant_allowed(c)
    if allowed:
        remnant_quantities(s, computed)
    inspiral_quantities(s, settings.low_frequency, settings.arm_length, computed)
    s.update(computed.samples)
    for name, values in computed.samples.items():
        result.quantities[name] = summarise(
            values,
            level,
            computed.frames.get(name),
            computed.methods[name],
            computed.spreads.get(name),
        )
    result.mass_bands, band_notes = ctx.mass_bands(s, ref)
    z = float(np.median(s["redshift"].value))
    result.lookback_time = getattr(realizations, settings.cosmology).lookback_time(z).to(u.Gyr)
    total = float(np.median(s["total_mass"].to_value(u.Msun)))
    result.windows, result.no_window_reason, window_notes = ctx.windows(
        result.event, z, c, s.get("kick_velocity"), total, ref, level
    )
    medians = {k: np.median(s[k]) for k in ("radiated_energy", "peak_luminosity") if k in s}
    result.comparisons = ctx.comparison_values(
        medians.get("radiated_energy"), medians.get("peak_luminosity"), ref, settings.energy_units
    )
    result.other_methods = ctx.methods_used(c, result.windows, result.comparisons)
    result.caveats.extend(
        [
            *([note] if note else []),
            *computed.caveats,
            *band_notes,
            *window_notes,
            *ctx.significance_caveats(
                result.event, settings.low_significance_rate, settings.large_sky_area
            ),
        ]
    )


BASE_FRAMES = {
    "mass_1": SOURCE,
    "mass_2": SOURCE,
    "total_mass": SOURCE,
    "chirp_mass": SOURCE,
    "mass_ratio": None,
    "chi_eff": None,
    "spin_1z": None,
    "spin_2z": None,
    "luminosity_distance": None,
    "redshift": None,
    "mass_1_detector": DETECTOR,
    "mass_2_detector": DETECTOR,
    "total_mass_detector": DETECTOR,
    "chirp_mass_detector": DETECTOR,
}


def _summarise_base(result: Derived) -> None:
    level = result.credible_level
    methods = {
        "chirp_mass": (inspiral.CHIRP_METHOD,),
        "redshift": () if "redshift" in result.event.parameters else (cosmology.METHOD,),
    }
    for name, frame in BASE_FRAMES.items():
        result.quantities[name] = summarise(
            result.samples[name], level, frame, methods.get(name, ())
        )
