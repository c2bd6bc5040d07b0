"""Fixed, plainly written ticks for log and symmetric-log axes.

Fixed ticks with plain labels cost far less to draw than matplotlib's automatic log labels (which
go through mathtext) and read better: ``20 50 100 200`` rather than powers of ten.

Numbers drawn on a figure take the decimal symbol of the language in use (``0.5`` / ``0,5``);
tick numbers are never grouped by thousands (``5000``), in any language. :class:`LocalFormatter`
does the same for the ticks of linear axes that matplotlib labels itself.
"""

from __future__ import annotations

import math

import numpy as np
from matplotlib.axis import Axis
from matplotlib.ticker import FixedLocator, NullLocator, ScalarFormatter

from factsheet.i18n import decimal_text

SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


def decimal_symbol() -> str:
    """The decimal symbol of the language in use, as :func:`factsheet.i18n.decimal_text`
    writes it."""
    return decimal_text(0.5, 1)[1]


def digits(text: str) -> str:
    """A number written with a full stop (``2.5``, ``−0.25``, ``2.5×10⁶``) in the decimal
    symbol of the language in use, ungrouped."""
    return text.replace(".", decimal_symbol())


class LocalFormatter(ScalarFormatter):
    """matplotlib's tick labels of a linear axis, with the decimal symbol of the language."""

    def __call__(self, x, pos=None):
        return digits(super().__call__(x, pos))

    def get_offset(self):
        return digits(super().get_offset())


def plain_number(x: float) -> str:
    """``0.01``, ``20``, ``5000``; ``10⁶`` or ``2×10⁶`` beyond ten thousand or below 0.001."""
    if x == 0:
        return "0"
    sign = "−" if x < 0 else ""
    x = abs(x)
    if 1e-3 <= x < 1e5:
        return sign + digits(f"{x:.6g}")
    exponent = math.floor(math.log10(x) + 1e-9)
    mantissa = round(x / 10**exponent, 6)
    power = "10" + str(exponent).translate(SUPERSCRIPT)
    return sign + (power if mantissa == 1 else digits(f"{mantissa:g}") + "×" + power)


def log_tick_values(lo: float, hi: float) -> list[float]:
    """1–2–5 steps over up to three decades, whole decades (thinned) beyond."""
    first, last = math.floor(math.log10(lo)), math.ceil(math.log10(hi))
    decades = last - first
    steps = (1, 2, 5) if decades <= 3 else (1,)
    stride = max(1, math.ceil(decades / 7))
    values = [
        s * 10.0**e for e in range(first, last + 1) if (e - first) % stride == 0 for s in steps
    ]
    return [v for v in values if lo <= v * (1 + 1e-9) and v <= hi * (1 + 1e-9)]


def set_log_ticks(axis: Axis, lo: float, hi: float) -> None:
    """Put fixed 1–2–5 (or decade) ticks with plain labels on a log ``axis`` spanning lo..hi."""
    values = log_tick_values(lo, hi)
    axis.set_major_locator(FixedLocator(values))
    axis.set_ticklabels([plain_number(v) for v in values])
    axis.set_minor_locator(NullLocator())


def symlog_tick_values(lo: float, hi: float, linthresh: float) -> list[float]:
    """Zero, then ± decades outside the linear zone |x| < linthresh, thinned to about 9 ticks."""
    values = [0.0]
    for sign, end in ((-1.0, -lo), (1.0, hi)):
        if end < linthresh:
            continue
        exps = np.arange(math.ceil(math.log10(linthresh)), math.floor(math.log10(end)) + 1)
        stride = max(1, math.ceil(len(exps) / 5))
        values += [sign * 10.0**e for e in exps[::-1][::stride]]
    return sorted(values)
