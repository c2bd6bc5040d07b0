"""Kerr 220 ringdown: Leaver's method (Leaver 1985, Proc. R. Soc. A 402, 285), the tabulated
values, and the Berti, Cardoso & Will 2006 fit (PRD 73, 064030)."""

import astropy.units as u
import numpy as np
import pytest
from astropy.constants import GM_sun, c

from factsheet.physics import _qnm_table, leaver
from factsheet.physics.ringdown import qnm_220, qnm_220_bcw06

M = u.Msun
T_SUN = (GM_sun / c**3).to_value(u.s)


def test_schwarzschild_mode_leaver_1985():
    # l = 2, n = 0 Schwarzschild mode M omega = 0.3736717 - 0.0889623 i (Leaver 1985; from memory,
    # docs/methods.md §16).
    omega, sep = leaver.solve_mode(0.0, 0.37 - 0.09j, 4.0)
    assert omega.real == pytest.approx(0.3736717, abs=1e-7)
    assert omega.imag == pytest.approx(-0.0889623, abs=1e-7)
    assert sep == pytest.approx(4.0)  # l(l+1) - s(s+1) for l = 2, s = -2


def test_kerr_mode_at_seven_tenths():
    # Kerr 220 at j = 0.7: 0.53260 - 0.08079 i (docs/methods.md §7.2, computed for this project;
    # Berti's tables, from memory).
    omega = leaver.mode_220(list(np.linspace(0, 0.7, 8)))[-1]
    assert omega.real == pytest.approx(0.53260, abs=1e-5)
    assert omega.imag == pytest.approx(-0.08079, abs=1e-5)


@pytest.mark.parametrize("index", [0, 57, 201, 333, 399])
def test_table_points_resolve(index):
    # Re-solving table points with the solver in the package reproduces the table.
    u_val = 1 - index * (1 - _qnm_table.U_LAST) / (len(_qnm_table.REAL) - 1)
    spins = list(np.linspace(0, 1 - u_val**2, 40))
    omega = leaver.mode_220(spins)[-1]
    assert omega.real == pytest.approx(_qnm_table.REAL[index], rel=1e-10)
    assert omega.imag == pytest.approx(_qnm_table.IMAG[index], rel=1e-10)


@pytest.mark.parametrize("spin", [0.123, 0.5, 0.8765, 0.95, 0.9931])
def test_interpolation_between_table_points(spin):
    # Interpolated values within 1e-6 of fresh Leaver solutions at spins off the grid.
    omega = leaver.mode_220(list(np.linspace(0, spin, 60)))[-1]
    f, tau = qnm_220(1 * M, spin)
    assert 2 * np.pi * f.to_value(u.Hz) * T_SUN == pytest.approx(omega.real, rel=1e-6)
    assert T_SUN / tau.to_value(u.s) == pytest.approx(-omega.imag, rel=1e-6)


def test_worked_remnant_methods_7_2():
    # M_f = 66.74 M_sun, a_f = 0.6750: exact 252.7 Hz, 4.02 ms; BCW06 254.0 Hz, 3.99 ms
    # (worked example of docs/methods.md §7.2, computed for this project).
    f, tau = qnm_220(66.74 * M, 0.6750)
    assert f.to_value(u.Hz) == pytest.approx(252.7, abs=0.05)
    assert tau.to_value(u.ms) == pytest.approx(4.02, abs=0.005)
    f, tau = qnm_220_bcw06(66.74 * M, 0.6750)
    assert f.to_value(u.Hz) == pytest.approx(254.0, abs=0.05)
    assert tau.to_value(u.ms) == pytest.approx(3.99, abs=0.005)


def test_bcw06_fit_within_its_accuracy_of_exact_values():
    # BCW06 claim a few per cent; measured against Leaver: F within 1.85 %, Q within 0.88 %
    # (docs/methods.md §7.1).
    j = np.linspace(0, 0.99, 200)
    f1, t1 = qnm_220(M, j)
    f2, t2 = qnm_220_bcw06(M, j)
    assert np.max(np.abs(f2 / f1 - 1)) < 0.019
    assert np.max(np.abs(f2 * t2 / (f1 * t1) - 1)) < 0.009


def test_frames_and_negative_spin():
    # Frequencies scale as 1/M: a (1+z)-heavier detector-frame mass gives f/(1+z), tau (1+z).
    f_src, tau_src = qnm_220(60 * M, 0.7)
    f_det, tau_det = qnm_220(60 * 1.5 * M, 0.7)
    assert f_det.value == pytest.approx(f_src.value / 1.5)
    assert tau_det.value == pytest.approx(tau_src.value * 1.5)
    assert qnm_220(60 * M, -0.3)[0].value == pytest.approx(qnm_220(60 * M, 0.3)[0].value)


def test_spin_beyond_table_is_nan():
    f, tau = qnm_220(60 * M, np.array([0.5, 0.99995]))
    assert np.isfinite(f[0]) and np.isnan(f[1]) and np.isnan(tau[1])


def test_arguments_are_the_remnant_mass_and_spin():
    # The arguments are named for the remnant (docs/methods.md §7); by name equals by place.
    by_name = qnm_220(remnant_mass=66.74 * M, remnant_spin=0.6750)
    fit_by_name = qnm_220_bcw06(remnant_mass=66.74 * M, remnant_spin=0.6750)
    assert by_name[0] == qnm_220(66.74 * M, 0.6750)[0]
    assert fit_by_name[1] == qnm_220_bcw06(66.74 * M, 0.6750)[1]
