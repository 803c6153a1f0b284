"""``boreflow sheets compute``: a workbook of BF_ formulas computed headlessly, written as a copy
that stores every value; and the shipped demo workbook opened by LibreOffice shows numbers.

The values are checked against calc called directly (the same BF_ function evaluated by the
formula engine, PyPI ``formulas``, is an independent spreadsheet evaluator of the cell) and
against LibreOffice, a general-purpose spreadsheet program.  That Office Open XML stores a
formula and its last value side by side (``<c><f>…</f><v>…</v></c>``) is ECMA-376 Part 1,
§18.3.1.4 (c) and §18.3.1.40 (f); that openpyxl cannot write both is read from its cell
writer (it writes an empty ``<v/>`` after every formula) and checked below.
"""

from __future__ import annotations

import csv
import os
import subprocess
import sys
import tempfile
import zipfile
from pathlib import Path

import openpyxl
import pytest

from addin.commands.sheets import compute_file
from addin.report import recalc
from addin.sheets import engine
from calc import rheology as cr
from calc import units as cu

pytest.importorskip("formulas")

ROOT = Path(__file__).resolve().parents[1]
DEMO_BOOK = ROOT / "workbooks" / "demo-workbook.xlsx"
DIAL = {600: 56.0, 300: 37.0, 200: 29.0, 100: 20.0, 6: 8.0, 3: 7.0}  # invented readings


def _cli(*args):
    return subprocess.run(
        [sys.executable, "-m", "addin.cli", *map(str, args)],
        capture_output=True,
        text=True,
        env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"},
        timeout=300,
        check=False,
    )


def _small_book(path: Path) -> None:
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "Mud & rheology"
    for i, (rpm, dial) in enumerate(DIAL.items(), start=1):
        ws[f"A{i}"], ws[f"B{i}"] = rpm, dial
    ws["D1"] = "=BF_PV(A1:B6)"
    ws["D2"] = "=BF_YP(A1:B6)"
    ws["D3"] = "=D1*2"
    ws["D4"] = '=BF_CONVERT(1,"ppg","sg")'
    ws["D5"] = "=BF_VERSION()"
    ws["D6"] = "=1/0"
    ws["F1"] = openpyxl.worksheet.formula.ArrayFormula("F1:F2", "=BF_HB(A1:B6)")
    wb.save(path)


def test_openpyxl_cannot_store_a_value_with_a_formula(tmp_path):
    # the reason for the XML-level copy: openpyxl writes <f>…</f><v/> and nothing else
    p = tmp_path / "o.xlsx"
    _small_book(p)
    sheet = zipfile.ZipFile(p).read("xl/worksheets/sheet1.xml").decode()
    assert "<f>BF_PV(A1:B6)</f><v" in sheet
    assert openpyxl.load_workbook(p, data_only=True).active["D1"].value is None


def test_computed_copy_keeps_formulas_and_stores_values(tmp_path):
    src, out = tmp_path / "in.xlsx", tmp_path / "out.xlsx"
    _small_book(src)
    stored, errors = compute_file(src, out)
    r = cr.ViscometerReadings(list(DIAL), list(DIAL.values()))
    pv = cu.from_si(r.pv, "cP", "viscosity")  # calc.rheology: PV = θ600 − θ300 (API RP 13B-1)
    yp = cu.from_si(r.yp, cu.unit_for("stress", "oilfield"), "stress")
    assert pv == pytest.approx(19.0, rel=1e-12)  # 56 − 37, by hand
    vals = openpyxl.load_workbook(out, data_only=True)["Mud & rheology"]
    assert vals["D1"].value == pytest.approx(pv, rel=1e-12)
    assert vals["D2"].value == pytest.approx(yp, rel=1e-12)
    assert vals["D3"].value == pytest.approx(2 * pv, rel=1e-12)
    # 1 ppg in sg: 1 lb = 0.453 592 37 kg and 1 US gal = 3.785 411 784 L, both exact (NIST
    # SP 811, appendix B); sg referred to 1000 kg/m³, as calc.units defines it
    assert vals["D4"].value == pytest.approx(0.45359237 / 0.003785411784 / 1000, rel=1e-9)
    assert vals["D5"].value.startswith("boreflow ")
    assert vals["D6"].value == "#DIV/0!"
    assert vals["F1"].value is not None and vals["F2"].value is not None
    forms = openpyxl.load_workbook(out)["Mud & rheology"]
    assert forms["D1"].value == "=BF_PV(A1:B6)"  # the formula is kept beside its value
    assert forms["D3"].value == "=D1*2"
    assert forms["F1"].value == vals["F1"].value  # array formula → values …
    listed = openpyxl.load_workbook(out)[stored.formula_sheet]
    assert ("Mud & rheology", "F1:F2", "BF_HB(A1:B6)") in [
        tuple(row) for row in listed.iter_rows(min_row=3, values_only=True)
    ]  # … and its text listed
    assert ("Mud & rheology", "D6", "#DIV/0!") in errors
    with zipfile.ZipFile(out) as z:
        assert b"fullCalcOnLoad" not in z.read("xl/workbook.xml")
        assert z.read("xl/styles.xml") == zipfile.ZipFile(src).read("xl/styles.xml")


def test_keep_arrays_keeps_array_formulas(tmp_path):
    src, out = tmp_path / "in.xlsx", tmp_path / "out.xlsx"
    _small_book(src)
    stored, _ = compute_file(src, out, keep_arrays=True)
    assert stored.arrays == () and stored.formula_sheet is None
    ws = openpyxl.load_workbook(out)["Mud & rheology"]
    assert ws["F1"].value.text == "=BF_HB(A1:B6)"
    assert openpyxl.load_workbook(out, data_only=True).active["F2"].value is not None


def test_cli_exit_codes_and_atomic_write(tmp_path):
    src, out = tmp_path / "in.xlsx", tmp_path / "out.xlsx"
    _small_book(src)
    run = _cli("sheets", "compute", src, "-o", out)
    assert run.returncode == 0, run.stderr
    assert "formulas kept" in run.stdout and "BF array formulas" in run.stdout
    assert "Mud & rheology!D6 computes to #DIV/0!" in run.stderr
    before = out.read_bytes()
    run = _cli("sheets", "compute", src, "-o", out)
    assert run.returncode == 3 and "--force" in run.stderr
    assert out.read_bytes() == before
    assert _cli("sheets", "compute", src, "-o", out, "--force").returncode == 0
    junk = tmp_path / "junk.xlsx"
    junk.write_text("not a workbook")
    run = _cli("sheets", "compute", junk, "-o", tmp_path / "j.xlsx")
    assert run.returncode == 2 and "junk.xlsx" in run.stderr
    assert not (tmp_path / "j.xlsx").exists()
    run = _cli("sheets", "compute", src, "-o", tmp_path / "no" / "dir.xlsx")
    assert run.returncode == 4, run.stderr
    assert sorted(p.name for p in tmp_path.iterdir()) == ["in.xlsx", "junk.xlsx", "out.xlsx"]


def test_broken_sheet_is_refused_naming_sheet_and_row(tmp_path):
    src, bad = tmp_path / "in.xlsx", tmp_path / "bad.xlsx"
    _small_book(src)
    with zipfile.ZipFile(src) as zin, zipfile.ZipFile(bad, "w") as zout:
        for info in zin.infolist():
            data = zin.read(info)
            if info.filename == "xl/worksheets/sheet1.xml":
                data = data.replace(b"<v>37</v>", b"<v>nan</v>", 1)
            zout.writestr(info, data)
    run = _cli("sheets", "compute", bad, "-o", tmp_path / "o.xlsx")
    assert run.returncode == 2, run.stderr
    assert "bad.xlsx: sheet 'Mud & rheology' row 2" in run.stderr, run.stderr


def test_shipped_demo_workbook_stores_every_value():
    forms = openpyxl.load_workbook(DEMO_BOOK)
    vals = openpyxl.load_workbook(DEMO_BOOK, data_only=True)
    n = 0
    for ws in forms.worksheets:
        for row in ws.iter_rows():
            for c in row:
                if c.data_type == "f":
                    n += 1
                    v = vals[ws.title][c.coordinate].value
                    assert v is not None and not str(v).startswith("#"), (ws.title, c.coordinate)
    assert n >= 50
    assert engine.FORMULA_SHEET in forms.sheetnames


# ------------------------------------------------------------------ LibreOffice (as users have it)
def _libreoffice_csv(src: Path, outdir: Path) -> dict[str, list[list[str]]]:
    """Every sheet as CSV text, converted by LibreOffice with a fresh *default* profile (no
    recalculation setting changed: what a user who opens the file sees)."""
    with tempfile.TemporaryDirectory(prefix="bf-lo-default-") as prof:
        env = dict(os.environ, HOME=prof, SAL_USE_VCLPLUGIN="svp")
        subprocess.run(
            [
                recalc.soffice(),
                f"-env:UserInstallation={Path(prof).as_uri()}",
                "--headless",
                "--norestore",
                "--nologo",
                "--nodefault",
                "--nolockcheck",
                "--convert-to",
                # CSV filter options: comma, double quote, UTF-8, from line 1, ..., sheet -1 = all
                "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1",
                "--outdir",
                str(outdir),
                str(src),
            ],
            capture_output=True,
            timeout=240,
            env=env,
            check=False,
        )
    out = {}
    for p in outdir.glob(f"{src.stem}-*.csv"):
        with open(p, encoding="utf-8", newline="") as fh:
            out[p.stem[len(src.stem) + 1 :]] = list(csv.reader(fh))
    return out


@pytest.mark.libreoffice
@pytest.mark.skipif(
    recalc.soffice() is None,
    reason="LibreOffice headless not installed (Debian package libreoffice-calc-nogui)",
)
def test_libreoffice_shows_numbers_in_the_shipped_demo_workbook(tmp_path):
    src = tmp_path / "demo.xlsx"
    src.write_bytes(DEMO_BOOK.read_bytes())
    sheets = _libreoffice_csv(src, tmp_path / "csv")
    assert "Daily hydraulics" in sheets, sorted(sheets)
    forms = openpyxl.load_workbook(DEMO_BOOK)
    vals = openpyxl.load_workbook(DEMO_BOOK, data_only=True)
    checked = 0
    for title, grid in sheets.items():
        flat = [cell for row in grid for cell in row]
        assert not any(c.startswith(("#NAME", "Err:")) for c in flat), title
        if title not in forms.sheetnames:
            continue
        for row in forms[title].iter_rows():
            for c in row:
                if c.data_type != "f":
                    continue
                want = vals[title][c.coordinate].value
                got = grid[c.row - 1][c.column - 1]
                if isinstance(want, int | float):
                    # LibreOffice keeps the cell's number format in the CSV (percent, grouping)
                    text = got.replace(",", "")
                    num = float(text[:-1]) / 100 if text.endswith("%") else float(text)
                    assert num == pytest.approx(want, rel=1e-9), (title, c.coordinate, got)
                    checked += 1
    assert checked >= 40  # numbers where the BF_ formulas are


def test_macros_and_external_links_are_not_copied(tmp_path):
    """A macro-enabled book (xlwings imports the functions into a VBA module) is computed, but
    the copy carries neither the VBA project nor external links (ECMA-376 part names)."""
    src, bad, out = tmp_path / "in.xlsx", tmp_path / "macro.xlsm", tmp_path / "out.xlsx"
    _small_book(src)
    with zipfile.ZipFile(src) as zin, zipfile.ZipFile(bad, "w") as zout:
        for info in zin.infolist():
            data = zin.read(info)
            if info.filename == "[Content_Types].xml":
                data = data.replace(
                    b"application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml",
                    b"application/vnd.ms-excel.sheet.macroEnabled.main+xml",
                ).replace(
                    b"</Types>",
                    b'<Override PartName="/xl/vbaProject.bin" '
                    b'ContentType="application/vnd.ms-office.vbaProject"/></Types>',
                )
            if info.filename == "xl/_rels/workbook.xml.rels":
                data = data.replace(
                    b"</Relationships>",
                    b'<Relationship Id="rIdVba" Type="http://schemas.microsoft.com/office/2006/'
                    b'relationships/vbaProject" Target="vbaProject.bin"/></Relationships>',
                )
            zout.writestr(info, data)
        zout.writestr("xl/vbaProject.bin", b"\xd0\xcf\x11\xe0 not a real VBA project")
    stored, _ = compute_file(bad, out)
    assert stored.dropped == ("xl/vbaProject.bin",)
    with zipfile.ZipFile(out) as z:
        assert "xl/vbaProject.bin" not in z.namelist()
        assert b"vbaProject" not in z.read("xl/_rels/workbook.xml.rels")
        assert b"macroEnabled" not in z.read("[Content_Types].xml")
    assert openpyxl.load_workbook(out, data_only=True).active["D1"].value == pytest.approx(19.0)
