"""Property tests (hypothesis) for calc.flow: monotonicity, eccentricity, continuity, bad input."""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calc.errors import InputError
from calc.flow import (
    annulus_flow,
    critical_flow_rate,
    cross_section_area,
    list_friction_laws,
    mean_velocity,
    pipe_flow,
)
from calc.flow.distinct import distinct_combinations
from calc.units import from_si, to_si

METHODS = [m.name for m in list_friction_laws()]
FAST = dict(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])

density = st.floats(800.0, 2200.0)
n_index = st.floats(0.25, 1.0)
diam = st.floats(0.05, 0.35)
ratio = st.floats(0.2, 0.92)


@st.composite
def fluid(draw, method):
    """(tau_y, k, n) within what ``method`` accepts."""
    if method == "newtonian":
        return 0.0, draw(st.floats(5e-4, 0.1)), 1.0
    if method in ("bingham", "bingham_darby_1992"):
        return draw(st.floats(0.0, 20.0)), draw(st.floats(5e-3, 0.08)), 1.0
    n = draw(n_index)
    k = draw(st.floats(0.02, 2.0))
    if method in ("power_law", "api13d_1995_power_law"):
        return 0.0, k, n
    return draw(st.floats(0.0, 20.0)), k, n


def _flow(method, geometry, q, d, kappa, rho, fl, ecc=0.0):
    ty, k, n = fl
    a = dict(density=rho, tau_y=ty, k=k, n=n, method=method)
    if geometry == "pipe":
        return pipe_flow(q, d, **a)
    return annulus_flow(q, d, kappa * d, eccentricity=ecc, **a)


def _rates_around_transition(method, geometry, d, kappa, rho, fl, n_pts=60, span=(0.2, 6.0)):
    ty, k, n = fl
    qc = critical_flow_rate(
        d,
        None if geometry == "pipe" else kappa * d,
        density=rho,
        tau_y=ty,
        k=k,
        n=n,
        method=method,
    )
    return np.geomspace(span[0] * qc, span[1] * qc, n_pts)


@pytest.mark.parametrize("geometry", ["pipe", "annulus"])
@pytest.mark.parametrize("method", [m for m in METHODS if m != "api13d_1995_power_law"])
@settings(**FAST)
@given(data=st.data(), d=diam, kappa=ratio, rho=density)
def test_gradient_non_decreasing_with_flow_rate(method, geometry, data, d, kappa, rho):
    # Physical requirement: more flow, more friction loss (DESIGN.md property list)
    fl = data.draw(fluid(method))
    q = _rates_around_transition(method, geometry, d, kappa, rho, fl, n_pts=40)
    if method == "exact_laminar":
        q = q[:15:2]
    g = _flow(method, geometry, q, d, kappa, rho, fl).gradient
    assert np.all(np.diff(g) >= -1e-9 * g[1:]), (fl, np.min(np.diff(g) / g[1:]))


@pytest.mark.parametrize("geometry", ["pipe", "annulus"])
@settings(**FAST)
@given(data=st.data(), d=diam, kappa=ratio, rho=density)
def test_api95_non_decreasing_within_each_regime(geometry, data, d, kappa, rho):
    # API RP 13D (1995) as published jumps at Re = 2100 (see test_flow_methods); within a regime
    # the gradient must still rise with the rate.
    fl = data.draw(fluid("api13d_1995_power_law"))
    q = _rates_around_transition("api13d_1995_power_law", geometry, d, kappa, rho, fl)
    r = _flow("api13d_1995_power_law", geometry, q, d, kappa, rho, fl)
    for reg in (0, 2):
        g = r.gradient[r.regime == reg]
        assert np.all(np.diff(g) >= -1e-9 * g[1:])


@pytest.mark.parametrize(
    "method",
    [pytest.param(m, marks=pytest.mark.slow) if m == "exact_laminar" else m for m in METHODS],
)
@settings(max_examples=15, deadline=None)
@given(data=st.data(), d=diam, kappa=st.floats(0.3, 0.9), rho=density, e=st.floats(0.0, 0.95))
def test_eccentric_not_above_concentric_in_laminar(method, data, d, kappa, rho, e):
    # Haciislamoglu & Langlinais (1990): within laminar flow the eccentric loss is lower
    fl = data.draw(fluid(method))
    q = _rates_around_transition(method, "annulus", d, kappa, rho, fl, n_pts=8, span=(0.1, 0.9))
    if method == "exact_laminar":
        q = q[::3]  # the exact annulus is a nested solve: three rates suffice
    # concentric (row 0) and eccentric (row 1) in one vectorised call
    both = _flow(method, "annulus", q, d, kappa, rho, fl, ecc=np.array([[0.0], [e]]))
    c_grad, x_grad = np.asarray(both.gradient)
    lam = np.asarray(both.regime)[0] == 0
    assert lam.all()
    assert np.all(x_grad[lam] <= c_grad[lam] * (1 + 1e-12))
    if e > 0.05:
        assert np.all(x_grad[lam] < c_grad[lam])


#: Largest change of ln(gradient) allowed between neighbouring rates 1e-4 apart (relative):
#: 0.1 %, our stated continuity tolerance across regime boundaries (a smooth gradient ∝ Qᵐ with
#: m ≤ 3 changes by at most 3e-4 per step).
JUMP_TOL = 1e-3


@pytest.mark.parametrize("geometry", ["pipe", "annulus"])
@pytest.mark.parametrize(
    "method", [m for m in METHODS if m not in ("api13d_1995_power_law", "exact_laminar")]
)
@settings(max_examples=15, deadline=None)
@given(data=st.data(), d=diam, kappa=ratio, rho=density, e=st.floats(0.0, 0.9))
def test_no_jump_across_regime_boundaries(method, geometry, data, d, kappa, rho, e):
    fl = data.draw(fluid(method))
    ty, k, n = fl
    a = dict(density=rho, tau_y=ty, k=k, n=n, method=method)
    qc = critical_flow_rate(d, None if geometry == "pipe" else kappa * d, **a)
    probe = _flow(method, geometry, qc, d, kappa, rho, fl)
    # Every method's Re grows at least linearly with V, so the whole transitional band lies
    # within [qc, qc·Re_turb/Re_lam]: sweep it densely (steps of 1e-4), from just below qc.
    span = probe.reynolds_turbulent_limit / probe.reynolds_laminar_limit
    q = qc * np.exp(np.arange(-20, np.log(span) / 1e-4 + 20) * 1e-4)
    r = _flow(method, geometry, q, d, kappa, rho, fl, ecc=e if geometry == "annulus" else 0.0)
    assert (r.regime == 0).any() and (r.regime == 2).any()
    step = np.abs(np.diff(np.log(r.gradient)))
    assert np.max(step) <= JUMP_TOL, (fl, float(np.max(step)))


BAD_VALUES = {
    "q": [0.0, -1e-3, np.nan, np.inf],
    "d_hole": [0.0, -0.2, np.nan],
    "d_pipe": [0.0, -0.1, 0.5],
    "density": [0.0, -1000.0, np.nan],
    "tau_y": [-0.1, np.nan],
    "k": [0.0, -0.5],
    "n": [0.0, -0.7],
    "eccentricity": [1.0, -0.01, 1.5],
    "method": ["api13d", "", "exact"],
}


@settings(max_examples=60, deadline=None)
@given(
    which=st.sampled_from(sorted(BAD_VALUES)),
    data=st.data(),
    size=st.integers(1, 5),
)
def test_bad_input_always_input_error(which, data, size):
    bad = data.draw(st.sampled_from(BAD_VALUES[which]))
    args = dict(
        q=np.full(size, 0.02),
        d_hole=0.2159,
        d_pipe=0.127,
        density=1200.0,
        tau_y=3.0,
        k=0.3,
        n=0.7,
        eccentricity=0.2,
        method="api13d_2010_hb",
    )
    if which == "method":
        args["method"] = bad
    else:
        arr = np.array(np.broadcast_to(np.asarray(args[which], dtype=float), (size,)))
        arr[data.draw(st.integers(0, size - 1))] = bad
        args[which] = arr
    with pytest.raises(InputError):
        annulus_flow(args.pop("q"), args.pop("d_hole"), args.pop("d_pipe"), **args)


@settings(**FAST)
@given(
    a=st.lists(st.sampled_from([0.1, 0.2, 0.3]), min_size=1, max_size=5),
    b=st.lists(st.floats(-1e3, 1e3), min_size=1, max_size=4),
)
def test_distinct_combinations_rebuild_the_broadcast_inputs(a, b):
    # exact identity: gathering the distinct columns must give back every broadcast element
    x = np.array(a)[:, None]
    y = np.array(b)[None, :]
    shape = np.broadcast_shapes(x.shape, y.shape)
    cols, inv = distinct_combinations([x, y, 7.0], shape)
    for col, arr in zip(cols, (x, y, 7.0), strict=True):
        np.testing.assert_array_equal(col[inv], np.broadcast_to(arr, shape).ravel())
    pairs = {(float(p), float(q)) for p, q in zip(cols[0], cols[1], strict=True)}
    assert len(pairs) == cols[0].size  # each combination once


@pytest.mark.parametrize("method", METHODS)
def test_sweep_critical_velocity_equals_single_interval_call(method):
    # the sweep solves the critical velocity once per interval; it must equal the one-rate
    # call's value for that interval (same solve, so to rounding)
    fl = {
        "newtonian": (0.0, 0.02, 1.0),
        "bingham": (7.0, 0.025, 1.0),
        "bingham_darby_1992": (7.0, 0.025, 1.0),
    }.get(method, (0.0 if method in ("power_law", "api13d_1995_power_law") else 5.0, 0.4, 0.65))
    ty, k, n = fl
    q = np.linspace(0.005, 0.06, 7)[:, None]
    d_hole = np.array([0.2159, 0.2159, 0.3112])[None, :]
    d_pipe = np.array([0.127, 0.1651, 0.127])[None, :]
    r = annulus_flow(q, d_hole, d_pipe, density=1300.0, tau_y=ty, k=k, n=n, method=method)
    for j in range(3):
        one = annulus_flow(
            0.02, d_hole[0, j], d_pipe[0, j], density=1300.0, tau_y=ty, k=k, n=n, method=method
        )
        np.testing.assert_allclose(r.critical_velocity[:, j], one.critical_velocity, rtol=1e-14)


def test_mean_velocity_equals_field_annular_velocity_formula():
    # field form AV[ft/min] = 24.51·Q[gpm]/(D2² − D1²)[in²] (calc/METHODS.md §6.1; common practice;
    # 24.51 is 77/π = 24.5099 rounded, hence rel 5e-5)
    q_gpm, d2_in, d1_in = np.array([300.0, 522.0, 700.0]), 8.5, np.array([5.0, 5.0, 6.75])
    av = mean_velocity(to_si(q_gpm, "gpm"), to_si(d2_in, "in"), to_si(d1_in, "in"))
    field = 24.51 * q_gpm / (d2_in**2 - d1_in**2)
    np.testing.assert_allclose(from_si(av, "ft/min"), field, rtol=5e-5)
    # pipe: V = Q/(πD²/4), and the annulus area is the difference of two circles (exact)
    assert float(mean_velocity(0.01, 0.1)) == pytest.approx(0.01 / (np.pi * 0.1**2 / 4))
    assert float(cross_section_area(0.2, 0.1)) == pytest.approx(
        float(cross_section_area(0.2)) - float(cross_section_area(0.1))
    )
