"""The Jinja2 environment of the pages, its filters, and Markdown through a sanitiser.

Filters: ``url`` (a site path to a link relative to the page being rendered), ``interval``
(a :class:`~factsheet.model.Summary` rounded by its uncertainty), ``value`` (one number to
significant figures with its unit), ``unit`` (a unit as readers write it), ``label`` (the short
label of a quantity key, from :mod:`factsheet.labels`), ``percent`` (a credible level, ``90 %``)
and ``markdown`` (sanitised HTML).
Autoescape is on and undefined variables are errors.
"""

from __future__ import annotations

import hashlib
import posixpath

import jinja2
import markdown as md
import nh3
from markupsafe import Markup, escape

from factsheet import __version__, i18n
from factsheet.labels import CLASS_NAMES, QUANTITIES
from factsheet.notation import format_interval, format_value, percent, unit_text
from factsheet.resources import templates_dir

ALLOWED_TAGS = {
    "p", "a", "em", "strong", "code", "pre", "ul", "ol", "li", "blockquote", "br", "sub", "sup",
    "h3", "h4", "table", "thead", "tbody", "tr", "th", "td", "hr",
}  # fmt: skip
ALLOWED_SCHEMES = {"http", "https", "mailto"}


def markdown_html(text: str) -> Markup:
    """Markdown to HTML, passed through the nh3 sanitiser (no scripts, handlers or frames)."""
    html = md.markdown(i18n.localized(text) or "", extensions=["sane_lists"])
    clean = nh3.clean(
        html,
        tags=ALLOWED_TAGS,
        url_schemes=ALLOWED_SCHEMES,
        link_rel="noopener noreferrer nofollow",
    )
    return Markup(clean)


@jinja2.pass_context
def markdown_filter(context: jinja2.runtime.Context, text: str) -> Markup:
    """:func:`markdown_html` in the page's language; an editor's text shown in its original
    language for want of a translation is marked with that language."""
    html = markdown_html(text)
    original = original_language(context, text)
    if original:
        return Markup('<div lang="{}">{}</div>').format(original, html)
    return html


@jinja2.pass_context
def original_language(context: jinja2.runtime.Context, text: object) -> str:
    """The language of an editor's text when the page shows it in that original language for
    want of a version in the page's own (empty otherwise)."""
    settings = context.get("settings")
    first = settings.languages[0] if settings is not None else i18n.SOURCE
    return shown_original(text, context.get("language", first), first)


def shown_original(text: object, language: str, first: str) -> str:
    """The ``original_language`` filter outside a template: the language of an editor's text
    when a page in ``language`` (of a site whose first language is ``first``) shows it in that
    original language, else ""."""
    if not isinstance(text, i18n.Editorial) or not text.missing_in(language, first):
        return ""
    return next(iter(text.versions)) or first


@jinja2.pass_context
def editorial_html(context: jinja2.runtime.Context, text: object) -> Markup:
    """An editor's short text (a title), marked with its language when shown in the original."""
    original = original_language(context, text)
    if original:
        return Markup('<span lang="{}">{}</span>').format(original, str.__str__(text))
    return Markup(escape(i18n.localized(text)))


@jinja2.pass_context
def url_filter(context: jinja2.runtime.Context, target: str) -> str:
    """A link from the page being rendered to ``target`` (a path from the site root, as in the
    first language's site): a page or the feed of the page's own language, or a shared file
    (style, script, exports, sounds; figures carry their language's path already)."""
    return site_link(context["page_path"], context.get("language_prefix", ""), target)


def site_link(page_path: str, prefix: str, target: str) -> str:
    """The ``url`` filter outside a template: a link from the page ``page_path`` of the
    language whose pages are under ``prefix`` to the site path ``target``."""
    if prefix and (target.endswith(".html") or target == "feed.xml"):
        target = prefix + target
    return posixpath.relpath(target, posixpath.dirname(page_path) or ".")


@jinja2.pass_context
def placed_url(context: jinja2.runtime.Context, target: str) -> str:
    """A link from the page being rendered to ``target``, a site path taken as it is (another
    language's version of a page)."""
    here = posixpath.dirname(context["page_path"]) or "."
    return posixpath.relpath(target, here)


def in_language_of_page(function):
    """A filter whose words or digits depend on the language in use: marked as reading the
    context so that Jinja does not fold it on a constant at compile time, in whichever
    language happened to be in use then."""

    @jinja2.pass_context
    def filter_(context: jinja2.runtime.Context, *args, **kwargs):
        return function(*args, **kwargs)

    return filter_


def make_environment() -> jinja2.Environment:
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(templates_dir()),
        extensions=["jinja2.ext.i18n"],
        autoescape=jinja2.select_autoescape(["html", "xml"]),
        undefined=jinja2.StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
    )
    env.filters.update(
        url=url_filter,
        placed_url=placed_url,
        editorial=editorial_html,
        original_language=original_language,
        markdown=markdown_filter,
        **{
            name: in_language_of_page(function)
            for name, function in {
                "in_language": i18n.localized,
                "language_name": i18n.language_name,
                "unit": unit_text,
                "interval": lambda s: format_interval(s.median, s.low, s.high, s.unit),
                "value": format_value,
                "percent": percent,
                "label": lambda key: i18n.localized(QUANTITIES[key].short),
            }.items()
        },
    )
    # {{ _("...") }}, {{ ngettext(...) }} and {% trans %} in the language in use (newstyle:
    # parameters are escaped and a literal per cent sign is written %%)
    env.install_gettext_callables(
        i18n.gettext, i18n.ngettext, newstyle=True, pgettext=i18n.pgettext
    )
    env.globals["factsheet_version"] = __version__
    env.globals["class_names"] = CLASS_NAMES
    return env


def templates_fingerprint() -> str:
    """A hash of every template and static file (every page depends on them)."""
    digest = hashlib.sha256()
    for path in sorted(templates_dir().rglob("*")):
        if path.is_file():
            digest.update(path.relative_to(templates_dir()).as_posix().encode())
            digest.update(path.read_bytes())
    return digest.hexdigest()
