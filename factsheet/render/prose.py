"""The sentences of a sheet written from its numbers: the headline and the detection facts.

The headline tells the truth about the status before anything else: a retracted event speaks
of the signal in the past conditional, a candidate conditionally. Each body is named by the
mass band it most probably lies in, not by the source class alone, and every number is rounded
to the digits its interval supports (:func:`factsheet.notation.format_about`).
"""

from __future__ import annotations

import astropy.units as u

from factsheet import labels
from factsheet.load.schema import WHOLE_SKY_DEG2
from factsheet.model import Derived, Summary
from factsheet.notation import (
    format_about,
    format_value,
    how_often,
    percent,
)
from factsheet.physics.comparisons import emission_time
from factsheet.render.numbers import median_text

#: What a body in each mass band is called; ``None``: an object neither band can name.
BODY_NOUNS = {
    "neutron_star": "neutron star",
    "lower_gap": None,
    "stellar_black_hole": "black hole",
    "pair_instability_gap": "black hole",
    "above_gap": "black hole",
}
GAP_OBJECT = "heavier than any known neutron star and lighter than any known black hole"


def about(summary: Summary) -> str:
    """A median in prose, to the digit its interval supports (ages)."""
    return format_about(summary.median, summary.low, summary.high)


def likely_band(item: Derived, subject: str) -> str:
    """The mass band a subject most probably lies in."""
    probs = item.mass_bands.get(subject, {})
    return max(probs, key=probs.get) if probs else "stellar_black_hole"


def _body(item: Derived, subject: str) -> str:
    """One body as the first sentence names it: "a black hole of about 49 solar masses"."""
    mass = median_text(item, f"{subject}_mass")
    noun = BODY_NOUNS[likely_band(item, subject)]
    if noun is None:
        return f"an object of about {mass} solar masses, {GAP_OBJECT},"
    return f"a {noun} of about {mass} solar masses"


def _bodies(item: Derived) -> str:
    """Both bodies: "two black holes of about 49 and 5.4 solar masses" when one noun fits."""
    nouns = [BODY_NOUNS[likely_band(item, s)] for s in ("heavier", "lighter")]
    if nouns[0] == nouns[1] and nouns[0] is not None:
        masses = [median_text(item, f"{s}_mass") for s in ("heavier", "lighter")]
        return f"two {nouns[0]}s of about {masses[0]} and {masses[1]} times the mass of the Sun"
    return f"{_body(item, 'heavier')} and {_body(item, 'lighter')}"


def when(item: Derived) -> str:
    """How long ago, to the digit the interval allows: "about 6 billion years ago"."""
    t = item.quantities["lookback_time"]
    if t.median >= 1:
        return f"about {about(t)} billion years ago"
    mega = Summary(t.median * 1e3, t.low * 1e3, t.high * 1e3, "Myr", t.level)
    return f"about {about(mega)} million years ago"


def headline(item: Derived) -> list[str]:
    """Two or three plain sentences from the numbers, for the top of a sheet."""
    status, date = item.event.status, item.event.time.utc.isot[:10]
    bodies = _bodies(item)
    if status == "retracted":
        return [
            f"Had the signal been real, it would have come from {bodies} that merged "
            f"{when(item)}, its waves reaching the detectors on {date}."
        ]
    first = f"{bodies} merged {when(item)}; the waves reached the detectors on {date}."
    if status == "candidate":
        first = f"If it is real, {first}"
    text = [labels.sentence(first)]
    text.extend(_remnant(item, conditional=status == "candidate"))
    return text


def _remnant(item: Derived, conditional: bool = False) -> list[str]:
    """What the merger left and gave off, and the comparison a reader can picture (for a
    candidate: what it would have left)."""
    q, text = item.quantities, []
    left, radiated = (
        ("would have left", "would have radiated") if conditional else ("left", "radiated")
    )
    if "remnant_mass" in q:
        share = median_text(item, "remnant_spin", 100).lstrip("−")
        text.append(
            f"They {left} a single black hole of about {median_text(item, 'remnant_mass')} solar "
            f"masses, spinning at about {share} % of the maximum a black hole can have, and "
            f"{radiated} about {median_text(item, 'radiated_mass')} solar masses of energy as "
            "gravitational waves."
        )
    compared = item.comparisons
    if compared.sun_years is not None and compared.luminosity:
        sun = compared.sun_years.to_value(u.yr)
        line = f"The Sun would need about {format_value(sun, '', 1)} years to emit that energy"
        quasar = _quasar_time(item)
        if quasar:
            line += f", and {quasar}"
        galaxy = compared.luminosity.get("milky_way")
        if galaxy:
            line += (
                f"; at its peak the merger put out about {format_value(galaxy, '', 1)} times "
                "the light of all the stars in the Milky Way, as gravitational waves"
            )
        text.append(line + ".")
    elif item.windows:
        text.append(
            "A neutron star was involved, so light could follow: the counterpart "
            "windows below say when to look."
        )
    return text


#: Units for a duration in words, largest first (a year of 365.25 days).
DURATIONS = (("year", 365.25 * 86400), ("day", 86400), ("hour", 3600), ("minute", 60))


def duration_words(seconds: float) -> str:
    """A duration in the largest unit that keeps it at one or more: "about 3 days"."""
    for unit, size in DURATIONS:
        if seconds >= size:
            count = format_value(seconds / size, "", 1).removesuffix(".0")
            return f"about {count} {unit}{'' if count == '1' else 's'}"
    count = format_value(seconds, "", 1)
    return f"about {count} second{'' if count == '1' else 's'}"


def _quasar_time(item: Derived) -> str:
    """How long one of the most luminous quasars (the packaged comparison object) would shine
    to emit the merger's energy, in words; "" without the energy or the object."""
    quasar = item.reference.luminosities().get("luminous_quasar")
    energy = item.quantities.get("energy_radiated")
    if quasar is None or energy is None:
        return ""
    shine = emission_time(energy.quantity, quasar).to_value(u.s)
    name = item.reference.comparison_labels().get("luminous_quasar", "a luminous quasar")
    return f"{name} {duration_words(shine)}"


def _listed(words: list[str]) -> str:
    return words[0] if len(words) == 1 else ", ".join(words[:-1]) + " and " + words[-1]


def detection(item: Derived, large_sky: bool = False, rate_in_box: bool = False) -> list[str]:
    """The detection facts as sentences: who saw it, how loud, how significant, where (the
    false-alarm rate only when no caveat box before the numbers already says it)."""
    found, retracted = item.event.detection, item.event.status == "retracted"
    text = []
    seen = "As first reported, it was seen" if retracted else "Seen"
    if found.network and found.snr is not None:
        text.append(
            f"{seen} by {_listed(list(found.network))} with a combined signal-to-noise ratio "
            f"of {found.snr:g}."
        )
    elif found.network:
        text.append(f"{seen} by {_listed(list(found.network))}.")
    elif found.snr is not None:
        text.append(f"Combined signal-to-noise ratio {found.snr:g}.")
    if found.false_alarm_rate is not None and not retracted and not rate_in_box:
        rate = found.false_alarm_rate.to_value(1 / u.yr)
        text.append(f"Noise alone would make a signal like this {how_often(rate)}.")
    mapped = item.sky_map
    if mapped is not None or found.sky_area is not None:
        area = (found.sky_area if mapped is None else mapped.area_90).to_value(u.deg**2)
        share = format_value(100 * area / WHOLE_SKY_DEG2, "", 1)
        line = (
            f"The 90 % credible sky region covers {format_value(area, '', 2)} square degrees, "
            f"about {share} % of the sky"
        )
        large = large_sky and not retracted
        text.append(line + (": a large area to search for a counterpart." if large else "."))
    text.append(class_sentence(item))
    return text


def class_sentence(item: Derived) -> str:
    """The source class, with no more certainty than the masses alone can give."""
    probs = item.class_probabilities
    code = item.source_class
    name = f"{labels.CLASS_NAMES[code]} ({code})" if code in labels.CLASS_NAMES else code
    others = [f"{k} {percent(p)}" for k, p in probs.items() if k != item.source_class and p >= 0.01]
    verb = "it would have been" if item.event.status == "retracted" else "this is"
    line = f"By its masses alone {verb} a {name} merger"
    if others:
        line += f" (other classes: {', '.join(others)})"
    gap = [s for s in ("heavier", "lighter") if likely_band(item, s) == "lower_gap"]
    if gap:
        body = f"the {gap[0]} body" if len(gap) == 1 else "either body"
        line += (
            f"; but the masses cannot say what {body} is: a mass in the lower gap "
            "fits neither a known neutron star nor a known black hole"
        )
    return line + "."
