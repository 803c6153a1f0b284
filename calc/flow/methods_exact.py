"""The ``exact_laminar`` method: exact laminar Herschel-Bulkley flow, pipe and annulus.

Pipe by the closed form (Skelland 1967) inverted for τ_w; concentric annulus by the
Fredrickson & Bird (1958) construction solved numerically (:mod:`calc.flow.laminar_exact`).
Laminar only: Re_G = 8ρV²/τ_w (τ_w the exact mean wall stress) is compared with 3470 - 1370n
(Guo & Liu 2011, eq. 2.35) only to flag flow that is probably not laminar.
"""

from __future__ import annotations

import numpy as np

from calc.flow.checks import require_n_at_most
from calc.flow.friction import n_dependent_bounds
from calc.flow.laminar_exact import (
    hb_annulus_flow_rate,
    hb_annulus_gradient,
    hb_pipe_flow_rate,
    hb_pipe_wall_stress,
    power_law_pipe_wall_stress,
    power_law_slot_wall_stress,
)
from calc.flow.result import (
    FRICTION_LAWS,
    FlowCase,
    FlowMethod,
    MethodState,
    classify_regime,
    count_note,
)
from calc.flow.solvers import solve_positive

__all__ = ["exact_laminar_state", "exact_wall_stress"]


def exact_wall_stress(case: FlowCase, q) -> np.ndarray:
    """Exact laminar mean wall shear stress [Pa] at flow rate ``q`` (pipe or annulus)."""
    if case.is_annulus:
        g = hb_annulus_gradient(q, case.d_outer, case.d_inner, case.tau_y, case.k, case.n)
        return 0.25 * g * case.d_h
    return hb_pipe_wall_stress(q, case.d_outer, case.tau_y, case.k, case.n)


def _re(case: FlowCase, v):
    tw = exact_wall_stress(case, v * case.area)
    return 8.0 * case.density * v**2 / tw


def exact_laminar_state(case: FlowCase) -> MethodState:
    """Exact laminar state: f = 2τ_w/(ρV²) = 16/Re_G; γ̇_w = ((τ_w - τ_y)/K)^(1/n)."""
    v = case.velocity
    tw = exact_wall_stress(case, case.q)
    re = 8.0 * case.density * v**2 / tw
    lam, turb = n_dependent_bounds(case.n)
    f = 2.0 * tw / (case.density * v**2)
    gw = (np.maximum(tw - case.tau_y, 0.0) / case.k) ** (1.0 / case.n)
    regime = classify_regime(re, lam, turb)
    notes = (
        count_note(
            re >= lam,
            "warning",
            "exact_laminar_not_laminar",
            "Re_G is above the laminar limit 3470-1370n: the flow is probably not laminar, "
            "and the exact laminar gradient underestimates the loss",
            case.geometry,
        ),
    )
    return MethodState(re, lam, turb, regime, f, gw, tw, tuple(x for x in notes if x))


def _critical_velocity(case: FlowCase) -> np.ndarray:
    """Velocity where Re_G = 3470 - 1370n, solved on the wall-stress variable (no nesting)."""
    target = np.log(n_dependent_bounds(case.n)[0])
    # estimate: slot/pipe power-law stress + yield at the velocity giving Re_G = target
    if case.is_annulus:

        def v_of(stress_param):
            g = 4.0 * stress_param / case.d_h
            q = hb_annulus_flow_rate(g, case.d_outer, case.d_inner, case.tau_y, case.k, case.n)
            return q / case.area

        est = case.tau_y * 1.5 + power_law_slot_wall_stress(1.0, 0.5 * case.d_h, case.k, case.n)
    else:

        def v_of(stress_param):
            return hb_pipe_flow_rate(stress_param, case.d_outer, case.tau_y, case.k, case.n) / (
                case.area
            )

        est = case.tau_y * 4.0 / 3.0 + power_law_pipe_wall_stress(1.0, case.d_h, case.k, case.n)

    def resid(tw):
        v = v_of(tw)
        re = 8.0 * case.density * v**2 / tw
        return np.log(np.maximum(re, 1e-300)) - target

    tw_c = solve_positive(resid, est, rtol=1e-11)
    return v_of(tw_c)


def _check(case: FlowCase) -> None:
    require_n_at_most(case, "exact_laminar")


FRICTION_LAWS.register(
    "exact_laminar",
    "Exact laminar Herschel-Bulkley: pipe closed form, concentric annulus solved numerically "
    "(laminar only; flags non-laminar Re)",
    "Skelland (1967); Fredrickson & Bird (1958); Bird, Stewart & Lightfoot (2002)",
)(
    FlowMethod(
        label="Exact laminar Herschel-Bulkley (pipe: Skelland 1967 closed form; annulus: "
        "Fredrickson & Bird 1958, solved numerically)",
        evaluate=exact_laminar_state,
        reynolds=_re,
        laminar_limit=lambda case: n_dependent_bounds(case.n)[0],
        check=_check,
        critical_velocity=_critical_velocity,
    )
)
