"""Burkhardt clinging constants: the chart fits and the exact Newtonian laminar value.

Fits to Burkhardt's chart (Guo & Liu 2011, eqs. 2.81-2.82): laminar K_c = 0.275(D1/D2) + 0.25,
turbulent K_c = 0.1(D1/D2) + 0.41; the solver blends them across the friction method's
transitional zone (:func:`clinging_constant_blended`, our continuous formulation).  For
Newtonian laminar flow in a concentric annulus the exact value is
:func:`clinging_constant_exact_newtonian`.

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Guo, B. & Liu, G. (2011) Applied Drilling Circulation Systems, ch. 2.
Bird, R.B., Stewart, W.E. & Lightfoot, E.N. (2002) Transport Phenomena, 2nd ed., Wiley.
"""

from __future__ import annotations

import numpy as np

from calc.errors import InputError, check_choice, check_nonnegative
from calc.numeric import scalar_or_array

__all__ = [
    "check_clinging",
    "clinging_constant",
    "clinging_constant_blended",
    "clinging_constant_exact_newtonian",
    "transition_weight",
]


def clinging_constant(d_pipe, d_hole, regime="laminar"):
    """Burkhardt clinging constant K_c from the fits to his chart [-].

    .. math:: K_c = 0.275\\,\\frac{D_1}{D_2} + 0.25\\ \\text{(laminar)},\\qquad
              K_c = 0.1\\,\\frac{D_1}{D_2} + 0.41\\ \\text{(turbulent)}

    Parameters
    ----------
    d_pipe, d_hole : array_like
        Pipe OD D1 and hole ID D2 [m].
    regime : {"laminar", "turbulent"} or array of bool
        ``True`` entries of a boolean array mean turbulent.

    References
    ----------
    Guo & Liu (2011), eqs. 2.81-2.82 (placement of D1/D2 inferred, not checked against the source;
    calc/METHODS.md §11.2).

    >>> round(clinging_constant(0.5, 1.0), 4)
    0.3875
    """
    k = np.asarray(d_pipe, dtype=float) / np.asarray(d_hole, dtype=float)
    if isinstance(regime, str):
        turb = check_choice("regime", regime, ("laminar", "turbulent")) == "turbulent"
    else:
        turb = np.asarray(regime, dtype=bool)
    return scalar_or_array(np.where(turb, 0.1 * k + 0.41, 0.275 * k + 0.25))


def transition_weight(reynolds, laminar_limit, turbulent_limit):
    """Position of a flow in its friction method's transitional zone, 0 (laminar) to 1 [-].

    .. math:: w = \\min\\left(1, \\max\\left(0,
              \\frac{Re - Re_{lam}}{Re_{turb} - Re_{lam}}\\right)\\right)

    A method without a transitional zone (Re_turb ≤ Re_lam) gives a step at Re_lam.

    >>> float(transition_weight(2500.0, 2000.0, 3000.0))
    0.5
    """
    re_ = np.asarray(reynolds, dtype=float)
    lo = np.asarray(laminar_limit, dtype=float)
    hi = np.asarray(turbulent_limit, dtype=float)
    width = hi - lo
    ramp = np.clip((re_ - lo) / np.where(width > 0, width, 1.0), 0.0, 1.0)
    return scalar_or_array(np.where(width > 0, ramp, (re_ >= lo).astype(float)))


def clinging_constant_blended(d_pipe, d_hole, weight):
    """Burkhardt clinging constant blended across the transitional zone [-].

    .. math:: K_c = K_{c,lam} + w\\,(K_{c,turb} - K_{c,lam}),\\qquad 0 \\le w \\le 1

    ``w`` is :func:`transition_weight` of the annulus flow evaluated with the laminar K_c (a
    quantity that rises with the pipe speed), so K_c changes continuously from the laminar fit
    to the turbulent fit across the friction method's own transitional zone instead of
    switching at one speed.  A continuous formulation of our own (not a published blend):
    at w = 0 and w = 1 it equals the fits of :func:`clinging_constant`
    (calc/METHODS.md §11.2).

    Parameters
    ----------
    d_pipe, d_hole : array_like
        Pipe OD D1 and hole ID D2 [m].
    weight : array_like
        Transition weight w in [0, 1] [-].

    >>> round(clinging_constant_blended(0.5, 1.0, 0.5), 5)  # halfway between 0.3875 and 0.46
    0.42375
    """
    w = np.clip(np.asarray(weight, dtype=float), 0.0, 1.0)
    lam = np.asarray(clinging_constant(d_pipe, d_hole, "laminar"))
    turb = np.asarray(clinging_constant(d_pipe, d_hole, "turbulent"))
    return scalar_or_array(lam + w * (turb - lam))


def clinging_constant_exact_newtonian(d_pipe, d_hole):
    """Exact clinging constant for laminar Newtonian flow in a concentric annulus [-].

    .. math:: K_c = \\frac{1}{2\\ln(1/\\kappa)} - \\frac{\\kappa^2}{1 - \\kappa^2},\\quad
              \\kappa = D_1/D_2

    Derivation: the axial drag (Couette) flow of an inner cylinder moving at V_p in a fixed outer
    cylinder, u = V_p ln(R2/r)/ln(R2/R1), carries Q_d = πV_p[(R2² - R1²)/(2 ln(R2/R1)) - R1²];
    by linearity of Stokes flow the moving-wall problem equals a stationary-wall flow of
    Q_a + Q_d, so K_c = Q_d/(V_p·π(R2² - R1²)) (Bird, Stewart & Lightfoot 2002, problem 2B.7
    type axial annular flow with a moving rod).

    >>> round(clinging_constant_exact_newtonian(0.5, 1.0), 4)
    0.388
    """
    k = np.asarray(d_pipe, dtype=float) / np.asarray(d_hole, dtype=float)
    return scalar_or_array(1.0 / (2.0 * np.log(1.0 / k)) - k**2 / (1.0 - k**2))


def check_clinging(clinging):
    """A clinging choice: "burkhardt" (the fits) or given K_c values in [0, 1)."""
    if isinstance(clinging, str):
        check_choice("clinging", clinging, ("burkhardt",))
        return clinging
    kc = check_nonnegative("clinging constant", clinging)
    if np.any(kc >= 1.0):
        raise InputError("clinging constant", float(np.max(kc)), "in [0, 1)")
    return kc
