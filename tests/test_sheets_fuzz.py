"""Hypothesis fuzzing of every worksheet function with what cells can hold.

Blanks, text, NaN, infinities, negative and huge numbers, logicals, error cells, wrong-shaped
ranges and unknown unit or method names: no exception may escape, the result is always a
finite number, a text, or a 2-D table of those; a failed call is the error text with a reason
(and never an "internal error", which would mean an input slipped past the checks).
Good calls with valid random inputs equal calc (last tests).
"""

import inspect
import math
import typing

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import addin.sheets.functions  # noqa: F401
from addin.sheets.framework import FUNCTIONS, MARK
from calc import bit as cb
from calc import rheology as cr
from calc import units as cu

SETTINGS = settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])

GOOD_READINGS = [[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]]

numbers = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-(10**20), max_value=10**20),
    st.sampled_from([0.0, -1.0, 1e308, -1e308, 5e-324, 8.5, 11.0, 522.0, 10000.0]),
)
bad_text = st.sampled_from(
    [
        "",
        " ",
        "abc",
        "#N/A",
        "#DIV/0!",
        "#BF! upstream",
        "12 furlongs",
        "5 psi",
        "1e999",
        "nan",
        "inf",
        "-3",
        "2.6 sg",
        "3x12 3x11",
        "TRUE",
        "—",
        "12.43 bbl/min",
    ]
)
cell = st.one_of(st.none(), st.booleans(), numbers, bad_text, st.text(max_size=12))
grid = st.lists(st.lists(cell, min_size=1, max_size=4), min_size=1, max_size=7)
ranges = st.one_of(
    cell,
    grid,
    st.lists(cell, max_size=7),  # 1-D, as xlwings gives without ndim
    st.just(GOOD_READINGS),
    st.just([[600, 56], [300, 37], [6, 8], [3, 9]]),  # 3 rpm above 6 rpm
    st.just([[56], [37], [29]]),  # three readings without speeds
)
names = st.one_of(
    st.none(),
    bad_text,
    st.text(max_size=15),
    st.sampled_from(
        [
            "oilfield",
            "metric",
            "si",
            "imperial",
            "oilfield; flow_rate=bbl/min",
            "si; pressure=ppg",
            "exact",
            "0.052",
            "moore",
            "chien",
            "api13d_2010_hb",
            "hb_least_squares",
            "bingham",
            "psi",
            "bar",
            "gpm",
            "furlong",
            "stress",
            "pressure",
            "densty",
        ]
    ),
)


def _strategy(hint):
    base = typing.get_args(hint)[0] if typing.get_origin(hint) is typing.Annotated else hint
    if base is float:
        return st.one_of(cell, st.just([[1.0, 2.0]]))  # a range where one cell is wanted
    if base is str:
        return names
    return ranges


def _check_result(out, name):
    def ok_scalar(v):
        if isinstance(v, str):
            if v.startswith(MARK):
                reason = v[len(MARK) :].strip()
                assert reason, f"{name}: error text without a reason"
                assert "internal error" not in v, f"{name}: {v}"
            return True
        assert type(v) in (float, bool), f"{name}: {type(v)} {v!r}"
        assert not (isinstance(v, float) and not math.isfinite(v)), f"{name}: {v!r}"
        return True

    if isinstance(out, list):
        assert out and all(isinstance(r, list) for r in out), f"{name}: not a 2-D table"
        width = len(out[0])
        for row in out:
            assert len(row) == width, f"{name}: ragged table"
            for v in row:
                ok_scalar(v)
    else:
        ok_scalar(out)


@pytest.mark.parametrize("name", list(FUNCTIONS))
def test_fuzz_never_raises(name):
    func = FUNCTIONS[name].func
    hints = typing.get_type_hints(func, include_extras=True)
    params = list(inspect.signature(func).parameters.values())
    strategies = [_strategy(hints[p.name]) for p in params]
    n_required = sum(p.default is inspect.Parameter.empty for p in params)

    @SETTINGS
    @given(st.tuples(*strategies), st.integers(min_value=n_required, max_value=len(params)))
    def run(args, count):
        out = func(*args[:count])  # optional arguments left out from the right
        _check_result(out, name)

    run()


# A valid call for every argument name used by the functions (the D1 check of the demo case).
VALID = {
    # settling-slurry functions (the demo's invented slurry line)
    "solids_density": 21.7,
    "concentration": 0.12,
    "d50": "0.15 mm",
    "d85": "0.35 mm",
    "roughness": None,
    "carrier_density": None,
    "density": 11.0,
    "readings": GOOD_READINGS,
    "d_hole": 8.6,
    "d_pipe": 5.0,
    "d_inner": 4.276,
    "d_outer": 8.6,
    "q": 522.0,
    "length": 1000.0,
    "tvd": 9000.0,
    "tops": [[0.0, 8000.0]],
    "densities": [[11.0, 15.0]],
    "pressure": 5000.0,
    "annular_loss": 300.0,
    "back_pressure": None,
    "nozzles": "3x12 3x11",
    "bit_size": 8.5,
    "cuttings_size": 0.25,
    "cuttings_density": "2.6 sg",
    "rop": 58.0,
    "units": None,
    "method": None,
    "slip_method": None,
    "hydraulics_method": None,
    "hydrostatic": None,
    "discharge_coefficient": None,
    "eccentricity": None,
    "shear_rate": 170.0,
    "rpm": 300.0,
    "value": 12.43,
    "from_unit": "bbl/min",
    "to_unit": "gpm",
    "kind": "pressure",
    "speed": 90.0,
    "direction": None,
    "d_bore": 4.276,  # an open string, so the nozzles below are used
    "clinging": None,
    "peak_factor": None,
    "limit_emw": 12.4,
    "gel_strength": 12.0,
    "inclination": 70.0,  # a high-angle interval (cuttings-bed functions)
    "standoff": 0.5,  # stand-off ratio 0-1 (BF_ECC_STANDOFF)
    "dial_resolution": None,
    "balance_resolution": None,
    "rate_uncertainty": None,
    "accel_time": 2.0,
    "liner": 6.5,  # the demo's pumps
    "stroke": 12.0,
    "efficiency": 0.97,
    "spm": 52.0,
    "pumps": None,
    "pump_kind": None,
    "rod": None,
    # downhole density at T and p (the demo's bit: 232 °F, 6,700 psi; invented)
    "surface_density": 11.0,
    "base_fluid": "mineral_oil",
    "oil_water_ratio": 80.0,
    "solids": 14.0,
    "reference_temperature": None,
    "water_phase": None,
    "surface_temperature": 70.0,
    "gradient": 1.5,
    # rheology at temperature (fn_rheology_temperature): D1 at 120 °F and an invented hot reading
    "readings_1": GOOD_READINGS,
    "readings_2": [[600, 46], [300, 31], [200, 24], [100, 17], [6, 7], [3, 6]],
    "temperature_1": 120.0,
    "temperature_2": 150.0,
    "temperature": 135.0,
    "parameter": "k",
}


def test_valid_template_covers_every_argument():
    for name, sf in FUNCTIONS.items():
        for p in inspect.signature(sf.func).parameters:
            assert p in VALID, (name, p)


@pytest.mark.parametrize("name", list(FUNCTIONS))
def test_fuzz_one_argument_at_a_time(name):
    """Start from a valid call and spoil one argument: the valid call gives a result, a
    spoiled one a result or an error text with a reason — never an exception."""
    func = FUNCTIONS[name].func
    hints = typing.get_type_hints(func, include_extras=True)
    params = list(inspect.signature(func).parameters)
    valid = [VALID[p] for p in params]
    good = func(*valid)
    assert not (isinstance(good, str) and good.startswith(MARK)), f"{name}: {good}"
    _check_result(good, name)
    if not params:
        return

    @SETTINGS
    @given(st.integers(min_value=0, max_value=len(params) - 1), st.data())
    def run(i, data):
        args = list(valid)
        args[i] = data.draw(_strategy(hints[params[i]]))
        _check_result(func(*args), name)

    run()


# ---------------------------------------------------------------- good calls equal calc

rising = st.lists(st.floats(min_value=0.5, max_value=20.0), min_size=6, max_size=6).map(
    lambda steps: np.cumsum(steps)[::-1]
)  # θ600 > θ300 > … > θ3 > 0


@SETTINGS
@given(rising)
def test_good_readings_equal_calc(dial):
    from addin.sheets.functions import BF_N, BF_PV, BF_TAU_Y, BF_YP

    speeds = [600, 300, 200, 100, 6, 3]
    r = cr.ViscometerReadings(speeds, dial)
    column = [[float(d)] for d in dial]
    assert BF_PV(column) == pytest.approx(cu.from_si(r.pv, "cP"), rel=1e-12)
    assert BF_YP(column, "si") == pytest.approx(r.yp, rel=1e-12, abs=1e-12)
    res = cr.fit(r, "api13d_2010_hb")
    assert BF_N(column, "api13d_2010_hb") == pytest.approx(res.model.n, rel=1e-12)
    assert BF_TAU_Y(column, "api13d_2010_hb", "si") == pytest.approx(res.model.tau_y, rel=1e-12)


@SETTINGS
@given(
    st.floats(min_value=6.5, max_value=22.0),
    st.lists(st.integers(min_value=6, max_value=32), min_size=1, max_size=9),
    st.floats(min_value=50.0, max_value=1500.0),
)
def test_good_bit_calls_equal_calc(density, nozzles, rate):
    from addin.sheets.functions import BF_BIT_DP, BF_TFA

    tfa = cb.total_flow_area(nozzles)
    assert BF_TFA([nozzles], "si") == pytest.approx(tfa, rel=1e-12)
    dp = cb.bit_pressure_drop(rate * cu.si_factor("gpm"), density * cu.si_factor("ppg"), tfa)
    assert BF_BIT_DP(density, [nozzles], rate) == pytest.approx(cu.from_si(dp, "psi"), rel=1e-12)


@SETTINGS
@given(
    st.floats(min_value=-1e6, max_value=1e6, allow_nan=False),
    st.sampled_from(["psi", "bar", "kPa", "ppg", "sg", "kg/m3", "gpm", "bbl/min", "L/min"]),
)
def test_good_conversions_equal_calc(value, unit):
    from addin.sheets.functions import BF_CONVERT

    target = {
        "psi": "bar",
        "bar": "psi",
        "kPa": "psi",
        "ppg": "sg",
        "sg": "kg/m3",
        "kg/m3": "ppg",
        "gpm": "bbl/min",
        "bbl/min": "L/min",
        "L/min": "gpm",
    }[unit]
    got = BF_CONVERT(value, unit, target)
    assert got == pytest.approx(cu.convert(value, unit, target), rel=1e-12, abs=1e-300)


@SETTINGS
@given(
    st.floats(min_value=8.0, max_value=16.0),
    st.floats(min_value=6.0, max_value=12.25),
    st.floats(min_value=0.3, max_value=0.85),
    st.floats(min_value=1.0, max_value=300.0),
    st.sampled_from(["running", "pulling"]),
)
def test_good_surge_calls_equal_calc(density, d_hole, ratio, speed, direction):
    from addin.sheets.functions import BF_SURGE
    from calc import circulation as cc
    from calc import surge as cs

    r = cr.ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
    fluid = cc.hydraulics_fluid_from_readings(r, density=density * cu.si_factor("ppg"))
    ty, k, n = fluid.annulus_parameters
    inch = cu.si_factor("in")
    res = cs.interval_surge(
        speed * cu.si_factor("ft/min"), d_hole * inch, ratio * d_hole * inch,
        1000.0 * cu.si_factor("ft"), density=fluid.density, tau_y=ty, k=k, n=n,
        direction=direction,
    )  # fmt: skip
    got = BF_SURGE(density, GOOD_READINGS, d_hole, ratio * d_hole, 1000.0, speed, direction)
    assert got == pytest.approx(cu.from_si(res.pressure_change, "psi"), rel=1e-12)
