"""Rotation factor (laminar helical flow of a power-law fluid in the slot annulus).

Checks against outside references:
- the exact Newtonian limit: axial and rotational Stokes flows superpose, so rotation leaves
  the axial gradient unchanged (Bird, Armstrong & Hassager 1987, Dynamics of Polymeric Liquids
  vol. 1, helical flow of generalised Newtonian fluids: coupling only through the viscosity);
- the exact λ = 0 slot solution of a power-law fluid (plane Poiseuille flow, Bird et al. 1987);
- the exact limit of dominant rotation: a small axial flow under strong Couette shear sees the
  secant viscosity K·(U/h)^(n-1), so the gradient tends to the Newtonian slot value 12μV/h²
  (derived from the same constitutive law; Savins & Wallick 1966 discuss the limit);
- an independent solution of the slot equations with scipy.integrate.quad and nested
  scipy.optimize.brentq, written apart from the Newton solver.
"""

import numpy as np
import pytest
from scipy import integrate, optimize

from calc.errors import InputError
from calc.flow import annulus_flow
from calc.flow.rotation import (
    RPM_MAX,
    check_rpm,
    helical_gradient_ratio,
    rotation_factor,
    surface_speed_ratio,
)


def _reference_ratio(n, lam):
    """g/g0 from quad + nested brentq on the slot equations (independent implementation)."""
    m = (1.0 - n) / n

    def axial(g, t):
        return 2 * integrate.quad(lambda x: g * x * x * np.hypot(g * x, t) ** m, 0, 0.5,
                                  epsabs=1e-14, epsrel=1e-13)[0] - 1.0  # fmt: skip

    def g_of(t):
        return optimize.brentq(lambda g: axial(g, t), 1e-12, 1e8, xtol=1e-14, rtol=1e-14)

    def wall(t):
        g = g_of(t)
        return 2 * integrate.quad(lambda x: t * np.hypot(g * x, t) ** m, 0, 0.5,
                                  epsabs=1e-14, epsrel=1e-13)[0] - lam  # fmt: skip

    t = optimize.brentq(wall, 1e-9, 10.0 * (1.0 + lam), xtol=1e-14, rtol=1e-14)
    return g_of(t) / g_of(0.0)


@pytest.mark.parametrize("n, lam", [(0.3, 0.5), (0.5, 2.0), (0.65, 1.0), (0.8, 8.0), (0.4, 20.0)])
def test_newton_solver_matches_independent_quadrature(n, lam):
    assert float(helical_gradient_ratio(n, lam)) == pytest.approx(_reference_ratio(n, lam),
                                                                  rel=1e-8)  # fmt: skip


def test_newtonian_fluid_is_unaffected_by_rotation():
    # exact: Newtonian axial and Couette flows superpose (Bird, Armstrong & Hassager 1987)
    lam = np.array([0.0, 0.5, 5.0, 50.0])
    assert np.array_equal(helical_gradient_ratio(1.0, lam), np.ones(4))


def test_dominant_rotation_gives_the_secant_viscosity_limit():
    # λ → ∞: the axial gradient is the Newtonian slot one with μ = K(U/h)^(n-1); in the
    # module's scales g → 12 λ^(n-1), and g0 = (2(1/n+2)·2^(1/n+1))^n (exact λ = 0 solution)
    for n in (0.4, 0.7):
        lam = 1.0e4
        g0 = (0.5 * (1 / n + 2) * 2 ** (1 / n + 2)) ** n
        assert float(helical_gradient_ratio(n, lam)) == pytest.approx(
            12 * lam ** (n - 1) / g0, rel=1e-6
        )


def test_rotation_lowers_the_gradient_of_shear_thinning_fluids_monotonically():
    lam = np.linspace(0.0, 20.0, 41)
    r = helical_gradient_ratio(0.6, lam)
    assert r[0] == 1.0 and np.all(np.diff(r) < 0) and r[-1] > 0


def test_annulus_flow_applies_the_factor_to_laminar_flow():
    d2, d1, q = 0.2159, 0.127, 0.02
    kw = dict(density=1200.0, tau_y=0.0, k=0.5, n=0.6, method="power_law")
    base = annulus_flow(q, d2, d1, **kw)
    rot = annulus_flow(q, d2, d1, rpm=140.0, **kw)
    assert base.regime_label == "laminar"
    lam = surface_speed_ratio(140.0, d1, base.velocity)
    expected = float(helical_gradient_ratio(0.6, lam))
    assert rot.rotation_factor == pytest.approx(expected, rel=1e-12)
    assert rot.gradient == pytest.approx(base.gradient * expected, rel=1e-12)
    assert expected < 0.99


def test_no_factor_in_turbulent_flow():
    r = rotation_factor(140.0, 0.2159, 0.127, 0.6, 0.6, turbulent_weight=1.0)
    assert float(r) == 1.0


@pytest.mark.parametrize("bad", [-1.0, RPM_MAX + 1.0, float("nan")])
def test_bad_rpm_names_input_value_and_range(bad):
    with pytest.raises(InputError) as exc:
        check_rpm(bad)
    assert "rotary speed" in str(exc.value)
    with pytest.raises(InputError):
        annulus_flow(0.02, 0.2159, 0.127, density=1200.0, tau_y=0.0, k=0.5, n=0.6, rpm=bad)


def test_outside_range_gives_a_note():
    r = annulus_flow(0.02, 0.2159, 0.06, density=1200.0, tau_y=0.0, k=0.5, n=0.6, rpm=100.0)
    assert any(n.code == "rotation_outside_validity" for n in r.notes)
