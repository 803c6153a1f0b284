"""Settling slurries in pipes (calc.slurry): the Wilson–Thomas carrier friction against the
Newtonian law of the reference library `fluids`, exact laminar limits, the settling velocity
against Stokes' law and `fluids.drag`, the deposition-velocity fits' scaling, the gradient
methods' exact limits, monotone properties (hypothesis), bad input and the operating curve."""

from __future__ import annotations

import itertools
import math

import numpy as np
import pytest
from fluids.drag import v_terminal
from fluids.friction import Colebrook
from hypothesis import given, settings
from hypothesis import strategies as st

from calc.errors import InputError
from calc.flow.laminar_exact import hb_pipe_wall_stress
from calc.slurry import (
    Carrier,
    SlurryLine,
    Solids,
    carrier_gradient,
    deposition_velocities,
    durand_deposition_velocity,
    durand_fl,
    durand_gradient,
    four_component_gradient,
    operating_curve,
    settling_gradient,
    size_fractions,
    terminal_velocity,
    volume_concentration,
    wilson_deposition_velocity,
    wilson_thomas_area_ratio,
    wilson_thomas_wall_stress,
)
from calc.slurry.homogeneous import wilson_thomas_velocity
from calc.slurry.settling import G

WATER = Carrier.water(1000.0, 1.0e-3)
D = 0.1016  # 4 in ID
DEMO_SOLIDS = Solids(2600.0, 0.12, 150e-6, 300e-6)


# --- Wilson–Thomas: the Newtonian limit against the reference library ---------------------


@pytest.mark.parametrize("tau_w", [0.5, 2.0, 10.0, 50.0])
@pytest.mark.parametrize("rough", [0.0, 4.6e-5, 5e-4])
def test_wilson_thomas_is_colebrook_for_a_newtonian_fluid(tau_w, rough):
    # τ_y = 0, n = 1: α = 1, Ω = 0, so the law is Colebrook; reference: fluids.friction.Colebrook
    v = float(wilson_thomas_velocity(tau_w, D, 1000.0, 0.0, 1e-3, 1.0, rough))
    re = 1000.0 * v * D / 1e-3
    darcy = 8.0 * tau_w / (1000.0 * v**2)
    assert darcy == pytest.approx(Colebrook(re, rough / D), rel=1e-9)


def test_wilson_thomas_tends_to_newtonian_as_yield_vanishes_and_n_to_one():
    # limit τ_y → 0, n → 1 (Wilson & Thomas 1985 reduce to the Newtonian law): the wall stress
    # approaches fluids.friction.Colebrook's at the same velocity
    v, mu, rho = 2.0, 2e-3, 1100.0
    re = rho * v * D / mu
    tw_ref = Colebrook(re, 0.0) * rho * v**2 / 8.0
    gaps = []
    for eps in (1e-1, 1e-2, 1e-3, 1e-4):
        tw = float(wilson_thomas_wall_stress(v, D, rho, eps * 0.1, mu, 1.0 - eps))
        gaps.append(abs(tw / tw_ref - 1.0))
    assert gaps[-1] < 1e-3 and all(a > b for a, b in itertools.pairwise(gaps))


def test_area_ratio_closed_forms():
    # exact integrals of the rheogram: power law 2/(1+n), Bingham 1 + ξ (Wilson & Thomas 1985)
    assert float(wilson_thomas_area_ratio(0.0, 0.6)) == pytest.approx(2.0 / 1.6, rel=1e-15)
    assert float(wilson_thomas_area_ratio(0.3, 1.0)) == pytest.approx(1.3, rel=1e-15)


def test_shear_thinning_and_yield_lower_turbulent_friction_than_the_secant_newtonian():
    # the thicker sublayer (α > 1) gives a higher velocity at a wall stress than the Newtonian
    # law with the wall-secant viscosity (Wilson & Thomas 1985: drag reduction of shear-thinning
    # fluids); the Newtonian comparison is fluids.friction.Colebrook
    tw, rho, k, n = 20.0, 1100.0, 0.05, 0.6
    mu_eq = tw / (tw / k) ** (1.0 / n)
    v_wt = float(wilson_thomas_velocity(tw, D, rho, 0.0, k, n))
    # Newtonian velocity at the same wall stress and viscosity, from fluids' Colebrook by fixed
    # point in V
    v = 2.0
    for _ in range(200):
        v = math.sqrt(8.0 * tw / (rho * Colebrook(rho * v * D / mu_eq, 0.0)))
    assert v_wt > v


def test_carrier_laminar_is_the_exact_hb_solution():
    # slow flow of a viscous HB carrier is laminar; exact HB pipe solution (calc.flow)
    c = Carrier(1200.0, 8.0, 0.3, 0.6)
    v = 0.3
    q = v * math.pi * D**2 / 4
    g = float(carrier_gradient(v, D, c))
    assert g == pytest.approx(4.0 * float(hb_pipe_wall_stress(q, D, 8.0, 0.3, 0.6)) / D, 1e-12)
    # Hagen-Poiseuille for water at Re = 400 (exact)
    assert float(carrier_gradient(0.004, D, WATER)) == pytest.approx(32e-3 * 0.004 / D**2)


# --- settling velocity --------------------------------------------------------------------


def test_terminal_velocity_tends_to_stokes():
    # Stokes' law w = Δρ g d²/(18μ) (exact limit for Re → 0)
    d = 1e-6
    assert float(terminal_velocity(d, 2650.0, 1000.0, 1e-3)) == pytest.approx(
        1650.0 * G * d**2 / 18e-3, rel=5e-4
    )


@pytest.mark.parametrize("d, tol", [(50e-6, 0.05), (150e-6, 0.05), (2e-3, 0.10), (5e-4, 0.30)])
def test_terminal_velocity_of_spheres_against_fluids_drag(d, tol):
    # smooth spheres (C2 = 0.4) against fluids.drag.v_terminal (standard drag curve); measured
    # gaps: < 3 % for Re < 3, 6 % at 2 mm, 24 % at 0.5 mm (Re ≈ 40), the Ferguson & Church
    # form's worst region
    ref = v_terminal(d, 2650.0, 1000.0, 1e-3)
    assert float(terminal_velocity(d, 2650.0, 1000.0, 1e-3, c2=0.4)) == pytest.approx(ref, rel=tol)


# --- deposition velocity ------------------------------------------------------------------


def test_durand_scales_with_root_diameter_and_submerged_density():
    # V_D = F_L·√(2gD(S−1)) (Durand 1952): exact √D and √(S−1) dependence at fixed F_L
    v1 = float(durand_deposition_velocity(0.1, 0.3e-3, 2650.0, 1000.0, 0.1))
    v4 = float(durand_deposition_velocity(0.4, 0.3e-3, 2650.0, 1000.0, 0.1))
    assert v4 / v1 == pytest.approx(2.0, rel=1e-12)
    s1 = float(durand_deposition_velocity(0.1, 0.3e-3, 2000.0, 1000.0, 0.1))
    assert v1 / s1 == pytest.approx(math.sqrt(1.65), rel=1e-12)
    assert v1 == pytest.approx(float(durand_fl(0.3e-3, 0.1)) * math.sqrt(2 * G * 0.1 * 1.65))


@given(d=st.floats(0.05e-3, 25e-3), cv=st.floats(0.02, 0.3))
def test_durand_fl_stays_in_the_band_of_durands_chart(d, cv):
    # Durand's chart shows F_L between about 0.4 and 1.4 for 0.1-25 mm at 2-15 % (values read
    # from the chart, from memory)
    assert 0.2 < float(durand_fl(d, cv)) < 1.4


def test_wilson_fit_limits():
    # the nomograph fit: for d² ≫ 0.11·D^0.7 it tends to 8.8·a·D^0.7·d^-0.25; for fine grains
    # it is independent of D (exact limits of the closed form)
    a = (0.44 * 1.65 / 0.66) ** 0.55
    v = float(wilson_deposition_velocity(0.2, 20e-3, 2650.0, 1000.0))
    assert v == pytest.approx(8.8 * a * 0.2**0.7 * 20.0**-0.25, rel=0.01)
    f1 = float(wilson_deposition_velocity(0.2, 0.02e-3, 2650.0, 1000.0))
    f2 = float(wilson_deposition_velocity(0.8, 0.02e-3, 2650.0, 1000.0))
    assert f1 == pytest.approx(f2, rel=0.01)


def test_wilson_and_durand_agree_in_order_for_medium_sand():
    # both describe the same limit; for 0.5 mm sand in a 150 mm pipe they lie within ±30 % of
    # each other (from memory: the nomograph gives about 3 m/s there)
    r = deposition_velocities(0.15, 0.5e-3, 2650.0, 1000.0, 0.15)
    a, b = r.by_method.values()
    assert 0.7 < a / b < 1.3
    assert r.velocity == max(a, b)


# --- gradient -----------------------------------------------------------------------------


@pytest.mark.parametrize("method", ["four_component_2006", "durand_condolios_1952"])
def test_no_solids_gives_the_carrier_gradient_exactly(method):
    # C_v → 0: the slurry gradient is the carrier's (exact limit of both methods)
    s = Solids(2600.0, 0.0, 0.4e-3, 0.8e-3)
    v = np.array([1.0, 2.0, 4.0])
    g = settling_gradient(v, D, s, WATER, 4.6e-5, method=method)
    np.testing.assert_array_equal(g, carrier_gradient(v, D, WATER, 4.6e-5))


def test_pseudo_homogeneous_solids_are_an_equivalent_fluid():
    # all solids between 40 and 200 µm (one size 100 µm): friction × ρ_m/ρ_f, no excess
    s = Solids(2600.0, 0.1, 100e-6, 100e-6)
    r = four_component_gradient(2.0, D, s, WATER)
    assert float(r.total) == pytest.approx(float(r.carrier) * (1000 + 0.1 * 1600) / 1000, 1e-12)


def test_durand_excess_decays_as_v_to_minus_three_over_carrier():
    # Φ = 81·Ψ^-1.5 with Ψ ∝ V²: the excess ratio (i − i_f)/i_f falls as V^-3 (exact)
    s = Solids(2650.0, 0.1, 0.5e-3, 0.5e-3)
    v = np.array([2.0, 4.0])
    g = durand_gradient(v, 0.15, s, WATER)
    jf = carrier_gradient(v, 0.15, WATER)
    ratio = g / jf - 1.0
    assert ratio[0] / ratio[1] == pytest.approx(8.0, rel=1e-12)


@settings(max_examples=40, deadline=None)
@given(cv=st.floats(0.01, 0.4), v=st.floats(0.5, 6.0), d50=st.floats(50e-6, 3e-3))
def test_gradient_grows_with_concentration(cv, v, d50):
    # more solids never lower the friction (both methods; property)
    lo, hi = Solids(2600.0, cv * 0.5, d50, 2 * d50), Solids(2600.0, cv, d50, 2 * d50)
    for m in ("four_component_2006", "durand_condolios_1952"):
        a = float(settling_gradient(v, D, lo, WATER, method=m))
        b = float(settling_gradient(v, D, hi, WATER, method=m))
        assert b >= a


def test_settling_parts_capped_by_coulomb_friction():
    # at a crawl the heterogeneous part cannot exceed the sliding-bed limit μ_s·Δρ·g·C
    s = Solids(2600.0, 0.2, 1e-3, 2e-3)
    r = four_component_gradient(0.05, D, s, WATER)
    assert float(r.heterogeneous) <= 0.44 * 1600 * G * 0.2 * r.fractions.heterogeneous + 1e-9


def test_size_fractions_sum_to_one_and_follow_the_distribution():
    f = size_fractions(150e-6, 300e-6, D)
    assert f.fine + f.pseudo + f.heterogeneous + f.stratified == pytest.approx(1.0, abs=1e-12)
    # a narrow coarse sand in a small pipe is stratified
    g = size_fractions(5e-3, 5.5e-3, 0.05)
    assert g.stratified > 0.99


def test_inclination_scales_the_excess_by_cosine():
    # Worster & Denny (1955): excess over the carrier × cos θ
    h = float(settling_gradient(2.0, D, DEMO_SOLIDS, WATER))
    up = float(settling_gradient(2.0, D, DEMO_SOLIDS, WATER, inclination=60.0))
    jeq = float(four_component_gradient(2.0, D, DEMO_SOLIDS, WATER).fluid)
    assert up - jeq == pytest.approx(0.5 * (h - jeq), rel=1e-12)


# --- bad input ----------------------------------------------------------------------------


@pytest.mark.parametrize(
    "kw, name",
    [
        (dict(cv=0.7), "solids volume concentration"),
        (dict(cv=-0.1), "solids volume concentration"),
        (dict(d50=5e-6, d85=6e-6), "d50"),
        (dict(d85=100e-6), "d85"),
    ],
)
def test_bad_solids(kw, name):
    args = dict(density=2600.0, cv=0.1, d50=150e-6, d85=300e-6) | kw
    with pytest.raises(InputError) as e:
        Solids(**args)
    assert e.value.name == name


def test_bad_line_inputs():
    with pytest.raises(InputError, match="slurry rate"):
        SlurryLine("x", D, 100.0, DEMO_SOLIDS, WATER, rates=(-0.01,))
    with pytest.raises(InputError, match="d50"):
        SlurryLine("x", 0.01, 100.0, Solids(2600.0, 0.1, 12e-3, 12e-3), WATER)
    with pytest.raises(InputError, match="slurry gradient method"):
        SlurryLine("x", D, 100.0, DEMO_SOLIDS, WATER, method="nope")


def test_slurry_density_must_match_solids_and_carrier():
    assert volume_concentration(1160.0, 1000.0, 2600.0) == pytest.approx(0.1)
    with pytest.raises(InputError, match="slurry density"):
        volume_concentration(1160.0, 1000.0, 2600.0, cv=0.15)
    with pytest.raises(InputError, match="slurry density"):
        volume_concentration(3000.0, 1000.0, 2600.0)
    with pytest.raises(InputError, match="slurry density"):
        volume_concentration(900.0, 1000.0, 2600.0)


def test_outside_published_range_is_a_note():
    r = deposition_velocities(D, 0.05e-3, 2600.0, 1000.0, 0.1)
    assert {n.code for n in r.notes} == {"slurry_outside_correlation_range"}


# --- the operating curve ------------------------------------------------------------------


def test_operating_curve_minimum_and_deposition():
    q = 6 * 0.158987294928 / 60  # 6 bbl/min
    line = SlurryLine("demo", D, 91.44, DEMO_SOLIDS, WATER, rates=(q, 0.005))
    c = operating_curve(line)
    assert c.minimum_gradient <= c.gradient.min() + 1e-9
    assert c.velocity[0] < c.minimum_velocity < c.velocity[-1]
    assert np.array_equal(c.below_deposition, c.velocity < c.deposition_velocity)
    assert list(c.op_below) == [False, True]
    assert "slurry_below_deposition" in {n.code for n in c.notes}
    # horizontal: no static term; pressure = gradient × length
    np.testing.assert_allclose(c.pressure, c.gradient * 91.44, rtol=1e-14)


def test_operating_curve_static_term_uphill():
    line = SlurryLine("up", D, 100.0, DEMO_SOLIDS, WATER, rates=(0.02,), elevation_change=10.0)
    c = operating_curve(line)
    rho_m = 1000.0 + 0.12 * 1600.0
    assert c.static_pressure == pytest.approx(rho_m * G * 10.0, rel=1e-14)
