"""Mass bands and source classes, computed from mass samples (docs/methods.md §11).

Band edges are source-frame masses passed in as a mapping from the edge names in
:data:`EDGE_KEYS` to Quantities (the packaged reference data supplies them, ``catalogue.yaml``
may override them). Every band probability is the fraction of samples in the band, never a
verdict on the median.
"""

from collections.abc import Mapping

import astropy.units as u
import numpy as np

from factsheet.physics._checks import require
from factsheet.physics.registry import Method, register

MASS_BANDS = "mass-bands-from-samples"
SOURCE_CLASS = "source-class-from-samples"

#: Edge names, lowest first; each is the lower edge of the band that follows it.
EDGE_KEYS = (
    "neutron_star_max",
    "lower_gap_top",
    "pair_instability_lower",
    "pair_instability_upper",
)
#: Threshold of intermediate mass: a separate question, not a band (it overlaps the bands).
INTERMEDIATE_KEY = "intermediate_mass_min"
#: Bands in order of mass; ``BANDS[i]`` lies between ``EDGE_KEYS[i-1]`` and ``EDGE_KEYS[i]``, so
#: the bands partition the mass axis and their probabilities sum to 1.
BANDS = ("neutron_star", "lower_gap", "stellar_black_hole", "pair_instability_gap", "above_gap")
SOURCE_CLASSES = ("BNS", "NSBH", "BBH")

register(
    Method(
        id=MASS_BANDS,
        title="Mass bands from posterior samples",
        citation=(
            "Edges: Antoniadis et al. 2013 (Science 340, 1233232); Fonseca et al. 2021 "
            "(ApJL 915, L12); Özel et al. 2010 (ApJ 725, 1918); Farr et al. 2011 (ApJ 741, 103); "
            "Farmer et al. 2019 (ApJ 887, 53); Woosley 2017 (ApJ 836, 244); "
            "Greene, Strader & Ho 2020 (ARA&A 58, 257)"
        ),
        formula="P(band) = fraction of samples with lower edge ≤ m < upper edge",
        validity="source-frame masses; the edges themselves are uncertain by tens of per cent",
        accuracy="sampling error about √(P(1 − P)/N) for N samples; the uncertainty of the "
        "edges dominates",
        quantities=("mass_bands", "intermediate_mass"),
    )
)
register(
    Method(
        id=SOURCE_CLASS,
        title="Source class from component masses",
        citation="the maximum neutron-star mass of the mass bands (see the mass-band edges)",
        formula="BNS: m₁, m₂ < M_{NS,max}; NSBH: m₂ < M_{NS,max} ≤ m₁; BBH: m₁, m₂ ≥ M_{NS,max}",
        validity="by mass alone; says nothing about matter seen in the signal",
        quantities=("source_class",),
    )
)


def _edge(edges: Mapping[str, u.Quantity], key: str) -> float:
    """One edge in solar masses; a missing or non-mass edge raises with its name."""
    if key not in edges:
        raise KeyError(f"mass band edge {key!r} missing")
    return float(require(edges[key], "mass", f"edges[{key!r}]"))


def band_probabilities(
    mass_samples: u.Quantity, edges: Mapping[str, u.Quantity]
) -> dict[str, float]:
    """Fraction of mass samples in each band (docs/methods.md §11; edges from the reference data).

    The bands partition the mass axis: the probabilities sum to 1.
    """
    m = np.atleast_1d(require(mass_samples, "mass", "mass_samples")).ravel()
    cuts = [-np.inf, *(_edge(edges, k) for k in EDGE_KEYS), np.inf]
    if np.any(np.diff(cuts) < 0):
        raise ValueError(f"mass band edges must increase in the order {EDGE_KEYS}")
    result = {
        band: float(np.mean((m >= low) & (m < high)))
        for band, low, high in zip(BANDS, cuts[:-1], cuts[1:], strict=True)
    }
    return result


def intermediate_mass_probability(
    mass_samples: u.Quantity, edges: Mapping[str, u.Quantity]
) -> float:
    """Fraction of mass samples at or above the intermediate-mass threshold (docs/methods.md
    §11); a separate question from the bands, which it overlaps."""
    m = np.atleast_1d(require(mass_samples, "mass", "mass_samples")).ravel()
    return float(np.mean(m >= _edge(edges, INTERMEDIATE_KEY)))


def straddles(probabilities: Mapping[str, float], threshold: float = 0.05) -> list[str]:
    """Edges with at least ``threshold`` of the probability on each side (common practice)."""
    below = np.cumsum([probabilities.get(band, 0.0) for band in BANDS])
    total = below[-1]
    return [
        key
        for key, p_below in zip(EDGE_KEYS, below[:-1], strict=True)
        if p_below >= threshold and total - p_below >= threshold
    ]


def source_class_probabilities(
    m1: u.Quantity, m2: u.Quantity, ns_max: u.Quantity
) -> dict[str, float]:
    """Fractions of samples that are BNS, NSBH and BBH by mass (docs/methods.md §11 edge)."""
    a, b = np.broadcast_arrays(require(m1, "mass", "m1"), require(m2, "mass", "m2"))
    limit = float(require(ns_max, "mass", "ns_max"))
    n_stars = (np.minimum(a, b) < limit).astype(int) + (np.maximum(a, b) < limit).astype(int)
    n_stars = np.atleast_1d(n_stars)
    return {
        "BNS": float(np.mean(n_stars == 2)),
        "NSBH": float(np.mean(n_stars == 1)),
        "BBH": float(np.mean(n_stars == 0)),
    }


def source_class(m1: u.Quantity, m2: u.Quantity, ns_max: u.Quantity) -> str:
    """The most probable source class, BNS, NSBH or BBH (ties go to the lighter class)."""
    probabilities = source_class_probabilities(m1, m2, ns_max)
    return max(SOURCE_CLASSES, key=lambda name: probabilities[name])
