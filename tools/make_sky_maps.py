"""Write the demo catalogue's three sky maps, deterministically.

The maps are invented: each is drawn from a model of our own, not taken from any detection.
Three demo events name one under ``detection.sky_map``, beside them in ``events_demo/``:

* ``mer34-012-sky.fits`` — compact (four sites): a main Gaussian blob and a weaker side lobe,
  90 % area about 40 deg2;
* ``mer34-005-sky.fits`` — a long arc (two sites): the timing of a signal at two sites fixes its
  angle to the line between them, so the map is a band at a constant angle from that axis, with
  a Gaussian profile across it and a smooth variation along it; 90 % area about 1000 deg2;
* ``mer34-011-sky.fits`` — broad (two sites, a weak signal): a few wide blobs, 90 % area about
  3000 deg2.

The random parts (the wiggle along the arc, the place and weight of the side blobs) come from
numpy's default generator with the fixed seed :data:`SEED`, so a rerun rewrites byte-identical
files (astropy writes no date into these headers, and no checksum is asked for). Run from
anywhere:

    python tools/make_sky_maps.py

File layout (docs/sky-maps.md): a FITS binary table of one float32 column ``PROB``, one value
per pixel, with ``PIXTYPE = 'HEALPIX'``, ``ORDERING = 'NESTED'``, ``COORDSYS = 'C'``, ``NSIDE``
and ``INDXSCHM = 'IMPLICIT'`` in its header; NSIDE 64 or 32, so each file stays near 200 kB.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import numpy as np
from astropy.io import fits
from astropy_healpix import HEALPix

SEED = 20340728  # fixed: the files must not change between runs
OUT = Path(__file__).resolve().parent.parent / "events_demo"
ORDERING = "NESTED"


def unit_vector(ra_deg: float, dec_deg: float) -> np.ndarray:
    ra, dec = np.radians(ra_deg), np.radians(dec_deg)
    return np.array([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)])


def pixel_vectors(nside: int) -> np.ndarray:
    """Unit vectors of every pixel centre, shape (npix, 3), in the files' ordering."""
    grid = HEALPix(nside=nside, order=ORDERING.lower())
    lon, lat = grid.healpix_to_lonlat(np.arange(grid.npix))
    ra, dec = lon.to_value("rad"), lat.to_value("rad")
    return np.stack([np.cos(dec) * np.cos(ra), np.cos(dec) * np.sin(ra), np.sin(dec)], axis=1)


def angle_to(vectors: np.ndarray, axis: np.ndarray) -> np.ndarray:
    """Angle of each pixel from a direction, in degrees."""
    return np.degrees(np.arccos(np.clip(vectors @ axis, -1.0, 1.0)))


def blob(vectors: np.ndarray, ra: float, dec: float, sigma: float) -> np.ndarray:
    """A Gaussian blob of width ``sigma`` degrees about (ra, dec), peak 1."""
    return np.exp(-(angle_to(vectors, unit_vector(ra, dec)) ** 2) / (2 * sigma**2))


def band(vectors, axis, angle, width, centre_azimuth, spread, wiggle) -> np.ndarray:
    """A band at ``angle`` degrees from ``axis`` (Gaussian of ``width`` across it), weighted
    along it by a Gaussian of ``spread`` degrees about ``centre_azimuth`` and by the smooth
    factor ``1 + Σ a_k cos(k φ + b_k)`` of the Fourier terms ``wiggle``."""
    across = np.exp(-((angle_to(vectors, axis) - angle) ** 2) / (2 * width**2))
    first = np.cross(axis, [0.0, 0.0, 1.0])
    first /= np.linalg.norm(first)
    second = np.cross(axis, first)
    phi = np.degrees(np.arctan2(vectors @ second, vectors @ first))
    offset = (phi - centre_azimuth + 180.0) % 360.0 - 180.0
    along = np.exp(-(offset**2) / (2 * spread**2))
    for k, (a, b) in enumerate(wiggle, start=1):
        along = along * (1.0 + a * np.cos(np.radians(k * phi) + b))
    return across * along


def compact(rng: np.random.Generator) -> tuple[int, np.ndarray]:
    """Four sites: a main blob and a side lobe a few degrees off, a third as strong."""
    nside = 64
    v = pixel_vectors(nside)
    side = rng.uniform(0.25, 0.4)
    prob = blob(v, 152.4, 31.8, 1.6) + side * blob(v, 155.6, 30.1, 1.1)
    return nside, prob


def arc(rng: np.random.Generator) -> tuple[int, np.ndarray]:
    """Two sites: a band 68 degrees from the (invented) axis between them."""
    nside = 64
    axis = unit_vector(318.0, -12.0)
    wiggle = [(rng.uniform(0.15, 0.3), rng.uniform(0, 2 * np.pi)) for _ in range(3)]
    return nside, band(pixel_vectors(nside), axis, 68.0, 1.8, 40.0, 50.0, wiggle)


def broad(rng: np.random.Generator) -> tuple[int, np.ndarray]:
    """Two sites and a weak signal: three wide, overlapping blobs."""
    nside = 32
    v = pixel_vectors(nside)
    prob = blob(v, 221.0, -38.0, 12.5)
    for ra, dec in ((243.0, -22.0), (199.0, -55.0)):
        prob = prob + rng.uniform(0.4, 0.7) * blob(v, ra, dec, 10.0)
    return nside, prob


#: File name → the model that draws it, in the order the generator is used.
MAPS: dict[str, Callable[[np.random.Generator], tuple[int, np.ndarray]]] = {
    "mer34-012-sky.fits": compact,
    "mer34-005-sky.fits": arc,
    "mer34-011-sky.fits": broad,
}


def draw_maps() -> dict[str, tuple[int, np.ndarray]]:
    """Every demo map, normalised, as float32: name → (NSIDE, probabilities)."""
    rng = np.random.default_rng(SEED)
    out = {}
    for name, model in MAPS.items():
        nside, prob = model(rng)
        out[name] = nside, (prob / prob.sum()).astype(np.float32)
    return out


def write_map(path: Path, nside: int, prob: np.ndarray) -> None:
    table = fits.BinTableHDU.from_columns([fits.Column(name="PROB", format="E", array=prob)])
    for key, value, comment in (
        ("PIXTYPE", "HEALPIX", "HEALPix pixelisation"),
        ("ORDERING", ORDERING, "pixel ordering scheme"),
        ("COORDSYS", "C", "equatorial (celestial) coordinates"),
        ("NSIDE", nside, "resolution parameter"),
        ("INDXSCHM", "IMPLICIT", "every pixel, in order"),
        ("OBJECT", path.stem.removesuffix("-sky").upper(), "invented demo event"),
    ):
        table.header[key] = (value, comment)
    fits.HDUList([fits.PrimaryHDU(), table]).writeto(path, overwrite=True, checksum=False)


def main(out: Path = OUT) -> None:
    for name, (nside, prob) in draw_maps().items():
        write_map(out / name, nside, prob)
        print(f"wrote {out / name} (NSIDE {nside})")


if __name__ == "__main__":
    main()
