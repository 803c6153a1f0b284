"""Round trip: the inputs echoed in the report parse back to the same case; TOML and workbook
give the same calc inputs."""

from __future__ import annotations

import numpy as np
import openpyxl
from _report_demo import DEMO, ROOT, demo_report_path, demo_results

from addin.case import load_case, parse_case
from addin.workbook_input import read_blocks


def test_report_inputs_parse_back_to_the_same_case():
    case = demo_results().case
    doc, where = read_blocks(demo_report_path())
    back = parse_case(doc, "report")
    assert back.hash == case.hash
    assert where["check[2].density"].split(": ")[1].startswith("Inputs!")


def test_toml_and_workbook_build_the_same_well():
    a = load_case(DEMO)
    b = load_case(ROOT / "workbooks" / "input-template.xlsx")
    assert a.hash == b.hash
    ia, ib = a.well().flow_intervals(), b.well().flow_intervals()
    for name in ("top_md", "bottom_md", "outer_diameter", "inner_diameter", "top_tvd"):
        np.testing.assert_array_equal(getattr(ia, name), getattr(ib, name))
    assert a.checks[-1].readings.pv == b.checks[-1].readings.pv


def test_text_with_formula_triggers_stays_text_in_the_report(tmp_path):
    """A well name starting with '=' (OWASP CSV-injection trigger) is echoed as text."""
    import tomllib

    from addin.report import compute, write_report

    doc = tomllib.loads(DEMO.read_text(encoding="utf-8"))
    doc["case"]["well"] = '=HYPERLINK("http://example.invalid","click")'
    doc["case"]["title"] = "+1 test"
    doc["check"][-1]["remark"] = "@SUM(A1:A9)"
    case = parse_case(doc, "hostile.toml")
    out = tmp_path / "r.xlsx"
    write_report(compute(case), out)
    wb = openpyxl.load_workbook(out)
    found = 0
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for c in row:
                if isinstance(c.value, str) and ("HYPERLINK" in c.value or "@SUM" in c.value):
                    assert c.data_type == "s", (ws.title, c.coordinate)
                    found += 1
    assert found >= 3
    back, _ = read_blocks(out)
    assert back["case"]["well"] == doc["case"]["well"]
