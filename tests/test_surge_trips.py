"""Tripping: inertia, gel breaking at start-up, the peak of a stand, the trip schedule, the
continuous clinging constant and the swab limit of the demo workbook."""

import importlib.util
import math
import sys
from pathlib import Path

import numpy as np
import openpyxl
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc.circulation import PressureWindow
from calc.errors import InputError
from calc.geometry import Survey
from calc.surge import (
    clinging_constant,
    clinging_constant_blended,
    inertia_ratio,
    inertial_pressure,
    interval_surge,
    peak_trip_pressure,
    pipe_start_gel_pressure,
    trip_schedule,
    trip_speed_limits,
    well_at_bit_depth,
)
from calc.units import from_si, to_si
from tests.cleaning_demo import demo_fluid, demo_weak_points, demo_well, demo_window
from tests.test_surge import L, newtonian, simple_well

ROOT = Path(__file__).resolve().parents[1]
PSI, FT, INCH = to_si(1.0, "psi"), 0.3048, 0.0254


def lamb_annulus_gradient(q, r1, r2, mu):
    """-dp/dz of laminar Newtonian flow q [m³/s] in a concentric annulus with fixed walls.

    Exact (Lamb 1932; Bird, Stewart & Lightfoot 2002, eq. 2.4-17):
    Q = πG/(8μ)·[R2⁴ − R1⁴ − (R2² − R1²)²/ln(R2/R1)].
    """
    return 8 * mu * q / (np.pi * (r2**4 - r1**4 - (r2**2 - r1**2) ** 2 / np.log(r2 / r1)))


# ---------------------------------------------------------------- one stand by hand


def test_stand_peak_against_hand_calculation():
    # One stand of a closed string, Newtonian mud, laminar, K_c given (0.45, as Lapeyrouse 2002
    # prints it), vertical well L = 1000 m, bit at L, constant window.  Written out from the
    # published formulas:
    #   steady  Burkhardt (1961): V_e = V_p(D1²/(D2² − D1²) + K_c), friction by the exact
    #           laminar annulus law (Lamb 1932)   → Δp_s = G(V_e)·L, linear in V_p
    #   inertia Burkhardt (1961) closed pipe: Δp_i = ρ·a·L·D1²/(D2² − D1²), a = V_p/t_a
    #           (ratio from memory, derived from continuity — calc/METHODS.md §11.9)
    #   gel     force balance on the annular plug (Bourgoyne et al. 1986, ch. 4, from memory):
    #           τ_g·π(D2 + D1)L = Δp·π(D2² − D1²)/4  → Δp_g = 4τ_g·L/(D2 − D1)
    #   peak    max(Δp_g, Δp_s + Δp_i) (calc/METHODS.md §11.9, a stated model)
    d2, d1, rho, mu, kc, pf, t_a, tau_g = 0.2159, 0.127, 1200.0, 0.05, 0.45, 1.5, 2.0, 5.0
    well = simple_well(d2, d1)
    fluid = newtonian(mu, rho)
    margin_emw = 60.0  # fracture − mud [kg/m³] everywhere
    window = PressureWindow([0.0, 2000.0], [900.0, 900.0], [rho + margin_emw] * 2)
    lim = trip_speed_limits(
        well, fluid, window=window, method="newtonian", clinging=kc, peak_factor=pf,
        acceleration_time=t_a, stand_gel=tau_g, step=1000.0,
    )  # fmt: skip
    comp, pt = lim.running, lim.running_point
    z = pt.md  # the governing depth (every depth gives the same limit here)
    a_o, a_a = math.pi * d1**2 / 4, math.pi * (d2**2 - d1**2) / 4
    r1, r2 = d1 / 2, d2 / 2
    steady_per_speed = lamb_annulus_gradient((a_o / a_a + kc) * a_a * pf, r1, r2, mu) * z
    inertia_per_speed = rho * (pf / t_a) * z * d1**2 / (d2**2 - d1**2)
    gel = 4 * tau_g * z / (d2 - d1)
    allow = margin_emw * 9.80665 * z  # (ρ_lim − ρ)·g·TVD, vertical
    v_hand = allow / (steady_per_speed + inertia_per_speed)  # both linear in the speed
    assert comp.allowance == pytest.approx(allow, rel=1e-12)
    assert gel < allow  # the gel does not govern in this case
    assert lim.max_running_speed == pytest.approx(v_hand, rel=1e-7)
    assert comp.steady == pytest.approx(steady_per_speed * comp.speed, rel=1e-7)
    assert comp.inertia == pytest.approx(inertia_per_speed * comp.speed, rel=1e-9)
    assert comp.gel == pytest.approx(gel, rel=1e-12)
    assert comp.peak == pytest.approx(max(gel, comp.steady + comp.inertia), rel=1e-12)
    assert comp.peak == pytest.approx(allow, rel=1e-7)
    assert comp.term in ("friction", "inertia")
    # pulling out: the same magnitudes against the swab allowance (ρ − pore)·g·TVD, and the stop
    # of a pulled stand surges by the inertia alone, held to the surge allowance
    s1, i1 = steady_per_speed / z, inertia_per_speed / z  # per metre of depth
    v_pull = min((rho - 900.0) * 9.80665 / (s1 + i1), margin_emw * 9.80665 / i1)
    assert lim.max_pulling_speed == pytest.approx(v_pull, rel=1e-7)
    assert lim.pulling.peak <= lim.pulling.allowance * (1 + 1e-7)
    # and the stop of a run stand swabs by the inertia alone, within the swab allowance
    assert comp.stopping <= comp.opposite_allowance


def test_gel_above_the_allowance_leaves_no_safe_speed():
    # Gel force balance Δp = 4τ_g L/(D2 − D1) (Bourgoyne et al. 1986, ch. 4, from memory):
    # τ_g = 40 Pa over 1000 m of a 0.0889 m gap gives 1.80 MPa > the 0.59 MPa allowance
    well = simple_well(0.2159, 0.127)
    window = PressureWindow([0.0, 2000.0], [900.0, 900.0], [1260.0, 1260.0])
    lim = trip_speed_limits(well, newtonian(0.05, 1200.0), window=window, method="newtonian",
                            acceleration_time=2.0, stand_gel=40.0)  # fmt: skip
    assert 4 * 40.0 * L / (0.2159 - 0.127) > 60.0 * 9.80665 * L
    assert lim.max_running_speed == 0.0 and lim.running.term == "gel"
    assert any(n.code == "surge_gel_exceeds_allowance" for n in lim.notes)


def test_inertia_ratio_closed_and_open_forms():
    # Closed: r = D1²/(D2² − D1²); open, one uniform interval: r = (D1² − Db²)/(D2² − D1² + Db²)
    # (Burkhardt 1961 / Bourgoyne et al. 1986 ch. 4, from memory; both follow from continuity)
    d2, d1, db = 0.2159, 0.127, 0.1086
    assert inertia_ratio(d2, d1, 500.0) == pytest.approx(d1**2 / (d2**2 - d1**2), rel=1e-12)
    got = inertia_ratio(d2, d1, 500.0, d_bore=db, string_end="open")
    assert got == pytest.approx((d1**2 - db**2) / (d2**2 - d1**2 + db**2), rel=1e-12)


def test_open_inertia_gives_equal_pressure_on_both_paths():
    # Exact for a rigid incompressible column: the split makes the annulus and the bore need
    # the same pressure at the bit; checked here from the bore side written out independently,
    # Δp_bore = ρ·Σ L_j·(q̇/A_b,j − a) (ground-frame acceleration of the bore mud)
    d2 = np.array([0.2245, 0.2184, 0.2184])
    d1 = np.array([0.127, 0.127, 0.1715])
    db = np.array([0.1086, 0.1086, 0.0714])
    ln = np.array([2000.0, 800.0, 200.0])
    rho, a = 1300.0, 0.4
    ann = np.sum(inertial_pressure(rho, a, d2, d1, ln, d_bore=db, string_end="open"))
    r = inertia_ratio(d2, d1, ln, d_bore=db, string_end="open")
    a_o, a_a, a_b = np.pi * d1**2 / 4, np.pi * (d2**2 - d1**2) / 4, np.pi * db**2 / 4
    qdot = a * (a_o - r * a_a)  # from the annulus: a_f = (a·A_o − q̇)/A_a
    assert np.allclose(qdot, qdot[0], rtol=1e-12)  # one relative inflow for the whole string
    bore = rho * np.sum(ln * (qdot[0] / a_b - a))
    assert ann == pytest.approx(bore, rel=1e-12)
    closed = np.sum(inertial_pressure(rho, a, d2, d1, ln))
    assert 0 < ann < closed


def test_peak_combination_and_start_gel_cap():
    assert peak_trip_pressure(3e5, 1e5, 2e5) == 4e5 and peak_trip_pressure(1e5, 5e4, 2e5) == 2e5
    # open string: the mud yields in the bore when that is easier (4τL/D_b, force balance)
    ann, cap = pipe_start_gel_pressure(5.0, 0.2159, 0.127, 1000.0, d_bore=0.1086,
                                       string_end="open")  # fmt: skip
    assert ann[0] == pytest.approx(4 * 5.0 * 1000.0 / (0.2159 - 0.127), rel=1e-12)
    assert cap == pytest.approx(4 * 5.0 * 1000.0 / 0.1086, rel=1e-12)


# ---------------------------------------------------------------- schedule


@pytest.fixture(scope="module")
def demo_schedule():
    kw = dict(window=demo_window(), weak_points=demo_weak_points(), acceleration_time=2.0,
              stand_gel=to_si(10.0, "lbf_per_100ft_sq"))  # fmt: skip
    return trip_schedule(demo_well(), demo_fluid(), **kw), kw


def test_schedule_at_the_bottom_equals_the_single_limit(demo_schedule):
    sch, kw = demo_schedule
    single = trip_speed_limits(demo_well(), demo_fluid(), **kw)
    at_td = sch.at_bit[-1]
    assert at_td.max_running_speed == single.max_running_speed
    assert at_td.max_pulling_speed == single.max_pulling_speed
    assert np.array_equal(at_td.running_limit, single.running_limit)
    assert np.array_equal(at_td.pulling_limit, single.pulling_limit)
    last = sch.bands[-1]
    assert last.bottom_md == demo_well().bit_depth
    assert last.running_limit <= single.max_running_speed
    assert last.pulling_limit <= single.max_pulling_speed
    # bands cover surface to the bottom without gaps
    assert sch.top_md[0] == 0.0 and np.array_equal(sch.top_md[1:], sch.bottom_md[:-1])


def test_schedule_band_is_the_lowest_limit_inside_it(demo_schedule):
    # the band's limit against solves with the bit at 4 depths inside each of the two deepest
    # bands (the schedule solves the edges and each check depth with the bit at it): measured
    # within 2e-4 (the spacing of the check depths), never more than 0.1 % above
    sch, kw = demo_schedule
    well, fluid = demo_well(), demo_fluid()
    for band in sch.bands[-2:]:
        for b in np.linspace(band.top_md, band.bottom_md, 6)[1:-1]:
            wb = well_at_bit_depth(well, b)
            # the exposed hole below this bit feels the bit's pressure: check it as the bit
            lim = trip_speed_limits(wb, fluid, **kw)
            assert band.running_limit <= lim.max_running_speed * (1 + 1e-3)
            assert band.pulling_limit <= lim.max_pulling_speed * (1 + 1e-3)


def test_shallower_bit_is_a_shorter_string():
    well = demo_well()
    td = float(well.bit_depth)
    for b in (50.0, 150.0, 0.5 * td):
        wb = well_at_bit_depth(well, b)
        assert float(np.sum(wb.component_lengths)) == pytest.approx(b, abs=1e-9)
        assert wb.flow_intervals().annulus.bottom_md.max() == pytest.approx(b, abs=1e-9)


# ---------------------------------------------------------------- bad input


def test_trip_bad_inputs_name_input_value_and_allowed():
    well, fluid = demo_well(), demo_fluid()
    kw = dict(window=demo_window(), weak_points=demo_weak_points())
    with pytest.raises(InputError) as e:
        trip_speed_limits(well, fluid, acceleration_time=-2.0, **kw)
    assert (
        e.value.name == "acceleration time" and e.value.value == -2.0 and "> 0" in e.value.allowed
    )
    with pytest.raises(InputError) as e:
        trip_speed_limits(well, fluid, stand_gel=-1.0, **kw)
    assert e.value.name == "stand gel strength" and e.value.value == -1.0
    assert ">= 0" in e.value.allowed
    td = float(well.bit_depth)
    for bad in (-10.0, td + 100.0):
        with pytest.raises(InputError) as e:
            trip_schedule(well, fluid, bit_depths=[bad], **kw)
        assert e.value.name == "bit depth" and e.value.value == bad
        with pytest.raises(InputError) as e:
            well_at_bit_depth(well, bad)
        assert e.value.name == "bit depth" and "<=" in e.value.allowed
    with pytest.raises(InputError) as e:
        inertial_pressure(1200.0, -0.1, 0.2, 0.1, 100.0)
    assert e.value.name == "pipe acceleration"


def test_case_trip_inputs_are_checked(tmp_path):
    from addin.case import load_case
    from addin.report.compute import compute

    text = (ROOT / "workbooks" / "demo-case.toml").read_text(encoding="utf-8")
    for key, value, name in (
        ("acceleration_time_s", "-1.0", "trip.acceleration_time_s"),
        ("stand_gel", '"5min"', "trip.stand_gel"),
    ):
        path = tmp_path / f"{key}.toml"
        path.write_text(text.replace("[trip]\n", f"[trip]\n{key} = {value}\n"), encoding="utf-8")
        with pytest.raises(InputError) as e:
            compute(load_case(path))
        assert e.value.name.endswith(name)  # the plausibility guard also names the file


# ---------------------------------------------------------------- continuous clinging constant


def test_blended_clinging_constant_ends_are_the_fits():
    # Guo & Liu (2011) eqs. 2.81-2.82 at w = 0 and w = 1
    for k in (0.3, 0.6, 0.9):
        assert clinging_constant_blended(k, 1.0, 0.0) == pytest.approx(
            clinging_constant(k, 1.0, "laminar"), rel=1e-15
        )
        assert clinging_constant_blended(k, 1.0, 1.0) == pytest.approx(
            clinging_constant(k, 1.0, "turbulent"), rel=1e-15
        )


@settings(max_examples=40, deadline=None)
@given(
    d2=st.floats(0.15, 0.35),
    kappa=st.floats(0.35, 0.85),
    bore_frac=st.floats(0.4, 0.85),
    rho=st.floats(1000.0, 1900.0),
    tau_y=st.floats(0.0, 10.0),
    k=st.floats(0.005, 0.8),
    n=st.floats(0.4, 1.0),
    nozzles=st.booleans(),
)
def test_open_ended_surge_is_non_decreasing_in_speed(d2, kappa, bore_frac, rho, tau_y, k, n,
                                                     nozzles):  # fmt: skip
    # Property (common practice: more pipe speed, more surge): with the Burkhardt fits blended
    # across the transitional zone (calc/METHODS.md §11.2), the open-string surge of the default
    # method (API RP 13D 2010 HB, with a transitional zone) does not fall as the speed rises —
    # before the blend it fell by up to 6-9 % where K_c switched regime.  A dense log scan of
    # speeds through laminar, transitional and turbulent flow.
    d1 = kappa * d2
    v = np.geomspace(0.01, 6.0, 400)
    res = interval_surge(
        v, d2, d1, 2000.0, density=rho, tau_y=tau_y, k=k, n=n, d_bore=bore_frac * d1,
        tfa=6e-4 if nozzles else None, string_end="open", peak_factor=1.0,
    )  # fmt: skip
    p = np.asarray(res.total_pressure_change)
    assert np.all(np.diff(p) >= -1e-9 * np.abs(p[1:]) - 1e-9), float(np.min(np.diff(p) / p[1:]))


def test_closed_surge_has_no_jump_at_the_transition():
    # the old switch made Δp jump by several % between two speeds 0.01 % apart; the blend is
    # continuous: neighbouring speeds of a fine scan differ by little more than the speed step
    v = np.geomspace(0.2, 5.0, 20001)
    res = interval_surge(v, 0.2159, 0.127, L, density=1300.0, tau_y=4.0, k=0.3, n=0.65,
                         peak_factor=1.0)  # fmt: skip
    p = np.asarray(res.total_pressure_change)
    regimes = np.asarray(res.regime)
    assert regimes.min() == 0 and regimes.max() == 2  # the scan crosses the transition
    assert np.max(np.diff(p) / p[:-1]) < 5 * np.max(np.diff(v) / v[:-1])
    assert np.all(np.diff(p) >= 0)


# ---------------------------------------------------------------- demo workbook swab limit


def test_demo_workbook_swab_limit_uses_the_pore_pressure_at_the_bit(tmp_path):
    # Defect: the swab limit took the highest pore pressure of the window below the shoe,
    # including the undrilled formation below the bit (10.6 ppg at 11,271 ft TVD), and gave a
    # pulling limit of 8.8 ft/min.  The limit EMW at the bit is the pore pressure at the bit's
    # own TVD (linear in TVD between stations) + the trip margin; here from the case file and
    # numpy's interpolation, independently of the builder.
    import tomllib

    spec = importlib.util.spec_from_file_location(
        "build_demo_workbook", ROOT / "workbooks" / "build_demo_workbook.py"
    )
    builder = importlib.util.module_from_spec(spec)
    sys.modules["build_demo_workbook"] = builder
    spec.loader.exec_module(builder)
    out = tmp_path / "demo.xlsx"
    lay = builder.build(out)
    case = tomllib.loads((ROOT / "workbooks" / "demo-case.toml").read_text(encoding="utf-8"))
    check = next(c for c in case["check"] if c["label"].startswith("D1"))
    st_ = case["survey"]["stations"]
    survey = Survey([s[0] * FT for s in st_], [s[1] for s in st_], [s[2] for s in st_])
    tvd_bit = float(survey.tvd_at(check["bit_depth"] * FT)) / FT
    win = case["pressure_window"]
    expected = np.interp(tvd_bit, win["tvd"], win["pore"]) + case["limits"]["trip_pore_margin"]
    ws = openpyxl.load_workbook(out)[builder.SHEET]
    cell = lay.cells["swab_lim"]
    got = ws[cell.replace("$", "")].value
    assert got == pytest.approx(expected, abs=5e-4)
    assert got < max(win["pore"]) + case["limits"]["trip_pore_margin"]  # not from below the bit
    assert win["tvd"][-1] > tvd_bit  # the window does reach below the bit (the trap)
    # and the pulling limit the sheet computes is a plausible speed, not 8.8 ft/min
    from addin.sheets.engine import calculate

    values = calculate(out)
    pull = values[(builder.SHEET.upper(), lay.cells["pull_bit"].replace("$", ""))]
    assert pull > 100.0


def test_inertia_field_form():
    # ρ·r·a·L in field units: 11 ppg, 5 in in 8.6 in, a = 0.75 ft/s², 10,000 ft; the field
    # constant (psi/ft per ppg·ft/s²) derived from SI: 119.826 kg/m³ · 0.3048 m/s² / (6894.76 Pa
    # / 0.3048 m) = 0.0016146
    r = 5.0**2 / (8.6**2 - 5.0**2)
    field = 0.0016146 * 11.0 * 0.75 * r * 10000.0
    si = inertial_pressure(to_si(11.0, "ppg"), 0.75 * FT, 8.6 * INCH, 5.0 * INCH, 10000.0 * FT)
    assert from_si(float(si), "psi") == pytest.approx(field, rel=1e-4)


# ---------------------------------------------------------------- worksheet functions


def test_inertia_and_peak_functions_as_a_spreadsheet_calls_them(tmp_path):
    # A sheet with the inputs in cells and the functions in formulas, computed by the headless
    # formula engine (addin.sheets.engine, PyPI `formulas`) as Excel would: a column of two
    # annular intervals (casing, open hole), oilfield units.  Checked against the published
    # forms written out here: inertia ρ·D1²/(D2² − D1²)·a·L per interval (Burkhardt 1961, from
    # memory), gel 4τ_g·L/(D2 − D1) (force balance), peak max(gel, steady + inertia).
    from openpyxl.worksheet.formula import ArrayFormula

    from addin.sheets.engine import calculate

    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "T"
    dial = [(600, 56), (300, 37), (200, 29), (100, 20), (6, 8), (3, 7)]
    for i, (rpm, d) in enumerate(dial, start=1):
        ws[f"A{i}"], ws[f"B{i}"] = rpm, d
    for i, (d2, d1, ln) in enumerate(((8.835, 5.0, 8200.0), (8.6, 5.0, 2750.0)), start=1):
        ws[f"C{i}"], ws[f"D{i}"], ws[f"E{i}"] = d2, d1, ln
    ws["F1"] = ArrayFormula("F1:F2", "=BF_SURGE_INERTIA(11,C1:C2,D1:D2,E1:E2,60,2)")
    ws["G1"] = ArrayFormula("G1:G2", "=BF_SURGE(11,A1:B6,C1:C2,D1:D2,E1:E2,60)")
    ws["H1"] = "=BF_SURGE_PEAK(11,A1:B6,C1:C2,D1:D2,E1:E2,60,7,2)"
    ws["H2"] = '=BF_SURGE_PEAK(11,A1:B6,C1:C2,D1:D2,E1:E2,60,7,2,"pulling")'
    ws["H3"] = "=BF_SURGE_PEAK(11,A1:B6,C1:C2,D1:D2,E1:E2,0.5,40,2)"
    ws["H4"] = "=BF_SURGE_INERTIA(11,C1:C2,D1:D2,E1:E2,60,-1)"
    path = tmp_path / "trip.xlsx"
    wb.save(path)
    v = calculate(path)
    rho, a = to_si(11.0, "ppg"), 1.5 * 60.0 * FT / 60.0 / 2.0  # peak 90 ft/min in 2 s
    hand_i = []
    for d2, d1, ln in ((8.835, 5.0, 8200.0), (8.6, 5.0, 2750.0)):
        hand_i.append(rho * d1**2 / (d2**2 - d1**2) * a * ln * FT / PSI)
    assert v[("T", "F1")] == pytest.approx(hand_i[0], rel=1e-9)
    assert v[("T", "F2")] == pytest.approx(hand_i[1], rel=1e-9)
    steady = v[("T", "G1")] + v[("T", "G2")]
    gel = lambda tau: sum(tau * ln / (300.0 * (d2 - d1))  # noqa: E731  field form, 1/300 exact
                          for d2, d1, ln in ((8.835, 5.0, 8200.0), (8.6, 5.0, 2750.0)))  # fmt: skip
    assert gel(7.0) < steady + sum(hand_i)
    assert v[("T", "H1")] == pytest.approx(steady + sum(hand_i), rel=1e-9)
    assert v[("T", "H2")] == pytest.approx(-(steady + sum(hand_i)), rel=1e-9)
    assert v[("T", "H3")] == pytest.approx(gel(40.0), rel=1e-9)  # slow start: the gel governs
    assert str(v[("T", "H4")]).startswith("#BF!") and "acceleration time" in v[("T", "H4")]
