"""Mass bands and source classes on constructed sample sets with known answers (METHODS.md §11)."""

import astropy.units as u
import numpy as np
import pytest

from factsheet.physics.bands import (
    BANDS,
    band_probabilities,
    source_class,
    source_class_probabilities,
    straddles,
)
from factsheet.reference import load_reference

# Default edges of METHODS.md §11 (Farmer et al. 2019, ApJ 887, 53: 45 Msun; Özel et al. 2010,
# ApJ 725, 1918: 5 Msun; 130 Msun upper edge, van Son et al. 2020; 100 Msun, Greene, Strader &
# Ho 2020, ARA&A 58, 257), read from the packaged reference data.
EDGES = load_reference().mass_bands.quantities()


def test_edges_come_from_reference_data_methods_section_11():
    expected = {"neutron_star_max": 2.3, "lower_gap_top": 5.0, "pair_instability_lower": 45.0}
    expected |= {"pair_instability_upper": 130.0, "intermediate_mass_min": 100.0}
    assert {k: v.to_value(u.Msun) for k, v in EDGES.items()} == expected


def test_uniform_samples_across_the_lower_pair_instability_edge():
    # Uniform on [40, 50) Msun: exactly half below the 45 Msun edge (constructed answer).
    samples = (40 + np.arange(10_000) / 1000) * u.Msun
    p = band_probabilities(samples, EDGES)
    assert p["black_hole"] == pytest.approx(0.5)
    assert p["pair_instability_gap"] == pytest.approx(0.5)
    assert p["neutron_star"] == p["lower_gap"] == p["above_gap"] == 0
    assert "intermediate_mass" not in p
    assert straddles(p) == ["pair_instability_lower"]


def test_remnant_labels_overlap_above_100_msun():
    # Uniform on [90, 140) Msun: 45/50 at or above 100; 10/50 above the 130 Msun edge.
    samples = (90 + np.arange(50_000) / 1000) * u.Msun
    p = band_probabilities(samples, EDGES, remnant=True)
    assert p["intermediate_mass"] == pytest.approx(0.8)
    assert p["pair_instability_gap"] == pytest.approx(0.8)
    assert p["above_gap"] == pytest.approx(0.2)
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
    # Bands are [lower edge, upper edge): a sample exactly on 5 Msun is a black hole (convention).
    p = band_probabilities([5.0] * u.Msun, EDGES)
    assert p["black_hole"] == 1.0


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
    with pytest.raises(u.UnitsError, match="ns_max"):
        source_class_probabilities(1 * u.Msun, 1 * u.Msun, 2.3 * u.s)
