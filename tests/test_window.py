"""Operating window of flow rates on the demo well: limits, binding ends, property tests."""

import dataclasses

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from addin import text
from calc.circulation import Margins, circulate
from calc.cleaning import hole_cleaning
from calc.errors import InputError
from calc.rate_window import operating_window
from calc.units import to_si
from tests.cleaning_demo import (
    demo_cuttings,
    demo_fluid,
    demo_margins,
    demo_rop,
    demo_surface_rating,
    demo_weak_points,
    demo_well,
    demo_window,
    ppg,
)

Q = to_si(np.linspace(100.0, 1200.0, 111), "gpm")


def no_tools(well):
    return dataclasses.replace(well, tool_drops=())


def run(well=None, q=Q, margins=None, cuttings=True):
    w = demo_well() if well is None else well
    return operating_window(
        w, demo_fluid(), q, window=demo_window(), weak_points=demo_weak_points(),
        margins=demo_margins() if margins is None else margins,
        surface_rating=demo_surface_rating(), rop=demo_rop(),
        cuttings=demo_cuttings() if cuttings else None,
    )  # fmt: skip


def test_demo_window_tool_limits_bind():
    ow = run()
    assert ow.feasible
    # the RSS + MWD/LWD flow window 400-650 gpm (demo case) binds the high end; the low end is
    # the cleaning minimum rate (the deviated-hole methods at the 30° tangent ask for more than
    # the tools' 400 gpm: calc/METHODS.md §10.13)
    assert ow.q_low == pytest.approx(ow.min_cleaning_rate, rel=1e-9)
    assert ow.q_low > to_si(400.0, "gpm")
    assert ow.q_high == pytest.approx(to_si(650.0, "gpm"), rel=1e-9)
    assert ow.binding_low == "hole cleaning" and "flow window (max)" in ow.binding_high


def test_demo_window_without_tools():
    w = no_tools(demo_well())
    ow = run(w)
    assert ow.feasible
    assert ow.binding_low == "hole cleaning" and ow.binding_high == "surface rating"
    # low end: the cleaning minimum rate of calc.cleaning (sweep interpolation, 1 %)
    hc = hole_cleaning(w, demo_fluid(), 0.03, rop=demo_rop(), cuttings=demo_cuttings())
    assert ow.q_low == pytest.approx(hc.controlling_rate, rel=0.01)
    assert ow.min_cleaning_rate == pytest.approx(hc.controlling_rate, rel=1e-9)
    # high end: SPP equals the 5000 psi rating there (independent circulate call, 0.5 %)
    spp = circulate(w, demo_fluid(), ow.q_high).standpipe_pressure
    assert spp == pytest.approx(demo_surface_rating(), rel=5e-3)
    # curves for the report have one value per rate
    for curve in (ow.spp, ow.ecd_fracture_point, ow.ecd_pore_point, ow.cleaning_indicator):
        assert np.shape(curve) == Q.shape and np.all(np.isfinite(curve))
    inside = (ow.q >= ow.q_low) & (ow.q <= ow.q_high)
    assert np.all(ow.ecd_fracture_point[inside] <= ow.fracture_at_point[inside] - ppg(0.5) + 1e-9)


def test_impossible_margins_give_empty_window_with_note():
    ow = run(no_tools(demo_well()), margins=Margins(ppg(2.5), ppg(2.0)))
    assert not ow.feasible
    assert any(n.code == "no_operating_window" for n in ow.notes)


@settings(max_examples=6, deadline=None)
@given(m1=st.floats(0.0, 1.0), extra=st.floats(0.05, 1.0))
def test_window_shrinks_as_margin_grows(m1, extra):
    w = no_tools(demo_well())
    q = to_si(np.linspace(100.0, 1400.0, 53), "gpm")
    a = run(w, q, Margins(ppg(m1), ppg(0.2)), cuttings=False)
    b = run(w, q, Margins(ppg(m1 + extra), ppg(0.2)), cuttings=False)
    if b.feasible:
        assert a.feasible
        assert b.q_high <= a.q_high + 1e-12 and b.q_low >= a.q_low - 1e-12
    assert np.all(b.limits["fracture"] <= a.limits["fracture"] + 1e-12)


def test_sweep_must_increase():
    with pytest.raises(InputError, match="sweep"):
        run(q=to_si(np.array([500.0, 400.0, 600.0]), "gpm"))


def test_ecd_limit_curves_and_point_depths_in_units():
    m = demo_margins()
    w = demo_well()
    kw = dict(window=demo_window(), weak_points=demo_weak_points(), margins=m)
    ow = operating_window(w, demo_fluid(), Q[:20], **kw)
    # the limits returned are the tightest points' fracture − margin and pore + margin
    assert np.allclose(ow.ecd_max_at_point, np.asarray(ow.fracture_at_point) - m.fracture)
    assert np.allclose(ow.ecd_min_at_point, np.asarray(ow.pore_at_point) + m.pore)
    # the tightest points come with their depths [m]; the face says them in the case's units
    assert np.all((ow.pore_point_md > 0) & (ow.pore_point_md <= w.bit_depth + 1e-9))
    assert np.allclose(w.tvd_at(ow.fracture_point_md), ow.fracture_point_tvd)
    checked = 0
    for words, md, tvd in (
        (
            [text.check_point(p, "metric") for p in ow.fracture_point_name],
            ow.fracture_point_md,
            ow.fracture_point_tvd,
        ),
        (
            [text.check_point(p, "metric") for p in ow.pore_point_name],
            ow.pore_point_md,
            ow.pore_point_tvd,
        ),
    ):
        assert all(" ft" not in x for x in words)
        for i, x in enumerate(words):
            if x.startswith("MD "):
                assert x == f"MD {md[i]:,.1f} m"
                checked += 1
            elif x.startswith("window station"):
                assert x == f"window station, TVD {tvd[i]:,.1f} m"
                checked += 1
    assert checked
