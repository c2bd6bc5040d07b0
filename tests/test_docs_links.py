"""Every link between the project's own documents reaches a file that exists and, when it names
a heading, a heading that exists (anchors as the common Markdown renderers make them: lower
case, punctuation other than "-" and "_" dropped, spaces as "-", a repeated heading "-1")."""

from __future__ import annotations

import re
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
DOCUMENTS = sorted([ROOT / "README.md", ROOT / "DEVELOPERS.md", *(ROOT / "docs").glob("*.md")])
LINK = re.compile(r"\]\(([^)\s#]*)(?:#([^)\s]+))?\)")
FENCE = re.compile(r"^```.*?^```", re.S | re.M)


def anchors(text: str) -> set[str]:
    found, seen = set(), {}
    for heading in re.findall(r"^#{1,6} (.+)$", FENCE.sub("", text), re.M):
        slug = re.sub(r"[^\w\- ]", "", heading.strip().lower()).replace(" ", "-")
        count = seen.get(slug, 0)
        seen[slug] = count + 1
        found.add(slug if count == 0 else f"{slug}-{count}")
    return found


@pytest.mark.parametrize("document", DOCUMENTS, ids=lambda p: p.name)
def test_links_reach_their_file_and_heading(document):
    broken = []
    for target, anchor in LINK.findall(FENCE.sub("", document.read_text(encoding="utf-8"))):
        if re.match(r"[a-z]+:", target):
            continue  # a web address or mailto: not ours to check offline
        path = (document.parent / target) if target else document
        if not path.exists():
            broken.append(target)
        elif anchor and path.suffix == ".md" and anchor not in anchors(path.read_text("utf-8")):
            broken.append(f"{target}#{anchor}")
    assert broken == []


def test_the_anchor_rule_matches_a_known_heading():
    assert anchors("## `counterpart_candidates`\n## What is derived\n## What is derived\n") == {
        "counterpart_candidates",
        "what-is-derived",
        "what-is-derived-1",
    }
