"""Derive one event: run the physics over its samples and summarise every quantity.

All quantities are computed sample by sample on the same draws (from the summary intervals or
the samples file), then summarised as a median and the bounds of the catalogue's credible
interval. Which methods produced each quantity is recorded alongside it. Deterministic: the
random seed comes from the event's content.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np
from astropy.cosmology import realizations

from factsheet.derive import caveats as cv
from factsheet.derive.classify import classify, mass_bands, remnant_allowed
from factsheet.derive.lensing import what_if_lensed
from factsheet.derive.remnant import Computed, inspiral_quantities, remnant_quantities
from factsheet.derive.sampling import (
    BODY_SPINS,
    draw_estimate,
    drawn_from_summary,
    fill_missing,
    used_paths,
)
from factsheet.derive.summaries import summarise
from factsheet.derive.windows import comparison_values, methods_used, windows
from factsheet.load.reference import reference_for
from factsheet.model import DETECTOR, SOURCE, Derived, Event, Reference, Settings, Summary
from factsheet.physics import cosmology, inspiral
from factsheet.physics.lensing import METHOD as LENSING


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
        remnant_quantities(s, computed)
    inspiral_quantities(s, settings.low_frequency, settings.arm_length, computed)
    s.update(computed.samples)
    for name, values in computed.samples.items():
        quantities[name] = summarise(
            values, level, computed.frames.get(name), computed.methods[name],
            computed.spreads.get(name),
        )  # fmt: skip
    quantities["lookback_time"] = lookback(quantities["redshift"], settings.cosmology)
    bands, intermediate, band_notes = mass_bands(s, reference)
    lensed, lens_notes = what_if_lensed(event, settings, reference, s, bands)
    z = float(np.median(s["redshift"].value))
    found, no_window, window_notes = windows(
        event, z, c, s.get("kick_velocity"), np.median(s["total_mass"]), reference, level
    )
    medians = {k: np.median(s[k]) for k in ("energy_radiated", "peak_luminosity") if k in s}
    compared = comparison_values(
        medians.get("energy_radiated"), medians.get("peak_luminosity"), reference
    )
    drawn = {k: s[k].value for k in ("heavier_mass", "lighter_mass") if k in s}
    drawn |= {f"{k}_detector": s[f"{k}_detector"].value for k in ("heavier_mass", "lighter_mass")}
    relabel = cv.relabel_caveat(given_summaries(event, level), drawn)
    notes = [
        *cv.input_caveats(event, settings.cosmology, settings.low_significance_rate),
        *([relabel] if relabel else []),
        *([gate_note] if gate_note else []),
        *computed.caveats,
        *band_notes,
        *window_notes,
        *lens_notes,
        *cv.significance_caveats(event, settings.low_significance_rate, settings.large_sky_area),
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
        other_methods=(*methods_used(c, found, compared), *([LENSING] if lensed else [])),
        lensing=lensed,
        samples=s,
    )


def lookback(redshift: Summary, cosmology_name: str) -> Summary:
    """The time since the merger (lookback time) at the redshift's median and bounds: the
    lookback time grows with redshift, so the bounds of one are the bounds of the other."""
    cosmo = getattr(realizations, cosmology_name)
    low, median, high = cosmo.lookback_time([redshift.low, redshift.median, redshift.high])
    return Summary(
        *(float(t.to_value(u.Gyr)) for t in (median, low, high)),
        "Gyr",
        redshift.level,
        methods=redshift.methods,
    )


def input_samples(event: Event, settings: Settings) -> dict[str, np.ndarray]:
    """Samples of the estimate's values by path, in canonical units (solMass, Mpc, one), from
    the samples file when there is one (what it lacks drawn from the summary), else drawn."""
    n, level = settings.samples, settings.credible_level
    # distances are drawn inside the redshift table (the loader refuses intervals beyond it)
    ranges = {"distance": (0.0, cosmology.distance_limit(settings.cosmology).to_value(u.Mpc))}
    if event.samples is None:
        return draw_estimate(event.estimate, n, level, event.seed(), ranges)
    return fill_missing(dict(event.samples.values), event, level, ranges)


def base_samples(event: Event, settings: Settings) -> dict[str, u.Quantity]:
    """The input quantities per sample, source-frame masses, and what follows from them alone."""
    values = input_samples(event, settings)
    size = len(values["heavier.mass"])
    spins = [values.get(path) for path in BODY_SPINS]
    if "effective_spin" in values and all(x is None for x in spins):
        spins = [values["effective_spin"]] * 2
    chi1, chi2 = (np.zeros(size) if x is None else x for x in spins)
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
    return s


#: Units of the input quantities with one (the rest are dimensionless).
BASE_UNITS = {
    "heavier_mass": u.Msun,
    "lighter_mass": u.Msun,
    "heavier_mass_detector": u.Msun,
    "lighter_mass_detector": u.Msun,
    "distance": u.Mpc,
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
    given = used_paths(event)
    skipped = {path.replace(".", "_") for path in BODY_SPINS if path not in given}
    if not given & {*BODY_SPINS, "effective_spin"}:
        skipped.add("effective_spin")
    found = {
        name: summarise(s[name], level, frame, methods.get(name, ()))
        for name, frame in BASE_FRAMES.items()
        if name not in skipped
    }
    return found | given_summaries(event, level)


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
