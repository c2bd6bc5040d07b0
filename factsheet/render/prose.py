"""The sentences of a sheet written from its numbers: the headline and the detection facts.

The headline tells the truth about the status before anything else: a retracted event speaks
of the signal in the past conditional, a candidate conditionally. Each body is named by the
mass band it most probably lies in, not by the source class alone, and every number is rounded
to the digits its interval supports (:func:`factsheet.notation.format_about`).

Each sentence is one message of the catalogue in each of its variants (confirmed, candidate,
retracted; with or without an optional clause), its numbers and names in placeholders, so that
a language orders and inflects the whole sentence its own way. These functions run while the
reader's language is in use and return text in that language.
"""

from __future__ import annotations

import astropy.units as u

from factsheet import labels
from factsheet.i18n import _, date_text, decimal_text, localize_number, ngettext
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
    "neutron_star": "neutron_star",
    "lower_gap": None,
    "stellar_black_hole": "black_hole",
    "pair_instability_gap": "black_hole",
    "above_gap": "black_hole",
}


def about(summary: Summary) -> str:
    """A median in prose, to the digit its interval supports (ages)."""
    return format_about(summary.median, summary.low, summary.high)


def likely_band(item: Derived, subject: str) -> str:
    """The mass band a subject most probably lies in."""
    probs = item.mass_bands.get(subject, {})
    return max(probs, key=probs.get) if probs else "stellar_black_hole"


def _percent_of(number: str) -> str:
    """A number already written, as a percentage ("45 %", a no-break space before the sign):
    the sign stays out of the messages, where gettext tools would take it for a format."""
    return f"{number}\u00a0%"


def _capital(text: str) -> str:
    """A sentence, already in the language in use, with its first letter upper-case."""
    return text[:1].upper() + text[1:]


def _body(item: Derived, subject: str) -> str:
    """One body as the first sentence names it: "a black hole of about 49 solar masses"."""
    mass = median_text(item, f"{subject}_mass")
    noun = BODY_NOUNS[likely_band(item, subject)]
    if noun is None:
        return _(
            "an object of about {mass} solar masses, heavier than any known neutron star and "
            "lighter than any known black hole,"
        ).format(mass=mass)
    if noun == "neutron_star":
        return _("a neutron star of about {mass} solar masses").format(mass=mass)
    return _("a black hole of about {mass} solar masses").format(mass=mass)


def _bodies(item: Derived) -> str:
    """Both bodies: "two black holes of about 49 and 5.4 solar masses" when one noun fits."""
    nouns = [BODY_NOUNS[likely_band(item, s)] for s in ("heavier", "lighter")]
    if nouns[0] == nouns[1] and nouns[0] is not None:
        heavier, lighter = (median_text(item, f"{s}_mass") for s in ("heavier", "lighter"))
        if nouns[0] == "neutron_star":
            both = _("two neutron stars of about {heavier} and {lighter} times the mass of the Sun")
        else:
            both = _("two black holes of about {heavier} and {lighter} times the mass of the Sun")
        return both.format(heavier=heavier, lighter=lighter)
    # TRANSLATORS: two bodies named in full, as the subject of "... merged"
    return _("{heavier} and {lighter}").format(
        heavier=_body(item, "heavier"), lighter=_body(item, "lighter")
    )


def when(item: Derived) -> str:
    """How long ago, to the digit the interval allows: "about 6 billion years ago"."""
    t = item.quantities["lookback_time"]
    if t.median >= 1:
        n = about(t)
        return ngettext(
            "about {n} billion years ago", "about {n} billion years ago", 1 if n == "1" else 2
        ).format(n=n)
    mega = Summary(t.median * 1e3, t.low * 1e3, t.high * 1e3, "Myr", t.level)
    n = about(mega)
    return ngettext(
        "about {n} million years ago", "about {n} million years ago", 1 if n == "1" else 2
    ).format(n=n)


def headline(item: Derived) -> list[str]:
    """Two or three plain sentences from the numbers, for the top of a sheet."""
    status, date = item.event.status, date_text(item.event.time.utc.datetime)
    words = {"bodies": _bodies(item), "when": when(item), "date": date}
    if status == "retracted":
        return [
            _capital(
                _(
                    "Had the signal been real, it would have come from {bodies} that merged "
                    "{when}, its waves reaching the detectors on {date}."
                ).format(**words)
            )
        ]
    if status == "candidate":
        first = _(
            "If it is real, {bodies} merged {when}; the waves reached the detectors on {date}."
        )
    else:
        first = _("{bodies} merged {when}; the waves reached the detectors on {date}.")
    text = [_capital(first.format(**words))]
    text.extend(_remnant(item, conditional=status == "candidate"))
    return text


def _remnant(item: Derived, conditional: bool = False) -> list[str]:
    """What the merger left and gave off, and the comparison a reader can picture (for a
    candidate: what it would have left)."""
    q, text = item.quantities, []
    if "remnant_mass" in q:
        if conditional:
            line = _(
                "They would have left a single black hole of about {mass} solar masses, spinning "
                "at about {spin} of the maximum a black hole can have, and would have "
                "radiated about {radiated} solar masses of energy as gravitational waves."
            )
        else:
            line = _(
                "They left a single black hole of about {mass} solar masses, spinning at about "
                "{spin} of the maximum a black hole can have, and radiated about "
                "{radiated} solar masses of energy as gravitational waves."
            )
        text.append(
            line.format(
                mass=median_text(item, "remnant_mass"),
                spin=_percent_of(median_text(item, "remnant_spin", 100).lstrip("−")),
                radiated=median_text(item, "radiated_mass"),
            )
        )
    compared = item.comparisons
    if compared.sun_years is not None and compared.luminosity:
        sun = format_value(compared.sun_years.to_value(u.yr), "", 1)
        quasar = _quasar_time(item)
        galaxy = compared.luminosity.get("milky_way")
        if quasar and galaxy:
            line = _(
                "The Sun would need about {years} years to emit that energy, and {quasar}; at "
                "its peak the merger put out about {galaxies} times the light of all the stars "
                "in the Milky Way, as gravitational waves."
            )
        elif quasar:
            line = _("The Sun would need about {years} years to emit that energy, and {quasar}.")
        elif galaxy:
            line = _(
                "The Sun would need about {years} years to emit that energy; at its peak the "
                "merger put out about {galaxies} times the light of all the stars in the Milky "
                "Way, as gravitational waves."
            )
        else:
            line = _("The Sun would need about {years} years to emit that energy.")
        galaxies = format_value(galaxy, "", 1) if galaxy else ""
        text.append(line.format(years=sun, quasar=quasar, galaxies=galaxies))
    elif item.windows:
        text.append(
            _(
                "A neutron star was involved, so light could follow: the counterpart "
                "windows below say when to look."
            )
        )
    return text


#: Units for a duration in words, largest first (a year of 365.25 days).
DURATIONS = (("year", 365.25 * 86400), ("day", 86400), ("hour", 3600), ("minute", 60))


def _duration(unit: str, count: str) -> str:
    """``count`` (already written) of ``unit`` in words: "about 3 days"."""
    n = 1 if count == "1" else 2
    if unit == "year":
        text = ngettext("about {n} year", "about {n} years", n)
    elif unit == "day":
        text = ngettext("about {n} day", "about {n} days", n)
    elif unit == "hour":
        text = ngettext("about {n} hour", "about {n} hours", n)
    elif unit == "minute":
        text = ngettext("about {n} minute", "about {n} minutes", n)
    else:
        text = ngettext("about {n} second", "about {n} seconds", n)
    return text.format(n=count)


def duration_words(seconds: float) -> str:
    """A duration in the largest unit that keeps it at one or more: "about 3 days"."""
    for unit, size in DURATIONS:
        if seconds >= size:
            count = format_value(seconds / size, "", 1).removesuffix(decimal_text(0.0, 1)[1:])
            return _duration(unit, count)
    return _duration("second", format_value(seconds, "", 1))


def _quasar_time(item: Derived) -> str:
    """How long one of the most luminous quasars (the packaged comparison object) would shine
    to emit the merger's energy, in words; "" without the energy or the object."""
    quasar = item.reference.luminosities().get("luminous_quasar")
    energy = item.quantities.get("energy_radiated")
    if quasar is None or energy is None:
        return ""
    shine = emission_time(energy.quantity, quasar).to_value(u.s)
    name = item.reference.comparison_labels().get("luminous_quasar") or _("a luminous quasar")
    # TRANSLATORS: after "The Sun would need about 10 years to emit that energy, and": an
    # object and how long it would need ("one of the most luminous quasars known about 3 days")
    return _("{object} {duration}").format(object=name, duration=duration_words(shine))


def _listed(words: list[str]) -> str:
    """Names in a list: "A", "A and B", "A, B and C"."""
    if len(words) == 1:
        return words[0]
    # TRANSLATORS: the last two names of a list of detectors
    return _("{names} and {last}").format(names=", ".join(words[:-1]), last=words[-1])


def detection(item: Derived, large_sky: bool = False, rate_in_box: bool = False) -> list[str]:
    """The detection facts as sentences: who saw it, how loud, how significant, where (the
    false-alarm rate only when no caveat box before the numbers already says it)."""
    found, retracted = item.event.detection, item.event.status == "retracted"
    text = []
    snr = "" if found.snr is None else localize_number(f"{found.snr:g}")
    network = _listed(list(found.network)) if found.network else ""
    if found.network and found.snr is not None:
        if retracted:
            line = _(
                "As first reported, it was seen by {detectors} with a combined signal-to-noise "
                "ratio of {snr}."
            )
        else:
            line = _("Seen by {detectors} with a combined signal-to-noise ratio of {snr}.")
        text.append(line.format(detectors=network, snr=snr))
    elif found.network:
        if retracted:
            line = _("As first reported, it was seen by {detectors}.")
        else:
            line = _("Seen by {detectors}.")
        text.append(line.format(detectors=network))
    elif found.snr is not None:
        text.append(_("Combined signal-to-noise ratio {snr}.").format(snr=snr))
    if found.false_alarm_rate is not None and not retracted and not rate_in_box:
        rate = found.false_alarm_rate.to_value(1 / u.yr)
        text.append(
            _("Noise alone would make a signal like this {how}.").format(how=how_often(rate))
        )
    mapped = item.sky_map
    if mapped is not None or found.sky_area is not None:
        area = (found.sky_area if mapped is None else mapped.area_90).to_value(u.deg**2)
        share = format_value(100 * area / WHOLE_SKY_DEG2, "", 1)
        if large_sky and not retracted:
            line = _(
                "The {level} credible sky region covers {area} square degrees, about "
                "{share} of the sky: a large area to search for a counterpart."
            )
        else:
            line = _(
                "The {level} credible sky region covers {area} square degrees, about "
                "{share} of the sky."
            )
        text.append(
            line.format(
                level=percent(0.9), area=format_value(area, "", 2), share=_percent_of(share)
            )
        )
    text.append(class_sentence(item))
    return text


def class_sentence(item: Derived) -> str:
    """The source class, with no more certainty than the masses alone can give."""
    probs = item.class_probabilities
    code = item.source_class
    name = f"{labels.CLASS_NAMES[code]} ({code})" if code in labels.CLASS_NAMES else code
    others = ", ".join(
        f"{k} {percent(p)}" for k, p in probs.items() if k != item.source_class and p >= 0.01
    )
    retracted = item.event.status == "retracted"
    if retracted and others:
        line = _("By its masses alone it would have been a {name} merger (other classes: {others})")
    elif retracted:
        line = _("By its masses alone it would have been a {name} merger")
    elif others:
        line = _("By its masses alone this is a {name} merger (other classes: {others})")
    else:
        line = _("By its masses alone this is a {name} merger")
    line = line.format(name=name, others=others)
    gap = [s for s in ("heavier", "lighter") if likely_band(item, s) == "lower_gap"]
    if not gap:
        return line + "."
    if len(gap) == 2:
        # TRANSLATORS: {sentence} is "By its masses alone this is a ... merger"
        end = _(
            "{sentence}; but the masses cannot say what either body is: a mass in the lower gap "
            "fits neither a known neutron star nor a known black hole."
        )
    elif gap[0] == "heavier":
        end = _(
            "{sentence}; but the masses cannot say what the heavier body is: a mass in the lower "
            "gap fits neither a known neutron star nor a known black hole."
        )
    else:
        end = _(
            "{sentence}; but the masses cannot say what the lighter body is: a mass in the lower "
            "gap fits neither a known neutron star nor a known black hole."
        )
    return end.format(sentence=line)
