"""Language codes in the input: the site's ``languages`` and the keys of an editor's versions.

A code is written as the site's catalogues are named: a language of two or three lower-case
letters (``en``, ``es``, ``ast``), optionally with a region of two capital letters or three
digits (``pt_BR``, ``es_419``). ``pt-BR`` is read as ``pt_BR``. The code must name a language
that Babel's locale data knows (``xx`` does not exist).
"""

from __future__ import annotations

import re

from babel import Locale, UnknownLocaleError

from factsheet.load.scalars import Bad, show

_CODE = re.compile(r"(?P<language>[a-z]{2,3})(?:[_-](?P<region>[A-Z]{2}|[0-9]{3}))?")
_EXAMPLE = "e.g. en, es or pt_BR"


def language_code(raw: object) -> str:
    """A language code as the site names its languages (``pt-BR`` becomes ``pt_BR``);
    :class:`Bad` says why ``raw`` is not one."""
    if not isinstance(raw, str):
        raise Bad(f"expected a language code ({_EXAMPLE}), got {show(raw)}")
    found = _CODE.fullmatch(raw)
    if found is None:
        hint = _spelling(raw)
        raise Bad(
            f"{show(raw)} is not a language code (expected two or three lower-case letters, "
            f"with an optional region, {_EXAMPLE}){hint}"
        )
    code = found["language"] + (f"_{found['region']}" if found["region"] else "")
    try:
        locale = Locale.parse(code)
    except (UnknownLocaleError, ValueError):
        locale = None
    if locale is None or str(locale) != code:  # Babel reads some codes as others ('und')
        raise Bad(f"unknown language code {show(raw)} ({_EXAMPLE})")
    return code


def _spelling(raw: str) -> str:
    """A hint for a code written in the wrong case (``EN``, ``pt_br``): how to write it."""
    loose = re.fullmatch(r"([A-Za-z]{2,3})(?:[_-]([A-Za-z]{2}|[0-9]{3}))?", raw.strip())
    if loose is None:
        return ""
    language, region = loose.groups()
    return f": write {language.lower() + (f'_{region.upper()}' if region else '')!r}"
