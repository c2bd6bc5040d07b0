"""The headline of a sheet: two or three plain sentences written from the numbers."""

from __future__ import annotations

import astropy.units as u

from factsheet.labels import CLASSES
from factsheet.model import Derived
from factsheet.notation import format_value


def _about(value: float) -> str:
    return format_value(value, "", 2)


def headline(item: Derived) -> list[str]:
    """Two or three plain sentences from the numbers, for the top of a sheet."""
    q = item.quantities
    years = item.lookback_time.to_value(u.Gyr)
    when = (
        f"about {_about(years)} billion years ago"
        if years >= 1
        else f"about {_about(years * 1000)} million years ago"
    )
    text = [
        f"{CLASSES.get(item.source_class, 'Two compact objects')} of about "
        f"{_about(q['heavier_mass'].median)} and {_about(q['lighter_mass'].median)} times the "
        f"mass of the Sun merged {when}; the waves reached the detectors on "
        f"{item.event.time.utc.isot[:10]}."
    ]
    if "remnant_mass" in q:
        spin = q["remnant_spin"].median
        text.append(
            f"They left a single black hole of about {_about(q['remnant_mass'].median)} "
            f"solar masses, spinning at {abs(spin):.0%} of the maximum a black hole "
            f"can have, and radiated about {_about(q['radiated_mass'].median)} solar "
            "masses of energy as gravitational waves."
        )
    compared = item.comparisons
    if compared.sun_years is not None and compared.luminosity:
        sun = compared.sun_years.to_value(u.yr)
        galaxy = compared.luminosity.get("milky_way")
        line = f"The Sun would need about {format_value(sun, '', 2)} years to emit that energy"
        if galaxy:
            line += (
                f"; at its peak the merger put out {format_value(galaxy, '', 2)} times "
                "the light of all the stars in the Milky Way, as gravitational waves"
            )
        text.append(line + ".")
    elif item.windows:
        text.append(
            "A neutron star was involved, so light could follow: the counterpart "
            "windows below say when to look."
        )
    return text
