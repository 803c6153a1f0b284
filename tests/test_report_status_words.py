"""Status words say what they mean (issue 14): a poor hole-cleaning verdict is POOR, not a
limit exceeded; margins read OK / MARGINAL / OUTSIDE LIMIT; the tightest point names every
point tied with it."""

from __future__ import annotations

from types import SimpleNamespace

import numpy as np
import openpyxl

from addin import text
from calc.circulation import margin_status
from tests._report_demo import demo_report_path


def test_status_words():
    # calc.circulation.margin_status: below zero the limit is crossed, below required marginal
    assert text.STATUS_WORDS[margin_status(-1.0)] == "OUTSIDE LIMIT"
    assert text.STATUS_WORDS[margin_status(20.0, 50.0)] == "MARGINAL"
    assert text.STATUS_WORDS[margin_status(80.0, 50.0)] == "OK"
    assert text.CLEANING_STATUS == {"adequate": "OK", "marginal": "MARGINAL", "poor": "POOR"}


def test_summary_uses_only_the_defined_words():
    ws = openpyxl.load_workbook(demo_report_path())["Summary"]
    rows = list(ws.iter_rows(values_only=True))
    statuses = {r[8] for r in rows if isinstance(r[8], str) and r[8].isupper()}
    allowed = set(text.STATUS_WORDS.values()) | set(text.CLEANING_STATUS.values())
    allowed |= set(text.PROGRAMME_WORDS.values()) | {"CHECK", "INFO", "NOT CHECKED", "status"}
    assert statuses <= allowed, statuses - allowed
    assert "EXCEEDED" not in statuses and "NEAR LIMIT" not in statuses


def _margins(values):
    pts = tuple(SimpleNamespace(name=f"P{i}", role="", md=None, tvd=None, kind="point")
                for i in range(len(values)))  # fmt: skip
    i = int(np.argmin(values))
    return SimpleNamespace(
        points=pts,
        fracture_margin=np.array(values),
        pore_margin=np.full(len(values), 500.0),
        tightest=SimpleNamespace(point=pts[i], limit="fracture", margin=values[i]),
    ), pts


def test_tightest_names_both_tied_points(monkeypatch):
    monkeypatch.setattr(text, "check_point", lambda p, system="oilfield": p.name)
    # two margins 0.01 kg/m³ apart (8e-5 ppg: equal at the 0.01 ppg shown) and one far off
    mt, _ = _margins([97.31, 300.0, 97.32])
    assert text.tightest_where(mt) == "P0 and P2"
    mt, _ = _margins([97.31, 300.0, 120.0])
    assert text.tightest_where(mt) == "P0"
