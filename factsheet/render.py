"""Render stage: derived events in, pages and exports out (as bytes in memory).

Templates get a documented context (see DEVELOPERS.md, "Template variables"); formatting lives
in the registered filters ``url`` (site path to a link relative to the current page),
``interval`` and ``value`` (numbers rounded by uncertainty, units written properly) and
``markdown`` (Markdown through a sanitiser). Decisions are made here, not in templates.
"""

from __future__ import annotations

import hashlib
import json
import posixpath
from collections.abc import Callable
from dataclasses import dataclass, field

import jinja2
import markdown as md
import nh3
from markupsafe import Markup

from factsheet import export, feed, pages, tables
from factsheet.assets import EventBundle, SiteFigure
from factsheet.derive import Derived, reference_for
from factsheet.formatting import format_interval, format_value, unit_text
from factsheet.model import Settings
from factsheet.resources import templates_dir

ALLOWED_TAGS = {
    "p",
    "a",
    "em",
    "strong",
    "code",
    "pre",
    "ul",
    "ol",
    "li",
    "blockquote",
    "br",
    "sub",
    "sup",
    "h3",
    "h4",
    "table",
    "thead",
    "tbody",
    "tr",
    "th",
    "td",
    "hr",
}
ALLOWED_SCHEMES = {"http", "https", "mailto"}


# A memo: (key parts, make) -> files; the build passes one backed by its cache.
Memo = Callable[[tuple, Callable[[], dict[str, bytes]]], dict[str, bytes]]


@dataclass
class Site:
    """Rendered output: site-relative path to file content."""

    files: dict[str, bytes] = field(default_factory=dict)

    def add(self, path: str, content: str | bytes) -> None:
        self.files[path] = content.encode("utf-8") if isinstance(content, str) else content


def markdown_html(text: str) -> Markup:
    """Markdown to HTML, passed through the nh3 sanitiser (no scripts, handlers or frames)."""
    html = md.markdown(text or "", extensions=["sane_lists"])
    clean = nh3.clean(
        html,
        tags=ALLOWED_TAGS,
        url_schemes=ALLOWED_SCHEMES,
        link_rel="noopener noreferrer nofollow",
    )
    return Markup(clean)


@jinja2.pass_context
def url_filter(context: jinja2.runtime.Context, target: str) -> str:
    """A link from the page being rendered to ``target`` (a path from the site root)."""
    here = posixpath.dirname(context["page_path"]) or "."
    return posixpath.relpath(target, here)


def make_environment() -> jinja2.Environment:
    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(templates_dir()),
        autoescape=jinja2.select_autoescape(["html", "xml"]),
        undefined=jinja2.StrictUndefined,
        trim_blocks=True,
        lstrip_blocks=True,
    )
    env.filters.update(
        url=url_filter,
        markdown=markdown_html,
        unit=unit_text,
        interval=lambda s: format_interval(s.median, s.low, s.high, s.unit),
        value=format_value,
    )
    return env


def plane_edges(settings: Settings) -> dict[str, float]:
    """Mass-band edges in solar masses, in the form the mass-plane figure takes."""
    bands = reference_for(settings).mass_bands
    return {
        "neutron_star_max": bands.neutron_star_max.value.to_value("solMass"),
        "lower_gap_max": bands.lower_gap_top.value.to_value("solMass"),
        "pair_instability_min": bands.pair_instability_lower.value.to_value("solMass"),
        "pair_instability_max": bands.pair_instability_upper.value.to_value("solMass"),
    }


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
    env = make_environment()
    site = Site() if site is None else site
    if memo is not None:
        memo = with_templates(memo)
    derived = [b.derived for b in bundles]
    common = {"settings": settings, "catalogue_title": settings.title, "audience": audience}
    for fig in index_figures:
        site.add(fig.path, fig.svg)
    for i, bundle in enumerate(bundles):
        neighbours = (
            derived[i - 1] if i else None,
            derived[i + 1] if i + 1 < len(derived) else None,
        )
        render_event(env, site, bundle, *neighbours, common, memo)

    def make() -> dict[str, bytes]:
        return catalogue_pages(env, derived, settings, index_figures, common)

    keys = tuple(b.key for b in bundles)
    key = (
        "catalogue",
        keys,
        settings,
        audience,
        templates_fingerprint(),
        tuple((f.path, f.alt) for f in index_figures),
    )
    pages_ = memo(key, make) if memo and all(keys) else make()
    for name, content in pages_.items():
        site.add(name, content)
    for path in sorted(p for p in (templates_dir() / "static").rglob("*") if p.is_file()):
        site.add(
            f"static/{path.relative_to(templates_dir() / 'static').as_posix()}", path.read_bytes()
        )
    return site


def catalogue_pages(
    env: jinja2.Environment,
    derived: list[Derived],
    settings: Settings,
    index_figures: list[SiteFigure],
    common: dict,
) -> dict[str, bytes]:
    """The catalogue-wide pages and exports: index, methods, changes, feed, tables."""
    out = {}
    out["index.html"] = env.get_template("index.html").render(
        page_path="index.html",
        rows=[export.event_row(d) for d in derived],
        description=settings.description,
        index_figures=index_figures,
        **common,
    )
    out["methods.html"] = env.get_template("methods.html").render(
        page_path="methods.html",
        **pages.methods_context(derived, reference_for(settings)),
        **common,
    )
    entries = feed.change_entries(derived)
    out["changes.html"] = env.get_template("changes.html").render(
        page_path="changes.html", entries=entries, **common
    )
    table = tables.catalogue_table(derived)
    files = {name: text.encode("utf-8") for name, text in out.items()}
    files["feed.xml"] = feed.atom_feed(entries, settings)
    files["data/catalogue.ecsv"] = tables.write_ecsv(table)
    files["data/catalogue.csv"] = tables.write_csv(table)
    return files


def render_event(
    env: jinja2.Environment,
    site: Site,
    bundle: EventBundle,
    previous: Derived | None,
    following: Derived | None,
    common: dict,
    memo: Memo | None = None,
) -> None:
    """The sheet of one event and its JSON (its figures and sound are made in assets).

    With a ``memo`` (the build cache), an unchanged event with unchanged neighbours, templates
    and audience reuses its page and JSON from the previous build.
    """
    item = bundle.derived
    page, data = f"events/{item.event.id}.html", f"data/{item.event.id}.json"

    def make() -> dict[str, bytes]:
        context = export.event_context(item, previous, following)
        html = env.get_template("event.html").render(
            page_path=page,
            figures=bundle.figures,
            headline=pages.headline(item),
            history=pages.history_steps(item),
            audio={"path": bundle.audio_path, "description": bundle.audio_description},
            **context,
            **common,
        )
        text = json.dumps(export.event_json(item), indent=2, sort_keys=False) + "\n"
        return {page: html.encode("utf-8"), data: text.encode("utf-8")}

    key = (
        bundle.key,
        previous and previous.event.id,
        following and following.event.id,
        common["audience"],
        common["catalogue_title"],
    )
    files = memo(key, make) if memo and bundle.key else make()
    for name in (page, data):
        site.add(name, files[name])


def with_templates(memo: Memo) -> Memo:
    """A memo whose keys also carry the templates' fingerprint (every page depends on them)."""
    fingerprint = templates_fingerprint()

    def keyed(parts: tuple, make: Callable[[], dict[str, bytes]]) -> dict[str, bytes]:
        return memo((*parts, fingerprint), make)

    return keyed


def templates_fingerprint() -> str:
    """A hash of every template and static file (pages depend on them)."""
    digest = hashlib.sha256()
    for path in sorted(templates_dir().rglob("*")):
        if path.is_file():
            digest.update(path.relative_to(templates_dir()).as_posix().encode())
            digest.update(path.read_bytes())
    return digest.hexdigest()
