"""Numbers for people: rounding by uncertainty and units written properly.

Rounding follows the Particle Data Group's rule (Review of Particle Physics, "Introduction:
rounding"): take the three leading digits of the uncertainty (the smaller side of an asymmetric
interval); 100–354 keeps two significant digits, 355–949 one, and 950–999 rounds up to 1000
and keeps two. The value is rounded to the same decimal place.

Numbers are written in the language in use (:func:`factsheet.i18n.decimal_text`: a decimal
comma in Spanish, the language's grouping of thousands); the ``× 10ⁿ`` notation, the signs of
an interval and the symbols of units are the same in every language.
"""

from __future__ import annotations

import functools
import math
from decimal import ROUND_HALF_UP, Decimal

import astropy.units as u
import erfa
from astropy.time import Time

from factsheet.i18n import N_, _, decimal_text, ngettext

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


@functools.cache  # unit symbols are the same in every language: safe to keep
def _unit_text(key: str) -> str:
    if key in UNIT_TEXT:
        return UNIT_TEXT[key]
    return u.Unit(key).to_string("unicode").replace("M_⊙", "M⊙")


def _round(x: float, place: int) -> float:
    """``x`` rounded at the decimal place ``place``, halves away from zero as people round
    (450 → 500 at the hundreds; Python's ``round`` gives 400), on the number's shortest decimal
    form so that 0.45 rounds up too."""
    step = Decimal(1).scaleb(place)
    return float(Decimal(repr(float(x))).quantize(step, rounding=ROUND_HALF_UP))


def _fmt(x: float, place: int) -> str:
    """``x`` rounded at ``place``, in the language's digits (never "−0")."""
    return decimal_text(_round(x, place), max(0, -place))


def _scale(median: float, low: float, high: float) -> int:
    """Power of ten to factor out for very large or small numbers (0 if none)."""
    ref = max(abs(median), abs(low), abs(high))
    if ref == 0 or 1e-3 <= ref < 1e5:
        return 0
    return math.floor(math.log10(ref))


def _interval_parts(median: float, low: float, high: float) -> tuple[int, int, tuple[float, ...]]:
    """The power of ten factored out, the decimal place kept, and the scaled numbers.

    The place follows the smaller side of the uncertainty (PDG rule); with no uncertainty, four
    significant digits. When rounding carries into the next decade (9.996 → 10.00), the power
    is raised so that a mantissa never reads "10.0 × 10ⁿ".
    """
    power = _scale(median, low, high)
    for _attempt in range(2):
        m, lo, hi = (x / 10**power for x in (median, low, high))
        errs = [e for e in (hi - m, m - lo) if e > 0]
        place = decimal_place(min(errs)) if errs else _significant_place(m, 4)
        if not power or abs(_round(m, place)) < 10:
            break
        power += 1
    return power, place, (m, lo, hi)


def _times_power(text: str, power: int, wrap: bool) -> str:
    if not power:
        return text
    body = f"({text})" if wrap else text
    return f"{body} × 10{str(power).translate(SUPERSCRIPT)}"


def format_interval(median: float, low: float, high: float, unit: str = "") -> str:
    """``median +plus −minus unit``, rounded by the uncertainty (PDG rule)."""
    power, place, (m, lo, hi) = _interval_parts(median, low, high)
    plus, minus = hi - m, m - lo
    text = _fmt(m, place)
    errs = plus > 0 or minus > 0
    if errs:
        text += f" +{_fmt(plus, place)} −{_fmt(minus, place)}"
    return f"{_times_power(text, power, errs)} {unit_text(unit)}".strip()


def format_median(median: float, low: float, high: float, unit: str = "") -> str:
    """The median alone, rounded exactly as :func:`format_interval` rounds it.

    Captions, figure labels and prose use it so that one quantity reads the same everywhere.
    """
    power, place, (m, _, _) = _interval_parts(median, low, high)
    return f"{_times_power(_fmt(m, place), power, False)} {unit_text(unit)}".strip()


def _given_place(x: float) -> int:
    """The decimal place of the last digit of a number as written in the input (up to six
    significant digits; a unit conversion's float noise is ignored)."""
    if x == 0 or not math.isfinite(x):
        return 0
    place = math.floor(math.log10(abs(x))) - 5
    while place < 12 and math.isclose(round(x, -(place + 1)), x, rel_tol=1e-9, abs_tol=0):
        place += 1
    return place


def _given_parts(median: float, low: float, high: float) -> tuple[int, int, float]:
    power = _scale(median, low, high)
    m, lo, hi = (x / 10**power for x in (median, low, high))
    nonzero = [x for x in (m, hi - m, m - lo) if x]
    return power, min((_given_place(x) for x in nonzero), default=0), m


def format_given(median: float, low: float, high: float, unit: str = "") -> str:
    """An interval given in the input, with the digits it was given with ("950 +450 -400"
    stays "950 +450 −400"; the PDG rule would print "1000 +500 −400"): the sheet shows what the
    editors wrote. Very large or small numbers factor out a power of ten as usual."""
    power, place, m = _given_parts(median, low, high)
    hi, lo = high / 10**power, low / 10**power
    text = _fmt(m, place)
    errs = hi > m or lo < m
    if errs:
        text += f" +{_fmt(hi - m, place)} −{_fmt(m - lo, place)}"
    return f"{_times_power(text, power, errs)} {unit_text(unit)}".strip()


def format_given_median(median: float, low: float, high: float, unit: str = "") -> str:
    """The median alone, as :func:`format_given` prints it."""
    power, place, m = _given_parts(median, low, high)
    return f"{_times_power(_fmt(m, place), power, False)} {unit_text(unit)}".strip()


def format_like_interval(
    value: float, median: float, low: float, high: float, unit: str = ""
) -> str | None:
    """``value`` (a fit spread) at the decimal place and power of ten of the interval's
    rounding, or None when it rounds to zero there and so does not matter beside it."""
    power, place, _ = _interval_parts(median, low, high)
    scaled = _round(value / 10**power, place)
    if scaled == 0:
        return None
    return f"{_times_power(_fmt(scaled, place), power, False)} {unit_text(unit)}".strip()


def format_about(median: float, low: float, high: float, unit: str = "") -> str:
    """The median to the one digit the interval supports, for prose ("about 6 billion years"
    when the interval spans 4.4–7.4): rounded at the leading digit of the smaller side."""
    errs = [e for e in (high - median, median - low) if e > 0]
    if not errs:
        return format_value(median, unit, 2)
    place = math.floor(math.log10(min(errs)))
    rounded = _round(median, place)
    if rounded == 0:
        return format_value(median, unit, 1)
    return format_value(rounded, unit, max(1, _significant_place(rounded, 1) - place + 1))


def format_value(value: float, unit: str = "", digits: int = 2) -> str:
    """A single value to ``digits`` significant figures (for prose and comparisons).

    The value is rounded before its power of ten is chosen, so 9.96 reads "10" and 9.956e-4
    reads "1.0 × 10⁻³", never "10.0" or "10.0 × 10⁻⁴".
    """
    if value == 0 or not math.isfinite(value):
        return f"{value:g} {unit_text(unit)}".strip()
    place = _significant_place(value, digits)
    value = _round(value, place)
    place = _significant_place(value, digits)
    power = _scale(value, value, value)
    mantissa = value / 10**power
    text = _fmt(mantissa, _significant_place(mantissa, digits))
    return f"{_times_power(text, power, False)} {unit_text(unit)}".strip()


def percent(level: float) -> str:
    """A credible level (or another fraction) as people write it: ``90 %``, ``68.3 %``
    (``68,3 %`` in Spanish), to three significant digits."""
    text = f"{100 * level:.3g}"
    if math.isfinite(level) and "e" not in text:
        text = decimal_text(float(text), len(text.partition(".")[2]))
    return f"{text} %"  # a no-break space keeps "90 %" on one line, in every language


def _significant_place(x: float, digits: int) -> int:
    if x == 0:
        return 0
    return math.floor(math.log10(abs(x))) - digits + 1


def how_often(per_year: float) -> str:
    """A rate in plain words: "about twice a year", "about once in 80 years" (a whole phrase
    per case, so each language words it its own way)."""
    if per_year <= 0:
        return _("never")
    if per_year < 0.75:
        years = _rounded(1 / per_year)
        phrase = ngettext("about once in {n} year", "about once in {n} years", years)
        return phrase.format(n=_plain(years))
    for unit, size in (("day", 365.25), ("month", 12.0), ("year", 1.0)):
        count = per_year / size
        if count >= 0.75 or unit == "year":
            break
    if count < 1.5:
        return _(_ONCE[unit])
    if count < 2.5:
        return _(_TWICE[unit])
    count = _rounded(count)  # at least 2.5, but a language may have more than one plural form
    if unit == "day":
        phrase = ngettext("about {n} time a day", "about {n} times a day", count)
    elif unit == "month":
        phrase = ngettext("about {n} time a month", "about {n} times a month", count)
    else:
        phrase = ngettext("about {n} time a year", "about {n} times a year", count)
    return phrase.format(n=_plain(count))


_ONCE = {
    "day": N_("about once a day"),
    "month": N_("about once a month"),
    "year": N_("about once a year"),
}
_TWICE = {
    "day": N_("about twice a day"),
    "month": N_("about twice a month"),
    "year": N_("about twice a year"),
}


def _rounded(x: float) -> float:
    """``x`` to two significant figures, as :func:`_plain` writes it (for the plural rule)."""
    return _round(x, _significant_place(x, 2))


def _plain(x: float) -> str:
    """Two significant figures without a trailing zero decimal (2.0 → "2", 2.5 → "2.5")."""
    text = format_value(x)
    zero = decimal_text(0.0, 1)[1:]  # ".0" in the language's digits
    return text.removesuffix(zero)


def utc_iso(time: Time) -> str:
    """``time.utc.isot`` (``2034-05-11T09:14:36.520``, leap seconds included), without the
    conversions astropy keeps on ``time`` once asked for them: a build formats the times of
    every event of the catalogue, and those kept conversions (about a kilobyte a time) would
    outlive the page that asked. erfa's ``d2dtf``, which astropy itself calls, does the work."""
    if time.scale != "utc" or not time.isscalar:
        return time.utc.isot
    places = time.precision
    year, month, day, hmsf, _ = erfa.ufunc.d2dtf(b"UTC", places, time.jd1, time.jd2)
    h, m, s, f = hmsf.item()
    fraction = f".{f:0{places}d}" if places else ""
    return f"{int(year):04d}-{int(month):02d}-{int(day):02d}T{h:02d}:{m:02d}:{s:02d}{fraction}"
