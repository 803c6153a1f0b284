"""The LibreOffice harness itself: stale cached values are replaced, bad input is detected.

These checks guard the recalculation test of the report: if the throwaway profile failed to set
"always recalculate", a stale cached value would survive and the report test would pass
vacuously.
"""

from __future__ import annotations

import zipfile

import openpyxl
import pytest

from addin.report import recalc

pytestmark = [
    pytest.mark.libreoffice,
    pytest.mark.skipif(
        recalc.soffice() is None,
        reason="LibreOffice headless not installed (Debian package libreoffice-calc-nogui)",
    ),
]


def _with_stale_cache(path, sheet_xml: str, formula: str, stale: str):
    with zipfile.ZipFile(path) as z:
        items = {n: z.read(n) for n in z.namelist()}
    s = items[sheet_xml].decode()
    old = f"<f>{formula}</f><v />"
    assert old in s, "openpyxl output changed; adapt the stale-cache injection"
    items[sheet_xml] = s.replace(old, f"<f>{formula}</f><v>{stale}</v>").encode()
    with zipfile.ZipFile(path, "w") as z:
        for n, d in items.items():
            z.writestr(n, d)


def test_stale_cached_value_is_recalculated(tmp_path):
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Sheet with space"
    ws["A1"] = 21
    ws["A2"] = "=A1*2"
    ws["A3"] = "=NOSUCHFUNCTION(A1)"
    other = wb.create_sheet("Other")
    other["B2"] = "='Sheet with space'!A2+1"
    src = tmp_path / "stale.xlsx"
    wb.save(src)
    _with_stale_cache(src, "xl/worksheets/sheet1.xml", "A1*2", "999")
    # the file really carries the stale value before recalculation
    assert openpyxl.load_workbook(src, data_only=True).active["A2"].value == 999
    out = recalc.recalculate(src, tmp_path / "lo")
    vals = recalc.recalculated_values(src, out)
    assert vals[("Sheet with space", "A2")] == 42  # 2 × 21, exact
    assert vals[("Other", "B2")] == 43
    assert vals[("Sheet with space", "A3")] == "#NAME?"  # unknown names are flagged, not hidden


def test_garbage_input_raises_despite_exit_status_zero(tmp_path):
    bad = tmp_path / "garbage.xlsx"
    bad.write_text("this is not a workbook")
    with pytest.raises(recalc.RecalcError, match="produced no xlsx"):
        recalc.recalculate(bad, tmp_path / "lo")
