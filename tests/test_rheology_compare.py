"""Comparing mud checks: parameter changes, tolerances, flow curves against reading resolution."""

import numpy as np
import pytest

from calc.errors import InputError
from calc.rheology import (
    DEFAULT_TOLERANCES,
    Tolerance,
    ViscometerReadings,
    compare_checks,
    compare_series,
)
from calc.rheology.viscometer import FIELD_STRESS

SIX = [600, 300, 200, 100, 6, 3]
GELS1 = {"10s": 7, "10min": 12, "30min": 15}
GELS2 = {"10s": 10, "10min": 22, "30min": 30}


def check(dial, gels=None, temperature=322.04, label=""):
    return ViscometerReadings(SIX, dial, gels=gels, temperature=temperature, label=label)


def test_demo_checks_d1_to_d2():
    # demo checks D1 → D2 (invented demo data); values are the API RP 13B-1 field definitions,
    # so the changes are exact: PV 19 → 24 cP, YP 18 → 20, LSYP 6 → 8, gels 7/12/15 → 10/22/30.
    a = check([56, 37, 29, 20, 8, 7], GELS1, label="D1")
    b = check([68, 44, 35, 25, 10, 9], GELS2, label="D2")
    c = compare_checks(a, b)
    assert c["PV"].change == pytest.approx(5e-3)
    assert c["PV"].relative == pytest.approx(5 / 19)
    assert c["YP"].change == pytest.approx(2 * FIELD_STRESS)
    assert c["gel_30min"].relative == pytest.approx(1.0)
    # default tolerances (common practice, from memory): PV 2 cP & 10 %, YP 2 lbf/100ft² & 10 %
    assert c["PV"].flagged and c["gel_10min"].flagged and c["LSYP"].flagged
    assert not c["YP"].flagged  # exactly on the 2 lbf/100ft² tolerance: not beyond it
    assert not c["n"].flagged  # regression value, reviewed: Δn = +0.013 (< 0.05)
    assert c.curves_differ
    # regression value, reviewed: the largest difference is at the top speed, ~11.8°
    assert c.max_curve_difference == pytest.approx(11.76, abs=0.05)
    assert c.reading_differences[600.0] == 12.0
    assert c.label_a == "D1" and c.label_b == "D2"


def test_identical_and_within_resolution():
    a = check([56, 37, 29, 20, 8, 7], GELS1)
    same = compare_checks(a, check([56, 37, 29, 20, 8, 7], GELS1))
    assert not same.flagged and not same.curves_differ
    assert all(ch.change == pytest.approx(0, abs=1e-12) for ch in same.changes)
    # every reading 0.5° higher: within the combined ±0.5° resolution of two readings
    half = compare_checks(a, check(np.array([56, 37, 29, 20, 8, 7]) + 0.5, GELS1))
    assert not half.curves_differ
    assert half.threshold == 1.0
    two = compare_checks(a, check(np.array([56, 37, 29, 20, 8, 7]) + 2.0, GELS1))
    assert two.curves_differ


def test_user_tolerances_and_notes():
    a = check([56, 37, 29, 20, 8, 7], temperature=322.04)
    b = check([68, 44, 35, 25, 10, 9], temperature=339.0)  # ~30 °F warmer
    c = compare_checks(a, b, tolerances={"PV": (10e-3, 0.5), "YP": Tolerance(0.1, 0.01)})
    assert not c["PV"].flagged and c["YP"].flagged
    assert "temperature_differs" in [n.code for n in c.notes]
    assert "gel_10s" not in [ch.name for ch in c.changes]
    c2 = compare_checks(a, check([68, 44, 35, 25, 10, 9], temperature=None))
    assert "temperature_missing" in [n.code for n in c2.notes]
    with pytest.raises(InputError, match="did you mean"):
        compare_checks(a, b, tolerances={"PVV": (1, 1)})
    with pytest.raises(InputError):
        compare_checks(a, b, tolerances={"PV": (-1, 0)})
    with pytest.raises(InputError):
        compare_checks(a, "today")
    assert set(DEFAULT_TOLERANCES) >= {"n", "K", "tau_y", "PV", "YP", "LSYP", "gel_10s"}


def test_series_and_method_choice():
    checks = [
        check([56, 37, 29, 20, 8, 7]),
        check([60, 40, 31, 22, 9, 8]),
        check([68, 44, 35, 25, 10, 9]),
    ]
    out = compare_series(checks, method="api13d_2010_hb")
    assert len(out) == 2 and all(c.method == "api13d_2010_hb" for c in out)
