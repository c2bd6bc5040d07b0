"""Remnant, radiation, ringdown and inspiral quantities on an event's samples.

Where two published fits exist for a quantity (remnant spin; radiated energy) each sample gets
their mean, and half the difference between the fits (median over samples) is kept as the
``fit_spread``: a systematic reported apart from the statistical interval.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import astropy.constants as const
import astropy.units as u
import numpy as np

from factsheet import labels
from factsheet.derive import spin_effects
from factsheet.derive.caveats import general, listed, share
from factsheet.i18n import Later, Text, gettext
from factsheet.model import DETECTOR, SOURCE, Caveat
from factsheet.physics import inspiral, luminosity, remnant, ringdown
from factsheet.physics.registry import METHODS, fraction_outside


@dataclass
class Computed:
    """Per-sample results with the methods behind each and the fit spreads."""

    samples: dict[str, u.Quantity] = field(default_factory=dict)
    methods: dict[str, tuple[str, ...]] = field(default_factory=dict)
    spreads: dict[str, u.Quantity] = field(default_factory=dict)
    frames: dict[str, str] = field(default_factory=dict)
    caveats: list[Caveat] = field(default_factory=list)

    def put(
        self,
        name: str,
        values: u.Quantity,
        methods: tuple[str, ...],
        frame: str | None,
        spread: u.Quantity | None = None,
    ) -> None:
        self.samples[name] = values
        self.methods[name] = methods
        if frame:
            self.frames[name] = frame
        if spread is not None:
            self.spreads[name] = spread


def _mean_and_spread(results: list[np.ndarray]) -> tuple[np.ndarray, float]:
    stack = np.vstack(results)
    return stack.mean(axis=0), float(np.median((stack.max(axis=0) - stack.min(axis=0)) / 2))


def remnant_quantities(s: dict[str, u.Quantity], out: Computed, has_host: bool = False) -> None:
    """Remnant spin and mass, energy radiated, peak luminosity, kick and ringdown (BH fits);
    ``has_host``: the event's counterpart windows include the disk flares the kick sets."""
    m1, m2 = s["heavier_mass"], s["lighter_mass"]
    c1, c2 = s["heavier_spin"].value, s["lighter_spin"].value
    spin = _put(out, "remnant_spin", spin_effects.remnant_spin(s))
    erad, erad_spread = _mean_and_spread(
        [
            remnant.radiated_fraction_jf17(m1, m2, c1, c2),
            remnant.radiated_fraction_bmr12(m1, m2, c1, c2),
        ]
    )
    total = s["total_mass"]
    radiated = (erad * total).to(u.Msun)
    out.put(
        "radiated_mass",
        radiated,
        remnant.RADIATED_METHODS,
        SOURCE,
        erad_spread * np.median(total),
    )
    out.put(
        "remnant_mass",
        total - radiated,
        remnant.RADIATED_METHODS,
        SOURCE,
        erad_spread * np.median(total),
    )
    out.put(
        "energy_radiated",
        (radiated * const.c**2).to(u.J),
        remnant.RADIATED_METHODS,
        None,
        (erad_spread * np.median(total) * const.c**2).to(u.J),
    )
    out.put(
        "peak_luminosity",
        luminosity.peak_luminosity_keitel17(m1, m2, c1, c2).to(u.W),
        (luminosity.METHOD,),
        None,
    )
    _put(out, "kick_velocity", spin_effects.kick(s, has_host))
    if "heavier_spin_in_plane" in s:
        out.caveats.append(spin_effects.aligned_fits_caveat())
    remnant_detector = (total - radiated) * (1 + s["redshift"].value)
    f_ring, tau_ring = ringdown.qnm_220(remnant_detector, spin)  # signed: picks the branch
    out.put("ringdown_frequency", f_ring.to(u.Hz), (ringdown.METHOD,), DETECTOR)
    out.put("ringdown_damping_time", tau_ring.to(u.s), (ringdown.METHOD,), DETECTOR)
    _counter_rotating_caveat(spin, out)
    _calibration_caveats(s, spin, out)


def _put(out: Computed, name: str, found: spin_effects.Found) -> np.ndarray:
    """Record one quantity found with its methods, spread and caveats; return its values."""
    out.put(name, found.values, found.methods, None, found.spread)
    out.caveats.extend(found.caveats)
    return found.values.value


def inspiral_quantities(
    s: dict[str, u.Quantity], low_frequency: u.Quantity, arm_length: u.Quantity, out: Computed
) -> None:
    """ISCO frequency, time and cycles in band, strain and arm-length change (leading order)."""
    mc_det = s["chirp_mass_detector"]
    f_isco = inspiral.isco_frequency(s["total_mass_detector"]).to(u.Hz)
    order = (inspiral.LEADING_ORDER_METHOD,)
    out.put("isco_frequency", f_isco, order, DETECTOR)
    out.put("time_in_band", inspiral.time_to_merger(mc_det, low_frequency).to(u.s), order, DETECTOR)
    cycles = inspiral.cycles_between(mc_det, low_frequency, np.maximum(f_isco, low_frequency))
    out.put("cycles_in_band", np.asarray(cycles) * u.one, order, None)
    strain = inspiral.strain_amplitude(mc_det, f_isco, s["distance"])
    out.put("strain_amplitude", u.Quantity(strain, u.one), order, None)
    out.put(
        "arm_length_change", inspiral.arm_length_change(strain, arm_length).to(u.m), order, None
    )
    if np.median(f_isco) < low_frequency:
        out.caveats.append(
            Caveat(
                "inspiral-below-band",
                "notice",
                Text(
                    "The inspiral ends (at the ISCO frequency, observed) below the band edge of "
                    "{frequency} Hz: what the detectors saw is mostly the merger and ringdown, and "
                    "the time and cycles in band are lower limits of little meaning.",
                    frequency=Later(general, float(low_frequency.to_value(u.Hz))),
                ),
                concerns=("isco_frequency", "time_in_band", "cycles_in_band"),
            )
        )


#: Share of samples outside a fit's calibration below which no caveat is shown: a few per cent
#: of extrapolated samples barely move a median or a 90 % bound (common practice, not a rule).
MATTERS = 0.05


def _counter_rotating_caveat(spin: np.ndarray, out: Computed) -> None:
    """Say when many samples have the remnant spin against the orbit (docs/methods.md §7.3)."""
    against = float(np.mean(spin < 0)) if np.size(spin) else 0.0
    if against < MATTERS:
        return
    out.caveats.append(
        Caveat(
            "counter-rotating-ringdown",
            "notice",
            Text(
                "The remnant spins against the orbit in {share} of the samples. For those the "
                "ringdown given is the counter-rotating mode of the black hole, the one expected "
                "to dominate then: lower in frequency and slightly faster damped than the "
                "co-rotating mode of a hole of the same spin turning with the orbit.",
                share=Later(share, against),
            ),
            concerns=("remnant_spin", "ringdown_frequency", "ringdown_damping_time"),
        )
    )


def _calibration_caveats(s: dict[str, u.Quantity], spin: np.ndarray, out: Computed) -> None:
    values = {
        "mass_ratio": s["mass_ratio"].value,
        "heavier_spin": s["heavier_spin"].value,
        "lighter_spin": s["lighter_spin"].value,
        "remnant_spin": np.abs(spin),
    }
    used = {m for methods in out.methods.values() for m in methods}
    for method_id in sorted(used):
        outside = fraction_outside(method_id, **values)
        worst = max(outside.values(), default=0.0)
        if worst < MATTERS:
            continue
        names = tuple(labels.parameter(name) for name in sorted(outside))
        concerns = tuple(k for k, methods in out.methods.items() if method_id in methods)
        out.caveats.append(
            Caveat(
                "fit-outside-calibration",
                "warning" if worst > 0.5 else "notice",
                Text(
                    "{fit}: {share} of the samples lie outside the range the fit was calibrated "
                    "on ({parameters}); its numbers there are extrapolated.",
                    fit=Later(gettext, METHODS[method_id].title),  # the methods page's words
                    share=Later(share, worst),
                    parameters=Later(listed, names),
                ),
                concerns=concerns,
            )
        )
