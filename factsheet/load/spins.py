"""The rules that tie an estimate's spin keys together (input format version 2).

A body's spin is given either as its aligned component (``spin``) or as a magnitude with its
tilt (``spin_magnitude`` and ``tilt``, always together); ``effective_spin`` replaces both
bodies' spins; ``precession_spin`` may accompany aligned spins or ``effective_spin`` but not
tilts (the tilts already say how much spin lies in the orbital plane). A precession spin is
carried by the heavier body, so its aligned spin must leave room for it: ``chi1z² + chi_p² <= 1``
at the medians. Each rule returns ``(key, message)`` pairs, the key relative to the section.
"""

from __future__ import annotations

import math
from typing import Any

from factsheet.model import Body


def body_problems(values: dict[str, Any]) -> list[tuple[str, str]]:
    """Problems of one body's spin keys (``values`` are the body's checked values)."""
    found = []
    if "spin" in values and ("spin_magnitude" in values or "tilt" in values):
        other = "spin_magnitude" if "spin_magnitude" in values else "tilt"
        found.append(
            (
                other,
                "give either spin (the aligned component) or spin_magnitude with tilt, not both",
            )
        )
    elif "spin_magnitude" in values and "tilt" not in values:
        found.append(
            ("spin_magnitude", "a spin magnitude needs its tilt (e.g. tilt: 60 +40 -40 deg)")
        )
    elif "tilt" in values and "spin_magnitude" not in values:
        found.append(
            ("tilt", "a tilt needs its spin magnitude (e.g. spin_magnitude: 0.4 +0.4 -0.3)")
        )
    return found


def _has_tilt(body: Body) -> bool:
    return body.spin_magnitude is not None or body.tilt is not None


def estimate_problems(values: dict[str, Any]) -> list[tuple[str, str]]:
    """Problems between the bodies' spins, ``effective_spin`` and ``precession_spin``."""
    heavier, lighter = values["heavier"], values["lighter"]
    bodies_given = any(b.spin is not None or _has_tilt(b) for b in (heavier, lighter))
    if "effective_spin" in values and bodies_given:
        return [("effective_spin", "give either effective_spin or the bodies' spin, not both")]
    chi_p = values.get("precession_spin")
    if chi_p is None:
        return []
    if _has_tilt(heavier) or _has_tilt(lighter):
        return [
            (
                "precession_spin",
                "the tilts already give the in-plane spins: leave precession_spin out, or give "
                "the bodies' aligned components as spin instead of spin_magnitude and tilt",
            )
        ]
    aligned = values.get("effective_spin") or heavier.spin
    chi1z = 0.0 if aligned is None else aligned.median
    if math.hypot(chi1z, chi_p.median) > 1:
        room = math.sqrt(max(0.0, 1 - chi1z * chi1z))
        return [
            (
                "precession_spin",
                f"a precession spin of {chi_p.median:g} with the heavier body's aligned spin "
                f"{chi1z:g} makes its spin {math.hypot(chi1z, chi_p.median):.3g}, above 1 (the "
                f"precession spin is carried by the heavier body: expected at most {room:.3g} "
                "at the median)",
            )
        ]
    return []
