"""Interpolation on a uniform grid, numpy only (used by the ringdown table)."""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike


def interpolate_uniform(table: ArrayLike, first: float, last: float, x: np.ndarray) -> np.ndarray:
    """Four-point (cubic Lagrange) interpolation of ``table`` on a uniform grid first..last."""
    table = np.asarray(table, dtype=float)
    step = (last - first) / (len(table) - 1)
    pos = (np.asarray(x, dtype=float) - first) / step
    i = np.clip(np.floor(pos).astype(int) - 1, 0, len(table) - 4)
    t = pos - i
    y0, y1, y2, y3 = (table[i + k] for k in range(4))
    return (
        -y0 * (t - 1) * (t - 2) * (t - 3) / 6
        + y1 * t * (t - 2) * (t - 3) / 2
        - y2 * t * (t - 1) * (t - 3) / 2
        + y3 * t * (t - 1) * (t - 2) / 6
    )
