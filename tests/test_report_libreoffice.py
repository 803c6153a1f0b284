"""The generated report recalculates in LibreOffice headless to the numbers boreflow wrote.

Every live formula is recomputed by a real spreadsheet program (throwaway profile, OOXML
recalculation "always"; see addin/report/recalc.py and its own test) and must reproduce the
plain number beside it; no formula may end in a spreadsheet error (#NAME? and friends).
"""

from __future__ import annotations

import math

import openpyxl
import pytest
from _report_demo import demo_report_path

from addin.report import recalc

pytestmark = [
    pytest.mark.libreoffice,
    pytest.mark.skipif(
        recalc.soffice() is None,
        reason="LibreOffice headless not installed (Debian package libreoffice-calc-nogui)",
    ),
]


def test_every_live_formula_reproduces_boreflows_value(tmp_path):
    src = demo_report_path()
    out = recalc.recalculate(src, tmp_path)
    values = recalc.recalculated_values(src, out)
    wb = openpyxl.load_workbook(src)
    checked = agreed = 0
    for (sheet, coord), got in values.items():
        cell = wb[sheet][coord]
        assert not (
            isinstance(got, str) and (got in recalc.ERROR_VALUES or got.startswith("Err:"))
        ), (sheet, coord, got)
        if cell.value.startswith("=IF(ABS("):
            assert got == "agrees", (sheet, coord, cell.value)
            agreed += 1
            continue
        want = wb[sheet].cell(row=cell.row, column=cell.column - 1).value
        assert isinstance(got, int | float), (sheet, coord, cell.value, got)
        assert math.isclose(got, want, rel_tol=1e-9, abs_tol=1e-12), (sheet, coord, cell.value)
        checked += 1
    assert checked >= 20 and agreed == checked
