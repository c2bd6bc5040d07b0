"""The sharing image of a sheet: a 1200 × 630 PNG that chat apps and social sites show.

Drawn with the figures' palette and fonts: the status first when it is not "confirmed" (a
retracted event says so across the top, before anything else), the title, the designation and
date, and the two bodies and the remnant as discs whose areas follow their masses, each with its
mass as the sheet prints it. Text only and a few patches on one axes, so it costs little. It is
stored as an 8-bit palette PNG (:func:`palette_png`): about 15 kB instead of about 56 kB.
"""

from __future__ import annotations

import io
import math
import textwrap
from typing import NamedTuple

import matplotlib
import numpy as np
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure
from matplotlib.patches import Circle, FancyArrowPatch, Patch, Rectangle
from matplotlib.transforms import Affine2D
from PIL import Image

from factsheet.figures import style

SIZE_PX = (1200, 630)  # the size social sites and chat apps expect of a sharing card
DPI = 100
DISC_Y = 0.22  # the discs' centre line (the card is 1 wide and 0.525 high)
TITLE_CHARS = 40  # a title longer than this runs onto a second line
STATUS_SHADE = {"retracted": "#F2D5C4", "candidate": "#F4EDB0"}  # pale tints under dark text


class ShareBody(NamedTuple):
    """One disc of the card: its label, its mass as printed, its mass in M⊙ and palette role."""

    label: str
    text: str
    mass: float
    role: str


class ShareCard(NamedTuple):
    """Everything the card says, as text already written for readers."""

    title: str
    subtitle: str  # designation and date
    status: str | None  # the word shown across the top (a candidate, a retraction), or None
    bodies: tuple[ShareBody, ...]  # the heavier, the lighter, then the remnant if there is one
    footer: str  # the catalogue's title
    tone: str = ""  # the status whose tint the top band takes (the word may be translated)


def _disc(ax, x: float, body: ShareBody, scale: float, label_y: float) -> float:
    radius = scale * math.sqrt(body.mass)
    ax.add_patch(Circle((x, DISC_Y), radius, color=style.ROLE[body.role], lw=0))
    ax.text(
        x,
        label_y,
        f"{body.label}\n{body.text}",
        ha="center",
        va="top",
        fontsize=22,
        color=style.INK,
        linespacing=1.3,
    )
    return radius


def _discs(ax, bodies: tuple[ShareBody, ...]) -> None:
    """The two bodies, an arrow, the remnant; disc areas follow the masses, the largest disc
    0.08 in radius, and every name on one line below the largest."""
    scale = 0.08 / math.sqrt(max(b.mass for b in bodies))
    label_y = DISC_Y - 0.095
    xs = (0.14, 0.36, 0.7)
    radii = [_disc(ax, x, b, scale, label_y) for x, b in zip(xs, bodies, strict=False)]
    if len(bodies) == 3:
        start, end = (xs[1] + radii[1] + 0.03, DISC_Y), (xs[2] - radii[2] - 0.03, DISC_Y)
        arrow = FancyArrowPatch(
            start, end, arrowstyle="-|>", mutation_scale=30, lw=2.5, color=style.MUTED
        )
        ax.add_patch(arrow)


def _status(ax, status: str, tone: str) -> None:
    """The status word across the top of the card, on a pale band (the tint of ``tone``, or of
    the word itself)."""
    status = str(status)
    shade = STATUS_SHADE.get(tone or status.lower(), style.GRID)
    ax.add_patch(Rectangle((0, 0.455), 1, 0.07, lw=0, color=shade))
    ax.text(
        0.04, 0.49, status.upper(), fontsize=34, fontweight="bold", va="center", color=style.INK
    )


class _Surface:
    """The card's drawing surface: the Figure itself, in card units (x from 0 to 1 across, y
    from 0 to 0.525 up: one unit is the card's width both ways, so discs stay round). No Axes:
    one would make ticks, spines and data limits that the card never shows."""

    def __init__(self, fig: Figure) -> None:
        self.fig = fig
        self.transform = Affine2D().scale(1.0, SIZE_PX[0] / SIZE_PX[1]) + fig.transFigure

    def add_patch(self, patch: Patch) -> None:
        patch.set_transform(self.transform)
        self.fig.add_artist(patch)

    def text(self, x: float, y: float, s: str, **kwargs) -> None:
        self.fig.text(x, y, s, transform=self.transform, **kwargs)


def share_png(card: ShareCard) -> bytes:
    """The card as PNG bytes, identical for identical input (no software tag, fixed size)."""
    with matplotlib.rc_context(style.RC):
        fig = Figure(figsize=(SIZE_PX[0] / DPI, SIZE_PX[1] / DPI), dpi=DPI, facecolor=style.PANEL)
        ax = _Surface(fig)
        top = 0.5
        if card.status:
            _status(ax, card.status, card.tone)
            top = 0.435
        title = textwrap.fill(str(card.title), TITLE_CHARS)  # in the language in use
        ax.text(
            0.04,
            top,
            title,
            fontsize=30,
            fontweight="bold",
            va="top",
            color=style.INK,
            linespacing=1.15,
        )
        below = top - 0.042 * (title.count("\n") + 1) - 0.012
        ax.text(0.04, below, str(card.subtitle), fontsize=22, va="top", color=style.INK)
        _discs(ax, card.bodies)
        ax.text(0.04, 0.015, str(card.footer), fontsize=16, color=style.MUTED, va="bottom")
        canvas = FigureCanvasAgg(fig)
        canvas.draw()
        rgba = Image.frombuffer("RGBA", canvas.get_width_height(), canvas.buffer_rgba())
    return palette_png(rgba.convert("RGB"))


#: The card's flat colours, kept exact in its palette (see :func:`palette_png`).
FLAT = (style.PANEL, style.INK, style.MUTED, style.GRID, *style.ROLE.values(),
        *STATUS_SHADE.values())  # fmt: skip
PALETTE_COLOURS = 128
SNAP = 4  # a palette entry this close (in each channel, of 255) to a flat colour becomes it


def palette_png(rgb: Image.Image) -> bytes:
    """The image as an 8-bit palette PNG: a flat graphic (a few colours and their antialiased
    edges) keeps its look in 128 colours at about a quarter of the bytes of a true-colour PNG.

    The palette is adaptive (Pillow's fast octree, no dithering: a deterministic function of
    the pixels); an entry within :data:`SNAP` of one of the card's flat colours is set to that
    colour, so the panel, the ink and the tints come out exact rather than averaged with their
    edges. No text chunks: the bytes depend on the pixels alone."""
    image = rgb.quantize(
        PALETTE_COLOURS, method=Image.Quantize.FASTOCTREE, dither=Image.Dither.NONE
    )
    flat = np.array([[int(h[k : k + 2], 16) for k in (1, 3, 5)] for h in FLAT])
    entries = np.array(image.getpalette() or [], dtype=int).reshape(-1, 3)
    distance = np.abs(entries[:, None, :] - flat[None, :, :]).max(axis=2)
    nearest = distance.argmin(axis=1)
    snapped = np.where((distance.min(axis=1) <= SNAP)[:, None], flat[nearest], entries)
    image.putpalette(snapped.astype(np.uint8).ravel().tolist())
    buffer = io.BytesIO()
    image.save(buffer, format="PNG", compress_level=6)  # 9 saves a tenth more at 5x the time
    return buffer.getvalue()
