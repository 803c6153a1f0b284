"""Report workbook: sheets, headings, charts, units, cautions, run information, values vs calc.

External references: PV = θ600 − θ300 and YP = 2θ300 − θ600 (API RP 13B-1, field units, dial
readings of the demo case D2: 68, 44); the hydrostatic constant 12/231 psi/ft per ppg (exact,
METHODS §0.1 from lbf = lb·gₙ and gal = 231 in³); TFA = Σ N²/1303.8 in² (PRACTICE §2.4; exact
π/4096·N² per nozzle).
"""

from __future__ import annotations

import math

import openpyxl
import pytest
from _report_demo import demo_report_path, demo_results

from calc import cautions
from calc.units import from_si

SHEETS = [
    "Summary",
    "Inputs",
    "Rheology",
    "Hydraulics",
    "ECD",
    "Bit",
    "Cleaning",
    "Trips",
    "Cautions",
    "Audit",
]


@pytest.fixture(scope="module")
def wb():
    return openpyxl.load_workbook(demo_report_path())


def _texts(ws):
    return [c.value for row in ws.iter_rows() for c in row if isinstance(c.value, str)]


def _find_row(ws, text, col=1):
    for row in ws.iter_rows():
        v = row[col - 1].value
        if isinstance(v, str) and v.startswith(text):
            return row
    raise AssertionError(f"no row starting with {text!r} on {ws.title}")


def test_sheets_in_order(wb):
    assert wb.sheetnames == SHEETS


def test_every_sheet_has_a_title_and_print_setup(wb):
    for ws in wb.worksheets:
        if ws.title == "Inputs":
            continue
        assert isinstance(ws["A1"].value, str) and ws["A1"].value.strip(), ws.title
        assert ws.page_setup.fitToWidth == 1, ws.title
        assert "page &P of &N" in ws.oddFooter.right.text


def test_charts_present_with_the_right_axes(wb):
    rheo = wb["Rheology"]._charts
    assert len(rheo) == 1
    ch = rheo[0]
    assert ch.x_axis.scaling.logBase == 10 and ch.y_axis.scaling.logBase == 10
    # readings as markers without lines, models as lines without markers
    kinds = [(s.marker.symbol, s.graphicalProperties.line.noFill) for s in ch.series]
    assert any(sym not in (None, "none") and nofill for sym, nofill in kinds)
    assert any(sym in (None, "none") and not nofill for sym, nofill in kinds)
    assert len(wb["Hydraulics"]._charts) == 1  # pressure breakdown
    ecd = wb["ECD"]._charts[0]
    assert ecd.y_axis.scaling.orientation == "maxMin"  # depth increases downward
    titles = [s.tx.strRef.f if s.tx.strRef else s.tx.v for s in ecd.series]
    assert {"ESD", "ECD", "pore pressure", "fracture pressure"} <= set(titles)
    # depth on the vertical axis: y values from the profile's TVD column, x from the densities
    ws = wb["ECD"]
    head = {ws.cell(row=4, column=c).value: c for c in range(13, 19)}
    from openpyxl.utils import get_column_letter as col

    for s in ecd.series:
        assert f"${col(head['TVD'])}$" in s.yVal.numRef.f
        assert f"${col(head['TVD'])}$" not in s.xVal.numRef.f


def test_units_shown_in_the_case_system(wb):
    summary = _texts(wb["Summary"])
    for unit in ("psi", "ppg", "gpm", "ft/min", "hp/in²"):
        assert unit in summary, unit
    hyd_units = _texts(wb["Hydraulics"])
    assert "psi/ft" in hyd_units and "in" in hyd_units


def test_cautions_version_runtime_and_hash(wb):
    res = demo_results()
    texts = _texts(wb["Cautions"])
    assert cautions.SHORT in texts and cautions.CELL in texts
    for line in cautions.LINES:
        assert line in texts
    assert cautions.CELL in _texts(wb["Summary"])
    run = _texts(wb["Summary"]) + _texts(wb["Audit"])
    assert res.version in run and "2026-01-01 06:00:00 UTC" in run
    assert res.case.hash in run and len(res.case.hash) == 64


def test_pv_yp_cells_match_api_13b1_definitions(wb):
    ws = wb["Rheology"]
    pv = _find_row(ws, "PV")
    yp = _find_row(ws, "YP")
    # D2 05:30 (second check) values sit in columns F (value) / G (formula)
    assert pv[5].value == pytest.approx(68 - 44)  # API RP 13B-1: PV = θ600 − θ300 [cP]
    assert yp[5].value == pytest.approx(2 * 44 - 68)  # YP = 2θ300 − θ600 [lbf/100ft²]
    assert pv[6].value.startswith("=") and "$" in pv[6].value


def test_summary_values_equal_calc_results(wb):
    res = demo_results().circulation
    ws = wb["Summary"]
    spp = _find_row(ws, "standpipe pressure, predicted")
    assert spp[1].value == pytest.approx(from_si(float(res.standpipe_pressure), "psi"), rel=1e-12)
    ecd = _find_row(ws, "ECD at the bit")
    assert ecd[1].value == pytest.approx(from_si(float(res.ecd_bit), "ppg"), rel=1e-12)
    hyd = _find_row(ws, "hydrostatic pressure at the bit")
    tvd_ft = from_si(res.bit_tvd, "ft")
    rho_ppg = from_si(float(res.density), "ppg")
    # exact field constant 12/231 psi/ft per ppg (METHODS §0.1), hydrostatic="exact"
    assert hyd[1].value == pytest.approx(12 / 231 * rho_ppg * tvd_ft, rel=1e-9)


def test_bit_tfa_matches_the_field_formula(wb):
    ws = wb["Bit"]
    tfa = _find_row(ws, "total flow area")
    nozzles = [12, 12, 12, 11, 11, 11]  # demo case [bit].nozzles, 1/32 in
    assert tfa[1].value == pytest.approx(sum(n * n for n in nozzles) / 1303.8, rel=2e-4)
    assert tfa[1].value == pytest.approx(sum(math.pi / 4 * (n / 32) ** 2 for n in nozzles))


def test_breakdown_sums_to_standpipe_pressure(wb):
    ws = wb["Hydraulics"]
    total = _find_row(ws, "predicted standpipe pressure")
    assert total[2].value.startswith("=SUM(")
    res = demo_results().circulation
    parts = sum(float(v) for v in res.breakdown().values())
    assert total[1].value == pytest.approx(from_si(parts, "psi"), rel=1e-12)


def test_live_formulas_use_native_functions_only(wb):
    import re

    allowed = {"SUM", "SUMPRODUCT", "PI", "SQRT", "IF", "ABS", "MAX"}
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for c in row:
                if c.data_type == "f":
                    names = set(re.findall(r"([A-Z][A-Z0-9.]*)\(", c.value))
                    assert names <= allowed, (ws.title, c.coordinate, c.value)


def test_every_audited_value_has_an_agreement_cell(wb):
    n = 0
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for c in row:
                if c.data_type == "f" and not c.value.startswith("=IF(ABS("):
                    right = ws.cell(row=c.row, column=c.column + 1).value
                    left = ws.cell(row=c.row, column=c.column - 1).value
                    assert isinstance(left, float | int), (ws.title, c.coordinate)
                    assert str(right).startswith("=IF(ABS("), (ws.title, c.coordinate)
                    n += 1
    assert n >= 20
