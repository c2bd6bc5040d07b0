"""Chirp audio: a short WAV per event synthesised from its observed frequency track.

The sound is one phase-continuous oscillator. Its frequency follows the leading-order inspiral
f(tau) (Peters & Mathews 1963, Phys. Rev. 131, 435; Peters 1964, Phys. Rev. 136, B1224;
docs/methods.md §10) from ``f_low`` up to ``f_merger``, glides in a short bridge to the ringdown
frequency and then holds it while the amplitude decays exponentially with the ringdown damping
time (docs/methods.md §7).
Long inspirals are compressed in time by one factor; all frequencies are multiplied by one power of
two when the chirp would otherwise be out of the audible range. Both factors and any lengthening of
the ringdown are stated in the returned description. The bytes are deterministic.
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
AUDIBLE_FLOOR = 30 * u.Hz  # merger and ringdown are raised above this (common practice)
AUDIBLE_CEILING = 4 * u.kHz  # the top of the chirp is lowered below this (and below 0.4 rate)
MIN_RINGDOWN_DAMPING = 0.15 * u.s  # an audible ringdown decays no faster than this
RINGDOWN_DAMPINGS = 4.0  # the ringdown segment lasts this many damping times (e^-4 ~ 2 %)
BRIDGE = 0.02 * u.s  # glide from merger to ringdown frequency, with an amplitude crossfade
FADE_IN, FADE_OUT = 0.02 * u.s, 0.05 * u.s
_OCTAVES = ("", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten")


@dataclass(frozen=True)
class Chirp:
    """A synthesised chirp: WAV bytes, its length and what was done to make it audible."""

    wav: bytes
    duration_s: float
    pitch_factor: float  # every frequency multiplied by this power of two (1: unshifted)
    time_factor: float  # the inspiral plays this many times faster than observed (1: real time)
    description: str  # one plain sentence for the page


def chirp_wav(
    chirp_mass_detector: u.Quantity,
    f_low: u.Quantity,
    f_merger: u.Quantity,
    f_ringdown: u.Quantity | None,
    tau_ringdown: u.Quantity | None,
    *,
    sample_rate: int = 22050,
    max_seconds: float = 6.0,
) -> Chirp:
    """Chirp WAV from the leading-order inspiral f(tau) (Peters 1964) and a damped ringdown tone.

    With no ringdown (``f_ringdown`` None, e.g. a neutron-star pair with no black-hole fit), the
    sound ends with a short fade at the merger frequency and the description says so.
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
    pitch = _pitch_factor(min(fm, frd), max(fm, frd), ceiling)
    tau0, taum = (time_to_merger(mc * u.Msun, f * u.Hz).to_value(u.s) for f in (f0, fm))
    speed = _time_factor(tau0 - taum, taurd, max_seconds)
    damping = max(taurd / speed, MIN_RINGDOWN_DAMPING.to_value(u.s))
    f_in, a_in = _inspiral_track(mc, tau0, taum, speed, int(sample_rate))
    f_rd, a_rd = _ringdown_track(fm, frd, damping, int(sample_rate))
    signal = _oscillate(
        np.concatenate([f_in, f_rd]) * pitch, np.concatenate([a_in, a_rd]), sample_rate
    )
    text = _describe(pitch, speed, (max_seconds, taurd, damping), (f0, fm, frd), ceiling)
    if not has_ringdown:
        text = text.split("; the inspiral")[0] + (
            f"; the inspiral rises from {_num(f0)} Hz to {_num(fm)} Hz (observed) and the sound "
            "then fades: no ringdown tone is given for this event."
        )
    return Chirp(_encode(signal, int(sample_rate)), signal.size / sample_rate, pitch, speed, text)


def _scalar(value, physical_type: str, name: str) -> float:
    """One positive, finite value of the named physical type, in solar masses, Hz or s."""
    number = require(value, physical_type, name)
    if number.ndim != 0 or not np.isfinite(number) or number <= 0:
        raise ValueError(f"{name}: expected one positive finite {physical_type}, got {value}")
    return float(number)


def _pitch_factor(f_bottom: float, f_top: float, ceiling: float) -> float:
    """Power of two lifting merger and ringdown above the floor; keeping the top below the ceiling
    takes precedence (it prevents aliasing)."""
    floor = AUDIBLE_FLOOR.to_value(u.Hz)
    k = max(0, math.ceil(math.log2(floor / f_bottom)))
    if f_top * 2.0**k > ceiling:
        k = math.floor(math.log2(ceiling / f_top))
    return 2.0**k


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


def _describe(pitch, speed, times, freqs, ceiling) -> str:
    """One plain sentence saying how the sound was made from the observed track."""
    max_seconds, tau_true, damping = times
    k = round(math.log2(pitch))
    octaves = f"{_OCTAVES[abs(k)]} octave{'s' if abs(k) > 1 else ''}" if abs(k) < 11 else "octaves"
    if k:
        text = f"Frequencies {'raised' if k > 0 else 'lowered'} {_num(2.0 ** abs(k))}× ({octaves})"
        text += (
            " so the chirp is audible"
            if k > 0
            else f" to keep the top of the chirp below {_num(ceiling)} Hz"
        )
    else:
        text = "Played at the observed frequencies"
    if speed > 1:
        text += f"{' and' if k else ','} time compressed {_num(speed)}× to fit in"
        text += f" {_num(max_seconds)} s"
    else:
        text += ", played in real time" if k else " and in real time"
    f0, fm, frd = (_num(f) for f in freqs)
    text += f"; the inspiral rises from {f0} Hz to {fm} Hz at merger and the"
    text += f" final tone is the ringdown at {frd} Hz (observed frequencies)"
    if damping > tau_true / speed * (1 + 1e-9):
        text += f", its {_num(tau_true * 1e3)} ms damping time lengthened to {_num(damping)} s"
        text += " so it can be heard"
    return text + "."


def _num(x: float) -> str:
    """A number to three significant figures, without exponent or trailing zeros."""
    return f"{float(f'{x:.3g}'):g}" if x < 1e6 else f"{x:.3g}"
