"""Generate ``workbooks/worksheet-functions.md`` from the worksheet functions themselves.

The reference is built from each function's signature, its argument hints (the ``doc`` text
xlwings shows in the function wizard) and its docstring, so it cannot drift from the code.
Regenerate with ``python -m addin.sheets.docs``; ``python -m addin.sheets.docs --check``
exits non-zero when the committed file is stale (the tests run the same check).
"""

import ast
import inspect
import re
import sys
import textwrap
import typing
from pathlib import Path

import addin.sheets.functions  # noqa: F401  (registers every family)
from addin.sheets.cells import STANDARD_SPEEDS
from addin.sheets.framework import FUNCTIONS, MARK
from calc import cautions
from calc import units as cu

__all__ = ["DOC_PATH", "main", "render"]

DOC_PATH = Path(__file__).resolve().parents[2] / "workbooks" / "worksheet-functions.md"

_FAMILY_TITLES = {
    "units": "Units and housekeeping",
    "rheology": "Rheology from viscometer readings",
    "flow": "Pipe and annular flow",
    "bit": "Bit hydraulics",
    "pressure": "Hydrostatic pressure, ESD and ECD",
    "downhole": "Downhole temperature and density at temperature and pressure",
    "cleaning": "Hole cleaning",
    "surge": "Surge, swab and trip speed",
    "pumps": "Mud pumps (strokes and rate)",
    "slurry": "Settling slurries in pipes",
}

_ENABLE = """\
## Enabling the functions in a spreadsheet (xlwings)

The functions are ordinary Python functions made available to the spreadsheet by
[xlwings](https://docs.xlwings.org).  Classic xlwings user-defined functions run on
**Windows** desktop Excel; its documentation states that the UDF features of the add-in are
not available on macOS.

### Windows

1. Install Python 3.11 or newer, then boreflow with its dependencies (xlwings included):
   `pip install .` from a copy of the boreflow repository.
2. Install the xlwings add-in once: `xlwings addin install`, then restart Excel.  An
   **xlwings** tab appears on the ribbon.
3. In Excel, allow the add-in to write its function module: *File → Options → Trust Center →
   Trust Center Settings → Macro Settings →* tick *Trust access to the VBA project object
   model*.
4. Open the workbook that will use the functions and save it as a macro-enabled workbook
   (`.xlsm`) — importing functions adds a VBA module to it.
5. Tell xlwings where the functions are, **either** on the ribbon's xlwings tab
   (*UDF Modules*: `addin.sheets.functions`; *Interpreter*: the full path of the
   `python.exe` that has boreflow installed, if it is not the first on `PATH`) **or** in a
   sheet named `xlwings.conf` in the workbook, two columns, no header, no quotes:

   | A | B |
   |---|---|
   | `UDF Modules` | `addin.sheets.functions` |
   | `Interpreter_Win` | `C:\\path\\to\\python.exe` (optional) |
   | `PYTHONPATH` | the boreflow folder, if boreflow is not installed with pip (optional) |

   The demo workbook `workbooks/demo-workbook.xlsx` already carries such a sheet.
6. Click **Import Functions** on the xlwings tab.  The `BF_…` functions now appear in the
   function wizard (category *boreflow …*), with a description of every argument.  Import
   again after upgrading boreflow.

### macOS

Classic xlwings does not offer user-defined functions on macOS.  There, compute the same
workbook headlessly with `boreflow sheets compute book.xlsx -o book-computed.xlsx` (see the
top of this page; from Python: `addin.sheets.engine.calculate("book.xlsx")`), or use boreflow
from Python or its command line.

### If a cell shows …

* `#NAME?` — the functions are not imported: repeat step 6 (and check *UDF Modules*).
* a long Python traceback — the functions were imported from an older boreflow; upgrade and
  import again.  boreflow functions themselves never return tracebacks (see *Errors*).
"""


def _conventions() -> str:
    speeds = "; ".join(
        f"{n} readings → {', '.join(f'{s:g}' for s in v)} rpm" for n, v in STANDARD_SPEEDS.items()
    )
    systems = ", ".join(f"`{s}`" for s in cu.UNIT_SYSTEMS)
    kinds = ", ".join(f"`{k}`" for k in cu.KINDS)
    oil = cu.UNIT_SYSTEMS["oilfield"]
    defaults = ", ".join(
        f"{k.replace('_', ' ')} {cu.label(oil[k])}"
        for k in ("depth", "diameter", "nozzle", "density", "pressure", "flow_rate", "stress")
    )
    return f"""\
## Conventions (the same for every function)

**Names.** `BF_` (for *boreflow*) followed by the trade term: `BF_PV`, `BF_YP`, `BF_ECD`,
`BF_TFA`, `BF_HSI` … Several words are joined by `_` (`BF_ANN_LOSS`).  Excel ignores case.

**Argument order.** Always: *fluid* first (density, then the readings range), then
*geometry* (diameters outer before inner, then length or depth), then *rate* (flow rate, trip
speed), then *options* (method, factors), and the *units* last.  Optional arguments may be
left out from the right, or given as an empty cell.

**Units.** The last argument, `units`, is blank for oilfield units ({defaults}), or one of
{systems}, optionally followed by overrides `kind=unit` separated by `;` —
`"oilfield; flow_rate=bbl/min; density=sg"` — or a two-column range `kind | unit` (a row
`system | metric` picks the base).  Results come out in the same units.  Any single numeric
cell may carry its own unit as text (`"12.43 bbl/min"`, `"1.32 sg"`).  Kinds: {kinds}.

**Readings.** A viscometer range may be two columns `rpm | dial` (or two rows), with or
without a text header; or a single row or column of dial readings alone, whose speeds are
then taken by count ({speeds}).  A blank dial cell leaves that speed out.  Dial readings are
in degrees of the standard R1-B1 bob with F1 spring.

**Blanks, text, logicals.** A blank required argument, text that is not a number, TRUE/FALSE
where a number is wanted, or a reference to an error cell gives an error naming the argument.
Inside a numeric range every cell must hold a number (the error names the row and column).

**Errors.** A call that cannot be computed returns a short text starting with `{MARK}` that
names the problem, e.g. `{MARK} flow rate = -5: not allowed; allowed: > 0 gpm`.  Arithmetic on
it fails visibly (`#VALUE!`); test for it with `=LEFT(A1, 4) = "{MARK}"`.  No Python exception
or traceback ever reaches a cell, and a result is never NaN or infinite (xlwings would show
NaN as an empty cell).  Classic xlwings cannot return native error values such as `#N/A`.

**Results.** A number in the stated units, or a spilled table whose first row holds the
labels (with units) — enter it as an array formula in spreadsheets without dynamic arrays.

**Caution.** {cautions.CELL}
"""


def _hint_doc(func, name: str) -> str:
    hints = typing.get_type_hints(func, include_extras=True)
    hint = hints.get(name)
    for meta in getattr(hint, "__metadata__", ()):
        if isinstance(meta, dict) and "doc" in meta:
            return meta["doc"]
    return ""


def _sig_text(name: str, func) -> str:
    parts = []
    for p in inspect.signature(func).parameters.values():
        parts.append(p.name if p.default is inspect.Parameter.empty else f"[{p.name}]")
    return f"{name}({', '.join(parts)})"


def _excel_literal(value) -> str | None:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "TRUE" if value else "FALSE"
    if isinstance(value, int | float):
        return repr(value)
    if isinstance(value, str):
        return '"' + value.replace('"', '""') + '"'
    if isinstance(value, list):
        grid = value if value and isinstance(value[0], list) else [value]
        rows = []
        for row in grid:
            cells = [_excel_literal(v) for v in row]
            if any(c is None or c == "" for c in cells):
                return None
            rows.append(",".join(cells))
        return "{" + ";".join(rows) + "}"
    return None


def _examples(doc: str) -> list[str]:
    """Doctest lines ``>>> BF_X(literal, …)`` with their output → spreadsheet examples."""
    out = []
    lines = doc.splitlines()
    for i, line in enumerate(lines):
        m = re.match(r"\s*>>> (BF_\w+)\((.*)\)\s*$", line)
        if not m or i + 1 >= len(lines):
            continue
        try:
            args = ast.literal_eval(f"[{m.group(2)}]")
        except (ValueError, SyntaxError):
            continue
        lits = [_excel_literal(a) for a in args]
        if any(x is None for x in lits):
            continue
        result = lines[i + 1].strip()
        if len(result) >= 2 and result[0] == result[-1] == "'":
            result = result[1:-1]
        out.append(f"`={m.group(1)}({', '.join(lits)})` → `{result}`")
    return out


def _body(doc: str) -> str:
    """The docstring without its Examples section, numpydoc headings in bold."""
    doc = inspect.cleandoc(doc or "")
    doc = re.split(r"\n\s*(?:Examples\n-+|>>> )", doc, maxsplit=1)[0]
    doc = re.sub(r"\n(\w[\w ]*)\n-{3,}\n", r"\n**\1.**\n", doc)
    return doc.strip()


def _function_section(name: str) -> str:
    sf = FUNCTIONS[name]
    func = sf.raw
    lines = [f"### `{_sig_text(name, func)}`", "", _body(func.__doc__), ""]
    params = list(inspect.signature(func).parameters.values())
    if params:
        lines += ["| argument | default | description |", "|---|---|---|"]
        for p in params:
            default = "required" if p.default is inspect.Parameter.empty else "blank"
            if p.default not in (inspect.Parameter.empty, None):
                default = f"`{p.default!r}`"
            desc = _hint_doc(func, p.name).replace("|", "\\|")
            lines.append(f"| `{p.name}` | {default} | {desc} |")
        lines.append("")
    examples = _examples(func.__doc__ or "")
    if examples:
        lines += ["Examples: " + "; ".join(examples), ""]
    return "\n".join(lines)


def render() -> str:
    """The whole reference as Markdown text."""
    families: dict[str, list[str]] = {}
    for name, sf in FUNCTIONS.items():
        families.setdefault(sf.family, []).append(name)
    index = []
    for fam, names in families.items():
        index.append(f"* **{_FAMILY_TITLES.get(fam, fam)}**: " + ", ".join(f"`{n}`" for n in names))
    parts = [
        "# boreflow worksheet functions",
        "",
        "<!-- Generated by `python -m addin.sheets.docs` from the functions' docstrings and "
        "argument hints. Do not edit by hand. -->",
        "",
        textwrap.dedent(
            """\
            Spreadsheet functions for drilling-fluid and slurry hydraulics: type them into a
            cell, point them at a range of viscometer readings or geometry, and get PV, n, K,
            τy, a pressure loss, an ECD or a hole-cleaning indicator in your units.  Every
            number is computed by boreflow's `calc` package; the functions only translate
            cells to and from it.

            **Without the add-in** (macOS, Linux, LibreOffice, a file viewer):
            `boreflow sheets compute book.xlsx -o book-computed.xlsx` evaluates every `BF_…`
            formula headlessly (Python package `formulas`) and writes a copy in which every
            formula cell also stores its value.  Ordinary formulas are kept beside their
            values (so Excel with the functions still recomputes them); array formulas are
            stored as values and their text is listed on a sheet "BF array formulas",
            because LibreOffice recomputes array formulas on opening (`--keep-arrays` keeps
            them live).  The shipped `workbooks/demo-workbook.xlsx` is computed this way."""
        ),
        "",
        _ENABLE,
        _conventions(),
        "## Function index",
        "",
        *index,
        "",
    ]
    for fam, names in families.items():
        parts += [f"## {_FAMILY_TITLES.get(fam, fam)}", ""]
        parts += [_function_section(n) for n in names]
    return "\n".join(parts).rstrip() + "\n"


def main(argv: list[str] | None = None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    text = render()
    if "--check" in argv:
        current = DOC_PATH.read_text(encoding="utf-8") if DOC_PATH.exists() else ""
        if current != text:
            print(f"{DOC_PATH} is out of date: run python -m addin.sheets.docs", file=sys.stderr)
            return 1
        return 0
    DOC_PATH.parent.mkdir(parents=True, exist_ok=True)
    DOC_PATH.write_text(text, encoding="utf-8")
    print(f"wrote {DOC_PATH}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
