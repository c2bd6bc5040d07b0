"""The reader's language: translated words, and numbers and dates in the language's conventions.

Every string of our own that a reader sees goes through this module. Message catalogues are
gettext's (``factsheet/locale/<lang>/LC_MESSAGES/factsheet.po``, compiled to ``.mo``, managed
with Babel: see the contributor guide); English is the source language, so its catalogue is
the messages themselves.

The language is a context variable set by :func:`use_language` around the work done for one
language (drawing a sheet's figures, rendering its pages). Three ways to mark a string:

- ``_("Total mass")`` and ``ngettext("{n} event", "{n} events", n)`` translate now, in the
  language in use;
- ``N_("Total mass")`` only marks a string for extraction (translate it later with ``_``);
- ``Text("Noise alone would make this {how}", how=...)`` and ``Plural(...)`` keep the message
  and its parameters and translate each time they are shown: for words made before the
  language is known (caveats made when an event is derived, the label tables). A ``Text`` *is*
  its English wording as a ``str`` (so exports, comparisons and ``json.dumps`` see English),
  while ``str()``, ``format()`` and HTML escaping give the language in use.

Numbers go through :func:`decimal_text`: digits chosen by the caller (rounding is the
notation module's business), symbols and grouping from the language (Babel's locale data).
"""

from __future__ import annotations

import contextlib
import datetime as dt
import functools
import gettext as _gettext
from collections.abc import Callable, Iterator, Mapping
from contextvars import ContextVar
from pathlib import Path
from typing import Any, Self

from babel import Locale
from babel.dates import format_date as _babel_date
from babel.numbers import get_decimal_symbol, get_group_symbol
from markupsafe import escape

DOMAIN = "factsheet"
SOURCE = "en"  # the language the messages are written in
LOCALE_DIR = Path(__file__).parent / "locale"

_language: ContextVar[str] = ContextVar("factsheet_language", default=SOURCE)

# CLDR's minimumGroupingDigits: Spanish writes 1234 but 12 345 (from memory of CLDR's data;
# Babel does not apply it when formatting with a pattern). Default 1. English is ours, not
# CLDR's (1): the pages have always written 1200 and 90000 ungrouped, and the notation module
# factors out a power of ten from 10⁵ on, so English numbers stay ungrouped.
_MIN_GROUPING = {"es": 2, "en": 3}
# How a date is written in prose (a CLDR pattern); other languages take Babel's long format.
_DATE_PATTERN = {"en": "d MMMM y", "es": "d 'de' MMMM 'de' y"}


def available() -> tuple[str, ...]:
    """The languages the site can be built in: English and each shipped catalogue."""
    shipped = sorted(p.parent.parent.name for p in LOCALE_DIR.glob(f"*/LC_MESSAGES/{DOMAIN}.mo"))
    return (SOURCE, *(lang for lang in shipped if lang != SOURCE))


@functools.cache
def translations(language: str) -> _gettext.NullTranslations:
    """The compiled catalogue of ``language`` (English: the messages themselves)."""
    if language == SOURCE:
        return _gettext.NullTranslations()
    path = LOCALE_DIR / language / "LC_MESSAGES" / f"{DOMAIN}.mo"
    with path.open("rb") as handle:
        return _gettext.GNUTranslations(handle)


def current() -> str:
    """The language in use."""
    return _language.get()


@contextlib.contextmanager
def use_language(language: str) -> Iterator[str]:
    """Within the block, words, numbers and dates are in ``language``."""
    translations(language)  # fail here, not in the middle of a page, for an unknown language
    token = _language.set(language)
    try:
        yield language
    finally:
        _language.reset(token)


def gettext(message: str) -> str:
    """``message`` in the language in use."""
    return translations(current()).gettext(message)


_ = gettext


def ngettext(singular: str, plural: str, n: float) -> str:
    """The singular or plural form for ``n`` in the language in use (its own plural rule);
    format ``{n}`` into it yourself."""
    return translations(current()).ngettext(singular, plural, _plural_n(n))


def pgettext(context: str, message: str) -> str:
    """``message`` in the language in use, told apart from the same English words elsewhere."""
    return translations(current()).pgettext(context, message)


def N_(message: str) -> str:
    """Mark ``message`` for extraction only; translate it where it is shown with ``_``."""
    return message


def _plural_n(n: float) -> int:
    """gettext's plural rules take whole numbers: 1.0 is one, 1.5 is many."""
    if isinstance(n, int):
        return n
    return int(n) if float(n).is_integer() else 2


# --- words kept for later ---------------------------------------------------------------------


class _Shown:
    """Words shown in the language in use: ``str()``, ``format()`` and HTML escaping give
    :meth:`localized`."""

    __slots__ = ()

    def localized(self) -> str:
        raise NotImplementedError

    def __str__(self) -> str:
        return self.localized()

    def __format__(self, spec: str) -> str:
        return format(self.localized(), spec)

    def __html__(self) -> str:
        return str(escape(self.localized()))


def _shown(value: Any) -> str:
    """A parameter of a message as shown in the language in use."""
    if isinstance(value, _Shown):
        return value.localized()
    if isinstance(value, bool):
        return str(value)
    if isinstance(value, int):
        return decimal_text(float(value), 0)
    return str(value)


class Text(_Shown, str):
    """A message with its parameters, shown in the language in use each time it is shown.

    The ``str`` value is the English wording (what exports and comparisons see); ``str()``,
    ``format()`` and HTML escaping give the wording in the language in use. Parameters may be
    strings (shown as they are), ``Text`` (translated), :class:`Later` (formatted when shown)
    or whole numbers. Messages use ``{name}`` placeholders.

    Concatenating a ``Text`` with ``+`` or ``str.join`` keeps only its English value: compose
    messages with parameters instead.
    """

    __slots__ = ("_key", "_params")
    _key: tuple[str, ...]
    _params: tuple[tuple[str, Any], ...]

    def __new__(cls, message: str, /, **params: Any) -> Text:
        return cls._make((message,), params)

    @classmethod
    def _make(cls, key: tuple, params: dict[str, Any]) -> Self:
        self = str.__new__(cls, _wording(key, params, SOURCE))
        self._key, self._params = key, tuple(sorted(params.items()))
        return self

    def localized(self) -> str:
        """The wording in the language in use."""
        return _wording(self._key, dict(self._params), current())

    def __reduce__(self):
        return (_rebuild, (type(self), self._key, dict(self._params)))

    def __repr__(self) -> str:
        return f"{type(self).__name__}({str.__str__(self)!r})"


class Plural(Text):
    """A message with singular and plural forms chosen by the parameter ``n``."""

    __slots__ = ()

    def __new__(cls, singular: str, plural: str, n: float, /, **params: Any) -> Plural:
        return cls._make((singular, plural), {"n": n, **params})


def _rebuild(cls: type[Text], key: tuple, params: dict[str, Any]) -> Text:
    return cls._make(key, params)


def _wording(key: tuple, params: dict[str, Any], language: str) -> str:
    """A message (``(message,)`` or ``(singular, plural)``, chosen by ``params["n"]``) in
    ``language``, its parameters shown in that language too."""
    catalogue = translations(language)
    if len(key) == 1:
        message = catalogue.gettext(key[0])
    else:
        message = catalogue.ngettext(key[0], key[1], _plural_n(params["n"]))
    if not params:
        return message
    token = _language.set(language)
    try:
        return message.format(**{k: _shown(v) for k, v in params.items()})
    finally:
        _language.reset(token)


class Later(_Shown):
    """A value formatted when shown, in the language in use: ``Later(format_value, 3.2, "km")``.

    ``function`` must be importable by name (a module-level function), so that the value can be
    stored in the build cache.
    """

    __slots__ = ("args", "function")

    def __init__(self, function: Callable[..., str], *args: Any):
        self.function, self.args = function, args

    def localized(self) -> str:
        return self.function(*self.args)

    def __eq__(self, other: object) -> bool:
        return isinstance(other, Later) and (self.function, self.args) == (
            other.function,
            other.args,
        )

    def __hash__(self) -> int:
        return hash((self.function, self.args))

    def __reduce__(self):
        return (Later, (self.function, *self.args))


class Editorial(_Shown, str):
    """An editor's text from the input (a title, a summary, a caveat, a note) with its versions
    by language, as given: ``summary: {en: ..., es: ...}`` or one plain text.

    The ``str`` value is the original (the first version given), which the exports carry;
    ``str()`` and HTML escaping give the version in the language in use, or the original where
    that language has none (:meth:`missing_in` says so, for the page to tell its reader). A
    plain text has the one version ``""``: written in the site's first language.
    """

    __slots__ = ("versions",)
    versions: dict[str, str]

    def __new__(cls, versions: Mapping[str, str] | str) -> Editorial:
        given = {"": versions} if isinstance(versions, str) else dict(versions)
        self = super().__new__(cls, next(iter(given.values()), ""))
        self.versions = given
        return self

    def localized(self) -> str:
        return self.versions.get(current(), str.__str__(self))

    def missing_in(self, language: str, first: str) -> bool:
        """True when a page in ``language`` (``first``: the site's first language) shows the
        original because the editors gave no version in that language."""
        if language in self.versions or not str.__str__(self):
            return False
        return not ("" in self.versions and language == first)

    def __reduce__(self):
        return (Editorial, (self.versions,))

    def __repr__(self) -> str:
        return f"Editorial({self.versions!r})"


def localized(value: Any) -> Any:
    """``value`` in the language in use when it is kept or editors' words, else as is."""
    return value.localized() if isinstance(value, _Shown) else value


# --- numbers and dates ------------------------------------------------------------------------


@functools.cache
def _symbols(language: str) -> tuple[str, str, int]:
    locale = Locale.parse(language)
    return get_decimal_symbol(locale), get_group_symbol(locale), _MIN_GROUPING.get(language, 1)


def grouping() -> tuple[str, int]:
    """How the language in use groups the thousands of a whole number: the group symbol and the
    fewest digits a grouped number has (6 in English, 5 in Spanish); for the index script,
    which writes counts as :func:`decimal_text` does."""
    _point, group, min_grouping = _symbols(current())
    return group, 3 + min_grouping


def decimal_text(value: float, places: int) -> str:
    """``value`` with ``places`` decimals (already rounded by the caller) in the language's
    digits: decimal symbol, grouping of thousands, and U+2212 for the minus sign."""
    text = f"{abs(value):.{max(0, places)}f}"
    whole, _, fraction = text.partition(".")
    point, group, min_grouping = _symbols(current())
    if len(whole) >= 4 + min_grouping - 1:
        head = len(whole) % 3 or 3
        whole = group.join([whole[:head], *(whole[i : i + 3] for i in range(head, len(whole), 3))])
    sign = "−" if value < 0 and float(text) != 0 else ""
    return sign + whole + (point + fraction if fraction else "")


def localize_number(text: str) -> str:
    """An English-written number (``1234.5``, ``−0.25``) in the language in use."""
    plain = text.replace("−", "-").replace(",", "")
    places = len(plain.partition(".")[2])
    return decimal_text(float(plain), places)


def date_text(day: dt.date | dt.datetime) -> str:
    """A date as written in prose in the language in use: ``17 January 2035``."""
    language = current()
    return _babel_date(day, _DATE_PATTERN.get(language, "long"), locale=Locale.parse(language))


def language_in_words(language: str) -> str:
    """A language's name in the language in use, as written inside a sentence (``inglés``)."""
    return Locale.parse(language).get_display_name(current()) or language


def language_name(language: str) -> str:
    """A language's name in that language, capitalised for a menu: ``English``, ``Español``."""
    name = Locale.parse(language).get_display_name(language) or language
    return name[:1].upper() + name[1:]


# --- kept words as plain JSON (the build cache stores what derive found as JSON) ---------------

_TEXT, _LATER, _TUPLE, _EDITORIAL = "§text", "§later", "§tuple", "§editorial"


def to_json(value: Any) -> Any:
    """``value`` with every kept message as plain JSON (lists and dicts walked), so that words
    read back from the build cache still translate. Other values are returned as they are."""
    if isinstance(value, Editorial):  # every version, the original first
        return {_EDITORIAL: dict(value.versions)}
    if isinstance(value, Text):
        params = {k: to_json(v) for k, v in value._params}
        return {_TEXT: list(value._key), "params": params}
    if isinstance(value, Later):
        function = value.function
        name = f"{function.__module__}:{function.__qualname__}"
        return {_LATER: name, "args": [to_json(a) for a in value.args]}
    if isinstance(value, tuple):
        return {_TUPLE: [to_json(v) for v in value]}
    if isinstance(value, list):
        return [to_json(v) for v in value]
    if isinstance(value, dict):
        return {k: to_json(v) for k, v in value.items()}
    return value


def from_json(value: Any) -> Any:
    """The inverse of :func:`to_json`. A kept value names only a function of this package
    (nothing read from the cache can name other code); anything else raises ValueError."""
    if isinstance(value, list):
        return [from_json(v) for v in value]
    if not isinstance(value, dict):
        return value
    if _TEXT in value:
        key, params = value[_TEXT], {k: from_json(v) for k, v in value["params"].items()}
        if not (
            isinstance(key, list) and 1 <= len(key) <= 2 and all(isinstance(k, str) for k in key)
        ):
            raise ValueError(f"not a kept message: {key!r}")
        return (Text if len(key) == 1 else Plural)._make(tuple(key), params)
    if _EDITORIAL in value:
        versions = value[_EDITORIAL]
        if not (
            isinstance(versions, dict)
            and versions
            and all(isinstance(k, str) and isinstance(v, str) for k, v in versions.items())
        ):
            raise ValueError(f"not an editor's text: {versions!r}")
        return Editorial(versions)
    if _LATER in value:
        return Later(_function(value[_LATER]), *(from_json(a) for a in value["args"]))
    if _TUPLE in value:
        return tuple(from_json(v) for v in value[_TUPLE])
    return {k: from_json(v) for k, v in value.items()}


def json_hook(value: dict[str, Any]) -> Any:
    """:func:`from_json` for one object, as ``json.loads(..., object_hook=json_hook)`` calls it
    (innermost first, so its members are already read back): the C parser then does the walk."""
    if _TEXT in value or _EDITORIAL in value or _LATER in value or _TUPLE in value:
        return from_json(value)
    return value


def _function(name: str) -> Callable[..., str]:
    import importlib
    import types

    module_name, _, qualname = str(name).partition(":")
    if not module_name.startswith("factsheet.") or not qualname.isidentifier():
        raise ValueError(f"not a function of factsheet: {name!r}")
    function = getattr(importlib.import_module(module_name), qualname, None)
    if not isinstance(function, types.FunctionType):
        raise ValueError(f"not a function of factsheet: {name!r}")
    return function
