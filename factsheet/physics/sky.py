"""Credible regions of a HEALPix sky map (docs/methods.md, sky maps).

HEALPix (Górski et al. 2005, ApJ 622, 759) divides the sphere into 12 NSIDE² pixels of equal
area 4π/(12 NSIDE²) sr, numbered in RING or NESTED order. The credible region of level p is the
smallest set of pixels, taken in decreasing probability, whose probabilities sum to at least p;
its area is the pixel count times the pixel area. The credible level at a position is the total
probability of the pixels at least as probable as the position's pixel (ties included).

A map of NSIDE 2048 has 50 331 648 pixels, so nothing here keeps more than one sorted copy of
the map: running sums are taken in chunks of :data:`CHUNK` pixels, in double precision whatever
the map's own precision. Positions are equatorial (ICRS) right ascension and declination.
"""

from __future__ import annotations

import math
from typing import NamedTuple

import astropy.units as u
import numpy as np

from .registry import Method, register

#: Pixels summed at a time: bounds the temporary arrays of the running sums (8 MB in doubles).
CHUNK = 1 << 20
#: The largest NSIDE read: 50 million pixels, finer than any published merger map.
MAX_NSIDE = 2048
ORDERS = ("RING", "NESTED")
WHOLE_SKY = 4 * math.pi * u.sr

METHOD = register(
    Method(
        id="healpix-credible-region",
        title="Credible regions and levels of a HEALPix sky map",
        citation="Górski K. M. et al., 2005, ApJ 622, 759 (HEALPix: equal-area pixels in RING "
        "and NESTED order)",
        formula="area(p) = n_{p} · 4π/(12 NSIDE^{2}), n_{p} the fewest pixels, most probable "
        "first, holding probability ≥ p; level(x) = Σ P_{i} over pixels with P_{i} ≥ P(x)",
        validity="any HEALPix map in equatorial coordinates, NSIDE a power of 2 up to 2048",
        accuracy="to one pixel: areas are whole numbers of pixels, positions are pixel centres",
        arxiv="astro-ph/0409513",
        quantities=("sky_map", "counterpart_candidates"),
        provenance="definitions as used throughout the literature; check values are the closed "
        "forms of a flat-sky Gaussian and of a uniform map",
    )
).id


def check_nside(nside: int) -> int:
    """NSIDE as an int: a power of two from 1 to :data:`MAX_NSIDE` (ValueError otherwise)."""
    if isinstance(nside, bool) or not isinstance(nside, int | np.integer):
        raise ValueError(f"NSIDE: expected a whole number, got {nside!r}")
    n = int(nside)
    if n < 1 or n > MAX_NSIDE or n & (n - 1):
        raise ValueError(f"NSIDE {n} is not a power of 2 from 1 to {MAX_NSIDE}")
    return n


def pixel_count(nside: int) -> int:
    """Number of pixels of a map: 12 NSIDE²."""
    return 12 * check_nside(nside) ** 2


def pixel_area(nside: int) -> u.Quantity:
    """Area of one pixel, in square degrees."""
    return (WHOLE_SKY / pixel_count(nside)).to(u.deg**2)


def _grid(nside: int, order: str):
    from astropy_healpix import HEALPix  # imported here: only events with a sky map need it

    if order not in ORDERS:
        raise ValueError(f"ordering {order!r}: expected one of {', '.join(ORDERS)}")
    return HEALPix(nside=check_nside(nside), order=order.lower())


def pixels_at(nside: int, order: str, ra: u.Quantity, dec: u.Quantity) -> np.ndarray:
    """The pixel index of each position (right ascension, declination)."""
    ra = u.Quantity(ra, u.deg)
    dec = u.Quantity(dec, u.deg)
    if np.any(np.abs(dec) > 90 * u.deg):
        raise ValueError("declination outside -90 to 90 degrees")
    return np.asarray(_grid(nside, order).lonlat_to_healpix(ra.to(u.rad), dec.to(u.rad)))


def pixel_centres(nside: int, order: str, pixels) -> tuple[u.Quantity, u.Quantity]:
    """Right ascension (0 to 360 degrees) and declination of pixel centres."""
    lon, lat = _grid(nside, order).healpix_to_lonlat(np.asarray(pixels))
    return lon.to(u.deg).wrap_at(360 * u.deg).view(u.Quantity), lat.to(u.deg).view(u.Quantity)


class RankedMap:
    """A normalised map's probabilities in increasing order, for regions and levels.

    Holds one sorted copy of the map (in the map's own precision); every sum over it is taken
    in chunks, in double precision.
    """

    def __init__(self, prob: np.ndarray, nside: int):
        if len(prob) != pixel_count(nside):
            raise ValueError(f"{len(prob)} pixels, expected 12 × {nside}² = {pixel_count(nside)}")
        self.nside = nside
        self.values = np.sort(prob)  # values alone: a stable sort would only cost a buffer
        self.total = sum(float(np.sum(c, dtype=np.float64)) for c in _chunks(self.values))
        if not self.total > 0:
            raise ValueError("the map holds no probability")

    def region_size(self, level: float) -> int:
        """The number of pixels in the credible region of ``level`` (0 < level ≤ 1)."""
        if not 0 < level <= 1:
            raise ValueError(f"credible level {level}: expected 0 < level ≤ 1")
        target, held, n = level * self.total, 0.0, len(self.values)
        for end in range(n, 0, -CHUNK):
            running = np.cumsum(self.values[max(end - CHUNK, 0) : end][::-1], dtype=np.float64)
            running += held
            if running[-1] >= target:
                return n - end + int(np.searchsorted(running, target)) + 1
            held = float(running[-1])
        return n  # rounding left the whole map short of the target by less than an ulp

    def area(self, level: float) -> u.Quantity:
        """The area of the credible region of ``level``, in square degrees."""
        return self.region_size(level) * pixel_area(self.nside)

    def levels_of(self, values) -> np.ndarray:
        """For each probability value, the total probability of the pixels at least as
        probable: the credible level of a pixel holding that value."""
        values = np.asarray(values, dtype=self.values.dtype)
        first = np.searchsorted(self.values, values, side="left")  # first pixel >= the value
        below = _sums_below(self.values, first)
        return np.clip((self.total - below) / self.total, 0.0, 1.0)


def _chunks(x: np.ndarray):
    for start in range(0, len(x), CHUNK):
        yield x[start : start + CHUNK]


def _sums_below(ascending: np.ndarray, indices: np.ndarray) -> np.ndarray:
    """``ascending[:k].sum()`` for each k of ``indices``, in one chunked pass."""
    flat = indices.ravel()
    order = np.argsort(flat, kind="stable")
    wanted = flat[order]
    out = np.empty(len(flat), dtype=np.float64)
    held, pos = 0.0, 0
    for start in range(0, len(ascending), CHUNK):
        running = np.cumsum(ascending[start : start + CHUNK], dtype=np.float64)
        running += held
        stop = int(np.searchsorted(wanted, start + len(running), side="right"))
        taken = wanted[pos:stop] - start  # pixels of this chunk below each index
        out[pos:stop] = np.where(taken > 0, running[np.maximum(taken - 1, 0)], held)
        pos, held = stop, float(running[-1])
    out[pos:] = held
    result = np.empty_like(out)
    result[order] = out
    return result.reshape(indices.shape)


class Peak(NamedTuple):
    ra: u.Quantity
    dec: u.Quantity


def peak(prob: np.ndarray, nside: int, order: str) -> Peak:
    """The centre of the most probable pixel (the first one, if several tie)."""
    ra, dec = pixel_centres(nside, order, int(np.argmax(prob)))
    return Peak(ra, dec)


def levels_at(
    ranked: RankedMap, prob: np.ndarray, order: str, ra: u.Quantity, dec: u.Quantity
) -> np.ndarray:
    """The credible level of the map at each position."""
    return ranked.levels_of(prob[pixels_at(ranked.nside, order, ra, dec)])


def level_grid(
    ranked: RankedMap, prob: np.ndarray, order: str, width: int = 720, height: int = 360
) -> np.ndarray:
    """Credible levels on a regular grid of cell centres, ``height`` rows of declination from
    −90° up and ``width`` columns of right ascension from 0° up: what a figure contours."""
    ra = (np.arange(width) + 0.5) * (360.0 / width)
    dec = (np.arange(height) + 0.5) * (180.0 / height) - 90.0
    ra_grid, dec_grid = np.meshgrid(ra, dec)
    levels = levels_at(ranked, prob, order, ra_grid * u.deg, dec_grid * u.deg)
    return levels.astype(np.float32)
