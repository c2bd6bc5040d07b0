"""The message catalogues of the interface: extract, update, compile, check (Babel's API).

    python tools/messages.py extract            # factsheet/locale/factsheet.pot from the sources
    python tools/messages.py update             # each language's .po takes the new messages
    python tools/messages.py compile            # each .po to the .mo the build reads
    python tools/messages.py check              # every message translated in every language
    python tools/messages.py absorb es FILE...  # translations from other .po files into es

``update`` keeps every translation whose message is still used and drops the rest; messages
new to a language are left empty for its translator (``check`` lists them). The same steps
with Babel's command line: ``pybabel extract -F babel.cfg -k N_ -k Text -k Plural:1,2
-k pgettext:1c,2 -k count_words:2,3 -o factsheet/locale/factsheet.pot .``, ``pybabel update
-D factsheet -i factsheet/locale/factsheet.pot -d factsheet/locale``, ``pybabel compile -D
factsheet -d factsheet/locale`` (the texts of the packaged reference data,
``factsheet/data/*.yaml``, and those of the physics method registry, ``factsheet/physics/*.py``,
are read by :func:`extract_reference_data` and :func:`extract_registry` of this script only).
"""

from __future__ import annotations

import ast
import datetime
import io
import sys
from pathlib import Path

import yaml
from babel.messages.catalog import Catalog
from babel.messages.extract import extract_from_dir
from babel.messages.mofile import write_mo
from babel.messages.pofile import read_po, write_po

ROOT = Path(__file__).resolve().parent.parent
LOCALE = ROOT / "factsheet" / "locale"
DOMAIN = "factsheet"
KEYWORDS = {
    "_": None,
    "gettext": None,
    "ngettext": (1, 2),
    "pgettext": ((1, "c"), 2),
    "N_": None,
    "Text": None,
    "Plural": (1, 2),
    "count_words": (2, 3),
}


def extract_data_labels(fileobj, keywords, comment_tags, options):
    """Babel extraction method for the packaged reference data (``factsheet/data/*.yaml``):
    every ``label`` of a mapping is a message (load/reference.py shows it translated)."""
    root = yaml.compose(fileobj.read().decode(options.get("encoding", "utf-8")))
    yield from _texts(root, "", ("label",))


#: The texts of the packaged reference data the methods page shows besides the labels: the
#: sources and spreads of the mass-band edges and comparisons, the bases of the counterpart
#: time scales (render/methods_page.py translates them; the citations in them stay as written).
DATA_TEXTS = ("source", "spread", "basis")


def extract_reference_data(fileobj, keywords, comment_tags, options):
    """Babel extraction method for the packaged reference data: the labels (as
    :func:`extract_data_labels`) and the texts of :data:`DATA_TEXTS`, in file order."""
    root = yaml.compose(fileobj.read().decode(options.get("encoding", "utf-8")))
    yield from _texts(root, "", ("label", *DATA_TEXTS))


def _texts(node, where: str, names: tuple[str, ...]):
    if isinstance(node, yaml.MappingNode):
        for key, value in node.value:
            name = f"{where}.{key.value}" if where else str(key.value)
            if key.value in names and isinstance(value, yaml.ScalarNode) and value.value:
                comment = f"reference data: {where}"
                if key.value != "label":
                    comment += f" ({key.value})"
                yield value.start_mark.line + 1, None, value.value, [comment]
            else:
                yield from _texts(value, name, names)
    elif isinstance(node, yaml.SequenceNode):
        for index, item in enumerate(node.value):
            yield from _texts(item, f"{where}[{index}]", names)


#: The texts of a registry record the methods page shows (render/methods_page.py translates
#: them); formulas and citations are shown as written.
REGISTRY_TEXTS = ("title", "validity", "accuracy")


def extract_registry(fileobj, keywords, comment_tags, options):
    """Babel extraction method for the physics modules (``factsheet/physics/*.py``), which
    import nothing of the interface: the string constants given as ``title``, ``validity`` or
    ``accuracy`` to a ``Method(...)`` record, and the defaults of those fields in the class
    itself ("not stated"). Implicitly concatenated constants are one string, as Python reads
    them."""
    tree = ast.parse(fileobj.read().decode(options.get("encoding", "utf-8")))
    for node in ast.walk(tree):
        if isinstance(node, ast.Call) and _called(node.func) == "Method":
            ident = next(
                (k.value.value for k in node.keywords if k.arg == "id" and _text(k.value)), "?"
            )
            for keyword in node.keywords:
                if keyword.arg in REGISTRY_TEXTS and _text(keyword.value):
                    text = keyword.value.value
                    yield keyword.value.lineno, None, text, [f"method {ident}: {keyword.arg}"]
        elif isinstance(node, ast.ClassDef) and node.name == "Method":
            for item in node.body:
                if (
                    isinstance(item, ast.AnnAssign)
                    and isinstance(item.target, ast.Name)
                    and item.target.id in REGISTRY_TEXTS
                    and item.value is not None
                    and _text(item.value)
                ):
                    comment = f"method: {item.target.id} when a method gives none"
                    yield item.value.lineno, None, item.value.value, [comment]


def _called(func: ast.expr) -> str | None:
    if isinstance(func, ast.Name):
        return func.id
    if isinstance(func, ast.Attribute):
        return func.attr
    return None


def _text(node: ast.expr) -> bool:
    return isinstance(node, ast.Constant) and isinstance(node.value, str) and bool(node.value)


METHODS = [
    ("factsheet/physics/*.py", extract_registry),  # before the rest of the package: first wins
    ("factsheet/**.py", "python"),
    ("templates/**.html", "jinja2"),
    ("factsheet/data/*.yaml", extract_reference_data),
]
OPTIONS = {"templates/**.html": {"trim_blocks": "true", "lstrip_blocks": "true"}}
# Spanish plural forms as GNU gettext writes them (one, other); CLDR's separate form for
# whole millions is not used by our messages.
FIXED_DATE = datetime.datetime(2026, 12, 3, tzinfo=datetime.UTC)
PLURAL_FORMS = {"es": "nplurals=2; plural=(n != 1);"}


def template() -> Catalog:
    """Every message of the sources, with where it is used."""
    catalog = Catalog(domain=DOMAIN, project="factsheet", charset="utf-8")
    for filename, lineno, message, comments, context in extract_from_dir(
        ROOT,
        METHODS,
        options_map=OPTIONS,
        keywords=KEYWORDS,
        comment_tags=("TRANSLATORS:",),
        strip_comment_tags=True,
    ):
        if _ours(filename):
            catalog.add(
                message, None, [(filename, lineno)], auto_comments=comments, context=context
            )
    return catalog


def _ours(filename: str) -> bool:
    return not filename.startswith(("factsheet/locale", "tests/", "build/"))


def po_path(language: str) -> Path:
    return LOCALE / language / "LC_MESSAGES" / f"{DOMAIN}.po"


def languages() -> list[str]:
    return sorted(p.name for p in LOCALE.iterdir() if (p / "LC_MESSAGES").is_dir())


def read(language: str) -> Catalog:
    path = po_path(language)
    if not path.exists():
        return Catalog(locale=language, domain=DOMAIN, project="factsheet")
    with path.open("rb") as handle:
        return read_po(handle, locale=language, domain=DOMAIN)


def write(language: str, catalog: Catalog) -> None:
    if language in PLURAL_FORMS:
        catalog._num_plurals, catalog._plural_expr = _plural_parts(PLURAL_FORMS[language])
    catalog.fuzzy = False
    catalog.project, catalog.version = "factsheet", ""
    catalog.copyright_holder = "the factsheet authors"
    catalog.msgid_bugs_address = ""
    catalog.last_translator = catalog.language_team = "the factsheet authors"
    catalog.creation_date = catalog.revision_date = FIXED_DATE  # the same bytes every time
    buffer = io.BytesIO()
    write_po(buffer, catalog, width=100, omit_header=False, sort_output=True, no_location=True)
    po_path(language).parent.mkdir(parents=True, exist_ok=True)
    po_path(language).write_bytes(buffer.getvalue())


def _plural_parts(forms: str) -> tuple[int, str]:
    count, expr = (part.split("=", 1)[1].strip() for part in forms.rstrip(";").split(";"))
    return int(count), expr.strip().removeprefix("(").removesuffix(")")


def compiled(language: str) -> bytes:
    """The .mo bytes of a language's .po (what ``compile`` writes)."""
    buffer = io.BytesIO()
    write_mo(buffer, read(language), use_fuzzy=False)
    return buffer.getvalue()


def missing(language: str, pot: Catalog | None = None) -> list[str]:
    """Messages of the sources with no (or an incomplete) translation in ``language``."""
    pot = pot or template()
    catalog = read(language)
    out = []
    for message in pot:
        if not message.id:
            continue
        found = catalog.get(message.id, message.context)
        strings = found and (found.string if isinstance(found.string, tuple) else (found.string,))
        if not found or found.fuzzy or not strings or not all(strings):
            out.append(message.id if isinstance(message.id, str) else message.id[0])
    return out


def main(argv: list[str]) -> int:
    command, *rest = argv or ["check"]
    if command == "extract":
        buffer = io.BytesIO()
        write_po(buffer, template(), width=100, sort_output=True, no_location=True)
        (LOCALE / f"{DOMAIN}.pot").write_bytes(buffer.getvalue())
    elif command == "update":
        pot = template()
        for language in languages():
            catalog = read(language)
            catalog.update(pot, no_fuzzy_matching=True)
            catalog.obsolete.clear()
            write(language, catalog)
    elif command == "compile":
        for language in languages():
            path = po_path(language).with_suffix(".mo")
            path.write_bytes(compiled(language))
    elif command == "absorb":
        language, *files = rest
        catalog = read(language)
        for file in files:
            with open(file, "rb") as handle:
                other = read_po(handle, locale=language)
            for message in other:
                if (
                    message.id
                    and message.string
                    and (not isinstance(message.string, tuple) or all(message.string))
                ):
                    found = catalog.get(message.id, message.context)
                    if found is not None:  # update keeps an entry with an empty translation
                        found.string, found.flags = message.string, set()
                    else:
                        catalog.add(message.id, message.string, context=message.context)
        write(language, catalog)
    elif command == "check":
        pot, bad = template(), 0
        for language in languages():
            for message in missing(language, pot):
                print(f"{language}: no translation of {message!r}")
                bad += 1
        return 1 if bad else 0
    else:
        print(__doc__)
        return 2
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
