"""Counterpart windows in UTC from rest-frame time scales (docs/methods.md §13).

A literature time scale is a rest-frame delay; the window in UTC is ``t_merger + (1+z) Δt_src``,
computed with :class:`astropy.time.Time` and :class:`~astropy.time.TimeDelta` so that leap
seconds are handled (beyond the leap-second table no future leap second is assumed). The redshift
is a single value: the caller passes the median, since its spread moves a window by a few per cent
at most while the windows are ranges of a factor of several. For a black-hole pair in the disk
of an active nucleus the delays come from Newtonian orbital dynamics about the central black
hole. Windows are planning aids, not predictions.
"""

import warnings
from dataclasses import dataclass
from typing import Protocol

import astropy.constants as const
import astropy.units as u
import numpy as np
from astropy.time import Time, TimeDelta

from factsheet.physics._checks import dimensionless, require
from factsheet.physics.registry import Method, register

REST_FRAME_WINDOW = "counterpart-window-rest-frame"
AGN_DISK = "agn-disk-kicked-remnant"
#: Keys of the two windows of a kicked remnant in an AGN disk, and their band.
AGN_FLARE, AGN_REPEAT_FLARE, AGN_BAND = "agn_flare", "agn_repeat_flare", "optical_ultraviolet"

#: Why a black-hole pair in vacuum gets no window.
VACUUM_REASON = (
    "Two black holes merging in empty space leave no matter to heat, so no electromagnetic "
    "counterpart is expected and no window is given."
)

register(
    Method(
        id=REST_FRAME_WINDOW,
        title="Counterpart window from a rest-frame time scale",
        citation="cosmological time dilation; the time scales and their sources are listed "
        "under the counterpart time scales",
        formula="t_{UTC} = t_{merger} + (1 + z) Δt_{src} (astropy Time and TimeDelta, leap "
        "seconds handled)",
        validity="a planning aid: the rest-frame ranges are indicative, not predictions",
        quantities=("counterpart_windows",),
    )
)
register(
    Method(
        id=AGN_DISK,
        title="Flare windows of a kicked remnant in the disk of an active galactic nucleus",
        citation=(
            "mechanism: McKernan et al. 2019, Astrophys. J. Lett. 884, L50; time scales: "
            "Newtonian orbit, Hill sphere and disk crossing"
        ),
        arxiv="1907.03746",
        formula=(
            "P = 2π (G M_{smbh}/c³)(a/r_{g})^{3/2}; R_{H} = a [M_{bin}/(3 M_{smbh})]^{1/3}; "
            "t_{H} = R_{H}/v_{kick}; t_{disk} = (H/a) a/(v_{kick} cos θ); "
            "repeat after P/2 (1 ± 3 v_{kick}/v_{orb})"
        ),
        validity="Newtonian orbit (a ≫ r_{g}) about the central black hole; flare onset taken as "
        "the Hill-sphere (or disk) exit time, since the published onset scaling was not checked",
        accuracy="order of magnitude",
        quantities=("counterpart_windows",),
    )
)


class RestFrameSpec(Protocol):
    """What a window needs from the reference data (``factsheet.model.WindowSpec``)."""

    key: str
    band: str
    scenario: str
    start: u.Quantity
    end: u.Quantity
    basis: str


@dataclass(frozen=True)
class Window:
    """A counterpart window in UTC with its basis; ``key`` names it (readers' names are kept
    with the other labels, outside the physics), ``band`` is a band key."""

    key: str
    band: str
    scenario: str
    start: Time
    end: Time
    basis: str


@dataclass(frozen=True)
class RestFrameRange:
    """A rest-frame delay range with the text of its basis."""

    start: u.Quantity
    end: u.Quantity
    basis: str


def _redshift(redshift) -> float:
    """A single redshift as a float; the caller passes the median of the samples."""
    z = float(dimensionless(redshift, "redshift"))
    if not np.isfinite(z) or z < 0:
        raise ValueError(f"redshift: expected a finite number >= 0, got {z}")
    return z


def _speed(value, name: str) -> np.ndarray:
    """A speed in km/s as a float array; the wrong dimension raises UnitsError naming it."""
    if not isinstance(value, u.Quantity) or not value.unit.is_equivalent(u.km / u.s):
        raise u.UnitsError(f"{name}: expected a speed (e.g. 200 km/s), got {value!r}")
    return np.asarray(value.to_value(u.km / u.s), dtype=float)


def observed_delay(delay: u.Quantity, redshift) -> u.Quantity:
    """Observed delay (1+z) Δt_src of a rest-frame delay (cosmological time dilation)."""
    return (1 + _redshift(redshift)) * require(delay, "time", "delay") * u.s


#: The last UTC time a calendar date can be written for (ISO 8601 has four-digit years).
LAST_UTC = "9999-12-31T23:59:59"


class BeyondCalendar(ValueError):
    """A window that ends after the last date a calendar can show (year 9999)."""


def utc_window(t_merger: Time, redshift, start: u.Quantity, end: u.Quantity) -> tuple[Time, Time]:
    """Start and end in UTC of the rest-frame range [start, end] (docs/methods.md §13 rule).

    A window ending after the year 9999 raises :class:`BeyondCalendar`.
    """
    first_delay = observed_delay(start, redshift)
    last_delay = observed_delay(end, redshift)
    if last_delay < first_delay:
        raise ValueError(f"window end {end} is before its start {start}")
    with warnings.catch_warnings():
        warnings.filterwarnings("ignore", message=".*dubious year")
        room = (Time(LAST_UTC, scale="utc") - Time(t_merger, scale="utc")).to(u.s)
    if last_delay > room:
        raise BeyondCalendar(f"the window ends {last_delay.to(u.yr):.3g} after the merger")
    with warnings.catch_warnings():
        # Past the end of the leap-second table ERFA warns of a "dubious year"; no future
        # leap second is assumed there, which is all a planning window needs.
        warnings.filterwarnings("ignore", message=".*dubious year")
        t0 = Time(t_merger, scale="utc")
        return (t0 + TimeDelta(first_delay)).utc, (t0 + TimeDelta(last_delay)).utc


def window_from_spec(t_merger: Time, redshift, spec: RestFrameSpec) -> Window:
    """The UTC window of one rest-frame spec (docs/methods.md §13; time scales as in the spec)."""
    start, end = utc_window(t_merger, redshift, spec.start, spec.end)
    return Window(spec.key, spec.band, spec.scenario, start, end, spec.basis)


def rest_frame_windows(t_merger: Time, redshift, specs) -> list[Window]:
    """UTC windows of every spec, e.g. those of a disrupted neutron star (docs/methods.md §13);
    windows that would end after the year 9999 are left out."""
    found = []
    for spec in specs:
        try:
            found.append(window_from_spec(t_merger, redshift, spec))
        except BeyondCalendar:
            continue
    return found


def vacuum_windows() -> tuple[list[Window], str]:
    """No window for a black-hole pair in vacuum, and the reason to print (docs/methods.md §13)."""
    return [], VACUUM_REASON


def gravitational_radius(smbh_mass: u.Quantity) -> u.Quantity:
    """r_g = G M / c², with G M from the IAU 2015 nominal GM_sun (docs/methods.md §8)."""
    return (const.GM_sun * require(smbh_mass, "mass", "smbh_mass") / const.c**2).to(u.m)


def _orbit(smbh_mass: u.Quantity, orbit_radius_rg) -> u.Quantity:
    """Orbit radius a = (a/r_g) r_g in metres."""
    return gravitational_radius(smbh_mass) * dimensionless(orbit_radius_rg, "orbit_radius_rg")


def orbital_period(smbh_mass: u.Quantity, orbit_radius_rg) -> u.Quantity:
    """Kepler period P = 2π (G M/c³)(a/r_g)^(3/2) about the central black hole (§13)."""
    x = dimensionless(orbit_radius_rg, "orbit_radius_rg")
    return (2 * np.pi * gravitational_radius(smbh_mass) / const.c * x**1.5).to(u.yr)


def orbital_speed(smbh_mass: u.Quantity, orbit_radius_rg) -> u.Quantity:
    """Circular Keplerian speed v = c (a/r_g)^(-1/2) (Newtonian, docs/methods.md §13)."""
    require(smbh_mass, "mass", "smbh_mass")
    return (const.c / np.sqrt(dimensionless(orbit_radius_rg, "orbit_radius_rg"))).to(u.km / u.s)


def hill_radius(smbh_mass: u.Quantity, orbit_radius_rg, binary_mass: u.Quantity) -> u.Quantity:
    """Hill radius R_H = a [M_bin / (3 M_smbh)]^(1/3) of the remnant (docs/methods.md §13)."""
    ratio = require(binary_mass, "mass", "binary_mass") / require(smbh_mass, "mass", "smbh_mass")
    return _orbit(smbh_mass, orbit_radius_rg) * np.cbrt(ratio / 3)


def hill_exit_time(
    smbh_mass: u.Quantity, orbit_radius_rg, binary_mass: u.Quantity, kick_velocity: u.Quantity
) -> u.Quantity:
    """Time t_H ≈ R_H / v_kick for the kicked remnant to leave its Hill sphere (§13)."""
    speed = _speed(kick_velocity, "kick_velocity") * (u.km / u.s)
    return (hill_radius(smbh_mass, orbit_radius_rg, binary_mass) / speed).to(u.d)


def disk_exit_time(
    smbh_mass: u.Quantity,
    orbit_radius_rg,
    aspect_ratio,
    kick_velocity: u.Quantity,
    angle: u.Quantity = 0 * u.deg,
) -> u.Quantity:
    """Time t_disk ≈ (H/a) a / (v_kick cos θ) to leave the disk (docs/methods.md §13)."""
    height = dimensionless(aspect_ratio, "aspect_ratio") * _orbit(smbh_mass, orbit_radius_rg)
    speed = _speed(kick_velocity, "kick_velocity") * (u.km / u.s)
    if not isinstance(angle, u.Quantity) or not angle.unit.is_equivalent(u.rad):
        raise u.UnitsError(f"angle: expected an angle (e.g. 30 deg), got {angle!r}")
    return (height / (speed * np.cos(angle))).to(u.d)


def return_time(smbh_mass: u.Quantity, orbit_radius_rg) -> u.Quantity:
    """Half an orbit, P/2: an inclined orbit crosses the disk plane again (docs/methods.md §13)."""
    return orbital_period(smbh_mass, orbit_radius_rg) / 2


def _kick_range(kick_samples: u.Quantity, credible_level: float) -> u.Quantity:
    """Equal-tailed credible range of the kick speed, in km/s."""
    tail = (1 - credible_level) / 2
    v = np.atleast_1d(_speed(kick_samples, "kick_samples"))
    return np.quantile(v, [tail, 1 - tail]) * (u.km / u.s)


def flare_delay_range(
    smbh_mass: u.Quantity,
    orbit_radius_rg,
    binary_mass: u.Quantity,
    kick_samples: u.Quantity,
    aspect_ratio=None,
    credible_level: float = 0.9,
) -> RestFrameRange:
    """Rest-frame flare delay spanned by t_H (and t_disk at θ = 0) over the kick range (§13)."""
    speeds = _kick_range(kick_samples, credible_level)[::-1]  # fastest first
    times = [hill_exit_time(smbh_mass, orbit_radius_rg, binary_mass, speeds)]
    low, high = speeds[1].value, speeds[0].value
    basis = f"Hill-sphere exit R_H/v_kick for kicks of {low:.0f}–{high:.0f} km/s"
    if aspect_ratio is not None:
        times.append(disk_exit_time(smbh_mass, orbit_radius_rg, aspect_ratio, speeds))
        basis += f" and disk exit (H/a = {float(aspect_ratio):g}, kick along the normal)"
    cap = return_time(smbh_mass, orbit_radius_rg).to(u.d)
    end = min(max(t[1] for t in times), cap)
    start = min(min(t[0] for t in times), end)
    basis += (
        " (Newtonian; the flare mechanism is that of McKernan et al. 2019, ApJL 884, L50, whose"
        " onset scaling was not checked, so the exit times stand in for it; capped at P/2)"
    )
    return RestFrameRange(start, end, basis)


def repeat_delay_range(
    smbh_mass: u.Quantity,
    orbit_radius_rg,
    flare: RestFrameRange,
    kick_samples: u.Quantity,
    credible_level: float = 0.9,
) -> RestFrameRange:
    """Rest-frame delay of a repeat flare after the next disk crossing at P/2 (§13)."""
    half = return_time(smbh_mass, orbit_radius_rg).to(u.d)
    v_high = _kick_range(kick_samples, credible_level)[1]
    spread = (3 * v_high / orbital_speed(smbh_mass, orbit_radius_rg)).to_value(u.one)
    basis = (
        f"next disk crossing after P/2 = {half.to(u.yr).value:.3g} yr, ± {spread:.1%} for the "
        "kick's change of the orbital period (δP/P ≤ 3 v_kick/v_orb, Newtonian), followed by "
        "the same flare delay"
    )
    return RestFrameRange(half * (1 - spread) + flare.start, half * (1 + spread) + flare.end, basis)


def agn_windows(
    t_merger: Time,
    redshift,
    smbh_mass: u.Quantity,
    orbit_radius_rg,
    binary_mass: u.Quantity,
    kick_samples: u.Quantity,
    aspect_ratio=None,
    credible_level: float = 0.9,
) -> list[Window]:
    """Flare-delay and repeat windows of a kicked remnant in an AGN disk (docs/methods.md §13)."""
    flare = flare_delay_range(
        smbh_mass, orbit_radius_rg, binary_mass, kick_samples, aspect_ratio, credible_level
    )
    repeat = repeat_delay_range(smbh_mass, orbit_radius_rg, flare, kick_samples, credible_level)
    windows = []
    for delays, key in ((flare, AGN_FLARE), (repeat, AGN_REPEAT_FLARE)):
        try:
            start, end = utc_window(t_merger, redshift, delays.start, delays.end)
        except BeyondCalendar:  # left out: it would end after the year 9999
            continue
        windows.append(Window(key, AGN_BAND, "agn_disk", start, end, delays.basis))
    return windows
