"""Limits on curves that are not monotone: the trip-speed limits and the operating window with the
API RP 13D (1995) power law, whose friction factor jumps at Re = 2100 (no transitional zone).

Reference in every test: a brute-force dense scan, done here in the test, of the same public
calc functions the solvers call (``interval_surge``, ``surge_pressure``, ``operating_window``'s
own margin curves on a dense sweep).  The first sweep point at which the allowance is exceeded
(or a limit fails) going from the safe end is the true limit to the scan's resolution; a limit
reported beyond it is unsafe.  (An independent check of the solvers' search, not of the
friction law: that is tested against its published form in the flow tests.)
"""

import dataclasses

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc.cleaning import CleaningCriteria
from calc.numeric import depth_weights
from calc.rate_window import operating_window
from calc.surge import interval_surge, surge_pressure, trip_speed_limit, trip_speed_limits
from calc.units import to_si
from tests.cleaning_demo import (
    demo_cuttings,
    demo_margins,
    demo_rop,
    demo_surface_rating,
    demo_weak_points,
    demo_well,
    demo_window,
    ppg,
)
from tests.demo_well import demo_fluid

API95 = "api13d_1995_power_law"

#: Dense scan of average trip speeds [m/s] over the solvers' default bracket: 0.029 % apart.
DENSE = np.geomspace(1e-4, 10.0, 40001)


def _dense_first_crossing(dp, allow):
    """(last safe speed, first unsafe speed) of the dense scan; (None, None): never exceeded."""
    over = np.flatnonzero(dp > allow)
    if not over.size:
        return None, None
    i = int(over[0])
    return (DENSE[i - 1] if i else 0.0), DENSE[i]


def _assert_first_crossing(limit, dp_dense, allow, pressure_at):
    """``limit`` is the first crossing: no dense speed below it exceeds the allowance, and just
    above it the allowance is exceeded (so it is no speed below the true limit either)."""
    safe, unsafe = _dense_first_crossing(dp_dense, allow)
    below = DENSE < limit
    assert np.all(dp_dense[below] <= allow * (1 + 1e-12)), "an earlier crossing was skipped"
    if unsafe is None:
        assert limit == pytest.approx(DENSE[-1], rel=1e-6)  # not limited in the bracket
        return
    assert limit <= unsafe
    # the solver may resolve a crossing the dense scan steps over (a spike narrower than the
    # scan spacing); then Δp just above the limit exceeds the allowance
    assert limit >= safe * (1 - 1e-9) or pressure_at(limit * (1 + 1e-7)) > allow


# a closed string in one annular interval, method api13d_1995_power_law (invented values)
FLAT = dict(density=1440.0, tau_y=0.0, k=0.465, n=0.386, method=API95)
D2, D1, LENGTH = 0.288, 0.166, 585.0


def test_trip_limit_is_the_first_crossing_where_surge_falls_at_re_2100():
    dp = interval_surge(DENSE, D2, D1, LENGTH, **FLAT).total_pressure_change
    assert np.any(np.diff(dp) < 0)  # the surge falls where the annulus reaches Re = 2100
    drop = int(np.flatnonzero(np.diff(dp) < 0)[0])
    allow = 0.999 * dp[drop]  # just under the peak before the fall
    lim = trip_speed_limit(allow, D2, D1, LENGTH, **FLAT)

    def at(v):
        return interval_surge(v, D2, D1, LENGTH, **FLAT).total_pressure_change

    _assert_first_crossing(lim.max_speed, dp, allow, at)
    assert lim.pressure_at_limit <= allow * (1 + 1e-9)
    note = next(n for n in lim.notes if n.code == "non_monotone_curve")
    # the later crossing a search assuming a rising curve finds is a real crossing too, and
    # the dense scan shows speeds below it where the surge exceeds the allowance
    later = note.value("later").value
    assert note.value("first").value == lim.max_speed and note.value("first").kind == "trip_speed"
    assert later > 1.2 * lim.max_speed
    assert at(later) == pytest.approx(allow, rel=1e-6)
    assert np.any(dp[DENSE < later] > allow)


@settings(max_examples=25, deadline=None)
@given(
    d2=st.floats(0.15, 0.35),
    kappa=st.floats(0.3, 0.85),
    length=st.floats(200.0, 4000.0),
    density=st.floats(1000.0, 1900.0),
    k=st.floats(0.05, 2.0),
    n=st.floats(0.3, 0.95),
    where=st.floats(0.0, 1.0),
    scale=st.floats(0.9, 1.1),
)
def test_trip_limit_is_the_first_crossing_on_random_cases(
    d2, kappa, length, density, k, n, where, scale
):
    kw = dict(density=density, tau_y=0.0, k=k, n=n, method=API95)
    d1 = kappa * d2
    dp = interval_surge(DENSE, d2, d1, length, **kw).total_pressure_change
    falls = np.flatnonzero(np.diff(dp) < 0)
    # allowances near the peaks before a fall (where a rising-curve search goes wrong), or
    # anywhere on the curve when it has none
    i = int(falls[int(where * (falls.size - 1))]) if falls.size else int(where * (DENSE.size - 1))
    allow = scale * dp[i]
    lim = trip_speed_limit(allow, d2, d1, length, **kw)
    if lim.max_speed == 0.0:  # the slowest speed already exceeds it
        assert dp[0] >= allow * (1 - 1e-12) or allow <= 0
        return

    def at(v):
        return interval_surge(v, d2, d1, length, **kw).total_pressure_change

    _assert_first_crossing(lim.max_speed, dp, allow, at)


def test_demo_trip_limits_are_first_crossings_with_the_1995_method():
    w, f = demo_well(1), demo_fluid(API95, 1)
    lim = trip_speed_limits(
        w, f, window=demo_window(), weak_points=demo_weak_points(), fracture_margin=ppg(0.2),
        pore_margin=ppg(0.2), method=API95,
    )  # fmt: skip
    run = surge_pressure(w, f, DENSE, direction="running", method=API95)
    weights = depth_weights(lim.md, run.top_md, run.bottom_md)
    dp = np.asarray(run.interval_pressure) @ weights.T  # (speeds, depths), surge above each depth
    for j in range(lim.md.size):
        for limit, allow in (
            (lim.running_limit[j], lim.surge_allowance[j]),
            (lim.pulling_limit[j], lim.swab_allowance[j]),
        ):

            def at(v, j=j):
                r = surge_pressure(w, f, v, direction="running", method=API95)
                return float(np.asarray(r.interval_pressure) @ weights[j])

            _assert_first_crossing(limit, dp[:, j], allow, at)


def _no_tools(well):
    return dataclasses.replace(well, tool_drops=())


#: The vertical cleaning criteria alone (the deviated-hole methods' Q/Q_crit thresholds set so
#: low they never bind): the non-monotone cleaning margin this test walks lives in them.
VERTICAL_ONLY = CleaningCriteria(critical_ratio_adequate=1e-9, critical_ratio_poor=1e-9)


def _window(q, method=API95, margins=None):
    return operating_window(
        _no_tools(demo_well()), demo_fluid(method), q, window=demo_window(),
        weak_points=demo_weak_points(), margins=demo_margins() if margins is None else margins,
        surface_rating=demo_surface_rating(), method=method, rop=demo_rop(),
        cuttings=demo_cuttings(), criteria=VERTICAL_ONLY,
    )  # fmt: skip


def _dense_window(ow):
    """Widest run of the dense sweep meeting every limit: (first, last) rate of the run."""
    ok = np.all(np.stack(list(ow.limits.values())) >= 0, axis=0)
    edges = np.diff(np.concatenate([[0], ok.astype(int), [0]]))
    starts, stops = np.flatnonzero(edges == 1), np.flatnonzero(edges == -1) - 1
    j = int(np.argmax(stops - starts))
    return ow.q[starts[j]], ow.q[stops[j]], ok


def test_window_low_end_is_the_first_failing_rate_with_the_1995_method():
    # demo well without the tools' flow window, 1995 method, check D1: the cleaning margin
    # jumps down where annular rows reach Re = 2100, just above the sweep's first rate
    coarse = _window(to_si(np.linspace(100.0, 1200.0, 111), "gpm"))
    step = to_si(0.02, "gpm")
    dense = _window(np.arange(to_si(100.0, "gpm"), to_si(1200.0, "gpm"), step))
    lo, hi, ok = _dense_window(dense)
    assert coarse.feasible and coarse.binding_low == "hole cleaning"
    assert coarse.q_low == pytest.approx(lo, abs=step)
    assert coarse.q_high == pytest.approx(hi, abs=step)
    # the sweep's first rate meets every limit but rates just above it do not: the window
    # from the sweep alone started at 100 gpm, where the dense scan says it is cut off
    assert ok[0] and not ok[dense.q < lo].all()
    note = next(n for n in coarse.notes if n.code == "non_monotone_curve")
    assert note.value("interpolated").value == pytest.approx(to_si(100.0, "gpm"), rel=1e-12)
    assert note.value("rate").value == coarse.q_low and note.value("rate").kind == "flow_rate"
    assert any(n.code == "window_split" for n in coarse.notes)
