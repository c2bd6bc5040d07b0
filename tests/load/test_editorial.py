"""The editors' texts by language and the site's languages: what the loader accepts, what it
refuses at which line and key, what it warns of, and how the texts travel (pickling, the build
cache's key).

Language codes are checked against Babel's locale data (CLDR) and the site's languages against
the translations factsheet ships (``factsheet.i18n.available()``)."""

from __future__ import annotations

import pickle
import re
from pathlib import Path

import pytest
from helpers import VALID_EVENT

from factsheet import i18n
from factsheet.cache import content_key, event_key
from factsheet.errors import InputError
from factsheet.i18n import Editorial, use_language
from factsheet.load import load_catalogue
from factsheet.resources import demo_dir

BILINGUAL = "title: {}\nlanguages: [en, es]\n".format("A season")
SUMMARY = "summary: A *test* event.\n"  # line 18 of VALID_EVENT

TEXTS = """\
title:
  en: A test pair
  es: Un par de prueba
summary:
  en: A *test* event.
  es: Un evento *de prueba*.
caveats:
  - A plain caveat.
  - en: A caveat in two languages.
    es: Un aviso en dos idiomas.
internal_notes:
  en: Check site B1.
  es: Revisar el emplazamiento B1.
"""


def event_with(block: str) -> str:
    """The valid event with its title and summary replaced by ``block`` (from line 17 on)."""
    text = VALID_EVENT.replace("title: A test pair\n", "").replace(SUMMARY, block)
    assert text.splitlines()[16] == block.splitlines()[0]
    return text


def problems_of(folder: Path) -> list[str]:
    with pytest.raises(InputError) as info:
        load_catalogue(folder)
    return [str(p) for p in info.value.problems]


# -- accepted ----------------------------------------------------------------------------------


def test_versions_by_language_are_editorial_texts(catalogue):
    cat = load_catalogue(catalogue({"ev.yaml": event_with(TEXTS), "catalogue.yaml": BILINGUAL}))
    (event,) = cat.events
    assert cat.warnings == ()
    assert isinstance(event.title, Editorial) and isinstance(event.summary, Editorial)
    assert all(isinstance(c, Editorial) for c in event.caveats)
    assert isinstance(event.internal_notes, Editorial)
    # the str value is the original (the first version given): what exports and tests see
    assert event.title == "A test pair" and event.summary == "A *test* event."
    assert event.caveats == ("A plain caveat.", "A caveat in two languages.")
    assert event.title.versions == {"en": "A test pair", "es": "Un par de prueba"}
    with use_language("es"):
        assert str(event.title) == "Un par de prueba"
        assert f"{event.summary}" == "Un evento *de prueba*."
        assert [str(c) for c in event.caveats] == ["A plain caveat.", "Un aviso en dos idiomas."]
        assert str(event.internal_notes) == "Revisar el emplazamiento B1."
        # a plain text is written in the site's first language: only other languages say so
        assert event.caveats[0].missing_in("es", "en")
        assert not event.caveats[0].missing_in("en", "en")
        assert not event.summary.missing_in("es", "en")
    assert str(event.title) == "A test pair"


def test_plain_texts_are_editorial_too(catalogue):
    cat = load_catalogue(catalogue({"ev.yaml": VALID_EVENT + "caveats: [One.]\n"}))
    (event,) = cat.events
    assert event.title == Editorial("A test pair") and event.title.versions == {"": "A test pair"}
    assert event.summary.versions == {"": "A *test* event."}
    assert event.caveats == ("One.",) and isinstance(event.caveats[0], Editorial)
    with use_language("es"):  # no Spanish version: the original, in every language
        assert str(event.title) == "A test pair"
    untitled = VALID_EVENT.replace("title: A test pair\n", "")
    (event,) = load_catalogue(catalogue({"ev.yaml": untitled})).events
    assert isinstance(event.title, Editorial) and event.title == "TEST-1"  # the id, by default


def test_a_region_and_the_hyphenated_form(catalogue):
    block = "summary:\n  en: Hello.\n  pt-BR: Olá.\n  es_419: Hola.\n"
    cat = load_catalogue(catalogue({"ev.yaml": event_with("title: T\n" + block)}))
    (event,) = cat.events
    assert list(event.summary.versions) == ["en", "pt_BR", "es_419"]


def test_a_version_keeps_its_lines(catalogue):
    block = "summary:\n  en: |\n    one\n\n    two\n  es: |\n    uno\n\n    dos\n"
    (event,) = load_catalogue(catalogue({"ev.yaml": event_with("title: T\n" + block)})).events
    assert event.summary == "one\n\ntwo" and event.summary.versions["es"] == "uno\n\ndos"


# -- refused, at the line and key of the version -----------------------------------------------


@pytest.mark.parametrize(
    ("block", "line", "key", "words"),
    [
        ("summary:\n  en: A\n  EN: B\n", 19, "summary.EN", "write 'en'"),
        ("summary:\n  en: A\n  xx: B\n", 19, "summary.xx", "unknown language code 'xx'"),
        ("summary:\n  en: A\n  und: B\n", 19, "summary.und", "unknown language code"),
        ("summary:\n  english: A\n", 18, "summary.english", "not a language code"),
        ("summary:\n  1: A\n", 18, "summary.1", "expected a language code"),
        ("summary:\n  pt_BR: A\n  pt-BR: B\n", 19, "summary.pt-BR", "a second version in pt_BR"),
        ("summary:\n  en: A\n  es:\n", 19, "summary.es", "empty"),
        ("summary:\n  en: A\n  es: '  '\n", 19, "summary.es", "must not be empty"),
        ("summary:\n  en: A\n  es: [a, b]\n", 19, "summary.es", "expected text"),
        ("summary: {}\n", 17, "summary", "one per language"),
        ("summary: [a, b]\n", 17, "summary", "one per language"),
        ("title:\n  en: A\n  es: |\n    two\n    lines\n", 19, "title.es", "one line"),
        ("title:\n  en: A\n  es: " + "t" * 201 + "\n", 19, "title.es", "at most 200"),
        ("caveats: {en: a}\n", 17, "caveats", "expected a list of Markdown texts"),
        ("caveats:\n  - fine\n  - en: a\n    sp: b\n", 20, "caveats[1].sp", "unknown language"),
        ("internal_notes:\n  en: a\n  ES: b\n", 19, "internal_notes.ES", "write 'es'"),
    ],
)
def test_a_bad_version_names_file_line_and_key(catalogue, block, line, key, words):
    text = event_with(block if block.startswith("title") else "title: T\n" + block)
    if not block.startswith("title"):
        line += 1  # the title line above the block
    folder = catalogue({"ev.yaml": text})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'ev.yaml'}:{line}: {key}: "), problem
    assert words in problem


def test_every_bad_version_is_reported(catalogue):
    block = "title: T\nsummary:\n  EN: A\n  xx: B\ncaveats:\n  - {en: a, zz: b}\n"
    folder = catalogue({"ev.yaml": event_with(block)})
    keys = [re.search(r":\d+: (\S+):", p).group(1) for p in problems_of(folder)]
    assert keys == ["summary.EN", "summary.xx", "caveats[0].zz"]


# -- warned of ---------------------------------------------------------------------------------


def warnings_of(catalogue, block: str, settings: str = BILINGUAL) -> list[str]:
    folder = catalogue({"ev.yaml": event_with("title: T\n" + block), "catalogue.yaml": settings})
    return [str(w) for w in load_catalogue(folder).warnings]


def test_a_version_no_page_shows_is_a_warning(catalogue):
    (warning,) = warnings_of(catalogue, "summary:\n  en: A\n  fr: B\n")
    assert ":20: summary.fr: no page shows this version" in warning
    assert "built in en, es" in warning
    # with the default settings the site is in English alone
    (warning,) = warnings_of(catalogue, "summary:\n  en: A\n  es: B\n", settings="title: S\n")
    assert ":20: summary.es: no page shows this version" in warning


def test_an_original_outside_the_first_language_is_a_warning(catalogue):
    (warning,) = warnings_of(catalogue, "summary:\n  es: B\n  en: A\n")
    assert ":18: summary: the original" in warning and "put the version in en first" in warning
    (warning,) = warnings_of(catalogue, "caveats:\n  - {es: B}\n")
    assert ":19: caveats[0]: the original" in warning and "add a version in en" in warning


def test_a_missing_version_in_another_language_is_no_warning(catalogue):
    assert warnings_of(catalogue, "summary:\n  en: A\ncaveats: [plain]\n") == []


# -- the site's languages ----------------------------------------------------------------------


def test_languages_default_and_accepted(catalogue):
    cat = load_catalogue(catalogue({"ev.yaml": VALID_EVENT}))
    assert cat.settings.languages == ("en",)
    assert "es" in i18n.available()  # the Spanish catalogue ships with factsheet
    cat = load_catalogue(catalogue({"ev.yaml": VALID_EVENT, "catalogue.yaml": BILINGUAL}))
    assert cat.settings.languages == ("en", "es")


@pytest.mark.parametrize(
    ("setting", "line", "key", "words"),
    [
        ("languages: [en, fr]\n", 2, "languages[1]", "no translation for fr (available: en, es"),
        ("languages: [en, es, en]\n", 2, "languages[2]", "en is listed twice"),
        ("languages:\n  - es\n  - es-ES\n", 4, "languages[1]", "no translation for es_ES"),
        ("languages: [EN]\n", 2, "languages[0]", "write 'en'"),
        ("languages: [xx]\n", 2, "languages[0]", "unknown language code 'xx'"),
        ("languages: en\n", 2, "languages", "expected a list of language codes"),
        ("languages: []\n", 2, "languages", "expected a list of language codes"),
    ],
)
def test_bad_site_languages_name_file_line_and_key(catalogue, setting, line, key, words):
    folder = catalogue({"ev.yaml": VALID_EVENT, "catalogue.yaml": "title: S\n" + setting})
    (problem,) = problems_of(folder)
    assert problem.startswith(f"{folder / 'catalogue.yaml'}:{line}: {key}: "), problem
    assert words in problem


# -- how the texts travel ----------------------------------------------------------------------


def test_editorial_texts_survive_pickling(catalogue):
    """Events go to the build's worker processes by pickle."""
    (event,) = load_catalogue(catalogue({"ev.yaml": event_with(TEXTS)})).events
    back = pickle.loads(pickle.dumps(event))
    assert back == event
    for field in ("title", "summary", "internal_notes"):
        assert isinstance(getattr(back, field), Editorial)
        assert getattr(back, field).versions == getattr(event, field).versions
    assert [c.versions for c in back.caveats] == [c.versions for c in event.caveats]


def test_the_page_key_covers_every_version(tmp_path):
    """An event whose Spanish summary alone changed gets its pages again: their key hashes
    the file's bytes (and a memoised page's key the versions), not just the original; its
    numbers, figures and sound, which no summary shapes, keep theirs."""

    def key_of(spanish: str) -> tuple[str, str]:
        folder = tmp_path / f"cat{len(list(tmp_path.iterdir()))}"
        folder.mkdir()
        (folder / "catalogue.yaml").write_text(BILINGUAL, encoding="utf-8")
        text = event_with(TEXTS.replace("Un evento *de prueba*.", spanish))
        (folder / "ev.yaml").write_text(text, encoding="utf-8")
        cat = load_catalogue(folder)
        (event,) = cat.events
        keys = event_key(event, cat.settings), event.source_digest
        return (*keys, content_key("page", event.summary))

    first, same, other = key_of("Uno."), key_of("Uno."), key_of("Otro.")
    assert first == same
    assert first[0] == other[0] and first[1] != other[1] and first[2] != other[2]


# -- the demo ----------------------------------------------------------------------------------


def test_the_demo_is_in_english_and_spanish():
    cat = load_catalogue(demo_dir())
    assert cat.settings.languages == ("en", "es") and cat.warnings == ()
    untranslated = []
    for event in cat.events:
        texts = {"title": event.title, "summary": event.summary}
        texts.update({f"caveats[{i}]": c for i, c in enumerate(event.caveats)})
        for name, text in texts.items():
            assert isinstance(text, Editorial)
            if text.missing_in("es", "en"):
                untranslated.append(f"{event.id} {name}")
            else:  # the original is English: the English pages read as before
                assert next(iter(text.versions)) == "en", (event.id, name)
    # one summary is left in English, so the demo shows the note (events_demo/README.md)
    assert untranslated == ["MER34-003 summary"]
    first = cat.events[0]
    assert first.title == "The season's first signal"
    with use_language("es"):
        assert str(first.title) == "La primera señal de la temporada"


def test_the_documented_example_loads_without_problems_or_warnings(catalogue):
    """docs/input-format.md, "Texts in several languages", on a site in English and Spanish."""
    text = (Path(__file__).resolve().parents[2] / "docs" / "input-format.md").read_text("utf-8")
    section = text.split("### Texts in several languages", 1)[1]
    block = re.search(r"^```yaml\n(.*?)^```", section, re.M | re.S).group(1)
    minimal = VALID_EVENT.replace("title: A test pair\n", "").replace(SUMMARY, "")
    cat = load_catalogue(catalogue({"ev.yaml": minimal + block, "catalogue.yaml": BILINGUAL}))
    (event,) = cat.events
    assert cat.warnings == ()
    assert event.summary.versions["es"].startswith("Dos agujeros negros")
    assert event.caveats[1].versions == {"": "The calibration of site C1 is under review."}
