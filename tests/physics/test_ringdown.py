"""Kerr l = 2, n = 0 ringdown: Leaver's method (Leaver 1985, Proc. R. Soc. A 402, 285), the
tabulated co- and counter-rotating values, and the Berti, Cardoso & Will 2006 fit (PRD 73, 064030).

The counter-rotating branch is checked against values of the general-purpose ``qnm`` package
(Stein 2019, JOSS 4, 1683), quoted in docs/methods.md §7.3, and against the package itself when it
is installed (test-only and optional: its solver runs offline, its cache is never downloaded)."""

import astropy.units as u
import numpy as np
import pytest
from astropy.constants import GM_sun, c

from factsheet.physics import _qnm_table, leaver, remnant
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


#: M omega of the l = 2, n = 0 modes at |chi_f| = 0, 0.3, 0.5, 0.7: (co-rotating,
#: counter-rotating), six decimals. Computed with the ``qnm`` package's Leaver solver (Stein 2019,
#: JOSS 4, 1683) and quoted in docs/methods.md §7.3.
STEIN_2019 = {
    0.0: (0.373672 - 0.088962j, 0.373672 - 0.088962j),
    0.3: (0.419527 - 0.087729j, 0.341333 - 0.089185j),
    0.5: (0.464123 - 0.085639j, 0.324307 - 0.089032j),
    0.7: (0.532600 - 0.080793j, 0.309808 - 0.088717j),
}


def _table_omega(spin: float) -> complex:
    """M omega from the run-time table lookup at a signed spin, for a 1 M_sun hole."""
    f, tau = qnm_220(1 * M, spin)
    return complex(2 * np.pi * f.to_value(u.Hz) * T_SUN, -T_SUN / tau.to_value(u.s))


@pytest.mark.parametrize("spin", sorted(STEIN_2019))
def test_both_branches_match_stein_2019(spin):
    # The Leaver solver and the table, each branch, against the qnm package's values (Stein 2019,
    # JOSS 4, 1683; docs/methods.md §7.3) to the six decimals quoted.
    co, counter = STEIN_2019[spin]
    spins = list(np.linspace(0, spin, 8))
    assert leaver.mode_220(spins)[-1] == pytest.approx(co, abs=6e-7)
    assert leaver.mode_220(spins, counter_rotating=True)[-1] == pytest.approx(counter, abs=6e-7)
    assert _table_omega(spin) == pytest.approx(co, abs=6e-7)
    assert _table_omega(-spin) == pytest.approx(counter, abs=6e-7)


def test_counter_rotating_is_lower_and_damps_faster():
    # docs/methods.md §7.3 (and the Stein 2019 values above): against the orbit the dominant mode
    # has a lower frequency and a slightly shorter damping time; the branches meet at j = 0.
    j = np.linspace(0.01, 0.99, 50)
    f_co, tau_co = qnm_220(60 * M, j)
    f_counter, tau_counter = qnm_220(60 * M, -j)
    assert np.all(f_counter < f_co) and np.all(tau_counter < tau_co)
    assert np.all(np.diff(f_counter) < 0)  # lower still as the hole spins faster
    assert qnm_220(60 * M, -1e-12)[0].value == pytest.approx(qnm_220(60 * M, 0.0)[0].value)


@pytest.mark.parametrize(
    ("index", "counter_rotating"),
    [(0, False), (57, False), (201, False), (333, False), (399, False), (120, True), (399, True)],
)
def test_table_points_resolve(index, counter_rotating):
    # Re-solving table points with the solver in the package reproduces the table.
    u_val = 1 - index * (1 - _qnm_table.U_LAST) / (len(_qnm_table.REAL) - 1)
    spins = list(np.linspace(0, 1 - u_val**2, 40))
    omega = leaver.mode_220(spins, counter_rotating)[-1]
    real = _qnm_table.COUNTER_REAL if counter_rotating else _qnm_table.REAL
    imag = _qnm_table.COUNTER_IMAG if counter_rotating else _qnm_table.IMAG
    assert omega.real == pytest.approx(real[index], rel=1e-10)
    assert omega.imag == pytest.approx(imag[index], rel=1e-10)


@pytest.mark.parametrize("spin", [0.123, 0.5, 0.8765, 0.95, 0.9931, -0.2345, -0.8765, -0.9931])
def test_interpolation_between_table_points(spin):
    # Interpolated values within 1e-6 of fresh Leaver solutions at spins off the grid.
    spins = list(np.linspace(0, abs(spin), 60))
    omega = leaver.mode_220(spins, counter_rotating=spin < 0)[-1]
    f, tau = qnm_220(1 * M, spin)
    assert 2 * np.pi * f.to_value(u.Hz) * T_SUN == pytest.approx(omega.real, rel=1e-6)
    assert T_SUN / tau.to_value(u.s) == pytest.approx(-omega.imag, rel=1e-6)


def test_qnm_package_agrees_on_both_branches():
    # The qnm package (Stein 2019, JOSS 4, 1683), when installed: its offline spin-sequence solver
    # (no cache download), KerrSpinSeq(s=-2, l=2, m=+-2, n=0); m = -2 is the counter-rotating mode.
    spinsequence = pytest.importorskip("qnm.spinsequence")
    spins = np.array([0.1, 0.3571, 0.6, 0.9, 0.99])
    for m in (2, -2):
        seq = spinsequence.KerrSpinSeq(s=-2, l=2, m=m, n=0, a_max=0.99)
        seq.do_find_sequence()
        for spin in spins:
            expected = complex(seq(float(spin))[0])
            got = _table_omega(spin if m > 0 else -spin)
            assert got == pytest.approx(expected, rel=1e-6)


def test_counter_rotating_remnant_of_the_issue_case():
    # 40 + 4 M_sun, heavier spin -0.8 along the orbit, lighter 0: both remnant-spin fits give a
    # remnant spinning against the orbit (JF17 -0.355, HBR16 -0.359), so the dominant ringdown is
    # the counter-rotating mode. Expected M omega: the Stein 2019 counter-rotating values at
    # |chi_f| = 0.3, 0.5, 0.7 (docs/methods.md §7.3) through a parabola, good to ~2e-4 there.
    m1, m2 = 40 * M, 4 * M
    spin = np.mean(
        [
            remnant.remnant_spin_jf17(m1, m2, -0.8, 0.0),
            remnant.remnant_spin_hbr16(m1, m2, -0.8, 0.0),
        ]
    )
    erad = np.mean(
        [
            remnant.radiated_fraction_jf17(m1, m2, -0.8, 0.0),
            remnant.radiated_fraction_bmr12(m1, m2, -0.8, 0.0),
        ]
    )
    m_f = 44 * (1 - erad) * M
    assert spin == pytest.approx(-0.357, abs=0.002)
    x = [0.3, 0.5, 0.7]
    counter = [STEIN_2019[k][1] for k in x]
    w_re = np.polyval(np.polyfit(x, [w.real for w in counter], 2), -spin)
    w_im = np.polyval(np.polyfit(x, [w.imag for w in counter], 2), -spin)
    t_m = T_SUN * m_f.to_value(M)
    f, tau = qnm_220(m_f, spin)
    assert f.to_value(u.Hz) == pytest.approx(w_re / (2 * np.pi * t_m), rel=3e-4)
    assert tau.to_value(u.s) == pytest.approx(t_m / -w_im, rel=3e-4)
    # The issue's numbers are the observed ones at the redshift of 400 Mpc (z = 0.08491816,
    # Planck18; docs/methods.md §16): about 228 Hz, where |chi_f| in the co-rotating branch gave
    # 293 Hz.
    z = 0.08491816
    assert f.to_value(u.Hz) / (1 + z) == pytest.approx(228, abs=1.5)
    assert qnm_220(m_f, -spin)[0].to_value(u.Hz) / (1 + z) == pytest.approx(293, abs=1.5)


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
    # A negative remnant spin takes the counter-rotating branch (docs/methods.md §7.3).
    assert qnm_220(60 * M, -0.3)[0].value < 0.82 * qnm_220(60 * M, 0.3)[0].value


def test_spin_beyond_table_is_nan():
    f, tau = qnm_220(60 * M, np.array([0.5, 0.99995, -0.99995, -0.5]))
    assert np.all(np.isfinite(f[[0, 3]])) and np.all(np.isnan(f[1:3])) and np.isnan(tau[1:3]).all()


def test_fit_covers_the_co_rotating_branch_only():
    # BCW06 fitted the co-rotating mode for j from 0 to 0.99 (PRD 73, 064030): no value below 0.
    f, tau = qnm_220_bcw06(60 * M, np.array([-0.3, 0.3]))
    assert np.isnan(f[0]) and np.isnan(tau[0]) and np.isfinite(f[1])


def test_arguments_are_the_remnant_mass_and_spin():
    # The arguments are named for the remnant (docs/methods.md §7); by name equals by place.
    by_name = qnm_220(remnant_mass=66.74 * M, remnant_spin=0.6750)
    fit_by_name = qnm_220_bcw06(remnant_mass=66.74 * M, remnant_spin=0.6750)
    assert by_name[0] == qnm_220(66.74 * M, 0.6750)[0]
    assert fit_by_name[1] == qnm_220_bcw06(66.74 * M, 0.6750)[1]
