"""Exact laminar solutions (calc.flow.laminar_exact and method "exact_laminar").

Every expected value is an exact analytical solution, written out here independently of the
code, or an independent numerical solution (scipy adaptive quadrature and Brent's method).
"""

import itertools

import numpy as np
import pytest
from scipy import integrate, optimize

from calc.flow import annulus_flow, pipe_flow
from calc.flow.laminar_exact import (
    hb_annulus_flow_rate,
    hb_annulus_gradient,
    hb_pipe_flow_rate,
    hb_pipe_wall_stress,
    hb_slot_velocity,
    hb_slot_wall_stress,
    lamb_diameter,
)

RHO = 1100.0


def test_hagen_poiseuille_pipe():
    # Hagen-Poiseuille, Q = πR⁴G/(8μ) (Bird, Stewart & Lightfoot 2002, eq. 2.3-21), exact
    mu, d = 0.02, 0.08
    q = np.geomspace(1e-5, 2e-3, 20)
    expected_g = 8.0 * mu * q / (np.pi * (d / 2) ** 4)
    for method in ("exact_laminar", "newtonian"):
        r = pipe_flow(q, d, density=RHO, tau_y=0.0, k=mu, n=1.0, method=method)
        lam = r.regime == 0
        assert lam.sum() >= 15
        np.testing.assert_allclose(r.gradient[lam], expected_g[lam], rtol=1e-10, err_msg=method)


def _lamb_q(g, d2, d1, mu):
    # Lamb's concentric annulus, Bird, Stewart & Lightfoot (2002) eq. 2.4-17 (from memory,
    # not yet checked against the source; calc/METHODS.md §6.3):
    # Q = (πGR⁴/(8μ))[(1 - κ⁴) - (1 - κ²)²/ln(1/κ)]
    r = d2 / 2
    kap = d1 / d2
    return np.pi * g * r**4 / (8 * mu) * ((1 - kap**4) - (1 - kap**2) ** 2 / np.log(1 / kap))


@pytest.mark.parametrize("kappa", [0.05, 0.3, 0.5, 0.7, 0.9, 0.98])
def test_lamb_annulus(kappa):
    mu, d2 = 0.015, 0.2
    d1 = kappa * d2
    g = np.array([10.0, 300.0, 5000.0])
    q = _lamb_q(g, d2, d1, mu)
    # forward exact solution with the HB machinery at τ_y = 0, n = 1
    # rtol 1e-9: the closed form itself loses ~1e-11 to cancellation at κ → 1
    np.testing.assert_allclose(hb_annulus_flow_rate(g, d2, d1, 0.0, mu, 1.0), q, rtol=1e-9)
    # inverse through the public API, both the exact method and the Newtonian (Lamb) method
    for method in ("exact_laminar", "newtonian"):
        r = annulus_flow(q, d2, d1, density=RHO, tau_y=0.0, k=mu, n=1.0, method=method)
        lam = r.regime == 0
        np.testing.assert_allclose(r.gradient[lam], g[lam], rtol=1e-9, err_msg=method)
    # Lamb's diameter: V = G·D_L²/(32μ) (calc/METHODS.md §6.3, derived)
    v = q / (np.pi / 4 * (d2**2 - d1**2))
    np.testing.assert_allclose(v, g * lamb_diameter(d2, d1) ** 2 / (32 * mu), rtol=1e-9)


def test_buckingham_reiner_pipe():
    # Buckingham (1921): Q = (πR⁴G/(8μ_p))[1 - (4/3)φ + φ⁴/3], φ = τ_y/τ_w, τ_w = GR/2 (exact)
    mu_p, ty, d = 0.025, 6.0, 0.1
    tau_w = ty / np.array([0.05, 0.2, 0.5, 0.8, 0.95])
    g = 4 * tau_w / d
    phi = ty / tau_w
    q = np.pi * (d / 2) ** 4 * g / (8 * mu_p) * (1 - 4 / 3 * phi + phi**4 / 3)
    np.testing.assert_allclose(hb_pipe_flow_rate(tau_w, d, ty, mu_p, 1.0), q, rtol=1e-12)
    np.testing.assert_allclose(hb_pipe_wall_stress(q, d, ty, mu_p, 1.0), tau_w, rtol=1e-11)
    r = pipe_flow(q, d, density=RHO, tau_y=ty, k=mu_p, n=1.0, method="exact_laminar")
    np.testing.assert_allclose(r.gradient, g, rtol=1e-11)


def test_power_law_pipe():
    # Power law: Q = [πnR³/(3n + 1)](τ_w/K)^(1/n) (Skelland 1967; Chhabra & Richardson 2008,
    # ch. 3), exact
    d, kk = 0.12, 0.8
    for n in (0.2, 0.45, 0.7, 1.0, 1.4):
        tau_w = np.array([1.0, 10.0, 60.0])
        q = np.pi * n * (d / 2) ** 3 / (3 * n + 1) * (tau_w / kk) ** (1 / n)
        r = pipe_flow(q, d, density=RHO, tau_y=0.0, k=kk, n=n, method="exact_laminar")
        np.testing.assert_allclose(r.wall_shear_stress, tau_w, rtol=1e-11)
        np.testing.assert_allclose(r.gradient, 4 * tau_w / d, rtol=1e-11)


def _hb_gamma(tau, ty, kk, n):
    return (max(abs(tau) - ty, 0.0) / kk) ** (1.0 / n)


@pytest.mark.parametrize(("ty", "kk", "n"), [(3.0, 0.4, 0.6), (10.0, 0.05, 1.0), (1.0, 2.0, 0.3)])
def test_herschel_bulkley_pipe_by_quadrature(ty, kk, n):
    # Exact HB pipe: Q = (πR³/τ_w³)∫τ²γ̇(τ)dτ over [τ_y, τ_w] (Rabinowitsch-Mooney relation;
    # Chhabra & Richardson 2008, ch. 3) integrated numerically here, independent of the closed form
    d = 0.1
    for tau_w in (1.2 * ty, 3.0 * ty, 20.0 * ty):
        ref = (
            np.pi
            * (d / 2) ** 3
            / tau_w**3
            * integrate.quad(lambda t: t**2 * _hb_gamma(t, ty, kk, n), ty, tau_w, epsrel=1e-13)[0]
        )
        assert hb_pipe_flow_rate(tau_w, d, ty, kk, n) == pytest.approx(ref, rel=1e-10)
        assert hb_pipe_wall_stress(ref, d, ty, kk, n) == pytest.approx(tau_w, rel=1e-10)


def test_hb_identities():
    # calc/METHODS.md §2.4, §6.5: HB(n = 1) ≡ Buckingham-Reiner, HB(τ_y = 0) ≡ power law
    # (exact identities)
    d, q = 0.1, np.geomspace(1e-4, 1e-2, 7)
    a = pipe_flow(q, d, density=RHO, tau_y=0.0, k=0.5, n=0.6, method="exact_laminar")
    b = pipe_flow(q, d, density=RHO, tau_y=0.0, k=0.5, n=0.6, method="power_law")
    lam = b.regime == 0
    np.testing.assert_allclose(a.gradient[lam], b.gradient[lam], rtol=1e-11)


def _reference_annulus_q(g, d2, d1, ty, kk, n):
    """Independent exact annulus solution: scipy quad + brentq on λ (Fredrickson & Bird 1958)."""
    r2, r1 = d2 / 2, d1 / 2

    def tau(r, lam):
        return g / 2 * (r - lam**2 / r)

    def edges(lam):
        rm = r1
        if tau(r1, lam) < -ty:
            rm = optimize.brentq(lambda r: tau(r, lam) + ty, r1, lam)
        rp = r2
        if tau(r2, lam) > ty:
            rp = optimize.brentq(lambda r: tau(r, lam) - ty, lam, r2)
        return rm, rp

    def gam(r, lam):
        return _hb_gamma(tau(r, lam), ty, kk, n)

    def mismatch(lam):
        rm, rp = edges(lam)
        return (
            integrate.quad(gam, r1, rm, args=(lam,), epsrel=1e-12)[0]
            - integrate.quad(gam, rp, r2, args=(lam,), epsrel=1e-12)[0]
        )

    lam = optimize.brentq(mismatch, r1 * (1 + 1e-12), r2 * (1 - 1e-12), xtol=1e-15)
    rm, rp = edges(lam)
    up = integrate.quad(gam, r1, rm, args=(lam,), epsrel=1e-12)[0]
    mi = integrate.quad(lambda r: (r**2 - r1**2) * gam(r, lam), r1, rm, epsrel=1e-12)[0]
    mo = integrate.quad(lambda r: (r2**2 - r**2) * gam(r, lam), rp, r2, epsrel=1e-12)[0]
    return np.pi * ((r2**2 - r1**2) * up - mi - mo)


@pytest.mark.parametrize(
    ("g", "d2", "d1", "ty", "kk", "n"),
    [
        (2000.0, 0.2159, 0.127, 5.0, 0.4, 0.6),
        (500.0, 0.3, 0.05, 2.0, 0.1, 0.3),
        (3000.0, 0.2, 0.18, 10.0, 1.0, 1.0),
        (800.0, 0.3112, 0.1397, 8.0, 0.03, 1.0),
    ],
)
def test_hb_annulus_against_independent_quadrature(g, d2, d1, ty, kk, n):
    # measured agreement ≤ 1.3e-10 (40-point Gauss-Legendre vs adaptive quadrature)
    ref = _reference_annulus_q(g, d2, d1, ty, kk, n)
    assert hb_annulus_flow_rate(g, d2, d1, ty, kk, n) == pytest.approx(ref, rel=1e-8)
    assert hb_annulus_gradient(ref, d2, d1, ty, kk, n) == pytest.approx(g, rel=1e-8)


def test_annulus_tends_to_slot_as_gap_narrows():
    # Exact plane-slot HB solution (calc/METHODS.md §6.6, derived):
    # V = (H/2)(τ_w/K)^(1/n)(1-φ)^(1+1/n)[(1-φ)/(2+1/n) + φ/(1+1/n)].  The annulus → slot as
    # D1/D2 → 1; the error must shrink.
    d2, ty, kk, n = 0.2, 3.0, 0.3, 0.7
    errs = []
    for kappa in (0.5, 0.8, 0.95, 0.99):
        d1 = kappa * d2
        gap = (d2 - d1) / 2
        v = 0.8
        q = v * np.pi / 4 * (d2**2 - d1**2)
        g_exact = hb_annulus_gradient(q, d2, d1, ty, kk, n)
        g_slot = 2 * hb_slot_wall_stress(v, gap, ty, kk, n) / gap
        errs.append(abs(g_exact / g_slot - 1))
    assert all(a > b for a, b in itertools.pairwise(errs)), errs
    assert errs[-1] < 1e-4, errs  # measured 1.6e-6 at D1/D2 = 0.99 (6.5e-3 at 0.5)
    # slot velocity formula: Newtonian plane Poiseuille V = Hτ_w/(6μ) (exact)
    assert hb_slot_velocity(6.0, 0.01, 0.0, 0.002, 1.0) == pytest.approx(0.01 * 6.0 / 0.012)
