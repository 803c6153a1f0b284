"""Text fits its cell on every sheet of the demo report (issue 14: "ABOVE PROGRAMME" cut,
"0.50OK", labels running into the next cell; invented demo data).

Generic check, independent of the fitting code's bookkeeping: a text cell longer than its
column (9-pt Arial ≈ 0.85 width units per character, judged on LibreOffice-rendered pages)
must wrap, unless it is long text with an empty right neighbour (it then overflows into it);
a wrapped cell's row is tall enough for its lines; text right after a number is indented.
"""

from __future__ import annotations

import openpyxl
import pytest
from openpyxl import Workbook

from addin.report.style import LINE_HEIGHT, fit_text, overflowing_cells, wrapped_lines
from tests._report_demo import demo_report_path


@pytest.fixture(scope="module")
def wb():
    return openpyxl.load_workbook(demo_report_path())


def test_no_text_cell_is_cut_or_runs_into_its_neighbour(wb):
    bad = [
        f"{ws.title}!{c.coordinate}: {c.value[:40]!r}" for ws in wb for c in overflowing_cells(ws)
    ]
    assert not bad, "\n".join(bad)


def test_wrapped_rows_are_tall_enough(wb):
    bad = []
    for ws in wb:
        merged = {(r, c) for m in ws.merged_cells.ranges for r in range(m.min_row, m.max_row + 1)
                  for c in range(m.min_col, m.max_col + 1)}  # fmt: skip
        for row in ws.iter_rows():
            for c in row:
                if (isinstance(c.value, str) and not c.value.startswith("=")
                        and c.alignment.wrap_text and (c.row, c.column) not in merged):  # fmt: skip
                    h = ws.row_dimensions[c.row].height or 12.75
                    if wrapped_lines(ws, c) * LINE_HEIGHT > h:
                        bad.append(f"{ws.title}!{c.coordinate}")
    assert not bad, bad


def test_status_words_fit_and_follow_numbers_with_a_gap(wb):
    ws = wb["Summary"]
    for row in ws.iter_rows():
        for c in row:
            if c.value in ("ABOVE PROGRAMME", "BELOW PROGRAMME", "OUTSIDE LIMIT"):
                assert ws.column_dimensions[c.column_letter].width >= 15 * 0.85
            left = ws.cell(c.row, c.column - 1).value if c.column > 1 else None
            if isinstance(c.value, str) and isinstance(left, float) and c.style == "bf_cell":
                assert c.alignment.indent >= 1 or c.alignment.horizontal in ("center", "right")


def test_fit_text_on_a_hand_made_sheet():
    ws = Workbook().active
    ws.column_dimensions["A"].width = 10
    ws.column_dimensions["B"].width = 6
    ws["A1"] = "a long label that cannot fit in ten units"
    ws["B1"] = 1.0
    ws["B2"] = 0.5
    ws["C2"] = "ABOVE PROGRAMME"
    ws["A3"] = "long text, empty neighbour: overflows"
    assert {c.coordinate for c in overflowing_cells(ws)} == {"A1", "C2"}
    fit_text(ws)
    assert ws["A1"].alignment.wrap_text and ws.row_dimensions[1].height >= 3 * LINE_HEIGHT
    assert ws.column_dimensions["C"].width >= 15 * 0.85 and ws["C2"].alignment.indent == 1
    assert not ws["A3"].alignment.wrap_text and overflowing_cells(ws) == []
