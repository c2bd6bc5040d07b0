"""The physics package is pure: it imports only numpy, astropy, a few stdlib modules and itself;
scipy only in the cosmology module and astropy-healpix only in the sky module (DEVELOPERS.md, the
physics stage). Also checks the method
registry entries."""

import ast
from pathlib import Path

import pytest

import factsheet.physics as physics_pkg
from factsheet.physics import (
    bands,
    comparisons,
    cosmology,
    counterparts,
    disruption,
    inspiral,
    kerr,
    kick,
    lensing,
    luminosity,
    precession,
    registry,
    remnant,
    ringdown,
    second_generation,
    sky,
)

PACKAGE = Path(physics_pkg.__file__).parent
# collections.abc holds the abstract types typing used to (ruff rule UP035 moves them there).
# warnings: counterparts silences ERFA's "dubious year" note for dates past the leap-second table.
ALLOWED = {
    "numpy",
    "astropy",
    "__future__",
    "typing",
    "dataclasses",
    "math",
    "functools",
    "warnings",
}
ALLOWED_SUBMODULES = {"collections.abc"}
SCIPY_ALLOWED_IN = {"cosmology.py"}
HEALPIX_ALLOWED_IN = {"sky.py"}


def _imports(path: Path):
    tree = ast.parse(path.read_text(), filename=str(path))
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            yield from ((alias.name, 0) for alias in node.names)
        elif isinstance(node, ast.ImportFrom):
            yield (node.module or "", node.level)


@pytest.mark.parametrize("path", sorted(PACKAGE.glob("*.py")), ids=lambda p: p.name)
def test_only_allowed_imports(path):
    for name, level in _imports(path):
        top = name.split(".")[0]
        if level > 0 or name.startswith("factsheet.physics") or name in ALLOWED_SUBMODULES:
            continue
        if top == "scipy" and path.name in SCIPY_ALLOWED_IN:
            continue
        if top == "astropy_healpix" and path.name in HEALPIX_ALLOWED_IN:
            continue
        assert top in ALLOWED, f"{path.name} imports {name}"


EXPORTED_IDS = [
    *remnant.REMNANT_SPIN_METHODS,
    *remnant.PRECESSING_SPIN_METHODS,
    precession.METHOD,
    kick.SUPERKICK_METHOD,
    *remnant.RADIATED_METHODS,
    remnant.CROSS_CHECK_SPIN_METHOD,
    luminosity.METHOD,
    kick.METHOD,
    ringdown.METHOD,
    ringdown.FALLBACK_METHOD,
    inspiral.CHIRP_METHOD,
    inspiral.LEADING_ORDER_METHOD,
    cosmology.METHOD,
    kerr.METHOD,
    bands.MASS_BANDS,
    bands.SOURCE_CLASS,
    counterparts.REST_FRAME_WINDOW,
    counterparts.AGN_DISK,
    disruption.REMNANT_MASS,
    disruption.BARYON_MASS,
    comparisons.COMPARISON,
    second_generation.METHOD,
    lensing.METHOD,
    sky.METHOD,
]
# Parameters a calibration range may name: the mass ratio and the spins of the heavier body, the
# lighter body and the remnant (checked on the samples), the redshift, the Kerr spin of the ISCO
# and a neutron star's compactness.
LIMITED = {"mass_ratio", "heavier_spin", "lighter_spin", "remnant_spin", "redshift", "spin"}
LIMITED |= {"compactness"}


def test_exported_method_ids_are_registered():
    for method_id in EXPORTED_IDS:
        method = registry.METHODS[method_id]
        assert method_id == method_id.lower() and " " not in method_id
        assert method.citation and method.formula and method.validity and method.quantities
        assert set(method.limits) <= LIMITED, method_id
        for low, high in method.limits.values():
            assert low < high


def test_every_registered_method_is_exported():
    # The leaver module registers nothing of its own; ringdown registers the table it solved.
    assert sorted(registry.METHODS) == sorted(set(EXPORTED_IDS))
    assert len(EXPORTED_IDS) == len(set(EXPORTED_IDS))


def test_method_keys_use_the_export_names():
    # The exact table covers both branches: a signed remnant spin (docs/methods.md §7.3).
    assert registry.METHODS[ringdown.METHOD].limits == {"remnant_spin": (-0.9999, 0.9999)}
    assert registry.METHODS[ringdown.FALLBACK_METHOD].limits == {"remnant_spin": (0.0, 0.99)}
    assert "effective_spin" in registry.METHODS[inspiral.CHIRP_METHOD].quantities
    assert registry.METHODS[bands.MASS_BANDS].quantities == ("mass_bands", "intermediate_mass")
    for method_id in (luminosity.METHOD, kick.METHOD):
        assert {"heavier_spin", "lighter_spin"} <= set(registry.METHODS[method_id].limits)


def test_kick_limits_flag_small_mass_ratios():
    # González et al. 2007 calibrated q from 1 down to 0.25.
    assert registry.fraction_outside(kick.METHOD, mass_ratio=[0.2, 0.5, 0.9, 1.0]) == {
        "mass_ratio": 0.25
    }
