"""The project speaks its own vocabulary and documents itself.

Input format and export contract version 2 replaced a set of key names that, taken together,
were another program's parameter names; none of them may come back anywhere in the repository
(not as an alias either). And nothing in the repository may point at a file outside it: users
see README.md and docs/. The retired words are assembled from pieces here so that this file
does not contain them itself.
"""

from __future__ import annotations

import re
import subprocess
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]

_PIECES = [
    ("mass", "1"),
    ("mass", "2"),
    ("spin", "1z"),
    ("spin", "2z"),
    ("chi", "eff"),
    ("luminosity", "distance"),
    ("final", "mass"),
    ("final", "spin"),
    ("radiated", "energy"),
]
RETIRED = re.compile(r"(?<![A-Za-z0-9.])(" + "|".join("_".join(p) for p in _PIECES) + r")")
RETIRED_YAML_KEYS = re.compile(r"^\s*-?\s*(" + "param" + "eters|" + "detec" + "tors):", re.M)
OUTSIDE = re.compile(
    "|".join(re.escape(x) for x in ("DESIGN" + ".md", "METHODS" + ".md", "../" + "shared"))
)


IGNORED = {"site", "build", "dist", "test-artifacts", "__pycache__"}


def repository_files() -> list[Path]:
    """Tracked and new files of the checkout (ignored build output left out)."""
    try:
        listed = subprocess.run(
            ["git", "ls-files", "-co", "--exclude-standard"],
            cwd=ROOT,
            capture_output=True,
            text=True,
            check=True,
        ).stdout.split("\n")
    except (OSError, subprocess.CalledProcessError):  # no git: walk the tree instead
        listed = [
            str(p.relative_to(ROOT))
            for p in ROOT.rglob("*")
            if not any(
                part.startswith(".") or part in IGNORED for part in p.relative_to(ROOT).parts
            )
        ]
    return [ROOT / name for name in listed if name and (ROOT / name).is_file()]


def _text(path: Path) -> str | None:
    try:
        return path.read_text(encoding="utf-8")
    except UnicodeDecodeError:
        return None  # binary files


def test_no_retired_name_anywhere():
    found = []
    for path in repository_files():
        text = _text(path)
        if text is None:
            continue
        for pattern in (RETIRED, RETIRED_YAML_KEYS):
            found += [
                f"{path.relative_to(ROOT)}: {m.group(0).strip()}" for m in pattern.finditer(text)
            ]
        if RETIRED.search(path.name):
            found.append(f"file name {path.relative_to(ROOT)}")
    assert not found, "retired version-1 names:\n" + "\n".join(found[:40])


def test_nothing_refers_to_files_outside_the_repository():
    found = [
        f"{path.relative_to(ROOT)}: {m.group(0)}"
        for path in repository_files()
        if path.relative_to(ROOT).parts[0] != ".ci" and (text := _text(path)) is not None
        for m in OUTSIDE.finditer(text)
    ]
    assert not found, "\n".join(found[:40])


def test_the_docs_the_code_cites_exist():
    cited = set()
    for path in repository_files():
        text = _text(path)
        if text is not None:
            cited |= set(re.findall(r"docs/[a-z0-9-]+\.md", text))
    missing = sorted(c for c in cited if not (ROOT / c).is_file())
    assert cited and not missing, missing
