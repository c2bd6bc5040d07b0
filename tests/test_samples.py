"""The summary sampler and the samples-file reader (DESIGN.md section 3)."""

import astropy.units as u
import numpy as np
import pytest

from factsheet.errors import InputError
from factsheet.model import Parameters
from factsheet.quantities import Estimate
from factsheet.samples import draw, draw_parameters, read_samples_csv

RNG = np.random.default_rng(1)


@pytest.mark.parametrize("level", [0.9, 0.68])
def test_draw_reproduces_median_and_bounds(level):
    est = Estimate(42.0, 7.0, 5.0, u.solMass)
    x = draw(est, 200_000, level, (0.0, np.inf), np.random.default_rng(3))
    low, med, high = np.percentile(x, [50 * (1 - level), 50, 50 * (1 + level)])
    # sampling error of a quantile at n = 2e5 is ~0.01 here; allow 0.05
    assert med == pytest.approx(42.0, abs=0.05)
    assert low == pytest.approx(37.0, abs=0.05) and high == pytest.approx(49.0, abs=0.05)


def test_truncation_keeps_samples_inside_physical_limits():
    spin = draw(Estimate(0.95, 0.2, 0.3, u.one), 50_000, 0.9, (-1.0, 1.0), RNG)
    mass = draw(Estimate(1.0, 3.0, 2.0, u.solMass), 50_000, 0.9, (0.0, np.inf), RNG)
    assert spin.max() <= 1.0 and spin.min() >= -1.0 and (mass > 0).all()
    assert len(np.unique(spin)) == len(spin)  # nothing piled up on the limit


def test_exact_value_gives_constant_samples():
    assert (draw(Estimate(4.0, 0, 0, u.km), 10, 0.9, (0, np.inf), RNG) == 4.0).all()


def test_component_labels_kept_and_seed_reproducible():
    params = Parameters(
        {
            "mass_1": Estimate(10.0, 3.0, 3.0, u.solMass),
            "mass_2": Estimate(9.5, 3.0, 3.0, u.solMass),
            "spin_1z": Estimate(0.5, 0.0, 0.0, u.one),
            "spin_2z": Estimate(-0.5, 0.0, 0.0, u.one),
            "luminosity_distance": Estimate(400.0, 100.0, 100.0, u.Mpc),
        }
    )
    a = draw_parameters(params, 5000, 0.9, seed=7)
    b = draw_parameters(params, 5000, 0.9, seed=7)
    assert all(np.array_equal(a[k], b[k]) for k in a)
    assert (a["mass_1"] >= a["mass_2"]).all()
    swapped = a["spin_1z"] < 0  # spins follow their body when labels swap
    assert swapped.any() and (a["spin_2z"][swapped] == 0.5).all()


def write(tmp_path, text, name="s.csv"):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def test_samples_csv_with_units_in_header(tmp_path):
    path = write(
        tmp_path,
        "# comment\nmass_1 [kg],mass_2 [Msun],luminosity_distance [Gpc],spin_1z\n"
        "3.97682e31,10,1.5,0.2\n3.97682e31,12,1.0,0.1\n",
    )
    s = read_samples_csv(path)
    assert s["mass_1"][0] == pytest.approx(20.0, rel=1e-4)  # 2 x 1.98841e30 kg (IAU 2015 / CODATA)
    assert s["luminosity_distance"].tolist() == [1500.0, 1000.0]
    assert s["spin_1z"].tolist() == [0.2, 0.1]


@pytest.mark.parametrize(
    ("text", "line", "words"),
    [
        ("mass_1 [Msun],mass_2 [Msun]\n1,1\n", 1, "missing column(s): luminosity_distance"),
        ("mass_1 [Mpc],mass_2 [Msun],luminosity_distance [Mpc]\n1,1,1\n", 1, "not a mass"),
        (
            "mass_1 [Msun],mass_2 [Msun],luminosity_distance [Mpc],bogus\n1,1,1,1\n",
            1,
            "unknown column",
        ),
        (
            "mass_1 [Msun],mass_2 [Msun],luminosity_distance [Mpc]\n1,1,1\n2,x,1\n",
            3,
            "not a number",
        ),
        ("mass_1 [Msun],mass_2 [Msun],luminosity_distance [Mpc]\n1,1\n", 2, "2 cells, expected 3"),
        ("mass_1 [Msun],mass_2 [Msun],luminosity_distance [Mpc]\n1,-1,1\n", 2, "physical range"),
        ("mass_1 [Msun],mass_2 [Msun],luminosity_distance [Mpc]\n1,nan,1\n", 2, "physical range"),
        ("mass_1 [Msun],mass_2 [Msun],luminosity_distance [Mpc]\n", 2, "no sample rows"),
    ],
)
def test_bad_samples_files_name_line(tmp_path, text, line, words):
    path = write(tmp_path, text)
    with pytest.raises(InputError) as info:
        read_samples_csv(path)
    (problem,) = [str(p) for p in info.value.problems]
    assert problem.startswith(f"{path}:{line}:") and words in problem


def test_binary_samples_file(tmp_path):
    path = tmp_path / "s.csv"
    path.write_bytes(b"\xff\xfe\x00\x01")
    with pytest.raises(InputError, match="not UTF-8"):
        read_samples_csv(path)
