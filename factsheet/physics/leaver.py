"""Kerr quasinormal modes by Leaver's continued fractions (Leaver 1985, Proc. R. Soc. A 402, 285).

Units 2M = 1, a = j/2 >= 0, spin weight s = -2, time dependence exp(-i omega t). With Re omega > 0,
m > 0 is the co-rotating mode (its pattern turns with the hole) and m < 0 the counter-rotating one;
the mirror solutions (m -> -m, omega -> -conj(omega)) carry no new frequencies. The angular
(spin-weighted spheroidal) and radial three-term recurrences are solved together for the
fundamental mode (no inversion needed for n = 0, l = |m|). Used once, by
``tools/make_qnm_table.py``, to tabulate both l = |m| = 2, n = 0 branches, and by tests that
re-solve table points. Plain Python complex arithmetic: the loops run over recurrence terms, not
samples.
"""

from __future__ import annotations

import math

S = -2


def _continued_fraction(alpha, beta, gamma, depth: int) -> complex:
    """beta_0 - alpha_0 gamma_1 / (beta_1 - alpha_1 gamma_2 / (beta_2 - ...)), from the tail."""
    tail = 0j
    for n in range(depth, 0, -1):
        tail = alpha(n - 1) * gamma(n) / (beta(n) - tail)
    return beta(0) - tail


def angular_condition(sep: complex, aw: complex, m: int, depth: int = 60) -> complex:
    """Leaver's angular recurrence (his eqs. 19–21) for separation constant ``sep`` at a*omega."""
    k1, k2 = abs(m - S) / 2, abs(m + S) / 2
    const = aw * (2 * k1 + S + 1) * 2 - (k1 + k2) * (k1 + k2 + 1) + aw * aw + S * (S + 1) + sep
    return _continued_fraction(
        lambda n: -2 * (n + 1) * (n + 2 * k1 + 1),
        lambda n: n * (n - 1) + 2 * n * (k1 + k2 + 1 - 2 * aw) - const,
        lambda n: 2 * aw * (n + k1 + k2 + S),
        depth,
    )


def radial_condition(w: complex, a: float, sep: complex, m: int, depth: int) -> complex:
    """Leaver's radial recurrence (his eqs. 25–26) at frequency ``w`` (2M = 1 units)."""
    b = math.sqrt(1 - 4 * a * a)
    x = w / 2 - a * m
    c0 = 1 - S - 1j * w - 2j / b * x
    c1 = -4 + 2j * w * (2 + b) + 4j / b * x
    c2 = S + 3 - 3j * w - 2j / b * x
    c3 = (
        w * w * (4 + 2 * b - a * a)
        - 2 * a * m * w
        - S
        - 1
        + (2 + b) * 1j * w
        - sep
        + (4 * w + 2j) / b * x
    )
    c4 = S + 1 - 2 * w * w - (2 * S + 3) * 1j * w - (4 * w + 2j) / b * x
    return _continued_fraction(
        lambda n: n * n + (c0 + 1) * n + c0,
        lambda n: -2 * n * n + (c1 + 2) * n + c3,
        lambda n: n * n + (c2 - 3) * n + c4 - c2 + 2,
        depth,
    )


def _secant(func, x0: complex, x1: complex, tol: float = 1e-13, maxiter: int = 80) -> complex:
    """Complex secant iteration for a root of ``func`` from two starting points."""
    f0, f1 = func(x0), func(x1)
    for _ in range(maxiter):
        if f1 == f0:
            return x1
        x0, x1 = x1, x1 - f1 * (x1 - x0) / (f1 - f0)
        f0, f1 = f1, func(x1)
        if abs(x1 - x0) < tol * max(1.0, abs(x1)):
            return x1
    raise ArithmeticError(f"Leaver root search did not converge (last {x1})")


def separation_constant(aw: complex, m: int, guess: complex) -> complex:
    """Spin-weighted spheroidal separation constant near ``guess`` (Leaver 1985 convention)."""
    return _secant(lambda sep: angular_condition(sep, aw, m), guess, guess * (1 + 1e-6) + 1e-6)


def solve_mode(
    spin: float, guess: complex, sep_guess: complex, m: int = 2, depth: int | None = None
) -> tuple[complex, complex]:
    """Fundamental (n = 0, l = m) Kerr mode at dimensionless ``spin``: (M omega, separation const).

    Leaver 1985 (Proc. R. Soc. A 402, 285). ``guess`` is M omega; continue in spin from a nearby
    solution. Returns M omega = omega(2M=1)/2 with Re > 0 and Im < 0.
    """
    a = spin / 2
    if depth is None:
        depth = int(400 + 60 / math.sqrt(max(1 - spin * spin, 1e-12)))
    state = {"sep": sep_guess}

    def condition(w: complex) -> complex:
        state["sep"] = separation_constant(a * w, m, state["sep"])
        return radial_condition(w, a, state["sep"], m, depth)

    w0 = 2 * guess
    w = _secant(condition, w0, w0 * (1 + 1e-5))
    condition(w)
    return w / 2, state["sep"]


def mode_220(spins: list[float], counter_rotating: bool = False) -> list[complex]:
    """M omega of the Kerr l = 2, n = 0 mode at increasing spins from 0, by continuation.

    Leaver 1985 (Proc. R. Soc. A 402, 285). ``counter_rotating`` selects the branch whose pattern
    turns against the hole's spin (m = -2 with Re omega > 0): the dominant mode of a remnant that
    spins against the orbit. Both branches start from the Schwarzschild value at j = 0.
    """
    m = -2 if counter_rotating else 2
    guess, sep, out = 0.3736717 - 0.0889623j, 4.0 + 0j, []
    for spin in spins:
        guess, sep = solve_mode(spin, guess, sep, m=m)
        out.append(guess)
    return out
