"""Typed objects the loader produces: settings, events, estimates and their history."""

from __future__ import annotations

import hashlib
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import astropy.units as u
from astropy.time import Time

from factsheet.errors import Problem
from factsheet.quantities import Estimate
from factsheet.yamlread import Limits


@dataclass(frozen=True)
class Settings:
    """Catalogue-wide settings from ``catalogue.yaml``, with the documented defaults."""

    title: str = "Gravitational-wave fact sheets"
    description: str = ""
    base_url: str = ""
    cosmology: str = "Planck18"
    credible_level: float = 0.9
    samples: int = 4000
    low_frequency: u.Quantity = field(default_factory=lambda: 20.0 * u.Hz)
    arm_length: u.Quantity = field(default_factory=lambda: 4.0 * u.km)
    mass_bands: dict[str, Any] = field(default_factory=dict)
    comparisons: dict[str, Any] = field(default_factory=dict)
    energy_units: str = "SI"
    # 12 km: current radius estimates span about 11-13 km (from memory; METHODS.md section 12)
    neutron_star_radius: u.Quantity = field(default_factory=lambda: 12.0 * u.km)
    # thresholds of the low-significance and large-sky-area caveats (common practice)
    low_significance_rate: u.Quantity = field(default_factory=lambda: 1.0 / u.yr)
    large_sky_area: u.Quantity = field(default_factory=lambda: 1000.0 * u.deg**2)
    limits: Limits = field(default_factory=Limits)

    def fingerprint(self) -> str:
        """A stable text form of the settings that change derived numbers."""
        return "|".join(
            str(x)
            for x in (
                self.cosmology,
                self.credible_level,
                self.samples,
                self.low_frequency.to_value(u.Hz),
                self.arm_length.to_value(u.m),
                sorted(self.mass_bands.items()),
                sorted(self.comparisons.items()),
                self.energy_units,
                self.neutron_star_radius.to_value(u.km),
                self.low_significance_rate.to_value(1 / u.yr),
                self.large_sky_area.to_value(u.deg**2),
            )
        )


@dataclass(frozen=True)
class Host:
    """Disk of an active galactic nucleus hosting the merger."""

    smbh_mass: u.Quantity
    orbit_radius: float  # in gravitational radii of the central black hole
    disk_aspect_ratio: float | None = None


@dataclass(frozen=True)
class Parameters:
    """One estimate: parameter name to :class:`Estimate`, in canonical units."""

    values: dict[str, Estimate]

    def __getitem__(self, name: str) -> Estimate:
        return self.values[name]

    def __contains__(self, name: object) -> bool:
        return name in self.values

    def canonical(self) -> str:
        return ";".join(f"{k}={v.canonical()}" for k, v in sorted(self.values.items()))


@dataclass(frozen=True)
class HistoryEntry:
    """An earlier estimate of the event."""

    date: Time
    label: str
    note: str
    parameters: Parameters


@dataclass(frozen=True)
class Event:
    """One validated event file."""

    id: str
    title: str
    time: Time
    parameters: Parameters
    source: Path
    line: int = 1
    status: str = "confirmed"
    frame: str = "source"
    history: tuple[HistoryEntry, ...] = ()
    samples: Path | None = None
    false_alarm_rate: u.Quantity | None = None
    snr: float | None = None
    detectors: tuple[str, ...] = ()
    sky_area: u.Quantity | None = None
    host: Host | None = None
    visibility: str = "public"
    embargo_until: Time | None = None
    internal_notes: str = ""
    summary: str = ""
    caveats: tuple[str, ...] = ()
    key_lines: dict[str, int] = field(default_factory=dict, compare=False, repr=False)

    def line_of(self, key: str) -> int:
        """The line of a top-level key in the event's file (the id's line if absent)."""
        return self.key_lines.get(key, self.line)

    def seed(self) -> int:
        """Random seed from the content that determines the numbers (not the prose)."""
        text = f"{self.id}|{self.frame}|{self.parameters.canonical()}"
        return int.from_bytes(hashlib.sha256(text.encode()).digest()[:8], "little")


@dataclass(frozen=True)
class Catalogue:
    """A validated catalogue: its settings and its events, sorted by merger time."""

    root: Path
    settings: Settings
    events: tuple[Event, ...]
    warnings: tuple[Problem, ...] = ()  # fatal only in strict mode
