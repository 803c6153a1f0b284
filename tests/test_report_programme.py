"""Mud-programme ranges compared and flagged on the Summary and Rheology sheets (issue 14:
the demo's D2 PV of 24 cP against a 12–22 cP programme was shown but never flagged)."""

from __future__ import annotations

import openpyxl

from tests._report_demo import demo_report_path


def _rows(sheet):
    ws = openpyxl.load_workbook(demo_report_path())[sheet]
    return [list(r) for r in ws.iter_rows(values_only=True)]


def test_summary_flags_pv_above_programme():
    rows = {r[0]: r for r in _rows("Summary") if isinstance(r[0], str)}
    pv = rows["PV against the mud programme (D2 05:30)"]
    # API RP 13B-1: PV = θ600 − θ300 = 68 − 44 = 24 cP (hand), programme 12–22 cP
    assert pv[1] == 24.0 and pv[8] == "ABOVE PROGRAMME"
    assert "12.0 cP – 22.0 cP" in pv[5] or "12 cP – 22 cP" in pv[5]
    # YP = θ300 − PV = 44 − 24 = 20 lbf/100ft² inside 15–25: OK
    assert rows["YP against the mud programme (D2 05:30)"][8] == "OK"
    # density 11.2 ppg inside 10.8–11.3
    assert rows["density against the mud programme (D2 05:30)"][8] == "OK"
    # LSYP = 2θ3 − θ6 = 2·9 − 10 = 8 inside 7–11
    assert rows["LSYP against the mud programme (D2 05:30)"][8] == "OK"


def test_rheology_sheet_flags_pv():
    rows = _rows("Rheology")
    head = next(r for r in rows if r[0] == "property")
    col = head.index("D2 05:30\nvs programme")
    pv = next(r for r in rows if r[0] == "PV")
    assert pv[col] == "ABOVE PROGRAMME"
    yp = next(r for r in rows if r[0] == "YP")
    assert yp[col] == "OK"


def test_gels_are_compared_with_their_programme_on_summary_and_rheology():
    # demo case D2 gels 10 / 22 / 30 lbf/100ft² (dial readings, API RP 13B-1 gel strengths)
    # against the invented programme 10s 5–12, 10min 10–20, 30min 12–28
    rows = {r[0]: r for r in _rows("Summary") if isinstance(r[0], str)}
    want = {"10-second": (10.0, "OK"), "10-minute": (22.0, "ABOVE PROGRAMME"),
            "30-minute": (30.0, "ABOVE PROGRAMME")}  # fmt: skip
    for name, (value, word) in want.items():
        r = rows[f"{name} gel against the mud programme (D2 05:30)"]
        assert (r[1], r[8]) == (value, word), name
    rh = _rows("Rheology")
    head = next(r for r in rh if r[0] == "property")
    col = head.index("D2 05:30\nvs programme")
    words = {r[0]: r[col] for r in rh if isinstance(r[0], str) and r[0].startswith("gel strength")}
    assert list(words.values()) == ["OK", "ABOVE PROGRAMME", "ABOVE PROGRAMME"]


def test_a_gel_programme_range_is_checked_like_the_others():
    import tomllib

    import pytest

    from addin.case import parse_case
    from calc.errors import InputError
    from tests._report_demo import DEMO

    src = DEMO.read_text(encoding="utf-8").replace("10min = [10, 20]", "10min = [20, 10]", 1)
    with pytest.raises(InputError, match=r"gels\.10min"):
        parse_case(tomllib.loads(src), source="test")
