"""Every Summary number can be recomputed in Python from the Audit sheet alone.

The test opens the demo report (invented demo data), reads the Audit sheet's trace table, calls
the calc functions it names with only the inputs it lists (SI numbers, keys of the case file the
Audit names — its inputs hash checked — and the setup rows above), and compares the result with
the number the Summary shows, converted back to SI from the Summary's unit column.

Tolerance: relative 1e-9.  The recomputation is the same deterministic computation as the
report's, fed the same SI floats (written with ``repr``, which reads back exactly), so the only
difference is the Summary's SI → display-unit conversion and this test's conversion back (two
multiplications by exact NIST SP 811 factors, ~1e-16 each).  1e-9 leaves room for that and
nothing else: a wrong input, function or index changes the numbers far more.
"""

from __future__ import annotations

import math

import numpy
import openpyxl
import pytest

import addin.case
import calc.bit
import calc.circulation
import calc.cleaning
import calc.rate_window
import calc.surge
from addin.report.trace import TRACE
from calc.units import to_si
from tests._report_demo import DEMO, demo_report_path

RTOL = 1e-9
#: Summary columns of the traced columns (quantity A, value B, unit E, limit F, margin G,
#: required H; see addin/report/sheets.py::_key_results).
SUMMARY_COLUMN = {"value": 2, "limit": 6, "margin": 7, "required": 8}


@pytest.fixture(scope="module")
def workbook():
    return openpyxl.load_workbook(demo_report_path())


def _audit_info(ws) -> dict:
    info = {}
    for row in ws.iter_rows(min_row=2, max_row=8, max_col=2, values_only=True):
        if row[0]:
            info[row[0]] = row[1]
    return info


def _trace_table(ws) -> tuple[list[dict], list[dict]]:
    """(setup rows, quantity rows) of the Audit trace table, as dicts by header."""
    head = None
    for r in range(1, ws.max_row + 1):
        if ws.cell(r, 1).value == "quantity" and ws.cell(r, 5).value == "calc function":
            head = r
            break
    assert head is not None, "the Audit sheet has no trace table"
    names = [ws.cell(head, c).value for c in range(1, 11)]
    setup, rows = [], []
    for r in range(head + 1, ws.max_row + 1):
        cells = {names[c - 1]: ws.cell(r, c).value for c in range(1, 11)}
        if cells["quantity"] is None:
            break
        (setup if cells["column"] == "setup" else rows).append(cells)
    return setup, rows


def _summary(ws) -> dict[str, list]:
    """Summary key-results rows by quantity name: the cells of columns A..I."""
    out, inside = {}, False
    for r in range(1, ws.max_row + 1):
        a = ws.cell(r, 1).value
        if a == "quantity":
            inside = True
            continue
        if inside and isinstance(a, str) and ws.cell(r, 2).value is not None:
            out[a] = [ws.cell(r, c).value for c in range(1, 10)]
        elif inside and a is None and out:
            break
    return out


def _namespace(audit, setup) -> dict:
    """Build the setup objects exactly as the Audit lists them."""
    ns = {"calc": calc, "numpy": numpy, "addin": addin, "__builtins__": {}}
    for s in setup:
        if s["quantity"] == "case":
            assert s["calc function"] == "addin.case.load_case"
            assert s["inputs"] == repr(audit["case source"]) == repr(DEMO.name)
            case = addin.case.load_case(DEMO)
            assert case.hash == audit["inputs hash (SHA-256 of the canonical case)"]
            ns["case"] = case
            continue
        ns[s["quantity"]] = eval(f"{s['calc function']}({s['inputs']})", ns)
    return ns


def _recompute(ns, row):
    fn = row["calc function"]
    if fn.startswith("@"):
        ret = ns[fn[1:]]
    else:
        ret = eval(f"{fn}({row['inputs'] or ''})", ns)
    return eval(row["result"], {**ns, "_": ret})


def test_every_summary_number_is_recomputed_from_the_audit_sheet(workbook):
    audit_ws, summary_ws = workbook["Audit"], workbook["Summary"]
    audit = _audit_info(audit_ws)
    setup, rows = _trace_table(audit_ws)
    summary = _summary(summary_ws)
    ns = _namespace(audit, setup)
    checked = 0
    for row in rows:
        assert row["calc function"] != "untraced", f"untraced Summary row: {row['quantity']}"
        shown = summary[row["quantity"]]
        got = _recompute(ns, row)
        cell = shown[SUMMARY_COLUMN[row["column"]] - 1]
        if isinstance(cell, str):  # a text result (the cleaning verdict): the worst interval
            verdicts = set(numpy.atleast_1d(got).tolist())
            worst = next(v for v in ("poor", "marginal", "adequate") if v in verdicts)
            assert cell == worst, row["quantity"]
            continue
        unit = shown[4]
        got_si = float(numpy.asarray(got, dtype=float).reshape(-1)[0])
        assert math.isclose(float(row["value (SI)"]), got_si, rel_tol=RTOL), row
        want_si = to_si(float(cell), unit) if unit and unit != "–" else float(cell)
        assert math.isclose(want_si, got_si, rel_tol=RTOL, abs_tol=1e-9), (
            row["quantity"],
            row["column"],
            want_si,
            got_si,
        )
        checked += 1
    # demo: SPP, measured SPP, shoe (4), bit (4), tightest (2), ESD, PWD (2), hydrostatic, bit
    # drop, HSI, annular velocity, window ends (2), trip limits (2)
    assert checked >= 20


def test_every_summary_row_has_a_trace_entry(workbook):
    """A new Summary row needs a TRACE entry (addin/report/trace.py); the Audit lists it."""
    names = list(_summary(workbook["Summary"]))
    assert len(names) >= 15
    untraced = [n for n in names if not any(n.startswith(e.match) for e in TRACE)]
    assert not untraced, f"Summary rows without a trace entry: {untraced}"
    _, rows = _trace_table(workbook["Audit"])
    assert set(names) == {r["quantity"] for r in rows}


def test_trace_lists_each_quantity_with_method_status_and_equation(workbook):
    _, rows = _trace_table(workbook["Audit"])
    for row in rows:
        assert row["equation"].startswith("calc/METHODS.md §") or row["method"] == "case input"
        if row["method"] != "case input":
            assert row["status"], row
