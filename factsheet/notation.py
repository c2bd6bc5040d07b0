"""Numbers for people: rounding by uncertainty and units written properly.

Rounding follows the Particle Data Group's rule (Review of Particle Physics, "Introduction:
rounding"): take the three leading digits of the uncertainty (the smaller side of an asymmetric
interval); 100–354 keeps two significant digits, 355–949 one, and 950–999 rounds up to 1000
and keeps two. The value is rounded to the same decimal place.
"""

from __future__ import annotations

import functools
import math

import astropy.units as u

SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")
UNIT_TEXT = {"": "", "solMass": "M⊙"}


def decimal_place(uncertainty: float) -> int:
    """The power of ten of the last digit to keep, by the PDG rule, for ``uncertainty`` > 0."""
    exponent = math.floor(math.log10(uncertainty))
    leading = round(uncertainty / 10 ** (exponent - 2))  # three leading digits, 100..1000
    if leading >= 1000:
        exponent, leading = exponent + 1, 100
    if leading <= 354:
        return exponent - 1
    if leading <= 949:
        return exponent
    return exponent  # 950..999 rounds up to 1000: two digits of the next decade


def unit_text(unit: str | u.UnitBase) -> str:
    """A unit as readers write it: M⊙, km s⁻¹, erg s⁻¹."""
    return _unit_text(unit if isinstance(unit, str) else unit.to_string())


@functools.cache
def _unit_text(key: str) -> str:
    if key in UNIT_TEXT:
        return UNIT_TEXT[key]
    return u.Unit(key).to_string("unicode").replace("M_⊙", "M⊙")


def _fmt(x: float, place: int) -> str:
    rounded = round(x, -place) + 0.0  # + 0.0 turns a rounded -0.0 into 0.0: never print "−0"
    return f"{rounded:.{max(0, -place)}f}".replace("-", "−")


def _scale(median: float, low: float, high: float) -> int:
    """Power of ten to factor out for very large or small numbers (0 if none)."""
    ref = max(abs(median), abs(low), abs(high))
    if ref == 0 or 1e-3 <= ref < 1e5:
        return 0
    return math.floor(math.log10(ref))


def format_interval(median: float, low: float, high: float, unit: str = "") -> str:
    """``median +plus −minus unit``, rounded by the uncertainty (PDG rule)."""
    power = _scale(median, low, high)
    m, lo, hi = (x / 10**power for x in (median, low, high))
    plus, minus = hi - m, m - lo
    errs = [e for e in (plus, minus) if e > 0]
    place = decimal_place(min(errs)) if errs else _significant_place(m, 4)
    text = _fmt(m, place)
    if errs:
        text += f" +{_fmt(plus, place)} −{_fmt(minus, place)}"
    if power:
        text = (
            f"({text}) × 10{str(power).translate(SUPERSCRIPT)}"
            if errs
            else (f"{text} × 10{str(power).translate(SUPERSCRIPT)}")
        )
    suffix = unit_text(unit)
    return f"{text} {suffix}".strip()


def format_value(value: float, unit: str = "", digits: int = 2) -> str:
    """A single value to ``digits`` significant figures (for prose and comparisons)."""
    if value == 0 or not math.isfinite(value):
        return f"{value:g} {unit_text(unit)}".strip()
    power = _scale(value, value, value)
    mantissa = value / 10**power
    text = _fmt(mantissa, _significant_place(mantissa, digits))
    if power:
        text = f"{text} × 10{str(power).translate(SUPERSCRIPT)}"
    return f"{text} {unit_text(unit)}".strip()


def percent(level: float) -> str:
    """A credible level (or another fraction) as people write it: ``90 %``, ``68.3 %``."""
    return f"{100 * level:.3g} %"


def _significant_place(x: float, digits: int) -> int:
    if x == 0:
        return 0
    return math.floor(math.log10(abs(x))) - digits + 1
