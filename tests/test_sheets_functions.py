"""Each worksheet function called as a spreadsheet would call it, compared with calc directly,
plus one end-to-end external value per family (source named beside it)."""

import math

import numpy as np
import pytest

from addin.sheets.functions import (
    BF_ANN_VEL,
    BF_AV,
    BF_BIT,
    BF_BIT_DP,
    BF_BIT_HHP,
    BF_CAUTION,
    BF_CCI,
    BF_CONVERT,
    BF_CUTTINGS_CONC,
    BF_ECD,
    BF_EMW,
    BF_FIT,
    BF_FITS,
    BF_HSI,
    BF_HYDROSTATIC,
    BF_IMPACT,
    BF_JET_VEL,
    BF_K,
    BF_LSYP,
    BF_N,
    BF_PV,
    BF_SHEAR_RATE,
    BF_SLIP,
    BF_STRESS,
    BF_TAU_Y,
    BF_TFA,
    BF_TRANSPORT,
    BF_TRANSPORT_RATIO,
    BF_UNIT,
    BF_UNITS,
    BF_VERSION,
    BF_VISC,
    BF_YP,
    MARK,
)
from calc import bit as cb
from calc import cautions
from calc import circulation as cc
from calc import rheology as cr
from calc import units as cu
from calc.cleaning.indicators import carrying_capacity_index
from calc.cleaning.transport import Cuttings, annular_transport, annular_velocity

# The D1 05:30 check of the invented demo case (workbooks/demo-case.toml).
SPEEDS = [600, 300, 200, 100, 6, 3]
DIAL = [56, 37, 29, 20, 8, 7]
COLUMNS = [[s, d] for s, d in zip(SPEEDS, DIAL, strict=True)]
ONE_COLUMN = [[d] for d in DIAL]
READINGS = cr.ViscometerReadings(SPEEDS, DIAL)

PPG = cu.si_factor("ppg")
GPM = cu.si_factor("gpm")
INCH = cu.si_factor("in")
PSI = cu.si_factor("psi")
FT = cu.si_factor("ft")


def close(a, b, rel=1e-12):
    return a == pytest.approx(b, rel=rel, abs=1e-300)


def oil(value_si, kind):
    """A calc (SI) value in the oilfield unit of ``kind``, as the functions return it."""
    return cu.from_si(value_si, cu.unit_for(kind, "oilfield"), kind)


# ---------------------------------------------------------------- units


def test_convert_matches_calc_and_nist():
    # External: 1 oil barrel = 42 US gallons exactly (NIST SP 811 App. B), so 12.43 bbl/min
    # = 522.06 gpm.
    assert close(BF_CONVERT(12.43, "bbl/min", "gpm"), 522.06)
    assert close(BF_CONVERT(11.0, "ppg", "kg/m3"), cu.convert(11.0, "ppg", "kg/m3"))
    out = BF_CONVERT([[1.0, 2.0], [3.0, 4.0]], "psi", "bar")
    assert np.allclose(out, cu.convert(np.array([[1.0, 2.0], [3.0, 4.0]]), "psi", "bar"), 0, 0)
    assert close(BF_CONVERT("1.32 sg", None, "ppg"), cu.convert(1.32, "sg", "ppg"))
    assert BF_CONVERT(1.0, "psi", "ppg").startswith(MARK)


def test_unit_labels_and_housekeeping():
    assert BF_UNIT("pressure") == "psi"
    assert BF_UNIT("flow_rate", "metric") == cu.label(cu.unit_for("flow_rate", "metric"))
    table = BF_UNITS("si")
    assert table[0] == ["quantity", "unit"]
    assert len(table) == 1 + len(cu.UNIT_SYSTEMS["si"])
    assert BF_CAUTION() == cautions.CELL
    assert BF_VERSION().startswith("boreflow ")


# ---------------------------------------------------------------- rheology


@pytest.mark.parametrize("layout", [COLUMNS, ONE_COLUMN, [DIAL], [SPEEDS, DIAL]])
def test_field_values_match_calc_and_api_13b1(layout):
    # External: PV = θ600 − θ300 = 19 cP, YP = 2θ300 − θ600 = 18 lbf/100ft², AV = θ600/2 = 28 cP
    # (API RP 13B-1 field definitions); LSYP = 2θ3 − θ6 = 6 (Guo & Liu 2011, eq. 2.12).
    assert close(BF_PV(layout), 19.0)
    assert close(BF_YP(layout), 18.0)
    assert close(BF_AV(layout), 28.0)
    assert close(BF_LSYP(layout), 6.0)
    assert close(BF_PV(layout, "si"), READINGS.pv)
    assert close(BF_YP(layout, "si"), READINGS.yp)


@pytest.mark.parametrize("method", cr.VISCOMETER_FITS.names())
def test_fit_parameters_match_calc(method):
    res = cr.fit(READINGS, method)
    assert close(BF_TAU_Y(COLUMNS, method, "si"), res.model.tau_y)
    assert close(BF_K(COLUMNS, method, "si"), res.model.k)
    assert close(BF_N(COLUMNS, method), res.model.n)
    assert close(BF_TAU_Y(COLUMNS, method), cu.from_si(res.model.tau_y, "lbf/100ft2"))
    table = BF_FIT(COLUMNS, method, "si")
    rows = {r[0]: r[1] for r in table[1:]}
    assert rows["method"] == method and close(rows["n"], res.model.n)
    assert close(rows["R²"], res.quality.r2)
    g = np.array([[5.0], [170.0], [1000.0]])
    assert np.allclose(BF_STRESS(COLUMNS, g, method, "si"), res.model.stress(g), rtol=1e-12)
    visc = BF_VISC(COLUMNS, 511.0, method)
    assert close(visc, res.model.apparent_viscosity(511.0) / 1e-3)


def test_default_method_is_calc_default():
    assert close(BF_N(COLUMNS), cr.fit(READINGS).model.n)


def test_power_law_pair_external():
    # External: API RP 13D (1995) pipe power law n = 3.32·log10(θ600/θ300)
    # (calc/METHODS.md §3.2; 3.32 ≈ 1/log10 2): log2(56/37).
    assert close(BF_N(COLUMNS, "api13d_1995_pipe"), math.log2(56 / 37))


def test_fit_table_ranks_every_fit():
    fs = cr.fit_all(READINGS)
    table = BF_FITS(COLUMNS, "si")
    assert table[0][:3] == ["rank", "method", "model"]
    assert [r[1] for r in table[1:]] == [e.method for e in fs.ranking]
    for row in table[1:]:
        m = fs[row[1]].model
        assert close(row[3], m.tau_y) and close(row[4], m.k) and close(row[5], m.n)


def test_shear_rate_and_reading_errors():
    assert close(BF_SHEAR_RATE(300), 300 * cr.STANDARD_GEOMETRY.shear_rate_per_rpm)
    # a 3-rpm reading above the 6-rpm one: calc refuses, the cell names the readings
    bad = [[600, 56], [300, 37], [6, 8], [3, 9]]
    out = BF_PV(bad)
    assert out.startswith(MARK) and "6 rpm" in out and "(9)" in out


# ---------------------------------------------------------------- bit

NOZZLES = [[12, 12, 12], [11, 11, 11]]


def test_bit_functions_match_calc():
    tfa = cb.total_flow_area([12, 12, 12, 11, 11, 11])
    q, rho = 522 * GPM, 11.0 * PPG
    assert close(BF_TFA(NOZZLES, "si"), tfa)
    assert close(BF_TFA("3x12 3x11"), oil(tfa, "area"))
    assert close(BF_JET_VEL(NOZZLES, 522), oil(cb.nozzle_velocity(q, tfa), "jet_velocity"))
    dp = cb.bit_pressure_drop(q, rho, tfa)
    assert close(BF_BIT_DP(11.0, NOZZLES, 522), oil(dp, "pressure"))
    assert close(BF_BIT_DP(rho, NOZZLES, q, None, "si"), dp)
    assert close(
        BF_BIT_DP(11.0, NOZZLES, 522, 1.0), oil(cb.bit_pressure_drop(q, rho, tfa, 1.0), "pressure")
    )
    assert close(BF_BIT_HHP(11.0, NOZZLES, 522), oil(cb.bit_hydraulic_power(q, dp), "power"))
    assert close(BF_IMPACT(11.0, NOZZLES, 522), oil(cb.impact_force(q, rho, dp), "force"))
    res = cb.bit_hydraulics(q, rho, cb.Bit(8.5 * INCH, nozzles="3x12 3x11"))
    assert close(BF_HSI(11.0, NOZZLES, 8.5, 522), oil(res.hsi, "power_density"))
    table = {r[0]: r[1] for r in BF_BIT(11.0, NOZZLES, 8.5, 522)[1:]}
    assert close(table["HSI"], oil(res.hsi, "power_density"))
    assert close(table["impact force"], oil(res.impact_force, "force"))
    rates = np.array([[400.0], [500.0], [600.0]])
    assert np.allclose(
        BF_BIT_DP(11.0, NOZZLES, rates),
        oil(cb.bit_pressure_drop(rates * GPM, rho, tfa), "pressure"),
        rtol=1e-12,
    )


def test_bit_external_field_formulas():
    # External: TFA[in²] = Σ N²/1303.8 (common practice, calc/METHODS.md §8.1; 1303.8 = 4096/π) and
    # the field nozzle loss ΔP = 8.311e-5·ρQ²/(Cd²·TFA²) psi (Bourgoyne et al. 1986, ch. 4;
    # calc/METHODS.md §8.3), whose printed constant is rounded to 4 figures.
    tfa_in2 = (3 * 12**2 + 3 * 11**2) / 1303.8
    assert BF_TFA(NOZZLES) == pytest.approx(tfa_in2, rel=1e-4)
    expected = 8.311e-5 * 11.0 * 522**2 / (0.95**2 * tfa_in2**2)
    assert BF_BIT_DP(11.0, NOZZLES, 522) == pytest.approx(expected, rel=5e-4)
    # HHP = ΔP·Q/1714 (Lyons 1996, eq. 4-77)
    dp = BF_BIT_DP(11.0, NOZZLES, 522)
    assert BF_BIT_HHP(11.0, NOZZLES, 522) == pytest.approx(dp * 522 / 1714, rel=5e-4)


def test_bit_bad_inputs_name_the_problem():
    assert "12/32" in BF_BIT_DP(11.0, "0.375", 522)
    assert "flow rate = -600" in BF_BIT_DP(11.0, NOZZLES, -600)
    assert "density" in BF_BIT_DP(None, NOZZLES, 522)


# ---------------------------------------------------------------- pressure


def test_pressure_functions_match_calc():
    tvd = np.array([[5000.0], [10000.0]])
    p = BF_HYDROSTATIC(11.0, tvd)
    assert np.allclose(p, oil(cc.hydrostatic_pressure(11.0 * PPG, tvd * FT), "pressure"), 1e-12)
    emw = cc.equivalent_density(5200 * PSI, 10000 * FT, hydrostatic="0.052")
    assert close(BF_EMW(5200.0, 10000.0, "0.052"), oil(emw, "density"))
    ecd = cc.equivalent_circulating_density(11 * PPG, 312 * PSI, 10000 * FT, back_pressure=50 * PSI)
    assert close(BF_ECD(11.0, 10000.0, 312.0, 50.0), oil(ecd, "density"))
    metric = BF_ECD(1318.0, 3048.0, 21.5, None, None, "metric")
    ecd_m = cc.equivalent_circulating_density(1318.0, 21.5e5, 3048.0)
    assert close(metric, ecd_m)  # metric density unit is kg/m³


def test_pressure_external_field_constant():
    # External: p[psi] = 0.052·ρ[ppg]·TVD[ft] (Bourgoyne et al. 1986, ch. 4; common practice),
    # and ECD = ρ + ΔP/(0.052·TVD) (calc/METHODS.md §9.3).
    assert BF_HYDROSTATIC(10.0, 10000.0, "0.052") == pytest.approx(5200.0, rel=1e-12)
    assert BF_ECD(11.0, 10000.0, 312.0, None, "0.052") == pytest.approx(11.6, rel=1e-12)
    assert BF_EMW(5200.0, 10000.0, "0.052") == pytest.approx(10.0, rel=1e-12)


# ---------------------------------------------------------------- cleaning

CUT = ("0.25", "2.6 sg")  # in, density with its unit


def _calc_transport(q_gpm=522.0, method="moore"):
    fluid = cc.hydraulics_fluid_from_readings(READINGS, density=11.0 * PPG)
    tau_y, k, n = fluid.annulus_parameters
    return annular_transport(
        q_gpm * GPM,
        8.6 * INCH,
        5.0 * INCH,
        density=11.0 * PPG,
        k=k,
        tau_y=tau_y,
        n=n,
        cuttings=Cuttings(0.25 * INCH, 2600.0),
        rop=cu.to_si(58.0, "ft/hour"),
        bit_diameter=8.5 * INCH,
        method=method,
    ), (tau_y, k, n)


def test_cleaning_functions_match_calc():
    res, (tau_y, k, n) = _calc_transport()
    args = (11.0, COLUMNS, *CUT, 8.6, 5.0)
    assert close(BF_SLIP(*args, 522), oil(res.slip_velocity, "velocity"))
    assert close(BF_TRANSPORT_RATIO(*args, 522), res.transport_ratio)
    assert close(BF_CUTTINGS_CONC(*args, 8.5, 522, 58.0), res.concentration)
    table = {r[0]: r[1] for r in BF_TRANSPORT(*args, 8.5, 522, 58.0)[1:]}
    assert close(table["loaded mud density"], oil(res.loaded_density, "density"))
    assert close(table["annular velocity"], oil(res.annular_velocity, "velocity"))
    chien, _ = _calc_transport(method="chien")
    assert close(BF_SLIP(*args, 522, "chien"), oil(chien.slip_velocity, "velocity"))
    va = annular_velocity(522 * GPM, 8.6 * INCH, 5.0 * INCH)
    cci = carrying_capacity_index(va, density=11.0 * PPG, k=k, tau_y=tau_y, n=n).cci
    assert close(BF_CCI(11.0, COLUMNS, 8.6, 5.0, 522), cci)


def test_annular_velocity_external():
    # External: AV[ft/min] = 24.51·Q[gpm]/(Dh² − Dp²)[in²] (common practice; 24.51 ≈ 77/π,
    # calc/METHODS.md §0.4).
    assert BF_ANN_VEL(8.5, 5.0, 500) == pytest.approx(24.51 * 500 / (8.5**2 - 5.0**2), rel=1e-4)
    assert "pipe diameter" in BF_ANN_VEL(5.0, 8.5, 500)


# ---------------------------------------------------------------- flow


def test_flow_functions_match_calc():
    from addin.sheets.functions import (
        BF_ANN_FLOW,
        BF_ANN_GRAD,
        BF_ANN_LOSS,
        BF_CRIT_RATE,
        BF_PIPE_FLOW,
        BF_PIPE_GRAD,
        BF_PIPE_LOSS,
    )
    from calc import flow as cf

    for method in (None, "api13d_1995_power_law", "bingham"):
        fluid = (
            cc.hydraulics_fluid_from_readings(READINGS, density=11 * PPG)
            if method is None
            else cc.hydraulics_fluid_from_readings(READINGS, method, density=11 * PPG)
        )
        kw = {} if method is None else {"method": method}
        tp, kp, np_ = fluid.pipe_parameters
        ta, ka, na = fluid.annulus_parameters
        rates = np.array([[300.0], [522.0], [700.0]])
        pipe = cf.pipe_flow(
            rates * GPM, 4.276 * INCH, density=11 * PPG, tau_y=tp, k=kp, n=np_, **kw
        )
        got = BF_PIPE_GRAD(11.0, COLUMNS, 4.276, rates, method)
        assert np.allclose(got, oil(pipe.gradient, "pressure_gradient"), rtol=1e-12, atol=0)
        loss = BF_PIPE_LOSS(11.0, COLUMNS, 4.276, 1000.0, 522.0, method)
        one = cf.pipe_flow(522 * GPM, 4.276 * INCH, density=11 * PPG, tau_y=tp, k=kp, n=np_, **kw)
        assert close(loss, oil(one.gradient * 1000 * FT, "pressure"))
        ann = cf.annulus_flow(
            522 * GPM, 8.6 * INCH, 5 * INCH, density=11 * PPG, tau_y=ta, k=ka, n=na, **kw
        )
        assert close(
            BF_ANN_GRAD(11.0, COLUMNS, 8.6, 5.0, 522, method),
            oil(ann.gradient, "pressure_gradient"),
        )
        assert close(
            BF_ANN_LOSS(11.0, COLUMNS, 8.6, 5.0, 500.0, 522, method),
            oil(ann.gradient * 500 * FT, "pressure"),
        )
        qc = cf.critical_flow_rate(
            8.6 * INCH, 5 * INCH, density=11 * PPG, tau_y=ta, k=ka, n=na, **kw
        )
        assert close(BF_CRIT_RATE(11.0, COLUMNS, 8.6, 5.0, method), oil(qc, "flow_rate"))
        table = {r[0]: r[1] for r in BF_ANN_FLOW(11.0, COLUMNS, 8.6, 5.0, 522, method)[1:]}
        assert close(table["Reynolds number"], ann.reynolds)
        assert table["regime"] == ann.regime_label
        ptable = {r[0]: r[1] for r in BF_PIPE_FLOW(11.0, COLUMNS, 4.276, 522, method)[1:]}
        assert close(ptable["Fanning friction factor"], one.friction_factor)


def test_laminar_pipe_external_hagen_poiseuille():
    # External: exact laminar Newtonian pipe flow, -dp/dL = 32μV/D² (Hagen-Poiseuille), with μ
    # the Newtonian fit of readings proportional to speed (θ = N/15, about 20 cP).
    from addin.sheets.functions import BF_PIPE_GRAD

    readings = [[s, s / 15.0] for s in SPEEDS]
    mu = cr.fit(
        cr.ViscometerReadings(SPEEDS, [s / 15.0 for s in SPEEDS]), "newtonian_least_squares"
    ).model.k
    q, d = 20 * GPM, 4.276 * INCH
    v = q / (math.pi * d**2 / 4)
    assert v * d * 1000 / mu < 2000  # laminar at 1 sg
    got = BF_PIPE_GRAD(1.0, readings, 4.276, 20, "newtonian", "oilfield; density=sg")
    assert got == pytest.approx(oil(32 * mu * v / d**2, "pressure_gradient"), rel=1e-9)


# ---------------------------------------------------------------- surge


def test_surge_functions_match_calc():
    from addin.sheets.functions import (
        BF_BREAK_CIRC,
        BF_SURGE,
        BF_SURGE_EMW,
        BF_SURGE_TABLE,
        BF_TRIP_SPEED,
    )
    from calc import surge as cs

    fpm = cu.si_factor("ft/min")
    fluid = cc.hydraulics_fluid_from_readings(READINGS, density=11 * PPG)
    ty, k, n = fluid.annulus_parameters
    d2 = np.array([8.835, 8.6]) * INCH
    d1 = np.array([5.0, 5.0]) * INCH
    ln = np.array([8200.0, 2750.0]) * FT
    col = lambda a: [[float(x)] for x in a]  # noqa: E731
    hole, pipe, length = col([8.835, 8.6]), col([5.0, 5.0]), col([8200.0, 2750.0])
    kw = dict(density=11 * PPG, tau_y=ty, k=k, n=n)
    # a column of intervals, running in, closed string
    res = cs.interval_surge(90 * fpm, d2, d1, ln, **kw)
    got = BF_SURGE(11.0, COLUMNS, hole, pipe, length, 90.0)
    assert np.allclose(got, oil(res.pressure_change, "pressure").reshape(-1, 1), rtol=1e-12)
    # a column of speeds through one interval, pulling out, given K_c and peak factor
    sp = np.array([60.0, 120.0])
    one = cs.interval_surge(sp * fpm, d2[1], d1[1], ln[1], direction="pulling", clinging=0.45,
                            peak_factor=1.2, **kw)  # fmt: skip
    got = BF_SURGE(11.0, COLUMNS, 8.6, 5.0, 2750.0, col(sp), "swab", None, None, None, 0.45, 1.2)
    assert np.allclose(got, oil(one.pressure_change, "pressure").reshape(-1, 1), rtol=1e-12)
    # an open string with bit nozzles: bore uses the pipe fit
    tfa = cb.total_flow_area("3x12 3x11")
    op = cs.interval_surge(
        90 * fpm, d2, d1, ln, d_bore=4.276 * INCH, tfa=tfa, string_end="open",
        bore_parameters=fluid.pipe_parameters, **kw,
    )  # fmt: skip
    got = BF_SURGE(11.0, COLUMNS, hole, pipe, length, 90.0, None, 4.276, "3x12 3x11")
    assert np.allclose(got, oil(op.pressure_change, "pressure").reshape(-1, 1), rtol=1e-12)
    table = BF_SURGE_TABLE(11.0, COLUMNS, hole, pipe, length, 90.0)
    assert table[0][0] == "interval" and len({len(r) for r in table}) == 1
    assert close(table[1][1], res.clinging[0]) and table[1][3] == "laminar"
    assert close(table[3][5], oil(res.total_pressure_change, "pressure"))
    # EMW while tripping from the summed pressure (the column BF_SURGE gave)
    tvd = 9480.0
    emw = cs.trip_emw(11 * PPG, res.total_pressure_change, tvd * FT)
    summed = BF_SURGE_EMW(11.0, tvd, BF_SURGE(11.0, COLUMNS, hole, pipe, length, 90.0))
    assert close(summed, oil(emw, "density"))
    # trip-speed limit against a limit EMW
    allow = cs.trip_allowance(12.4 * PPG, 11 * PPG, tvd * FT)
    lim = cs.trip_speed_limit(allow, d2, d1, ln, **kw)
    assert close(BF_TRIP_SPEED(11.0, COLUMNS, hole, pipe, length, 12.4, tvd),
                 oil(lim.max_speed, "trip_speed"))  # fmt: skip
    swab = cs.trip_speed_limit(
        cs.trip_allowance(10.8 * PPG, 11 * PPG, tvd * FT, "pulling"), d2, d1, ln,
        direction="pulling", **kw,
    )  # fmt: skip
    got = BF_TRIP_SPEED(11.0, COLUMNS, hole, pipe, length, 10.8, tvd, "pulling")
    assert close(got, oil(swab.max_speed, "trip_speed"))
    assert BF_TRIP_SPEED(11.0, COLUMNS, hole, pipe, length, 10.8, tvd).startswith(MARK)
    # breaking circulation: pipe bore and annulus rows in one column
    tau = cu.to_si(12.0, "lbf_per_100ft_sq")
    gb = cs.gel_break_pressure(tau, np.array([4.276, 8.6]) * INCH, ln, np.array([0, 5.0]) * INCH)
    got = BF_BREAK_CIRC(12.0, col([4.276, 8.6]), length, [[None], [5.0]])
    assert np.allclose(got, oil(gb, "pressure").reshape(-1, 1), rtol=1e-12)


def test_surge_bad_inputs_name_the_problem():
    from addin.sheets.functions import BF_SURGE, BF_TRIP_SPEED

    two = [[8.6], [8.6]]
    out = BF_SURGE(11.0, COLUMNS, two, [[5.0], [5.0]], [[100.0], [100.0]], [[60.0], [90.0]])
    assert out.startswith(MARK) and "trip speed" in out
    out = BF_SURGE(11.0, COLUMNS, 8.6, 5.0, 100.0, 90.0, None, None, "3x12")
    assert out.startswith(MARK) and "d_bore" in out
    out = BF_SURGE(11.0, COLUMNS, [[8.6], [5.0]], 5.0, 100.0, 90.0)
    assert out.startswith(MARK) and "row 2" in out
    out = BF_TRIP_SPEED(11.0, COLUMNS, 8.6, 5.0, 100.0, 12.0, 9000.0, "sideways")
    assert out.startswith(MARK) and "direction" in out


def test_surge_external_exact_newtonian_closed_end():
    # External: closed-end surge of a Newtonian fluid in a concentric annulus equals the exact
    # moving-rod solution (Bird, Stewart & Lightfoot 2002, problem 2B.7 type; helper in
    # tests/test_surge.py) when K_c is the exact constant and the speed is the peak speed.
    from addin.sheets.functions import BF_SURGE
    from calc.surge import clinging_constant_exact_newtonian
    from tests.test_surge import exact_moving_rod_gradient

    readings = [[s, s / 15.0] for s in SPEEDS]  # θ ∝ N: Newtonian, about 20 cP
    mu = cr.fit(
        cr.ViscometerReadings(SPEEDS, [s / 15.0 for s in SPEEDS]), "newtonian_least_squares"
    ).model.k
    d2, d1, vp = 8.5 * INCH, 5.0 * INCH, cu.to_si(60.0, "ft/min")
    kc = clinging_constant_exact_newtonian(d1, d2)
    got = BF_SURGE(1.0, readings, 8.5, 5.0, 1000.0, 60.0, None, None, None, "newtonian", kc,
                   1.0, "oilfield; density=sg")  # fmt: skip
    exact = exact_moving_rod_gradient(d1 / 2, d2 / 2, vp, mu) * 1000.0 * FT
    assert got == pytest.approx(oil(exact, "pressure"), rel=1e-6)
