"""Drawing the masses through the chirp mass and the mass ratio.

Definitions checked against: the chirp mass Mc = (m1 m2)^(3/5) / (m1 + m2)^(1/5) (Cutler &
Flanagan 1994, PRD 49, 2658) and the mass ratio q = m2/m1 <= 1; the textbook inverse through the
symmetric mass ratio eta = q/(1+q)^2, M = Mc eta^(-3/5), m1,2 = (M/2)(1 ± sqrt(1 - 4 eta))
(Maggiore 2008, Gravitational Waves vol. 1, ch. 4; recalled, not re-read in the source). Every
value below is invented.
"""

import copy

import numpy as np
import pytest

from factsheet.api import derive
from factsheet.derive.event import measured_names
from factsheet.derive.masses import ASSUMED_MASS_RATIO, masses_from_chirp_mass
from factsheet.derive.sampling import drawn_from_summary
from factsheet.model import Settings

EVENT = {
    "id": "MC-1",
    "time": "2034-01-01T00:00:00",
    "estimate": {
        "heavier": {"mass": "36 +5 -4 Msun"},
        "lighter": {"mass": "29 +4 -5 Msun"},
        "distance": "440 +180 -170 Mpc",
    },
}
N = 100_000
# The sampling error of a 5 % or 95 % point of 1e5 draws is about 0.006 Msun for an interval
# 2 Msun wide (sqrt(p(1-p)/n) / density); 0.03 Msun is five times that.
PRECISION = 0.03


def derived(estimate: dict, drop: tuple[str, ...] = (), frame: str | None = None, n: int = N):
    data = copy.deepcopy(EVENT)
    data["estimate"].update(estimate)
    for key in drop:
        data["estimate"].pop(key)
    if frame:
        data["frame"] = frame
    return derive(data, Settings(samples=n))


def points(x, level=0.9) -> np.ndarray:
    return np.percentile(np.asarray(x), [50 * (1 - level), 50, 50 * (1 + level)])


def test_inverse_of_the_chirp_mass_definition():
    q = np.array([1.0, 0.8, 0.5, 0.1])
    mc = np.array([26.11652, 28.0, 1.2, 10.0])
    m1, m2 = masses_from_chirp_mass(mc, q)
    # forward: Cutler & Flanagan 1994's definition gives the chirp mass back, q = m2/m1
    assert (m1 * m2) ** 0.6 / (m1 + m2) ** 0.2 == pytest.approx(mc, rel=1e-12)
    assert m2 / m1 == pytest.approx(q, rel=1e-12)
    # the textbook inverse through eta (Maggiore 2008 ch. 4)
    eta = q / (1 + q) ** 2
    total = mc * eta**-0.6
    assert m1 == pytest.approx(total / 2 * (1 + np.sqrt(1 - 4 * eta)), rel=1e-12)
    assert m2 == pytest.approx(total / 2 * (1 - np.sqrt(1 - 4 * eta)), rel=1e-9)
    # equal masses: Mc = m 2^(-1/5) from the definition, so 26.11652 is 30 + 30 (closed form)
    assert m1[0] == m2[0] == pytest.approx(30.0, rel=1e-6)


def test_given_chirp_mass_interval_is_kept():
    # the example: a chirp mass of 31.2 +1.1 -1.0 Msun comes out as given
    result = derived(
        {"chirp_mass": "31.2 +1.1 -1.0 Msun", "mass_ratio": "0.8 +0.15 -0.25"},
        drop=("heavier", "lighter"),
    )
    low, median, high = points(result.samples["chirp_mass"].value)  # frame: source
    assert median == pytest.approx(31.2, abs=PRECISION)
    assert low == pytest.approx(30.2, abs=PRECISION) and high == pytest.approx(32.3, abs=PRECISION)
    q = points(result.samples["mass_ratio"].value)
    assert q == pytest.approx([0.55, 0.8, 0.95], abs=0.003)


def test_independent_masses_widen_the_chirp_mass_and_the_chirp_mass_keeps_it():
    # before: the masses 36 +5 -4 and 29 +4 -5 drawn independently give a chirp mass interval
    # several times wider than a typical measured one; given the chirp mass, it is kept
    before = points(derived({}).samples["chirp_mass"].value)
    after = points(derived({"chirp_mass": "28.1 +1.1 -1.0 Msun"}).samples["chirp_mass"].value)
    assert (before[2] - before[0]) > 2.5 * (after[2] - after[0])
    assert after == pytest.approx([27.1, 28.1, 29.2], abs=PRECISION)


def test_detector_frame_chirp_mass_is_kept_in_its_frame():
    result = derived(
        {"chirp_mass": "31.2 +1.1 -1.0 Msun", "mass_ratio": "0.8 +0.15 -0.25"}, frame="detector"
    )
    detector = points(result.samples["chirp_mass_detector"].value)
    assert detector == pytest.approx([30.2, 31.2, 32.3], abs=PRECISION)
    shown = result.summary("chirp_mass_detector")  # as given, in its frame
    assert (shown.median, shown.low, shown.high) == pytest.approx((31.2, 30.2, 32.3))
    source = result.summary("chirp_mass")  # derived: divided by 1 + z sample by sample
    assert source.median < 31.2 and "chirp_mass" not in measured_names(result.event)


def test_kinds_given_chirp_mass_and_ratio_derived_masses():
    result = derived(
        {"chirp_mass": "28.1 +1.1 -1.0 Msun", "mass_ratio": "0.8 +0.15 -0.25"},
        drop=("heavier", "lighter"),
    )
    kinds = measured_names(result.event)
    assert kinds["chirp_mass"] == "given" and kinds["mass_ratio"] == "given"
    assert "heavier_mass" not in kinds and "lighter_mass" not in kinds  # derived
    m1, m2 = result.samples["heavier_mass"], result.samples["lighter_mass"]
    assert (m1 >= m2).all()


def test_caveats_say_how_the_masses_were_drawn():
    both = derived({"chirp_mass": "28.1 +1.1 -1.0 Msun", "mass_ratio": "0.8 +0.15 -0.25"}, n=2000)
    codes = {c.code: c.text for c in both.caveats}
    assert "chirp mass, which keeps its measured interval" in codes["independent-sampling"]
    assert "between the two masses" not in codes["independent-sampling"]
    assert "relabelled-draws" not in codes
    alone = derived({"chirp_mass": "28.1 +1.1 -1.0 Msun"}, n=2000)
    assert "mass-ratio-from-masses" in {c.code for c in alone.caveats}
    assumed = derived({"chirp_mass": "28.1 +1.1 -1.0 Msun"}, drop=("heavier", "lighter"))
    (note,) = [c for c in assumed.caveats if c.code == "mass-ratio-assumed"]
    assert "0.1 and 1" in note.text and "assumption" in note.text
    q = assumed.samples["mass_ratio"].value
    assert ASSUMED_MASS_RATIO[0] <= q.min() and q.max() <= ASSUMED_MASS_RATIO[1]
    # uniform: its median is the middle of the range (0.55) to sampling precision
    assert np.median(q) == pytest.approx(0.55, abs=0.01)


def test_chirp_mass_alone_takes_the_ratio_of_the_given_masses():
    result = derived({"chirp_mass": "28.1 +1.1 -1.0 Msun"})
    q = result.samples["mass_ratio"].value
    # the ratio of the masses' medians 29/36 = 0.806, near the median of the drawn ratio
    assert np.median(q) == pytest.approx(29 / 36, abs=0.01)
    assert points(result.samples["chirp_mass"].value) == pytest.approx(
        [27.1, 28.1, 29.2], abs=PRECISION
    )


def test_a_samples_file_stands_for_the_chirp_mass(tmp_path):
    # the file's masses fix the chirp mass and ratio: the summary's are not drawn beside them
    rng = np.random.default_rng(3)
    rows = "".join(
        f"{a:.4f},{b:.4f},{d:.2f}\n"
        for a, b, d in zip(
            rng.normal(36, 2, 400), rng.normal(29, 2, 400), rng.normal(440, 90, 400), strict=True
        )
    )
    (tmp_path / "t1.csv").write_text(
        "heavier.mass [Msun],lighter.mass [Msun],distance [Mpc]\n" + rows, encoding="utf-8"
    )
    (tmp_path / "t1.yaml").write_text(
        'id: T-1\ntime: "2034-04-12T07:26:41.2"\nsamples: t1.csv\n'
        "estimate:\n  heavier: {mass: 36 +4 -4 Msun}\n  lighter: {mass: 29 +4 -4 Msun}\n"
        "  chirp_mass: 28.1 +1.1 -1.0 Msun\n  mass_ratio: 0.8 +0.15 -0.25\n"
        "  distance: 440 +150 -150 Mpc\n",
        encoding="utf-8",
    )
    result = derive(tmp_path / "t1.yaml")
    assert drawn_from_summary(result.event) == []
    assert {"chirp_mass", "mass_ratio"}.isdisjoint(measured_names(result.event))
    codes = {c.code for c in result.caveats}
    assert not codes & {"partly-independent-sampling", "mass-ratio-from-masses"}
