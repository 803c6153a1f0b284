"""The whole circulating loop: consistency with calc.flow/calc.bit, exact laminar solutions,
hydrostatics in a deviated well, ECD identities, sweeps, calibration, notes and bad input.

External references are named beside each check: Hagen-Poiseuille and Lamb's concentric-annulus
solution (Bird, Stewart & Lightfoot (2002) *Transport Phenomena*, 2nd ed., §2.3-2.4), the
Bernoulli nozzle equation with a discharge coefficient (Bourgoyne et al. (1986) ch. 4), the
0.052 psi/ft per ppg constant (common practice) and ECD = ρ + Δp_ann/(g·TVD) (calc/METHODS.md §9.3).
"""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from addin import text
from calc.bit import Bit
from calc.circulation import (
    CALIBRATION_LABEL,
    HydraulicsFluid,
    Margins,
    PressureWindow,
    WeakPoint,
    calibrate_friction,
    circulate,
)
from calc.errors import InputError
from calc.flow import annulus_flow, pipe_flow
from calc.geometry import (
    DrillString,
    Hole,
    HoleSection,
    StringComponent,
    SurfaceLine,
    Survey,
    ToolPressureDrop,
    Well,
)
from calc.rheology import HerschelBulkley, Newtonian
from calc.units import G_N, from_si, to_si

INC = 30.0  # degrees, straight slant hole below a vertical section


def simple_well(
    bit_md=3000.0, inc=INC, lines=True, tools=True, tool_joints=False, kop=500.0
) -> Well:
    """Vertical to ``kop``, then an instantaneous-free straight slant (a 1 m build is avoided:
    stations at 0 and kop vertical, then a long hold at ``inc`` reached over 1 m)."""
    survey = Survey(
        [0.0, kop, kop + 1.0, bit_md + 100.0], [0.0, 0.0, inc, inc], [0.0, 0.0, 90.0, 90.0]
    )
    casing = HoleSection("casing", 0.0, 1500.0, 0.2245, "casing", shoe_test=1750.0)
    hole = Hole.from_casing([casing], depth=bit_md, bit_size=0.2159, diameter=0.2159)
    tj = {}
    if tool_joints:
        tj = dict(
            tool_joint_od=0.168, tool_joint_id=0.0826, joint_length=9.6, tool_joint_length=0.5
        )
    string = DrillString(
        [
            StringComponent("collars", 0.165, 0.0714, 150.0),
            StringComponent("drill pipe", 0.127, 0.1086, "fill", **tj),
        ]
    )
    bit = Bit(0.2159, nozzles=(12, 12, 12, 11, 11, 11), discharge_coefficient=0.95)
    sl = (
        [SurfaceLine("standpipe", 27.0, 0.1016), SurfaceLine("hose", 20.0, 0.0762)] if lines else []
    )
    td = (
        [ToolPressureDrop(2.2e6, 1318.0, 0.0328, flow_window=(0.025, 0.041), name="MWD")]
        if tools
        else []
    )
    return Well(survey, hole, string, bit, sl, td, bit_md)


def hb_fluid(rho=1318.0):
    m = HerschelBulkley(3.06, 0.215, 0.69)
    return HydraulicsFluid(rho, m, m, "HB test fluid")


Q = to_si(522.0, "gpm")


def test_breakdown_equals_the_flow_and_bit_results_it_is_made_of():
    # Consistency: every component re-computed independently with calc.flow / calc.bit.
    well = simple_well()
    fl = hb_fluid()
    r = circulate(well, fl, Q)
    ty, k, n = fl.pipe_parameters
    iv = well.flow_intervals()
    s, a = iv.select("string"), iv.select("annulus")
    fs = pipe_flow(Q, s.outer_diameter, density=1318.0, tau_y=ty, k=k, n=n)
    assert r.string.losses == pytest.approx(fs.gradient * s.length, rel=1e-12)
    fa = annulus_flow(Q, a.outer_diameter, a.inner_diameter, density=1318.0, tau_y=ty, k=k, n=n)
    assert r.annulus.losses == pytest.approx(fa.gradient * a.length, rel=1e-12)
    fl_lines = pipe_flow(Q, np.array([0.1016, 0.0762]), density=1318.0, tau_y=ty, k=k, n=n)
    assert r.surface.losses == pytest.approx(fl_lines.gradient * np.array([27.0, 20.0]), rel=1e-12)
    assert r.tools.total == pytest.approx(2.2e6 * (Q / 0.0328) ** 2, rel=1e-12)
    parts = sum(r.breakdown().values())
    assert r.standpipe_pressure == pytest.approx(parts, rel=1e-14)
    assert r.pump_power == pytest.approx(r.standpipe_pressure * Q, rel=1e-14)
    assert r.bit.share_of_standpipe == pytest.approx(r.bit.pressure_drop / r.standpipe_pressure)


def test_pipe_only_loop_newtonian_laminar_equals_hagen_poiseuille_and_lamb():
    # A viscous Newtonian fluid at a low rate is laminar everywhere.  Exact solutions:
    # pipe Δp = 128μQL/(πD⁴) (Hagen-Poiseuille); annulus Q = πG/(8μ)[R2⁴ − R1⁴ −
    # (R2² − R1²)²/ln(R2/R1)] (Lamb; Bird, Stewart & Lightfoot 2002 §2.4);
    # bit Δp = ρQ²/(2C_d²A²) (Bernoulli with discharge coefficient, Bourgoyne et al. 1986 ch. 4).
    well = simple_well(tools=False)
    mu, rho, q = 0.5, 1200.0, to_si(80.0, "gpm")
    fl = HydraulicsFluid(rho, Newtonian(mu), Newtonian(mu))
    r = circulate(well, fl, q, method="exact_laminar")
    iv = well.flow_intervals()
    s, a = iv.select("string"), iv.select("annulus")
    hp = 128 * mu * q * s.length / (np.pi * s.outer_diameter**4)
    assert r.string.losses == pytest.approx(hp, rel=1e-6)
    lines_hp = 128 * mu * q * np.array([27.0, 20.0]) / (np.pi * np.array([0.1016, 0.0762]) ** 4)
    assert r.surface.losses == pytest.approx(lines_hp, rel=1e-6)
    r2, r1 = a.outer_diameter / 2, a.inner_diameter / 2
    lamb = 8 * mu * q / (np.pi * (r2**4 - r1**4 - (r2**2 - r1**2) ** 2 / np.log(r2 / r1)))
    assert r.annulus.losses == pytest.approx(lamb * a.length, rel=1e-6)
    bit = well.bit
    jet = rho * q**2 / (2 * bit.discharge_coefficient**2 * bit.tfa**2)
    assert r.bit.pressure_drop == pytest.approx(jet, rel=1e-12)
    total = hp.sum() + lines_hp.sum() + (lamb * a.length).sum() + jet
    assert r.standpipe_pressure == pytest.approx(total, rel=1e-6)
    assert np.all(np.asarray(r.annulus.flow.regime) == 0)


def test_hydrostatics_in_a_slant_well():
    # Straight hold at 30°: TVD = kop + 1 m·(chord of the 1 m build) + (MD − kop − 1)·cos 30°.
    # Static BHP = ρ·g·TVD (exact) and 0.052·ρ[ppg]·TVD[ft] psi (common practice).
    well = simple_well()
    rho = to_si(11.0, "ppg")
    r = circulate(well, hb_fluid(rho), Q)
    build = 1.0 * np.sin(np.radians(INC)) / np.radians(INC)  # arc of a circle: ΔTVD = R sin β
    tvd = 500.0 + build + (3000.0 - 501.0) * np.cos(np.radians(INC))
    assert r.bit_tvd == pytest.approx(tvd, rel=1e-9)
    assert r.static_bhp == pytest.approx(rho * G_N * tvd, rel=1e-9)
    r052 = circulate(well, hb_fluid(rho), Q, hydrostatic="0.052")
    assert from_si(r052.static_bhp, "psi") == pytest.approx(
        0.052 * 11.0 * from_si(tvd, "ft"), rel=1e-9
    )
    assert r.circulating_bhp == pytest.approx(r.static_bhp + r.annulus.total, rel=1e-14)


def test_ecd_identity_at_bit_and_along_the_annulus():
    # ECD = ρ + Δp_ann(above)/(g·TVD) (calc/METHODS.md §9.3); at the bit Δp_ann is the
    # whole annulus.
    well = simple_well()
    rho = 1318.0
    pb = to_si(150.0, "psi")
    r = circulate(well, hb_fluid(rho), Q, back_pressure=pb)
    assert r.ecd_bit == pytest.approx(rho + (r.annulus.total + pb) / (G_N * r.bit_tvd), rel=1e-12)
    assert r.ecd_at(3000.0) == pytest.approx(r.ecd_bit, rel=1e-12)
    assert r.annular_loss_above(3000.0) == pytest.approx(r.annulus.total, rel=1e-12)
    # at the casing shoe (an interval boundary): the sum of the annular rows above it
    a = well.flow_intervals().select("annulus")
    above = np.asarray(r.annulus.losses)[a.bottom_md <= 1500.0 + 1e-9].sum()
    tvd_shoe = well.survey.tvd_at(1500.0)
    assert r.ecd_at(1500.0) == pytest.approx(rho + (above + pb) / (G_N * tvd_shoe), rel=1e-12)
    assert r.standpipe_pressure == pytest.approx(sum(r.breakdown().values()), rel=1e-14)
    p = r.profile(25.0)
    assert np.all(np.diff(r.annular_loss_above(p.md)) >= 0)
    assert p.ecd[-1] == pytest.approx(r.ecd_bit, rel=1e-12)
    assert p.md[-1] == pytest.approx(3000.0) and p.tvd.shape == p.md.shape


def test_tool_joints_raise_annular_loss():
    # Tool-joint sub-intervals narrow the annulus over their share of each joint: more loss
    # (physical expectation; exact laminar flow loss falls with the gap).
    base = circulate(simple_well(), hb_fluid(), Q).annulus.total
    tj = circulate(simple_well(tool_joints=True), hb_fluid(), Q).annulus.total
    assert tj > base


def test_sweep_equals_per_rate_calls_and_density_sweep():
    # One numpy pass over rates (and densities) gives the same numbers as scalar calls.
    well = simple_well()
    fl = hb_fluid()
    qs = to_si(np.array([250.0, 400.0, 522.0, 700.0]), "gpm")
    opts = dict(window=_window(), weak_points=(WeakPoint("sand", 2500.0, 1500.0, 1100.0),))
    rs = circulate(well, fl, qs, **opts)
    assert np.shape(rs.standpipe_pressure) == (4,)
    assert np.shape(rs.annulus.losses) == (4, len(rs.annulus.spans))
    assert np.shape(rs.annulus.flow.velocity) == (4, len(rs.annulus.spans))
    for i, q in enumerate(qs):
        r1 = circulate(well, fl, float(q), **opts)
        assert isinstance(r1.standpipe_pressure, float)
        assert rs.standpipe_pressure[i] == pytest.approx(r1.standpipe_pressure, rel=1e-12)
        assert rs.ecd_bit[i] == pytest.approx(r1.ecd_bit, rel=1e-12)
        assert rs.margins.tightest.margin[i] == pytest.approx(r1.margins.tightest.margin)
        assert rs.margins.tightest.point[i] == r1.margins.tightest.point
        assert rs.bit.pressure_drop[i] == pytest.approx(r1.bit.pressure_drop, rel=1e-12)
    rhos = np.array([1100.0, 1318.0, 1500.0])
    m = HerschelBulkley(3.06, 0.215, 0.69)
    rd = circulate(well, HydraulicsFluid(rhos[:, None], m, m), qs[None, :])
    assert np.shape(rd.standpipe_pressure) == (3, 4)
    single = circulate(well, HydraulicsFluid(1500.0, m, m), float(qs[1]))
    assert rd.standpipe_pressure[2, 1] == pytest.approx(single.standpipe_pressure, rel=1e-12)
    assert np.shape(rd.ecd_at(np.array([1000.0, 2000.0]))) == (3, 4, 2)


hb_params = st.tuples(
    st.floats(0.0, 10.0),  # τy [Pa]
    st.floats(0.02, 2.0),  # K [Pa·sⁿ]
    st.floats(0.3, 1.0),  # n
    st.floats(1000.0, 2000.0),  # ρ [kg/m³]
)


@settings(max_examples=15, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(hb_params, st.sampled_from(["api13d_2010_hb", "bingham", "power_law", "newtonian"]))
def test_property_spp_non_decreasing_with_rate_and_ecd_at_least_esd(params, method):
    # Properties (DESIGN §tests): loss non-decreasing with flow rate; ECD ≥ ESD while circulating.
    ty, k, n, rho = params
    if method == "power_law":
        ty = 0.0
    if method == "bingham":
        n = 1.0
    if method == "newtonian":
        ty, n = 0.0, 1.0
    m = HerschelBulkley(ty, k, n)
    well = simple_well(tool_joints=True)
    qs = to_si(np.linspace(50.0, 900.0, 60), "gpm")
    r = circulate(well, HydraulicsFluid(rho, m, m), qs, method=method)
    spp = np.asarray(r.standpipe_pressure)
    assert np.all(np.diff(spp) >= -1e-9 * spp[1:]), "SPP fell as the rate rose"
    p = r.profile(50.0)
    assert np.all(p.ecd >= p.esd * (1 - 1e-14)), "ECD below ESD while circulating"


def test_exact_laminar_spp_non_decreasing_with_rate():
    # Same property for the exact laminar method (slower: fewer rates, one fluid).
    m = HerschelBulkley(4.0, 0.3, 0.65)
    qs = to_si(np.linspace(50.0, 900.0, 12), "gpm")
    r = circulate(simple_well(), HydraulicsFluid(1300.0, m, m), qs, method="exact_laminar")
    assert np.all(np.diff(np.asarray(r.standpipe_pressure)) > 0)


def _window():
    return PressureWindow([0.0, 3000.0], [1000.0, 1200.0], [1700.0, 1800.0])


def test_margins_and_tightest_point():
    well = simple_well()
    weak = WeakPoint("depleted sand", 2000.0, fracture=1400.0, pore=1050.0)
    r = circulate(well, hb_fluid(1318.0), Q, window=_window(), weak_points=(weak,))
    t = r.margins.tightest
    # the weak sand (fracture EMW 1400) is far tighter than the window (≥ 1700)
    assert t.point.name == "depleted sand" and t.limit == "fracture"
    assert t.point.role == "weak_point"
    assert t.margin == pytest.approx(1400.0 - r.ecd_at(2000.0), rel=1e-12)
    names = [p.name for p in r.margins.points]
    assert "casing shoe" in names and "bit" in names
    # the shoe takes its shoe test as fracture EMW
    j = names.index("casing shoe")
    assert r.margins.points[j].role == "shoe" and r.margins.index("shoe") == j
    assert r.margins.fracture[j] == pytest.approx(1750.0)
    assert r.margins.md.min() >= 1500.0  # exposed formation only: last shoe to bit


def test_notes_margins_pore_rating_and_tool_window():
    well = simple_well()
    weak = WeakPoint("depleted sand", 2000.0, fracture=1400.0, pore=1050.0)
    r = circulate(
        well,
        hb_fluid(1318.0),
        Q,
        window=PressureWindow([0.0, 3000.0], [1300.0, 1340.0], [1700.0, 1800.0]),
        weak_points=(weak, WeakPoint("below the bit", 3500.0, 1600.0)),
        margins=Margins(fracture=100.0, pore=150.0),
        surface_rating=to_si(1000.0, "psi"),
    )
    codes = {n.code for n in r.notes}
    assert {"ecd_near_fracture", "ecd_near_pore", "static_below_pore", "spp_above_rating"} <= codes
    assert "weak_point_not_reached" in codes
    wc = next(n for n in r.notes if n.code == "static_below_pore")
    # wording required by common practice (calc/METHODS.md §16.5)
    assert "this tool does not assess well control; follow your procedures" in text.note(wc).lower()
    slow = circulate(well, hb_fluid(), to_si(300.0, "gpm"))
    assert "tool_flow_window" in {n.code for n in slow.notes}
    lam = circulate(well, hb_fluid(), to_si(100.0, "gpm"))
    assert "below_critical_velocity" in {n.code for n in lam.notes}


def test_transitional_flow_note():
    # A Newtonian fluid whose annular Reynolds number falls in the transitional band at some
    # rate of a sweep: the note names the interval(s).
    well = simple_well(tools=False, lines=False)
    fl = HydraulicsFluid(1000.0, Newtonian(0.01), Newtonian(0.01))
    r = circulate(well, fl, to_si(np.linspace(5.0, 200.0, 300), "gpm"), method="newtonian")
    regimes = np.unique(np.asarray(r.annulus.flow.regime))
    assert 1 in regimes
    assert "transitional_flow" in {n.code for n in r.notes}


def test_friction_multiplier_scales_friction_only():
    well = simple_well()
    a = circulate(well, hb_fluid(), Q)
    b = circulate(well, hb_fluid(), Q, friction_multiplier=1.2)
    assert b.frictional_loss == pytest.approx(1.2 * a.frictional_loss, rel=1e-12)
    assert b.bit.pressure_drop == pytest.approx(
        a.bit.pressure_drop
    ) and b.tools.total == pytest.approx(a.tools.total)
    assert b.ecd_bit > a.ecd_bit


def test_calibration_reproduces_the_measured_spp():
    # m = (p_meas − fixed)/friction (module docstring); exact for the model by linearity.
    well = simple_well()
    pred = circulate(well, hb_fluid(), Q).standpipe_pressure
    meas = 1.08 * pred
    cal = calibrate_friction(well, hb_fluid(), Q, meas)
    assert cal.label == CALIBRATION_LABEL and "CALIBRATION" in cal.label
    # one definition (calc.circulation.spp_deviation[_percent]): predicted − measured, relative
    # to the measurement: 100·(1 − 1.08)/1.08
    assert cal.deviation == pytest.approx(pred - meas, rel=1e-12)
    assert cal.deviation_percent == pytest.approx(100.0 * (1.0 - 1.08) / 1.08, rel=1e-9)
    assert cal.calibrated.standpipe_pressure == pytest.approx(meas, rel=1e-12)
    fixed = pred - cal.predicted.frictional_loss
    assert cal.multiplier == pytest.approx((meas - fixed) / cal.predicted.frictional_loss)
    assert cal.multiplier > 1.0
    assert cal.calibrated.bit.pressure_drop == pytest.approx(cal.predicted.bit.pressure_drop)
    assert any(n.code == "calibration" for n in cal.notes)
    far = calibrate_friction(well, hb_fluid(), Q, 1.5 * pred)
    assert "spp_gap" in {n.code for n in far.notes}
    with pytest.raises(InputError, match="measured standpipe pressure"):
        calibrate_friction(well, hb_fluid(), Q, 0.5 * fixed)
    with pytest.raises(InputError, match="friction_multiplier"):
        calibrate_friction(well, hb_fluid(), Q, meas, friction_multiplier=1.1)
    arr = calibrate_friction(well, hb_fluid(), np.array([Q, 0.8 * Q]), np.array([meas, meas]))
    assert np.shape(arr.multiplier) == (2,)


@pytest.mark.parametrize(
    ("kwargs", "name"),
    [
        (dict(q=0.0), "flow rate"),
        (dict(q=-0.01), "flow rate"),
        (dict(q=float("nan")), "flow rate"),
        (dict(method="api13d_2011_hb"), "hydraulics method"),
        (dict(eccentricity=1.0), "eccentricity"),
        (dict(hydrostatic="0.05"), "hydrostatic"),
        (dict(friction_multiplier=0.0), "friction multiplier"),
        (dict(back_pressure=-1.0), "back pressure"),
        (dict(margin_step=0.0), "margin step"),
        (dict(window="14 ppg"), "window"),
    ],
)
def test_bad_input(kwargs, name):
    well = simple_well()
    q = kwargs.pop("q", Q)
    with pytest.raises(InputError, match=name):
        circulate(well, hb_fluid(), q, **kwargs)


def test_bad_fluid_and_ecd_depth():
    with pytest.raises(InputError, match="density"):
        HydraulicsFluid(-1.0, Newtonian(0.01), Newtonian(0.01))
    with pytest.raises(InputError, match="rheology model"):
        HydraulicsFluid(1000.0, object(), Newtonian(0.01))
    with pytest.raises(InputError, match="fluid"):
        circulate(simple_well(), "mud", Q)
    r = circulate(simple_well(), hb_fluid(), Q)
    with pytest.raises(InputError, match="MD"):
        r.ecd_at(3500.0)
    with pytest.raises(InputError, match="MD"):
        r.ecd_at(0.0)


# ------------------------------------------------------------------ tool drops covering bores
def _covered_well(components=("collars",)):
    w = simple_well()
    t = w.tool_drops[0]
    tool = ToolPressureDrop(
        t.reference_drop, t.reference_density, t.reference_rate, name="MWD",
        flow_window=t.flow_window, components=components,
    )  # fmt: skip
    return Well(w.survey, w.hole, w.string, w.bit, w.surface_lines, [tool], w.bit_depth)


def test_tool_drop_covering_a_bore_removes_exactly_that_bore_friction():
    # Newtonian water-like fluid, turbulent in the 0.0714 m collar bore.  The bore friction the
    # covered run must no longer carry is the Darcy-Weisbach loss f·(L/D)·ρV²/2 with f from
    # fluids.friction.friction_factor(Method="Colebrook", smooth pipe) (fluids, PyPI; within 1 %).
    import fluids.friction

    rho, mu = 1000.0, 0.001
    fl = HydraulicsFluid(rho, Newtonian(mu), Newtonian(mu), "water")
    plain = circulate(simple_well(), fl, Q, method="newtonian")
    cov = circulate(_covered_well(), fl, Q, method="newtonian")
    d, length = 0.0714, 150.0
    v = Q / (np.pi / 4 * d**2)
    f = fluids.friction.friction_factor(Re=rho * v * d / mu, eD=0.0, Method="Colebrook")
    darcy = f * length / d * rho * v**2 / 2
    assert plain.standpipe_pressure - cov.standpipe_pressure == pytest.approx(darcy, rel=0.01)
    # bookkeeping: only the collar rows are zeroed; tool, bit and annulus are unchanged
    names = np.array([s.item == "collars" for s in cov.string.spans])
    assert np.all(np.asarray(cov.string.losses)[names] == 0.0)
    np.testing.assert_array_equal(
        np.asarray(cov.string.losses)[~names], np.asarray(plain.string.losses)[~names]
    )
    assert cov.tools.total == plain.tools.total and cov.annulus.total == plain.annulus.total
    assert cov.ecd_bit == plain.ecd_bit  # the annulus is untouched
    assert cov.tools.covered == ("collars",) and plain.tools.covered == ()
    assert "bore_covered_by_tool_drop" in {n.code for n in cov.notes}


def test_calibration_with_covered_bores_keeps_the_tool_drop_fixed():
    # m = (p_meas − fixed)/friction (calibration module docstring): the covered bore is in
    # neither part, so the calibrated SPP still reproduces the measurement exactly.
    well = _covered_well()
    pred = circulate(well, hb_fluid(), Q).standpipe_pressure
    cal = calibrate_friction(well, hb_fluid(), Q, 1.05 * pred)
    assert cal.calibrated.standpipe_pressure == pytest.approx(1.05 * pred, rel=1e-12)
    assert cal.calibrated.tools.total == pytest.approx(cal.predicted.tools.total, rel=1e-14)


def test_interval_spans_and_sweep_notes_in_the_faces_units():
    # 1 ft = 0.3048 m exactly (NIST SP 811): the spans are SI, the faces word them in ft or m
    well = simple_well()
    r = circulate(well, hb_fluid(), Q)
    iv = well.flow_intervals()
    assert r.string.spans == iv.string.spans() and r.annulus.spans == iv.annulus.spans()
    assert {s.path for s in r.string.spans} == {"string"}
    assert all(s.section for s in r.annulus.spans)
    oil = [text.span(s, "oilfield") for s in r.string.spans + r.annulus.spans]
    met = [text.span(s, "metric") for s in r.string.spans + r.annulus.spans]
    assert all(n.endswith(" ft") for n in oil) and all(n.endswith(" m") for n in met)
    top, bot = 0.0, 500.0  # the first string interval: surface to the kick-off station
    s0 = r.string.spans[0]
    assert (s0.top_md, s0.bottom_md) == (top, bot)
    assert f"MD {top / 0.3048:,.0f}-{bot / 0.3048:,.0f} ft" in text.span(s0, "oilfield")
    sweep = circulate(well, hb_fluid(), np.linspace(0.3, 1.6, 5) * Q)
    texts = " ".join(text.note(n, "oilfield") for n in sweep.notes)
    assert "m³/s" not in texts and "gpm" in texts
    ranged = [v for n in sweep.notes for v in n.values if v.name == "rates"]
    assert ranged and all(v.kind == "flow_rate" and len(v.value) == 2 for v in ranged)
