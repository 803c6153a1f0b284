"""Fanning friction factors and regime bounds for pipe and annulus flow.

Fanning throughout: ``f = τ_w / (½ρV²)``; Darcy ``λ = 4f``; ``dp/dL = 2fρV²/D_h``.
All functions broadcast over numpy arrays and return arrays (0-d for scalar input).

References
----------
Colebrook, C. F. (1939). Turbulent flow in pipes, with particular reference to the transition
region between the smooth and rough pipe laws. J. Inst. Civil Eng. 11(4), 133-156.
Dodge, D. W. & Metzner, A. B. (1959). Turbulent flow of non-Newtonian systems.
AIChE J. 5(2), 189-204.
Hanks, R. W. (1963). The laminar-turbulent transition for fluids with a yield stress.
AIChE J. 9(3), 306-309.
Darby, R., Mun, R. & Boger, D. V. (1992). Predict friction loss in slurry pipes.
Chem. Eng. 99(9), 116-119.
Guo, B. & Liu, G. (2011). Applied Drilling Circulation Systems. Gulf Professional, eq. 2.35.
API RP 13D, Rheology and Hydraulics of Oil-well Drilling Fluids, 3rd ed. (1995) and 6th ed.
(2010), American Petroleum Institute.
"""

from __future__ import annotations

import numpy as np

from calc.flow.solvers import itp_solve, newton_increasing_concave

__all__ = [
    "LN10",
    "api_hb_blend_fanning",
    "api_turbulent_coefficients",
    "api_turbulent_fanning",
    "colebrook_fanning",
    "colebrook_inverse_sqrt_darcy",
    "darby_bingham_fanning",
    "dodge_metzner_fanning",
    "hanks_critical_reynolds",
    "hedstrom_number",
    "n_dependent_bounds",
]

LN10 = np.log(10.0)

#: Hanks (1963) constant in x_c/(1 - x_c)³ = He/16,800 (from memory, not yet checked against
#: the source — calc/METHODS.md §6.14).
HANKS_CONSTANT = 16_800.0


def colebrook_inverse_sqrt_darcy(re_sqrt_darcy, relative_roughness=0.0):
    """The right side of the Colebrook (1939) equation, 1/√λ for a given Re·√λ.

    .. math:: 1/\\sqrt{λ} = -2\\log_{10}[(ε/D)/3.7 + 2.51/(Re\\sqrt{λ})]

    Re·√λ = √8·ρu*D/μ needs only the friction velocity u* = √(τ_w/ρ), so this is the
    Colebrook law in its explicit wall-stress form (used where the wall stress is the unknown,
    e.g. :func:`calc.slurry.homogeneous.wilson_thomas_wall_stress`);
    :func:`colebrook_fanning` solves the same equation for λ at a given Re.

    Examples
    --------
    >>> lam = 4 * float(colebrook_fanning(1e5, 1e-4))
    >>> x = float(colebrook_inverse_sqrt_darcy(1e5 * lam**0.5, 1e-4))
    >>> round(x * lam**0.5, 12)
    1.0
    """
    return -2.0 * np.log10(
        np.asarray(relative_roughness, dtype=float) / 3.7
        + 2.51 / np.asarray(re_sqrt_darcy, dtype=float)
    )


def colebrook_fanning(reynolds, relative_roughness=0.0):
    """Fanning friction factor from the Colebrook (1939) equation, solved vectorised.

    .. math:: 1/\\sqrt{λ} = -2\\log_{10}[(ε/D)/3.7 + 2.51/(Re\\sqrt{λ})], \\quad f = λ/4

    Parameters
    ----------
    reynolds : array_like
        Reynolds number ρVD/μ [-], > 0.
    relative_roughness : array_like
        ε/D [-], ≥ 0.

    Returns
    -------
    numpy.ndarray
        Fanning friction factor [-].

    Notes
    -----
    Written in x = 1/√λ the residual x + 2log₁₀(A + Bx) is increasing and concave, so Newton's
    method from the smooth-pipe Blasius-type start converges monotonically (see
    :func:`calc.flow.solvers.newton_increasing_concave`).  Meant for turbulent flow,
    Re ≳ 4000; ε/D up to ~0.05 (the range of the Moody chart).

    Examples
    --------
    >>> round(float(colebrook_fanning(1e5, 0.0)) * 4, 5)  # Darcy, smooth pipe
    0.01799
    """
    re = np.asarray(reynolds, dtype=float)
    rr = np.asarray(relative_roughness, dtype=float)
    re, rr = np.broadcast_arrays(re, rr)
    a = rr / 3.7
    b = 2.51 / re

    def g(x):
        inner = a + b * x
        return x - colebrook_inverse_sqrt_darcy(re / x, rr), 1.0 + 2.0 * b / (inner * LN10)

    x0 = np.full(re.shape, 1.0)  # left of every root for Re > 10 (x ≈ 5-12 in use)
    x = newton_increasing_concave(g, x0)
    return 0.25 / x**2


def api_turbulent_coefficients(n):
    """``a, b`` of the API RP 13D turbulent correlation f = a/Re^b (fit to Dodge-Metzner).

    a = (log₁₀n + 3.93)/50, b = (1.75 - log₁₀n)/7 (API RP 13D 1995, seen second-hand —
    calc/METHODS.md §6.11; the same
    pair is used by the 2006/2010 yield-power-law method).

    Examples
    --------
    >>> a, b = api_turbulent_coefficients(1.0)
    >>> round(float(a), 4), float(b)
    (0.0786, 0.25)

    At n = 1 this is a Blasius-type law a/Re^0.25 with a = 3.93/50 = 0.0786 (Blasius: 0.0791).
    """
    ln = np.log10(np.asarray(n, dtype=float))
    return (ln + 3.93) / 50.0, (1.75 - ln) / 7.0


def api_turbulent_fanning(reynolds, n):
    """Explicit API RP 13D turbulent Fanning factor ``f = a/Re^b`` [-] (calc/METHODS.md §6.11).

    Parameters
    ----------
    reynolds : array_like
        The method's Reynolds number [-].
    n : array_like
        Flow behaviour index [-].

    Examples
    --------
    At n = 1 and Re = 10⁵: 0.0786/10^(5/4) = 0.00442, 0.6 % below Blasius' 0.0791/Re^0.25:

    >>> f = float(api_turbulent_fanning(1e5, 1.0))
    >>> round(f, 5), round(f / (0.0791 * 1e5**-0.25), 4)
    (0.00442, 0.9937)
    """
    a, b = api_turbulent_coefficients(n)
    return a / np.asarray(reynolds, dtype=float) ** b


def dodge_metzner_fanning(reynolds, n):
    """Fanning factor from the Dodge & Metzner (1959) equation, solved implicitly, vectorised.

    .. math:: 1/\\sqrt{f} = (4.0/n^{0.75})\\log_{10}(Re_{MR} f^{1-n/2}) - 0.4/n^{1.2}

    Parameters
    ----------
    reynolds : array_like
        Metzner-Reed (generalised) Reynolds number 8ρV²/τ_w [-].
    n : array_like
        Flow behaviour index [-], 0 < n < 2.

    Returns
    -------
    numpy.ndarray
        Fanning friction factor [-].

    Notes
    -----
    Dodge & Metzner fitted 0.36 ≤ n ≤ 1, 2,900 ≤ Re_MR ≤ 36,000 (smooth pipes).  In
    x = 1/√f the residual x - (4/n^0.75)[log₁₀Re - (2 - n)log₁₀x] + 0.4/n^1.2 is increasing and
    concave for n < 2, so Newton converges monotonically.  n = 1 gives the Prandtl-Kármán
    smooth-pipe law 1/√f = 4log₁₀(Re√f) - 0.4.

    Examples
    --------
    >>> f = float(dodge_metzner_fanning(1e5, 1.0))
    >>> bool(abs(1 / f**0.5 - (4 * np.log10(1e5 * f**0.5) - 0.4)) < 1e-12)
    True
    """
    re = np.asarray(reynolds, dtype=float)
    nn = np.asarray(n, dtype=float)
    re, nn = np.broadcast_arrays(re, nn)
    c1 = 4.0 / nn**0.75
    c2 = 0.4 / nn**1.2
    log_re = np.log10(re)

    def g(x):
        val = x - c1 * (log_re - (2.0 - nn) * np.log10(x)) + c2
        der = 1.0 + c1 * (2.0 - nn) / (x * LN10)
        return val, der

    x = newton_increasing_concave(g, np.full(re.shape, 1.0))
    return 1.0 / x**2


def n_dependent_bounds(n):
    """Laminar and turbulent Reynolds bounds ``3470 - 1370n`` and ``4270 - 1370n`` [-].

    From Guo & Liu (2011) eq. 2.35 (calc/METHODS.md §6.12); used by API RP 13D (2006/2010) for
    the yield-power-law method [from memory, not yet checked against the source —
    calc/METHODS.md §6.12].

    Examples
    --------
    >>> lam, turb = n_dependent_bounds(1.0)
    >>> float(lam), float(turb)
    (2100.0, 2900.0)

    Guo & Liu (2011), Illustrative Example 2.6 (n = 0.8), p. 44: 2,374 and 3,174 (printed):

    >>> [round(float(b)) for b in n_dependent_bounds(0.8)]
    [2374, 3174]
    """
    nn = np.asarray(n, dtype=float)
    return 3470.0 - 1370.0 * nn, 4270.0 - 1370.0 * nn


def api_hb_blend_fanning(reynolds, n):
    """API RP 13D (2006/2010) blended Fanning factor over all regimes (calc/METHODS.md §6.13).

    .. math::
        f_{lam} = 16/Re_G,\\; f_{trans} = 16 Re_G/(3470 - 1370n)^2,\\; f_{turb} = a/Re_G^b

        f_{int} = (f_{trans}^{-8} + f_{turb}^{-8})^{-1/8},\\;
        f = (f_{int}^{12} + f_{lam}^{12})^{1/12}

    Structure and exponents from memory, pending verification against the standard
    (calc/METHODS.md §6.13).

    Parameters
    ----------
    reynolds : array_like
        Generalised Reynolds number Re_G = 8ρV²/τ_w [-].
    n : array_like
        Flow behaviour index [-].

    Examples
    --------
    The blend tends to its branches: 16/Re deep in laminar flow, a/Re^b deep in turbulence:

    >>> f = api_hb_blend_fanning(np.array([100.0, 1e6]), 0.7)
    >>> round(float(f[0] * 100.0), 6), round(float(f[1] / api_turbulent_fanning(1e6, 0.7)), 6)
    (16.0, 1.0)
    """
    re = np.asarray(reynolds, dtype=float)
    nn = np.asarray(n, dtype=float)
    f_lam = 16.0 / re
    f_trans = 16.0 * re / (3470.0 - 1370.0 * nn) ** 2
    f_turb = api_turbulent_fanning(re, nn)
    # work with logs: the -8 and 12 powers overflow nothing in range but keep them tame
    f_int = (f_trans**-8 + f_turb**-8) ** (-1.0 / 8.0)
    return (f_int**12 + f_lam**12) ** (1.0 / 12.0)


def hedstrom_number(density, tau_y, mu_p, d):
    """Hedström (1952) number He = ρτ_yD²/μ_p² [-] (calc/METHODS.md §6.14).

    Parameters: density [kg/m³], tau_y [Pa], mu_p [Pa·s], d characteristic diameter [m].

    Examples
    --------
    1000 kg/m³, τ_y = 10 Pa, μ_p = 20 mPa·s in a 0.1 m pipe: 1000·10·0.01/0.0004 = 250,000:

    >>> round(float(hedstrom_number(1000.0, 10.0, 0.02, 0.1)))
    250000
    """
    return np.asarray(density) * np.asarray(tau_y) * np.asarray(d) ** 2 / np.asarray(mu_p) ** 2


def hanks_critical_reynolds(hedstrom):
    """Hanks (1963) critical Bingham Reynolds number ρVD/μ_p for the end of laminar flow.

    .. math::
        x_c/(1 - x_c)^3 = He/16\\,800, \\qquad
        Re_{Bc} = \\frac{He}{8x_c}(1 - \\tfrac43 x_c + \\tfrac13 x_c^4)
                = \\frac{2100(1 - \\tfrac43 x_c + \\tfrac13 x_c^4)}{(1 - x_c)^3}

    x_c = τ_y/τ_w at the transition; the second form (ours, algebra) has no 0/0 at He = 0,
    where it gives 2100.  Constants from memory, not yet checked against the source
    (calc/METHODS.md §6.14).

    Parameters
    ----------
    hedstrom : array_like
        Hedström number [-], ≥ 0.

    Returns
    -------
    numpy.ndarray
        Critical Reynolds number [-].

    Examples
    --------
    >>> float(hanks_critical_reynolds(0.0))
    2100.0
    """
    he = np.asarray(hedstrom, dtype=float)
    c = he / HANKS_CONSTANT
    # x/(1-x)^3 is increasing on [0, 1); bracket [0, 1 - 1e-12]
    x = itp_solve(
        lambda x: x - c * (1.0 - x) ** 3,
        np.zeros(he.shape),
        np.full(he.shape, 1.0 - 1e-12),
        xtol=1e-15,
    )
    return 2100.0 * (1.0 - 4.0 * x / 3.0 + x**4 / 3.0) / (1.0 - x) ** 3


def darby_bingham_fanning(reynolds_b, hedstrom, f_laminar):
    """Darby, Mun & Boger (1992) Bingham-plastic Fanning factor for all regimes.

    .. math::
        f_T = 10^A Re_B^{-0.193},\\; A = -1.47[1 + 0.146\\exp(-2.9\\times10^{-5} He)]

        f = (f_L^m + f_T^m)^{1/m},\\; m = 1.7 + 40\\,000/Re_B

    Parameters
    ----------
    reynolds_b : array_like
        Bingham Reynolds number ρVD_h/μ_p [-].
    hedstrom : array_like
        Hedström number [-].
    f_laminar : array_like
        Laminar (Buckingham-Reiner, or slot) Fanning factor at the same state [-].

    Notes
    -----
    Coefficients from memory, Darby et al. (1992) seen second-hand (calc/METHODS.md §6.15).
    The turbulent branch does not reduce to the Newtonian smooth-pipe law at He → 0 (it was
    fitted to slurries with large He): 0.45 × smooth-pipe Colebrook at Re_B = 10⁴, He → 0
    (measured in the tests against ``fluids``).  Registered as the friction law
    ``bingham_darby_1992``.

    Examples
    --------
    At Re_B = 10⁵ and He → 0 the turbulent branch 10^A·Re^-0.193, A = -1.47·1.146, governs
    (the laminar 16/Re adds 0.2 %):

    >>> f_t = 10 ** (-1.47 * 1.146) * 1e5**-0.193
    >>> f = float(darby_bingham_fanning(1e5, 0.0, 16 / 1e5))
    >>> round(f, 6), round(f / f_t, 4)
    (0.002245, 1.0019)
    """
    re = np.asarray(reynolds_b, dtype=float)
    he = np.asarray(hedstrom, dtype=float)
    a = -1.47 * (1.0 + 0.146 * np.exp(-2.9e-5 * he))
    f_t = 10.0**a * re**-0.193
    m = 1.7 + 40_000.0 / re
    fl = np.asarray(f_laminar, dtype=float)
    # (f_L^m + f_T^m)^(1/m) = f_max·(1 + (f_min/f_max)^m)^(1/m): no overflow for large m
    f_max = np.maximum(fl, f_t)
    f_min = np.minimum(fl, f_t)
    return f_max * (1.0 + (f_min / f_max) ** m) ** (1.0 / m)
