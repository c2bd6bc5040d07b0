"""Chirp audio: a short WAV per event synthesised from its observed frequency track.

The sound is one phase-continuous oscillator. Its frequency follows the leading-order inspiral
f(tau) (Peters & Mathews 1963, Phys. Rev. 131, 435; Peters 1964, Phys. Rev. 136, B1224;
docs/methods.md §10) from ``f_low`` up to ``f_merger``, glides in a short bridge to the ringdown
frequency and then holds it while the amplitude decays exponentially with the ringdown damping
time (docs/methods.md §7).
Long inspirals are compressed in time by one factor; all frequencies are lowered by a power of two
when the top of the chirp would otherwise pass the ceiling, and are the observed ones otherwise.
A :class:`Chirp` records both factors and any lengthening of the ringdown, so that the page can
say how the sound was made (``factsheet.render.sound`` writes those words). The bytes are
deterministic.

Small loudspeakers (phones, laptops) play little below about 150 Hz (common practice; no single
source). A sound whose final tone, the ringdown, lies below that lies wholly below it, since
every earlier part of the sound is lower; :func:`speaker_shift` gives the whole octaves that lift
such a sound, from its first frequency on, above 150 Hz, and ``chirp_wav(..., pitch_factor=)``
makes the shifted copy: the same sound, same length, every frequency multiplied by the factor.
"""

from __future__ import annotations

import io
import math
import wave
from dataclasses import dataclass

import astropy.units as u
import numpy as np

from factsheet.physics._checks import require
from factsheet.physics.inspiral import frequency_at_time, time_to_merger

FULL_SCALE = 0.8  # peak amplitude as a fraction of 16-bit full scale
AUDIBLE_CEILING = 4 * u.kHz  # the top of the chirp is lowered below this (and below 0.4 rate)
# The lowest standard sample rate whose 0.4 × rate (4410 Hz, safely below the Nyquist
# frequency) stays above the audible ceiling: every tone the sound plays is kept, and the file
# is half the size of one at 22 050 Hz.
SAMPLE_RATE = 11025
SMALL_SPEAKER_FLOOR = 150 * u.Hz  # small loudspeakers play little below this (common practice)
MIN_RINGDOWN_DAMPING = 0.15 * u.s  # an audible ringdown decays no faster than this
RINGDOWN_DAMPINGS = 4.0  # the ringdown segment lasts this many damping times (e^-4 ~ 2 %)
BRIDGE = 0.02 * u.s  # glide from merger to ringdown frequency, with an amplitude crossfade
FADE_IN, FADE_OUT = 0.02 * u.s, 0.05 * u.s


@dataclass(frozen=True)
class Chirp:
    """A synthesised chirp: WAV bytes, its length and what was done to make it audible."""

    wav: bytes
    duration_s: float
    pitch_factor: float  # every frequency multiplied by this factor (1: observed frequencies)
    time_factor: float  # the inspiral plays this many times faster than observed (1: real time)
    damping_s: float  # the ringdown's played damping time (the fade's, with no ringdown)
    lengthened: bool  # the ringdown decays more slowly than observed so that it can be heard
    has_ringdown: bool
    max_seconds: float  # the length the chirp was fitted into
    ceiling_hz: float  # the top of the chirp is kept below this


def chirp_wav(
    chirp_mass_detector: u.Quantity,
    f_low: u.Quantity,
    f_merger: u.Quantity,
    f_ringdown: u.Quantity | None,
    tau_ringdown: u.Quantity | None,
    *,
    sample_rate: int = SAMPLE_RATE,
    max_seconds: float = 6.0,
    pitch_factor: float | None = None,
) -> Chirp:
    """Chirp WAV from the leading-order inspiral f(tau) (Peters 1964) and a damped ringdown tone.

    With no ringdown (``f_ringdown`` None, e.g. a neutron-star pair with no black-hole fit), the
    sound ends with a short fade at the merger frequency. ``pitch_factor`` multiplies every
    frequency by that factor instead of the automatic one (1, or the power of two that keeps the
    top below the ceiling; see :func:`speaker_shift`); the top must then stay below the ceiling.
    """
    mc = _scalar(chirp_mass_detector, "mass", "chirp_mass_detector")
    f0, fm = _scalar(f_low, "frequency", "f_low"), _scalar(f_merger, "frequency", "f_merger")
    has_ringdown = f_ringdown is not None and tau_ringdown is not None
    frd = _scalar(f_ringdown, "frequency", "f_ringdown") if has_ringdown else fm
    taurd = (
        _scalar(tau_ringdown, "time", "tau_ringdown")
        if has_ringdown
        else MIN_RINGDOWN_DAMPING.to_value(u.s) / 3
    )
    if f0 >= fm:
        raise ValueError(f"f_low ({f0:g} Hz) must lie below f_merger ({fm:g} Hz)")
    if int(sample_rate) != sample_rate or sample_rate < 8000:
        raise ValueError(f"sample_rate: expected an integer of at least 8000, got {sample_rate}")
    min_seconds = (RINGDOWN_DAMPINGS * MIN_RINGDOWN_DAMPING + BRIDGE).to_value(u.s) + 0.2
    if not max_seconds >= min_seconds:
        raise ValueError(f"max_seconds: expected at least {min_seconds:g}, got {max_seconds}")
    ceiling = min(AUDIBLE_CEILING.to_value(u.Hz), 0.4 * sample_rate)
    if pitch_factor is None:
        pitch = _pitch_factor(max(fm, frd), ceiling)
    elif not (pitch_factor > 0 and max(fm, frd) * pitch_factor <= ceiling):
        message = f"expected a factor keeping {max(fm, frd):g} Hz below {ceiling:g} Hz"
        raise ValueError(f"pitch_factor: {message}, got {pitch_factor}")
    else:
        pitch = float(pitch_factor)
    tau0, taum = (time_to_merger(mc * u.Msun, f * u.Hz).to_value(u.s) for f in (f0, fm))
    speed = _time_factor(tau0 - taum, taurd, max_seconds)
    damping = max(taurd / speed, MIN_RINGDOWN_DAMPING.to_value(u.s))
    f_in, a_in = _inspiral_track(mc, tau0, taum, speed, int(sample_rate))
    f_rd, a_rd = _ringdown_track(fm, frd, damping, int(sample_rate))
    signal = _oscillate(
        np.concatenate([f_in, f_rd]) * pitch, np.concatenate([a_in, a_rd]), sample_rate
    )
    lengthened = damping > taurd / speed * (1 + 1e-9)
    return Chirp(
        _encode(signal, int(sample_rate)),
        signal.size / sample_rate,
        pitch,
        speed,
        damping,
        lengthened and has_ringdown,
        has_ringdown,
        float(max_seconds),
        ceiling,
    )


def speaker_shift(
    f_low: u.Quantity, f_final: u.Quantity, played: float = 1.0, *, sample_rate: int = SAMPLE_RATE
) -> float | None:
    """The factor (a power of two) of a copy small speakers can play, or None if none is needed.

    A sound is shifted when its final tone (``f_final``, the ringdown, or the merger frequency
    when there is none), as played (times ``played``, the chirp's own pitch factor), lies below
    :data:`SMALL_SPEAKER_FLOOR`: then all of it does. The factor, relative to the observed
    frequencies, is the smallest whole number of octaves that lifts the sound's first frequency
    ``f_low`` to the floor, lowered if needed to keep the final tone below the ceiling.
    """
    f0 = _scalar(f_low, "frequency", "f_low")
    top = _scalar(f_final, "frequency", "f_final")
    floor = SMALL_SPEAKER_FLOOR.to_value(u.Hz)
    if top * played >= floor:
        return None
    octaves = math.ceil(math.log2(floor / f0) - 1e-12)
    ceiling = min(AUDIBLE_CEILING.to_value(u.Hz), 0.4 * sample_rate)
    octaves = min(octaves, math.floor(math.log2(ceiling / top)))
    factor = 2.0**octaves
    return factor if factor > played else None


def _scalar(value, physical_type: str, name: str) -> float:
    """One positive, finite value of the named physical type, in solar masses, Hz or s."""
    number = require(value, physical_type, name)
    if number.ndim != 0 or not np.isfinite(number) or number <= 0:
        raise ValueError(f"{name}: expected one positive finite {physical_type}, got {value}")
    return float(number)


def _pitch_factor(f_top: float, ceiling: float) -> float:
    """1, or the power of two that lowers the top of the chirp below the ceiling (which prevents
    aliasing): the chirp plays the observed frequencies whenever it can."""
    return 2.0 ** min(0, math.floor(math.log2(ceiling / f_top)))


def _time_factor(inspiral_s: float, tau_ringdown: float, max_seconds: float) -> float:
    """Smallest compression (rounded up to two significant figures) that fits max_seconds."""
    shortest_ringdown = (RINGDOWN_DAMPINGS * MIN_RINGDOWN_DAMPING + BRIDGE).to_value(u.s)
    needed = max(
        inspiral_s / (max_seconds - shortest_ringdown),
        (inspiral_s + RINGDOWN_DAMPINGS * tau_ringdown) / (max_seconds - BRIDGE.to_value(u.s)),
    )
    if needed <= 1:
        return 1.0
    step = 10.0 ** (math.floor(math.log10(needed)) - 1)
    return math.ceil(needed / step - 1e-9) * step


def _inspiral_track(mc: float, tau0: float, taum: float, speed: float, rate: int):
    """Observed frequency f(tau) and amplitude (f/f_merger)^(2/3) at each compressed sample."""
    n = max(1, math.floor((tau0 - taum) / speed * rate))
    tau = np.maximum(tau0 - speed * np.arange(n) / rate, taum)
    freq = frequency_at_time(mc * u.Msun, tau * u.s).to_value(u.Hz)
    f_merger = frequency_at_time(mc * u.Msun, taum * u.s).to_value(u.Hz)
    return freq, (freq / f_merger) ** (2 / 3)


def _ringdown_track(f_merger: float, f_ringdown: float, damping: float, rate: int):
    """Glide and crossfade from the merger into a tone at f_ringdown decaying as exp(-t/damping)."""
    bridge = BRIDGE.to_value(u.s)
    t = np.arange(math.floor((RINGDOWN_DAMPINGS * damping + bridge) * rate)) / rate
    w = np.where(t < bridge, 0.5 - 0.5 * np.cos(np.pi * np.minimum(t / bridge, 1)), 1.0)
    return (1 - w) * f_merger + w * f_ringdown, (1 - w) + w * np.exp(-t / damping)


def _oscillate(freq: np.ndarray, amp: np.ndarray, rate: int) -> np.ndarray:
    """Samples of amp * sin(phase), the phase integrated from freq, with fades at both ends."""
    phase = 2 * np.pi * np.cumsum(freq) / rate
    envelope = np.ones(freq.size)
    n_in, n_out = (math.floor(d.to_value(u.s) * rate) for d in (FADE_IN, FADE_OUT))
    envelope[:n_in] = 0.5 - 0.5 * np.cos(np.pi * np.arange(n_in) / n_in)
    envelope[freq.size - n_out :] *= 0.5 + 0.5 * np.cos(np.pi * (np.arange(n_out) + 1) / n_out)
    return FULL_SCALE * amp / amp.max() * envelope * np.sin(phase)


def _encode(signal: np.ndarray, rate: int) -> bytes:
    """16-bit mono PCM WAV bytes through the stdlib wave module (no timestamps, deterministic)."""
    buffer = io.BytesIO()
    with wave.open(buffer, "wb") as out:
        out.setnchannels(1)
        out.setsampwidth(2)
        out.setframerate(rate)
        out.writeframes(np.round(signal * 32767).astype("<i2").tobytes())
    return buffer.getvalue()
