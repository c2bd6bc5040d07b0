"""The method registry: every formula the site uses, with its source and range of validity.

Each physics module registers its methods here at import time. ``derive`` records the ids it used
for each quantity, checks samples against ``limits`` and the methods page is generated from
:data:`METHODS`. Pure data: no I/O.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np


@dataclass(frozen=True)
class Method:
    """A published method: formula, reference and calibration range.

    The texts are for readers of the methods page: ``formula``, ``validity`` and ``accuracy``
    are written in Unicode (η, χ₁, √, ≤, −), with ``^{...}`` and ``_{...}`` marking superscripts
    and subscripts (the page sets them as such); ``citation`` states the published source, and
    ``arxiv`` its arXiv id. ``provenance`` is for maintainers and is not published: how the
    coefficients or the citation were obtained (e.g. recalled from memory rather than re-read).

    ``limits`` maps a parameter name (``mass_ratio`` as m2/m1 <= 1, ``heavier_spin``,
    ``lighter_spin``, ``remnant_spin``, ...) to the closed interval ``(low, high)`` the method
    was calibrated on.
    """

    id: str
    title: str
    citation: str
    formula: str
    validity: str
    accuracy: str = "not stated"
    arxiv: str | None = None
    quantities: tuple[str, ...] = ()
    limits: dict[str, tuple[float, float]] = field(default_factory=dict)
    provenance: str = ""


METHODS: dict[str, Method] = {}


def register(method: Method) -> Method:
    """Add ``method`` to the registry; ids are unique."""
    if method.id in METHODS and METHODS[method.id] != method:
        raise ValueError(f"method id {method.id!r} registered twice with different content")
    METHODS[method.id] = method
    return method


def fraction_outside(method_id: str, **values: np.ndarray) -> dict[str, float]:
    """Fraction of samples outside the method's calibration range, per limited parameter.

    Only parameters that the method limits and that are passed in are checked; a parameter with
    no samples outside is left out of the result.
    """
    method = METHODS[method_id]
    result: dict[str, float] = {}
    for name, (low, high) in method.limits.items():
        if name not in values:
            continue
        x = np.asarray(values[name], dtype=float)
        frac = float(np.mean((x < low) | (x > high))) if x.size else 0.0
        if frac > 0:
            result[name] = frac
    return result
