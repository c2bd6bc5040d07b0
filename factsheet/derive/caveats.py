"""Caveats: short records of an assumption or a limit that a reader must know about.

Each rule is a small function of the event and what derive found; it returns a
:class:`Caveat` or None. :func:`input_caveats` runs the rules that depend only on the input.
"""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet import labels
from factsheet.derive.sampling import drawn_from_summary, used_paths
from factsheet.model import Caveat, Event, Summary
from factsheet.notation import format_given_median, format_median, how_often


def status_caveat(event: Event, far_threshold: u.Quantity | None = None) -> Caveat | None:
    """A candidate or a retraction; a candidate's caveat also says how often noise alone makes
    such a signal when its false-alarm rate is above ``far_threshold`` (one box, not two)."""
    if event.status == "candidate":
        text = (
            "This is a candidate: it has not been confirmed as an astrophysical signal "
            "and may be withdrawn."
        )
        far = event.detection.false_alarm_rate
        if far is not None and far_threshold is not None and far > far_threshold:
            text += f" {_noise_alone(far)}, so treat it as marginal."
        return Caveat("candidate", "warning", text)
    if event.status == "retracted":
        return Caveat(
            "retracted",
            "warning",
            "This candidate was retracted: it is not considered "
            "an astrophysical signal. The numbers are kept for the record only.",
        )
    return None


def _noise_alone(far: u.Quantity) -> str:
    return f"Noise alone would make a signal like this {how_often(far.to_value(1 / u.yr))}"


def sampling_caveat(event: Event) -> Caveat | None:
    if event.samples is not None:
        return _partly_drawn_caveat(event)
    return Caveat(
        "independent-sampling",
        "notice",
        "Each parameter was sampled independently from "
        "its summary interval, so correlations between parameters (for example between "
        "the two masses) are lost; derived intervals are approximate.",
    )


def _partly_drawn_caveat(event: Event) -> Caveat | None:
    """With a samples file: the values drawn from the summary because the file lacks them."""
    drawn = [
        labels.QUANTITIES[path.replace(".", "_")].in_prose for path in drawn_from_summary(event)
    ]
    if not drawn:
        return None
    these, their = ("this value was", "its") if len(drawn) == 1 else ("these values were", "their")
    return Caveat(
        "partly-independent-sampling",
        "notice",
        f"The samples file does not give {_listed(drawn)}: {these} drawn independently from "
        f"the summary, so {their} correlations with the other parameters are lost.",
    )


def _listed(words: list[str]) -> str:
    return words[0] if len(words) == 1 else ", ".join(words[:-1]) + " or " + words[-1]


def spin_caveat(event: Event) -> Caveat | None:
    given = used_paths(event)
    bodies = [b for b in ("heavier", "lighter") if given & {f"{b}.spin", f"{b}.spin_magnitude"}]
    if bodies:
        if len(bodies) == 2:
            return None
        missing = "lighter" if bodies == ["heavier"] else "heavier"
        return Caveat(
            "spin-assumed-zero",
            "notice",
            f"The {missing} body's spin was not given: it was taken as zero for the remnant fits.",
        )
    if "effective_spin" in given:
        return Caveat(
            "spins-from-effective-spin",
            "notice",
            "Only the effective spin was given: "
            "both aligned spin components were set equal to it for the remnant fits.",
        )
    if "precession_spin" in given:
        return Caveat(
            "aligned-spins-assumed-zero",
            "notice",
            "Only the effective precession spin was given: the spins along the orbit were "
            "taken as zero for the remnant fits.",
        )
    return Caveat(
        "spins-assumed-zero",
        "notice",
        "No spins were given: both bodies were taken as non-spinning for the remnant fits.",
    )


def redshift_caveat(event: Event, cosmology: str) -> Caveat | None:
    if event.estimate.redshift is not None:
        return None
    return Caveat(
        "redshift-from-cosmology",
        "info",
        f"The redshift, and from it the source-frame "
        f"masses, follow from the luminosity distance under the {cosmology} cosmology.",
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
        spin_caveat(event),
        redshift_caveat(event, cosmology),
    ]
    return [c for c in found if c is not None] + editorial_caveats(event)


def significance_caveats(
    event: Event, far_threshold: u.Quantity, sky_threshold: u.Quantity
) -> list[Caveat]:
    """Low significance (of a confirmed event: a candidate's own caveat says it) and large sky
    area (thresholds are common practice, not a standard)."""
    notes = []
    far, sky = event.detection.false_alarm_rate, event.detection.sky_area
    if far is not None and far > far_threshold and event.status == "confirmed":
        notes.append(
            Caveat(
                "low-significance",
                "warning",
                f"{_noise_alone(far)}, so treat it as marginal.",
            )
        )
    if sky is not None and sky > sky_threshold:
        notes.append(
            Caveat(
                "large-sky-area",
                "notice",
                f"The source is localised only to "
                f"{sky.to_value(u.deg**2):.0f} square degrees, a large "
                "area to search for a counterpart.",
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
            moved.append(
                f"{labels.QUANTITIES[key].short} {format_median(median, g.low, g.high)} "
                f"instead of {format_given_median(g.median, g.low, g.high)}"
            )
    if not moved:
        return None
    return Caveat(
        "relabelled-draws",
        "info",
        "The two masses' intervals overlap, so in some draws the lighter body came out heavier "
        "and the two were swapped; the derived numbers rest on these draws, whose medians are "
        f"{_listed(moved).replace(' or ', ' and ')} (the table shows the masses as given).",
        concerns=(),
    )
