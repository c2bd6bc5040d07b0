"""Caveats: short records of an assumption or a limit that a reader must know about.

Each rule is a small function of the event and what derive found; it returns a
:class:`Caveat` or None. :func:`input_caveats` runs the rules that depend only on the input.
"""

from __future__ import annotations

from dataclasses import asdict, dataclass

from factsheet.model import Event


@dataclass(frozen=True)
class Caveat:
    """One caveat: a stable code, a level (info, notice, warning) and plain text."""

    code: str
    level: str
    text: str
    editorial: bool = False

    def as_dict(self) -> dict[str, str]:
        data = asdict(self)
        if not self.editorial:
            del data["editorial"]
        return data


def status_caveat(event: Event) -> Caveat | None:
    if event.status == "candidate":
        return Caveat(
            "candidate",
            "warning",
            "This is a candidate: it has not been confirmed as an "
            "astrophysical signal and may be withdrawn.",
        )
    if event.status == "retracted":
        return Caveat(
            "retracted",
            "warning",
            "This candidate was retracted: it is not considered "
            "an astrophysical signal. The numbers are kept for the record only.",
        )
    return None


def sampling_caveat(event: Event) -> Caveat | None:
    if event.samples is not None:
        return None
    return Caveat(
        "independent-sampling",
        "notice",
        "Each parameter was sampled independently from "
        "its summary interval, so correlations between parameters (for example between "
        "the two masses) are lost; derived intervals are approximate.",
    )


def spin_caveat(event: Event) -> Caveat | None:
    params = event.parameters
    if "chi_eff" in params:
        return Caveat(
            "spins-from-effective-spin",
            "notice",
            "Only the effective spin was given: "
            "both aligned spin components were set equal to it for the remnant fits.",
        )
    if "spin_1z" not in params and "spin_2z" not in params:
        return Caveat(
            "spins-assumed-zero",
            "notice",
            "No spins were given: both components were taken as non-spinning for the remnant fits.",
        )
    return None


def redshift_caveat(event: Event, cosmology: str) -> Caveat | None:
    if "redshift" in event.parameters:
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


def input_caveats(event: Event, cosmology: str) -> list[Caveat]:
    """Caveats that follow from the input alone, most important first."""
    found = [
        status_caveat(event),
        sampling_caveat(event),
        spin_caveat(event),
        redshift_caveat(event, cosmology),
    ]
    return [c for c in found if c is not None] + editorial_caveats(event)
