"""The context of the methods page: every registered method with the events that used it, and
the reference data (mass-band edges, counterpart time scales, comparison objects)."""

from __future__ import annotations

from dataclasses import dataclass

from factsheet import labels
from factsheet.model import Derived, Reference, WindowSpec
from factsheet.physics.registry import METHODS, Method


@dataclass(frozen=True)
class MethodEntry:
    method: Method
    events: tuple[str, ...]


@dataclass(frozen=True)
class WindowScale:
    name: str
    spec: WindowSpec


@dataclass(frozen=True)
class MethodsPage:
    """The context of ``methods.html``."""

    methods: tuple[MethodEntry, ...]
    reference: Reference
    window_scales: tuple[WindowScale, ...]
    levels: tuple[float, ...]


def methods_page(derived: list[Derived], reference: Reference) -> MethodsPage:
    """Every registered method with the events that used it, and the reference data."""
    used: dict[str, set[str]] = {}
    for item in derived:
        ids = {m for summary in item.quantities.values() for m in summary.methods}
        for method_id in ids | set(item.other_methods):
            used.setdefault(method_id, set()).add(item.event.id)
    entries = tuple(
        MethodEntry(m, tuple(sorted(used.get(m.id, ()))))
        for m in sorted(METHODS.values(), key=lambda m: (not used.get(m.id), m.title))
    )
    scales = tuple(WindowScale(labels.WINDOWS[w.key].name, w) for w in reference.windows)
    levels = tuple(sorted({d.settings.credible_level for d in derived}))
    return MethodsPage(entries, reference, scales, levels)
