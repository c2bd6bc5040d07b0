"""Derive one event: run the physics over its samples and summarise every quantity.

All quantities are computed sample by sample on the same draws (from the summary intervals or
the samples file), then summarised as a median and the bounds of the catalogue's credible
interval. Which methods produced each quantity is recorded alongside it. Deterministic: the
random seed comes from the event's content.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet.derive import caveats as cv
from factsheet.derive.classify import classify, mass_bands, remnant_allowed
from factsheet.derive.lensing import what_if_lensed
from factsheet.derive.masses import through_chirp_mass
from factsheet.derive.remnant import Computed, inspiral_quantities, remnant_quantities
from factsheet.derive.sampling import (
    ALIGNED_FORMS,
    SPIN_VECTORS,
    draw_estimate,
    drawn_from_summary,
    fill_missing,
    used_paths,
)
from factsheet.derive.second_generation import second_generation
from factsheet.derive.sky import candidate_readings, sky_caveats, sky_map
from factsheet.derive.spins import SpinSamples, spin_samples
from factsheet.derive.summaries import summarise
from factsheet.derive.windows import comparison_values, methods_used, windows
from factsheet.load.reference import reference_for
from factsheet.model import DETECTOR, SOURCE, Derived, Event, Reference, Settings, Summary
from factsheet.physics import cosmology, inspiral, precession
from factsheet.physics.lensing import METHOD as LENSING
from factsheet.physics.second_generation import METHOD as second_generation_method


def derive_event(event: Event, settings: Settings, reference: Reference | None = None) -> Derived:
    """Derive every quantity of one event from its estimate and the catalogue settings."""
    reference = reference or reference_for(settings)
    level = settings.credible_level
    s = base_samples(event, settings)
    quantities = _summarise_base(event, s, level)
    c = classify(s, reference, settings.neutron_star_radius)
    computed = Computed()
    allowed, gate_note = remnant_allowed(c)
    if allowed:
        remnant_quantities(s, computed, has_host=event.host is not None)
    inspiral_quantities(s, settings.low_frequency, settings.arm_length, computed)
    s.update(computed.samples)
    for name, values in computed.samples.items():
        quantities[name] = summarise(
            values, level, computed.frames.get(name), computed.methods[name],
            computed.spreads.get(name),
        )  # fmt: skip
    quantities["lookback_time"] = lookback(quantities["redshift"], settings.cosmology)
    bands, intermediate, band_notes = mass_bands(s, reference)
    earlier = second_generation(
        s, bands, reference, level, event.seed(), spins_given=_spins_given(event)
    )
    lensed, lens_notes = what_if_lensed(event, settings, reference, s, bands)
    z = float(np.median(s["redshift"].value))
    found, no_window, window_notes = windows(
        event, z, c, s.get("kick_velocity"), np.median(s["total_mass"]), reference, level
    )
    mapped, at_candidates = sky_map(event, level)
    readings = candidate_readings(event, s["redshift"].value, found, at_candidates, level)
    medians = {k: np.median(s[k]) for k in ("energy_radiated", "peak_luminosity") if k in s}
    compared = comparison_values(
        medians.get("energy_radiated"), medians.get("peak_luminosity"), reference
    )
    drawn = {k: s[k].value for k in ("heavier_mass", "lighter_mass") if k in s}
    drawn |= {f"{k}_detector": s[f"{k}_detector"].value for k in ("heavier_mass", "lighter_mass")}
    relabel = cv.relabel_caveat(given_summaries(event, level), drawn) if relabelled(event) else None
    notes = [
        *cv.input_caveats(event, settings.cosmology, settings.low_significance_rate),
        *([relabel] if relabel else []),
        *filter(None, [cv.limit_caveat(event, level, draw_ranges(settings))]),
        *([gate_note] if gate_note else []),
        *computed.caveats,
        *band_notes,
        *window_notes,
        *lens_notes,
        *sky_caveats(event, mapped),
        *cv.significance_caveats(
            event,
            settings.low_significance_rate,
            settings.large_sky_area,
            None if mapped is None else mapped.area_90,
        ),
    ]
    return Derived(
        event=event,
        settings=settings,
        reference=reference,
        quantities=quantities,
        caveats=tuple(notes),
        source_class=c.source_class,
        class_probabilities=c.probabilities,
        mass_bands=bands,
        intermediate_mass=intermediate,
        disruption_probability=c.disruption_probability,
        windows=found,
        no_window_reason=no_window,
        comparisons=compared,
        other_methods=(
            *methods_used(c, found, compared),
            *([LENSING] if lensed else []),
            *([second_generation_method] if earlier else []),
        ),
        second_generation=earlier,
        lensing=lensed,
        sky_map=mapped,
        candidates=readings,
        samples=s,
    )


def relabelled(event: Event) -> bool:
    """Whether the masses were drawn one by one and relabelled heavier-first (not through the
    chirp mass, whose draws are heavier-first by construction, nor read from a samples file)."""
    return event.samples is None and not through_chirp_mass(event.estimate)


def lookback(redshift: Summary, cosmology_name: str) -> Summary:
    """The time since the merger (lookback time) at the redshift's median and bounds: the
    lookback time grows with redshift, so the bounds of one are the bounds of the other."""
    from astropy.cosmology import realizations  # loads scipy: only when deriving

    cosmo = getattr(realizations, cosmology_name)
    low, median, high = cosmo.lookback_time([redshift.low, redshift.median, redshift.high])
    return Summary(
        *(float(t.to_value(u.Gyr)) for t in (median, low, high)),
        "Gyr",
        redshift.level,
        methods=redshift.methods,
    )


def _spins_given(event: Event) -> frozenset[str]:
    """The bodies whose spin the input gives (in the estimate or the samples file)."""
    given = used_paths(event)
    return frozenset(body for body in ("heavier", "lighter") if f"{body}.spin" in given)


def input_samples(event: Event, settings: Settings) -> dict[str, np.ndarray]:
    """Samples of the estimate's values by path, in canonical units (solMass, Mpc, one), from
    the samples file when there is one (what it lacks drawn from the summary), else drawn."""
    n, level = settings.samples, settings.credible_level
    ranges = draw_ranges(settings)
    if event.samples is None:
        return draw_estimate(event.estimate, n, level, event.seed(), ranges)
    return fill_missing(dict(event.samples.values), event, level, ranges)


def draw_ranges(settings: Settings) -> dict[str, tuple[float, float]]:
    """Where draws are cut off beyond the physical limits: distances inside the redshift table
    (the loader refuses intervals beyond it)."""
    return {"distance": (0.0, cosmology.distance_limit(settings.cosmology).to_value(u.Mpc))}


def base_samples(event: Event, settings: Settings) -> dict[str, u.Quantity]:
    """The input quantities per sample, source-frame masses, and what follows from them alone."""
    values = input_samples(event, settings)
    size = len(values["heavier.mass"])
    spins = spin_samples(values, size, event.seed())
    chi1, chi2 = spins.aligned
    distance = values["distance"] * u.Mpc
    z = values.get("redshift")
    if z is None:
        z = cosmology.redshift_at_distance(distance, settings.cosmology)
    given = [values[f"{body}.mass"] * u.Msun for body in ("heavier", "lighter")]
    if event.frame == DETECTOR:
        given = [cosmology.to_source_frame(m, z) for m in given]
    m1, m2 = given
    s = {
        "heavier_mass": m1,
        "lighter_mass": m2,
        "heavier_spin": chi1 * u.one,
        "lighter_spin": chi2 * u.one,
        "distance": distance,
        "redshift": np.asarray(z) * u.one,
        "total_mass": m1 + m2,
        "chirp_mass": inspiral.chirp_mass(m1, m2),
        "mass_ratio": inspiral.mass_ratio(m1, m2) * u.one,
        "effective_spin": inspiral.effective_spin(m1, m2, chi1, chi2) * u.one,
    }
    for name in ("heavier_mass", "lighter_mass", "total_mass", "chirp_mass"):
        s[f"{name}_detector"] = cosmology.to_detector_frame(s[name], z)
    s.update(spin_vector_samples(values, spins, m1, m2))
    return s


def spin_vector_samples(
    values: dict[str, np.ndarray], spins: SpinSamples, m1: u.Quantity, m2: u.Quantity
) -> dict[str, u.Quantity]:
    """The given spin magnitudes and tilts, the in-plane spins and their angles, the precession
    spin, and the in-plane spins drawn from their prior range (keys of the remnant stage)."""
    s = {
        f"{path.replace('.', '_')}": values[path] * (u.deg if path.endswith("tilt") else u.one)
        for path in SPIN_VECTORS
        if path in values
    }
    s["spin_azimuth_difference"] = spins.azimuth_difference * u.rad
    s["merger_phase"] = spins.phase * u.rad
    s["prior_heavier_spin_in_plane"], s["prior_lighter_spin_in_plane"] = (
        x * u.one for x in spins.prior_in_plane
    )
    if spins.in_plane is not None:
        s["heavier_spin_in_plane"], s["lighter_spin_in_plane"] = (x * u.one for x in spins.in_plane)
        s["precession_spin"] = precession.precession_spin(m1, m2, *spins.in_plane) * u.one
    if spins.capped is not None:
        s["precession_spin_capped"] = spins.capped * u.one
    return s


#: Units of the input quantities with one (the rest are dimensionless).
BASE_UNITS = {
    "heavier_mass": u.Msun,
    "lighter_mass": u.Msun,
    "heavier_mass_detector": u.Msun,
    "lighter_mass_detector": u.Msun,
    "distance": u.Mpc,
    "heavier_tilt": u.deg,
    "lighter_tilt": u.deg,
    "chirp_mass": u.Msun,
    "chirp_mass_detector": u.Msun,
}

#: The input quantities a sheet summarises, with their frames.
BASE_FRAMES = {
    "heavier_mass": SOURCE,
    "lighter_mass": SOURCE,
    "total_mass": SOURCE,
    "chirp_mass": SOURCE,
    "mass_ratio": None,
    "effective_spin": None,
    "heavier_spin": None,
    "lighter_spin": None,
    "heavier_spin_magnitude": None,
    "heavier_tilt": None,
    "lighter_spin_magnitude": None,
    "lighter_tilt": None,
    "precession_spin": None,
    "distance": None,
    "redshift": None,
    "heavier_mass_detector": DETECTOR,
    "lighter_mass_detector": DETECTOR,
    "total_mass_detector": DETECTOR,
    "chirp_mass_detector": DETECTOR,
}


def _summarise_base(event: Event, s: dict[str, u.Quantity], level: float) -> dict[str, Summary]:
    """Summaries of the input quantities; spins only where some were given (in the estimate or
    the samples file), since an assumed spin is not a measurement."""
    methods = {
        "chirp_mass": (inspiral.CHIRP_METHOD,),
        "chirp_mass_detector": (inspiral.CHIRP_METHOD,),
        "redshift": () if event.estimate.redshift is not None else (cosmology.METHOD,),
    }
    if "precession_spin" not in used_paths(event):
        methods["precession_spin"] = (precession.METHOD,)
    skipped = _spins_not_given(used_paths(event))
    found = {
        name: summarise(s[name], level, frame, methods.get(name, ()))
        for name, frame in BASE_FRAMES.items()
        if name not in skipped and name in s
    }
    return found | given_summaries(event, level)


def _spins_not_given(given: set[str]) -> set[str]:
    """Spin quantities a sheet leaves out: a body's aligned spin unless its spin or its spin
    vector was given, the effective spin unless some spin was given."""
    skipped = set()
    for body in ("heavier", "lighter"):
        if not given & {f"{body}.spin", f"{body}.spin_magnitude"}:
            skipped.add(f"{body}_spin")
    if not given & set(ALIGNED_FORMS):
        skipped.add("effective_spin")
    return skipped


def input_name(path: str, frame: str) -> str:
    """The quantity key of an estimate value: ``heavier.mass`` is ``heavier_mass``, or
    ``heavier_mass_detector`` when the masses were given in the detector frame."""
    name = path.replace(".", "_")
    return name + "_detector" if name.endswith("_mass") and frame == DETECTOR else name


def measured_names(event: Event) -> dict[str, str]:
    """The quantities an event's input gives, each with how: ``given`` (a summary in the
    estimate), ``fixed`` (an exact value there: fixed in the analysis, so assumed, not
    measured) or ``samples`` (a column of the samples file)."""
    given = event.estimate.values()
    from_file = set(event.samples.values) if event.samples is not None else set()
    drawn = set(given) if event.samples is None else set(drawn_from_summary(event))
    found = {input_name(path, event.frame): "samples" for path in from_file}
    for path in drawn & set(given):
        found[input_name(path, event.frame)] = "fixed" if given[path].exact else "given"
    return found


def given_summaries(event: Event, level: float) -> dict[str, Summary]:
    """The values the estimate gives as summaries, as given: the sheet shows what the editors
    wrote (``88 +17 -14``), not the same interval re-summarised from the draws (``88 +17 -13``).
    Values that come from a samples file are summarised from its samples instead."""
    given = event.estimate.values()
    drawn = set(given) if event.samples is None else set(drawn_from_summary(event))
    found = {}
    for path in sorted(drawn & set(given)):
        name = input_name(path, event.frame)
        value = given[path].to(BASE_UNITS.get(name, u.one))
        found[name] = Summary(
            value.median, value.low, value.high, value.unit.to_string(), level, BASE_FRAMES[name]
        )
    return found
