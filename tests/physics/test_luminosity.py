"""Peak luminosity (Keitel et al. 2017, PRD 96, 024006) and c^5/G through astropy (CODATA)."""

import astropy.units as u
import numpy as np
import pytest
from astropy.constants import M_sun, c

from factsheet.physics.luminosity import peak_luminosity_keitel17, planck_luminosity

M = u.Msun


def test_planck_luminosity_codata():
    # c^5/G = 3.628255e52 W (CODATA 2018/2022 G through astropy; docs/methods.md §8, §16).
    assert planck_luminosity().to_value(u.W) == pytest.approx(3.628255e52, rel=1e-6)


def test_solar_mass_energy_codata_iau():
    # M_sun c^2 = 1.787094e47 J (IAU 2015 B3 GM_sun with CODATA G, via astropy;
    # docs/methods.md §16).
    assert (M_sun * c**2).to_value(u.J) == pytest.approx(1.787094e47, rel=1e-6)


def test_equal_mass_non_spinning():
    # The fit's non-spinning polynomial at eta = 1/4 is 1.00095: L = 1.0247e-3 c^5/G
    # (docs/methods.md §5).
    lum = peak_luminosity_keitel17(30 * M, 30 * M, 0, 0)
    assert (lum / planck_luminosity()).to_value(u.one) == pytest.approx(1.0247e-3, rel=1e-4)
    assert lum.to_value(u.erg / u.s) == pytest.approx(3.72e56, rel=2e-3)


def test_aligned_spin_raises_and_anti_aligned_lowers():
    # Numerical relativity: aligned spins brighten the peak, anti-aligned dim it; docs/methods.md §5
    # gives 1.70e-3 and 0.76e-3 c^5/G at chi = +-0.8, equal mass.
    up = peak_luminosity_keitel17(M, M, 0.8, 0.8) / planck_luminosity()
    down = peak_luminosity_keitel17(M, M, -0.8, -0.8) / planck_luminosity()
    assert up.to_value(u.one) == pytest.approx(1.70e-3, abs=5e-6)
    assert down.to_value(u.one) == pytest.approx(0.76e-3, abs=5e-6)
    chi = np.linspace(-0.9, 0.9, 19)
    assert np.all(np.diff(peak_luminosity_keitel17(M, 0.5 * M, chi, chi).value) > 0)


def test_independent_of_total_mass_and_in_watts():
    # L_peak/(c^5/G) depends on mass ratio and spins only (G = c = 1 scaling).
    a = peak_luminosity_keitel17(10 * M, 5 * M, 0.3, 0.1)
    b = peak_luminosity_keitel17(100 * M, 50 * M, 0.3, 0.1)
    assert a.unit == u.W
    assert a.value == pytest.approx(b.value, rel=1e-12)


def test_small_mass_ratio_scales_as_eta_squared():
    # Perturbative limit built into the fit: L_peak ∝ eta^2 as eta -> 0 (Keitel et al. 2017).
    eta = lambda q: q / (1 + q) ** 2  # noqa: E731
    l1 = peak_luminosity_keitel17(M, 1e-3 * M, 0, 0).value / eta(1e-3) ** 2
    l2 = peak_luminosity_keitel17(M, 1e-4 * M, 0, 0).value / eta(1e-4) ** 2
    assert l1 == pytest.approx(l2, rel=1e-2)
