"""Render every page and export of a catalogue from its event bundles, in each of its languages.

The site's first language is at its root; each other language has the same pages under
``<lang>/``, and every page links its versions in the others (:func:`alternates`).

The pages' contexts come from :mod:`factsheet.render.contexts`; a memo (the build cache) lets
a page whose inputs did not change come from the previous build instead of being rendered.
"""

from __future__ import annotations

import json
from collections.abc import Callable, Iterator, Mapping, Sequence
from dataclasses import dataclass, field, replace
from typing import Any

import jinja2

from factsheet.i18n import SOURCE, language_name, use_language
from factsheet.load.reference import reference_for
from factsheet.model import Audio, Comparisons, Derived, EventBundle, Settings, SiteFigure
from factsheet.render import contexts, history, sheet, tables
from factsheet.render.contexts import Alternate, SiteContext, variables
from factsheet.render.environment import (
    make_environment,
    shown_original,
    site_link,
    templates_fingerprint,
)
from factsheet.render.event_json import event_json
from factsheet.render.feed import atom_feed
from factsheet.render.index_page import IndexPage, index_page, rows_data, rows_script
from factsheet.render.methods_page import methods_page
from factsheet.resources import templates_dir

# A memo: (key parts, make) -> the files ``make()`` gives, or None when the memo placed the
# files of an earlier build itself; the build passes one backed by its cache. ``make`` gives
# a dict (an event's page), or (site path, content) pairs one at a time (the catalogue pages),
# which the memo hands on as they come.
Memo = Callable[[tuple, Callable[[], Any]], Any]


@dataclass
class Site:
    """Rendered output: site-relative path to file content."""

    files: dict[str, bytes] = field(default_factory=dict)

    def add(self, path: str, content: str | bytes) -> None:
        self.files[path] = content.encode("utf-8") if isinstance(content, str) else content


@dataclass(frozen=True)
class Renderer:
    """The environment and what every page shares, for one render of the site in one language."""

    env: jinja2.Environment
    settings: Settings
    audience: str
    templates: str  # fingerprint of the templates, part of every memo key
    language: str = SOURCE

    @property
    def prefix(self) -> str:
        """Where this language's pages are: the site root for the first language, else
        ``<lang>/``."""
        return language_prefix(self.settings, self.language)

    def page(self, template: str, path: str, context: object) -> bytes:
        """Render ``template`` as the page ``path`` (a path of the first language's site; the
        page is placed under this language's prefix)."""
        common = SiteContext(
            self.prefix + path,
            self.settings,
            self.settings.title,
            self.audience,
            self.language,
            self.prefix,
            alternates(self.settings, path),
        )
        html = self.env.get_template(template).render(**variables(common, context))
        return html.encode("utf-8")


def language_prefix(settings: Settings, language: str) -> str:
    """The folder of a language's pages: none for the site's first language, else ``<lang>/``."""
    return "" if language == settings.languages[0] else f"{language}/"


def alternates(settings: Settings, path: str) -> tuple[Alternate, ...]:
    """The versions of the page ``path`` in each language of the site."""
    return tuple(
        Alternate(language, language_name(language), language_prefix(settings, language) + path)
        for language in settings.languages
    )


def plane_edges(settings: Settings) -> dict[str, float]:
    """Mass-band edges in solar masses by key, the form the mass-plane figure takes."""
    bands = reference_for(settings).mass_bands
    return {edge.key: edge.value.to_value("solMass") for edge in bands.edges()}


def for_catalogue(bundle: EventBundle) -> EventBundle:
    """The part of a bundle that the catalogue pages and the index figures read (the event,
    its numbers, class and bands, the methods used, its sky map's summary): what a build holds
    for every event at once. The rest (caveats, windows, lensing, comparisons, figures, the
    sound's words) is only for the event's own page, which reads the whole bundle again."""
    derived = replace(
        bundle.derived,
        caveats=(),
        windows=(),
        no_window_reason="",
        comparisons=_NO_COMPARISONS,
        second_generation=(),
        lensing=None,
        candidates=(),
        samples={},
    )
    return replace(bundle, derived=derived, figures={}, audio=_NO_AUDIO, files={}, pages={})


_NO_COMPARISONS = Comparisons()
_NO_AUDIO = Audio("", "", 0.0)


def render_site(
    bundles: list[EventBundle],
    settings: Settings,
    audience: str = "public",
    index_figures: Mapping[str, Sequence[SiteFigure]] | Sequence[SiteFigure] = (),
    site: Site | None = None,
    memo: Memo | None = None,
    templates: str = "",
    whole: Callable[[EventBundle], EventBundle] | None = None,
) -> Site:
    """Every page and export of the catalogue, in every language of the site (event figures
    and sounds are placed separately).

    The exports (JSON, ECSV, CSV) are written once, in English, whatever the languages. With a
    ``memo`` (the build cache), pages whose inputs are unchanged come from the last build;
    ``templates`` is the templates' fingerprint when the caller took it already. With
    ``whole``, the bundles are those :func:`for_catalogue` keeps, and ``whole(bundle)`` gives the
    whole bundle for an event page that must be rendered.
    """
    site = Site() if site is None else site
    env, fingerprint = make_environment(), templates or templates_fingerprint()
    if not isinstance(index_figures, Mapping):
        index_figures = {settings.languages[0]: list(index_figures)}
    derived = [b.derived for b in bundles]
    placed: set[str] = set()
    for figures in index_figures.values():
        for fig in figures:
            if fig.path not in placed:
                placed.add(fig.path)
                site.add(fig.path, fig.svg)
    for language in settings.languages:
        r = Renderer(env, settings, audience, fingerprint, language)
        shown = tuple(index_figures.get(language, ()))
        with use_language(language):
            for i, bundle in enumerate(bundles):
                previous, following = neighbours(bundles, i)
                render_event(r, site, bundle, previous, following, memo, whole)

            def make(
                r: Renderer = r, shown: tuple[SiteFigure, ...] = shown
            ) -> Iterator[tuple[str, bytes]]:
                return catalogue_pages(r, derived, list(shown))

            keys = tuple((b.key, b.derived.event.source_digest) for b in bundles)
            figures = tuple((f.path, f.alt) for f in shown)
            key = ("catalogue", keys, settings, audience, r.templates, figures, language)
            made = memo(key, make) if memo and all(k for k, _ in keys) else make()
            for name, content in made or ():  # None: the memo placed them
                site.add(name, content)
    static = templates_dir() / "static"
    for path in sorted(p for p in static.rglob("*") if p.is_file()):
        site.add(f"static/{path.relative_to(static).as_posix()}", path.read_bytes())
    return site


def neighbours(bundles: Sequence[EventBundle], i: int) -> tuple[str | None, str | None]:
    """The ids of the events before and after the ``i``-th in the catalogue."""
    previous = bundles[i - 1].derived.event.id if i else None
    following = bundles[i + 1].derived.event.id if i + 1 < len(bundles) else None
    return previous, following


def catalogue_pages(
    r: Renderer, derived: list[Derived], index_figures: list[SiteFigure]
) -> Iterator[tuple[str, bytes]]:
    """The catalogue-wide pages of one language (index, methods, changes, feed) and, with the
    first language, the exports, in English: each (site path, content) as soon as it is made,
    so that a catalogue of thousands of events holds one page's making at a time."""
    prefix = r.prefix
    yield from index_files(
        r, index_page(derived, r.settings.description, index_figures, r.audience)
    ).items()
    methods = methods_page(derived, reference_for(r.settings))
    yield prefix + "methods.html", r.page("methods.html", "methods.html", methods)
    del methods
    entries = history.change_entries(derived)
    yield (
        prefix + "changes.html",
        r.page("changes.html", "changes.html", history.changes_page(entries)),
    )
    base = r.settings.base_url and r.settings.base_url + prefix
    yield prefix + "feed.xml", atom_feed(entries, r.settings, base)
    del entries
    if not prefix:
        with use_language(SOURCE):
            table = tables.catalogue_table(derived, r.audience)
            ecsv = tables.write_ecsv(table)
        yield "data/catalogue.ecsv", ecsv
        del ecsv
        with use_language(SOURCE):
            csv = tables.write_csv(table)
        yield "data/catalogue.csv", csv


def index_files(r: Renderer, index: IndexPage) -> dict[str, bytes]:
    """The index page of the renderer's language and, beside it, every row of its table as
    data (``index-rows.js``, read by the page's script), by site path."""
    prefix, first = r.prefix, r.settings.languages[0]
    data = rows_data(
        index,
        lambda target: site_link(prefix + "index.html", prefix, target),
        lambda text: shown_original(text, r.language, first),
    )
    return {
        prefix + "index.html": r.page("index.html", "index.html", index),
        prefix + index.rows_file: rows_script(data),
    }


def render_event(
    r: Renderer,
    site: Site,
    bundle: EventBundle,
    previous: str | None,
    following: str | None,
    memo: Memo | None = None,
    whole: Callable[[EventBundle], EventBundle] | None = None,
) -> None:
    """The sheet of one event and its JSON (its figures and sound are made by the build);
    ``previous`` and ``following`` are the ids of its neighbours in the catalogue, and
    ``whole`` gives the whole bundle when ``bundle`` is the part the catalogue keeps.

    With a ``memo`` (the build cache), an unchanged event with unchanged neighbours, templates
    and audience reuses its page and JSON from the previous build.
    """
    key, names = event_page_key(r, bundle, previous, following), event_page_names(r, bundle)

    def make() -> dict[str, bytes]:
        return event_page_files(r, whole(bundle) if whole else bundle, previous, following)

    files = memo(key, make) if memo and bundle.key else make()
    if files is not None:  # None: the memo placed them
        for name in names:
            site.add(name, files[name])


def event_page_names(r: Renderer, bundle: EventBundle) -> tuple[str, ...]:
    """The files of an event's page in the renderer's language: the sheet and, in the first
    language only, the event's JSON (language-neutral)."""
    event_id = bundle.derived.event.id
    page = r.prefix + contexts.page_of(event_id)
    return (page, f"data/{event_id}.json") if not r.prefix else (page,)


def event_page_files(
    r: Renderer, bundle: EventBundle, previous: str | None, following: str | None
) -> dict[str, bytes]:
    """An event's page (and JSON) in the renderer's language, by site path; the language in use
    must be the renderer's."""
    item = bundle.derived
    names = event_page_names(r, bundle)
    figures = bundle.figures.get(r.language, ())
    context = sheet.event_page(item, previous, following, figures, bundle.audio)
    files = {names[0]: r.page("event.html", contexts.page_of(item.event.id), context)}
    if len(names) > 1:
        with use_language(SOURCE):  # the export is language-neutral
            files[names[1]] = (json.dumps(event_json(item), indent=2) + "\n").encode("utf-8")
    return files


def event_page_key(
    r: Renderer, bundle: EventBundle, previous: str | None, following: str | None
) -> tuple:
    """What an event's page and JSON depend on: the memo's key for them."""
    return (
        bundle.key,
        bundle.derived.event.source_digest,  # the page shows words the bundle's key leaves out
        previous,
        following,
        r.audience,
        r.settings.title,
        r.settings.base_url,
        r.settings.licence,
        r.settings.citation,
        r.templates,
        r.settings.languages,
        r.language,
    )
