"""Mass bands and source classes on constructed sample sets with known answers
(docs/methods.md §11)."""

import astropy.units as u
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from factsheet.load.reference import load_reference
from factsheet.physics.bands import (
    BANDS,
    EDGE_KEYS,
    INTERMEDIATE_KEY,
    band_probabilities,
    intermediate_mass_probability,
    source_class,
    source_class_probabilities,
    straddles,
)

# Default edges of docs/methods.md §11 (Farmer et al. 2019, ApJ 887, 53: 45 Msun; Özel et al.
# 2010, ApJ 725, 1918: 5 Msun; 130 Msun upper edge, van Son et al. 2020; 100 Msun, Greene,
# Strader & Ho 2020, ARA&A 58, 257), read from the packaged reference data.
EDGES = load_reference().mass_bands.quantities()
EDGE_VALUES = [EDGES[key].to_value(u.Msun) for key in EDGE_KEYS]


def test_edges_come_from_reference_data_methods_section_11():
    expected = {"neutron_star_max": 2.3, "lower_gap_top": 5.0, "pair_instability_lower": 45.0}
    expected |= {"pair_instability_upper": 130.0, "intermediate_mass_min": 100.0}
    assert {k: v.to_value(u.Msun) for k, v in EDGES.items()} == expected


def test_uniform_samples_across_the_lower_pair_instability_edge():
    # Uniform on [40, 50) Msun: exactly half below the 45 Msun edge (constructed answer).
    samples = (40 + np.arange(10_000) / 1000) * u.Msun
    p = band_probabilities(samples, EDGES)
    assert p["stellar_black_hole"] == pytest.approx(0.5)
    assert p["pair_instability_gap"] == pytest.approx(0.5)
    assert p["neutron_star"] == p["lower_gap"] == p["above_gap"] == 0
    assert "intermediate_mass" not in p
    assert straddles(p) == ["pair_instability_lower"]


def test_remnant_labels_overlap_above_100_msun():
    # Uniform on [90, 140) Msun: 45/50 at or above 100; 10/50 above the 130 Msun edge. Intermediate
    # mass is a separate question that overlaps the bands (docs/methods.md §11).
    samples = (90 + np.arange(50_000) / 1000) * u.Msun
    p = band_probabilities(samples, EDGES)
    assert intermediate_mass_probability(samples, EDGES) == pytest.approx(0.8)
    assert p["pair_instability_gap"] == pytest.approx(0.8)
    assert p["above_gap"] == pytest.approx(0.2)
    assert set(p) == set(BANDS)
    assert sum(p[b] for b in BANDS) == pytest.approx(1.0)


def test_fractions_not_the_median():
    # 30 % of the samples in the neutron-star band, median in the lower gap (constructed).
    samples = np.array([2.0] * 3 + [3.0] * 7) * u.Msun
    p = band_probabilities(samples, EDGES)
    assert p["neutron_star"] == pytest.approx(0.3)
    assert p["lower_gap"] == pytest.approx(0.7)
    assert straddles(p) == ["neutron_star_max"]
    assert straddles(p, threshold=0.5) == []


def test_edge_values_are_in_the_upper_band():
    # Bands are [lower edge, upper edge) (docs/methods.md §11): a sample exactly on 5 Msun is a
    # black hole below the gap.
    p = band_probabilities([5.0] * u.Msun, EDGES)
    assert p["stellar_black_hole"] == 1.0


def test_every_single_sample_lies_in_exactly_one_band():
    # The five bands partition the mass axis (docs/methods.md §11): each sample, whether exactly
    # on an edge, between edges, below the lowest or above the highest, is in one band only.
    cases = [(0.1, "neutron_star"), (1e6, "above_gap")]
    cases += list(zip(EDGE_VALUES, BANDS[1:], strict=True))
    cases += [
        (np.nextafter(edge, 0.0), band) for edge, band in zip(EDGE_VALUES, BANDS[:-1], strict=True)
    ]
    for mass, band in cases:
        p = band_probabilities([mass] * u.Msun, EDGES)
        assert p == {b: float(b == band) for b in BANDS}, mass


masses = st.floats(1e-3, 1e5, allow_nan=False, allow_infinity=False)
on_edges = st.sampled_from(EDGE_VALUES)


@settings(max_examples=300, deadline=None)
@given(st.lists(st.one_of(masses, on_edges), min_size=1, max_size=200))
def test_band_probabilities_sum_to_one(samples):
    # The bands partition the mass axis (docs/methods.md §11), so every subject sums to 1: the
    # samples mix values exactly on each edge with values anywhere from below the lowest edge
    # (2.3 Msun) to far above the highest (130 Msun).
    p = band_probabilities(np.array(samples) * u.Msun, EDGES)
    assert set(p) == set(BANDS)
    assert sum(p.values()) == pytest.approx(1.0, abs=1e-12)
    counts = [round(p[b] * len(samples)) for b in BANDS]
    assert sum(counts) == len(samples)


@settings(max_examples=200, deadline=None)
@given(
    st.lists(st.floats(0.1, 500.0), min_size=4, max_size=4).map(sorted),
    st.lists(st.floats(0.01, 1000.0), min_size=1, max_size=50),
)
def test_any_increasing_edges_partition_the_mass_axis(edge_values, extra):
    # Overridden edges (docs/methods.md §11: configurable, in increasing order) still partition
    # the axis; the samples include every edge value exactly.
    edges = {key: value * u.Msun for key, value in zip(EDGE_KEYS, edge_values, strict=True)}
    samples = np.array([*edge_values, *extra]) * u.Msun
    p = band_probabilities(samples, edges)
    assert sum(p.values()) == pytest.approx(1.0, abs=1e-12)
    assert sum(round(v * len(samples)) for v in p.values()) == len(samples)


def test_intermediate_mass_counts_samples_at_or_above_the_threshold():
    # docs/methods.md §11: the probability that the mass is at or above the intermediate-mass
    # threshold (default 100 Msun, Greene, Strader & Ho 2020); the threshold itself counts.
    threshold = EDGES[INTERMEDIATE_KEY].to_value(u.Msun)
    assert threshold == 100.0
    below = np.nextafter(threshold, 0.0)
    samples = np.array([50.0, below, threshold, threshold, 130.0, 1e4]) * u.Msun
    assert intermediate_mass_probability(samples, EDGES) == pytest.approx(4 / 6)
    assert intermediate_mass_probability([threshold] * u.Msun, EDGES) == 1.0
    assert intermediate_mass_probability([below] * u.Msun, EDGES) == 0.0
    # Any mass unit: 1e5 Msun expressed in kilograms is at or above the threshold.
    assert intermediate_mass_probability((1e5 * u.Msun).to(u.kg), EDGES) == 1.0


def test_intermediate_mass_is_not_a_band():
    # A remnant can be both intermediate-mass and inside the pair-instability gap
    # (docs/methods.md §11).
    samples = [110.0, 120.0] * u.Msun
    assert intermediate_mass_probability(samples, EDGES) == 1.0
    assert band_probabilities(samples, EDGES)["pair_instability_gap"] == 1.0
    assert INTERMEDIATE_KEY not in EDGE_KEYS


def test_source_classes_by_the_neutron_star_maximum():
    m1 = np.array([1.5, 10.0, 30.0, 1.9]) * u.Msun
    m2 = np.array([1.2, 1.4, 20.0, 1.8]) * u.Msun
    p = source_class_probabilities(m1, m2, EDGES["neutron_star_max"])
    assert p == {"BNS": 0.5, "NSBH": 0.25, "BBH": 0.25}
    assert source_class(m1, m2, EDGES["neutron_star_max"]) == "BNS"
    assert source_class(30 * u.Msun, 1.4 * u.Msun, 2.3 * u.Msun) == "NSBH"


def test_wrong_dimension_names_the_argument():
    with pytest.raises(u.UnitsError, match="mass_samples"):
        band_probabilities([1.0] * u.km, EDGES)
    with pytest.raises(u.UnitsError, match="mass_samples"):
        intermediate_mass_probability([1.0] * u.s, EDGES)
    with pytest.raises(u.UnitsError, match="ns_max"):
        source_class_probabilities(1 * u.Msun, 1 * u.Msun, 2.3 * u.s)
