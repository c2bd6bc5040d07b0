"""The context of a fact sheet: its numbers in groups that answer a reader's questions, and
each caveat placed where it helps.

Placement of the caveats (derive decides what they say; this module decides where they go):

* a **retraction** opens the page, before the headline;
* caveats about the **whole sheet** (a candidate's status, low significance, the editors' own
  caveats) are boxes before the numbers, most severe first, at most :data:`MAX_BOXES` (the rest
  follow the numbers);
* caveats about **some numbers** (a fit used outside its calibration, a mass on a band edge, an
  inspiral that ends below the band) are numbered notes under their group, and each row they
  concern carries the note's number;
* **routine** notes (independent sampling, the cosmology, assumed spins) are folded into one
  short "how these numbers were made" paragraph below the numbers;
* the counterpart-window notes go with the windows, the neutron-star notes with the remnant.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass

from factsheet import __version__, labels
from factsheet.derive.event import measured_names
from factsheet.i18n import (
    N_,
    Editorial,
    _,
    current,
    date_text,
    language_in_words,
    localize_number,
    ngettext,
)
from factsheet.model import Audio, Caveat, Derived, Edge, Event, FigureInfo, Summary
from factsheet.notation import (
    format_like_interval,
    format_value,
    percent,
)
from factsheet.physics.second_generation import MIN_MASS
from factsheet.render import prose
from factsheet.render.assets import samples_path
from factsheet.render.contexts import Link, display_summary, page_of, time_utc
from factsheet.render.history import HistoryStep, history_steps
from factsheet.render.index_page import sky_thumbnail
from factsheet.render.lensing import LENSING_NOTES, LensPanel, lens_panel
from factsheet.render.numbers import estimate_texts, value_text
from factsheet.render.sky import SkyPanel, sky_panel
from factsheet.render.windows import WindowRow, window_rows

MAX_BOXES = 3
SPREAD_MATTERS = 0.1  # a fit spread below a tenth of the interval's smaller side is not shown
LEVELS = ("warning", "notice", "info")  # most severe first
#: Caveats folded into the "how these numbers were made" paragraph.
ROUTINE = (
    "independent-sampling",
    "partly-independent-sampling",
    "spins-assumed-zero",
    "spin-assumed-zero",
    "spins-from-effective-spin",
    "redshift-from-cosmology",
    "relabelled-draws",
    "bound-at-limit",
    "mass-ratio-from-masses",
    "in-plane-spin-angles",
    "in-plane-spin-ignored",
)
WINDOW_NOTES = ("counterpart-windows-planning-aid", "windows-beyond-calendar")
REMNANT_NOTES = ("neutron-star-remnant", "neutron-star-disrupted", "neutron-star-plunges")
IN_PROSE = ("large-sky-area", "retracted")  # said by the detection sentence or the opening
STANDING = N_(
    "These numbers are derived from published fits applied to the summary given, not from a "
    "full re-analysis of the data."
)
#: Figures by the group they stand beside (by the end of their file name).
FIGURE_GROUPS = {
    "-masses.svg": "bodies",
    "-energy.svg": "remnant",
    "-luminosity.svg": "remnant",
    "-track.svg": "signal",
    "-windows.svg": "windows",
    "-history.svg": "history",
    "-lensing.svg": "lensing",
    "-sky.svg": "sky",
}


@dataclass(frozen=True)
class Note:
    """A caveat about some numbers, numbered on the sheet; its rows carry the number."""

    number: int
    level: str
    text: str


@dataclass(frozen=True)
class Row:
    key: str
    label: str
    text: str  # the value as printed: an interval, a bound or an exact value
    kind: str  # a value of labels.KINDS
    spread: str  # the systematic (fits and model) where it matters at this precision, else ""
    marks: tuple[Note, ...]


@dataclass(frozen=True)
class Group:
    key: str
    heading: str
    rows: tuple[Row, ...]
    notes: tuple[Note, ...]
    text: tuple[str, ...]  # sentences the group needs (why remnant numbers are missing, ...)
    figures: tuple[FigureInfo, ...]


@dataclass(frozen=True)
class BandRow:
    subject: str
    percents: tuple[str, ...]  # one per band, in the order of labels.BANDS; they add to 100
    marks: tuple[Note, ...]


@dataclass(frozen=True)
class BandTable:
    columns: tuple[str, ...]
    rows: tuple[BandRow, ...]
    intermediate: tuple[tuple[str, str], ...]  # (subject, probability) of intermediate mass
    threshold: str
    edges: tuple[Edge, ...]


@dataclass(frozen=True)
class ComparisonRow:
    kind: str  # energy or luminosity
    label: str
    ratio: str


@dataclass(frozen=True)
class EventPage:
    """The context of ``events/<id>.html``."""

    event: Event
    item: Derived
    time_utc: str
    opening: tuple[str, ...]  # the retraction, said first; empty otherwise
    headline: tuple[str, ...]
    detection: tuple[str, ...]
    boxes: tuple[Caveat, ...]  # before the numbers, most severe first
    later: tuple[Caveat, ...]  # sheet-wide caveats beyond MAX_BOXES, after the numbers
    groups: tuple[Group, ...]
    bands: BandTable | None
    lensing: LensPanel | None  # the what-if-lensed panel, after the numbers' groups
    made: tuple[str, ...]  # the "how these numbers were made" paragraph
    earlier: tuple[str, ...]  # could a body come from an earlier merger (sentences), or ()
    windows: tuple[WindowRow, ...]
    window_text: tuple[str, ...]
    window_figures: tuple[FigureInfo, ...]
    sky: SkyPanel | None  # where in the sky: the map and the counterpart candidates
    comparison_rows: tuple[ComparisonRow, ...]
    history: tuple[HistoryStep, ...]
    history_figures: tuple[FigureInfo, ...]
    figures: tuple[FigureInfo, ...]  # every figure, for the downloads
    audio: Audio | None  # none for a retracted event: no sound of a non-event
    share_image: str  # site path of the sharing image, or ""
    share_alt: str  # what the sharing image shows, in words
    description: str  # one-sentence page description for the metadata
    previous: Link | None
    next: Link | None
    json_path: str
    samples_path: str  # the published copy of the input's samples file, or ""
    estimate_date: str  # the date the sheet's estimate is known by (see estimate_date())
    version: str  # the factsheet version that made the sheet
    # says that some of the editors' texts are shown in their original language, or ""
    original_note: str = ""


def place(caveats: Iterable[Caveat]) -> dict[str, list[Caveat]]:
    """Each caveat by where the sheet shows it: boxes, rows, routine, windows, remnant, prose
    and the what-if-lensed panel."""
    found: dict[str, list[Caveat]] = {
        k: [] for k in ("boxes", "rows", "routine", "windows", "remnant", "prose", "lensing")
    }
    for c in caveats:
        if c.code in LENSING_NOTES:
            found["lensing"].append(c)
        elif c.code in ROUTINE:
            found["routine"].append(c)
        elif c.code in WINDOW_NOTES:
            found["windows"].append(c)
        elif c.code in REMNANT_NOTES:
            found["remnant"].append(c)
        elif c.code in IN_PROSE:
            found["prose"].append(c)
        elif c.concerns:
            found["rows"].append(c)
        else:
            found["boxes"].append(c)
    found["boxes"].sort(key=lambda c: LEVELS.index(c.level))
    return found


def _row(key: str, s: Summary, kind: str, marks: tuple[Note, ...]) -> Row:
    label = labels.QUANTITIES[key].name
    return Row(key, label, value_text(s, kind), labels.KINDS[kind], spread_text(s), marks)


def spread_text(s: Summary) -> str:
    """The systematic apart from the interval (the spread between published fits, and for the
    remnant spin what unknown in-plane spin could add), where it matters: at least a tenth of
    the smaller side of the interval and not zero at the interval's precision."""
    smaller = min(s.high - s.median, s.median - s.low)
    if not s.fit_spread or s.fit_spread < SPREAD_MATTERS * smaller:
        return ""
    shown = format_like_interval(s.fit_spread, s.median, s.low, s.high, s.unit)
    return _("± {spread} systematic (fits and model)").format(spread=shown) if shown else ""


def numbered(caveats: list[Caveat]) -> list[tuple[Note, Caveat]]:
    """Row caveats numbered in page order (by the group of the first quantity each concerns)."""
    order = list(labels.GROUPS)
    ranked = sorted(caveats, key=lambda c: order.index(labels.QUANTITIES[c.concerns[0]].group))
    return [(Note(i, c.level, c.text), c) for i, c in enumerate(ranked, start=1)]


def groups(
    item: Derived, notes: list[tuple[Note, Caveat]], placed: dict[str, list[Caveat]],
    figures: tuple[FigureInfo, ...],
) -> tuple[Group, ...]:  # fmt: skip
    """The numbers in the sheet's groups, with their notes, marks and figures."""
    units, measured = item.settings.energy_units, measured_names(item.event)
    hidden = _hidden_rows(placed["rows"])
    out = []
    for key, heading in labels.GROUPS.items():
        rows = []
        for name, label in labels.QUANTITIES.items():
            if label.group != key or name not in item.quantities or name in hidden:
                continue
            kind = measured.get(name, "derived")
            marks = tuple(n for n, c in notes if name in c.concerns)
            shown = display_summary(item.quantities[name], units)
            rows.append(_row(name, shown, kind, marks))
        own = tuple(n for n, c in notes if labels.QUANTITIES[c.concerns[0]].group == key)
        text = tuple(c.text for c in placed["remnant"]) if key == "remnant" else ()
        figs = tuple(f for f in figures if _figure_group(f) == key)
        if rows or text:
            out.append(Group(key, heading, tuple(rows), own, text, figs))
    return tuple(out)


def _hidden_rows(caveats: list[Caveat]) -> set[str]:
    """Rows left out because they would print a number of no meaning: the time and cycles in
    band when the inspiral ends below the band (the note on the ISCO row says so)."""
    if any(c.code == "inspiral-below-band" for c in caveats):
        return {"time_in_band", "cycles_in_band"}
    return set()


def _figure_group(figure: FigureInfo) -> str:
    return next((g for end, g in FIGURE_GROUPS.items() if figure.path.endswith(end)), "")


def percents(probabilities: list[float]) -> tuple[str, ...]:
    """Whole percentages that add up to 100 (largest remainders get the spare points); a
    probability that rounds to zero but is not zero reads "<1 %"."""
    raw = [100 * p / (sum(probabilities) or 1) for p in probabilities]
    whole = [int(x) for x in raw]
    spare = 100 - sum(whole) if sum(probabilities) else 0
    for i in sorted(range(len(raw)), key=lambda i: whole[i] - raw[i])[:spare]:
        whole[i] += 1
    return tuple(
        "<1 %" if w == 0 and p > 0 else f"{w} %" for w, p in zip(whole, probabilities, strict=True)
    )


def band_table(item: Derived, notes: list[tuple[Note, Caveat]]) -> BandTable | None:
    """Mass-band probabilities of each subject (rows add up to 100 %), and intermediate mass
    as the separate question it is."""
    if not item.mass_bands:
        return None
    edges = item.reference.mass_bands
    keys = {"heavier": "heavier_mass", "lighter": "lighter_mass", "remnant": "remnant_mass"}
    rows = []
    for subject, probs in item.mass_bands.items():
        marks = tuple(
            n for n, c in notes if c.code == "band-straddles-edge" and keys[subject] in c.concerns
        )
        rows.append(
            BandRow(labels.SUBJECTS[subject], percents([probs[b] for b in labels.BANDS]), marks)
        )
    intermediate = tuple(
        (labels.SUBJECTS[s], percents([p, 1 - p])[0]) for s, p in item.intermediate_mass.items()
    )
    threshold = format_value(edges.intermediate_mass_min.value.to_value("solMass"), "solMass", 3)
    columns = tuple(labels.BANDS.values())
    return BandTable(columns, tuple(rows), intermediate, threshold, edges.edges())


def made(item: Derived, placed: dict[str, list[Caveat]]) -> tuple[str, ...]:
    """The routine notes, folded into one short paragraph below the numbers."""
    level = f"{localize_number(f'{round(100 * item.credible_level, 3):g}')}\u00a0%"
    text = [
        _(STANDING),
        _("Each value is a median with the bounds of its {level} credible interval.").format(
            level=level
        ),
        *(c.text for c in placed["routine"]),
    ]
    return tuple(text)


def earlier_merger(item: Derived) -> tuple[str, ...]:
    """For a body in or above the pair-instability gap: what a first-generation merger would
    leave, and how much of the body's mass and spin lies inside that, in words."""
    if not item.second_generation or item.event.status == "retracted":
        return ()
    g = item.second_generation[0]
    edge = item.reference.mass_bands.quantities()["pair_instability_lower"].to_value("solMass")
    mass = f"{format_value(g.mass.low, '', 2)}–{format_value(g.mass.high, 'solMass', 2)}"
    spin = f"{format_value(g.spin.low, '', 2)}–{format_value(g.spin.high, '', 2)}"
    text = [
        _(
            "Stars are not expected to leave black holes in the pair-instability gap, but a "
            "merger can. A merger of two black holes below the gap (each of {low}–{high} solar "
            "masses, with small spins in random directions) leaves a remnant of {mass} spinning "
            "at {spin} ({level} ranges, from the fits used above)."
        ).format(
            low=localize_number(f"{MIN_MASS:g}"),
            high=localize_number(f"{edge:g}"),
            mass=mass,
            spin=spin,
            level=percent(g.mass.level),
        )
    ]
    for found in item.second_generation:
        heavier = found.subject == "heavier"
        if found.spin_inside is None:
            if heavier:
                line = _(
                    "The heavier body's mass lies in that range for {mass_share} of its "
                    "samples; its spin was not given, so it cannot be compared."
                )
            else:
                line = _(
                    "The lighter body's mass lies in that range for {mass_share} of its "
                    "samples; its spin was not given, so it cannot be compared."
                )
            text.append(line.format(mass_share=_share(found.mass_inside)))
            continue
        if heavier:
            line = _(
                "The heavier body's mass lies in that range for {mass_share} of its samples; "
                "its spin along the orbit lies in the range such a remnant would show ({low} to "
                "{high}, its direction random) for {spin_share}."
            )
        else:
            line = _(
                "The lighter body's mass lies in that range for {mass_share} of its samples; "
                "its spin along the orbit lies in the range such a remnant would show ({low} to "
                "{high}, its direction random) for {spin_share}."
            )
        text.append(
            line.format(
                mass_share=_share(found.mass_inside),
                low=format_value(found.spin_along.low, "", 2),
                high=format_value(found.spin_along.high, "", 2),
                spin_share=_share(found.spin_inside),
            )
        )
    text.append(
        _(
            "This is a reasoning aid, not a verdict: the first-generation masses and spins are "
            "assumptions, and a body's mass and spin can fit this picture without coming from it."
        )
    )
    return tuple(text)


def _share(fraction: float) -> str:
    return "<1\u00a0%" if 0 < fraction < 0.005 else f"{round(100 * fraction)}\u00a0%"


def comparison_rows(item: Derived) -> tuple[ComparisonRow, ...]:
    """Energy and luminosity against the comparison objects, largest ratio first."""
    names, rows = item.reference.comparison_labels(), []
    compared = item.comparisons
    for kind, ratios in (("energy", compared.energy), ("luminosity", compared.luminosity)):
        for key, ratio in sorted(ratios.items(), key=lambda kv: -kv[1]):
            rows.append(ComparisonRow(kind, names.get(key, key), format_value(ratio, "", 2)))
    return tuple(rows)


def opening(event: Event) -> tuple[str, ...]:
    """A retracted event's first words: what was withdrawn, when and why (from the dated status
    change in its history when there is one)."""
    if event.status != "retracted":
        return ()
    change = next((h for h in reversed(event.history) if h.status == "retracted"), None)
    if change is None:
        return (_("Retracted: this candidate is no longer considered a real signal."),)
    line = _("Retracted on {date}: this candidate is no longer considered a real signal.").format(
        date=date_text(change.date.utc.datetime)
    )
    return (line, change.note) if change.note else (line,)


def event_page(
    item: Derived,
    previous: str | None,
    following: str | None,
    figures: tuple[FigureInfo, ...],
    audio: Audio,
) -> EventPage:
    """The context of one event page."""
    event, retracted = item.event, item.event.status == "retracted"
    thumbnail = sky_thumbnail(event.id)  # the index's: not a figure of the sheet
    placed = place(item.caveats)
    shown = tuple(f for f in figures if f.path.endswith(".svg") and f.path != thumbnail)
    if retracted:  # no comparisons for a non-event
        shown = tuple(f for f in shown if _figure_group(f) != "remnant")
    share = next((f for f in figures if f.path.endswith(".png")), None)
    notes = numbered(placed["rows"])
    headline = prose.headline(item)
    large_sky = any(c.code == "large-sky-area" for c in placed["prose"])
    return EventPage(
        event=event,
        item=item,
        time_utc=time_utc(event),
        opening=opening(event),
        headline=tuple(headline),
        detection=tuple(prose.detection(item, large_sky, rate_in_box=_rate_in_box(item, placed))),
        boxes=tuple(placed["boxes"][:MAX_BOXES]),
        later=tuple(placed["boxes"][MAX_BOXES:]),
        groups=groups(item, notes, placed, shown),
        bands=band_table(item, notes),
        lensing=lens_panel(item, placed["lensing"], shown),
        made=made(item, placed),
        earlier=earlier_merger(item),
        windows=window_rows(item),
        window_text=tuple(c.text for c in placed["windows"]),
        window_figures=tuple(f for f in shown if _figure_group(f) == "windows"),
        sky=sky_panel(item, tuple(f for f in shown if _figure_group(f) == "sky")),
        comparison_rows=() if retracted else comparison_rows(item),
        history=tuple(history_steps(event, estimate_texts(item))),
        history_figures=tuple(f for f in shown if _figure_group(f) == "history"),
        figures=shown,
        audio=None if retracted else audio,
        share_image=share.path if share else "",
        share_alt=share.alt if share else "",
        description=" ".join([*opening(event)[:1], headline[0]]),
        previous=previous and Link(previous, page_of(previous)),
        next=following and Link(following, page_of(following)),
        json_path=f"data/{event.id}.json",
        samples_path=samples_path(event),
        estimate_date=estimate_date(event),
        version=__version__,
        original_note=original_note(event, item.settings.languages[0]),
    )


def original_note(event: Event, first: str) -> str:
    """A sentence in the reader's language when some of the editors' texts of the sheet (its
    title, summary, caveats, history, candidates' notes) have no version in it and are shown in
    their original language; "" otherwise."""
    texts = [
        event.title,
        event.summary,
        *event.caveats,
        *(t for step in event.history for t in (step.label, step.note)),
        *(c.note for c in event.counterpart_candidates),
    ]
    shown = sorted(
        {
            next(iter(t.versions)) or first
            for t in texts
            if isinstance(t, Editorial) and t.missing_in(current(), first)
        }
    )
    if not shown:
        return ""
    return ngettext(
        "Some of the editors' texts on this sheet have no version in this language and are "
        "shown in their original language ({languages}).",
        "Some of the editors' texts on this sheet have no version in this language and are "
        "shown in their original languages ({languages}).",
        len(shown),
    ).format(languages=", ".join(language_in_words(x) for x in shown))


def _rate_in_box(item: Derived, placed: dict[str, list[Caveat]]) -> bool:
    """Whether a box before the numbers already gives the false-alarm rate in words (derive
    puts it in a candidate's box, or in a low-significance one, above the catalogue's rate)."""
    far = item.event.detection.false_alarm_rate
    high = far is not None and far > item.settings.low_significance_rate
    return high and any(c.code in ("candidate", "low-significance") for c in placed["boxes"])


def estimate_date(event: Event) -> str:
    """The estimate's date in words: the latest dated estimate in the history (the inputs date
    the current estimate no further: it is that one or a later one), or, when the history dates
    none, the merger's day, said as such."""
    dated = [h.date for h in event.history if h.estimate is not None]
    if dated:
        return _("estimate of {date} or later").format(date=date_text(dated[-1].utc.datetime))
    return _("current estimate, undated (merger {date})").format(
        date=date_text(event.time.utc.datetime)
    )
