"""The sound of a sheet: which chirps to make, and the words that say how they were made.

:func:`event_sound` runs in a build worker (from :mod:`factsheet.render.assets`): it synthesises
the chirp with :func:`factsheet.figures.audio.chirp_wav` and, when the whole sound lies below
what small speakers play (:func:`factsheet.figures.audio.speaker_shift`), a copy shifted up by
whole octaves. Every number in the words is printed as the sheet's table prints it (the median
of :func:`~factsheet.render.contexts.display_summary`, rounded by its interval); the chirp's own
factors are ours and exact. :func:`band_note` is the one wording of "only merger and ringdown
are in band", for the sound and for the frequency figure alike.
"""

from __future__ import annotations

import math
from dataclasses import replace

import astropy.units as u

from factsheet import labels
from factsheet.model import Audio, Derived, Summary
from factsheet.notation import format_median, format_value, unit_text
from factsheet.render.contexts import display_summary

OCTAVES = ("", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten")


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


def band_note(item: Derived) -> str | None:
    """One sentence when the inspiral ends (at the ISCO frequency, median) below the catalogue's
    band edge: only the merger and the ringdown are then in the detectors' band."""
    isco = item.quantities.get("isco_frequency")
    edge = item.settings.low_frequency.to_value(u.Hz)
    if isco is None or isco.median >= edge:
        return None
    return (
        "Only the merger and the ringdown are in the detectors' band: the inspiral ends at "
        f"{shown(item, 'isco_frequency')} ({labels.QUANTITIES['isco_frequency'].in_prose}), "
        f"below the band edge at {exact(edge, 'Hz')}."
    )


def describe(item: Derived, chirp) -> str:
    """How the chirp was made from the observed track, after the band note when there is one."""
    edge = exact(item.settings.low_frequency.to_value(u.Hz), "Hz")
    text = _pitch_words(chirp.pitch_factor, chirp.ceiling_hz)
    if chirp.time_factor > 1:
        text += f"{' and' if chirp.pitch_factor != 1 else ','} time compressed"
        text += f" {exact(chirp.time_factor)}× to fit in {exact(chirp.max_seconds, 's')}"
    else:
        text += ", played in real time" if chirp.pitch_factor != 1 else " and in real time"
    note = band_note(item)
    if not chirp.has_ringdown:
        text += f"; the inspiral rises from {edge} to {shown(item, 'isco_frequency')} (observed)"
        return text + " and the sound then fades: no ringdown tone is given for this event."
    if note:
        text += f"; the sound sweeps up from {edge} into the final tone, the ringdown at"
    else:
        text += f"; the inspiral rises from {edge} to {shown(item, 'isco_frequency')} at merger"
        text += " and the final tone is the ringdown at"
    text += f" {shown(item, 'ringdown_frequency')} (observed frequencies)"
    if chirp.lengthened:
        text += f", its {shown(item, 'ringdown_damping_time')} damping time lengthened to"
        text += f" {format_value(chirp.damping_s, 's', 2)} so it can be heard"
    return f"{note} {text}." if note else text + "."


def shifted_words(item: Derived, factor: float) -> str:
    """What the shifted copy is: by how much, why, and where its final tone lands."""
    from factsheet.figures.audio import SMALL_SPEAKER_FLOOR

    key = "ringdown_frequency" if "ringdown_frequency" in item.quantities else "isco_frequency"
    floor = exact(SMALL_SPEAKER_FLOOR.to_value(u.Hz), "Hz")
    played = shown(item, key, factor)
    return (
        f"The same sound shifted up {_interval(factor)} so that small speakers can play it: they "
        f"play little below about {floor}, and all of the sound lies below that. Its final "
        f"tone sounds at {played} instead of {shown(item, key)}."
    )


def shown(item: Derived, key: str, factor: float = 1.0) -> str:
    """A quantity's median as the sheet's table prints it (times ``factor``, rounded alike)."""
    s: Summary = display_summary(item.quantities[key], item.settings.energy_units)
    return format_median(s.median * factor, s.low * factor, s.high * factor, s.unit)


def exact(value: float, unit: str = "") -> str:
    """A setting or one of our own factors, exactly as given (``20 Hz``, ``29``)."""
    return f"{value:g} {unit_text(unit)}".strip()


def _interval(factor: float) -> str:
    """``three octaves (×8)`` for a power of two, else ``×3``."""
    octaves = round(math.log2(factor))
    if 2.0**octaves == factor and 0 < abs(octaves) < len(OCTAVES):
        name = f"{OCTAVES[abs(octaves)]} octave{'s' if abs(octaves) > 1 else ''}"
        return f"{name} (×{exact(factor)})"
    return f"×{exact(factor)}"


def _pitch_words(pitch: float, ceiling: float) -> str:
    """The start of the sentence: the chirp's own pitch factor and why."""
    if pitch == 1:
        return "Played at the observed frequencies"
    text = f"Frequencies {'raised' if pitch > 1 else 'lowered'} {_interval(max(pitch, 1 / pitch))}"
    if pitch > 1:
        return text + " so the chirp is audible"
    return text + f" to keep the top of the chirp below {exact(ceiling, 'Hz')}"
