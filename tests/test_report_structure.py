"""Report workbook: sheets, headings, charts, units, cautions, run information, values vs calc.

External references: PV = θ600 − θ300 and YP = 2θ300 − θ600 (API RP 13B-1, field units, dial
readings of the demo case D2: 68, 44); the hydrostatic constant 12/231 psi/ft per ppg (exact,
calc/METHODS.md §0.4, from lbf = lb·gₙ and gal = 231 in³); TFA = Σ N²/1303.8 in² (common
practice, calc/METHODS.md §8.1; exact π/4096·N² per nozzle).
"""

from __future__ import annotations

import math
import re
from pathlib import Path

import openpyxl
import pytest
from _report_demo import demo_report_path, demo_results

from addin import text
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
    "Rate window",
    "Downhole",
    "Slurry line",
    "Cement job",
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
    top = _find_row(ws, "Profile along the annulus")[0].row + 1
    head = {ws.cell(row=top, column=c).value: c for c in range(1, 7)}
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
    ecd = _find_row(ws, "ECD at the bit, clean mud")
    assert ecd[1].value == pytest.approx(from_si(float(res.ecd_bit), "ppg"), rel=1e-12)
    loaded = _find_row(ws, "ECD at the bit, cuttings-loaded")  # tests/test_loaded_ecd.py
    assert loaded[1].value == pytest.approx(from_si(demo_results().loaded.ecd_bit, "ppg"))
    hyd = _find_row(ws, "hydrostatic pressure at the bit")
    tvd_ft = from_si(res.bit_tvd, "ft")
    rho_ppg = from_si(float(res.density), "ppg")
    # exact field constant 12/231 psi/ft per ppg (calc/METHODS.md §0.4), hydrostatic="exact"
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


def _print_rows(ws):
    """Last row of the print range (``A1:J40`` → 40)."""
    import re

    area = ws.print_area
    area = area[0] if isinstance(area, list | tuple) else area
    return int(re.findall(r"\$?[A-Z]+\$?(\d+)", str(area))[-1])


def test_chart_data_sits_below_the_print_range_not_beside_it(wb):
    # the lead's review: the rheogram table at column N shrank the printed Rheology page
    for name, head in (("Rheology", "Rheogram data"), ("ECD", "Profile along the annulus")):
        ws = wb[name]
        cell = _find_row(ws, head)[0]
        assert cell.column == 1 and cell.row > _print_rows(ws), name
        assert ws.max_column <= 10, (name, ws.max_column)  # nothing to the right of the page
        for ch in ws._charts:
            assert ch.anchor._from.row < _print_rows(ws), name


def test_every_sheet_prints_landscape_and_long_tables_repeat_their_header(wb):
    for ws in wb.worksheets:
        assert ws.page_setup.orientation == "landscape", ws.title
    for name, head in (("Hydraulics", "interval"), ("Cleaning", "interval")):
        ws = wb[name]
        first = int(str(ws.print_title_rows).split(":")[0].lstrip("$"))
        assert ws.cell(row=first, column=1).value == head, name


def test_hydraulics_shows_the_tool_coverage_and_the_calibration(wb):
    res = demo_results()
    ws = wb["Hydraulics"]
    texts = _texts(ws)
    # demo case [tool_pressure].covers: the RSS and the MWD/LWD bores
    assert any(
        "includes the bore loss of 6-3/4 in rotary steerable, 6-3/4 in MWD/LWD (with PWD)" in t
        for t in texts
    )
    assert _find_row(ws, "fixed tool drops (incl. their bores)")
    rss = _find_row(ws, "string: 6-3/4 in rotary steerable (bore loss in the fixed tool drop)")
    assert rss[15].value == 0.0  # loss column
    assert any(t.startswith("CALIBRATION, not a measurement") for t in texts)
    m = _find_row(ws, "friction multiplier m (calibration)")
    cal = res.calibration
    # m = (measured − fixed)/frictional (calc.circulation.calibration docstring)
    assert m[1].value == pytest.approx(
        (cal.measured_spp - cal.fixed_loss) / cal.frictional_loss, rel=1e-12
    )
    assert m[2].value.startswith("=(") and "agrees" not in str(m[2].value)


def test_summary_trend_has_one_row_per_check_at_its_own_depth(wb):
    res = demo_results()
    ws = wb["Summary"]
    head = _find_row(ws, "Trend: every mud check")[0].row
    rows = [_find_row(ws, t.label) for t in res.trend]
    assert all(r[0].row > head for r in rows)
    # demo case: D1 at 10,950 ft and 11.0 ppg, D2 at 11,880 ft and 11.2 ppg
    assert [r[1].value for r in rows] == pytest.approx([10950.0, 11880.0])
    assert [r[2].value for r in rows] == pytest.approx([11.0, 11.2])
    # PV = θ600 − θ300 (API RP 13B-1): D1 56 − 37, D2 68 − 44
    assert [r[3].value for r in rows] == pytest.approx([19.0, 24.0])
    for r, t in zip(rows, res.trend, strict=True):
        assert r[5].value == pytest.approx(from_si(t.spp, "psi"), rel=1e-12)
        assert r[7].value == pytest.approx(100 * (t.spp - t.measured_spp) / t.measured_spp)
    # the latest row is the key-results computation itself
    assert rows[-1][5].value == _find_row(ws, "standpipe pressure, predicted")[1].value


def test_every_label_in_the_case_units_for_a_metric_case(tmp_path):
    # A metric case must read in metres: no interval label or note carries feet.
    import tomllib

    from addin.case import parse_case
    from addin.report import compute, write_report

    doc = tomllib.loads(
        (Path(__file__).resolve().parents[1] / "workbooks" / "demo-case.toml").read_text("utf-8")
    )
    doc["case"]["units"] = "metric"
    _metric(doc)
    res = compute(parse_case(doc, "metric.toml"), run_time="2026-01-01 06:00:00 UTC")
    out = write_report(res, tmp_path / "m.xlsx")
    book = openpyxl.load_workbook(out)
    for ws in book.worksheets:
        if ws.title in ("Inputs", "Audit"):
            continue
        for t in _texts(ws):
            assert not re.search(r"\d ft\b|ppg|psi|gpm", t), (ws.title, t)
    for n in res.notes:
        assert not re.search(r"\d ft\b|ppg|psi|gpm", text.note(n, "metric")), text.note(n)
    assert any(" m" in text.span(sp, "metric") for sp in res.circulation.string.spans)


def _metric(doc):
    """Give every quantity of the (oilfield) demo case its oilfield unit as text, so the same
    well reads under units = "metric" (a case file allows "<number> <unit>" for any value)."""
    from addin.case_schema import SECTIONS
    from calc.units import KINDS, unit_for

    def tag(v, kind):
        if kind in ("length_or_fill",):
            kind = "length"
        if isinstance(v, bool) or not isinstance(v, int | float) or kind not in KINDS:
            return v
        return f"{float(v)!r} {unit_for(kind, 'oilfield')}"

    def walk(table, schema):
        for k, v in list(table.items()):
            f = schema.get(k)
            if f is None:
                continue
            if f.kind == "table" and f.sub:
                walk(v, f.sub)
            elif f.kind in ("range", "list"):
                table[k] = [tag(x, f.of) for x in v]
            elif f.kind == "stations":
                table[k] = [[tag(r[0], "depth"), r[1], r[2]] for r in v]
            else:
                table[k] = tag(v, f.kind)

    for name, (is_list, schema) in SECTIONS.items():
        if name not in doc or schema is None or name == "case":
            continue
        for t in doc[name] if is_list else [doc[name]]:
            walk(t, schema)
