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
from calc.flow.eccentricity import eccentricity_factor_laminar, eccentricity_factor_turbulent
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


#: Step of the continuity sweep in ln Q.
JUMP_STEP = 1e-4

#: Bound on |d ln f / d ln Re| of each component law a blend combines (laminar, transitional,
#: turbulent): 2.  Laminar f = 2τ_w/(ρV²) with τ_w non-decreasing in V falls at most as Re⁻²
#: (plug-dominated Bingham/HB flow, τ_w → const) and at least as Re⁻¹; the API transitional
#: law 16Re/(3470 − 1370n)² rises as Re¹; every turbulent correlation in use falls far slower
#: than Re⁻² (Blasius −0.25, Dodge–Metzner and a/Re^b with b < 0.5, Darby −0.193).  This is the
#: only property of a turbulent correlation the bound uses.
COMPONENT_SLOPE = 2.0

#: Extra slope of the Darby, Mun & Boger (1992) blend f = (f_L^m + f_T^m)^(1/m) from its
#: Re-dependent exponent m = 1.7 + 40 000/Re (bingham).  ∂ln f/∂m = (Σw_i ln f_i − ln f)/m with
#: w_i = f_i^m/Σf_j^m; with r = f_min/f_max, ln f − ln f_max = ln(1 + r^m)/m ≤ ln 2/m and
#: ln f_max − Σw_i ln f_i = w_min·|ln r| ≤ max_x x·e^(−x)/m = 1/(e·m), so |∂ln f/∂m| ≤
#: (ln 2 + 1/e)/m².  |dm/d ln Re| = 40 000/Re = x, and x/(1.7 + x)² ≤ 1/(4·1.7): the term is at
#: most (ln 2 + 1/e)/6.8 = 0.156.  (A blend with a fixed exponent — API 2006/2010, §6.13 of the
#: methods reference — is a weighted mean of its components' slopes and adds nothing.)
DARBY_EXPONENT_SLOPE = (np.log(2.0) + np.exp(-1.0)) / 6.8


def _jump_tolerance(method, geometry, r, q, kappa, n, e):
    """Largest |Δ ln(gradient)| each step of the sweep may make without a jump (per step).

    Derivation: the gradient is dp/dL = (2ρ/D_h)·V²·f(Re)·R, so between neighbouring rates
    Δ ln g = 2Δln V + Δln f + Δln R, and by the mean-value theorem
    |Δ ln f| ≤ S_f·|Δ ln Re| with S_f the largest |d ln f/d ln Re| over the step:

    * power-mean blends (api13d_2010_hb, bingham_darby_1992): S_f ≤ COMPONENT_SLOPE (+ the
      Darby exponent term DARBY_EXPONENT_SLOPE for bingham_darby_1992), since a power mean's
      log-slope is a weighted mean of its components' slopes;
    * linear interpolation in Re between the band-end values f_l = f(Re_l), f_t = f(Re_t)
      (newtonian, power_law; bingham interpolates the wall stress, the same bound with τ_w in
      place of f): inside the band d ln f/d ln Re = Re(f_t − f_l)/((Re_t − Re_l)f),
      so S_f ≤ max(COMPONENT_SLOPE, |f_t − f_l|/min(f_l, f_t)·Re_t/(Re_t − Re_l)); f_l, f_t are
      the method's own values at the sweep rates nearest the band ends (within one step,
      which moves each by ≤ COMPONENT_SLOPE·step relatively, added to the ratio);
    * eccentric annulus: R = R_lam + w(R_turb − R_lam), w = clip((Re − Re_l)/(Re_t − Re_l)),
      linear in w, so |Δ ln R| ≤ |R_turb − R_lam|·|Δw|/min(R_lam, R_turb) exactly, with the
      Haciislamoglu–Langlinais factors of calc.flow.eccentricity.  Where Hanks' Re_l is large
      the band is narrow in ln Re and this term dominates (it made the bingham-annulus case
      fail against the former flat 0.1 %: a step of 0.0010000761 at steps of 1e-4).

    Nothing here depends on the turbulent correlation beyond COMPONENT_SLOPE; a change of a
    blend's structure (its exponent, or interpolation in place of a power mean) changes S_f.
    """
    re = np.asarray(r.reynolds, dtype=float)
    lam, turb = (
        float(np.ravel(r.reynolds_laminar_limit)[0]),
        float(np.ravel(r.reynolds_turbulent_limit)[0]),
    )
    d_ln_v = np.abs(np.diff(np.log(q)))
    d_ln_re = np.abs(np.diff(np.log(re)))
    s_f = COMPONENT_SLOPE
    if method == "bingham_darby_1992":
        s_f += DARBY_EXPONENT_SLOPE
    elif method in ("newtonian", "power_law", "bingham"):
        # linear interpolation in Re across the band: of f (newtonian, power_law) or of the
        # wall stress (bingham, τ_w = τ_L + w(τ_T − τ_L)); for τ_w the same bound holds with
        # the stresses at the band ends (τ_L rises and τ_T stays ≤ its band-end value inside
        # the band, and Δ ln g = Δ ln τ_w)
        f = np.asarray(
            r.wall_shear_stress if method == "bingham" else r.friction_factor, dtype=float
        )
        f_l, f_t = f[np.argmin(np.abs(re - lam))], f[np.argmin(np.abs(re - turb))]
        ratio = abs(f_t - f_l) / min(f_l, f_t) + 2 * COMPONENT_SLOPE * JUMP_STEP
        s_f = max(s_f, ratio * turb / (turb - lam))
    ecc = np.zeros(d_ln_v.shape)
    if geometry == "annulus" and e > 0:
        r_l = float(eccentricity_factor_laminar(e, kappa, n))
        r_t = float(eccentricity_factor_turbulent(e, kappa, n))
        w = np.clip((re - lam) / (turb - lam), 0.0, 1.0)
        ecc = abs(r_t - r_l) * np.abs(np.diff(w)) / min(r_l, r_t)
    return 2.0 * d_ln_v + s_f * d_ln_re + ecc + 1e-12  # 1e-12: rounding of ln


def _continuity_fluid(method, u_ty, u_k, u_n):
    """(tau_y, k, n) within what ``method`` accepts, from three numbers in [0, 1] (the ranges
    of :func:`fluid`; plain floats so that found cases can be kept as @example)."""
    if method == "newtonian":
        return 0.0, 5e-4 + u_k * (0.1 - 5e-4), 1.0
    if method in ("bingham", "bingham_darby_1992"):
        return 20.0 * u_ty, 5e-3 + u_k * (0.08 - 5e-3), 1.0
    n = 0.25 + 0.75 * u_n
    k = 0.02 + u_k * (2.0 - 0.02)
    return (0.0 if method == "power_law" else 20.0 * u_ty), k, n


@pytest.mark.parametrize("geometry", ["pipe", "annulus"])
@pytest.mark.parametrize(
    "method", [m for m in METHODS if m not in ("api13d_1995_power_law", "exact_laminar")]
)
@settings(max_examples=15, deadline=None)
@given(
    d=diam, kappa=ratio, rho=density, e=st.floats(0.0, 0.9), u_ty=st.floats(0.0, 1.0),
    u_k=st.floats(0.0, 1.0), u_n=st.floats(0.0, 1.0),
)  # fmt: skip
def test_no_jump_across_regime_boundaries(method, geometry, d, kappa, rho, e, u_ty, u_k, u_n):
    # continuity of every blended method across its regime boundaries: no step of the dense
    # sweep changes ln(gradient) by more than the blend can legitimately change it over that
    # step (derivation in _jump_tolerance)
    fl = _continuity_fluid(method, u_ty, u_k, u_n)
    ty, k, n = fl
    a = dict(density=rho, tau_y=ty, k=k, n=n, method=method)
    qc = critical_flow_rate(d, None if geometry == "pipe" else kappa * d, **a)
    probe = _flow(method, geometry, qc, d, kappa, rho, fl)
    # Every method's Re grows at least linearly with V, so the whole transitional band lies
    # within [qc, qc·Re_turb/Re_lam]: sweep it densely (steps of 1e-4), from just below qc.
    span = probe.reynolds_turbulent_limit / probe.reynolds_laminar_limit
    q = qc * np.exp(np.arange(-20, np.log(span) / JUMP_STEP + 20) * JUMP_STEP)
    ecc = e if geometry == "annulus" else 0.0
    r = _flow(method, geometry, q, d, kappa, rho, fl, ecc=ecc)
    assert (r.regime == 0).any() and (r.regime == 2).any()
    step = np.abs(np.diff(np.log(r.gradient)))
    tol = _jump_tolerance(method, geometry, r, q, kappa, n, ecc)
    i = int(np.argmax(step - tol))
    assert step[i] <= tol[i], (fl, float(step[i]), float(tol[i]))


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


@pytest.mark.parametrize("geometry", ["pipe", "annulus"])
def test_jump_tolerance_catches_the_1995_jump(geometry):
    # the bound of test_no_jump_across_regime_boundaries is not vacuous: API RP 13D (1995) as
    # published jumps at Re = 2100 (test_api95_as_published_jump_at_2100), and that step exceeds
    # the tolerance the derivation allows a continuous law (component slopes ≤ 2, no blend)
    fl, d, kappa, rho = (0.0, 0.3, 0.6), 0.2, 0.6, 1200.0
    qc = critical_flow_rate(d, None if geometry == "pipe" else kappa * d, density=rho,
                            tau_y=0.0, k=0.3, n=0.6, method="api13d_1995_power_law")  # fmt: skip
    q = qc * np.exp(np.arange(-20, 20) * JUMP_STEP)
    r = _flow("api13d_1995_power_law", geometry, q, d, kappa, rho, fl)
    step = np.abs(np.diff(np.log(r.gradient)))
    tol = _jump_tolerance("api13d_1995_power_law", geometry, r, q, kappa, 0.6, 0.0)
    assert np.max(step - tol) > 0.05  # a jump of more than 5 % in the gradient
