"""Caveats: short records of an assumption or a limit that a reader must know about.

Each rule is a small function of the event and what derive found; it returns a
:class:`Caveat` or None. :func:`input_caveats` runs the rules that depend only on the input.

Derive runs once for every language, so a caveat's text is a kept message
(:class:`~factsheet.i18n.Text`): its ``str`` value is the English wording the exports carry,
and each page shows it in its reader's language. Numbers go in as :class:`~factsheet.i18n.Later`
values (written in the reader's digits when shown), lists as :func:`listed` (joined with the
reader's words), and every variant of a sentence is a whole message of its own.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet import labels
from factsheet.derive import masses
from factsheet.derive.sampling import (
    Ranges,
    drawn_bounds,
    drawn_from_summary,
    used_paths,
    value_range,
)
from factsheet.i18n import (
    SOURCE,
    Later,
    Plural,
    Text,
    current,
    localize_number,
    pgettext,
)
from factsheet.model import Caveat, Event, Summary
from factsheet.notation import format_given_median, format_median, how_often

# --- words shown later: numbers and lists in the reader's language ------------------------------


def general(value: float, spec: str = "g") -> str:
    """``value`` as ``format(value, spec)`` writes it (``g``, ``.3g``): exactly so in English,
    with the language's decimal sign and minus sign in another language."""
    text = format(value, spec)
    if current() == SOURCE:
        return text
    mantissa, e, power = text.partition("e")
    return localize_number(mantissa) + e + power


def share(fraction: float) -> str:
    """A fraction as a whole percentage, rounded as ``format(fraction, ".0%")`` rounds it."""
    digits = format(fraction, ".0%").removesuffix("%")
    return pgettext("whole percentage", "{number}%").format(number=localize_number(digits))


def _patterns(how: str) -> tuple[str, str]:
    """The patterns that add an item to a list: one for the middle items, one for the last."""
    if how == "and":
        return pgettext("list", "{head}, {item}"), pgettext(
            "list ending with and", "{head} and {item}"
        )
    if how == "nor":  # what something lacks: "does not give a, b or c"
        return pgettext("list", "{head}, {item}"), pgettext(
            "list of what is missing, ending with or", "{head} or {item}"
        )
    if how == "clauses":
        return pgettext("list of clauses", "{head}; {item}"), pgettext(
            "list of clauses ending with and", "{head}; and {item}"
        )
    if how == "numbers":
        return pgettext("list of numbers", "{head}, {item}"), pgettext(
            "list of numbers, last item", "{head}, {item}"
        )
    return pgettext("list", "{head}, {item}"), pgettext("list, last item", "{head}, {item}")


def listed(items: tuple, how: str = "plain") -> str:
    """Items (texts, numbers to show later) joined in the language in use: ``how`` is ``and``,
    ``nor`` (what something lacks; "or" in English), ``clauses`` (joined by semicolons),
    ``numbers`` or ``plain`` (commas only, in English)."""
    shown = [str(item) for item in items]
    if len(shown) < 2:
        return "".join(shown)
    middle, last = _patterns(how)
    head = shown[0]
    for item in shown[1:-1]:
        head = middle.format(head=head, item=item)
    return last.format(head=head, item=shown[-1])


def sentence_start(value: object) -> str:
    """``value`` as shown, with its first letter upper-case, to start a sentence."""
    text = str(value)
    return text[:1].upper() + text[1:]


# --- the rules ------------------------------------------------------------------------------------


def status_caveat(event: Event, far_threshold: u.Quantity | None = None) -> Caveat | None:
    """A candidate or a retraction; a candidate's caveat also says how often noise alone makes
    such a signal when its false-alarm rate is above ``far_threshold`` (one box, not two)."""
    if event.status == "candidate":
        far = event.detection.false_alarm_rate
        if far is not None and far_threshold is not None and far > far_threshold:
            text = Text(
                "This is a candidate: it has not been confirmed as an astrophysical signal and "
                "may be withdrawn. Noise alone would make a signal like this {how_often}, so "
                "treat it as marginal.",
                how_often=_how_often(far),
            )
        else:
            text = Text(
                "This is a candidate: it has not been confirmed as an astrophysical signal "
                "and may be withdrawn."
            )
        return Caveat("candidate", "warning", text)
    if event.status == "retracted":
        return Caveat(
            "retracted",
            "warning",
            Text(
                "This candidate was retracted: it is not considered "
                "an astrophysical signal. The numbers are kept for the record only."
            ),
        )
    return None


def _how_often(far: u.Quantity) -> Later:
    """How often noise alone makes such a signal, in words of the reader's language."""
    return Later(how_often, float(far.to_value(1 / u.yr)))


def sampling_caveat(event: Event) -> Caveat | None:
    if event.samples is not None:
        return _partly_drawn_caveat(event)
    if masses.through_chirp_mass(event.estimate):
        return Caveat(
            "independent-sampling",
            "notice",
            Text(
                "The two masses were drawn through the chirp mass, which keeps its measured "
                "interval, and the mass ratio; otherwise each parameter was sampled independently "
                "from its summary interval, so other correlations (for example between the mass "
                "ratio and the spins) are lost; derived intervals are approximate."
            ),
        )
    return Caveat(
        "independent-sampling",
        "notice",
        Text(
            "Each parameter was sampled independently from "
            "its summary interval, so correlations between parameters (for example between "
            "the two masses) are lost; derived intervals are approximate."
        ),
    )


def mass_ratio_caveat(event: Event) -> Caveat | None:
    """The chirp mass without a mass ratio: say where the ratio of the draws comes from."""
    if event.samples is not None or not masses.through_chirp_mass(event.estimate):
        return None
    source = masses.mass_ratio_source(event.estimate)
    concerns = ("heavier_mass", "lighter_mass", "mass_ratio")
    if source == masses.FROM_MASSES:
        return Caveat(
            "mass-ratio-from-masses",
            "notice",
            Text(
                "No mass ratio was given: each draw takes the ratio of the two masses drawn "
                "independently from their intervals and keeps the chirp mass drawn from its own, "
                "so the masses behind the derived numbers may spread less or more than those "
                "given (the table shows the masses as given)."
            ),
            concerns=concerns,
        )
    if source == masses.ASSUMED:
        low, high = masses.ASSUMED_MASS_RATIO
        return Caveat(
            "mass-ratio-assumed",
            "warning",
            Text(
                "Only the chirp mass was given: the mass ratio was assumed to lie anywhere "
                "between {low} and {high} with equal probability (an assumption, not a "
                "measurement), so the two masses and every number that depends on them rest on "
                "that assumption.",
                low=Later(general, low),
                high=Later(general, high),
            ),
            concerns=concerns,
        )
    return None


def limit_caveat(event: Event, level: float, ranges: Ranges | None = None) -> Caveat | None:
    """A bound given on a physical limit (a mass ratio's upper bound of 1, a spin's of 1): the
    draws cannot reach it without piling samples onto the limit, so their bound moves inward;
    say by how much (the table shows the value as given)."""
    moved = []
    for path in drawn_paths(event):
        value = event.estimate[path]
        limits = value_range(path, ranges)
        low, high = drawn_bounds(value, level, limits)
        for drawn, given in ((low, value.low), (high, value.high)):
            if drawn != given:
                moved.append(
                    Text(
                        "{drawn} for {name} instead of {given}",
                        drawn=Later(general, float(drawn), ".3g"),
                        name=labels.QUANTITIES[path.replace(".", "_")].in_prose,
                        given=Later(general, float(given), ".3g"),
                    )
                )
    if not moved:
        return None
    # TRANSLATORS: {bounds} lists one or more items "0.98 for the mass ratio instead of 1";
    # English says "bound is" either way, other languages may choose by {n}.
    text = Plural(
        "An interval given up to a physical limit cannot be drawn without piling samples onto "
        "the limit, so the draws behind the derived numbers stop short of it: their credible "
        "bound is {bounds}. The table shows the values as given.",
        "An interval given up to a physical limit cannot be drawn without piling samples onto "
        "the limit, so the draws behind the derived numbers stop short of it: their credible "
        "bound is {bounds}. The table shows the values as given.",
        len(moved),
        bounds=Later(listed, tuple(moved), "and"),
    )
    return Caveat("bound-at-limit", "info", text)


def drawn_paths(event: Event) -> list[str]:
    """The estimate's values that are drawn from their summaries (all of them without a
    samples file); the masses not when they are drawn through the chirp mass with a ratio."""
    if event.samples is not None:
        return drawn_from_summary(event)
    paths = list(event.estimate.values())
    if masses.mass_ratio_source(event.estimate) == masses.GIVEN:
        paths = [p for p in paths if p not in ("heavier.mass", "lighter.mass")]
    return paths


def _partly_drawn_caveat(event: Event) -> Caveat | None:
    """With a samples file: the values drawn from the summary because the file lacks them."""
    drawn = tuple(
        labels.QUANTITIES[path.replace(".", "_")].in_prose for path in drawn_from_summary(event)
    )
    if not drawn:
        return None
    return Caveat(
        "partly-independent-sampling",
        "notice",
        Plural(
            "The samples file does not give {names}: this value was drawn independently from "
            "the summary, so its correlations with the other parameters are lost.",
            "The samples file does not give {names}: these values were drawn independently from "
            "the summary, so their correlations with the other parameters are lost.",
            len(drawn),
            names=Later(listed, drawn, "nor"),
        ),
    )


def spin_caveat(event: Event) -> Caveat | None:
    given = used_paths(event)
    bodies = [b for b in ("heavier", "lighter") if given & {f"{b}.spin", f"{b}.spin_magnitude"}]
    if bodies:
        if len(bodies) == 2:
            return None
        if bodies == ["heavier"]:
            text = Text(
                "The lighter body's spin was not given: it was taken as zero for the remnant fits."
            )
        else:
            text = Text(
                "The heavier body's spin was not given: it was taken as zero for the remnant fits."
            )
        return Caveat("spin-assumed-zero", "notice", text)
    if "effective_spin" in given:
        return Caveat(
            "spins-from-effective-spin",
            "notice",
            Text(
                "Only the effective spin was given: "
                "both aligned spin components were set equal to it for the remnant fits."
            ),
        )
    if "precession_spin" in given:
        return Caveat(
            "aligned-spins-assumed-zero",
            "notice",
            Text(
                "Only the effective precession spin was given: the spins along the orbit were "
                "taken as zero for the remnant fits."
            ),
        )
    return Caveat(
        "spins-assumed-zero",
        "notice",
        Text("No spins were given: both bodies were taken as non-spinning for the remnant fits."),
    )


def redshift_caveat(event: Event, cosmology: str) -> Caveat | None:
    if event.estimate.redshift is not None:
        return None
    return Caveat(
        "redshift-from-cosmology",
        "info",
        Text(
            "The redshift, and from it the source-frame masses, follow from the luminosity "
            "distance under the {cosmology} cosmology.",
            cosmology=cosmology,
        ),
    )


def editorial_caveats(event: Event) -> list[Caveat]:
    return [
        Caveat(f"editorial-{i + 1}", "notice", text, editorial=True)
        for i, text in enumerate(event.caveats)
    ]


def input_caveats(
    event: Event, cosmology: str, far_threshold: u.Quantity | None = None
) -> list[Caveat]:
    """Caveats that follow from the input alone, most important first."""
    found = [
        status_caveat(event, far_threshold),
        sampling_caveat(event),
        mass_ratio_caveat(event),
        spin_caveat(event),
        redshift_caveat(event, cosmology),
    ]
    return [c for c in found if c is not None] + editorial_caveats(event)


def significance_caveats(
    event: Event,
    far_threshold: u.Quantity,
    sky_threshold: u.Quantity,
    map_area: u.Quantity | None = None,
) -> list[Caveat]:
    """Low significance (of a confirmed event: a candidate's own caveat says it) and large sky
    area, the sky map's 90 % area when there is a map (thresholds are common practice, not a
    standard)."""
    notes = []
    far = event.detection.false_alarm_rate
    sky = event.detection.sky_area if map_area is None else map_area
    if far is not None and far > far_threshold and event.status == "confirmed":
        notes.append(
            Caveat(
                "low-significance",
                "warning",
                Text(
                    "Noise alone would make a signal like this {how_often}, so treat it as "
                    "marginal.",
                    how_often=_how_often(far),
                ),
            )
        )
    if sky is not None and sky > sky_threshold:
        notes.append(
            Caveat(
                "large-sky-area",
                "notice",
                Text(
                    "The source is localised only to {area} square degrees, a large area to "
                    "search for a counterpart.",
                    area=Later(general, float(sky.to_value(u.deg**2)), ".0f"),
                ),
            )
        )
    return notes


#: A shift of the drawn median beyond this share of the interval's half-width is worth saying.
RELABEL_MATTERS = 0.02


def relabel_caveat(given: dict[str, Summary], drawn: dict[str, np.ndarray]) -> Caveat | None:
    """When relabelling the draws heavier-first moved a mass's median visibly away from the
    given one (the two intervals overlap), say that the derived numbers rest on the relabelled
    draws while the table shows the masses as given."""
    moved = []
    for key in ("heavier_mass", "lighter_mass", "heavier_mass_detector", "lighter_mass_detector"):
        if key not in given or key not in drawn:
            continue
        g = given[key]
        half = (g.high - g.low) / 2
        median = float(np.median(drawn[key]))
        if half > 0 and abs(median - g.median) > RELABEL_MATTERS * half:
            shown, was = (
                format_median(median, g.low, g.high),
                format_given_median(g.median, g.low, g.high),
            )
            if shown != was:  # a shift the table's precision hides is not worth a caveat
                moved.append(
                    Text(
                        "{label} {median} instead of {given}",
                        label=labels.QUANTITIES[key].short,
                        median=Later(format_median, median, g.low, g.high),
                        given=Later(format_given_median, g.median, g.low, g.high),
                    )
                )
    if not moved:
        return None
    return Caveat(
        "relabelled-draws",
        "info",
        Text(
            "The two masses' intervals overlap, so in some draws the lighter body came out "
            "heavier and the two were swapped; the derived numbers rest on these draws, whose "
            "medians are {medians} (the table shows the masses as given).",
            medians=Later(listed, tuple(moved), "and"),
        ),
        concerns=(),
    )
