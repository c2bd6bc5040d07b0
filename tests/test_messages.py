"""The message catalogues: every message of the interface translated in every shipped language,
placeholders kept, and the compiled catalogues the build reads up to date with their sources.

``tools/messages.py`` extracts the messages from the code and the templates exactly as the
documented ``extract`` command does, so a string marked for translation and not yet translated
fails here.
"""

from __future__ import annotations

import importlib.util
import re
from pathlib import Path

import pytest

from factsheet import i18n

ROOT = Path(__file__).resolve().parents[1]
SHIPPED = [lang for lang in i18n.available() if lang != i18n.SOURCE]


def _tool():
    spec = importlib.util.spec_from_file_location("messages", ROOT / "tools" / "messages.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


messages = _tool()


@pytest.fixture(scope="module")
def template():
    return messages.template()


def test_spanish_is_shipped():
    assert "es" in SHIPPED


def test_the_sources_have_messages_to_translate(template):
    ids = {m.id if isinstance(m.id, str) else m.id[0] for m in template if m.id}
    assert len(ids) > 300  # the interface, not a handful of strings
    assert "Skip to content" in ids


@pytest.mark.parametrize("language", SHIPPED)
def test_every_message_is_translated(language, template):
    assert messages.missing(language, template) == []


PLACEHOLDER = re.compile(r"\{(\w+)\}|%\((\w+)\)s")


def _placeholders(text: str) -> set[str]:
    return {a or b for a, b in PLACEHOLDER.findall(text)}


@pytest.mark.parametrize("language", SHIPPED)
def test_translations_keep_the_placeholders(language):
    for message in messages.read(language):
        if not message.id or not message.string:
            continue
        ids = (message.id,) if isinstance(message.id, str) else message.id
        strings = (message.string,) if isinstance(message.string, str) else message.string
        expected = set().union(*map(_placeholders, ids)) - {"n", "num"}
        for string in strings:
            assert expected <= _placeholders(string) | {"n", "num"}, (message.id, string)
            assert _placeholders(string) <= set().union(*map(_placeholders, ids)), (
                message.id,
                string,
            )


@pytest.mark.parametrize("language", SHIPPED)
def test_compiled_catalogue_is_up_to_date(language):
    shipped = (i18n.LOCALE_DIR / language / "LC_MESSAGES" / "factsheet.mo").read_bytes()
    assert shipped == messages.compiled(language), "run: python tools/messages.py compile"


def test_spanish_plural_rule():
    with i18n.use_language("es"):
        assert i18n.translations("es").plural(1) == 0
        assert i18n.translations("es").plural(2) == 1
        assert i18n.translations("es").plural(0) == 1


def test_the_method_registry_texts_are_extracted_as_python_joins_them():
    """Every registered method's title, range of validity and accuracy is a message (the
    registry imports nothing of the interface; the methods page translates them)."""
    import io

    from factsheet.physics.registry import METHODS

    source = b'Method(id="x", title="two " "pieces", formula="f", validity=name, accuracy="")\n'
    found = list(messages.extract_registry(io.BytesIO(source), {}, [], {}))
    assert [text for _, _, text, _ in found] == ["two pieces"]
    ids = {m.id for m in messages.template() if m.id}
    for method in METHODS.values():
        assert {method.title, method.validity, method.accuracy} <= ids, method.id
    assert "not stated" in ids
