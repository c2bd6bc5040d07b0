"""Packaged reference data: mass-band edges, counterpart time scales and comparison objects.

Their names for readers come from :mod:`factsheet.labels`, except the comparisons' labels,
which are in their data file: the packaged ones are kept messages (:class:`~factsheet.i18n.Text`,
extracted for the catalogues by ``tools/messages.py``), shown in the reader's language; a label
set in ``catalogue.yaml`` is the editors' own and shown as written. The records are in
:mod:`factsheet.model`.

The data live in ``factsheet/data/*.yaml``, each value with its unit and source, and are read
with :mod:`importlib.resources`. A ``provenance`` note (how a value or citation was obtained,
e.g. recalled from memory) stays in the data files for maintainers and is not read into the
records: pages state sources. ``catalogue.yaml`` may override two of them:

``mass_bands``
    maps an edge key (``neutron_star_max``, ``lower_gap_top``, ``pair_instability_lower``,
    ``pair_instability_upper``, ``intermediate_mass_min``) to a mass, either ``"2.5 Msun"`` or
    ``{value: "2.5 Msun", source: "..."}``. The four band edges must still increase in that
    order; the intermediate-mass threshold only has to be positive.

``comparisons``
    maps a comparison key to ``{value: "...", label: "...", source: "..."}``. For a packaged key
    any of the three may be given; a new key needs all three and its value must be an energy or
    a power. ``key: null`` drops a packaged comparison.

Every overridden item carries ``overridden=True``; an invalid override raises
:class:`~factsheet.errors.InputError` naming the key.
"""

from __future__ import annotations

from dataclasses import replace
from importlib.resources import files
from itertools import pairwise
from typing import Any

import astropy.units as u
import yaml

from factsheet.errors import InputError, Problem
from factsheet.i18n import Text
from factsheet.labels import EDGES
from factsheet.load.scalars import MAX_LINE_TEXT, MAX_MARKDOWN
from factsheet.model import Comparison, Edge, MassBands, Reference, Settings, WindowSpec
from factsheet.physics.bands import EDGE_KEYS, INTERMEDIATE_KEY
from factsheet.physics.comparisons import DERIVED_VALUES

_SOURCE = "catalogue.yaml"


def _read(name: str) -> Any:
    """One packaged YAML data file."""
    return yaml.safe_load((files("factsheet") / "data" / name).read_text(encoding="utf-8"))


def _quantity(text: Any, key: str, units: tuple[u.UnitBase, ...], example: str) -> u.Quantity:
    """Parse ``VALUE UNIT`` into a single Quantity convertible to one of ``units``."""
    try:
        value = text if isinstance(text, u.Quantity) else u.Quantity(str(text))
    except (TypeError, ValueError) as error:
        message = f"cannot read {text!r} as a value with a unit ({error})"
        raise _invalid(key, message, example) from error
    if value.size != 1 or not any(value.unit.is_equivalent(unit) for unit in units):
        kinds = " or ".join(str(unit.physical_type).split("/")[0] for unit in units)
        raise _invalid(key, f"{text!r} is not a single {kinds}", example)
    return value


def _invalid(key: str, message: str, example: str) -> InputError:
    """An InputError for one key, with an example of valid input."""
    problem = Problem(_SOURCE, None, key, f"{message}; expected e.g. {example}")
    return InputError(problems=[problem])


def _mass_bands(overrides: dict[str, Any]) -> MassBands:
    """Packaged edges with the overrides applied and the order checked."""
    data = _read("mass_bands.yaml")
    unknown = sorted(set(overrides) - set(data))
    if unknown:
        raise _invalid(f"mass_bands.{unknown[0]}", "unknown edge", f"one of {sorted(data)}")
    edges = {}
    for key, entry in data.items():
        edge = Edge(key, EDGES[key], u.Quantity(entry["value"]).to(u.Msun), entry["source"])
        edges[key] = _override_edge(edge, overrides[key]) if key in overrides else edge
        edges[key] = replace(edges[key], spread=entry.get("spread", ""))
    ordered = [edges[k].value for k in EDGE_KEYS]
    for (low, a), (high, b) in pairwise(zip(EDGE_KEYS, ordered, strict=True)):
        if b <= a:
            key = low if edges[low].overridden else high
            message = f"{low} ({a}) must be below {high} ({b})"
            raise _invalid(f"mass_bands.{key}", message, " < ".join(EDGE_KEYS))
    if edges[INTERMEDIATE_KEY].value <= 0 * u.Msun:
        raise _invalid(f"mass_bands.{INTERMEDIATE_KEY}", "must be positive", "100 Msun")
    return MassBands(**edges)


def _override_edge(edge: Edge, entry: Any) -> Edge:
    """One edge replaced by a catalogue value ("2.5 Msun" or {value, source})."""
    key = f"mass_bands.{edge.key}"
    entry = entry if isinstance(entry, dict) else {"value": entry}
    if set(entry) - {"value", "source"} or "value" not in entry:
        raise _invalid(key, f"unexpected form {entry!r}", '"2.5 Msun" or {value: 2.5 Msun}')
    value = _quantity(entry["value"], key, (u.Msun,), "2.5 Msun").to(u.Msun)
    if value <= 0 * u.Msun:
        raise _invalid(key, "must be positive", "2.5 Msun")
    _check_texts(key, entry)
    source = str(entry.get("source", "set in catalogue.yaml"))
    return replace(edge, value=value, source=source, overridden=True)


def _check_texts(where: str, entry: dict[str, Any]) -> None:
    """A label is one line of at most 200 characters, a source at most 100 000 characters."""
    for name, limit, lines in (("label", MAX_LINE_TEXT, False), ("source", MAX_MARKDOWN, True)):
        if name not in entry:
            continue
        text = entry[name]
        if not isinstance(text, str) or not text.strip():
            raise _invalid(f"{where}.{name}", f"expected text, got {text!r}"[:100], '"..."')
        if len(text) > limit:
            message = f"text is {len(text)} characters long (at most {limit})"
            raise _invalid(f"{where}.{name}", message, '"..."')
        if not lines and "\n" in text.strip():
            raise _invalid(f"{where}.{name}", "expected one line of text", '"..."')


def _windows() -> tuple[WindowSpec, ...]:
    """Packaged rest-frame counterpart windows."""
    specs = []
    for entry in _read("counterparts.yaml")["windows"]:
        start, end = u.Quantity(entry.pop("start")), u.Quantity(entry.pop("end"))
        entry.pop("provenance", None)
        specs.append(WindowSpec(start=start.to(u.s), end=end.to(u.s), **entry))
    return tuple(specs)


_KINDS = {"energy": u.J, "luminosity": u.W}
_COMPARISON_EXAMPLE = '{label: "...", value: 1e44 J, source: "..."}'


def _comparison(key: str, entry: dict[str, Any], where: str) -> Comparison:
    """One comparison from a data entry (value with unit, or ``computed``)."""
    if "computed" in entry:
        value = DERIVED_VALUES[entry["computed"]]
    else:
        value = _quantity(entry.get("value"), where, (u.J, u.W), "1e44 J")
    kind = "energy" if value.unit.is_equivalent(u.J) else "luminosity"
    unit = _KINDS[kind]
    bounds = {
        b: _quantity(entry[b], f"{where}.{b}", (unit,), f"1 {unit}").to(unit)
        for b in ("low", "high")
        if b in entry
    }
    return Comparison(key, entry["label"], kind, value.to(unit), entry["source"], **bounds)


def _comparisons(overrides: dict[str, Any]) -> tuple[Comparison, ...]:
    """Packaged comparisons with the overrides applied."""
    data = _read("comparisons.yaml")
    for entry in data.values():
        entry["label"] = Text(entry["label"])  # ours: translated where it is shown
    for key, entry in overrides.items():
        where = f"comparisons.{key}"
        if entry is None:
            data.pop(key, None)
            continue
        if not isinstance(entry, dict) or set(entry) - {"value", "label", "source"}:
            raise _invalid(where, f"unexpected form {entry!r}", _COMPARISON_EXAMPLE)
        if key not in data and set(entry) != {"value", "label", "source"}:
            raise _invalid(
                where, "a new comparison needs value, label and source", _COMPARISON_EXAMPLE
            )
        _check_texts(where, entry)
        replaced = {"computed", "low", "high"} if "value" in entry else set()
        base = {k: v for k, v in data.get(key, {}).items() if k not in replaced}
        data[key] = {**base, **entry, "overridden": True}
    result = []
    for key, entry in data.items():
        overridden = bool(entry.pop("overridden", False))
        where = f"comparisons.{key}"
        result.append(replace(_comparison(key, entry, where), overridden=overridden))
    return tuple(result)


def load_reference(overrides: dict[str, Any] | None = None) -> Reference:
    """Reference data from the package, with ``catalogue.yaml`` overrides applied."""
    overrides = dict(overrides or {})
    unknown = sorted(set(overrides) - {"mass_bands", "comparisons"})
    if unknown:
        raise _invalid(unknown[0], "not an overridable reference", "mass_bands or comparisons")
    sections = {}
    for name in ("mass_bands", "comparisons"):
        section = overrides.get(name) or {}
        if not isinstance(section, dict):
            raise _invalid(name, f"expected a mapping, got {section!r}", f"{name}: {{...}}")
        sections[name] = section
    return Reference(
        mass_bands=_mass_bands(sections["mass_bands"]),
        windows=_windows(),
        comparisons=_comparisons(sections["comparisons"]),
    )


_LOADED: dict[str, Reference] = {}


def reference_for(settings: Settings) -> Reference:
    """The reference data with the catalogue's overrides, read once per set of overrides."""
    overrides = {"mass_bands": settings.mass_bands, "comparisons": settings.comparisons}
    key = repr(overrides)
    if key not in _LOADED:
        _LOADED[key] = load_reference(overrides)
    return _LOADED[key]
