"""Nozzle selection at a fixed surface pressure, parasitic-loss exponent, nozzle combinations.

Optimum conditions from Guo & Liu (2011), eqs. 4.15–4.21 (also Bourgoyne et al. 1986, ch. 4),
each checked against a brute-force numerical optimisation of the same objective.
"""

import itertools

import numpy as np
import pytest
from fluids.friction import Blasius
from scipy.optimize import minimize_scalar

from calc.bit import (
    TURBULENT_PARASITIC_EXPONENT,
    ParasiticLoss,
    bit_pressure_drop,
    fit_parasitic_loss,
    impact_force,
    nozzle_combinations,
    optimum_nozzles,
    parasitic_loss_from_model,
    total_flow_area,
)
from calc.errors import InputError
from calc.units import from_si, to_si

P_MAX = to_si(4000.0, "psi")
RHO = to_si(11.0, "ppg")
# c chosen so that the parasitic loss is 1,500 psi at 500 gpm (invented illustration)
Q_REF = to_si(500.0, "gpm")


def _c(m):
    return to_si(1500.0, "psi") / Q_REF**m


@pytest.mark.parametrize("m", [1.4, 1.75, 1.86, 2.0])
def test_max_power_bit_share_and_brute_force(m):
    c = _c(m)
    opt = optimum_nozzles(P_MAX, c, m, "max_power", q_max=1.0, density=RHO)
    # Guo & Liu (2011) eqs. 4.16–4.18: ΔP_b = m/(m + 1)·p
    assert opt.bit_drop == pytest.approx(m / (m + 1) * P_MAX, rel=1e-12)
    assert opt.limited_by == "optimum"
    # brute force: maximise (p - cQ^m)·Q numerically
    q_zero = (P_MAX / c) ** (1 / m)  # rate at which nothing is left for the bit
    res = minimize_scalar(lambda q: -(P_MAX - c * q**m) * q, bounds=(1e-4, q_zero),
                          method="bounded", options={"xatol": 1e-10})  # fmt: skip
    assert opt.flow_rate == pytest.approx(res.x, rel=1e-5)
    assert opt.hydraulic_power == pytest.approx(-res.fun, rel=1e-8)


@pytest.mark.parametrize("m", [1.4, 1.75, 1.86, 2.0])
def test_max_impact_bit_share_and_brute_force(m):
    c = _c(m)
    opt = optimum_nozzles(P_MAX, c, m, "max_impact", q_max=1.0, density=RHO)
    # Guo & Liu (2011) eqs. 4.19–4.21: ΔP_b = m/(m + 2)·p
    assert opt.bit_drop == pytest.approx(m / (m + 2) * P_MAX, rel=1e-12)
    res = minimize_scalar(
        lambda q: -impact_force(q, RHO, P_MAX - c * q**m, 0.95),
        bounds=(1e-4, (P_MAX / c) ** (1 / m)),
        method="bounded", options={"xatol": 1e-10},
    )  # fmt: skip
    assert opt.flow_rate == pytest.approx(res.x, rel=1e-5)
    assert opt.impact_force == pytest.approx(-res.fun, rel=1e-8)


def test_bit_shares_match_the_rules_of_thumb():
    # common practice (calc/METHODS.md §16.4): bit share ~65 % for max HHP, ~48 % for max impact;
    # these correspond to m ≈ 1.86
    a = optimum_nozzles(P_MAX, _c(1.86), 1.86, "max_power", q_max=1.0, density=RHO)
    b = optimum_nozzles(P_MAX, _c(1.86), 1.86, "max_impact", q_max=1.0, density=RHO)
    assert a.bit_share == pytest.approx(0.65, abs=0.005)
    assert b.bit_share == pytest.approx(0.48, abs=0.005)


def test_tfa_field_form_0_00912():
    # Guo & Liu (2011) eqs. 4.15/4.19: A_T = 0.00912·Q·√(ρ/ΔP_b)/C_d (in², gpm, ppg, psi);
    # 0.00912 = √8.311e-5 (calc/METHODS.md §0.4)
    opt = optimum_nozzles(P_MAX, _c(1.75), 1.75, "max_power", q_max=1.0, density=RHO)
    q, dp = from_si(opt.flow_rate, "gpm"), from_si(opt.bit_drop, "psi")
    assert from_si(opt.tfa, "in**2") == pytest.approx(0.00912 * q * np.sqrt(11.0 / dp) / 0.95,
                                                      rel=5e-4)  # fmt: skip
    # and the TFA reproduces the bit drop through the nozzle equation (exact)
    assert bit_pressure_drop(opt.flow_rate, RHO, opt.tfa, 0.95) == pytest.approx(opt.bit_drop)


def test_impact_ratio_of_the_two_designs():
    # exact consequence of G&L eqs. 4.16–4.21 (calc/METHODS.md §8.9, derived):
    # F(max HHP)/F(max impact) = [(m+2)/(2(m+1))]^(1/m)·√[(m+2)/(m+1)]
    m = 1.75
    a = optimum_nozzles(P_MAX, _c(m), m, "max_power", q_max=1.0, density=RHO)
    b = optimum_nozzles(P_MAX, _c(m), m, "max_impact", q_max=1.0, density=RHO)
    want = ((m + 2) / (2 * (m + 1))) ** (1 / m) * np.sqrt((m + 2) / (m + 1))
    assert a.impact_force / b.impact_force == pytest.approx(want, rel=1e-12)
    assert want < 1.0


def test_rate_limited_by_pump_and_minimum():
    m = 1.75
    c = _c(m)
    q_max = to_si(400.0, "gpm")  # below the unconstrained optimum
    opt = optimum_nozzles(P_MAX, c, m, "max_power", q_max=q_max, density=RHO)
    assert opt.limited_by == "maximum rate" and opt.flow_rate == pytest.approx(q_max)
    # at the limit the bit takes all that is left (Guo & Liu 2011, eq. 4.15)
    assert opt.bit_drop == pytest.approx(P_MAX - c * q_max**m)
    assert [n.code for n in opt.notes] == ["rate_at_pump_maximum"]
    q_min = to_si(600.0, "gpm")  # above the unconstrained optimum (~491 gpm)
    opt2 = optimum_nozzles(P_MAX, c, m, "max_power", q_max=1.0, q_min=q_min, density=RHO)
    assert opt2.limited_by == "minimum rate" and opt2.flow_rate == pytest.approx(q_min)


def test_vectorised_over_pressure_limit():
    p = to_si(np.linspace(2000, 5000, 1000), "psi")
    opt = optimum_nozzles(p, _c(1.75), 1.75, "max_impact", q_max=to_si(700.0, "gpm"), density=RHO)
    assert opt.flow_rate.shape == (1000,)
    assert set(np.unique(opt.limited_by)) <= {"optimum", "maximum rate"}
    np.testing.assert_allclose(opt.bit_drop[opt.limited_by == "optimum"],
                               1.75 / 3.75 * p[opt.limited_by == "optimum"])  # fmt: skip


@pytest.mark.parametrize(
    ("kwargs", "match"),
    [
        ({"criterion": "max_hhp"}, "nozzle optimisation criterion"),
        ({"m": -1.0}, "exponent"),
        ({"q_min": 2.0}, "minimum flow rate"),
        ({"density": None}, "q_max/density"),
        ({"max_surface_pressure": to_si(100.0, "psi"), "q_min": 0.05}, "no pressure left"),
    ],
)
def test_optimisation_bad_input(kwargs, match):
    args = {"max_surface_pressure": P_MAX, "c": _c(1.75), "m": 1.75, "criterion": "max_power",
            "q_max": 1.0, "density": RHO, **kwargs}  # fmt: skip
    with pytest.raises(InputError, match=match):
        optimum_nozzles(**args)


# ------------------------------------------------------------------ parasitic exponent
def test_two_rate_fit_recovers_exponent():
    # synthetic pump test built from ΔP_d = c·Q^m plus the nozzle equation (exact inverse)
    c, m = _c(1.82), 1.82
    tfa = total_flow_area([12] * 6)
    q = to_si(np.array([300.0, 520.0]), "gpm")
    p = c * q**m + bit_pressure_drop(q, RHO, tfa, 0.95)
    fit = fit_parasitic_loss(q, p, RHO, tfa)
    assert fit.m == pytest.approx(m, rel=1e-12) and fit.c == pytest.approx(c, rel=1e-10)
    assert fit.notes == ()
    assert fit.loss(q[1]) == pytest.approx(c * q[1] ** m)


def test_two_rate_fit_demo_slow_circulation_rates():
    # invented demo scenario: slow circulating rates 30 and 40 spm on pump 1 at 520 and 880 psi,
    # 5.02 gal/stroke, 11.2 ppg, nozzles 3x12 3x11; common practice: two-rate exponent often ~1.8
    # (calc/METHODS.md §16.4)
    q = to_si(np.array([30, 40]) * 5.02, "gpm")
    fit = fit_parasitic_loss(q, to_si([520.0, 880.0], "psi"), to_si(11.2, "ppg"),
                             total_flow_area("3x12 3x11"))  # fmt: skip
    assert fit.m == pytest.approx(1.8, abs=0.1)


def test_two_rate_fit_bad_input():
    tfa = total_flow_area([12] * 6)
    with pytest.raises(InputError, match="two different"):
        fit_parasitic_loss([0.03, 0.03], [1e7, 2e7], RHO, tfa)
    with pytest.raises(InputError, match="parasitic loss"):
        fit_parasitic_loss([0.03, 0.04], [1e5, 2e5], RHO, tfa)  # below the bit drop
    with pytest.raises(InputError, match="exponent"):
        fit_parasitic_loss([0.03, 0.04], [2e7, 1.9e7], RHO, tfa)
    odd = fit_parasitic_loss([0.03, 0.04], [1.5e7, 3.5e7], RHO, tfa)  # m ≈ 3.2
    assert [n.code for n in odd.notes] == ["unusual_exponent"]


def test_computed_exponent_of_turbulent_pipe_flow_is_1_75():
    # Blasius' friction factor from the `fluids` library (Darcy 0.3164·Re^-0.25) in a pipe:
    # Δp ∝ Q^1.75 exactly — the theoretical exponent (Bourgoyne et al. 1986, ch. 4)
    d, length, mu = 0.1086, 3000.0, 0.02

    def loss(q):
        v = q / (np.pi / 4 * d**2)
        re = RHO * v * d / mu
        return np.array([Blasius(r) for r in np.atleast_1d(re)]) * length / d * RHO * v**2 / 2

    fit = parasitic_loss_from_model(loss, 0.02, 0.04)
    assert fit.m == pytest.approx(TURBULENT_PARASITIC_EXPONENT, rel=1e-10)
    theory = ParasiticLoss.turbulent_theory(0.02, float(loss(0.02)[0]))
    assert theory.loss(0.04) == pytest.approx(float(loss(0.04)[0]), rel=1e-10)


# ------------------------------------------------------------------ combinations
def test_nozzle_combinations_exact_target_and_brute_force():
    stock = [10, 11, 12, 13, 14]
    target = total_flow_area([12, 12, 12, 11, 11, 11])
    combos = nozzle_combinations(target, stock, 6, best=3)
    assert combos[0].sizes == (12, 12, 12, 11, 11, 11) and combos[0].deviation == 0.0
    assert combos[0].text == "3x12 3x11"
    # brute force over every ordered 6-tuple of stock sizes
    best = min(abs(total_flow_area(list(c)) - target) for c in itertools.product(stock, repeat=6))
    assert abs(combos[0].tfa - target) == pytest.approx(best, abs=1e-15)
    assert abs(combos[1].deviation) >= abs(combos[0].deviation)


def test_nozzle_combinations_for_an_optimum_and_bad_count():
    opt = optimum_nozzles(P_MAX, _c(1.75), 1.75, "max_impact", q_max=1.0, density=RHO)
    combos = nozzle_combinations(opt.tfa, [9, 10, 11, 12, 13, 14, 15, 16, 18, 20], 5)
    assert len(combos) == 5
    assert abs(combos[0].deviation) < 0.02  # a 5-nozzle set within 2 % exists in this stock
    with pytest.raises(InputError, match="nozzle count"):
        nozzle_combinations(opt.tfa, [12], 0)
    with pytest.raises(InputError, match="whole 32nds"):
        nozzle_combinations(opt.tfa, [12.5], 3)
