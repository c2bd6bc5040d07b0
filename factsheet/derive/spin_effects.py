"""What the bodies' spins do to the remnant: its spin and its kick, with or without in-plane spin.

With in-plane spins (tilts or a precession spin), the remnant spin comes from the generic form
of Hofmann, Barausse & Rezzolla 2016 alone (its RMS for precessing binaries is the spread shown)
and the kick gains the out-of-plane term of Lousto et al. 2012, the unknown angles drawn per
sample. With aligned spins only, the two aligned fits are averaged as before, and the same
formulas, fed in-plane spins drawn from their prior range, say how far unknown in-plane spin
could move the numbers: the remnant spin's systematic, and the kick's reach above its interval.
"""

from __future__ import annotations

from typing import NamedTuple

import astropy.units as u
import numpy as np

from factsheet import labels
from factsheet.derive.caveats import general, share
from factsheet.i18n import SOURCE, Later, Text, current, localize_number
from factsheet.model import Caveat
from factsheet.physics import kick as kick_fits
from factsheet.physics import remnant


class Found(NamedTuple):
    """One quantity per sample, the methods behind it, its systematic spread and caveats."""

    values: u.Quantity
    methods: tuple[str, ...]
    spread: u.Quantity | None
    caveats: list[Caveat]


def _vectors(s: dict[str, u.Quantity], prior: bool = False):
    m1, m2 = s["heavier_mass"], s["lighter_mass"]
    c1, c2 = s["heavier_spin"].value, s["lighter_spin"].value
    key = "prior_{}_spin_in_plane" if prior else "{}_spin_in_plane"
    p1, p2 = (s[key.format(body)].value for body in ("heavier", "lighter"))
    return m1, m2, c1, c2, p1, p2, s["spin_azimuth_difference"].value


def remnant_spin(s: dict[str, u.Quantity]) -> Found:
    """The signed remnant spin (negative: against the orbit) and its systematic."""
    if "heavier_spin_in_plane" in s:
        spin = remnant.remnant_spin_hbr16_generic(*_vectors(s))
        spread = remnant.HBR16_GENERIC_RMS * u.one
        return Found(spin * u.one, remnant.PRECESSING_SPIN_METHODS, spread, [_angles_caveat(s)])
    m1, m2 = s["heavier_mass"], s["lighter_mass"]
    c1, c2 = s["heavier_spin"].value, s["lighter_spin"].value
    aligned = remnant.remnant_spin_hbr16(m1, m2, c1, c2)
    stack = np.vstack([remnant.remnant_spin_jf17(m1, m2, c1, c2), aligned])
    spin = stack.mean(axis=0)
    between = float(np.median(np.ptp(stack, axis=0) / 2))
    shift = np.abs(remnant.remnant_spin_hbr16_generic(*_vectors(s, prior=True))) - np.abs(aligned)
    typical, reach = (float(x) for x in np.quantile(shift, [0.5, 0.95]))
    spread = max(between, typical) * u.one
    return Found(
        spin * u.one, remnant.REMNANT_SPIN_METHODS, spread, [_in_plane_caveat(typical, reach)]
    )


def _in_plane_caveat(typical: float, reach: float) -> Caveat:
    return Caveat(
        "remnant-spin-in-plane-unknown",
        "notice",
        Text(
            "The spins are known only along the orbit. Spin in the orbital plane would raise "
            "the {quantity}: by about {typical} (up to {reach}) with in-plane spins drawn up to "
            "the largest the aligned spins allow. Its systematic spread is this shift where it "
            "is larger than the difference between the fits, which assume no in-plane spin.",
            quantity=labels.QUANTITIES["remnant_spin"].in_prose,
            typical=Later(general, float(typical), ".2g"),
            reach=Later(general, float(reach), ".2g"),
        ),
        concerns=("remnant_spin",),
    )


def _angles_caveat(s: dict[str, u.Quantity]) -> Caveat:
    accuracy = Later(general, float(remnant.HBR16_GENERIC_RMS))
    capped = (
        float(np.mean(s["precession_spin_capped"].value)) if "precession_spin_capped" in s else None
    )
    if capped is None:
        text = Text(
            "The directions of the spins within the orbital plane are not in any summary: the "
            "angle between them and their phase at merger were drawn uniformly for each sample "
            "(common practice). The remnant spin comes from the one fit made for such spins; its "
            "systematic spread is that fit's stated accuracy, {accuracy}.",
            accuracy=accuracy,
        )
    elif capped > 0:
        text = Text(
            "The directions of the spins within the orbital plane are not in any summary: the "
            "angle between them and their phase at merger were drawn uniformly for each sample "
            "(common practice). The remnant spin comes from the one fit made for such spins; its "
            "systematic spread is that fit's stated accuracy, {accuracy}. The precession spin "
            "was put on the heavier body, the single-spin case it stands for. In {share} of the "
            "samples it asked for more in-plane spin than the heavier body's aligned spin leaves "
            "room for, and was lowered to fit.",
            accuracy=accuracy,
            share=Later(share, capped),
        )
    else:
        text = Text(
            "The directions of the spins within the orbital plane are not in any summary: the "
            "angle between them and their phase at merger were drawn uniformly for each sample "
            "(common practice). The remnant spin comes from the one fit made for such spins; its "
            "systematic spread is that fit's stated accuracy, {accuracy}. The precession spin "
            "was put on the heavier body, the single-spin case it stands for.",
            accuracy=accuracy,
        )
    return Caveat(
        "in-plane-spin-angles", "notice", text, concerns=("remnant_spin", "kick_velocity")
    )


def aligned_fits_caveat() -> Caveat:
    """With in-plane spins: the energy, mass and luminosity fits take the aligned components."""
    return Caveat(
        "in-plane-spin-ignored",
        "info",
        Text(
            "The fits for the energy radiated, the remnant mass and the peak luminosity are for "
            "spins along the orbit: they were given the aligned parts of the spins, and the spin "
            "in the orbital plane is left out of them (common practice)."
        ),
        concerns=("remnant_mass", "radiated_mass", "energy_radiated", "peak_luminosity"),
    )


def kick(s: dict[str, u.Quantity], has_host: bool) -> Found:
    """The recoil kick: with the out-of-plane term when in-plane spins are known; otherwise
    the aligned-spin kick with a caveat on how much more in-plane spin could give."""
    m1, m2 = s["heavier_mass"], s["lighter_mass"]
    c1, c2 = s["heavier_spin"].value, s["lighter_spin"].value
    phase = s["merger_phase"].value
    if "heavier_spin_in_plane" in s:
        v = kick_fits.kick_velocity_precessing(*_vectors(s), phase).to(u.km / u.s)
        return Found(v, (kick_fits.METHOD, kick_fits.SUPERKICK_METHOD), None, [])
    v = kick_fits.kick_velocity(m1, m2, c1, c2).to(u.km / u.s)
    prior = kick_fits.kick_velocity_precessing(*_vectors(s, prior=True), phase)
    reach = float(np.quantile(prior.to_value(u.km / u.s), 0.95))
    return Found(v, (kick_fits.METHOD,), None, [_kick_caveat(v, reach, has_host)])


def two_figures(x: float) -> str:
    """A positive number to two significant figures, written out (2100, 85, 0.31), in the
    reader's digits."""
    text = f"{float(f'{x:.2g}'):g}"
    return text if current() == SOURCE or "e" in text else localize_number(text)


def _kick_caveat(v: u.Quantity, reach: float, has_host: bool) -> Caveat:
    if has_host:
        text = Text(
            "The recoil kick counts only the spins along the orbit: spin in the orbital plane, "
            "which the input does not give, could make it much larger (up to about {reach} km/s "
            "with in-plane spins drawn up to the largest the aligned spins allow). Read its "
            "interval as a lower bound. The disk-flare counterpart windows assume the kick shown.",
            reach=Later(two_figures, float(reach)),
        )
    else:
        text = Text(
            "The recoil kick counts only the spins along the orbit: spin in the orbital plane, "
            "which the input does not give, could make it much larger (up to about {reach} km/s "
            "with in-plane spins drawn up to the largest the aligned spins allow). Read its "
            "interval as a lower bound.",
            reach=Later(two_figures, float(reach)),
        )
    return Caveat("kick-lower-bound", "notice", text, concerns=("kick_velocity",))
