"""Tidal disruption against the check values of docs/methods.md §12.

The check values were computed in docs/methods.md §12 from the Foucart, Hinderer & Nissanke 2018 fit
(PRD 98, 081501(R)), coefficients from memory, with the Lattimer & Prakash 2001 (ApJ 550, 426)
baryon mass and R_NS = 12 km.
"""

import astropy.units as u
import numpy as np
import pytest

from factsheet.physics.disruption import (
    baryon_mass,
    compactness,
    disrupted,
    disruption_probability,
    remnant_baryon_mass,
)

R_NS = 12 * u.km


@pytest.mark.parametrize(
    ("m_bh", "chi", "expected", "abs_tol"),
    [
        (7.0, 0.0, 0.0, 0.0),  # plunge, docs/methods.md §12
        (7.0, 0.5, 0.005, 0.0005),  # docs/methods.md §12, quoted to 1 significant figure
        (7.0, 0.9, 0.27, 0.005),  # docs/methods.md §12, quoted to 2 significant figures
        (10.0, 0.0, 0.0, 0.0),  # plunge, docs/methods.md §12
    ],
)
def test_fhn18_check_values(m_bh, chi, expected, abs_tol):
    result = remnant_baryon_mass(m_bh * u.Msun, 1.4 * u.Msun, chi, R_NS)
    assert result.unit == u.Msun
    assert result.value == pytest.approx(expected, abs=abs_tol)


def test_elementwise_on_samples():
    spins = np.array([0.0, 0.5, 0.9])
    result = remnant_baryon_mass(7 * u.Msun, 1.4 * u.Msun, spins, R_NS)
    assert result.shape == (3,)
    assert list(disrupted(result)) == [False, False, True]  # 0.01 Msun threshold, common practice
    assert disruption_probability(result) == pytest.approx(1 / 3)


def test_compactness_and_baryon_mass_closed_form():
    # C = G M / (R c^2) with GM_sun/c^2 = 1476.625 m (docs/methods.md §8, IAU 2015 B3):
    c = compactness(1.4 * u.Msun, R_NS)
    assert c.value == pytest.approx(1.4 * 1476.625 / 12_000, rel=1e-6)
    # Lattimer & Prakash 2001 (ApJ 550, 426) approximation, formula from memory.
    assert baryon_mass(1.4 * u.Msun, R_NS).value == pytest.approx(
        1.4 * (1 + 0.6 * c.value / (1 - 0.5 * c.value))
    )


def test_more_spin_more_remnant_fhn18_trend():
    # FHN18: a prograde spin moves the ISCO inwards and raises the remnant mass.
    spins = np.linspace(0.3, 0.95, 14)
    result = remnant_baryon_mass(5 * u.Msun, 1.4 * u.Msun, spins, R_NS).value
    assert np.all(np.diff(result) > 0)


def test_wrong_dimension_names_the_argument():
    with pytest.raises(u.UnitsError, match="ns_radius"):
        remnant_baryon_mass(7 * u.Msun, 1.4 * u.Msun, 0.5, 12 * u.s)
    with pytest.raises(u.UnitsError, match="m_bh"):
        remnant_baryon_mass(7 * u.km, 1.4 * u.Msun, 0.5, R_NS)
