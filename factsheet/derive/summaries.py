"""Summaries of samples: the median and the equal-tailed credible interval, with its level."""

from __future__ import annotations

import astropy.units as u
import numpy as np

from factsheet.model import Summary


def summarise(
    values: u.Quantity,
    level: float,
    frame: str | None = None,
    methods: tuple[str, ...] = (),
    fit_spread: u.Quantity | None = None,
) -> Summary:
    """Median and the equal-tailed credible interval of ``values`` at ``level``."""
    q = u.Quantity(values)
    low, med, high = np.percentile(q.value, [50 * (1 - level), 50, 50 * (1 + level)])
    spread = None if fit_spread is None else float(u.Quantity(fit_spread).to_value(q.unit))
    return Summary(
        float(med), float(low), float(high), q.unit.to_string(), level, frame, spread, methods
    )
