"""Textbook methods: Newtonian (with roughness), Bingham plastic and power law.

References
----------
Bourgoyne, A. T., Millheim, K. K., Chenevert, M. E. & Young, F. S. (1986). Applied Drilling
Engineering. SPE Textbook Series 2, ch. 4.
Colebrook, C. F. (1939). J. Inst. Civil Eng. 11(4), 133-156.
Bird, R. B., Stewart, W. E. & Lightfoot, E. N. (2002). Transport Phenomena, 2nd ed., §2.3-2.4.
Buckingham, E. (1921). Proc. ASTM 21, 1154-1156.
Hanks, R. W. (1963). AIChE J. 9(3), 306-309.
Darby, R., Mun, R. & Boger, D. V. (1992). Chem. Eng. 99(9), 116-119.
Metzner, A. B. & Reed, J. C. (1955). AIChE J. 1(4), 434-440.
Dodge, D. W. & Metzner, A. B. (1959). AIChE J. 5(2), 189-204.
Guo, B. & Liu, G. (2011). Applied Drilling Circulation Systems, eq. 2.35.
"""

from __future__ import annotations

import numpy as np

from calc.flow.checks import require_n_at_most, require_n_one, require_no_yield
from calc.flow.friction import (
    colebrook_fanning,
    darby_bingham_fanning,
    dodge_metzner_fanning,
    hanks_critical_reynolds,
    hedstrom_number,
    n_dependent_bounds,
)
from calc.flow.laminar_exact import hb_pipe_wall_stress, hb_slot_wall_stress, lamb_diameter
from calc.flow.result import (
    FRICTION_LAWS,
    FlowCase,
    FlowMethod,
    MethodState,
    classify_regime,
    count_note,
)

__all__ = ["bingham_darby_state", "bingham_state", "newtonian_state", "power_law_state"]

#: Newtonian bounds: laminar below 2100, turbulent from 4000 (common practice; our choice of
#: the common textbook pair, stated in the method description).
NEWTONIAN_RE_LAMINAR = 2100.0
NEWTONIAN_RE_TURBULENT = 4000.0

#: Width of the Bingham transitional band above Hanks' critical Re: 1900, the Newtonian
#: 2100-4000 band (our choice), so at τ_y = 0 the Bingham regimes are the Newtonian ones.
BINGHAM_BAND = NEWTONIAN_RE_TURBULENT - NEWTONIAN_RE_LAMINAR


def _tidy(notes):
    return tuple(x for x in notes if x)


# --------------------------------------------------------------------------- Newtonian


def _newtonian_re(case: FlowCase, v):
    return case.density * v * case.d_h / case.k


def _newtonian_laminar_f(case: FlowCase, re):
    """16/Re (Hagen-Poiseuille) or (16/Re)(D_h/D_L)² (Lamb, exact concentric annulus)."""
    if case.is_annulus:
        ratio = (case.d_h / lamb_diameter(case.d_outer, case.d_inner)) ** 2
        return 16.0 / re * ratio
    return 16.0 / re


def newtonian_state(case: FlowCase) -> MethodState:
    """Newtonian: exact laminar, Colebrook turbulent, linear-in-Re transition 2100-4000.

    In the band f = f_lam(2100) + (Re - 2100)/1900·[f_Colebrook(4000) - f_lam(2100)]: continuous
    at both ends.  The annulus uses D_h = D2 - D1 in Re and in Colebrook.
    """
    v = case.velocity
    re = _newtonian_re(case, v)
    rr = case.roughness / case.d_h
    lo, hi = NEWTONIAN_RE_LAMINAR, NEWTONIAN_RE_TURBULENT
    f_lam = _newtonian_laminar_f(case, re)
    f_turb = colebrook_fanning(np.maximum(re, hi), rr)
    f_lo = _newtonian_laminar_f(case, np.full(re.shape, lo))
    f_hi = colebrook_fanning(np.full(re.shape, hi), rr)
    f_tr = f_lo + (re - lo) / (hi - lo) * (f_hi - f_lo)
    f = np.where(re < lo, f_lam, np.where(re < hi, f_tr, f_turb))
    tw = 0.5 * f * case.density * v**2
    lam = np.full(re.shape, lo)
    turb = np.full(re.shape, hi)
    notes = (
        count_note(
            (re >= lo) & (rr > 0.05),
            "warning",
            "roughness_outside_colebrook",
            "relative roughness above 0.05, beyond the range of the Colebrook/Moody chart",
            case.geometry,
        ),
    )
    return MethodState(
        re, lam, turb, classify_regime(re, lam, turb), f, tw / case.k, tw, _tidy(notes)
    )


def _check_newtonian(case: FlowCase) -> None:
    require_n_one(case, "newtonian")
    require_no_yield(case, "newtonian")


FRICTION_LAWS.register(
    "newtonian",
    "Newtonian: Hagen-Poiseuille / Lamb laminar, Colebrook turbulent with roughness, "
    "linear transition 2100-4000",
    "Bird, Stewart & Lightfoot (2002) §2.3-2.4; Colebrook (1939)",
)(
    FlowMethod(
        label="Newtonian: exact laminar (Hagen-Poiseuille, Lamb), Colebrook (1939) turbulent",
        evaluate=newtonian_state,
        reynolds=_newtonian_re,
        laminar_limit=lambda case: np.full(case.q.shape, NEWTONIAN_RE_LAMINAR),
        check=_check_newtonian,
        uses_roughness=True,
    )
)


# --------------------------------------------------------------------------- Bingham


def _bingham_re(case: FlowCase, v):
    return case.density * v * case.d_h / case.k


def _bingham_he(case: FlowCase):
    return hedstrom_number(case.density, case.tau_y, case.k, case.d_h)


def _bingham_laminar_tw(case: FlowCase, v):
    """Buckingham-Reiner (pipe, exact) or plane-slot Bingham (annulus) wall stress [Pa]."""
    ones = np.ones_like(v)
    if case.is_annulus:
        gap = 0.5 * case.d_h
        return hb_slot_wall_stress(v, gap, case.tau_y, case.k, ones)
    return hb_pipe_wall_stress(v * case.area, case.d_h, case.tau_y, case.k, ones)


def _bingham_laminar_f(case: FlowCase, v):
    return 2.0 * _bingham_laminar_tw(case, v) / (case.density * v**2)


def _bingham_velocity(case: FlowCase, re):
    """The mean velocity [m/s] at which the Bingham Reynolds number ρVD_h/μ_p equals ``re``."""
    return re * case.k / (case.density * case.d_h)


def bingham_state(case: FlowCase, laminar_limit=None) -> MethodState:
    """Bingham plastic: exact laminar, Hanks (1963) regimes, Colebrook (1939) on μ_p turbulent.

    f_L: Buckingham-Reiner exact in pipes; the exact plane-slot Bingham solution in annuli
    (slot of gap (D2 - D1)/2, width π(D1 + D2)/2).  Turbulent (Re_B = ρVD_h/μ_p from Hanks'
    Re_Bc + 1900): the Newtonian friction law with the plastic viscosity, as the drilling
    textbooks do (Bourgoyne et al. 1986, ch. 4: the Newtonian friction chart with the
    "apparent" Reynolds number on μ_p), i.e. Colebrook at Re_B with the wall roughness, so at
    τ_y = 0 the turbulent branch is the ``newtonian`` law; τ_w,T = max(τ_w,L, ½ρV²f_C) (our
    choice: at a large Hedström number the Newtonian estimate near the transition lies below
    the laminar loss at the same rate, and turbulent flow does not lose less than laminar).
    Between Re_Bc and Re_Bc + 1900 the wall stress runs linearly in Re_B from τ_w,L(Re_Bc) to
    τ_w,T(Re_Bc + 1900): continuous at both ends and rising with the rate.  ``laminar_limit``:
    Hanks' Re_Bc per element when already known (the flow functions solve it once per distinct
    geometry and fluid; it does not depend on the rate).
    """
    v = case.velocity
    re = _bingham_re(case, v)
    rr = case.roughness / case.d_h
    lam = hanks_critical_reynolds(_bingham_he(case)) if laminar_limit is None else laminar_limit
    turb = lam + BINGHAM_BAND
    half_rho_v2 = 0.5 * case.density * v**2
    tw_lam = _bingham_laminar_tw(case, v)
    f_turb = np.maximum(tw_lam / half_rho_v2, colebrook_fanning(np.maximum(re, turb), rr))
    v_lo, v_hi = _bingham_velocity(case, lam), _bingham_velocity(case, turb)
    tw_lo = _bingham_laminar_tw(case, v_lo)
    f_hi = np.maximum(_bingham_laminar_f(case, v_hi), colebrook_fanning(turb, rr))
    tw_hi = 0.5 * case.density * v_hi**2 * f_hi
    tw_tr = tw_lo + (re - lam) / (turb - lam) * (tw_hi - tw_lo)
    tw = np.where(re < lam, tw_lam, np.where(re < turb, tw_tr, half_rho_v2 * f_turb))
    f = tw / half_rho_v2
    gw = np.maximum(tw - case.tau_y, 0.0) / case.k
    notes = (
        count_note(
            (re >= lam) & (rr > 0.05),
            "warning",
            "roughness_outside_colebrook",
            "relative roughness above 0.05, beyond the range of the Colebrook/Moody chart",
            case.geometry,
        ),
    )
    return MethodState(re, lam, turb, classify_regime(re, lam, turb), f, gw, tw, _tidy(notes))


def bingham_darby_state(case: FlowCase, laminar_limit=None) -> MethodState:
    """Bingham plastic after Darby, Mun & Boger (1992), regimes by Hanks (1963).

    f_L: Buckingham-Reiner exact in pipes; the exact plane-slot Bingham solution in annuli
    (slot of gap (D2 - D1)/2, width π(D1 + D2)/2).  f = (f_L^m + f_T^m)^(1/m) over all Re.
    Laminar below Hanks' Re_Bc (He on D_h); turbulent from Re_Bc + 1900.  ``laminar_limit``:
    Hanks' Re_Bc per element when already known.

    Caveat: the Darby turbulent term was fitted to slurries of large Hedström number and does
    not reduce to the Newtonian law as He → 0: at Re_B = 10⁴ and He → 0 it gives 0.45 times
    the smooth-pipe Colebrook factor (measured in the tests against ``fluids``).  Drilling
    muds (He ~ 10⁴-10⁶) lie where it reads 23-62 % below the Newtonian law on μ_p; the
    ``bingham`` law is the default for that reason.
    """
    v = case.velocity
    re = _bingham_re(case, v)
    he = _bingham_he(case)
    f_l = _bingham_laminar_f(case, v)
    f = darby_bingham_fanning(re, he, f_l)
    lam = hanks_critical_reynolds(he) if laminar_limit is None else laminar_limit
    turb = lam + BINGHAM_BAND
    tw = 0.5 * f * case.density * v**2
    gw = np.maximum(tw - case.tau_y, 0.0) / case.k
    return MethodState(re, lam, turb, classify_regime(re, lam, turb), f, gw, tw)


def _check_bingham(case: FlowCase) -> None:
    require_n_one(case, "bingham")


def _check_bingham_darby(case: FlowCase) -> None:
    require_n_one(case, "bingham_darby_1992")


FRICTION_LAWS.register(
    "bingham",
    "Bingham plastic: Buckingham-Reiner (pipe) / plane slot (annulus) laminar, Hanks "
    "transition, Colebrook on the plastic viscosity turbulent (the Newtonian law at τy = 0)",
    "Buckingham (1921); Hanks (1963); Colebrook (1939); Bourgoyne et al. (1986) ch. 4",
)(
    FlowMethod(
        label="Bingham plastic: Buckingham-Reiner / slot laminar, Hanks (1963) transition, "
        "Colebrook (1939) turbulent on μ_p",
        evaluate=bingham_state,
        reynolds=_bingham_re,
        laminar_limit=lambda case: hanks_critical_reynolds(_bingham_he(case)),
        check=_check_bingham,
        uses_roughness=True,
        limit_from_distinct=True,
    )
)

FRICTION_LAWS.register(
    "bingham_darby_1992",
    "Bingham plastic after Darby, Mun & Boger (1992): exact laminar, Hanks transition, "
    "slurry correlation turbulent and blend",
    "Buckingham (1921); Hanks (1963); Darby, Mun & Boger (1992) Chem. Eng. 99(9)",
)(
    FlowMethod(
        label="Bingham plastic: Buckingham-Reiner / slot laminar, Hanks (1963) transition, "
        "Darby, Mun & Boger (1992) friction factor",
        evaluate=bingham_darby_state,
        reynolds=_bingham_re,
        laminar_limit=lambda case: hanks_critical_reynolds(_bingham_he(case)),
        check=_check_bingham_darby,
        limit_from_distinct=True,
    )
)


# --------------------------------------------------------------------------- power law


def _pl_wall(case: FlowCase, v):
    n = case.n
    if case.is_annulus:
        gw = (2.0 * n + 1.0) / (3.0 * n) * 12.0 * v / case.d_h
    else:
        gw = (3.0 * n + 1.0) / (4.0 * n) * 8.0 * v / case.d_h
    return gw, case.k * gw**n


def _pl_re(case: FlowCase, v):
    _, tw = _pl_wall(case, v)
    return 8.0 * case.density * v**2 / tw


def power_law_state(case: FlowCase) -> MethodState:
    """Power law: Metzner-Reed Re, Dodge-Metzner turbulent, n-dependent bounds.

    Re_MR = 8ρV²/τ_w,lam with τ_w,lam = K[(3n+1)/(4n)·8V/D]ⁿ (pipe) or K[(2n+1)/(3n)·12V/D_h]ⁿ
    (annulus, slot basis); laminar f = 16/Re_MR (exact pipe, slot annulus); bounds
    Re1 = 3470 - 1370n, Re2 = 4270 - 1370n; between them f = 16/Re1 + (Re - Re1)/(Re2 - Re1)·
    [f_DM(Re2) - 16/Re1] (calc/METHODS.md §7.5; bounds §6.12, with Dodge-Metzner at Re2 in
    place of a/Re2^b).
    """
    v = case.velocity
    n = case.n
    re = _pl_re(case, v)
    lo, hi = n_dependent_bounds(n)
    f_lam = 16.0 / re
    f_turb = dodge_metzner_fanning(np.maximum(re, hi), n)
    f_lo = 16.0 / lo
    f_hi = dodge_metzner_fanning(hi, n)
    f_tr = f_lo + (re - lo) / (hi - lo) * (f_hi - f_lo)
    f = np.where(re < lo, f_lam, np.where(re < hi, f_tr, f_turb))
    tw = 0.5 * f * case.density * v**2
    gw = (tw / case.k) ** (1.0 / n)
    notes = (
        count_note(
            (re >= lo) & ((n < 0.36) | (n > 1.0)),
            "warning",
            "n_outside_dodge_metzner",
            "non-laminar flow with n outside 0.36-1, the range of the Dodge-Metzner data",
            case.geometry,
        ),
    )
    return MethodState(re, lo, hi, classify_regime(re, lo, hi), f, gw, tw, _tidy(notes))


def _check_power_law(case: FlowCase) -> None:
    require_no_yield(case, "power_law")
    require_n_at_most(case, "power_law")


FRICTION_LAWS.register(
    "power_law",
    "Power law: Metzner-Reed Re, Dodge-Metzner turbulent (solved), bounds 3470-1370n / "
    "4270-1370n with linear transition",
    "Metzner & Reed (1955); Dodge & Metzner (1959); Guo & Liu (2011) eq. 2.35",
)(
    FlowMethod(
        label="Power law: Metzner-Reed (1955) Re, Dodge & Metzner (1959) turbulent",
        evaluate=power_law_state,
        reynolds=_pl_re,
        laminar_limit=lambda case: n_dependent_bounds(case.n)[0],
        check=_check_power_law,
    )
)
