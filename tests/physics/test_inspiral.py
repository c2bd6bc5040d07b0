"""Leading-order inspiral against docs/methods.md §10 and §16 test vectors (closed forms of Peters &
Mathews 1963, Phys. Rev. 131, 435; Peters 1964, Phys. Rev. 136, B1224; Maggiore 2008 §4.1)."""

import astropy.units as u
import numpy as np
import pytest
from astropy.constants import GM_sun, c
from scipy.integrate import quad

from factsheet.physics import cosmology, inspiral

MSUN = u.Msun
MC_BNS = inspiral.chirp_mass(1.4 * MSUN, 1.4 * MSUN)
MC_BBH = inspiral.chirp_mass(30 * MSUN, 30 * MSUN)


def test_solar_time_iau_2015():
    # GM_sun / c^3 = 4.925491e-6 s from the IAU 2015 B3 nominal solar mass parameter.
    assert (GM_sun / c**3).to_value(u.s) == pytest.approx(4.925491e-6, rel=1e-6)


@pytest.mark.parametrize(
    ("value", "expected"),
    [
        (lambda: MC_BNS.to_value(MSUN), 1.218771),
        (lambda: MC_BBH.to_value(MSUN), 26.11652),
        (lambda: inspiral.symmetric_mass_ratio(30 * MSUN, 20 * MSUN), 0.24),
        (lambda: inspiral.isco_frequency(1 * MSUN).to_value(u.Hz), 4397.175),
        (lambda: inspiral.isco_frequency(60 * MSUN).to_value(u.Hz), 73.28625),
        (lambda: inspiral.time_to_merger(MC_BNS, 10 * u.Hz).to_value(u.s), 1002.408),
        (lambda: inspiral.time_to_merger(MC_BBH, 20 * u.Hz).to_value(u.s), 0.9549393),
        (lambda: inspiral.frequency_at_time(MC_BNS, 1 * u.s).to_value(u.Hz), 133.4725),
        (
            lambda: inspiral.cycles_between(MC_BNS, 10 * u.Hz, inspiral.isco_frequency(2.8 * MSUN)),
            16035.02,
        ),
        (
            lambda: inspiral.cycles_between(MC_BBH, 20 * u.Hz, inspiral.isco_frequency(60 * MSUN)),
            27.04942,
        ),
        (lambda: inspiral.strain_amplitude(MC_BBH, 50 * u.Hz, 400 * u.Mpc).value, 9.271672e-22),
        (lambda: inspiral.strain_amplitude(MC_BNS, 100 * u.Hz, 40 * u.Mpc).value, 8.902719e-23),
        (lambda: inspiral.effective_spin(30 * MSUN, 20 * MSUN, 0.5, 0.15), 0.36),
    ],
)
def test_methods_section_16_vectors(value, expected):
    # docs/methods.md §16 test vectors (computed for this project), relative tolerance 1e-6.
    assert value() == pytest.approx(expected, rel=1e-6)


def test_time_to_merger_against_quadrature_of_df_dt():
    # Peters 1964: df/dt = (96/5) pi^(8/3) T^(5/3) f^(11/3); integrate 1/(df/dt) from f to infinity.
    t_c = MC_BBH.to_value(MSUN) * (GM_sun / c**3).to_value(u.s)
    rate = lambda f: 96 / 5 * np.pi ** (8 / 3) * t_c ** (5 / 3) * f ** (11 / 3)  # noqa: E731
    numeric, _ = quad(lambda f: 1 / rate(f), 20, np.inf, epsrel=1e-12)
    assert inspiral.time_to_merger(MC_BBH, 20 * u.Hz).to_value(u.s) == pytest.approx(numeric)
    cycles, _ = quad(lambda f: f / rate(f), 20, 70, epsrel=1e-12)
    assert inspiral.cycles_between(MC_BBH, 20 * u.Hz, 70 * u.Hz) == pytest.approx(cycles)


def test_frequency_at_time_inverts_time_to_merger():
    f = np.geomspace(5, 1000, 50) * u.Hz
    tau = inspiral.time_to_merger(MC_BNS, f)
    assert np.allclose(inspiral.frequency_at_time(MC_BNS, tau).to_value(u.Hz), f.value)


# Worked binaries, docs/methods.md §10 (computed for this project): source masses, Planck18
# redshift, observed quantities.
WORKED = [
    (1.4, 1.4, 40, 10, 100, 0.00897, 1.2297, 1556.46, 987.6, 15798, 9.04e-23),
    (10, 1.4, 200, 10, 100, 0.04370, 3.1251, 369.57, 208.7, 3331, 8.55e-23),
    (30, 30, 400, 20, None, 0.08492, 28.3343, 67.55, 0.834, 23.2, 1.30e-21),
    (30, 30, 5000, 20, None, 0.77942, 46.4724, 41.19, 0.365, 8.19, 1.70e-22),
]


@pytest.mark.parametrize(("m1", "m2", "dist", "f_low", "f_ref", *"zmftnh"), WORKED)
def test_worked_binaries(m1, m2, dist, f_low, f_ref, z, m, f, t, n, h):
    z_got = cosmology.redshift_at_distance(dist * u.Mpc, "Planck18")
    mc_det = cosmology.to_detector_frame(inspiral.chirp_mass(m1 * MSUN, m2 * MSUN), z_got)
    f_isco = inspiral.isco_frequency(cosmology.to_detector_frame((m1 + m2) * MSUN, z_got))
    f_h = f_isco if f_ref is None else f_ref * u.Hz
    assert z_got == pytest.approx(z, rel=2e-3)
    assert mc_det.to_value(MSUN) == pytest.approx(m, rel=1e-4)
    assert f_isco.to_value(u.Hz) == pytest.approx(f, rel=2e-4)  # table rounds to 4 digits
    assert inspiral.time_to_merger(mc_det, f_low * u.Hz).to_value(u.s) == pytest.approx(t, rel=2e-3)
    assert inspiral.cycles_between(mc_det, f_low * u.Hz, f_isco) == pytest.approx(n, rel=2e-3)
    assert inspiral.strain_amplitude(mc_det, f_h, dist * u.Mpc).value == pytest.approx(h, rel=5e-3)


def test_mass_ratio_is_at_most_one_in_either_order():
    assert inspiral.mass_ratio(20 * MSUN, 30 * MSUN) == pytest.approx(2 / 3)
    assert inspiral.mass_ratio(30 * MSUN, 20 * MSUN) == pytest.approx(2 / 3)


def test_arm_length_change_is_half_h_l_per_arm():
    # Each arm changes by h L / 2 (docs/methods.md §10); 1e-21 on a 4 km arm gives 2e-18 m.
    got = inspiral.arm_length_change(1e-21, 4 * u.km)
    assert got.unit == u.m
    assert got.value == pytest.approx(2e-18)


def test_units_returned():
    assert inspiral.chirp_mass(3e31 * u.kg, 3e31 * u.kg).unit == MSUN
    assert inspiral.time_to_merger(MC_BNS, 10 * u.Hz).unit == u.s
    assert inspiral.strain_amplitude(MC_BNS, 100 * u.Hz, 40 * u.Mpc).unit == u.one
