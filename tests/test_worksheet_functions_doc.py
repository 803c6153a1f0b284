"""workbooks/worksheet-functions.md stays true: it is the output of its generator, and every
example call it prints (`=BF_X(…)` → `result`) is computed again here in a workbook, by the
headless formula engine, as a spreadsheet would compute the cell."""

from __future__ import annotations

import re

import pytest
from _report_demo import ROOT

pytest.importorskip("formulas")
openpyxl = pytest.importorskip("openpyxl")

from addin.sheets import docs  # noqa: E402
from addin.sheets.engine import calculate  # noqa: E402

DOC_PATH = ROOT / "workbooks" / "worksheet-functions.md"
DOC = DOC_PATH.read_text(encoding="utf-8")
EXAMPLE = re.compile(r"`(=BF_\w+\(.*?\))` → `(.*?)`")


def _examples():
    out = []
    for k, line in enumerate(DOC.splitlines(), start=1):
        if line.startswith("Examples:"):
            out += [(k, f, r) for f, r in EXAMPLE.findall(line)]
    return out


def test_reference_is_generated_from_the_code():
    assert DOC == docs.render(), (
        "workbooks/worksheet-functions.md is stale: regenerate it with "
        "`python -m addin.sheets.docs` (its examples come from the functions' doctests)"
    )


def test_printed_examples_compute_in_a_workbook(tmp_path):
    examples = _examples()
    assert len(examples) >= 4
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "EX"
    for i, (_, formula, _) in enumerate(examples, start=1):
        ws[f"A{i}"] = formula
    path = tmp_path / "examples.xlsx"
    wb.save(path)
    cells = calculate(path)
    for i, (line, formula, shown) in enumerate(examples, start=1):
        got = cells[("EX", f"A{i}")]
        if isinstance(got, float):
            decimals = len(shown.split(".")[1]) if "." in shown else 0
            fresh = f"{got:.{decimals}f}"
        else:
            fresh = str(got)
        assert fresh == shown, (
            f"worksheet-functions.md line {line}: {formula} prints {shown}, a workbook now "
            f"computes {got!r}: fix the function's doctest and regenerate"
        )
