"""SVG output that is byte-identical across runs and processes, and carries no links or dates.

Every text is written as plain text (no mathtext, no TeX), whatever characters it holds.

What matplotlib writes is then made smaller without changing what a viewer draws
(:func:`compact`): about half the bytes.
"""

from __future__ import annotations

import io
import re

import matplotlib
from matplotlib.figure import Figure

from factsheet.figures.style import RC, plain_text

# What matplotlib writes before the drawing that we do not want: the DTD reference (a URL) and
# the RDF metadata block (namespace URLs and, unless suppressed, a date and a version).
_DOCTYPE = re.compile(rb"<!DOCTYPE svg[^>]*>\s*")
_METADATA = re.compile(rb"\s*<metadata>.*?</metadata>", re.S)
_NO_METADATA = {"Date": None, "Creator": None, "Type": None, "Format": None}


def to_svg(figure: Figure, close: bool = True) -> bytes:
    """The figure as SVG bytes (fixed hash salt, no date or creator); clears it when ``close``."""
    buffer = io.BytesIO()
    with matplotlib.rc_context(RC):
        plain_text(figure)
        figure.savefig(
            buffer, format="svg", facecolor=figure.get_facecolor(), metadata=_NO_METADATA
        )
    if close:
        release(figure)
    data = _DOCTYPE.sub(b"", buffer.getvalue(), count=1)
    return compact(_METADATA.sub(b"", data, count=1))


_REFERENCE = re.compile(rb'(?:url\(#|xlink:href="#)([^)"]+)')
_ID = re.compile(rb' id="([^"]+)"')
_NO_ROTATION = re.compile(rb' transform="rotate\(-0 [^"]*\)"')
_GEOMETRY = re.compile(rb' (d|x|y|width|height|viewBox|transform)="([^"]*)"')
_LONG_NUMBER = re.compile(rb"-?\d+\.\d{3,}")
PLACES = 2  # decimals kept in coordinates: 0.01 pt, a hundredth of a pixel at the natural size


def compact(svg: bytes) -> bytes:
    """matplotlib's SVG with the same drawing in fewer bytes: coordinates to :data:`PLACES`
    decimals (the root's size and viewBox too, so the panel still fills it), path data on one
    line, no ``id`` that nothing refers to (matplotlib names every group), no group left with
    no attribute (it does nothing), no ``rotate(-0 …)`` on upright text and no indentation,
    and a style that many elements share written once as a class. Clip paths and markers,
    which are referred to, keep their ids."""
    used = set(_REFERENCE.findall(svg))
    svg = _ID.sub(lambda m: m.group() if m.group(1) in used else b"", svg)
    svg = _NO_ROTATION.sub(b"", svg)
    svg = _GEOMETRY.sub(_short_geometry, svg)
    lines, dropped = [], []
    for line in svg.split(b"\n"):  # matplotlib writes one tag a line (path data aside)
        tag = line.strip()
        if not tag:
            continue
        if tag == b"<g>":
            dropped.append(True)
            continue
        if tag.startswith(b"<g ") and not tag.endswith(b"/>"):
            dropped.append(False)
        elif tag == b"</g>" and dropped.pop():
            continue
        lines.append(tag)
    return _style_classes(b"\n".join(lines) + b"\n")


_STYLE = re.compile(rb' style="([^"]*)"')
_SHEET = re.compile(rb'<style type="text/css">(.*?)</style>', re.S)


def _style_classes(svg: bytes) -> bytes:
    """Each style that two or more elements share written once, as a class rule in the style
    sheet matplotlib already writes (classes ``s0``, ``s1``, … in order of first use), with its
    whitespace after ``:`` and ``;`` dropped. A class rule outranks the sheet's ``*`` rule as the
    inline style did, and nothing else styles these elements, so they are drawn the same."""
    sheet = _SHEET.search(svg)
    counts: dict[bytes, int] = {}
    for style in _STYLE.findall(svg):
        counts[style] = counts.get(style, 0) + 1
    if sheet is None or b"class=" in svg:
        return svg
    names = {v: b"s%d" % k for k, v in enumerate(v for v, n in counts.items() if n > 1)}
    rules = b"".join(b"." + name + b"{" + _tight(style) + b"}" for style, name in names.items())

    def swap(match: re.Match) -> bytes:
        name = names.get(match.group(1))
        return b' class="' + name + b'"' if name else b' style="' + _tight(match.group(1)) + b'"'

    head, body = svg[: sheet.end(1)], svg[sheet.end(1) :]
    return head + rules + _STYLE.sub(swap, body)


def _tight(style: bytes) -> bytes:
    return style.replace(b": ", b":").replace(b"; ", b";")


def _short_geometry(match: re.Match) -> bytes:
    value = _LONG_NUMBER.sub(_rounded, b" ".join(match.group(2).split()))
    return b" " + match.group(1) + b'="' + value + b'"'


def _rounded(match: re.Match) -> bytes:
    text = f"{float(match.group()):.{PLACES}f}".rstrip("0").rstrip(".")
    return b"0" if text == "-0" else text.encode()


def release(figure: Figure) -> None:
    """Empty ``figure``: its Axes taken out without resetting each first (what
    ``Figure.clear`` does, at the cost of re-making every tick of an Axes that is thrown
    away), then the figure's own artists."""
    for ax in tuple(figure.axes):
        figure.delaxes(ax)
    figure.clear()
