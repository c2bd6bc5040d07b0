"""The sound of a sheet: which chirps to make, and the words that say how they were made.

:func:`event_sound` runs in a build worker (from :mod:`factsheet.render.assets`): it synthesises
the chirp with :func:`factsheet.figures.audio.chirp_wav` and, when the whole sound lies below
what small speakers play (:func:`factsheet.figures.audio.speaker_shift`), a copy shifted up by
whole octaves. It runs once for every language (the sound has no words), so its words are kept
messages (:class:`factsheet.i18n.Text`) with their numbers formatted when shown: the page of
each language shows them in its own words and conventions, while their ``str`` value stays the
English wording. Every number in the words is printed as the sheet's table prints it (the median
of :func:`~factsheet.render.contexts.display_summary`, rounded by its interval); the chirp's own
factors are ours and exact. :func:`band_note` is the one wording of "only merger and ringdown
are in band", for the sound and for the frequency figure alike.
"""

from __future__ import annotations

import math
from dataclasses import replace

import astropy.units as u
from babel import Locale
from babel.numbers import get_decimal_symbol

from factsheet import labels
from factsheet.i18n import Later, Text, current
from factsheet.model import Audio, Derived, Summary
from factsheet.notation import format_median, format_value, unit_text
from factsheet.render.contexts import display_summary

#: A shift by whole octaves, in words (index: the number of octaves).
OCTAVES = (
    "",
    Text("one octave"),
    Text("two octaves"),
    Text("three octaves"),
    Text("four octaves"),
    Text("five octaves"),
    Text("six octaves"),
    Text("seven octaves"),
    Text("eight octaves"),
    Text("nine octaves"),
    Text("ten octaves"),
)


def event_sound(item: Derived) -> tuple[Audio, dict[str, bytes]]:
    """The sheet's chirp (and its shifted copy when needed) and the files by site path."""
    from factsheet.figures.audio import chirp_wav, speaker_shift

    q, f_low = item.quantities, item.settings.low_frequency
    ring, damp = q.get("ringdown_frequency"), q.get("ringdown_damping_time")
    isco = q["isco_frequency"].median * u.Hz
    # With the inspiral's end below the band edge, a short sweep from the edge stands in for the
    # merger before the ringdown tone (band_note says so).
    args = (
        q["chirp_mass_detector"].median * u.Msun,
        f_low,
        isco if isco > f_low else 1.5 * f_low,
        ring.median * u.Hz if ring else None,
        damp.median * u.s if damp else None,
    )
    chirp = chirp_wav(*args)
    path = f"events/{item.event.id}.wav"
    files = {path: chirp.wav}
    audio = Audio(path, describe(item, chirp), chirp.duration_s)
    factor = speaker_shift(f_low, args[3] if ring else args[2], chirp.pitch_factor)
    if factor is not None:
        shifted = chirp_wav(*args, pitch_factor=factor)
        shifted_path = f"events/{item.event.id}-shifted.wav"
        files[shifted_path] = shifted.wav
        words = shifted_words(item, factor)
        audio = replace(audio, shifted_path=shifted_path, shifted_description=words)
    return audio, files


def band_note(item: Derived) -> Text | None:
    """One sentence when the inspiral ends (at the ISCO frequency, median) below the catalogue's
    band edge: only the merger and the ringdown are then in the detectors' band. A kept message
    (a ``str`` whose value is the English wording; shown in the language in use)."""
    isco = item.quantities.get("isco_frequency")
    edge = item.settings.low_frequency.to_value(u.Hz)
    if isco is None or isco.median >= edge:
        return None
    return Text(
        "Only the merger and the ringdown are in the detectors' band: the inspiral ends at "
        "{frequency} ({meaning}), below the band edge at {edge}.",
        frequency=shown(item, "isco_frequency"),
        meaning=Later(in_prose, "isco_frequency"),
        edge=Later(exact, edge, "Hz"),
    )


def describe(item: Derived, chirp) -> Text:
    """How the chirp was made from the observed track, after the band note when there is one."""
    edge = Later(exact, item.settings.low_frequency.to_value(u.Hz), "Hz")
    how = _how_words(chirp)
    note = band_note(item)
    if not chirp.has_ringdown:
        what = Text(
            "the inspiral rises from {edge} to {merger} (observed) and the sound then fades: no "
            "ringdown tone is given for this event",
            edge=edge,
            merger=shown(item, "isco_frequency"),
        )
        return Text("{how}; {what}.", how=how, what=what)
    numbers = {"edge": edge, "ringdown": shown(item, "ringdown_frequency")}
    if chirp.lengthened:
        numbers["damping"] = shown(item, "ringdown_damping_time")
        numbers["played"] = Later(format_value, chirp.damping_s, "s", 2)
    if note and chirp.lengthened:
        what = Text(
            "the sound sweeps up from {edge} into the final tone, the ringdown at {ringdown} "
            "(observed frequencies), its {damping} damping time lengthened to {played} so it "
            "can be heard",
            **numbers,
        )
    elif note:
        what = Text(
            "the sound sweeps up from {edge} into the final tone, the ringdown at {ringdown} "
            "(observed frequencies)",
            **numbers,
        )
    elif chirp.lengthened:
        what = Text(
            "the inspiral rises from {edge} to {merger} at merger and the final tone is the "
            "ringdown at {ringdown} (observed frequencies), its {damping} damping time "
            "lengthened to {played} so it can be heard",
            merger=shown(item, "isco_frequency"),
            **numbers,
        )
    else:
        what = Text(
            "the inspiral rises from {edge} to {merger} at merger and the final tone is the "
            "ringdown at {ringdown} (observed frequencies)",
            merger=shown(item, "isco_frequency"),
            **numbers,
        )
    if note:
        # TRANSLATORS: the sound's description: the band note, then how the sound was made
        # ({how}) and what it plays ({what}).
        return Text("{note} {how}; {what}.", note=note, how=how, what=what)
    # TRANSLATORS: the sound's description: how the sound was made, then what it plays.
    return Text("{how}; {what}.", how=how, what=what)


def _how_words(chirp) -> Text:
    """The start of the description: the chirp's own pitch factor and why, and its pace."""
    pitch, compressed = chirp.pitch_factor, chirp.time_factor > 1
    pace = {
        "factor": Later(exact, chirp.time_factor),
        "length": Later(exact, chirp.max_seconds, "s"),
    }
    if pitch == 1:
        if compressed:
            return Text(
                "Played at the observed frequencies, time compressed {factor}× to fit in {length}",
                **pace,
            )
        return Text("Played at the observed frequencies and in real time")
    interval = _interval(max(pitch, 1 / pitch))
    if pitch > 1 and compressed:
        return Text(
            "Frequencies raised {interval} so the chirp is audible and time compressed "
            "{factor}× to fit in {length}",
            interval=interval,
            **pace,
        )
    if pitch > 1:
        return Text(
            "Frequencies raised {interval} so the chirp is audible, played in real time",
            interval=interval,
        )
    ceiling = Later(exact, chirp.ceiling_hz, "Hz")
    if compressed:
        return Text(
            "Frequencies lowered {interval} to keep the top of the chirp below {ceiling} and "
            "time compressed {factor}× to fit in {length}",
            interval=interval,
            ceiling=ceiling,
            **pace,
        )
    return Text(
        "Frequencies lowered {interval} to keep the top of the chirp below {ceiling}, played "
        "in real time",
        interval=interval,
        ceiling=ceiling,
    )


def shifted_words(item: Derived, factor: float) -> Text:
    """What the shifted copy is: by how much, why, and where its final tone lands."""
    from factsheet.figures.audio import SMALL_SPEAKER_FLOOR

    key = "ringdown_frequency" if "ringdown_frequency" in item.quantities else "isco_frequency"
    return Text(
        "The same sound shifted up {interval} so that small speakers can play it: they play "
        "little below about {floor}, and all of the sound lies below that. Its final tone "
        "sounds at {played} instead of {observed}.",
        interval=_interval(factor),
        floor=Later(exact, SMALL_SPEAKER_FLOOR.to_value(u.Hz), "Hz"),
        played=shown(item, key, factor),
        observed=shown(item, key),
    )


def shown(item: Derived, key: str, factor: float = 1.0) -> Later:
    """A quantity's median as the sheet's table prints it (times ``factor``, rounded alike),
    formatted when shown."""
    s: Summary = display_summary(item.quantities[key], item.settings.energy_units)
    return Later(format_median, s.median * factor, s.low * factor, s.high * factor, s.unit)


def in_prose(key: str) -> str:
    """A quantity's name in prose, in the language in use."""
    return str(labels.QUANTITIES[key].in_prose)


def exact(value: float, unit: str = "") -> str:
    """A setting or one of our own factors, exactly as given (``20 Hz``, ``29``), with the
    decimal sign of the language in use (and no grouping of thousands: ``4000 Hz``)."""
    text = f"{value:g}".replace(".", get_decimal_symbol(Locale.parse(current())))
    return f"{text} {unit_text(unit)}".strip()


def _interval(factor: float) -> Later:
    """``three octaves (×8)`` for a power of two, else ``×3``, formatted when shown."""
    return Later(interval_text, factor)


def interval_text(factor: float) -> str:
    """``three octaves (×8)`` for a power of two, else ``×3``, in the language in use."""
    octaves = round(math.log2(factor))
    if 2.0**octaves == factor and 0 < abs(octaves) < len(OCTAVES):
        return f"{OCTAVES[abs(octaves)]} (×{exact(factor)})"
    return f"×{exact(factor)}"
