"""Render every page and export of a catalogue from its event bundles.

The pages' contexts come from :mod:`factsheet.render.contexts`; a memo (the build cache) lets
a page whose inputs did not change come from the previous build instead of being rendered.
"""

from __future__ import annotations

import json
from collections.abc import Callable
from dataclasses import dataclass, field

import jinja2

from factsheet.load.reference import reference_for
from factsheet.model import Derived, EventBundle, Settings, SiteFigure
from factsheet.render import contexts, history, sheet, tables
from factsheet.render.contexts import SiteContext, variables
from factsheet.render.environment import make_environment, templates_fingerprint
from factsheet.render.event_json import event_json
from factsheet.render.feed import atom_feed
from factsheet.render.index_page import index_page
from factsheet.render.methods_page import methods_page
from factsheet.resources import templates_dir

# A memo: (key parts, make) -> files; the build passes one backed by its cache.
Memo = Callable[[tuple, Callable[[], dict[str, bytes]]], dict[str, bytes]]


@dataclass
class Site:
    """Rendered output: site-relative path to file content."""

    files: dict[str, bytes] = field(default_factory=dict)

    def add(self, path: str, content: str | bytes) -> None:
        self.files[path] = content.encode("utf-8") if isinstance(content, str) else content


@dataclass(frozen=True)
class Renderer:
    """The environment and what every page shares, for one render of the site."""

    env: jinja2.Environment
    settings: Settings
    audience: str
    templates: str  # fingerprint of the templates, part of every memo key

    def page(self, template: str, path: str, context: object) -> bytes:
        common = SiteContext(path, self.settings, self.settings.title, self.audience)
        html = self.env.get_template(template).render(**variables(common, context))
        return html.encode("utf-8")


def plane_edges(settings: Settings) -> dict[str, float]:
    """Mass-band edges in solar masses by key, the form the mass-plane figure takes."""
    bands = reference_for(settings).mass_bands
    return {edge.key: edge.value.to_value("solMass") for edge in bands.edges()}


def render_site(
    bundles: list[EventBundle],
    settings: Settings,
    audience: str = "public",
    index_figures: list[SiteFigure] = (),
    site: Site | None = None,
    memo: Memo | None = None,
) -> Site:
    """Every page and export of the catalogue (event figures and sounds are placed separately).

    With a ``memo`` (the build cache), pages whose inputs are unchanged come from the last build.
    """
    site = Site() if site is None else site
    r = Renderer(make_environment(), settings, audience, templates_fingerprint())
    derived = [b.derived for b in bundles]
    for fig in index_figures:
        site.add(fig.path, fig.svg)
    for i, bundle in enumerate(bundles):
        previous = derived[i - 1] if i else None
        following = derived[i + 1] if i + 1 < len(derived) else None
        render_event(r, site, bundle, previous, following, memo)

    def make() -> dict[str, bytes]:
        return catalogue_pages(r, derived, index_figures)

    keys = tuple(b.key for b in bundles)
    figures = tuple((f.path, f.alt) for f in index_figures)
    key = ("catalogue", keys, settings, audience, r.templates, figures)
    for name, content in (memo(key, make) if memo and all(keys) else make()).items():
        site.add(name, content)
    static = templates_dir() / "static"
    for path in sorted(p for p in static.rglob("*") if p.is_file()):
        site.add(f"static/{path.relative_to(static).as_posix()}", path.read_bytes())
    return site


def catalogue_pages(
    r: Renderer, derived: list[Derived], index_figures: list[SiteFigure]
) -> dict[str, bytes]:
    """The catalogue-wide pages and exports: index, methods, changes, feed, tables."""
    index = index_page(derived, r.settings.description, index_figures, r.audience)
    table = tables.catalogue_table(derived, r.audience)
    return {
        "index.html": r.page("index.html", "index.html", index),
        "methods.html": r.page(
            "methods.html",
            "methods.html",
            methods_page(derived, reference_for(r.settings)),
        ),
        "changes.html": r.page("changes.html", "changes.html", history.changes_page(derived)),
        "feed.xml": atom_feed(history.change_entries(derived), r.settings),
        "data/catalogue.ecsv": tables.write_ecsv(table),
        "data/catalogue.csv": tables.write_csv(table),
    }


def render_event(
    r: Renderer,
    site: Site,
    bundle: EventBundle,
    previous: Derived | None,
    following: Derived | None,
    memo: Memo | None = None,
) -> None:
    """The sheet of one event and its JSON (its figures and sound are made by the build).

    With a ``memo`` (the build cache), an unchanged event with unchanged neighbours, templates
    and audience reuses its page and JSON from the previous build.
    """
    item = bundle.derived
    page, data = contexts.page_of(item.event.id), f"data/{item.event.id}.json"

    def make() -> dict[str, bytes]:
        context = sheet.event_page(item, previous, following, bundle.figures, bundle.audio)
        text = json.dumps(event_json(item), indent=2) + "\n"
        return {page: r.page("event.html", page, context), data: text.encode("utf-8")}

    key = (
        bundle.key,
        previous and previous.event.id,
        following and following.event.id,
        r.audience,
        r.settings.title,
        r.settings.base_url,
        r.settings.licence,
        r.settings.citation,
        r.templates,
    )
    files = memo(key, make) if memo and bundle.key else make()
    for name in (page, data):
        site.add(name, files[name])
