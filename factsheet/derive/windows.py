"""When and against what to look: counterpart windows in UTC and the energy comparisons."""

from __future__ import annotations

import astropy.units as u

from factsheet.derive.classify import Classification
from factsheet.i18n import Plural, Text
from factsheet.model import Caveat, Comparisons, Event, Reference
from factsheet.physics import bands, comparisons, counterparts, disruption
from factsheet.physics.counterparts import Window

RETRACTED_REASON = Text(
    "The event was retracted: with no real merger there is no counterpart to look for."
)
BEYOND_CALENDAR_REASON = Text("Every window would end after the year 9999, so none is given.")

#: Why a black-hole pair in vacuum gets no window (physics.counterparts.VACUUM_REASON, which
#: is kept free of our language machinery), in the reader's language.
VACUUM_REASON = Text(
    "Two black holes merging in empty space leave no matter to heat, so no electromagnetic "
    "counterpart is expected and no window is given."
)


def windows(
    event: Event,
    z: float,
    c: Classification,
    kick_samples: u.Quantity | None,
    total_mass: u.Quantity,
    ref: Reference,
    level: float,
) -> tuple[tuple[Window, ...], str, list[Caveat]]:
    """Counterpart windows in UTC, the reason when there are none, and their caveats."""
    if event.status == "retracted":
        return (), RETRACTED_REASON, []
    if c.disrupted:
        found = counterparts.rest_frame_windows(event.time, z, ref.windows)
        return tuple(found), _none_left(found), _window_notes(len(ref.windows) - len(found))
    if event.host is not None and kick_samples is not None:
        host = event.host
        found = counterparts.agn_windows(
            event.time,
            z,
            host.smbh_mass,
            host.orbit_radius,
            total_mass,
            kick_samples,
            host.disk_aspect_ratio,
            level,
        )
        return tuple(found), _none_left(found), _window_notes(2 - len(found))
    empty, _reason = counterparts.vacuum_windows()
    return tuple(empty), VACUUM_REASON, []


def _none_left(found: list[Window]) -> str:
    return "" if found else BEYOND_CALENDAR_REASON


def _window_notes(left_out: int) -> list[Caveat]:
    """The planning-aid caveat, and one for windows that would end after the year 9999."""
    notes = [_planning_caveat()]
    if left_out:
        notes.append(
            Caveat(
                "windows-beyond-calendar",
                "notice",
                Plural(
                    "{n} counterpart window would end after the year 9999, beyond any date the "
                    "site can write, and is left out.",
                    "{n} counterpart windows would end after the year 9999, beyond any date the "
                    "site can write, and are left out.",
                    left_out,
                ),
            )
        )
    return notes


def _planning_caveat() -> Caveat:
    return Caveat(
        "counterpart-windows-planning-aid",
        "info",
        Text(
            "Counterpart windows are a planning aid built from typical time scales, not a "
            "prediction that anything will be seen."
        ),
    )


def comparison_values(
    energy: u.Quantity | None, peak: u.Quantity | None, ref: Reference
) -> Comparisons:
    """Ratios of the median energy radiated and peak luminosity to the comparison objects."""
    found: dict = {}
    if energy is not None:
        ratios = comparisons.energy_ratios(energy, ref.energies())
        found["energy"] = {k: float(v) for k, v in ratios.items()}
        found["sun_years"] = comparisons.emission_time(energy).to(u.yr)
    if peak is not None:
        ratios = comparisons.luminosity_ratios(peak, ref.luminosities())
        found["luminosity"] = {k: float(v) for k, v in ratios.items()}
    return Comparisons(**found)


def methods_used(
    c: Classification, found: tuple[Window, ...], compared: Comparisons
) -> tuple[str, ...]:
    """Ids of the registered methods behind the class, bands, disruption, windows, comparisons."""
    ids = [bands.SOURCE_CLASS, bands.MASS_BANDS]
    if c.disruption_probability is not None:
        ids += [disruption.REMNANT_MASS, disruption.BARYON_MASS]
    scenarios = {w.scenario for w in found}
    if scenarios - {"agn_disk"}:
        ids.append(counterparts.REST_FRAME_WINDOW)
    if "agn_disk" in scenarios:
        ids.append(counterparts.AGN_DISK)
    if compared.energy or compared.luminosity:
        ids.append(comparisons.COMPARISON)
    return tuple(ids)
