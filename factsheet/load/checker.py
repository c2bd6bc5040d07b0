"""Check one YAML file against the key tables of :mod:`factsheet.load.schema`.

A :class:`Checker` walks a mapping key by key, converts each value by its kind (plain kinds in
:mod:`factsheet.load.scalars`, structured ones — detection, estimate, body, history,
counterpart candidates, host, limits, file paths, the sky map, the editors' texts by language,
the site's languages — here) and appends a
:class:`~factsheet.errors.Problem` with the line and key path for each bad value, so one run
reports every problem of a file.
"""

from __future__ import annotations

import difflib
from pathlib import Path
from typing import Any

from factsheet import i18n
from factsheet.errors import Problem
from factsheet.load import scalars, spins
from factsheet.load.languages import language_code
from factsheet.load.scalars import Bad, show
from factsheet.load.schema import (
    BODY_KEYS,
    CANDIDATE_KEYS,
    DETECTION_KEYS,
    ESTIMATE_KEYS,
    HISTORY_KEYS,
    HOST_KEYS,
    MAX_CANDIDATES,
    Key,
)
from factsheet.load.skymap import Where, check_sky_map
from factsheet.load.yaml_lines import LineList, LineMap
from factsheet.model import (
    Body,
    CounterpartCandidate,
    Detection,
    Estimate,
    HistoryEntry,
    Host,
    Limits,
    SkyMapFile,
)
from factsheet.notation import utc_iso


class Checker:
    """Validates values from one file, recording problems with their line and key path.

    ``base`` is the folder that relative file names start from, ``root`` the catalogue folder
    that they must not leave, ``cosmology`` the catalogue's cosmology, under which a distance
    must lie inside the redshift table (up to d_L(z = 1000)), ``languages`` the site's
    languages (the first is its main one), against which the editors' versions by language are
    read. Warnings about valid but suspicious files (a sky map far from normalised, a version
    in a language the site is not built in) go to ``warnings``.
    """

    def __init__(
        self,
        path: Path,
        problems: list[Problem],
        base: Path | None = None,
        root: Path | None = None,
        cosmology: str | None = None,
        warnings: list[Problem] | None = None,
        languages: tuple[str, ...] = (i18n.SOURCE,),
    ):
        self.path, self.problems = path, problems
        self.base, self.root = base, root
        self.cosmology = cosmology
        self.warnings = [] if warnings is None else warnings
        self.languages = languages

    def fail(self, line: int | None, key: str, message: str) -> None:
        self.problems.append(Problem(self.path, line, key, message))

    def mapping(self, data: LineMap, keys: dict[str, Key], prefix: str) -> dict[str, Any]:
        """Check every key of ``data`` against ``keys``; return the converted good values."""
        out: dict[str, Any] = {}
        for name in data:
            if name not in keys:
                self._unknown(data, name, keys, prefix)
        for name, key in keys.items():
            path = f"{prefix}{name}"
            if key.kind == "unsupported" and name in data:
                self.value(data[name], key, path, data.line_of(name))  # even when left empty
                continue
            if name not in data or data[name] is None:
                if key.required and name in data:  # written, but with nothing after the colon
                    example = f": write a value, e.g. {name}: {key.example}" if key.example else ""
                    self.fail(data.line_of(name), path, f"empty{example}")
                elif key.required:
                    example = f" (e.g. {name}: {key.example})" if key.example else ""
                    self.fail(data.line, path, f"missing required key{example}")
                continue
            value = self.value(data[name], key, path, data.line_of(name))
            if value is not None:
                out[name] = value
        return out

    def _unknown(self, data: LineMap, name: object, keys: dict[str, Any], prefix: str) -> None:
        close = difflib.get_close_matches(str(name)[:60], list(keys), n=1)
        hint = (
            f" (did you mean '{close[0]}'?)" if close else f" (expected one of: {', '.join(keys)})"
        )
        self.fail(data.line_of(name), f"{prefix}{str(name)[:60]}", f"unknown key{hint}")

    def value(self, raw: object, key: Key, path: str, line: int | None) -> Any:
        """Convert one value by the kind of its key; None after recording a problem."""
        convert = scalars.CONVERTERS.get(key.kind)
        if convert is None:
            return getattr(self, f"_{key.kind}")(raw, key, path, line)
        try:
            return convert(raw, key)
        except Bad as exc:
            self.fail(line, path, str(exc))
            return None

    def _section(self, raw: object, keys: dict[str, Key], path: str, line: int | None, what: str):
        """The checked values of a nested mapping, or None when it or any of its values is bad."""
        if not isinstance(raw, LineMap):
            names = ", ".join(k for k, v in keys.items() if v.kind != "unsupported")
            self.fail(line, path, f"expected a mapping {{{names}}}{what}")
            return None
        before = len(self.problems)
        values = self.mapping(raw, keys, prefix=f"{path}.")
        return values if len(self.problems) == before else None

    def warn(self, line: int | None, key: str, message: str) -> None:
        self.warnings.append(Problem(self.path, line, key, message))

    # -- structured kinds ------------------------------------------------------------------
    def _path(self, raw, key, path, line) -> Path | None:
        try:
            return scalars.file_in(raw, self.base or Path("."), self.root)
        except Bad as exc:
            self.fail(line, path, str(exc))
            return None

    def _sky_map(self, raw, key, path, line) -> SkyMapFile | None:
        """A sky map named relative to the event file, read and checked whole."""
        try:
            found = scalars.file_in(raw, self.base or Path("."), self.root, "sky map")
        except Bad as exc:
            self.fail(line, path, str(exc))
            return None
        return check_sky_map(found, self.problems, self.warnings, Where(self.path, line, path))

    def _detection(self, raw, key, path, line) -> Detection | None:
        values = self._section(raw, DETECTION_KEYS, path, line, "")
        return None if values is None else Detection(**values)

    def _body(self, raw, key, path, line) -> Body | None:
        values = self._section(raw, BODY_KEYS, path, line, ", e.g. {mass: 36 +5 -4 Msun}")
        if isinstance(raw, LineMap) and "mass" in raw and raw["mass"] is None:
            self.fail(  # written with nothing after the colon: an unfinished value, not absent
                raw.line_of("mass"),
                f"{path}.mass",
                "empty: write a value, e.g. mass: 36 +5 -4 Msun (or leave it out and give "
                "chirp_mass)",
            )
            return None
        if values is None:
            return None
        found = spins.body_problems(values)
        for name, message in found:
            self.fail(raw.line_of(name), f"{path}.{name}", message)
        return None if found else Body(**values)

    def _estimate(self, raw, key, path, line) -> Estimate | None:
        values = self._section(raw, ESTIMATE_KEYS, path, line, "")
        if values is None:
            return None
        if not self._masses_given(raw, values, path):
            return None
        heavier, lighter = values["heavier"], values["lighter"]
        if self.cosmology is not None:
            beyond = distance_beyond_table(values["distance"].high, self.cosmology)
            if beyond:
                self.fail(raw.line_of("distance"), f"{path}.distance", beyond)
                return None
        found = spins.estimate_problems(values)
        for name, message in found:
            self.fail(raw.line_of(name), f"{path}.{name}", message)
        if found:
            return None
        if lighter.mass and heavier.mass and lighter.mass.median > heavier.mass.median:
            self.fail(
                raw["lighter"].line_of("mass"),
                f"{path}.lighter.mass",
                "the lighter body's mass exceeds the heavier body's (expected "
                "heavier.mass >= lighter.mass: swap the two bodies)",
            )
            return None
        return Estimate(**values)

    def _masses_given(self, raw: LineMap, values: dict[str, Any], path: str) -> bool:
        """Both bodies' masses, or the chirp mass (with or without them); a mass ratio only
        with the chirp mass. Fills in an absent body (it may hold a spin alone)."""
        bodies = [name for name in ("heavier", "lighter") if name in values]
        massive = [name for name in bodies if values[name].mass is not None]
        for name in ("heavier", "lighter"):
            values.setdefault(name, Body())
        if "chirp_mass" not in values:
            if "mass_ratio" in values:
                self.fail(
                    raw.line_of("mass_ratio"),
                    f"{path}.mass_ratio",
                    "a mass ratio needs the chirp mass beside it (add chirp_mass, e.g. "
                    "chirp_mass: 31.2 +1.1 -1.0 Msun, or leave mass_ratio out)",
                )
                return False
            for name in ("heavier", "lighter"):
                if name not in massive:
                    self._mass_missing(raw, name, path)
            return len(massive) == 2
        if len(massive) == 1:
            (alone,) = massive
            self.fail(
                raw[alone].line_of("mass"),
                f"{path}.{alone}.mass",
                "give both bodies' masses or neither when chirp_mass is given",
            )
            return False
        return True

    def _mass_missing(self, raw: LineMap, name: str, path: str) -> None:
        """A body without a mass, and no chirp mass: the body or its mass left out."""
        body = raw.get(name)
        if not isinstance(body, LineMap):
            example = f"{name}: {{mass: 36 +5 -4 Msun}}"
            self.fail(raw.line, f"{path}.{name}", f"missing required key (e.g. {example})")
        else:
            self.fail(
                body.line,
                f"{path}.{name}.mass",
                "missing required key (e.g. mass: 36 +5 -4 Msun), or give chirp_mass instead",
            )

    def _history(self, raw, key, path, line) -> tuple[HistoryEntry, ...] | None:
        """The entries, which must be listed oldest first (entries of one date keep their
        order); each needs an estimate, a status, or both."""
        if not isinstance(raw, LineList):
            self.fail(line, path, "expected a list of earlier estimates and changes of status")
            return None
        entries: list[HistoryEntry] = []
        for i, item in enumerate(raw):
            where = f"{path}[{i}]"
            values = self._section(item, HISTORY_KEYS, where, raw.line_of(i), "")
            if values is None:
                continue
            if "estimate" not in values and "status" not in values:
                self.fail(
                    raw.line_of(i),
                    where,
                    "an entry needs an estimate, a status, or both (e.g. an earlier estimate "
                    "under estimate:, or a change of status such as status: retracted)",
                )
                continue
            if entries and values["date"] < entries[-1].date:
                self.fail(
                    item.line_of("date"),
                    f"{where}.date",
                    f"{_day(values['date'])} is earlier than the entry before it "
                    f"('{entries[-1].label}', {_day(entries[-1].date)}); list the history "
                    "oldest first",
                )
                continue
            entries.append(HistoryEntry(**values))
        return tuple(entries)

    def _candidates(self, raw, key, path, line) -> tuple[CounterpartCandidate, ...] | None:
        """Transients reported by observers: a short list, each named once."""
        if not isinstance(raw, LineList):
            self.fail(line, path, f"expected a list of transients, e.g. {key.example}")
            return None
        if len(raw) > MAX_CANDIDATES:
            self.fail(line, path, f"{len(raw)} candidates, at most {MAX_CANDIDATES}")
            return None
        found: list[CounterpartCandidate] = []
        for i, item in enumerate(raw):
            where = f"{path}[{i}]"
            values = self._section(item, CANDIDATE_KEYS, where, raw.line_of(i), "")
            if values is None:
                continue
            if any(c.name == values["name"] for c in found):
                self.fail(item.line_of("name"), f"{where}.name", "a second candidate of this name")
                continue
            found.append(CounterpartCandidate(**values))
        return tuple(found)

    def _host(self, raw, key, path, line) -> Host | None:
        values = self._section(raw, HOST_KEYS, path, line, "")
        return None if values is None else Host(**values)

    def _limits(self, raw, key, path, line) -> Limits | None:
        if not isinstance(raw, LineMap):
            self.fail(line, path, "expected a mapping of limits")
            return None
        known = {f: getattr(Limits(), f) for f in Limits.__dataclass_fields__}
        out = {}
        for name, value in raw.items():
            if name not in known:
                self._unknown(raw, name, known, f"{path}.")
            elif isinstance(value, bool) or not isinstance(value, int) or value < 1:
                self.fail(
                    raw.line_of(name),
                    f"{path}.{name}",
                    f"expected a positive whole number, got {show(value)}",
                )
            else:
                out[name] = value
        return Limits(**out)

    # -- the editors' texts, by language ---------------------------------------------------
    def _editorial_text(self, raw, key, path, line) -> i18n.Editorial | None:
        return self._editorial(raw, key, path, line, scalars.text)

    def _editorial_markdown(self, raw, key, path, line) -> i18n.Editorial | None:
        return self._editorial(raw, key, path, line, scalars.markdown)

    def _editorial_list(self, raw, key, path, line) -> tuple[i18n.Editorial, ...] | None:
        """Caveats: a list whose items are each one Markdown text or one per language."""
        if not isinstance(raw, LineList):
            self.fail(
                line,
                path,
                f"expected a list of Markdown texts, each one text or one per language "
                f"({_VERSIONS}), got {show(raw)}",
            )
            return None
        before = len(self.problems)
        items = [
            self._editorial(item, key, f"{path}[{i}]", raw.line_of(i), scalars.markdown)
            for i, item in enumerate(raw)
        ]
        if len(self.problems) > before:
            return None
        return tuple(item for item in items if item is not None)

    def _editorial(self, raw, key, path, line, convert) -> i18n.Editorial | None:
        """One text (written in the site's first language), or a mapping of language code to
        text whose first version is the original. Each version is checked as ``convert``
        checks a text (one line for a title, Markdown otherwise)."""
        if not isinstance(raw, LineMap):
            if isinstance(raw, list):
                self.fail(line, path, f"expected one text, or one per language ({_VERSIONS})")
                return None
            try:
                return i18n.Editorial(convert(raw, key))
            except scalars.Bad as exc:
                self.fail(line, path, str(exc))
                return None
        if not raw:
            self.fail(line, path, f"expected one text, or one per language ({_VERSIONS})")
            return None
        before = len(self.problems)
        versions: dict[str, str] = {}
        for name, text in raw.items():
            where, at = f"{path}.{str(name)[:60]}", raw.line_of(name)
            try:
                code = language_code(name)
                if code in versions:
                    raise scalars.Bad(f"a second version in {code}")
                if text is None:
                    raise scalars.Bad(
                        "empty: write the text in this language, or leave the language out"
                    )
                versions[code] = convert(text, key)
            except scalars.Bad as exc:
                self.fail(at, where, str(exc))
        if len(self.problems) > before:
            return None
        self._versions_shown(raw, versions, path, line)
        return i18n.Editorial(versions)

    def _versions_shown(self, raw: LineMap, versions: dict[str, str], path: str, line) -> None:
        """Warn of a version no page shows, and of an original that is not in the site's
        first language (the exports carry the original)."""
        main, *_ = self.languages
        built = ", ".join(self.languages)
        for name, code in zip(raw, versions, strict=True):
            if code not in self.languages:
                self.warn(
                    raw.line_of(name),
                    f"{path}.{str(name)[:60]}",
                    f"no page shows this version: the site is built in {built} (languages in "
                    "catalogue.yaml); add the language there, or correct the code",
                )
        original = next(iter(versions))
        if original == main:
            return
        if main in versions:
            what = f"put the version in {main} first"
        else:
            what = f"the pages in {main} show the original with a note; add a version in {main}"
        self.warn(
            line,
            path,
            f"the original (the first version given, which the exports carry) is in {original}, "
            f"not in {main}, the site's first language: {what}",
        )

    def _languages(self, raw, key, path, line) -> tuple[str, ...] | None:
        """The site's languages: codes of languages factsheet ships, each once, main first."""
        if not isinstance(raw, LineList) or not raw:
            self.fail(
                line,
                path,
                f"expected a list of language codes, the site's first language first, e.g. "
                f"languages: {key.example}, got {show(raw)}",
            )
            return None
        shipped = i18n.available()
        before = len(self.problems)
        codes: list[str] = []
        for i, item in enumerate(raw):
            where, at = f"{path}[{i}]", raw.line_of(i)
            try:
                code = language_code(item)
                if code not in shipped:
                    names = ", ".join(shipped)
                    raise scalars.Bad(
                        f"factsheet has no translation for {code} (available: {names})"
                    )
                if code in codes:
                    raise scalars.Bad(f"{code} is listed twice")
            except scalars.Bad as exc:
                self.fail(at, where, str(exc))
                continue
            codes.append(code)
        return tuple(codes) if len(self.problems) == before else None


#: How versions by language are written, for messages.
_VERSIONS = "e.g. {en: ..., es: ...}"


def _day(time) -> str:
    """A date as given to the day or to the second (UTC)."""
    text = utc_iso(time)
    return text[:10] if text.endswith("T00:00:00.000") else text[:19].replace("T", " ") + " UTC"


def distance_beyond_table(distance_mpc: float, cosmology: str) -> str:
    """Why a distance (in Mpc) cannot be turned into a redshift under ``cosmology``, or "".

    The redshift table ends at d_L(z = 1000) (:mod:`factsheet.physics.cosmology`).
    """
    from factsheet.physics.cosmology import Z_MAX, named_distance_limit

    limit = named_distance_limit(cosmology)
    if distance_mpc <= limit:
        return ""
    return (
        f"distance {distance_mpc:.6g} Mpc lies beyond {limit:.6g} Mpc, the luminosity distance "
        f"at redshift {Z_MAX:g} under {cosmology}, where the redshift table ends (expected a "
        "distance, and the upper bound of its interval, below it)"
    )
