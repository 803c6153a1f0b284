"""The structure of the circulation results: spans per row, losses grouped per flow path, check
points, the one definition of the SPP deviation and of a margin's state, and the faces' wording
of them (addin.text).

Sources: the loop's own equation p_SPP = p_s + Σ losses (calc.circulation.circulate docstring);
1 ft = 0.3048 m and 1 psi = 6894.757 Pa (NIST SP 811, via calc.units); the demo figures quoted in
README.md (predicted 2,952 psi against a measured 2,860 psi on day 2, regression values,
reviewed).
"""

import numpy as np
import pytest

from addin import text
from addin.case import load_case
from addin.report import compute
from calc.circulation import (
    BREAKDOWN_KEYS,
    CheckPoint,
    PathLosses,
    ToolLosses,
    circulate,
    margin_status,
    spp_deviation,
    spp_deviation_percent,
    worst_status,
)
from calc.span import Span
from calc.units import to_si
from tests.test_circulation_loop import Q, hb_fluid, simple_well


def test_flow_interval_spans_are_the_rows():
    iv = simple_well(tool_joints=True).flow_intervals()
    spans = iv.spans()
    assert len(spans) == len(iv)
    for k, s in enumerate(spans):
        assert s.path == iv.path[k] and s.item == iv.component[k]
        assert s.tool_joint == bool(iv.is_tool_joint[k])
        assert (s.top_md, s.bottom_md) == (iv.top_md[k], iv.bottom_md[k])
        assert (s.top_tvd, s.bottom_tvd) == (iv.top_tvd[k], iv.bottom_tvd[k])
        assert s.section == (iv.section[k] if s.path == "annulus" else "")
    assert any(s.tool_joint for s in spans)


def test_losses_grouped_per_path_add_up_to_the_standpipe_pressure():
    r = circulate(simple_well(), hb_fluid(), Q, back_pressure=to_si(200.0, "psi"))
    for path in (r.surface, r.string, r.annulus):
        assert isinstance(path, PathLosses)
        assert len(path.spans) == np.shape(path.losses)[-1]
        assert path.total == pytest.approx(float(np.sum(path.losses)), rel=1e-14)
    assert isinstance(r.tools, ToolLosses) and [s.item for s in r.tools.spans] == ["MWD"]
    assert tuple(r.breakdown()) == BREAKDOWN_KEYS
    # p_SPP = p_s + Σ losses (loop docstring): the shares of the parts sum to one
    assert sum(r.shares().values()) == pytest.approx(1.0, rel=1e-14)
    assert r.shares()["bit"] == pytest.approx(r.bit_share, rel=1e-15)
    assert r.context.well is not None and r.context.annulus_top.shape == (len(r.annulus.spans),)
    assert set(text.BREAKDOWN_LABELS) == set(BREAKDOWN_KEYS)


def test_check_points_have_roles_and_words():
    r = circulate(simple_well(), hb_fluid(), Q, margin_step=100.0)
    roles = {p.role for p in r.margins.points}
    assert {"depth", "shoe", "bit"} <= roles
    shoe = r.margins.points[r.margins.index("shoe")]
    assert text.check_point(shoe) == "casing shoe"
    grid = next(p for p in r.margins.points if p.role == "depth")
    # 1 ft = 0.3048 m (NIST SP 811)
    assert text.check_point(grid) == f"MD {grid.md / 0.3048:,.0f} ft"
    assert text.check_point(grid, "metric") == f"MD {grid.md:,.1f} m"
    station = CheckPoint("window_station", "", 3018.0, 3000.0)
    assert text.check_point(station) == f"window station, TVD {3000.0 / 0.3048:,.0f} ft"
    assert text.span(station.place) == f"window station, MD {3018.0 / 0.3048:,.0f} ft"
    with pytest.raises(ValueError, match="role"):
        CheckPoint("casing", "x", 1.0, 1.0)


def test_notes_carry_si_values_the_faces_word():
    rating = to_si(1000.0, "psi")
    r = circulate(simple_well(), hb_fluid(), Q, surface_rating=rating)
    n = next(n for n in r.notes if n.code == "spp_above_rating")
    assert n.value("rating").value == rating and n.value("rating").kind == "pressure"
    assert "1,000 psi" in text.note(n, "oilfield")
    # 1000 psi = 68.95 bar (1 psi = 6894.757 Pa, 1 bar = 1e5 Pa)
    assert "68.95 bar" in text.note(n, "metric")
    # a sweep whose SPP is about 790, 2400 and 4880 psi (regression values, reviewed) against a
    # 3000 psi rating: only the highest rate is over, said as a range value of rates
    qs = np.array([0.5, 1.0, 1.5]) * Q
    sweep = circulate(simple_well(), hb_fluid(), qs, surface_rating=3.0 * rating)
    n = next(n for n in sweep.notes if n.code == "spp_above_rating")
    rates = n.value("rates")
    assert rates.kind == "flow_rate" and rates.value == (qs[2], qs[2])
    assert "at 1 of 3 sweep points" in text.note(n, "oilfield")


def test_one_definition_of_the_spp_deviation():
    # README demo day 2: predicted 2,952 psi, measured 2,860 psi → (2952 − 2860)/2860 = +3.22 %
    pred, meas = to_si(2952.0, "psi"), to_si(2860.0, "psi")
    assert spp_deviation(pred, meas) == pytest.approx(to_si(92.0, "psi"), rel=1e-12)
    assert spp_deviation_percent(pred, meas) == pytest.approx(100 * 92.0 / 2860.0, rel=1e-12)
    assert spp_deviation_percent(meas, pred) < 0  # the model below the gauge: negative


def test_report_trend_and_calibration_share_the_definition_and_the_fluid():
    res = compute(load_case("workbooks/demo-case.toml"), run_time="2026-01-01 00:00:00 UTC")
    last = res.trend[-1]
    assert last.spp_deviation_percent == pytest.approx(
        float(spp_deviation_percent(last.spp, last.measured_spp)), rel=1e-15
    )
    cal = res.calibration
    assert cal.deviation_percent == pytest.approx(last.spp_deviation_percent, rel=1e-12)
    # the calibration starts from the very result the report shows (no second fit)
    assert cal.predicted.standpipe_pressure == res.circulation.standpipe_pressure


def test_margin_status_is_defined_once():
    assert margin_status(-0.1, 50.0) == "exceeded"
    assert margin_status(49.9, 50.0) == "near_limit"
    assert margin_status(50.0, 50.0) == "ok"
    assert margin_status(0.0) == "ok"
    assert worst_status("ok", "near_limit") == "near_limit"
    assert worst_status("exceeded", "ok", "near_limit") == "exceeded"
    assert set(text.STATUS_WORDS) == {"ok", "near_limit", "exceeded"}


def test_point_span_words():
    s = Span("annulus", "", top_md=304.8, bottom_md=304.8)
    assert text.span(s) == "MD 1,000 ft"
    assert text.span(Span("annulus", "sand", top_md=304.8, bottom_md=304.8)) == "sand, MD 1,000 ft"
