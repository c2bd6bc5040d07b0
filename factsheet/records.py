"""Check the structured values of an event file: parameters, history, host and limits.

:class:`RecordChecker` adds these kinds to the scalar and quantity kinds of
:class:`factsheet.fields.Checker`; each checks its own keys against :mod:`schema` and reports
every problem with its line and key path.
"""

from __future__ import annotations

from factsheet.fields import Checker, show
from factsheet.model import HistoryEntry, Host, Parameters
from factsheet.schema import HISTORY_KEYS, HOST_KEYS, PARAMETER_KEYS
from factsheet.yamlread import Limits, LineList, LineMap

SPIN_KEYS = ("spin_1z", "spin_2z")


class RecordChecker(Checker):
    """A :class:`Checker` that also knows the structured kinds of the input format."""

    def _parameters(self, raw, key, path, line) -> Parameters | None:
        if not isinstance(raw, LineMap):
            return self.fail(line, path, "expected a mapping of parameters (mass_1, mass_2, ...)")
        before = len(self.problems)
        values = self.mapping(raw, PARAMETER_KEYS, prefix=f"{path}.")
        if "chi_eff" in values and any(k in values for k in SPIN_KEYS):
            self.fail(
                raw.line_of("chi_eff"),
                f"{path}.chi_eff",
                "give either chi_eff or spin_1z/spin_2z, not both",
            )
        if len(self.problems) > before:
            return None
        m1, m2 = values["mass_1"], values["mass_2"]
        if m2.median > m1.median:
            return self.fail(
                raw.line_of("mass_2"),
                f"{path}.mass_2",
                "mass_2 exceeds mass_1 (expected mass_1 >= mass_2: label the heavier body 1)",
            )
        return Parameters(values)

    def _history(self, raw, key, path, line):
        if not isinstance(raw, LineList):
            return self.fail(line, path, "expected a list of earlier estimates")
        entries = []
        for i, item in enumerate(raw):
            where = f"{path}[{i}]"
            if not isinstance(item, LineMap):
                self.fail(
                    raw.line_of(i), where, "expected a mapping {date, label, note, parameters}"
                )
                continue
            values = self.mapping(item, HISTORY_KEYS, prefix=f"{where}.")
            if set(values) >= {"date", "label", "parameters"}:
                entries.append(
                    HistoryEntry(
                        values["date"],
                        values["label"],
                        values.get("note", ""),
                        values["parameters"],
                    )
                )
        return tuple(sorted(entries, key=lambda e: e.date.unix))

    def _host(self, raw, key, path, line):
        if not isinstance(raw, LineMap):
            return self.fail(
                line, path, "expected a mapping {smbh_mass, orbit_radius, disk_aspect_ratio}"
            )
        before = len(self.problems)
        values = self.mapping(raw, HOST_KEYS, prefix=f"{path}.")
        return Host(**values) if len(self.problems) == before else None

    def _limits(self, raw, key, path, line):
        if not isinstance(raw, LineMap):
            return self.fail(line, path, "expected a mapping of limits")
        known = {f: getattr(Limits(), f) for f in Limits.__dataclass_fields__}
        out = {}
        for name, value in raw.items():
            if name not in known:
                self._unknown(raw, name, dict.fromkeys(known), f"{path}.")
            elif isinstance(value, bool) or not isinstance(value, int) or value < 1:
                self.fail(
                    raw.line_of(name),
                    f"{path}.{name}",
                    f"expected a positive whole number, got {show(value)}",
                )
            else:
                out[name] = value
        return Limits(**out)
