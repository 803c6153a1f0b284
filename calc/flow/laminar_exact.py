"""Exact laminar flow of Herschel-Bulkley fluids in pipes, plane slots and concentric annuli.

Herschel-Bulkley: τ = τ_y + Kγ̇ⁿ for |τ| > τ_y, no shear otherwise.  Newtonian (τ_y = 0, n = 1),
Bingham (n = 1) and power law (τ_y = 0) are special cases.  These solutions are the
``exact_laminar`` method and the reference the fast methods are tested against.

* Pipe: closed form Q(τ_w) (Skelland 1967; Chhabra & Richardson 2008), inverted for τ_w.
* Plane slot: closed form V(τ_w) (per unit width), inverted for τ_w.
* Concentric annulus: the stress is τ(r) = (G/2)(r - λ²/r) with λ the radius of zero shear
  (Fredrickson & Bird 1958); λ is found so that the velocity vanishes on both walls, the flow
  rate follows by Gauss-Legendre quadrature, and G is found for the given flow rate.

All functions broadcast and solve whole arrays at once (no per-element loops).

References
----------
Bird, R. B., Stewart, W. E. & Lightfoot, E. N. (2002). Transport Phenomena, 2nd ed. Wiley,
§2.3 (Hagen-Poiseuille), §2.4 (annulus, Lamb's result).
Buckingham, E. (1921). On plastic flow through capillary tubes. Proc. ASTM 21, 1154-1156.
Fredrickson, A. G. & Bird, R. B. (1958). Non-Newtonian flow in annuli.
Ind. Eng. Chem. 50(3), 347-352.
Skelland, A. H. P. (1967). Non-Newtonian Flow and Heat Transfer. Wiley.
Chhabra, R. P. & Richardson, J. F. (2008). Non-Newtonian Flow and Applied Rheology, 2nd ed.
Butterworth-Heinemann, ch. 3.
"""

from __future__ import annotations

import numpy as np

from calc.flow.area import mean_velocity
from calc.flow.solvers import expand_bracket, itp_solve

__all__ = [
    "hb_annulus_flow_rate",
    "hb_annulus_gradient",
    "hb_pipe_flow_rate",
    "hb_pipe_wall_stress",
    "hb_slot_velocity",
    "hb_slot_wall_stress",
    "lamb_diameter",
    "power_law_pipe_wall_stress",
    "power_law_slot_wall_stress",
]

#: Gauss-Legendre nodes on [-1, 1] for the annulus integrals (40 points).
_GL_T, _GL_W = np.polynomial.legendre.leggauss(40)


def _phi(tau_w, tau_y):
    return np.clip(tau_y / tau_w, 0.0, 1.0)


def _pipe_shape(phi, n):
    """(1-φ)^(1+1/n)·[(1-φ)²/(3+1/n) + 2φ(1-φ)/(2+1/n) + φ²/(1+1/n)]."""
    m = 1.0 / n
    om = 1.0 - phi
    return om ** (1.0 + m) * (om**2 / (3.0 + m) + 2 * phi * om / (2.0 + m) + phi**2 / (1.0 + m))


def hb_pipe_flow_rate(tau_w, d, tau_y, k, n):
    """Laminar flow rate of a Herschel-Bulkley fluid in a pipe at wall stress ``tau_w``.

    .. math::
        Q = πR^3 (τ_w/K)^{1/n}(1-φ)^{1+1/n}
            \\left[\\frac{(1-φ)^2}{3+1/n} + \\frac{2φ(1-φ)}{2+1/n} + \\frac{φ^2}{1+1/n}\\right],
        \\quad φ = τ_y/τ_w

    Parameters
    ----------
    tau_w : array_like
        Wall shear stress [Pa]; Q = 0 for τ_w ≤ τ_y.
    d : array_like
        Pipe inside diameter [m].
    tau_y, k, n : array_like
        Yield stress [Pa], consistency [Pa·sⁿ], flow index [-].

    Returns
    -------
    numpy.ndarray
        Flow rate [m³/s].

    Notes
    -----
    Equals Q = (πR³/τ_w³)∫τ²γ̇(τ)dτ from τ_y to τ_w.  n = 1: Buckingham-Reiner; τ_y = 0: the
    power-law result Q = πnR³/(3n+1)·(τ_w/K)^(1/n); both: Hagen-Poiseuille.

    Examples
    --------
    >>> mu, d, tw = 0.01, 0.1, 2.0  # Hagen-Poiseuille: Q = πR³τ_w/(4μ)
    >>> bool(np.isclose(hb_pipe_flow_rate(tw, d, 0.0, mu, 1.0), np.pi * 0.05**3 * tw / (4 * mu)))
    True
    """
    tau_w = np.asarray(tau_w, dtype=float)
    r = 0.5 * np.asarray(d, dtype=float)
    phi = _phi(tau_w, np.asarray(tau_y, dtype=float))
    return np.pi * r**3 * (tau_w / k) ** (1.0 / n) * _pipe_shape(phi, n)


def power_law_pipe_wall_stress(v, d, k, n):
    """Power-law laminar wall stress τ_w = K[(3n+1)/(4n)·8V/D]ⁿ [Pa] (exact; Metzner-Reed).

    Examples
    --------
    n = 1 is Hagen-Poiseuille, τ_w = μ·8V/D: 0.01 Pa·s at 1 m/s in a 0.1 m pipe is 0.8 Pa:

    >>> round(power_law_pipe_wall_stress(1.0, 0.1, 0.01, 1.0), 12)
    0.8
    """
    return k * ((3.0 * n + 1.0) / (4.0 * n) * 8.0 * v / d) ** n


def hb_pipe_wall_stress(q, d, tau_y, k, n):
    """Invert :func:`hb_pipe_flow_rate` for the wall stress τ_w [Pa] at flow rate ``q`` [m³/s].

    Solved in ln τ_w by vectorised ITP bracketing between τ_y + τ_PL (τ_PL the power-law wall
    stress for the same flow; the HB flow there is at most q) and an upper bound found by
    doubling.  Relative tolerance 1e-13.

    Examples
    --------
    >>> tw = hb_pipe_wall_stress(1e-3, 0.1, 5.0, 0.3, 0.6)
    >>> bool(np.isclose(hb_pipe_flow_rate(tw, 0.1, 5.0, 0.3, 0.6), 1e-3, rtol=1e-12))
    True
    """
    q, d, tau_y, k, n = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (q, d, tau_y, k, n))
    )
    v = mean_velocity(q, d)
    lo = tau_y + power_law_pipe_wall_stress(v, d, k, n)
    ln_q = np.log(q)

    def resid_lin(tw):
        return np.log(hb_pipe_flow_rate(tw, d, tau_y, k, n)) - ln_q

    hi = expand_bracket(resid_lin, 2.0 * lo)

    def resid(x):
        tw = np.exp(x)
        phi = np.minimum(tau_y / tw, 1.0 - 1e-300)
        r = 0.5 * d
        val = (
            np.log(np.pi * r**3)
            + (np.log(tw) - np.log(k)) / n
            + (1.0 + 1.0 / n) * np.log1p(-phi)
            + np.log(
                (1 - phi) ** 2 / (3 + 1 / n)
                + 2 * phi * (1 - phi) / (2 + 1 / n)
                + phi**2 / (1 + 1 / n)
            )
        )
        return val - ln_q

    return np.exp(itp_solve(resid, np.log(lo), np.log(hi), rtol=0.0, xtol=1e-13))


def hb_slot_velocity(tau_w, gap, tau_y, k, n):
    """Mean laminar velocity of a Herschel-Bulkley fluid in a plane slot [m/s].

    .. math::
        V = \\frac{H}{2}(τ_w/K)^{1/n}(1-φ)^{1+1/n}
            \\left[\\frac{1-φ}{2+1/n} + \\frac{φ}{1+1/n}\\right]

    Parameters: tau_w wall stress [Pa] (= G·H/2), gap H [m], tau_y [Pa], k [Pa·sⁿ], n [-].
    Newtonian check: V = Hτ_w/(6μ), i.e. plane Poiseuille flow.

    Examples
    --------
    Newtonian, 1.2 Pa at the walls of a 50 mm slot, μ = 0.01 Pa·s: V = 0.05·1.2/0.06 = 1 m/s;
    a yield stress at the wall stress stops the flow (the plug fills the slot):

    >>> round(float(hb_slot_velocity(1.2, 0.05, 0.0, 0.01, 1.0)), 12)
    1.0
    >>> float(hb_slot_velocity(1.2, 0.05, 1.2, 0.01, 1.0))
    0.0
    """
    tau_w = np.asarray(tau_w, dtype=float)
    phi = _phi(tau_w, np.asarray(tau_y, dtype=float))
    m = 1.0 / n
    om = 1.0 - phi
    return 0.5 * gap * (tau_w / k) ** m * om ** (1.0 + m) * (om / (2.0 + m) + phi / (1.0 + m))


def power_law_slot_wall_stress(v, gap, k, n):
    """Power-law slot wall stress τ_w = K[(2n+1)/(3n)·6V/H]ⁿ [Pa] (exact, plane slot).

    Examples
    --------
    n = 1 is plane Poiseuille, τ_w = μ·6V/H: 0.01 Pa·s at 1 m/s in a 50 mm slot is 1.2 Pa:

    >>> round(power_law_slot_wall_stress(1.0, 0.05, 0.01, 1.0), 12)
    1.2
    """
    return k * ((2.0 * n + 1.0) / (3.0 * n) * 6.0 * v / gap) ** n


def hb_slot_wall_stress(v, gap, tau_y, k, n):
    """Invert :func:`hb_slot_velocity` for τ_w [Pa] at mean velocity ``v`` [m/s], gap [m].

    Examples
    --------
    >>> tw = hb_slot_wall_stress(0.5, 0.02, 4.0, 0.2, 0.7)
    >>> bool(np.isclose(hb_slot_velocity(tw, 0.02, 4.0, 0.2, 0.7), 0.5, rtol=1e-12))
    True
    """
    v, gap, tau_y, k, n = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (v, gap, tau_y, k, n))
    )
    lo = tau_y + power_law_slot_wall_stress(v, gap, k, n)
    ln_v = np.log(v)

    def resid_lin(tw):
        return np.log(hb_slot_velocity(tw, gap, tau_y, k, n)) - ln_v

    hi = expand_bracket(resid_lin, 2.0 * lo)

    def resid(x):
        tw = np.exp(x)
        phi = np.minimum(tau_y / tw, 1.0 - 1e-300)
        m = 1.0 / n
        val = (
            np.log(0.5 * gap)
            + (x - np.log(k)) * m
            + (1.0 + m) * np.log1p(-phi)
            + np.log((1 - phi) / (2 + m) + phi / (1 + m))
        )
        return val - ln_v

    return np.exp(itp_solve(resid, np.log(lo), np.log(hi), rtol=0.0, xtol=1e-13))


def lamb_diameter(d_hole, d_pipe):
    """Lamb's equivalent diameter D_L = √(D2² + D1² - (D2² - D1²)/ln(D2/D1)) [m].

    Exact for Newtonian laminar flow in a concentric annulus: V = G·D_L²/(32μ)
    (Lamb 1932; Bird, Stewart & Lightfoot 2002, eq. 2.4-17 rearranged; calc/METHODS.md §6.3).

    Examples
    --------
    5 in pipe in 8-1/2 in hole: D_L = 0.0728 m, and G = 32μV/D_L² is the exact Newtonian
    annulus gradient that :func:`hb_annulus_gradient` solves for (τ_y = 0, n = 1):

    >>> from calc.flow.area import mean_velocity
    >>> d2, d1, mu, q = 0.2159, 0.127, 0.02, 0.03
    >>> dl = float(lamb_diameter(d2, d1))
    >>> g_lamb = 32 * mu * mean_velocity(q, d2, d1) / dl**2
    >>> round(dl, 4), round(float(hb_annulus_gradient(q, d2, d1, 0.0, mu, 1.0) / g_lamb), 9)
    (0.0728, 1.0)
    """
    d2 = np.asarray(d_hole, dtype=float)
    d1 = np.asarray(d_pipe, dtype=float)
    return np.sqrt(d2**2 + d1**2 - (d2**2 - d1**2) / np.log(d2 / d1))


def _unique_rows(arrs):
    """The distinct rows of the parameter columns ``arrs`` (equal shapes) and the index that
    takes the distinct rows back to all of them.  Stations of one section share their inputs,
    so the nested root solves run once per distinct case; each element is solved on its own
    (the solvers are element by element), so the results are those of the full arrays."""
    cols = np.stack([np.atleast_1d(a).ravel() for a in arrs], axis=1)
    uniq, back = np.unique(cols, axis=0, return_inverse=True)
    return tuple(np.ascontiguousarray(uniq[:, j]) for j in range(len(arrs))), back.ravel()


def _gl_on(a, b):
    """Nodes (N, M) and weights (N, M) of Gauss-Legendre on [a, b] (a, b arrays (N,))."""
    half = 0.5 * (b - a)[:, None]
    mid = 0.5 * (b + a)[:, None]
    return mid + half * _GL_T[None, :], half * _GL_W[None, :]


def _plug_edges(lam, s):
    """Dimensionless radii where |τ| = τ_y: ξ∓ = (∓s + √(s² + 4λ²))/2."""
    root = np.sqrt(s**2 + 4.0 * lam**2)
    return 0.5 * (root - s), 0.5 * (root + s)


def _annulus_integrals(lam, kappa, s, n):
    """Dimensionless shear-rate integrals of the inner and outer sheared layers.

    Returns (u_in, u_out, m_in, m_out): ∫g dξ on each layer and the moments ∫(ξ²-κ²)g dξ
    (inner) and ∫(1-ξ²)g dξ (outer), with g = (|ξ - λ²/ξ| - s)^(1/n).
    """
    xm, xp = _plug_edges(lam, s)
    a_in = kappa
    b_in = np.maximum(xm, kappa)
    a_out = np.minimum(xp, 1.0)
    b_out = np.ones_like(lam)
    xi, wi = _gl_on(a_in, b_in)
    xo, wo = _gl_on(a_out, b_out)
    lam2 = (lam**2)[:, None]
    gi = np.maximum(lam2 / xi - xi - s[:, None], 0.0) ** (1.0 / n[:, None])
    go = np.maximum(xo - lam2 / xo - s[:, None], 0.0) ** (1.0 / n[:, None])
    k2 = (kappa**2)[:, None]
    u_in = np.sum(wi * gi, axis=1)
    u_out = np.sum(wo * go, axis=1)
    m_in = np.sum(wi * (xi**2 - k2) * gi, axis=1)
    m_out = np.sum(wo * (1.0 - xo**2) * go, axis=1)
    return u_in, u_out, m_in, m_out


def _zero_shear_radius(kappa, s, n):
    """λ/R2 in (κ, 1) making the velocity vanish on both walls (1-D arrays)."""

    # u ∝ (layer thickness)^(1+1/n) for thin layers: compare u^(n/(n+1)), which has the same
    # root and sign but is nearly linear in λ, so the interpolation steps work
    p = n / (n + 1.0)

    def resid(lam):
        u_in, u_out, _, _ = _annulus_integrals(lam, kappa, s, n)
        return u_in**p - u_out**p

    return itp_solve(resid, kappa, np.ones_like(kappa), xtol=1e-13, rtol=0.0)


def hb_annulus_flow_rate(gradient, d_hole, d_pipe, tau_y, k, n, *, return_lambda=False):
    """Exact laminar flow rate of a Herschel-Bulkley fluid in a concentric annulus [m³/s].

    .. math::
        τ(r) = \\frac{G}{2}\\left(r - \\frac{λ^2}{r}\\right), \\qquad
        Q = πR_2^3 c\\left[(1-κ^2)\\hat u_p - \\int_κ^{ξ_-}(ξ^2-κ^2)g\\,dξ
            - \\int_{ξ_+}^1(1-ξ^2)g\\,dξ\\right]

    with ξ = r/R2, κ = R1/R2, c = (GR2/(2K))^(1/n), g = (|ξ - λ̂²/ξ| - s)^(1/n), s = 2τ_y/(GR2),
    ξ∓ the plug edges and û_p = ∫_κ^{ξ-} g dξ the dimensionless plug velocity.  The zero-shear
    radius λ̂ = λ/R2 solves ∫_κ^{ξ-} g dξ = ∫_{ξ+}^1 g dξ (velocity zero on both walls).

    Parameters
    ----------
    gradient : array_like
        Frictional pressure gradient G = -dp/dz [Pa/m], > 0.
    d_hole, d_pipe : array_like
        Outer (hole) and inner (pipe) diameters [m], 0 < d_pipe < d_hole.
    tau_y, k, n : array_like
        Yield stress [Pa], consistency [Pa·sⁿ], flow index [-].
    return_lambda : bool
        Also return λ/R2 [-].

    Notes
    -----
    Integrals by 40-point Gauss-Legendre on each sheared layer; λ by vectorised ITP to 1e-13.
    Measured against Lamb's formula (Newtonian) and an independent adaptive-quadrature solution
    in the tests.  The plug may touch neither wall (it is a ring), by construction.

    Examples
    --------
    >>> # Newtonian: Lamb, Q = (πG/(8μ))[R2⁴ - R1⁴ - (R2² - R1²)²/ln(R2/R1)]
    >>> r2, r1, mu, g = 0.1, 0.05, 0.02, 100.0
    >>> lamb = np.pi * g / (8 * mu) * (r2**4 - r1**4 - (r2**2 - r1**2) ** 2 / np.log(r2 / r1))
    >>> bool(np.isclose(hb_annulus_flow_rate(g, 0.2, 0.1, 0.0, mu, 1.0), lamb, rtol=1e-10))
    True
    """
    arrs = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (gradient, d_hole, d_pipe, tau_y, k, n))
    )
    shape = arrs[0].shape
    g, d2, d1, ty, kk, nn = (np.atleast_1d(a).ravel() for a in arrs)
    r2 = 0.5 * d2
    kappa = d1 / d2
    tau_r = 0.5 * g * r2
    s = ty / tau_r
    lam = _zero_shear_radius(kappa, s, nn)
    u_in, u_out, m_in, m_out = _annulus_integrals(lam, kappa, s, nn)
    u_p = 0.5 * (u_in + u_out)
    c = (tau_r / kk) ** (1.0 / nn)
    q_hat = (1.0 - kappa**2) * u_p - m_in - m_out
    q = np.pi * r2**3 * c * np.maximum(q_hat, 0.0)
    if return_lambda:
        return q.reshape(shape), lam.reshape(shape)
    return q.reshape(shape)


def hb_annulus_gradient(q, d_hole, d_pipe, tau_y, k, n):
    """Invert :func:`hb_annulus_flow_rate`: the laminar gradient G [Pa/m] for flow rate q [m³/s].

    Residual (Q(G)/q)ⁿ - 1 (nearly linear in G) solved by vectorised ITP, relative tolerance
    1e-11; the bracket starts from the plane-slot estimate.

    Examples
    --------
    >>> g = hb_annulus_gradient(0.02, 0.2159, 0.127, 5.0, 0.4, 0.6)
    >>> bool(np.isclose(hb_annulus_flow_rate(g, 0.2159, 0.127, 5.0, 0.4, 0.6), 0.02, rtol=1e-9))
    True
    """
    arrs = np.broadcast_arrays(
        *(np.asarray(x, dtype=float) for x in (q, d_hole, d_pipe, tau_y, k, n))
    )
    shape = arrs[0].shape
    (qq, d2, d1, ty, kk, nn), back = _unique_rows(arrs)
    gap = 0.5 * (d2 - d1)
    v = mean_velocity(qq, d2, d1)
    g_est = 2.0 * hb_slot_wall_stress(v, gap, ty, kk, nn) / gap

    def resid(g):
        return (hb_annulus_flow_rate(g, d2, d1, ty, kk, nn) / qq) ** nn - 1.0

    hi = expand_bracket(resid, 1.5 * g_est)
    lo = 0.5 * g_est
    for _ in range(200):
        f_lo = resid(lo)
        bad = f_lo > 0
        if not np.any(bad):
            break
        lo[bad] *= 0.25
    out = itp_solve(resid, lo, hi, rtol=1e-11, f_lo=f_lo)
    return out[back].reshape(shape)
