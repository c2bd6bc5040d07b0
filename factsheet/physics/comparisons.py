"""Radiated energy and peak luminosity against familiar sources (docs/methods.md §8 and §14).

The comparison objects come from the reference data as a mapping of keys to Quantities (an
energy or a power); :data:`DERIVED_VALUES` holds the ones computed from astropy's constants
rather than typed in, so the data file names them instead of giving numbers.
"""

from collections.abc import Mapping

import astropy.constants as const
import astropy.units as u
import numpy as np

from factsheet.physics.registry import Method, register

COMPARISON = "energy-luminosity-comparison"

#: Unit systems for display: SI (J, W) or cgs (erg, erg/s).
ENERGY_UNITS = {"SI": (u.J, u.W), "cgs": (u.erg, u.erg / u.s)}

#: Values computed from IAU 2015 nominal values and CODATA constants, as astropy gives them.
DERIVED_VALUES: dict[str, u.Quantity] = {
    "solar_rest_energy": (const.M_sun * const.c**2).to(u.J),
    "planck_luminosity": (const.c**5 / const.G).to(u.W),
    "solar_luminosity": const.L_sun.to(u.W),
}

register(
    Method(
        id=COMPARISON,
        title="Energy and luminosity comparisons",
        citation=(
            "IAU 2015 Resolution B3 nominal solar values (Prša et al. 2016, AJ 152, 41); "
            "CODATA constants through astropy; comparison objects as listed with their sources"
        ),
        formula="ratio = E/E_{object} or L/L_{object}; duration = E/L_{object}",
        validity="order-of-magnitude context; many comparison values are approximate",
        accuracy="as good as the comparison value (a factor of ~2 for the approximate ones)",
        quantities=("energy_radiated", "peak_luminosity"),
    )
)


def _ratios(value: u.Quantity, references: Mapping[str, u.Quantity]) -> dict[str, np.ndarray]:
    """Ratios of value to each reference of the same dimension; others are left out."""
    return {
        key: (value / reference).to_value(u.one)
        for key, reference in references.items()
        if reference.unit.is_equivalent(value.unit)
    }


def _require(value, unit: u.UnitBase, kind: str, name: str) -> u.Quantity:
    """``value`` in ``unit``; the wrong dimension raises UnitsError naming the argument."""
    if not isinstance(value, u.Quantity) or not value.unit.is_equivalent(unit):
        raise u.UnitsError(f"{name}: expected {kind} (e.g. 1e47 {unit}), got {value!r}")
    return value.to(unit)


def energy_ratios(
    energy: u.Quantity, references: Mapping[str, u.Quantity]
) -> dict[str, np.ndarray]:
    """Radiated energy over each comparison energy (docs/methods.md §14 objects)."""
    return _ratios(_require(energy, u.J, "an energy", "energy"), references)


def luminosity_ratios(
    luminosity: u.Quantity, references: Mapping[str, u.Quantity]
) -> dict[str, np.ndarray]:
    """Peak luminosity over each comparison luminosity (docs/methods.md §14 objects)."""
    return _ratios(_require(luminosity, u.W, "a power", "luminosity"), references)


def emission_time(energy: u.Quantity, luminosity: u.Quantity = const.L_sun) -> u.Quantity:
    """Time a source of the given luminosity (default the Sun, IAU 2015 B3) needs for E (§14)."""
    e = _require(energy, u.J, "an energy", "energy")
    return (e / _require(luminosity, u.W, "a power", "luminosity")).to(u.yr)


def in_energy_units(value: u.Quantity, energy_units: str = "SI") -> u.Quantity:
    """An energy or power in SI (J, W) or cgs (erg, erg/s) units, as set by ``energy_units``."""
    if energy_units not in ENERGY_UNITS:
        raise ValueError(
            f"energy_units: expected one of {sorted(ENERGY_UNITS)}, got {energy_units!r}"
        )
    energy_unit, power_unit = ENERGY_UNITS[energy_units]
    if isinstance(value, u.Quantity) and value.unit.is_equivalent(u.J):
        return value.to(energy_unit)
    return _require(value, u.W, "an energy or a power", "value").to(power_unit)
