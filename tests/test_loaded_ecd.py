"""Cuttings-loaded ECD in the headline: loaded ECD = clean ECD + the hydrostatic of the cuttings
load (integrated here independently along the survey), margins from the loaded ECD, and the
operating window's top end on the loaded ECD as the first crossing of a dense scan.

References: hydrostatics p = ∫ρ g dTVD (exact, the definition of EMW: EMW = p/(g·TVD)); the
window reference is a brute-force dense scan of the public calc functions, as in
tests/test_first_crossing.py.  Demo data invented.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

from calc.circulation import circulate
from calc.cleaning import hole_cleaning, loaded_margins
from calc.errors import InputError
from calc.rate_window import operating_window
from calc.units import to_si
from tests._report_demo import demo_results
from tests.cleaning_demo import (
    demo_cuttings,
    demo_fluid,
    demo_margins,
    demo_rop,
    demo_weak_points,
    demo_well,
    demo_window,
)


def _load_hydrostatic(well, loaded_density, rho, md):
    """EMW of the cuttings load above each depth ``md`` [kg/m³]: Σ_i (ρ_i − ρ)·s_i·ΔTVD_i / TVD,
    with ΔTVD_i the survey TVD over the part of interval i above md (well.tvd_at at both ends,
    not a linear share) and s_i the interval row's share of its MD span (pipe body and
    tool-joint rows of one span split it by length)."""
    a = well.flow_intervals().annulus
    top, bot = np.asarray(a.top_md, float), np.asarray(a.bottom_md, float)
    share = np.asarray(a.length, float) / (bot - top)
    md = np.atleast_1d(np.asarray(md, float))
    out = []
    for z in md:
        lo = np.minimum(top, z)
        hi = np.minimum(bot, z)
        dtvd = np.asarray(well.tvd_at(hi)) - np.asarray(well.tvd_at(np.maximum(lo, 0.0)))
        dtvd = np.where(hi > lo, dtvd, 0.0)
        load = (np.asarray(loaded_density, float) - rho) * share * dtvd  # per unit g
        out.append(load.sum(axis=-1) / float(well.tvd_at(z)))
    return np.moveaxis(np.array(out), 0, -1)


def test_loaded_ecd_at_the_bit_is_clean_plus_the_cuttings_hydrostatic():
    r = demo_results()
    res, hc, ld = r.circulation, r.cleaning.result, r.loaded
    extra = float(_load_hydrostatic(r.well, hc.transport.loaded_density, res.density,
                                    res.bit_md)[0])  # fmt: skip
    assert extra > 0
    # at the bit every interval lies wholly above: the integral is exact, rel 1e-12
    assert ld.ecd_bit == pytest.approx(float(res.ecd_bit) + extra, rel=1e-12)
    assert ld.increment_bit == pytest.approx(extra, rel=1e-9)
    # about +0.06 ppg on the demo (regression value, reviewed)
    assert to_si(0.04, "ppg") < ld.increment_bit < to_si(0.08, "ppg")


def test_loaded_margins_use_the_loaded_ecd():
    r = demo_results()
    res, hc, ld = r.circulation, r.cleaning.result, r.loaded
    mt, lm = res.margins, ld.margins
    extra = _load_hydrostatic(r.well, hc.transport.loaded_density, res.density, mt.md)
    # partial intervals at a check point: TVD not linear in MD inside an interval → 1e-3
    np.testing.assert_allclose(np.asarray(lm.ecd) - np.asarray(mt.ecd), extra, rtol=1e-3,
                               atol=1e-6)  # fmt: skip
    np.testing.assert_allclose(lm.fracture_margin, np.asarray(mt.fracture) - lm.ecd, rtol=1e-12)
    # pore margin stays on the clean ECD (the lower, conservative value)
    np.testing.assert_allclose(lm.pore_margin, np.asarray(mt.ecd) - mt.pore, rtol=1e-12)
    both = np.concatenate([np.ravel(lm.fracture_margin), np.ravel(lm.pore_margin)])
    assert float(lm.tightest.margin) == pytest.approx(float(np.nanmin(both)), rel=1e-12)
    # the loaded fracture margin is smaller than the clean one by the load
    assert float(lm.tightest.margin) < float(mt.tightest.margin)


def test_summary_rows_show_loaded_and_clean_ecd():
    from addin.report.summary_rows import summary_rows

    r = demo_results()
    refs = {
        "ecd": {"ecd_bit": (None, "X"), "hydrostatic": (None, "X"),
                "tightest": r.loaded.margins.tightest},
        "hydraulics": {"spp": (None, "X")},
        "bit": {"dp": (None, "X"), "hsi": (None, "X")},
    }  # fmt: skip
    rows = {row["name"]: row for row in summary_rows(r, refs)}
    lb, cb = rows["ECD at the bit, cuttings-loaded"], rows["ECD at the bit, clean mud"]
    assert lb["value"] == pytest.approx(r.loaded.ecd_bit)
    assert cb["value"] == pytest.approx(float(r.circulation.ecd_bit))
    assert lb["margin"] == pytest.approx(lb["limit"] - lb["value"], rel=1e-12)
    shoe = next(k for k in rows if k.startswith("ECD at the") and "shoe" in k)
    assert shoe.endswith(", cuttings-loaded")
    i = r.loaded.margins.index("shoe")
    assert rows[shoe]["value"] == pytest.approx(float(np.ravel(r.loaded.margins.ecd)[i]))
    assert any("loaded ECD" in k for k in rows if k.startswith("tightest margin"))


def test_loaded_margins_refuse_a_sweep():
    w, fl = demo_well(), demo_fluid()
    q = np.array([0.03, 0.04])
    hc = hole_cleaning(w, fl, q, rop=demo_rop(), cuttings=demo_cuttings())
    res = circulate(w, fl, 0.03, window=demo_window(), weak_points=demo_weak_points())
    with pytest.raises(InputError):
        loaded_margins(res.margins, hc, w, float(fl.density))


# -- operating window: the loaded top end is the first crossing ---------------------------------

Q = to_si(np.linspace(300.0, 1200.0, 91), "gpm")
DENSE = to_si(np.linspace(600.0, 1000.0, 2001), "gpm")  # 0.2 gpm apart


def _window(ecd_basis):
    w = dataclasses.replace(demo_well(), tool_drops=())  # no tool flow window: fracture binds
    return w, operating_window(
        w, demo_fluid(), Q, window=demo_window(), weak_points=demo_weak_points(),
        margins=demo_margins(), surface_rating=None, rop=demo_rop(), cuttings=demo_cuttings(),
        ecd_basis=ecd_basis,
    )  # fmt: skip


def _dense_fracture_margin(w, loaded: bool):
    """fracture − ECD − margin at the tightest check point over DENSE, from circulate and
    hole_cleaning with the load integrated here (not by calc's cuttings_ecd_increment)."""
    fl, m = demo_fluid(), demo_margins()
    res = circulate(w, fl, DENSE, window=demo_window(), weak_points=demo_weak_points(), margins=m)
    ecd = np.asarray(res.margins.ecd)
    if loaded:
        hc = hole_cleaning(w, fl, DENSE, rop=demo_rop(), cuttings=demo_cuttings())
        ecd = ecd + _load_hydrostatic(w, hc.transport.loaded_density, float(fl.density),
                                      res.margins.md)  # fmt: skip
    return (np.asarray(res.margins.fracture)[None, :] - ecd - m.fracture).min(axis=-1)


@pytest.mark.parametrize("basis", ["loaded", "clean"])
def test_window_top_end_is_the_first_fracture_crossing(basis):
    w, ow = _window(basis)
    assert ow.feasible and ow.binding_high == "fracture"
    assert ow.ecd_basis == basis and ow.loaded == (basis == "loaded")
    fm = _dense_fracture_margin(w, basis == "loaded")
    over = np.flatnonzero(fm < 0)
    assert over.size and over[0] > 0
    first_bad, last_ok = DENSE[over[0]], DENSE[over[0] - 1]
    # no dense rate below the reported end fails (within the load-integration tolerance)
    assert np.all(fm[DENSE < ow.q_high] >= -1e-3)
    assert last_ok * (1 - 2e-3) <= ow.q_high <= first_bad * (1 + 2e-3)


def test_loaded_window_ends_below_the_clean_one():
    _, lo = _window("loaded")
    _, cl = _window("clean")
    # the cuttings load raises ECD, so fracture binds at a lower rate
    assert lo.q_high < cl.q_high
    assert np.all(lo.ecd_fracture_point >= lo.ecd_clean_fracture_point)
    np.testing.assert_allclose(cl.ecd_fracture_point, cl.ecd_clean_fracture_point, rtol=0)


def test_ecd_basis_is_checked():
    with pytest.raises(InputError) as e:
        _window("dirty")
    assert e.value.name == "ECD basis"
