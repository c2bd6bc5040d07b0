"""Tidal disruption of a neutron star by a black hole (docs/methods.md §12).

The remnant baryon mass left outside the black hole follows the fit of Foucart, Hinderer &
Nissanke 2018; the neutron star's baryon mass comes from its gravitational mass and compactness
with the approximation of Lattimer & Prakash 2001. The neutron-star radius is an assumption
(a setting shown on the sheet), not a measurement.
"""

import astropy.constants as const
import astropy.units as u
import numpy as np

from factsheet.physics._checks import dimensionless, require
from factsheet.physics.kerr import isco_radius
from factsheet.physics.registry import Method, register

REMNANT_MASS = "fhn18-remnant-baryon-mass"
BARYON_MASS = "lp01-baryon-mass"

#: Remnant mass above which a kilonova and a burst are expected (common practice).
DISRUPTION_THRESHOLD = 0.01 * u.Msun

# Foucart, Hinderer & Nissanke 2018, eq. (4) coefficients [from memory; docs/methods.md §12].
_ALPHA, _BETA, _GAMMA, _DELTA = 0.406, 0.139, 0.255, 1.761

register(
    Method(
        id=REMNANT_MASS,
        title="Remnant baryon mass outside the black hole after a neutron-star disruption",
        citation=("Foucart, Hinderer & Nissanke 2018, Phys. Rev. D 98, 081501(R)"),
        arxiv="1807.00011",
        formula=(
            "M_{rem}/M_{NS}^{b} = [max(α(1 − 2C)/η^{1/3} − β R_{isco}(χ_{BH}) C/η + γ, 0)]^{δ}, "
            "α = 0.406, β = 0.139, γ = 0.255, δ = 1.761, C = G M_{NS}/(R_{NS} c²), "
            "η = Q/(1 + Q)², Q = M_{BH}/M_{NS}"
        ),
        validity="black-hole spin aligned with the orbit; calibrated for Q ≈ 1–7, "
        "χ_{BH} ≈ −0.5–0.9, C ≈ 0.13–0.18",
        accuracy="about 15 % of the remnant mass or 0.01 M⊙, whichever is larger",
        provenance="coefficients, arXiv id, calibration range and accuracy recalled from memory",
        quantities=("remnant_baryon_mass", "disruption_probability"),
        limits={
            "mass_ratio": (1 / 7, 1.0),
            "heavier_spin": (-0.5, 0.9),
            "compactness": (0.13, 0.182),
        },
    )
)
register(
    Method(
        id=BARYON_MASS,
        title="Baryon mass of a neutron star",
        citation=("Lattimer & Prakash 2001, Astrophys. J. 550, 426"),
        arxiv="astro-ph/0002232",
        formula="M^{b} ≈ M (1 + 0.6 C/(1 − 0.5 C)), C = G M/(R c²)",
        validity="cold neutron stars with realistic equations of state",
        accuracy="a few per cent of the binding energy",
        provenance="formula, arXiv id and accuracy recalled from memory",
        quantities=("baryon_mass",),
    )
)


def compactness(m_ns: u.Quantity, ns_radius: u.Quantity) -> u.Quantity:
    """Compactness C = G M / (R c²), G M from the IAU 2015 nominal GM_sun (docs/methods.md §8)."""
    gm = const.GM_sun * require(m_ns, "mass", "m_ns")
    radius = require(ns_radius, "length", "ns_radius") * u.m
    return (gm / (radius * const.c**2)).to(u.dimensionless_unscaled)


def baryon_mass(m_ns: u.Quantity, ns_radius: u.Quantity) -> u.Quantity:
    """Neutron-star baryon mass, Lattimer & Prakash 2001 (ApJ 550, 426) approximation."""
    c = compactness(m_ns, ns_radius).value
    return require(m_ns, "mass", "m_ns") * (1 + 0.6 * c / (1 - 0.5 * c)) * u.Msun


def remnant_baryon_mass(
    m_bh: u.Quantity, m_ns: u.Quantity, chi_bh, ns_radius: u.Quantity
) -> u.Quantity:
    """Baryon mass left outside the black hole (Foucart, Hinderer & Nissanke 2018, PRD 98)."""
    c = compactness(m_ns, ns_radius).value
    q = require(m_bh, "mass", "m_bh") / require(m_ns, "mass", "m_ns")
    eta = q / (1 + q) ** 2
    r_isco = isco_radius(dimensionless(chi_bh, "chi_bh"))
    core = _ALPHA * (1 - 2 * c) / np.cbrt(eta) - _BETA * r_isco * c / eta + _GAMMA
    return baryon_mass(m_ns, ns_radius) * np.maximum(core, 0.0) ** _DELTA


def disrupted(remnant_mass: u.Quantity, threshold: u.Quantity = DISRUPTION_THRESHOLD) -> np.ndarray:
    """True per sample where the remnant exceeds 0.01 M⊙ (common practice, docs/methods.md §12)."""
    limit = require(threshold, "mass", "threshold")
    return np.asarray(require(remnant_mass, "mass", "remnant_mass") > limit)


def disruption_probability(remnant_mass: u.Quantity) -> float:
    """Fraction of samples with a remnant above the disruption threshold (common practice)."""
    return float(np.mean(disrupted(remnant_mass)))
