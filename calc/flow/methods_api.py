"""API RP 13D methods: the 2006/2010 Herschel-Bulkley method and the 1995 power-law method.

References
----------
API RP 13D, Rheology and Hydraulics of Oil-well Drilling Fluids. American Petroleum
Institute: 3rd ed. (June 1995); 5th ed. (2006); 6th ed. (May 2010).  The 1995 recipe: equations as
published in the 3rd ed. (1995), taken from a secondary account (calc/METHODS.md §7.2, §6.11);
the 2006/2010 yield-power-law structure from memory, pending verification against the standard
(calc/METHODS.md §7.1, §6.12, §6.13).
"""

from __future__ import annotations

import numpy as np

from calc.flow.checks import require_n_at_most, require_no_yield
from calc.flow.friction import (
    api_hb_blend_fanning,
    api_turbulent_fanning,
    n_dependent_bounds,
)
from calc.flow.result import (
    FRICTION_LAWS,
    LAMINAR,
    TURBULENT,
    FlowCase,
    FlowMethod,
    MethodState,
    classify_regime,
    count_note,
)

__all__ = ["api13d_1995_state", "api13d_2010_state", "api_geometry_factor", "api_wall_shear"]

#: Laminar/turbulent boundary of the 1995 method (API RP 13D 1995; calc/METHODS.md §7.2).
API95_RE_LIMIT = 2100.0


def api_geometry_factor(n, alpha):
    """API RP 13D (2006/2010) geometry factor G = [((3-α)n + 1)/((4-α)n)]·(1 + α/2) [-].

    α = 0 pipe, 1 annulus (calc/METHODS.md §7.1, from memory; reduces to (3n+1)/(4n) for a pipe and
    to the slot factor (2n+1)/(3n)·3/2 for the annulus [D]).

    Examples
    --------
    >>> float(api_geometry_factor(1.0, 0.0)), float(api_geometry_factor(1.0, 1.0))
    (1.0, 1.5)
    """
    return ((3.0 - alpha) * n + 1.0) / ((4.0 - alpha) * n) * (1.0 + alpha / 2.0)


def api_wall_shear(velocity, d_h, tau_y, k, n, alpha):
    """API RP 13D (2006/2010) laminar wall shear rate [1/s] and wall shear stress [Pa].

    .. math::
        \\dot γ_w = G\\,\\frac{8V}{D_h}, \\qquad
        τ_w = \\left(\\frac{4-α}{3-α}\\right)^n τ_y + K\\dot γ_w^n

    Parameters
    ----------
    velocity : array_like
        Mean velocity V [m/s].
    d_h : array_like
        Hydraulic diameter D (pipe) or D2 - D1 (annulus) [m].
    tau_y, k, n : array_like
        Herschel-Bulkley yield stress [Pa], consistency [Pa·sⁿ], flow index [-].
    alpha : float
        0 for a pipe, 1 for an annulus (slot).

    Returns
    -------
    tuple of numpy.ndarray
        ``(γ̇_w, τ_w)``.

    Notes
    -----
    The geometry factor G is :func:`api_geometry_factor`; for the annulus γ̇_w is
    (2n+1)/(3n)·12V/(D2 - D1) and τ_w = (3/2)ⁿτ_y + Kγ̇_wⁿ (calc/METHODS.md §7.1, from memory,
    pending verification against the standard).

    References
    ----------
    API RP 13D, Rheology and Hydraulics of Oil-well Drilling Fluids, 5th ed. (2006) / 6th ed.
    (2010), American Petroleum Institute.

    Examples
    --------
    >>> gw, tw = api_wall_shear(1.0, 0.1, 0.0, 0.02, 1.0, 0.0)  # Newtonian pipe: 8V/D, μ·8V/D
    >>> float(gw), round(float(tw), 12)
    (80.0, 1.6)
    """
    v = np.asarray(velocity, dtype=float)
    gw = api_geometry_factor(n, alpha) * 8.0 * v / d_h
    tw = ((4.0 - alpha) / (3.0 - alpha)) ** n * tau_y + k * gw**n
    return gw, tw


def _api10_wall(case: FlowCase, v):
    alpha = 1.0 if case.is_annulus else 0.0
    return api_wall_shear(v, case.d_h, case.tau_y, case.k, case.n, alpha)


def _api10_re(case: FlowCase, v):
    _, tw = _api10_wall(case, v)
    return 8.0 * case.density * v**2 / tw


def api13d_2010_state(case: FlowCase) -> MethodState:
    """API RP 13D (2006/2010) Herschel-Bulkley state (calc/METHODS.md §7.1).

    γ̇_w = G·8V/D_h; τ_w = [(4-α)/(3-α)]ⁿτ_y + Kγ̇_wⁿ; Re_G = 8ρV²/τ_w; f from the blend of
    :func:`calc.flow.friction.api_hb_blend_fanning`; laminar below 3470 - 1370n, turbulent
    from 4270 - 1370n.
    """
    v = case.velocity
    gw, _tw = _api10_wall(case, v)
    re = _api10_re(case, v)
    lam, turb = n_dependent_bounds(case.n)
    f = api_hb_blend_fanning(re, case.n)
    notes = (
        count_note(
            (re >= lam) & ((case.n < 0.36) | (case.n > 1.0)),
            "warning",
            "n_outside_turbulent_fit",
            "non-laminar flow with n outside 0.36-1, the range of the Dodge-Metzner data the "
            "a/Re^b correlation was fitted to",
            case.geometry,
        ),
    )
    return MethodState(
        re,
        lam,
        turb,
        classify_regime(re, lam, turb),
        f,
        gw,
        0.5 * f * case.density * v**2,
        tuple(x for x in notes if x),
    )


def _check_api10(case: FlowCase) -> None:
    require_n_at_most(case, "api13d_2010_hb")


FRICTION_LAWS.register(
    "api13d_2010_hb",
    "API RP 13D (2006/2010) Herschel-Bulkley: G factor, tau_w, Re_G, blended friction factor",
    "API RP 13D 5th ed. (2006) / 6th ed. (2010)",
)(
    FlowMethod(
        label="API RP 13D (2006/2010 editions) Herschel-Bulkley — structure from memory, pending "
        "verification against the standard (calc/METHODS.md §7.1)",
        evaluate=api13d_2010_state,
        reynolds=_api10_re,
        laminar_limit=lambda case: n_dependent_bounds(case.n)[0],
        check=_check_api10,
    )
)


def _api95_shear(case: FlowCase, v):
    n = case.n
    if case.is_annulus:
        return (2.0 * n + 1.0) / (3.0 * n) * 12.0 * v / case.d_h, 12.0 * v / case.d_h
    return (3.0 * n + 1.0) / (4.0 * n) * 8.0 * v / case.d_h, 8.0 * v / case.d_h


def _api95_re(case: FlowCase, v):
    n = case.n
    gw, nominal = _api95_shear(case, v)
    # μ_e = K(8V/D)^(n-1)((3n+1)/(4n))^n pipe; K(12V/(D2-D1))^(n-1)((2n+1)/(3n))^n annulus
    mu_e = case.k * nominal ** (n - 1.0) * (gw / nominal) ** n
    return case.density * v * case.d_h / mu_e


def api13d_1995_state(case: FlowCase) -> MethodState:
    """API RP 13D (1995) power-law state (calc/METHODS.md §7.2).

    Equations as published in API RP 13D (1995), taken from a secondary account.

    μ_e from K, n (pipe: 600/300 pair; annulus: 100/3 pair — the caller passes the pair);
    Re = ρVD_h/μ_e; Re < 2100: f = 16/Re (pipe), 24/Re (annulus); else f = a/Re^b.
    That edition has no transitional zone, so the friction factor jumps at Re = 2100.
    """
    v = case.velocity
    gw, _ = _api95_shear(case, v)
    re = _api95_re(case, v)
    lam_const = 24.0 if case.is_annulus else 16.0
    laminar = re < API95_RE_LIMIT
    f = np.where(laminar, lam_const / re, api_turbulent_fanning(re, case.n))
    limit = np.full(re.shape, API95_RE_LIMIT)
    regime = np.where(laminar, LAMINAR, TURBULENT)
    _, turb_gl = n_dependent_bounds(case.n)
    notes = (
        count_note(
            (~laminar) & (re < turb_gl),
            "info",
            "no_transitional_zone",
            "the 1995 method treats Re >= 2100 as turbulent; the n-dependent bounds of later "
            "practice (3470-1370n, 4270-1370n) would call this flow transitional",
            case.geometry,
        ),
    )
    return MethodState(
        re,
        limit,
        limit,
        regime,
        f,
        gw,
        0.5 * f * case.density * v**2,
        tuple(x for x in notes if x),
    )


def _check_api95(case: FlowCase) -> None:
    require_no_yield(case, "api13d_1995_power_law")


FRICTION_LAWS.register(
    "api13d_1995_power_law",
    "API RP 13D (1995) power law: mu_e, Re, 16/Re or 24/Re below 2100, a/Re^b above",
    "API RP 13D, 3rd ed. (1995)",
)(
    FlowMethod(
        label="API RP 13D (1995, 3rd ed.) power law",
        evaluate=api13d_1995_state,
        reynolds=_api95_re,
        laminar_limit=lambda case: np.full(case.q.shape, API95_RE_LIMIT),
        check=_check_api95,
    )
)
