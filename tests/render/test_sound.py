"""The sound of the demo's sheets: which get a copy shifted up for small speakers and why, the
length given for the player, and the words that say how each sound was made (numbers as the
sheet's table prints them, the band note of heavy pairs)."""

from __future__ import annotations

import io
import pickle
import re
import wave

import numpy as np
import pytest

from factsheet.derive import derive_event
from factsheet.i18n import use_language
from factsheet.load import load_catalogue
from factsheet.notation import format_median
from factsheet.render.contexts import display_summary
from factsheet.render.sound import band_note, event_sound
from factsheet.resources import demo_dir

# Small loudspeakers play little below about 150 Hz (common practice, no single source).
FLOOR_HZ = 150.0


@pytest.fixture(scope="module")
def demo():
    catalogue = load_catalogue(demo_dir())
    items = {e.id: derive_event(e, catalogue.settings) for e in catalogue.events}
    return {i: (item, *event_sound(item)) for i, item in items.items()}


def frames(data: bytes) -> tuple[int, int, np.ndarray]:
    with wave.open(io.BytesIO(data), "rb") as wav:
        n, rate = wav.getnframes(), wav.getframerate()
        x = np.frombuffer(wav.readframes(n), dtype="<i2").astype(float)
    return n, rate, x


def table(item, key: str) -> str:
    """The median of a quantity exactly as the sheet's table prints it."""
    s = display_summary(item.quantities[key], item.settings.energy_units)
    return format_median(s.median, s.low, s.high, s.unit)


def test_shifted_copy_exactly_for_sounds_whose_final_tone_is_below_150_hz(demo):
    # The final tone is the ringdown (the merger frequency when there is none); all earlier
    # parts of the sound are lower, so a final tone below 150 Hz means a sound wholly below it.
    # In the demo: the two heavy pairs, MER34-006 (ringdown near 75 Hz) and MER34-012 (near
    # 127 Hz); the next lowest final tone is near 230 Hz.
    expected = set()
    for event_id, (item, _, _) in demo.items():
        q = item.quantities
        final = q.get("ringdown_frequency", q["isco_frequency"]).median
        if final < FLOOR_HZ:
            expected.add(event_id)
    shifted = {i for i, (_, audio, _) in demo.items() if audio.shifted_path}
    assert shifted == expected == {"MER34-006", "MER34-012"}


@pytest.mark.parametrize("event_id", ["MER34-006", "MER34-012"])
def test_shifted_copy_is_three_octaves_up_and_says_so(demo, event_id):
    # The band edge is 20 Hz: 20 × 8 = 160 Hz is the first octave step at or above 150 Hz.
    item, audio, files = demo[event_id]
    assert audio.shifted_path == f"events/{event_id}-shifted.wav"
    assert set(files) == {audio.path, audio.shifted_path}
    text = audio.shifted_description
    assert "shifted up three octaves (×8) so that small speakers can play it" in text
    assert "150 Hz" in text
    ringdown = item.quantities["ringdown_frequency"]
    played = format_median(ringdown.median * 8, ringdown.low * 8, ringdown.high * 8, "Hz")
    assert f"at {played} instead of {table(item, 'ringdown_frequency')}" in text
    # Measured in the files with numpy's FFT: the final tone of the copy is 8 times higher.
    peaks = []
    for path in (audio.path, audio.shifted_path):
        n, rate, x = frames(files[path])
        tail = x[n - int(0.45 * rate) : n - int(0.05 * rate)]
        spectrum = np.abs(np.fft.rfft(tail * np.hanning(tail.size), 16 * tail.size))
        peaks.append(np.argmax(spectrum) * rate / (16 * tail.size))
    assert peaks[1] == pytest.approx(8 * peaks[0], rel=0.01)
    assert peaks[0] == pytest.approx(ringdown.median, rel=0.01)


def test_duration_is_the_length_of_both_files(demo):
    for _, audio, files in demo.values():
        for path in filter(None, (audio.path, audio.shifted_path)):
            n, rate, _ = frames(files[path])
            assert audio.duration_s == pytest.approx(n / rate, abs=1e-9)
        assert 0.5 < audio.duration_s <= 6.0


def test_numbers_in_the_words_are_the_tables(demo):
    for item, audio, _ in demo.values():
        text = audio.description
        for key in ("ringdown_frequency", "ringdown_damping_time", "isco_frequency"):
            if key in item.quantities and (key != "isco_frequency" or not band_note(item)):
                assert table(item, key) in text, (item.event.id, key, text)
        # Every number followed by Hz or ms in the words is one the table prints, or ours.
        for number in re.findall(r"(\d[\d.]*) (?:Hz|ms)", text):
            ours = {"20", "4000"}  # the band edge (a setting) and the ceiling
            shown = {
                table(item, k).split()[0]
                for k in ("ringdown_frequency", "ringdown_damping_time", "isco_frequency")
                if k in item.quantities
            }
            assert number in ours | shown, (item.event.id, number, text)


def test_damping_time_and_isco_as_the_table_rounds_them(demo):
    item, audio, _ = demo["MER34-001"]
    assert f"to {table(item, 'isco_frequency')} at merger" in audio.description
    assert f"its {table(item, 'ringdown_damping_time')} damping time lengthened to 0.15 s" in (
        audio.description
    )
    assert table(item, "ringdown_damping_time").endswith(" ms")


def test_heavy_pair_with_isco_below_the_band_edge_says_only_merger_and_ringdown_are_in_band(demo):
    notes = {i: band_note(item) for i, (item, _, _) in demo.items()}
    below = {
        i
        for i, (item, _, _) in demo.items()
        if item.quantities["isco_frequency"].median < item.settings.low_frequency.value
    }
    assert below == {"MER34-006"} == {i for i, note in notes.items() if note}
    item, audio, _ = demo["MER34-006"]
    note = notes["MER34-006"]
    assert note.startswith("Only the merger and the ringdown are in the detectors' band")
    assert f"ends at {table(item, 'isco_frequency')}" in note and "band edge at 20 Hz" in note
    assert audio.description.startswith(note)
    assert "at merger" not in audio.description  # the sweep from the band edge is no inspiral


def test_pair_without_ringdown_fades_and_is_not_shifted(demo):
    item, audio, files = demo["MER34-002"]
    assert "ringdown_frequency" not in item.quantities
    assert audio.shifted_path is None and audio.shifted_description == ""
    assert "time compressed 29× to fit in 6 s" in audio.description
    assert "no ringdown tone is given for this event" in audio.description
    assert list(files) == [audio.path]


def test_same_event_same_bytes(demo):
    item, _, files = demo["MER34-006"]
    assert event_sound(item)[1] == files


def test_words_are_kept_for_the_readers_language(demo):
    # The sound is made once for every language: its words are kept messages whose value is
    # the English wording (the exports and the tests above read it) and which are shown, with
    # their numbers, in the language of the page; they survive a pickle round trip intact.
    _, audio, _ = demo["MER34-008"]
    assert "time compressed 9.1× to fit in 6 s" in audio.description
    back = pickle.loads(pickle.dumps(audio))
    assert back == audio and str(back.description) == str(audio.description)
    with use_language("es"):
        shown = str(back.description)
    # Spanish writes a decimal comma (CLDR's locale data, through Babel).
    assert "9,1×" in shown and "9.1×" not in shown
    note = band_note(demo["MER34-006"][0])
    assert isinstance(note, str) and f"{note}" == str.__str__(note)  # English where no language
