"""A site in two languages (catalogue.yaml ``languages: [en, es]``), built from one catalogue.

The first language is at the site root and the second under ``es/`` with the same file names;
every page says its language and links its other version; the exports are written once, in
English; the physics and the sounds are made once for both languages.
"""

from __future__ import annotations

import json
import re
from html.parser import HTMLParser
from pathlib import Path

import pytest
from helpers import VALID_EVENT

from factsheet import derive as derive_module
from factsheet import i18n
from factsheet.build import build

pytestmark = pytest.mark.slow

SETTINGS = "title: A test catalogue\nlanguages: [en, es]\n"


class Links(HTMLParser):
    """The language, the alternates and every local link of one page."""

    def __init__(self):
        super().__init__()
        self.lang, self.alternates, self.links, self.switch = None, {}, [], []
        self._in_switch = False

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag == "html":
            self.lang = a.get("lang")
        if tag == "link" and a.get("rel") == "alternate" and "hreflang" in a:
            self.alternates[a["hreflang"]] = a["href"]
        if tag == "nav" and "languages" in (a.get("class") or ""):
            self._in_switch = True
        if self._in_switch and tag == "a":
            self.switch.append(a["href"])
        for name in ("href", "src"):
            value = a.get(name)
            if value and not re.match(r"^(#|data:|https?:|mailto:)", value):
                self.links.append(value.split("#")[0])

    def handle_endtag(self, tag):
        if tag == "nav":
            self._in_switch = False


def parsed(path: Path) -> Links:
    page = Links()
    page.feed(path.read_text(encoding="utf-8"))
    return page


@pytest.fixture(scope="module")
def two_languages(tmp_path_factory) -> tuple[Path, list]:
    folder = tmp_path_factory.mktemp("cat")
    (folder / "catalogue.yaml").write_text(SETTINGS, encoding="utf-8")
    (folder / "one.yaml").write_text(VALID_EVENT, encoding="utf-8")
    (folder / "two.yaml").write_text(VALID_EVENT.replace("TEST-1", "TEST-2"), encoding="utf-8")
    derived = []
    original = derive_module.derive_event

    def counting(*args, **kwargs):
        derived.append(args[0].id)
        return original(*args, **kwargs)

    derive_module.derive_event = counting
    try:
        out = tmp_path_factory.mktemp("out") / "site"
        build(folder, out, jobs=1)
    finally:
        derive_module.derive_event = original
    return out, derived


def test_each_language_has_the_same_pages(two_languages):
    site, _ = two_languages
    root = {p.relative_to(site).as_posix() for p in site.rglob("*.html") if "es" not in p.parts}
    spanish = {p.relative_to(site / "es").as_posix() for p in (site / "es").rglob("*.html")}
    assert root == spanish
    assert {"index.html", "methods.html", "changes.html", "events/TEST-1.html"} <= root
    assert (site / "es" / "feed.xml").is_file()


def test_every_page_says_its_language_and_links_its_other_version(two_languages):
    site, _ = two_languages
    for page in site.rglob("*.html"):
        found = parsed(page)
        spanish = page.relative_to(site).parts[0] == "es"
        assert found.lang == ("es" if spanish else "en"), page
        assert set(found.alternates) == {"en", "es", "x-default"}, page
        other = found.alternates["en" if spanish else "es"]
        assert (page.parent / other).resolve().is_file(), (page, other)
        assert found.switch == [other], page  # the visible switch links the other version
        name = page.relative_to(site / "es" if spanish else site).as_posix()
        assert (page.parent / other).resolve() == (
            (site / name) if spanish else (site / "es" / name)
        ).resolve()


def test_every_local_link_of_every_page_reaches_a_file(two_languages):
    site, _ = two_languages
    for page in site.rglob("*.html"):
        for link in parsed(page).links:
            assert (page.parent / link).resolve().is_file(), (page, link)


def test_exports_are_written_once_in_english(two_languages):
    site, _ = two_languages
    assert not (site / "es" / "data").exists()
    data = json.loads((site / "data" / "TEST-1.json").read_text(encoding="utf-8"))
    texts = [c["text"] for c in data["caveats"]]
    assert texts and all(re.search(r"\b(the|of|and|is)\b", t) for t in texts)


def test_physics_and_sound_are_made_once_for_both_languages(two_languages):
    site, derived = two_languages
    assert sorted(derived) == ["TEST-1", "TEST-2"]
    assert not list((site / "es").rglob("*.wav"))
    page = (site / "es" / "events" / "TEST-1.html").read_text(encoding="utf-8")
    sound = re.search(r'<audio[^>]*src="([^"]+)"', page)
    assert sound and sound.group(1) == "../../events/TEST-1.wav"


def test_spanish_pages_are_in_spanish(two_languages):
    site, _ = two_languages
    page = (site / "es" / "events" / "TEST-1.html").read_text(encoding="utf-8")
    assert ">Eventos<" in page and ">Métodos<" in page
    index = (site / "es" / "index.html").read_text(encoding="utf-8")
    assert 'lang="es"' in index


# Words that English sentences cannot do without and Spanish never uses: one of them in a
# Spanish page's own text is a string of the interface left untranslated.
ENGLISH = re.compile(
    r"\b(the|of|and|with|from|is|are|this|that|which|for|not|was|were|has|have|been|than|"
    r"between|about|only|each|when|where|shown|given|"
    # and words of the interface's labels that Spanish writes otherwise
    r"mass|masses|distance|energy|radiated|remnant|spin|sky|window|windows|status|class|"
    r"date|candidate|confirmed|retracted|events?|sheets?|heavier|lighter|merger|signal)\b",
    re.IGNORECASE,
)


class Words(HTMLParser):
    """The text a reader sees or hears (text, alt, title, aria-label), outside elements marked
    with another language and outside scripts, styles and bibliographic references."""

    SKIP = frozenset({"script", "style", "cite", "code", "pre"})
    VOID = frozenset({"img", "br", "meta", "link", "input", "source", "hr", "wbr"})
    READ = frozenset({"description", "og:title", "og:description", "og:image:alt"})

    def __init__(self, language: str):
        super().__init__()
        self.language, self.stack, self.words = language, [], []

    def _hidden(self) -> bool:
        return any(
            tag in self.SKIP or lang not in (None, self.language) for tag, lang in self.stack
        )

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if tag not in self.VOID:
            self.stack.append((tag, a.get("lang")))
        if not self._hidden() and a.get("lang") in (None, self.language):
            for name in ("alt", "title", "aria-label", "placeholder"):
                if a.get(name):
                    self.words.append(a[name])
            if tag == "meta" and (a.get("name") or a.get("property")) in self.READ:
                self.words.append(a.get("content", ""))
            if any(k.startswith("data-ui-") for k in a):  # the index script's words
                self.words.extend(v for k, v in a.items() if k.startswith("data-ui-") and v)

    def handle_endtag(self, tag):
        while self.stack:
            if self.stack.pop()[0] == tag:
                break

    def handle_data(self, data):
        if not self._hidden():
            self.words.append(data)


def english_left(page: Path, language: str, allowed: tuple[str, ...]) -> list[str]:
    words = Words(language)
    words.feed(page.read_text(encoding="utf-8"))
    text = re.sub(r"\{\w+\}", " ", " ".join(w for w in words.words if w.strip()))  # {shown}
    for phrase in allowed:
        text = text.replace(phrase, " ")
    return [text[max(0, m.start() - 40) : m.end() + 40] for m in ENGLISH.finditer(text)]


def test_no_english_is_left_on_the_spanish_demo(demo_site):
    """Every Spanish page of the demo: no interface string left in English."""
    from factsheet.load import load_catalogue
    from factsheet.resources import demo_dir

    settings = load_catalogue(demo_dir()).settings
    assert "es" in settings.languages
    allowed = (
        str.__str__(settings.title),  # the catalogue's own title, as its editors gave it
        "Energy Institute, Statistical Review of World Energy",  # a cited report, in a sources cell
    )
    pages = sorted((demo_site / "es").rglob("*.html"))
    assert len(pages) > 10
    leaks = {p.relative_to(demo_site).as_posix(): english_left(p, "es", allowed) for p in pages}
    assert {k: v for k, v in leaks.items() if v} == {}


def test_a_sheet_from_the_build_cache_reads_as_a_fresh_one_in_every_language():
    """Every kept message survives the cache's JSON: the Spanish page of a bundle read back
    from the cache is the page of the freshly made bundle."""
    from factsheet.build import event_bundle
    from factsheet.cache import bundle_from_json, bundle_to_json
    from factsheet.i18n import use_language
    from factsheet.load import load_catalogue
    from factsheet.load.reference import reference_for
    from factsheet.render import sheet
    from factsheet.render.environment import make_environment
    from factsheet.render.site import Renderer
    from factsheet.resources import demo_dir

    catalogue = load_catalogue(demo_dir())
    settings, reference = catalogue.settings, reference_for(catalogue.settings)
    env = make_environment()
    for event in catalogue.events[:3]:
        fresh = event_bundle(event, settings, reference)
        stored = json.loads(json.dumps(bundle_to_json(fresh)), object_hook=i18n.json_hook)
        again = bundle_from_json(stored, event, settings, reference)
        for language in settings.languages:
            pages = []
            for bundle in (fresh, again):
                with use_language(language):
                    context = sheet.event_page(
                        bundle.derived, None, None, bundle.figures[language], bundle.audio
                    )
                    renderer = Renderer(env, settings, "public", "", language)
                    pages.append(renderer.page("event.html", "events/x.html", context))
            assert pages[0] == pages[1], (event.id, language)
