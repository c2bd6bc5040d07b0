"""The physics package is pure: it imports only numpy, astropy, a few stdlib modules and itself;
scipy only in the cosmology module (STYLE.md point 2). Also checks the method registry entries."""

import ast
from pathlib import Path

import pytest

import factsheet.physics as physics_pkg
from factsheet.physics import (
    cosmology,
    inspiral,
    kerr,
    kick,
    luminosity,
    registry,
    remnant,
    ringdown,
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
        assert top in ALLOWED, f"{path.name} imports {name}"


def test_exported_method_ids_are_registered():
    ids = [
        *remnant.FINAL_SPIN_METHODS,
        *remnant.RADIATED_METHODS,
        remnant.CROSS_CHECK_SPIN_METHOD,
        luminosity.METHOD,
        kick.METHOD,
        ringdown.METHOD,
        ringdown.BCW06.id,
        inspiral.CHIRP_METHOD,
        inspiral.LEADING_ORDER_METHOD,
        cosmology.METHOD,
        kerr.METHOD,
    ]
    for method_id in ids:
        method = registry.METHODS[method_id]
        assert method_id == method_id.lower() and " " not in method_id
        assert method.citation and method.formula and method.validity and method.quantities
        for low, high in method.limits.values():
            assert low < high


def test_kick_limits_flag_small_mass_ratios():
    # González et al. 2007 calibrated q from 1 down to 0.25.
    assert registry.fraction_outside(kick.METHOD, mass_ratio=[0.2, 0.5, 0.9, 1.0]) == {
        "mass_ratio": 0.25
    }
