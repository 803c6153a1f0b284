"""Input-workbook and report-cell findings of the hostile-input review, each reproduced.

* a ``<dimension>`` tag that understates the used range must not drop data (openpyxl's
  read-only mode trusts the tag: the reader resets it);
* text from a case that a spreadsheet reads as a formula (OWASP "CSV injection" list: text
  starting with = + - @) is stored as text *with* the quote-prefix flag in the written file;
* a workbook storing too many cells is refused, quickly, before openpyxl loads it;
* a cell ``<v>nan</v>``, an invalid XML character and an undefined entity give exit 2 naming
  the sheet (and cell), not exit 1.

The file format facts used (``<dimension ref>``, ``<c><v>``, ``quotePrefix`` on a ``<xf>``) are
those of ECMA-376 Part 1, §18.3.1 (worksheet) and §18.8.45 (xf).
"""

from __future__ import annotations

import re
import subprocess
import sys
import time
import tomllib
import zipfile
from pathlib import Path

import openpyxl
import pytest

from addin import workbook_input as wi
from addin.workbook_layout import WorkbookError
from addin.workbook_template import write_case_sheets
from addin.xlsx_cells import add_styles, put

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "workbooks" / "demo-case.toml"
TEMPLATE = ROOT / "workbooks" / "input-template.xlsx"
ATTACK = "=cmd|' /C calc'!A0"


def _rewrite(src: Path, dst: Path, edit) -> None:
    """Copy an .xlsx, passing every worksheet's XML text through ``edit(name, xml)``."""
    with zipfile.ZipFile(src) as zin, zipfile.ZipFile(dst, "w", zipfile.ZIP_DEFLATED) as zout:
        for info in zin.infolist():
            data = zin.read(info)
            if info.filename.startswith("xl/worksheets/") and info.filename.endswith(".xml"):
                data = edit(info.filename, data.decode("utf-8")).encode("utf-8")
            zout.writestr(info, data)


def _cli(*args, cwd=None):
    return subprocess.run(
        [sys.executable, "-m", "addin.cli", *map(str, args)],
        capture_output=True,
        text=True,
        cwd=cwd,
        env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"},
        timeout=300,
        check=False,
    )


# ------------------------------------------------------------------ understated dimension
def test_understated_dimension_drops_no_data(tmp_path):
    bad = tmp_path / "dim.xlsx"
    _rewrite(
        TEMPLATE, bad, lambda _, x: re.sub(r'<dimension ref="[^"]*"', '<dimension ref="A1:B3"', x)
    )
    # the tag really understates: openpyxl read-only without the reset sees only A1:B3
    raw = openpyxl.load_workbook(bad, read_only=True)
    assert raw["Mud checks"].max_row == 3
    raw.close()
    want, _ = wi.read_blocks(TEMPLATE)
    got, _ = wi.read_blocks(bad)
    assert got == want
    assert [c["label"] for c in got["check"]] == [c["label"] for c in want["check"]]
    assert len(got["check"]) == 2  # both mud checks of the demo (the second one is today's)


# ------------------------------------------------------------------ formula-like text
def test_put_keeps_quote_prefix_in_the_written_file(tmp_path):
    wb = openpyxl.Workbook()
    add_styles(wb)
    ws = wb.active
    for i, text in enumerate((ATTACK, "+1", "-A1", "@SUM(1)", "plain"), start=1):
        put(ws, i, 1, text, "bf_cell")
    p = tmp_path / "q.xlsx"
    wb.save(p)
    back = openpyxl.load_workbook(p).active
    for i in range(1, 5):
        c = back.cell(row=i, column=1)
        assert c.data_type == "s" and c.quotePrefix, (c.coordinate, c.value, c.quotePrefix)
    assert back["A1"].value == ATTACK
    assert not back["A5"].quotePrefix
    with zipfile.ZipFile(p) as z:
        sheet = z.read("xl/worksheets/sheet1.xml").decode()
        styles = z.read("xl/styles.xml").decode()
    assert "<f>" not in sheet  # stored as a string, never as a formula
    assert 'quotePrefix="1"' in styles


def test_report_keeps_case_text_as_text(tmp_path):
    text = DEMO.read_text(encoding="utf-8")
    title = tomllib.loads(text)["case"]["title"]
    case = tmp_path / "hostile.toml"
    case.write_text(text.replace(f'"{title}"', '"' + ATTACK.replace("'", "'") + '"', 1))
    assert tomllib.loads(case.read_text())["case"]["title"] == ATTACK
    out = tmp_path / "r.xlsx"
    run = _cli("report", case, "-o", out)
    assert run.returncode == 0, run.stderr
    wb = openpyxl.load_workbook(out)
    found = [c for ws in wb.worksheets for row in ws.iter_rows() for c in row if c.value == ATTACK]
    assert found, "the case title should appear in the report"
    for c in found:
        assert c.data_type == "s" and c.quotePrefix, (c.parent.title, c.coordinate)


# ------------------------------------------------------------------ too many cells
def _many_cells(path: Path, rows: int, cols: int) -> None:
    from openpyxl.utils import get_column_letter

    letters = [get_column_letter(c) for c in range(1, cols + 1)]
    body = "".join(
        f'<row r="{r}">'
        + "".join(f'<c r="{L}{r}"><v>{r * 7 + j}</v></c>' for j, L in enumerate(letters))
        + "</row>"
        for r in range(1, rows + 1)
    )
    _rewrite(
        TEMPLATE,
        path,
        lambda name, x: (
            re.sub(
                r"<sheetData>.*?</sheetData>|<sheetData\s*/>",
                f"<sheetData>{body}</sheetData>",
                x,
                flags=re.S,
            )
            if name.endswith("sheet1.xml")
            else x
        ),
    )


def test_too_many_stored_cells_refused_before_loading(tmp_path):
    p = tmp_path / "many.xlsx"
    _many_cells(p, 30, 40)  # 1,200 cells on the first sheet
    with pytest.raises(WorkbookError, match=r"sheet 'Read me'.*stored cells"):
        wi.read_blocks(p, limits=wi.Limits(max_stored_cells=1000))
    assert wi.count_stored_cells(TEMPLATE) < 2000  # the real template passes easily


def test_million_cell_workbook_exits_2_quickly(tmp_path):
    p = tmp_path / "huge.xlsx"
    _many_cells(p, 1100, 1000)  # 1.1 million cells; ~1 MB zipped, ratio under the bomb guard
    t0 = time.perf_counter()
    run = _cli("report", p, "-o", tmp_path / "r.xlsx")
    dt = time.perf_counter() - t0
    assert run.returncode == 2, run.stderr
    assert "huge.xlsx: sheet 'Read me'" in run.stderr and "stored cells" in run.stderr
    assert dt < 30, dt  # the guard streams the XML; loading such a file took minutes
    assert not (tmp_path / "r.xlsx").exists()


# ------------------------------------------------------------------ broken cells and XML
def _first_number_to(value: str):
    def edit(name, x):
        if not name.endswith("sheet2.xml"):  # "Well"
            return x
        return x.replace(
            '<c r="D12" s="7" t="n"><v>0.5</v>', f'<c r="D12" s="7" t="n"><v>{value}</v>', 1
        )

    return edit


@pytest.mark.parametrize(
    "edit, expect",
    [
        (_first_number_to("nan"), "sheet 'Well' row 12"),
        (_first_number_to("inf"), "sheet 'Well' row 12"),
        (
            lambda n, x: x.replace("<t>", "<t>\x01", 1) if n.endswith("sheet2.xml") else x,
            "sheet 'Well'",
        ),
        (
            lambda n, x: x.replace("<t>", "<t>&bogus;", 1) if n.endswith("sheet2.xml") else x,
            "sheet 'Well'",
        ),
    ],
    ids=["nan", "inf", "control-char", "undefined-entity"],
)
def test_broken_cells_exit_2_naming_sheet(tmp_path, edit, expect):
    p = tmp_path / "bad.xlsx"
    _rewrite(TEMPLATE, p, edit)
    with zipfile.ZipFile(p) as z:  # the damage is really in the file
        assert z.read("xl/worksheets/sheet2.xml") != zipfile.ZipFile(TEMPLATE).read(
            "xl/worksheets/sheet2.xml"
        )
    run = _cli("report", p, "-o", tmp_path / "r.xlsx")
    assert run.returncode == 2, (run.returncode, run.stderr)
    assert "bad.xlsx" in run.stderr and expect in run.stderr, run.stderr
    assert "internal error" not in run.stderr
    assert not (tmp_path / "r.xlsx").exists()


def test_hostile_protections_still_hold(tmp_path):
    """Entity expansion ("billion laughs", as defusedxml documents it) stays refused."""
    bomb = '<!DOCTYPE worksheet [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;">]>'

    def edit(n, x):
        if not n.endswith("sheet2.xml"):
            return x
        return bomb + x.replace("<t>", "<t>&b;", 1)

    p = tmp_path / "ent.xlsx"
    _rewrite(TEMPLATE, p, edit)
    assert b"<!ENTITY" in zipfile.ZipFile(p).read("xl/worksheets/sheet2.xml")
    run = _cli("report", p, "-o", tmp_path / "r.xlsx")
    assert run.returncode == 2 and "ent.xlsx" in run.stderr, run.stderr
    assert "internal error" not in run.stderr
    assert not (tmp_path / "r.xlsx").exists()


def test_demo_written_by_the_template_writer_still_reads(tmp_path):
    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    wb = openpyxl.Workbook()
    wb.remove(wb.active)
    write_case_sheets(wb, doc)
    wb.save(tmp_path / "c.xlsx")
    back, _ = wi.read_blocks(tmp_path / "c.xlsx")
    assert back["case"]["title"] == doc["case"]["title"]
