"""Report 'Rate window' sheet, Summary window rows and --json window against calc.rate_window.

The reference is an independent :func:`calc.rate_window.operating_window` call on the demo well
built by tests/demo_well.py straight from workbooks/demo-case.toml (invented demo data), not
through the report's case parser.  The demo window ends are fixed by the downhole tools' flow
window of the case file ([tool_pressure] flow_window = 400-650 gpm, invented data); the sweep is
the report's 200 rates from 0.3 to 1.8 × the check's 522 gpm.  Unit conversions: gpm, psi, ppg
by calc.units (exact definitions, calc/METHODS.md §0.1).
"""

from __future__ import annotations

import numpy as np
import openpyxl
import pytest
from _report_demo import demo_report_path, demo_results

from calc.rate_window import operating_window
from calc.units import from_si, to_si
from tests.cleaning_demo import (
    demo_cuttings,
    demo_fluid,
    demo_margins,
    demo_rop,
    demo_surface_rating,
    demo_weak_points,
    demo_well,
    demo_window,
)
from tests.demo_well import demo_pumps

LATEST = 1  # the demo case's second (latest) mud check, D2 05:30


@pytest.fixture(scope="module")
def wb():
    return openpyxl.load_workbook(demo_report_path())


@pytest.fixture(scope="module")
def ref():
    q0 = to_si(522.0, "gpm")  # demo check D2 flow_rate
    return operating_window(
        demo_well(LATEST), demo_fluid(LATEST), np.linspace(0.3 * q0, 1.8 * q0, 200),
        window=demo_window(), weak_points=demo_weak_points(), margins=demo_margins(),
        surface_rating=demo_surface_rating(), rop=demo_rop(LATEST),
        cuttings=demo_cuttings(LATEST), pumps=demo_pumps(),
    )  # fmt: skip


def _row(ws, text, col=1):
    for row in ws.iter_rows():
        v = row[col - 1].value
        if isinstance(v, str) and v.startswith(text):
            return row
    raise AssertionError(f"no row starting with {text!r} on {ws.title}")


def _gpm(x):
    return from_si(x, "gpm")


def test_report_window_is_calc_window(ref):
    ow = demo_results().window
    assert ow.feasible and ref.feasible
    assert ow.q_low == pytest.approx(ref.q_low, rel=1e-9)
    assert ow.q_high == pytest.approx(ref.q_high, rel=1e-9)
    # the tools carry the case parser's label; tests/demo_well.py names them itself
    # since the deviated-hole cleaning methods apply at the 30° tangent, the cleaning limit binds
    # the low end (larsen_1997 there, calc/METHODS.md §10.13), above the tools' 400 gpm
    assert ow.binding_low == ref.binding_low == "hole cleaning"
    # the pumps' 4,000 psi liners bind the high end (issue 12: 650 gpm needs ~4,240 psi)
    assert ow.binding_high == ref.binding_high == "liner rating"
    np.testing.assert_allclose(ow.spp, ref.spp, rtol=1e-9)
    np.testing.assert_allclose(ow.cleaning_indicator, ref.cleaning_indicator, rtol=1e-9)
    # demo case: the liner rating (4,000 psi) binds the high end below the tools' 650 gpm
    # (invented case data; at the end the SPP is the rating to the sweep's interpolation); the
    # low end is the minimum cleaning rate, 508 gpm (regression value, reviewed)
    assert ow.q_low == pytest.approx(ow.min_cleaning_rate, rel=1e-9)
    assert _gpm(ow.q_low) == pytest.approx(508.3, abs=0.5)
    assert _gpm(ow.q_high) == pytest.approx(627.9, abs=0.05)


def test_summary_shows_window_ends_with_binding_limits_in_words(wb, ref):
    ws = wb["Summary"]
    low = _row(ws, "operating window, lowest rate")
    high = _row(ws, "operating window, highest rate")
    assert low[1].value == pytest.approx(_gpm(ref.q_low), rel=1e-12)
    assert high[1].value == pytest.approx(_gpm(ref.q_high), rel=1e-12)
    assert low[4].value == high[4].value == "gpm"
    # the 30° tangent; strokes per minute of each pump beside the rate (5.016 gal/stk each)
    assert low[5].value == "bound by: hole cleaning no longer adequate; 50.7 spm × 2 pumps"
    assert high[5].value == (
        "bound by: standpipe pressure reaches the pumps' liner rating; 62.6 spm × 2 pumps"
    )
    # the check's 522 gpm lies inside 508-628 gpm
    assert low[8].value == high[8].value == "OK"


def test_rate_window_sheet_table_units_and_values(wb, ref):
    ws = wb["Rate window"]
    assert ws["A1"].value.startswith("Flow-rate operating window")
    assert _row(ws, "lowest rate")[2].value == pytest.approx(_gpm(ref.q_low), rel=1e-12)
    assert _row(ws, "highest rate")[4].value.startswith("standpipe pressure reaches the pumps'")
    assert _row(ws, "this check's rate")[4].value == "inside the window"
    head = _row(ws, "Rate sweep")[0].row + 1
    names = [ws.cell(row=head, column=c).value for c in range(1, 14)]
    units = [ws.cell(row=head + 1, column=c).value for c in range(1, 14)]
    assert names[:5] == [
        "flow rate", "standpipe pressure", "surface rating", "ECD, fracture-tightest point",
        "max. ECD (fracture − margin)",
    ]  # fmt: skip
    assert units[:5] == ["gpm", "psi", "psi", "ppg", "ppg"] and units[6:8] == ["ppg", "ppg"]
    r0 = head + 2
    col = {n: i + 1 for i, n in enumerate(names)}
    got = {
        n: np.array([ws.cell(row=r0 + i, column=col[n]).value for i in range(200)]) for n in names
    }
    assert ws.cell(row=r0 + 200, column=1).value is None  # exactly the 200 sweep rates
    np.testing.assert_allclose(got["flow rate"], _gpm(ref.q), rtol=1e-12)
    np.testing.assert_allclose(got["standpipe pressure"], from_si(ref.spp, "psi"), rtol=1e-9)
    np.testing.assert_allclose(
        got["ECD, fracture-tightest point"], from_si(ref.ecd_fracture_point, "ppg"), rtol=1e-9
    )
    # limit line = fracture EMW at that point − the case's 0.50 ppg margin (demo [limits])
    np.testing.assert_allclose(
        got["max. ECD (fracture − margin)"], from_si(ref.fracture_at_point, "ppg") - 0.5,
        rtol=1e-9,
    )  # fmt: skip
    np.testing.assert_allclose(
        got["min. ECD (pore + margin)"], from_si(ref.pore_at_point, "ppg") + 0.2, rtol=1e-9
    )
    np.testing.assert_allclose(got["cleaning indicator"], ref.cleaning_indicator, rtol=1e-9)
    np.testing.assert_allclose(got["lowest transport ratio"], ref.min_transport_ratio, rtol=1e-9)
    inside = (ref.q >= ref.q_low) & (ref.q <= ref.q_high)
    assert list(got["in window"]) == ["yes" if x else "no" for x in inside]


def test_rate_window_charts_axes_units_and_data_below_the_print_range(wb):
    import re

    ws = wb["Rate window"]
    charts = ws._charts
    assert len(charts) == 3

    def title(t):
        return "".join(r.t for p in t.tx.rich.p for r in (p.r or []))

    assert [title(c.title) for c in charts] == [
        "ECD at the tightest points", "Standpipe pressure", "Hole cleaning",
    ]  # fmt: skip
    assert [title(c.y_axis.title) for c in charts] == [
        "equivalent density [ppg]", "pressure [psi]", "indicator, transport ratio [–]",
    ]  # fmt: skip
    assert all(title(c.x_axis.title) == "flow rate [gpm]" for c in charts)
    end = int(re.findall(r"\d+", str(ws.print_area))[-1])
    data = _row(ws, "Rate sweep")[0].row
    assert data > end
    for ch in charts:
        assert ch.anchor._from.row < end
        rows = [int(x) for s in ch.series for x in re.findall(r"\$(\d+)", s.xVal.numRef.f)]
        assert min(rows) > data  # every series reads the sweep (or marker) rows, not printed
    assert len(charts[0].series) == 5  # 2 ECD curves, 2 limit lines, window-end markers
    assert ws.page_setup.orientation == "landscape" and ws.page_setup.fitToWidth == 1


def test_json_window_ends_bindings_and_curves(tmp_path, capsys, ref):
    import json

    from _report_demo import DEMO

    from addin.cli import main

    out = tmp_path / "r.xlsx"
    assert main(["report", str(DEMO), "-o", str(out), "--json"]) == 0
    w = json.loads(capsys.readouterr().out)["operating_window"]
    assert w["feasible"] is True
    assert w["low_rate"] == pytest.approx(_gpm(ref.q_low), rel=1e-12)
    assert w["high_rate"] == pytest.approx(_gpm(ref.q_high), rel=1e-12)
    assert w["binding_low"] == "hole cleaning"  # calc.rate_window's name
    assert w["binding_high_words"] == "standpipe pressure reaches the pumps' liner rating"
    c = w["curves"]
    assert len(c["flow_rate"]) == 200
    np.testing.assert_allclose(c["standpipe_pressure"], from_si(ref.spp, "psi"), rtol=1e-9)
    np.testing.assert_allclose(c["ecd_pore_point"], from_si(ref.ecd_pore_point, "ppg"), rtol=1e-9)
    np.testing.assert_allclose(c["cleaning_indicator"], ref.cleaning_indicator, rtol=1e-9)
    assert w["limit_margins"]["surface_rating"]["unit"] == "psi"
    np.testing.assert_allclose(
        w["limit_margins"]["surface_rating"]["values"],
        from_si(ref.limits["surface rating"], "psi"), rtol=1e-9,
    )  # fmt: skip


def test_no_window_gives_a_clear_status(tmp_path):
    # 2.5 ppg below fracture and 2.0 ppg above pore cannot both hold in the demo's 10.5-12.6 ppg
    # window (demo case data, invented); calc.rate_window then reports no feasible rate
    import tomllib

    from _report_demo import DEMO

    from addin.case import parse_case
    from addin.report import compute, write_report

    doc = tomllib.loads(DEMO.read_text("utf-8"))
    doc["limits"].update(fracture_margin=2.5, pore_margin=2.0)
    res = compute(parse_case(doc, "tight.toml"), run_time="2026-01-01 06:00:00 UTC")
    assert not res.window.feasible
    book = openpyxl.load_workbook(write_report(res, tmp_path / "t.xlsx"))
    row = _row(book["Summary"], "operating window (see 'Rate window')")
    assert row[1].value == "none" and row[8].value == "OUTSIDE LIMIT"
    assert row[5].value.startswith("no rate satisfies every limit at once (failing: ")
    ws = book["Rate window"]
    assert _row(ws, "operating window")[2].value == "none"
    assert _row(ws, "this check's rate")[4].value == "no window"
    head = _row(ws, "Rate sweep")[0].row + 1
    assert {ws.cell(row=head + 2 + i, column=13).value for i in range(200)} == {"no"}
    assert len(ws._charts) == 3 and all(len(c.series) in (2, 4) for c in ws._charts)
