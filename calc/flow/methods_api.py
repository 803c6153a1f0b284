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

from dataclasses import dataclass
from functools import cache

import numpy as np

from calc.errors import check_choice
from calc.flow.checks import require_n_at_most, require_no_yield
from calc.flow.friction import (
    api_hb_blend_fanning,
    api_turbulent_fanning,
    n_dependent_bounds,
)
from calc.flow.result import (
    CONSTANT_SETS,
    FRICTION_LAWS,
    LAMINAR,
    TURBULENT,
    FlowCase,
    FlowMethod,
    MethodState,
    classify_regime,
    count_note,
)
from calc.units import si_factor

__all__ = [
    "API95_PRINTED",
    "Api1995Constants",
    "api13d_1995_state",
    "api13d_2010_state",
    "api95_constants",
    "api_geometry_factor",
    "api_wall_shear",
]

#: Laminar/turbulent boundary of the 1995 method (API RP 13D 1995; calc/METHODS.md §7.2).
API95_RE_LIMIT = 2100.0


@dataclass(frozen=True)
class Api1995Constants:
    """The field constants of the API RP 13D (1995) power-law recipe, one set per name.

    The recipe as printed (API RP 13D, 3rd ed. 1995, read second-hand — calc/METHODS.md §7.2,
    §7.9) uses rounded field constants; ``"exact"`` holds the same constants derived from SI
    (calc/METHODS.md §0.1), ``"as_printed"`` the printed ones.  The code evaluates one SI formula
    per quantity and multiplies each term by :meth:`ratio` = printed/exact of the constant that
    term carries in the field form, so the ``"exact"`` set gives ratio 1 exactly (the SI
    numbers unchanged) and ``"as_printed"`` reproduces the printed field formula.

    ============  ====================================================  =========  =========
    field         field formula (units)                                 printed    exact
    ============  ====================================================  =========  =========
    n_pipe        n_p = c·log(θ600/θ300)                                3.32       1/log 2
    n_annulus     n_a = c·log(θ100/θ3)                                  0.657      1/log(100/3)
    dial_stress   K = c·θ/γ̇ⁿ [dyn·sⁿ/cm²] (R1-B1-F1, dyn/cm² per °)     5.11       5.10678
    rate_600      γ̇ at 600 rpm in K_p = 5.11θ600/1022^n_p [1/s]        1022       1021.38
    rate_100      γ̇ at 100 rpm in K_a = 5.11θ100/170.2^n_a [1/s]       170.2      170.230
    velocity      V = c·Q/D² (ft/s, gpm, in)                            0.408      0.408497
    reynolds      Re = c·D·V·ρ/μ_e (in, ft/s, ppg, cP)                  928        927.687
    gradient      dP/dL = f·V²·ρ/(c·D) (psi/ft, ft/s, ppg, in)          25.81      25.8064
    bit           ΔP = c·ρQ²/(ΣD_N²)² (psi, ppg, gpm, 32nds; C_d 0.95)  156        156.52
    ============  ====================================================  =========  =========

    The other numbers of the recipe (96 = 8·12 and 144 = 12·12 in μ_e, 100 cP per poise, 16/Re,
    24/Re, 2100, and a = (log n + 3.93)/50, b = (1.75 − log n)/7) are exact or dimensionless and
    the same in both sets.

    Examples
    --------
    >>> round(api95_constants("exact").reynolds, 3), API95_PRINTED.reynolds
    (927.687, 928.0)
    >>> api95_constants("exact").ratio("velocity")
    1.0
    """

    name: str
    n_pipe: float
    n_annulus: float
    dial_stress: float
    rate_600: float
    rate_100: float
    velocity: float
    reynolds: float
    gradient: float
    bit: float

    def ratio(self, field: str) -> float:
        """This set's constant over the exact one (1.0 for the exact set) [-]."""
        return getattr(self, field) / getattr(api95_constants("exact"), field)


def _exact_api95() -> Api1995Constants:
    """The 1995 field constants derived from SI (calc/METHODS.md §0.1, §1.1-§1.2)."""
    # lazy: calc.rheology imports calc.flow (its 1995 fits use this table); the standard
    # viscometer is read at first use so the two packages import in either order
    from calc.rheology.viscometer import STANDARD_GEOMETRY

    ppg, gpm, cp = si_factor("ppg"), si_factor("gpm"), si_factor("cP")
    inch, fps, psi_ft = si_factor("in"), si_factor("ft/s"), si_factor("psi/ft")
    rate, stress = STANDARD_GEOMETRY.shear_rate_per_rpm, STANDARD_GEOMETRY.stress_per_reading
    nozzle = np.pi / 4.0 * (inch / 32.0) ** 2  # m² per (32nd in)² of nozzle diameter
    cd = 0.95  # the discharge coefficient the printed 156 carries (calc/METHODS.md §8.3)
    return Api1995Constants(
        name="exact",
        n_pipe=1.0 / np.log10(2.0),
        n_annulus=1.0 / np.log10(100.0 / 3.0),
        dial_stress=stress / 0.1,  # 1 dyn/cm² = 0.1 Pa (CGS, exact)
        rate_600=600.0 * rate,
        rate_100=100.0 * rate,
        velocity=gpm / (np.pi / 4.0 * inch**2) / fps,
        reynolds=ppg * fps * inch / cp,
        gradient=psi_ft / (2.0 * ppg * fps**2 / inch),  # SI: dP/dL = 2fρV²/D
        bit=ppg * gpm**2 / (2.0 * cd**2 * nozzle**2) / si_factor("psi"),
    )


#: The 1995 constants as printed (API RP 13D, 3rd ed. 1995, second-hand; calc/METHODS.md §7.9).
API95_PRINTED = Api1995Constants(
    name="as_printed",
    n_pipe=3.32,
    n_annulus=0.657,
    dial_stress=5.11,
    rate_600=1022.0,
    rate_100=170.2,
    velocity=0.408,
    reynolds=928.0,
    gradient=25.81,
    bit=156.0,
)


@cache
def _api95_set(name: str) -> Api1995Constants:
    return _exact_api95() if name == "exact" else API95_PRINTED


def api95_constants(constants: str = "exact") -> Api1995Constants:
    """The 1995 constant set named ``constants`` (``"exact"`` or ``"as_printed"``).

    Raises :class:`~calc.errors.InputError` naming the allowed sets for any other name.

    Examples
    --------
    >>> api95_constants("as_printed").gradient
    25.81
    """
    return _api95_set(check_choice("constants", constants, CONSTANT_SETS))


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


def _api95_velocity(case: FlowCase, v):
    """The velocity the recipe's formulas see: V·(0.408 printed/exact) for the printed set."""
    return v * api95_constants(case.constants).ratio("velocity")


def _api95_shear(case: FlowCase, v):
    n = case.n
    v = _api95_velocity(case, v)
    if case.is_annulus:
        return (2.0 * n + 1.0) / (3.0 * n) * 12.0 * v / case.d_h, 12.0 * v / case.d_h
    return (3.0 * n + 1.0) / (4.0 * n) * 8.0 * v / case.d_h, 8.0 * v / case.d_h


def _api95_re(case: FlowCase, v):
    n = case.n
    gw, nominal = _api95_shear(case, v)
    # μ_e = K(8V/D)^(n-1)((3n+1)/(4n))^n pipe; K(12V/(D2-D1))^(n-1)((2n+1)/(3n))^n annulus
    mu_e = case.k * nominal ** (n - 1.0) * (gw / nominal) ** n
    c = api95_constants(case.constants)
    return case.density * _api95_velocity(case, v) * case.d_h / mu_e * c.ratio("reynolds")


def api13d_1995_state(case: FlowCase) -> MethodState:
    """API RP 13D (1995) power-law state (calc/METHODS.md §7.2).

    Equations as published in API RP 13D (1995), taken from a secondary account.

    μ_e from K, n (pipe: 600/300 pair; annulus: 100/3 pair — the caller passes the pair);
    Re = ρVD_h/μ_e; Re < 2100: f = 16/Re (pipe), 24/Re (annulus); else f = a/Re^b.
    That edition has no transitional zone, so the friction factor jumps at Re = 2100.
    With ``case.constants == "as_printed"`` the velocity, Reynolds number and gradient carry
    the printed 0.408, 928 and 25.81 (:class:`Api1995Constants`, calc/METHODS.md §7.9).
    """
    c = api95_constants(case.constants)
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
    # dP/dL = fV²ρ/(25.81·D): the gradient 2fρV²/D_h scaled by (V_printed/V)²·(exact/printed)
    scale = c.ratio("velocity") ** 2 / c.ratio("gradient")
    return MethodState(
        re,
        limit,
        limit,
        regime,
        f,
        gw,
        0.5 * f * case.density * v**2 * scale,
        tuple(x for x in notes if x),
        gradient_scale=scale,
        velocity_scale=c.ratio("velocity"),
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
        constant_sets=CONSTANT_SETS,
    )
)
