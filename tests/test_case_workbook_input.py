"""Input workbook: hostile or broken files are refused with a one-line message naming the place.

External references: the zip-bomb guard follows the idea of D. Fifield, "A better zip bomb"
(USENIX WOOT 2019): the uncompressed size and compression ratio are checked before parsing;
XML entity attacks ("billion laughs", external entities) are the ones defusedxml documents.
"""

from __future__ import annotations

import tomllib
import zipfile
from pathlib import Path

import openpyxl
import pytest

from addin import workbook_input as wi
from addin import workbook_layout as wl
from addin.workbook_template import write_case_sheets

ROOT = Path(__file__).resolve().parents[1]
DEMO = ROOT / "workbooks" / "demo-case.toml"


def _norm(x):
    if isinstance(x, dict):
        return {k: _norm(v) for k, v in x.items()}
    if isinstance(x, list):
        return [_norm(v) for v in x]
    if isinstance(x, int | float) and not isinstance(x, bool):
        return float(x)
    return x


def _demo_workbook(path: Path) -> dict:
    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    wb = openpyxl.Workbook()
    wb.remove(wb.active)
    write_case_sheets(wb, doc)
    wb.save(path)
    return doc


def test_demo_case_round_trips_through_the_workbook_layout(tmp_path):
    doc = _demo_workbook(tmp_path / "c.xlsx")
    back, where = wi.read_blocks(tmp_path / "c.xlsx")
    assert _norm(back) == _norm(doc)
    assert where["check[2].dial.600"].startswith("c.xlsx: Mud checks!E")  # 2nd check: column E


def test_committed_template_carries_the_demo_case():
    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    back, _ = wi.read_blocks(ROOT / "workbooks" / "input-template.xlsx")
    assert _norm(back) == _norm(doc), "rebuild with python3 workbooks/build_input_template.py"


def test_changed_unit_cell_becomes_a_per_value_unit(tmp_path):
    p = tmp_path / "c.xlsx"
    _demo_workbook(p)
    wb = openpyxl.load_workbook(p)
    ws = wb["Mud checks"]
    for row in ws.iter_rows():
        if row[1].value == "density":
            row[2].value = "sg"
            row[3].value = 1.32
    wb.save(p)
    back, _ = wi.read_blocks(p)
    assert back["check"][0]["density"] == "1.32 sg"


def test_not_a_workbook(tmp_path):
    p = tmp_path / "x.xlsx"
    p.write_text("name,value\nwell,1\n")
    with pytest.raises(wl.WorkbookError, match="not a workbook"):
        wi.read_blocks(p)


def test_zip_that_is_not_xlsx(tmp_path):
    p = tmp_path / "x.xlsx"
    with zipfile.ZipFile(p, "w") as z:
        z.writestr("hello.txt", "hi")
    with pytest.raises(wl.WorkbookError, match=r"xl/workbook\.xml"):
        wi.read_blocks(p)


def test_zip_bomb_member_is_refused_before_parsing(tmp_path):
    p = tmp_path / "bomb.xlsx"
    with zipfile.ZipFile(p, "w", compression=zipfile.ZIP_DEFLATED) as z:
        z.writestr("xl/workbook.xml", "<workbook/>")
        z.writestr("xl/worksheets/sheet1.xml", b"\0" * 50_000_000)  # ratio ~1000:1
    with pytest.raises(wl.WorkbookError, match="zip-bomb guard"):
        wi.read_blocks(p)


def test_oversized_file_is_refused(tmp_path):
    p = tmp_path / "c.xlsx"
    _demo_workbook(p)
    with pytest.raises(wl.WorkbookError, match="at most 1000 bytes"):
        wi.read_blocks(p, limits=wi.Limits(max_file_bytes=1000))


def test_too_many_cells_is_refused(tmp_path):
    p = tmp_path / "big.xlsx"
    wb = openpyxl.Workbook()
    ws = wb.active
    for _ in range(300):
        ws.append(list(range(50)))
    wb.save(p)
    with pytest.raises(wl.WorkbookError, match="cells"):
        wi.read_blocks(p, limits=wi.Limits(max_cells=10_000))


def test_entity_expansion_is_refused(tmp_path):
    """A 'billion laughs' payload in the shared strings must not be expanded."""
    p = tmp_path / "c.xlsx"
    _demo_workbook(p)
    bomb = (
        '<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol">'
        '<!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;&lol;">]>'
        '<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" count="1" '
        'uniqueCount="1"><si><t>&lol2;</t></si></sst>'
    )
    with zipfile.ZipFile(p) as z:
        items = {n: z.read(n) for n in z.namelist()}
    # openpyxl writes inline strings; put the payload in the workbook part itself
    items["xl/workbook.xml"] = bomb.replace("sst", "workbook").encode()
    with zipfile.ZipFile(p, "w") as z:
        for n, d in items.items():
            z.writestr(n, d)
    with pytest.raises(wl.WorkbookError, match="unreadable") as err:
        wi.read_blocks(p)
    assert "Entities" in str(err.value) or "DTD" in str(err.value)  # defusedxml refused it


def test_macro_workbook_is_read_without_its_vba(tmp_path):
    p = tmp_path / "c.xlsm"
    _demo_workbook(p)
    with zipfile.ZipFile(p, "a") as z:
        z.writestr("xl/vbaProject.bin", b"\xd0\xcf\x11\xe0 not run")
    wb = wi.open_workbook_safely(p)
    assert getattr(wb, "vba_archive", None) is None  # keep_vba=False drops the project
    wb.close()
    back, _ = wi.read_blocks(p)
    assert back["case"]["well"] == "DEMO-A1 (fictitious)"


def test_formula_without_stored_value_is_an_error_not_a_guess(tmp_path):
    p = tmp_path / "c.xlsx"
    _demo_workbook(p)
    wb = openpyxl.load_workbook(p)
    ws = wb["Mud checks"]
    for row in ws.iter_rows():
        if row[1].value == "density":
            row[3].value = "=10+1"  # openpyxl stores no cached value
    wb.save(p)
    back, _ = wi.read_blocks(p)
    # read as stored values: the formula gives no value, so the key is simply absent and the
    # case validation reports the missing density naming the cell (see test_case_*.py)
    assert "density" not in back["check"][0]


def test_unknown_block_and_key_suggest_the_nearest(tmp_path):
    p = tmp_path / "c.xlsx"
    _demo_workbook(p)
    wb = openpyxl.load_workbook(p)
    wb["Well"]["A1"].value = "§ caes  Case"
    wb.save(p)
    with pytest.raises(wl.WorkbookError, match=r"Well!A1.*did you mean 'case'"):
        wi.read_blocks(p)
    wb["Well"]["A1"].value = "§ case  Case"
    for row in wb["Rig and string"].iter_rows():
        if row[1].value == "discharge_coefficient":
            row[1].value = "discharge_coeficient"
    wb.save(p)
    with pytest.raises(wl.WorkbookError, match=r"did you mean 'discharge_coefficient'"):
        wi.read_blocks(p)


def test_spreadsheet_error_value_is_refused(tmp_path):
    p = tmp_path / "c.xlsx"
    _demo_workbook(p)
    wb = openpyxl.load_workbook(p)
    for row in wb["Rig and string"].iter_rows():
        if row[1].value == "size":
            row[3].value = "#DIV/0!"
    wb.save(p)
    with pytest.raises(wl.WorkbookError, match="Rig and string!D"):
        wi.read_blocks(p)


def test_every_case_key_has_a_workbook_label_and_every_label_a_case_key():
    """The workbook layout is derived from the case schema (addin.case_schema.SECTIONS); it adds
    labels.

    A case key without a row label, or a label for a key the case schema no longer has, fails.
    """
    from addin.case_schema import SECTIONS

    assert set(wl.BLOCKS) == set(SECTIONS), "each case section is a workbook block"
    for block in wl.LAYOUT:
        labels = wl.LABELS[block.key]
        for f in block.fields:
            base = f.key.split("[")[0].removesuffix(".*")
            stem = base.rsplit(".", 1)[0] if base.rsplit(".", 1)[-1].isdigit() else base
            assert stem in labels, f"case key {block.key}.{f.key} has no workbook label"
        used = {f.key.split("[")[0].removesuffix(".*") for f in block.fields}
        used |= {k.rsplit(".", 1)[0] for k in used}
        stale = [k for k in labels if k not in used]
        assert not stale, f"labels for keys not in the case schema of {block.key}: {stale}"


def test_workbook_kinds_come_from_the_case_schema():
    """A quantity key reads and writes in the unit of the kind the case schema gives it."""
    from addin.case_schema import SECTIONS

    assert (
        wl.BLOCKS["limits"].by_key["surface_rating"].kind
        == SECTIONS["limits"][1]["surface_rating"].kind
    )
    program = SECTIONS["check"][1]["program"].sub["pv"]
    assert wl.BLOCKS["check"].by_key["program.pv[1]"].kind == program.of == "viscosity"
    assert wl.BLOCKS["string"].by_key["float_valve"].kind == "flag"  # case kind "bool"
    assert wl.BLOCKS["tool_pressure"].by_key["flow_window"].many


def test_nozzle_sizes_labelled_in_32nds_in_every_unit_system():
    # the case file reads nozzle sizes as whole 32nds of an inch (trade use, common practice),
    # so a metric workbook must not label them mm
    from addin.workbook_layout import unit_labels

    for system in ("oilfield", "metric", "si"):
        assert unit_labels(system)("nozzle") == "1/32 in"
