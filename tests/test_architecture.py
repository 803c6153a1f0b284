"""The architecture rules of DEVELOPERS.md ("Layers"), read from the source with ``ast``.

Each test names the rule it keeps.  They read files only (nothing is imported), so a broken
module still gets a clear message here.
"""

from __future__ import annotations

import ast
import re
from dataclasses import dataclass
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGES = ("calc", "addin")


@dataclass(frozen=True)
class Import:
    source: str  # importing module
    target: str  # imported module (most specific module named)
    names: tuple[str, ...]  # names taken from it ("" for a plain import)
    line: int
    in_function: bool
    lazy_reason: bool  # a "# lazy:" comment on the line or above its block of imports


def module_name(path: Path) -> str:
    parts = list(path.relative_to(ROOT).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


def all_modules(root: Path = ROOT) -> dict[str, Path]:
    out = {}
    for pkg in PACKAGES:
        for p in sorted((root / pkg).rglob("*.py")):
            out[module_name(p) if root == ROOT else _name_under(p, root)] = p
    return out


def _name_under(path: Path, root: Path) -> str:
    parts = list(path.relative_to(root).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts.pop()
    return ".".join(parts)


def _resolve(mod: str, pkg_of: str, level: int, modules) -> str:
    if level:
        base = pkg_of.split(".")[: len(pkg_of.split(".")) - level + 1]
        mod = ".".join(base + ([mod] if mod else []))
    return mod


def imports_of(name: str, path: Path, modules) -> list[Import]:
    text = path.read_text(encoding="utf-8")
    lines = text.splitlines()
    tree = ast.parse(text, filename=str(path))
    is_pkg = path.name == "__init__.py"
    pkg = name if is_pkg else name.rpartition(".")[0]
    out: list[Import] = []

    def lazy(lineno: int) -> bool:
        """A '# lazy:' comment on the line, or in the comment block above its import lines."""
        if "# lazy:" in lines[lineno - 1]:
            return True
        k = lineno - 2
        while k >= 0 and lines[k].strip().startswith(("import ", "from ")):
            k -= 1
        while k >= 0 and lines[k].strip().startswith("#"):  # the comment block above
            if lines[k].strip().startswith("# lazy:"):
                return True
            k -= 1
        return False

    def visit(node, in_function: bool):
        for child in ast.iter_child_nodes(node):
            fn = in_function or isinstance(child, (ast.FunctionDef, ast.AsyncFunctionDef))
            if isinstance(child, ast.Import):
                for a in child.names:
                    if a.name.split(".")[0] in PACKAGES:
                        out.append(
                            Import(
                                name, a.name, ("",), child.lineno, in_function, lazy(child.lineno)
                            )
                        )
                    elif in_function:
                        out.append(
                            Import(name, a.name, ("",), child.lineno, True, lazy(child.lineno))
                        )
            elif isinstance(child, ast.ImportFrom):
                mod = _resolve(child.module or "", pkg, child.level, modules)
                if mod.split(".")[0] not in PACKAGES:
                    if in_function:
                        names = tuple(a.name for a in child.names)
                        out.append(Import(name, mod, names, child.lineno, True, lazy(child.lineno)))
                    continue
                for a in child.names:
                    sub = f"{mod}.{a.name}"
                    if sub in modules:
                        out.append(
                            Import(name, sub, ("",), child.lineno, in_function, lazy(child.lineno))
                        )
                    else:
                        out.append(
                            Import(
                                name, mod, (a.name,), child.lineno, in_function, lazy(child.lineno)
                            )
                        )
            visit(child, fn)

    visit(tree, False)
    return out


def graph(root: Path = ROOT):
    modules = all_modules(root) if root != ROOT else all_modules()
    imports = [i for name, p in modules.items() for i in imports_of(name, p, modules)]
    return modules, imports


def cycles(modules, imports) -> list[list[str]]:
    """Strongly connected components with more than one module (Tarjan), or a self-import."""
    edges: dict[str, set[str]] = {m: set() for m in modules}
    for i in imports:
        if i.target in modules:
            edges[i.source].add(i.target)
    index: dict[str, int] = {}
    low: dict[str, int] = {}
    stack: list[str] = []
    on: set[str] = set()
    out: list[list[str]] = []
    counter = [0]

    def strong(v: str):
        index[v] = low[v] = counter[0]
        counter[0] += 1
        stack.append(v)
        on.add(v)
        for w in sorted(edges[v]):
            if w not in index:
                strong(w)
                low[v] = min(low[v], low[w])
            elif w in on:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            comp = []
            while True:
                w = stack.pop()
                on.discard(w)
                comp.append(w)
                if w == v:
                    break
            if len(comp) > 1 or v in edges[v]:
                out.append(sorted(comp))

    for m in sorted(modules):
        if m not in index:
            strong(m)
    return out


MODULES, IMPORTS = graph()


def _where(i: Import) -> str:
    return f"{MODULES[i.source].relative_to(ROOT)}:{i.line}"


def test_the_graph_is_read():
    """Guard against a reader that finds nothing (every rule below would pass vacuously)."""
    assert "calc.flow.core" in MODULES and "addin.cli" in MODULES
    assert any(
        i.source == "calc.circulation.loop" and i.target.startswith("calc.") for i in IMPORTS
    )


def test_calc_never_imports_addin():
    """Rule 1 — layers: calc is the core; addin (the faces) may import calc, never the reverse."""
    bad = [
        f"{_where(i)} imports {i.target}"
        for i in IMPORTS
        if i.source.startswith("calc") and i.target.startswith("addin")
    ]
    assert not bad, "calc must not import addin:\n" + "\n".join(bad)


def test_no_import_cycles():
    """Rule 2 — no circles: the module import graph of calc and addin is acyclic."""
    found = cycles(MODULES, IMPORTS)
    assert not found, "import cycles:\n" + "\n".join(" -> ".join(c) for c in found)


def test_no_private_names_across_modules():
    """Rule 3 — no underscore names across modules: what two modules share has a public name
    in a named internal module."""
    bad = []
    for i in IMPORTS:
        if i.target.split(".")[0] not in ("calc", "addin"):
            continue
        last = i.target.rsplit(".", 1)[-1]
        if last.startswith("_") and not last.startswith("__"):
            bad.append(f"{_where(i)} imports private module {i.target}")
        for n in i.names:
            if n.startswith("_") and not n.startswith("__"):
                bad.append(f"{_where(i)} imports {n} from {i.target}")
    assert not bad, "private names imported across modules:\n" + "\n".join(bad)


def test_function_level_imports_say_why():
    """Rule 4 — imports at module top; a function-level import (an optional or heavy
    dependency) carries a ``# lazy: why`` comment."""
    bad = [
        f"{_where(i)} imports {i.target} inside a function without '# lazy: why'"
        for i in IMPORTS
        if i.in_function and not i.lazy_reason
    ]
    assert not bad, "\n".join(bad)


def test_no_object_annotations_in_calc_results():
    """Rule 5 — typed results: no field of a calc class is annotated ``object``."""
    bad = []
    for name, path in MODULES.items():
        if not name.startswith("calc"):
            continue
        tree = ast.parse(path.read_text(encoding="utf-8"))
        for cls in (n for n in ast.walk(tree) if isinstance(n, ast.ClassDef)):
            for st in cls.body:
                if isinstance(st, ast.AnnAssign):
                    names = {x.id for x in ast.walk(st.annotation) if isinstance(x, ast.Name)}
                    consts = {
                        x.value
                        for x in ast.walk(st.annotation)
                        if isinstance(x, ast.Constant) and isinstance(x.value, str)
                    }
                    if "object" in names or any(re.search(r"\bobject\b", c) for c in consts):
                        bad.append(f"{path.relative_to(ROOT)}:{st.lineno} {cls.name}")
    assert not bad, "fields annotated 'object':\n" + "\n".join(bad)


#: calc modules that may turn SI values into display units: the registry itself, and the notes'
#: own SI rendering (``str(note)``).
_DISPLAY_OK = {"calc.units", "calc.notes"}


def test_calc_builds_no_display_text():
    """Rule 6 — numbers and structure out: calc never converts to a display unit nor takes a
    unit system for messages; the faces format (addin.text)."""
    bad = []
    for i in IMPORTS:
        if not i.source.startswith("calc") or i.source in _DISPLAY_OK:
            continue
        if i.target == "calc.units":
            shown = {"from_si", "unit_for", "label", "convert"} & set(i.names)
            if shown:
                bad.append(f"{_where(i)} imports {sorted(shown)} from calc.units")
    for name, path in MODULES.items():
        if name.startswith("calc") and "message_units" in path.read_text(encoding="utf-8"):
            bad.append(f"{path.relative_to(ROOT)} mentions message_units")
    assert not bad, "\n".join(bad)


# --------------------------------------------------------------------- the rules can fail


def _tree(tmp_path: Path, files: dict[str, str]) -> Path:
    for rel, body in files.items():
        p = tmp_path / rel
        p.parent.mkdir(parents=True, exist_ok=True)
        p.write_text(body, encoding="utf-8")
    for pkg in PACKAGES:
        (tmp_path / pkg).mkdir(exist_ok=True)
        (tmp_path / pkg / "__init__.py").touch()
    return tmp_path


def _graph_at(root: Path):
    modules = {_name_under(p, root): p for pkg in PACKAGES for p in (root / pkg).rglob("*.py")}
    imports = [i for n, p in modules.items() for i in imports_of(n, p, modules)]
    return modules, imports


@pytest.mark.parametrize(
    ("files", "expect"),
    [
        ({"calc/a.py": "from calc.b import x\n", "calc/b.py": "from calc.a import y\n"}, 1),
        ({"calc/a.py": "import calc.b\n", "calc/b.py": "x = 1\n"}, 0),
        (
            {
                "addin/p/__init__.py": "from addin.p.m import f\n",
                "addin/p/m.py": "from addin.p import g\n",
            },
            1,
        ),
    ],
)
def test_cycle_finder_on_small_trees(tmp_path, files, expect):
    """The cycle finder sees a two-module circle and a package/__init__ circle (and no false
    one)."""
    modules, imports = _graph_at(_tree(tmp_path, files))
    assert len(cycles(modules, imports)) == expect


def test_import_reader_flags_private_lazy_and_back_imports(tmp_path):
    files = {
        "calc/a.py": "from calc.b import _hidden\n\ndef f():\n    from calc.b import y\n",
        "calc/b.py": "import addin.x\n_hidden = 1\ny = 2\n",
        "addin/x.py": "def g():\n    # lazy: heavy optional dependency\n    import openpyxl\n",
    }
    _, imports = _graph_at(_tree(tmp_path, files))
    private = [i for i in imports if "_hidden" in i.names]
    assert private and private[0].source == "calc.a"
    inner = [i for i in imports if i.in_function]
    assert {(i.source, i.lazy_reason) for i in inner} == {("calc.a", False), ("addin.x", True)}
    assert any(i.source == "calc.b" and i.target == "addin.x" for i in imports)
