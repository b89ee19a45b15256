"""The package layout: stages import only downwards and no module imports itself in a loop.

The stages, bottom to top, as the folder tree reads (DEVELOPERS.md, "Layout")::

    fluids_props <- units, errors, constants, plain_data <- dimensional <- correlations
    <- prediction <- planning <- readers <- report <- commands, cli

Every ``import`` and ``from ... import`` statement is read from the source with ``ast``, in
function bodies too (a loop hidden inside a function is still a loop). A result object may
offer a thin notebook convenience that calls a writer (``Plan.to_excel``, ``Plan.plot``): an
upward import inside a method of one of those names is allowed and kept out of the graph.
"""

from __future__ import annotations

import ast
import pathlib

import pytest

ROOT = pathlib.Path(__file__).resolve().parents[1]
PACKAGES = ("fluids_props", "similitude")

#: Stage of each top-level part; a module may import its own stage or lower ones.
STAGES = {
    "fluids_props": 0,
    "similitude.units": 1, "similitude.errors": 1, "similitude.constants": 1,
    "similitude.plain_data": 1, "similitude.cautions": 1, "similitude.labels": 1,
    "similitude.dimensional": 2,
    "similitude.correlations": 3,
    "similitude.prediction": 4,
    "similitude.planning": 5,
    "similitude.readers": 6,
    "similitude.report": 7,
    "similitude.commands": 8, "similitude.cli": 8, "similitude.__main__": 8,
}

#: Methods of result objects that may call a writer of a higher stage (notebook conveniences).
CONVENIENCES = ("to_excel", "plot")


def _module_name(path: pathlib.Path) -> str:
    parts = list(path.relative_to(ROOT).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


def _modules() -> dict[str, pathlib.Path]:
    return {_module_name(p): p for pkg in PACKAGES for p in sorted((ROOT / pkg).rglob("*.py"))}


MODULES = _modules()


def _stage(module: str) -> int | None:
    best = None
    for prefix, rank in STAGES.items():
        if module == prefix or module.startswith(prefix + "."):
            if best is None or len(prefix) > len(best[0]):
                best = (prefix, rank)
    return None if best is None else best[1]


def _resolve(module: str, node: ast.ImportFrom | ast.Import) -> list[str]:
    """Project modules named by one import statement."""
    if isinstance(node, ast.Import):
        names = [a.name for a in node.names]
    else:
        base = node.module or ""
        if node.level:
            pkg = module.split(".")
            if not MODULES[module].name == "__init__.py":
                pkg = pkg[:-1]
            pkg = pkg[: len(pkg) - (node.level - 1)]
            base = ".".join(pkg + ([base] if base else []))
        # "from pkg import mod" names a module; "from mod import func" names mod
        names = [f"{base}.{a.name}" if f"{base}.{a.name}" in MODULES else base
                 for a in node.names]
    return sorted({n for n in names if n.split(".")[0] in PACKAGES and n in MODULES})


def _imports(module: str) -> list[tuple[str, str | None]]:
    """(imported module, enclosing function name or None) for every import of ``module``."""
    tree = ast.parse(MODULES[module].read_text(encoding="utf-8"))
    found: list[tuple[str, str | None]] = []

    def visit(node: ast.AST, func: str | None) -> None:
        for child in ast.iter_child_nodes(node):
            if isinstance(child, (ast.FunctionDef, ast.AsyncFunctionDef)):
                visit(child, child.name if func is None else func)
            elif isinstance(child, (ast.Import, ast.ImportFrom)):
                found.extend((m, func) for m in _resolve(module, child))
            else:
                visit(child, func)

    visit(tree, None)
    return found


def _is_convenience(module: str, target: str, func: str | None) -> bool:
    return func in CONVENIENCES and (_stage(target) or 0) > (_stage(module) or 0)


def _graph() -> dict[str, set[str]]:
    graph: dict[str, set[str]] = {m: set() for m in MODULES}
    for m in MODULES:
        if m in PACKAGES:  # the package facades re-export names; they sit above every stage
            continue
        for target, func in _imports(m):
            if target != m and not _is_convenience(m, target, func):
                graph[m].add(target)
    return graph


def test_every_module_belongs_to_a_stage():
    loose = [m for m in MODULES if m not in PACKAGES and _stage(m) is None]
    assert loose == [], f"modules with no stage in STAGES: {loose}"


@pytest.mark.parametrize("module", [m for m in MODULES if m not in PACKAGES])
def test_module_imports_only_its_own_stage_or_lower(module):
    own = _stage(module)
    upward = [f"{target} (in {func or 'module body'})" for target, func in _imports(module)
              if (_stage(target) or 0) > own and not _is_convenience(module, target, func)]
    assert upward == [], f"{module} (stage {own}) imports a higher stage: {upward}"


def test_fluids_props_knows_nothing_of_similitude():
    bad = [(m, t) for m in MODULES if m.startswith("fluids_props")
           for t, _ in _imports(m) if t.startswith("similitude")]
    assert bad == []


def _cycles(graph: dict[str, set[str]]) -> list[list[str]]:
    """Strongly connected components of more than one module (Tarjan's algorithm)."""
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on_stack: set[str] = set()
    out: list[list[str]] = []

    def strong(v: str) -> None:
        index[v] = low[v] = len(index)
        stack.append(v)
        on_stack.add(v)
        for w in sorted(graph.get(v, ())):
            if w not in index:
                strong(w)
                low[v] = min(low[v], low[w])
            elif w in on_stack:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            comp = []
            while True:
                w = stack.pop()
                on_stack.discard(w)
                comp.append(w)
                if w == v:
                    break
            if len(comp) > 1:
                out.append(sorted(comp))

    for v in sorted(graph):
        if v not in index:
            strong(v)
    return out


def test_no_import_cycle_between_modules():
    assert _cycles(_graph()) == []


def test_cycle_finder_finds_a_planted_loop():
    # The checker itself must be able to fail: a -> b -> c -> a is one loop of three.
    assert _cycles({"a": {"b"}, "b": {"c"}, "c": {"a"}, "d": {"a"}}) == [["a", "b", "c"]]


def test_upward_import_outside_a_convenience_is_caught():
    # A planning module importing the plan workbook outside to_excel/plot would be refused.
    assert not _is_convenience("similitude.planning.planner", "similitude.report.plan_workbook",
                               "plan")
    assert _is_convenience("similitude.planning.planner", "similitude.report.plan_workbook",
                           "to_excel")
