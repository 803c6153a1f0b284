"""The import graph of calc/ and addin/ is one-way: no circles, and calc never imports addin.

The rule is the project's own (DEVELOPERS.md, Layout).  Every import counts, at module top or
inside a function: a function-level import hides a circle from Python's import machinery, not
from the design.  Circles are the strongly connected components of the module graph (Tarjan,
"Depth-first search and linear graph algorithms", SIAM J. Comput. 1 (1972) 146-160).
"""

from __future__ import annotations

import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def import_graph(root: Path, packages=("calc", "addin")) -> dict[str, set[str]]:
    """Module → the project modules it imports (``from pkg import name`` → ``pkg.name`` if a
    module, else ``pkg``)."""
    files = {}
    for pkg in packages:
        for path in (root / pkg).rglob("*.py"):
            parts = list(path.relative_to(root).with_suffix("").parts)
            if parts[-1] == "__init__":
                parts = parts[:-1]
            files[".".join(parts)] = path
    graph: dict[str, set[str]] = {m: set() for m in files}
    for mod, path in files.items():
        package = mod if path.name == "__init__.py" else mod.rpartition(".")[0]
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            if isinstance(node, ast.Import):
                targets = [a.name for a in node.names]
            elif isinstance(node, ast.ImportFrom):
                base = node.module or ""
                if node.level:
                    up = package.split(".")[: len(package.split(".")) - (node.level - 1)]
                    base = ".".join([*up, *([node.module] if node.module else [])])
                targets = [f"{base}.{a.name}" for a in node.names]
            else:
                continue
            for t in targets:
                while t and t not in files:  # the nearest project module (a.b.name → a.b)
                    t = t.rpartition(".")[0]
                if t and t != mod:
                    graph[mod].add(t)
    return graph


def circles(graph: dict[str, set[str]]) -> list[list[str]]:
    """Strongly connected components with more than one module (iterative Tarjan)."""
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on_stack: set[str] = set()
    found = []
    for start in sorted(graph):
        if start in index:
            continue
        work = [(start, iter(sorted(graph[start])))]
        index[start] = low[start] = len(index)
        stack.append(start)
        on_stack.add(start)
        while work:
            v, children = work[-1]
            w = next(children, None)
            if w is not None:
                if w not in index:
                    index[w] = low[w] = len(index)
                    stack.append(w)
                    on_stack.add(w)
                    work.append((w, iter(sorted(graph[w]))))
                elif w in on_stack:
                    low[v] = min(low[v], index[w])
                continue
            work.pop()
            if work:
                low[work[-1][0]] = min(low[work[-1][0]], low[v])
            if low[v] == index[v]:
                comp = []
                while True:
                    w = stack.pop()
                    on_stack.discard(w)
                    comp.append(w)
                    if w == v:
                        break
                if len(comp) > 1:
                    found.append(sorted(comp))
    return found


def test_circle_finder_finds_a_circle():
    # a → b → c → a is one component; d hangs off it and is not part of it
    graph = {"a": {"b"}, "b": {"c"}, "c": {"a"}, "d": {"a"}}
    assert circles(graph) == [["a", "b", "c"]]
    assert circles({"a": {"b"}, "b": set()}) == []


def test_no_import_circles_in_calc_and_addin():
    graph = import_graph(ROOT)
    assert "addin.cli" in graph and "calc.units" in graph  # the walk found the packages
    assert circles(graph) == []


def test_calc_never_imports_addin():
    graph = import_graph(ROOT)
    calc_to_addin = sorted(
        (m, t)
        for m, ts in graph.items()
        if m.split(".")[0] == "calc"
        for t in ts
        if t.split(".")[0] == "addin"
    )
    assert calc_to_addin == []
