"""Chirp audio: WAV format, determinism, the frequency track against the leading-order inspiral
f(tau) of Peters & Mathews 1963 (Phys. Rev. 131, 435) and Peters 1964 (Phys. Rev. 136, B1224),
docs/methods.md §10, the ringdown tone, the shift below the ceiling and the copy shifted up for
small speakers (measured in the WAV with numpy's FFT, independently of the synthesis)."""

import io
import itertools
import math
import wave

import astropy.units as u
import numpy as np
import pytest
from astropy.constants import G, c

from factsheet.figures.audio import (
    AUDIBLE_CEILING,
    SAMPLE_RATE,
    SMALL_SPEAKER_FLOOR,
    chirp_wav,
    speaker_shift,
)

# Invented binaries in the detector frame. f_merger is the Schwarzschild ISCO frequency of the
# detector-frame total mass; ringdown values are of the size the Berti, Cardoso & Will 2006 fits
# (PRD 73, 064030) give for such remnants (j ~ 0.7), approximately.
BBH = dict(chirp_mass_detector=28 * u.Msun, f_low=20 * u.Hz, f_merger=67.6 * u.Hz,
           f_ringdown=250 * u.Hz, tau_ringdown=4.1 * u.ms)  # fmt: skip
BNS = dict(chirp_mass_detector=1.2 * u.Msun, f_low=20 * u.Hz, f_merger=1556 * u.Hz,
           f_ringdown=6500 * u.Hz, tau_ringdown=0.3 * u.ms)  # fmt: skip
HEAVY = dict(chirp_mass_detector=150 * u.Msun, f_low=8 * u.Hz, f_merger=12.6 * u.Hz,
             f_ringdown=52 * u.Hz, tau_ringdown=20 * u.ms)  # fmt: skip
# The chirp plays the observed frequencies; the heavy pair's few inspiral cycles are checked two
# octaves up, where there are enough of them.
CASES = {"bbh": BBH, "bns": BNS, "heavy": {**HEAVY, "pitch_factor": 4.0}}


def read(chirp):
    """Parameters and samples (as fractions of full scale) of a chirp's WAV bytes."""
    with wave.open(io.BytesIO(chirp.wav), "rb") as wav:
        params = wav.getparams()
        frames = wav.readframes(params.nframes)
    return params, np.frombuffer(frames, dtype="<i2").astype(float) / 32767


def peters_frequency(chirp_mass, tau_s):
    """f(tau) = (1/pi) [5/(256 tau)]^(3/8) T_c^(-5/8), T_c = G Mc/c^3.

    Peters 1964; docs/methods.md §10.
    """
    t_c = (G * chirp_mass / c**3).to_value(u.s)
    return (5 / (256 * tau_s)) ** (3 / 8) * t_c ** (-5 / 8) / np.pi


def peters_time(chirp_mass, f_hz):
    """tau(f) = (5/256) T_c^(-5/3) (pi f)^(-8/3) (Peters 1964; docs/methods.md §10)."""
    t_c = (G * chirp_mass / c**3).to_value(u.s)
    return 5 / 256 * t_c ** (-5 / 3) * (np.pi * f_hz) ** (-8 / 3)


def peters_cycles(chirp_mass, f1, f2):
    """N = T_c^(-5/3) / (32 pi^(8/3)) (f1^(-5/3) - f2^(-5/3)).

    Peters 1964; docs/methods.md §10.
    """
    t_c = (G * chirp_mass / c**3).to_value(u.s)
    return t_c ** (-5 / 3) / (32 * np.pi ** (8 / 3)) * (f1 ** (-5 / 3) - f2 ** (-5 / 3))


def upward_zero_crossings(x, rate):
    """Times (s) of the upward zero crossings of x, by linear interpolation between samples."""
    i = np.flatnonzero((x[:-1] < 0) & (x[1:] >= 0))
    return (i + x[i] / (x[i] - x[i + 1])) / rate


def peak_frequency(x, rate, start_s, stop_s):
    """Dominant frequency of x in [start, stop) s: Hann window, 16× zero padding, parabolic peak."""
    seg = x[int(start_s * rate) : int(stop_s * rate)]
    spectrum = np.abs(np.fft.rfft(seg * np.hanning(seg.size), 16 * seg.size))
    k = int(np.argmax(spectrum[1:-1])) + 1
    a, b, d = np.log(spectrum[k - 1 : k + 2])
    return (k + 0.5 * (a - d) / (a - 2 * b + d)) * rate / (16 * seg.size)


def inspiral_seconds(case, chirp):
    """Played length of the inspiral, from the closed-form tau(f) and the stated time factor."""
    mc, f0, fm = (case[k] for k in ("chirp_mass_detector", "f_low", "f_merger"))
    return (peters_time(mc, f0.to_value(u.Hz)) - peters_time(mc, fm.to_value(u.Hz))) / (
        chirp.time_factor
    )


@pytest.mark.parametrize("name", CASES)
def test_wav_is_16_bit_mono_pcm_within_limits(name):
    chirp = chirp_wav(**CASES[name])
    params, _ = read(chirp)
    assert (params.nchannels, params.sampwidth, params.framerate) == (1, 2, SAMPLE_RATE)
    assert AUDIBLE_CEILING.to_value(u.Hz) <= SAMPLE_RATE * 0.4  # the highest tone is kept
    assert params.nframes / params.framerate == pytest.approx(chirp.duration_s)
    assert 0.5 < chirp.duration_s <= 6.0
    assert len(chirp.wav) <= 300_000


def test_same_input_gives_identical_bytes():
    assert chirp_wav(**BNS).wav == chirp_wav(**BNS).wav
    assert chirp_wav(**BBH) == chirp_wav(**BBH)


@pytest.mark.parametrize("name", CASES)
def test_inspiral_follows_peters_f_of_tau(name):
    # Leading-order f(tau) and cycles: Peters & Mathews 1963 (Phys. Rev. 131, 435), Peters 1964
    # (Phys. Rev. 136, B1224), docs/methods.md §10, written out here with G, M_sun, c from
    # astropy (CODATA 2018, IAU 2015). Played time t maps to tau = tau(f_low) - time_factor * t.
    case, chirp = CASES[name], chirp_wav(**CASES[name])
    _, x = read(chirp)
    t = upward_zero_crossings(x, SAMPLE_RATE)
    t = t[t < inspiral_seconds(case, chirp)]  # whole periods before the merger
    tau0 = peters_time(case["chirp_mass_detector"], case["f_low"].to_value(u.Hz))
    f = peters_frequency(case["chirp_mass_detector"], tau0 - chirp.time_factor * t)
    # Between successive crossings the sound completes one cycle; the played cycles are
    # pitch/time_factor times the observed cycles N(f_i, f_i+1) of the same Peters formulas.
    played = peters_cycles(case["chirp_mass_detector"], f[:-1], f[1:]) * chirp.pitch_factor
    assert t.size >= 10
    np.testing.assert_allclose(played / chirp.time_factor, 1.0, rtol=0.005)


@pytest.mark.parametrize("name", CASES)
def test_dominant_frequency_rises_through_the_inspiral(name):
    case, chirp = CASES[name], chirp_wav(**CASES[name])
    _, x = read(chirp)
    edges = np.linspace(0, inspiral_seconds(case, chirp), 6)
    peaks = [peak_frequency(x, SAMPLE_RATE, a, b) for a, b in itertools.pairwise(edges)]
    assert all(later >= 0.98 * earlier for earlier, later in itertools.pairwise(peaks))
    assert peaks[-1] > 1.2 * peaks[0]


@pytest.mark.parametrize("name", CASES)
def test_final_tone_is_the_shifted_ringdown_frequency(name):
    case, chirp = CASES[name], chirp_wav(**CASES[name])
    _, x = read(chirp)
    end = chirp.duration_s
    played = case["f_ringdown"].to_value(u.Hz) * chirp.pitch_factor
    assert peak_frequency(x, SAMPLE_RATE, end - 0.45, end - 0.05) == pytest.approx(played, rel=0.01)


def test_millisecond_ringdown_is_lengthened_to_an_audible_decay():
    # rms over equal windows 0.1 s apart falls by exp(-0.1 s / 0.15 s) for the lengthened decay.
    chirp = chirp_wav(**BBH)
    _, x = read(chirp)
    end, rate = chirp.duration_s, SAMPLE_RATE
    rms = [
        np.sqrt(np.mean(x[int(a * rate) : int((a + 0.1) * rate)] ** 2))
        for a in (end - 0.35, end - 0.45)
    ]
    assert rms[0] / rms[1] == pytest.approx(math.exp(-0.1 / 0.15), rel=0.03)
    assert chirp.lengthened and chirp.damping_s == pytest.approx(0.15)
    assert end - 0.6 > inspiral_seconds(BBH, chirp)


@pytest.mark.parametrize("name", CASES)
def test_no_clipping_and_no_click(name):
    case, chirp = CASES[name], chirp_wav(**CASES[name])
    _, x = read(chirp)
    assert np.abs(x).max() == pytest.approx(0.8, rel=0.02)
    # A sinusoid of amplitude A at f moves at most 2 pi f A / rate per sample; a click would not.
    f_top = max(case["f_merger"], case["f_ringdown"]).to_value(u.Hz) * chirp.pitch_factor
    assert np.abs(np.diff(x)).max() <= 1.05 * 2 * np.pi * f_top / SAMPLE_RATE * 0.8
    assert abs(x[0]) < 1e-3 and abs(x[-1]) < 1e-3


def test_black_hole_pair_plays_observed_frequencies_in_real_time():
    chirp = chirp_wav(**BBH)
    assert (chirp.pitch_factor, chirp.time_factor) == (1.0, 1.0)
    assert chirp.has_ringdown and chirp.max_seconds == 6.0


def test_heavy_pair_plays_observed_frequencies_however_low():
    # The chirp itself is never raised: the copy for small speakers is a second file.
    chirp = chirp_wav(**HEAVY)
    assert chirp.pitch_factor == 1.0
    _, x = read(chirp)
    end = chirp.duration_s
    assert peak_frequency(x, SAMPLE_RATE, end - 0.45, end - 0.05) == pytest.approx(52, rel=0.01)


def test_neutron_star_pair_is_compressed_and_lowered_below_4_khz():
    chirp = chirp_wav(**BNS)
    true_length = peters_time(BNS["chirp_mass_detector"], 20.0)  # about 155 s in band
    assert chirp.duration_s <= 6.0
    assert chirp.time_factor >= true_length / 6.0
    assert chirp.pitch_factor == 0.5 and 6500 * chirp.pitch_factor <= 4000
    assert chirp.ceiling_hz == 4000
    assert chirp_wav(**BNS, max_seconds=3.0).duration_s <= 3.0


# Small loudspeakers roll off below about 150 Hz (common practice, no single source). A sound is
# shifted when its final tone lies below that; the factor is the smallest number of octaves that
# lifts the start of the sound, f_low, above it.
@pytest.mark.parametrize(
    ("f_low", "f_final", "played", "factor"),
    [
        (20, 75, 1.0, 8.0),  # 20 Hz × 8 = 160 Hz, the first octave step at or above 150 Hz
        (20, 149, 1.0, 8.0),
        (20, 150, 1.0, None),  # a final tone at 150 Hz is in the speakers' range already
        (20, 250, 1.0, None),
        (8, 52, 1.0, 32.0),  # 8 Hz × 32 = 256 Hz; 8 Hz × 16 = 128 Hz is not enough
        (10, 140, 1.0, 16.0),
        (5, 140, 1.0, 16.0),  # ×32 would put the final tone at 4480 Hz, above the 4 kHz ceiling
        (20, 100, 2.0, None),  # already played an octave up, at 200 Hz
    ],
)
def test_speaker_shift_rule(f_low, f_final, played, factor):
    assert speaker_shift(f_low * u.Hz, f_final * u.Hz, played) == factor
    if factor:
        assert f_low * factor >= SMALL_SPEAKER_FLOOR.to_value(u.Hz) or f_final * factor * 2 > 4000
        assert f_final * factor <= 4000


@pytest.mark.parametrize("case", [BBH, HEAVY], ids=["bbh", "heavy"])
def test_shifted_copy_is_the_same_sound_with_every_frequency_times_the_factor(case):
    # Dominant frequencies measured with numpy's FFT in both WAV files, independently of how
    # they were synthesised: the final tone (the loudest, longest-held part), and the number of
    # cycles (upward zero crossings) of the whole file, which counts the inspiral too.
    factor = 8.0
    plain, shifted = chirp_wav(**case), chirp_wav(**case, pitch_factor=factor)
    (p1, x1), (p2, x2) = read(plain), read(shifted)
    assert p1.nframes == p2.nframes and shifted.duration_s == plain.duration_s
    assert shifted.pitch_factor == factor and shifted.time_factor == plain.time_factor
    end = plain.duration_s
    tone = [peak_frequency(x, SAMPLE_RATE, end - 0.45, end - 0.05) for x in (x1, x2)]
    assert tone[1] == pytest.approx(factor * tone[0], rel=0.01)
    assert tone[0] == pytest.approx(case["f_ringdown"].to_value(u.Hz), rel=0.01)
    crossings = [upward_zero_crossings(x, SAMPLE_RATE).size for x in (x1, x2)]
    assert crossings[1] == pytest.approx(factor * crossings[0], rel=0.02)


def test_shift_that_would_pass_the_ceiling_is_refused():
    with pytest.raises(ValueError, match="pitch_factor"):
        chirp_wav(**BBH, pitch_factor=32.0)  # 250 Hz × 32 = 8 kHz


@pytest.mark.parametrize(
    ("name", "bad"),
    [
        ("chirp_mass_detector", 28 * u.km),
        ("f_low", 20 * u.s),
        ("f_merger", 67.6),
        ("f_ringdown", 250 * u.Msun),
        ("tau_ringdown", 4 * u.Hz),
    ],
)
def test_wrong_units_raise_naming_the_argument(name, bad):
    with pytest.raises(u.UnitsError, match=name):
        chirp_wav(**{**BBH, name: bad})


@pytest.mark.parametrize(
    "change",
    [
        {"f_low": 80 * u.Hz},
        {"tau_ringdown": -1 * u.ms},
        {"chirp_mass_detector": [28, 30] * u.Msun},
        {"max_seconds": 0.5},
        {"sample_rate": 4000},
        {"pitch_factor": 0.0},
    ],
)
def test_impossible_inputs_raise_value_error(change):
    with pytest.raises(ValueError):
        chirp_wav(**{**BBH, **change})
