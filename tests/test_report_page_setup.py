"""Every generated workbook prints on the pages it means to (issue 14): print area, fit to one
page wide, repeated header rows, landscape where wide — the report, the demo workbook and the
input template (the committed files, rebuilt by their scripts)."""

from __future__ import annotations

import openpyxl
import pytest

from tests._report_demo import ROOT, demo_report_path


def _check(ws):
    ps = ws.page_setup
    assert ws.sheet_properties.pageSetUpPr.fitToPage, ws.title
    assert ps.fitToWidth == 1, ws.title
    assert ws.print_area, ws.title
    assert ws.oddFooter.right.text == "page &P of &N", ws.title


@pytest.mark.parametrize("name", ["demo-workbook.xlsx", "input-template.xlsx"])
def test_committed_workbooks_have_page_setup(name):
    wb = openpyxl.load_workbook(ROOT / "workbooks" / name)
    for ws in wb.worksheets:
        if ws.title in ("xlwings.conf", "BF array formulas"):
            # xlwings' settings sheet; the list of array formulas that `sheets compute` adds at
            # the XML level (a reference list, not printed with the workbook)
            continue
        _check(ws)
        assert ws.print_title_rows, ws.title
        wide = ws.max_column > 8
        assert ws.page_setup.orientation == ("landscape" if wide else "portrait"), ws.title


def test_report_sheets_have_page_setup():
    wb = openpyxl.load_workbook(demo_report_path())
    for ws in wb.worksheets:
        _check(ws)


def test_inputs_hash_is_not_cut_off():
    """The Inputs sheet's source and hash line wraps inside a merged range, so the 64 hex
    digits of the SHA-256 are printed whole."""
    from tests._report_demo import demo_results

    ws = openpyxl.load_workbook(demo_report_path())["Inputs"]
    text = ws.cell(row=2, column=1).value
    assert demo_results().case.hash in text and len(demo_results().case.hash) == 64
    assert any(str(r).startswith("A2:") for r in ws.merged_cells.ranges)
    assert ws.cell(row=2, column=1).alignment.wrap_text
