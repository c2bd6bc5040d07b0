"""Render stage: derived events in, pages and exports out (as bytes in memory).

Templates get a documented context (see DEVELOPERS.md, "Template variables"); formatting lives
in the registered filters ``url`` (site path to a link relative to the current page),
``interval`` and ``value`` (numbers rounded by uncertainty, units written properly) and
``markdown`` (Markdown through a sanitiser). Decisions are made here, not in templates.
"""

from __future__ import annotations

import json
import posixpath
from dataclasses import dataclass, field

import jinja2
import markdown as md
import nh3
from markupsafe import Markup

from factsheet import export, feed, pages, tables
from factsheet.assets import EventBundle
from factsheet.derive import Derived, reference_for
from factsheet.formatting import format_interval, format_value, unit_text
from factsheet.model import Settings
from factsheet.resources import templates_dir
from factsheet.site_figures import SiteFigure

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


def plane_edges(item_or_settings: Settings) -> dict[str, float]:
    """Mass-band edges in solar masses, in the form the mass-plane figure takes."""
    bands = reference_for(item_or_settings).mass_bands
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
) -> Site:
    """Every page and export of the catalogue, in memory (event assets are placed separately)."""
    env = make_environment()
    site = Site()
    derived = [b.derived for b in bundles]
    common = {"settings": settings, "catalogue_title": settings.title, "audience": audience}
    for fig in index_figures:
        site.add(fig.path, fig.svg)
    rows = [export.event_row(d) for d in derived]
    site.add(
        "index.html",
        env.get_template("index.html").render(
            page_path="index.html",
            rows=rows,
            description=settings.description,
            index_figures=index_figures,
            **common,
        ),
    )
    for i, bundle in enumerate(bundles):
        neighbours = (
            derived[i - 1] if i else None,
            derived[i + 1] if i + 1 < len(derived) else None,
        )
        render_event(env, site, bundle, *neighbours, common)
    site.add(
        "methods.html",
        env.get_template("methods.html").render(
            page_path="methods.html",
            **pages.methods_context(derived, reference_for(settings)),
            **common,
        ),
    )
    entries = feed.change_entries(derived)
    site.add(
        "changes.html",
        env.get_template("changes.html").render(
            page_path="changes.html", entries=entries, **common
        ),
    )
    site.add("feed.xml", feed.atom_feed(entries, settings))
    table = tables.catalogue_table(derived)
    site.add("data/catalogue.ecsv", tables.write_ecsv(table))
    site.add("data/catalogue.csv", tables.write_csv(table))
    for path in sorted(p for p in (templates_dir() / "static").rglob("*") if p.is_file()):
        site.add(
            f"static/{path.relative_to(templates_dir() / 'static').as_posix()}", path.read_bytes()
        )
    return site


def render_event(
    env: jinja2.Environment,
    site: Site,
    bundle: EventBundle,
    previous: Derived | None,
    following: Derived | None,
    common: dict,
) -> None:
    """The sheet of one event and its JSON (its figures and sound are made in assets)."""
    item = bundle.derived
    page = f"events/{item.event.id}.html"
    context = export.event_context(item, previous, following)
    site.add(
        page,
        env.get_template("event.html").render(
            page_path=page,
            figures=bundle.figures,
            headline=pages.headline(item),
            history=pages.history_steps(item),
            audio={"path": bundle.audio_path, "description": bundle.audio_description},
            **context,
            **common,
        ),
    )
    site.add(
        f"data/{item.event.id}.json",
        json.dumps(export.event_json(item), indent=2, sort_keys=False) + "\n",
    )
