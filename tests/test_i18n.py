"""Labels, numbers and reference data in the reader's language: the label tables are kept
messages (English as values, the language in use when shown), numbers follow the language's
conventions, and the packaged reference data's labels reach the message catalogue.

The Spanish expectations need the compiled Spanish catalogue (factsheet/locale). Spanish number
conventions are checked against CLDR's data through Babel, a reference library outside the
project; the words against the catalogue's translations.
"""

from __future__ import annotations

import importlib.util
import io
import json
import pickle
from dataclasses import fields
from pathlib import Path

import pytest
from babel.numbers import format_decimal

from factsheet import labels
from factsheet.figures.words import count_words, interval_words
from factsheet.i18n import Text, use_language
from factsheet.load.reference import load_reference
from factsheet.model import DETECTOR
from factsheet.notation import (
    format_given,
    format_interval,
    format_median,
    format_value,
    how_often,
    percent,
)

ROOT = Path(__file__).resolve().parent.parent
NBSP = "\u00a0"


def _messages_tool():
    spec = importlib.util.spec_from_file_location("messages_tool", ROOT / "tools" / "messages.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def _label_texts() -> list[Text]:
    """Every kept message of the label tables."""
    found: list[Text] = []
    for value in vars(labels).values():
        items = value.values() if isinstance(value, dict) else [value]
        for item in items:
            if isinstance(item, labels.QuantityLabel | labels.WindowLabel):
                found += [getattr(item, f.name) for f in fields(item)]
            else:
                found.append(item)
    return [t for t in found if isinstance(t, Text)]


# --- kept messages --------------------------------------------------------------------------


def test_a_label_is_its_english_wording_and_pickles():
    name = labels.QUANTITIES["total_mass"].name
    assert isinstance(name, Text)
    assert name == "Total mass" and str(name) == "Total mass"
    again = pickle.loads(pickle.dumps(name))
    assert again == "Total mass" and isinstance(again, Text)
    with use_language("es"):
        assert str(again) == "Masa total"
    # the exports see English whatever the language in use
    with use_language("es"):
        assert json.dumps({"label": name}) == '{"label": "Total mass"}'


def test_label_tables_are_shown_in_the_language_in_use():
    with use_language("es"):
        assert str(labels.QUANTITIES["heavier_mass"].name) == "Masa del cuerpo más pesado m₁"
        assert f"{labels.GROUPS['bodies']}" == "Los dos cuerpos"
        assert str(labels.BANDS["pair_instability_gap"]) == "brecha de inestabilidad de pares"
        assert str(labels.CLASSES["BBH"]) == "Dos agujeros negros"
        assert str(labels.WINDOWS["kilonova_red"].name) == "kilonova infrarroja"
        assert str(labels.CHANGE_KINDS["retracted"]) == "retirado"
        assert str(labels.NOT_GIVEN) == "no indicado"
    assert str(labels.QUANTITIES["heavier_mass"].name) == "Mass of the heavier body m₁"


def test_symbols_are_not_messages():
    assert not isinstance(labels.QUANTITIES["heavier_mass"].short, Text)
    assert labels.QUANTITIES["effective_spin"].short == "χ_eff"


def test_every_label_has_a_spanish_translation():
    same_in_spanish = {"Ringdown", "neutrinos"}  # the trade's word, and the same word
    with use_language("es"):
        untranslated = {
            t for t in _label_texts() if t not in same_in_spanish and str(t) == str.__str__(t)
        }
    assert not untranslated


def test_in_prose_is_its_own_message_not_a_lower_cased_name():
    label = labels.QUANTITIES["total_mass"]
    assert label.in_prose == "total mass"  # English as before
    assert labels.QUANTITIES["remnant_spin"].in_prose == "remnant spin"
    assert labels.QUANTITIES["mass_ratio"].in_prose == "the mass ratio"
    with use_language("es"):
        assert str(label.in_prose) == "masa total"
        assert str(labels.parameter("mass_ratio")) == "el cociente de masas"
        assert str(labels.parameter("compactness")) == "la compacidad de la estrella de neutrones"


def test_detector_frame_label_is_one_message():
    english = labels.estimate_value("heavier.mass", DETECTOR)
    assert english == "m₁ (detector frame)" == labels.QUANTITIES["heavier_mass_detector"].short
    assert labels.estimate_value("heavier.mass", "source") == "m₁"
    total = labels.estimate_value("total.mass", DETECTOR)
    assert total == "Total mass (detector frame)"
    with use_language("es"):
        assert str(english) == "m₁ (sistema del detector)"
        assert str(total) == "Masa total (sistema del detector)"


def test_sentence_capitalises_in_the_language_shown():
    plain = labels.sentence("the two bodies merged")
    assert plain == "The two bodies merged" and not isinstance(plain, Text)
    kept = labels.sentence(labels.QUANTITIES["heavier_mass"].in_prose)
    assert kept == "The heavier body's mass"
    assert pickle.loads(pickle.dumps(kept)) == kept
    with use_language("es"):
        assert str(kept) == "La masa del cuerpo más pesado"


def test_embargo_words_are_one_message():
    words = labels.embargoed_until("2035-01-17 04:12")
    assert words == "embargoed until 2035-01-17 04:12 UTC"
    with use_language("es"):
        assert str(words) == "embargado hasta el 2035-01-17 04:12 UTC"


# --- numbers --------------------------------------------------------------------------------


def test_spanish_numbers_have_a_decimal_comma():
    # CLDR's Spanish decimal symbol, through Babel (a reference library, not ours)
    assert format_decimal(36.2, locale="es") == "36,2"
    with use_language("es"):
        assert format_interval(36.23, 33.1, 41.4, "solMass") == "36,2 +5,2 −3,1 M⊙"
        assert format_median(36.23, 33.1, 41.4, "solMass") == "36,2 M⊙"
        assert format_interval(36.2, 32.0, 41.0) == "36 +5 −4"  # whole numbers: no comma
        assert format_interval(5.36e47, 4.9e47, 5.9e47, "J") == "(5,4 +0,5 −0,5) × 10⁴⁷ J"
        assert format_interval(-0.0002, -0.0302, 0.0298) == "0,000 +0,030 −0,030"
        assert format_given(950, 550, 1400) == "950 +450 −400"
        assert format_value(0.00123) == "0,0012"
    # English unchanged
    assert format_interval(36.23, 33.1, 41.4, "solMass") == "36.2 +5.2 −3.1 M⊙"


def test_grouping_of_thousands():
    # Spanish groups with "." (CLDR through Babel) from five integer digits (CLDR's minimum
    # grouping digits for Spanish is 2, recalled from memory of CLDR's data; Babel does not
    # apply it, so only the symbol is checked against Babel)
    assert format_decimal(12000, locale="es") == "12.000"
    with use_language("es"):
        assert format_value(1234.5, "s") == "1200 s"
        assert format_value(12345) == "12.000"
    # English as the pages have always written it: no grouping below 10⁵
    assert format_value(1234.5, "s") == "1200 s"
    assert format_value(12345) == "12000"
    assert format_value(123456) == "1.2 × 10⁵"


def test_percent_keeps_its_no_break_space():
    assert percent(0.9) == f"90{NBSP}%"
    assert percent(0.683) == f"68.3{NBSP}%"
    with use_language("es"):
        assert percent(0.9) == f"90{NBSP}%"
        assert percent(0.683) == f"68,3{NBSP}%"


@pytest.mark.parametrize(
    ("per_year", "english", "spanish"),
    [
        (0, "never", "nunca"),
        (1 / 80, "about once in 80 years", "alrededor de una vez cada 80 años"),
        (0.4, "about once in 2.5 years", "alrededor de una vez cada 2,5 años"),
        (365.25, "about once a day", "alrededor de una vez al día"),
        (24.0, "about twice a month", "alrededor de dos veces al mes"),
        (1.0, "about once a year", "alrededor de una vez al año"),
        (2.0, "about twice a year", "alrededor de dos veces al año"),
        (5.0, "about 5 times a year", "alrededor de 5 veces al año"),
        (3 * 365.25, "about 3 times a day", "alrededor de 3 veces al día"),
    ],
)
def test_how_often_is_a_whole_phrase_in_each_language(per_year, english, spanish):
    assert how_often(per_year) == english
    with use_language("es"):
        assert how_often(per_year) == spanish


def test_alt_text_numbers_in_the_language_in_use():
    assert interval_words(36.23, 33.1, 41.4, "solMass") == "36.2 (33.1–41.4) M⊙"
    assert interval_words(0.05, -0.10, 0.20) == "0.05 (−0.10 to 0.20)"
    with use_language("es"):
        assert interval_words(36.23, 33.1, 41.4, "solMass") == "36,2 (33,1–41,4) M⊙"
        assert interval_words(0.05, -0.10, 0.20) == "0,05 (de −0,10 a 0,20)"


def test_count_words_by_plural_rule():
    assert count_words(1, "{n} event", "{n} events") == "1 event"
    assert count_words(3, "{n} event", "{n} events") == "3 events"
    assert count_words(0, "{n} event", "{n} events") == "0 events"
    assert count_words(3, "event") == "3 events"  # the older form, English only
    assert count_words(1, "event") == "1 event"


# --- packaged reference data ----------------------------------------------------------------


def test_packaged_comparison_labels_are_translated_editors_are_not():
    reference = load_reference({"comparisons": {"sun": {"label": "our star"}}})
    by_key = {c.key: c.label for c in reference.comparisons}
    assert isinstance(by_key["milky_way"], Text) and by_key["milky_way"] == "the Milky Way"
    assert not isinstance(by_key["sun"], Text)
    with use_language("es"):
        assert str(by_key["milky_way"]) == "la Vía Láctea"
        assert str(by_key["sun"]) == "our star"
    pickle.loads(pickle.dumps(reference))


def test_edges_are_named_in_the_language_in_use():
    edge = load_reference().mass_bands.neutron_star_max
    assert edge.label == "maximum neutron-star mass"
    with use_language("es"):
        assert str(edge.label) == "límite superior de masa de las estrellas de neutrones"


def test_reference_data_labels_are_extracted():
    tool = _messages_tool()
    data = (ROOT / "factsheet" / "data" / "comparisons.yaml").read_bytes()
    found = list(tool.extract_data_labels(io.BytesIO(data), {}, [], {}))
    texts = [message for _, _, message, _ in found]
    reference = load_reference()
    assert texts == [str.__str__(c.label) for c in reference.comparisons]
    lines = data.decode().splitlines()
    for lineno, _, message, _ in found:
        assert message in lines[lineno - 1]
    assert tool.template().get("the Milky Way") is not None
