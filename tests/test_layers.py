"""The package's folders are the pipeline: imports run one way, load ← derive ← render.

Every ``import`` in ``factsheet/`` (also those inside functions, which only defer the cost) is
an edge of the module graph. The graph must have no cycle, and each part may import only the
parts at or below it:

* ``physics`` — pure functions (tests/physics/test_physics_boundary.py checks its own imports);
* the shared records and words — ``model``, ``labels``, ``notation``, ``i18n``, ``errors``,
  ``resources``;
* ``load`` — may use the records and the physics (the redshift check);
* ``derive`` — may use load;
* ``figures`` — drawing only: the records, the labels and the physics, nothing of the stages;
* ``render`` — may use load, derive and figures;
* the orchestration at the top — ``build``, ``cache``, ``publish``, ``serve``, ``cli``, ``api``.
"""

from __future__ import annotations

import ast
from pathlib import Path

import pytest

import factsheet

PACKAGE = Path(factsheet.__file__).resolve().parent
SHARED = {"model", "labels", "notation", "errors", "resources", "i18n"}
TOP = {"build", "cache", "progress", "publish", "serve", "cli", "api"}
#: The parts each part may import (besides itself).
ALLOWED = {
    "physics": set(),
    "shared": {"physics"},
    "load": {"shared", "physics"},
    "derive": {"shared", "physics", "load"},
    "figures": {"shared", "physics"},
    "render": {"shared", "physics", "load", "derive", "figures"},
    "top": {"shared", "physics", "load", "derive", "figures", "render", "top"},
}


def _module_name(path: Path) -> str:
    parts = path.relative_to(PACKAGE.parent).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


MODULES = {_module_name(p): p for p in sorted(PACKAGE.rglob("*.py"))}


def part(module: str) -> str:
    """Which part of the pipeline a module belongs to."""
    pieces = module.split(".")
    if len(pieces) == 1:
        return "shared"  # the package's own __init__
    first = pieces[1]
    if first in SHARED:
        return "shared"
    if first in TOP:
        return "top"
    return first


def _targets(node: ast.AST, module: str, is_package: bool) -> list[str]:
    """The factsheet modules an import statement names (a submodule when it is one)."""
    if isinstance(node, ast.Import):
        return [a.name for a in node.names if a.name.split(".")[0] == "factsheet"]
    if not isinstance(node, ast.ImportFrom):
        return []
    if node.level:
        base = module.split(".")
        base = base if is_package else base[:-1]
        base = base[: len(base) - node.level + 1]
        source = ".".join([*base, node.module] if node.module else base)
    else:
        source = node.module or ""
    if source.split(".")[0] != "factsheet":
        return []
    return [f"{source}.{a.name}" if f"{source}.{a.name}" in MODULES else source for a in node.names]


def imports() -> dict[str, set[str]]:
    graph: dict[str, set[str]] = {}
    for name, path in MODULES.items():
        tree = ast.parse(path.read_text(encoding="utf-8"), filename=str(path))
        is_package = path.name == "__init__.py"
        found = {t for node in ast.walk(tree) for t in _targets(node, name, is_package)}
        graph[name] = {t for t in found if t in MODULES and t != name}
    return graph


GRAPH = imports()


@pytest.mark.parametrize("module", sorted(GRAPH))
def test_imports_run_one_way(module):
    here = part(module)
    for target in sorted(GRAPH[module]):
        there = part(target)
        assert there == here or there in ALLOWED[here], (
            f"{module} ({here}) imports {target} ({there}): a later stage into an earlier one"
        )


def test_no_import_cycle():
    state: dict[str, int] = {}  # 1: on the current path, 2: done

    def visit(module: str, path: list[str]) -> None:
        state[module] = 1
        for target in sorted(GRAPH[module]):
            if state.get(target) == 1:
                cycle = [*path[path.index(target) :], target]
                pytest.fail("import cycle: " + " -> ".join(cycle))
            if target not in state:
                visit(target, [*path, target])
        state[module] = 2

    for module in sorted(GRAPH):
        if module not in state:
            visit(module, [module])


def test_every_part_is_known():
    assert {part(m) for m in MODULES} <= set(ALLOWED)


def test_the_tree_shows_the_pipeline():
    packages = {p.name for p in PACKAGE.iterdir() if (p / "__init__.py").is_file()}
    assert {"load", "derive", "physics", "figures", "render"} <= packages
    flat = {p.stem for p in PACKAGE.glob("*.py")} - {"__init__"}
    assert flat == SHARED | TOP
