"""Friction of the carrier (and of homogeneous non-Newtonian slurries) in a pipe.

Turbulent flow by Wilson & Thomas (1985): the mean velocity of a non-Newtonian fluid at a wall
stress τ_w is that of a Newtonian fluid with the same wall stress and the viscosity
μ_eq = τ_w/γ̇_w (the secant viscosity at the wall), raised by the thicker viscous sublayer:

.. math:: \\frac{V}{u_*} = \\frac{V_N}{u_*} + 11.6(α - 1) - 2.5\\ln α - Ω

with α the area ratio of the rheogram, α = 2(1 + ξn)/(1 + n), ξ = τ_y/τ_w (power law
α = 2/(1+n), Bingham α = 1 + ξ), and Ω = −2.5 ln(1 − ξ) − 2.5ξ(1 + 0.5ξ) the plug term.
V_N/u* is the Colebrook (1939) law in its wall-stress form
(:func:`calc.flow.friction.colebrook_inverse_sqrt_darcy`), so α = 1, Ω = 0 (a Newtonian
fluid) gives Colebrook exactly.  Laminar flow is the exact Herschel-Bulkley pipe solution; the
carrier takes the larger of the laminar and turbulent wall stresses (the intersection of the
two curves as the transition, as Wilson & Thomas use it).

References
----------
Wilson, K. C. & Thomas, A. D. (1985). A new analysis of the turbulent flow of non-Newtonian
fluids. Can. J. Chem. Eng. 63(4), 539-546.
Thomas, A. D. & Wilson, K. C. (1987). New analysis of non-Newtonian turbulent flow — yield-power
law fluids. Can. J. Chem. Eng. 65(2), 335-338.
"""

from __future__ import annotations

import numpy as np

from calc.flow.friction import colebrook_inverse_sqrt_darcy
from calc.flow.laminar_exact import hb_pipe_wall_stress
from calc.numeric import bisect_increasing
from calc.registry import Verification
from calc.slurry.methods import SLURRY_METHODS
from calc.slurry.settling import Carrier

__all__ = [
    "SUBLAYER_CONSTANT",
    "carrier_gradient",
    "carrier_wall_stress",
    "wilson_thomas_area_ratio",
    "wilson_thomas_plug_term",
    "wilson_thomas_velocity",
    "wilson_thomas_wall_stress",
]

#: thickness of the viscous sublayer in wall units, 11.6 (Wilson & Thomas 1985; from memory,
#: not checked against the source — calc/METHODS.md §25.4)
SUBLAYER_CONSTANT = 11.6
#: von Kármán's constant 0.4 as 1/κ = 2.5 (Wilson & Thomas 1985)
INV_KAPPA = 2.5
SQRT8 = np.sqrt(8.0)


def wilson_thomas_area_ratio(xi, n):
    """Area ratio α = 2(1 + ξn)/(1 + n) of a Herschel-Bulkley rheogram [-] (ξ = τ_y/τ_w).

    The area under the rheogram from 0 to the wall shear rate, over that of the Newtonian line
    through the origin and the wall point.

    Examples
    --------
    Power law n = 0.5: α = 4/3; Bingham (n = 1) with ξ = 0.2: α = 1.2; Newtonian: 1.

    >>> [round(float(wilson_thomas_area_ratio(x, n)), 6) for x, n in ((0, .5), (.2, 1), (0, 1))]
    [1.333333, 1.2, 1.0]
    """
    xi = np.asarray(xi, dtype=float)
    return 2.0 * (1.0 + xi * n) / (1.0 + n)


def wilson_thomas_plug_term(xi):
    """Plug term Ω = −2.5 ln(1 − ξ) − 2.5ξ(1 + 0.5ξ) [-] of Wilson & Thomas (1985).

    Examples
    --------
    Zero without yield stress, of third order in ξ (≈ 2.5ξ³/3) for small ξ:

    >>> float(wilson_thomas_plug_term(0.0)), round(float(wilson_thomas_plug_term(0.01)), 9)
    (0.0, 8.4e-07)
    """
    xi = np.asarray(xi, dtype=float)
    return -INV_KAPPA * np.log1p(-xi) - INV_KAPPA * xi * (1.0 + 0.5 * xi)


def wilson_thomas_velocity(tau_w, d, density, tau_y, k, n, roughness=0.0):
    """Mean turbulent velocity [m/s] at wall stress ``tau_w`` [Pa] (Wilson & Thomas 1985).

    Parameters are SI: pipe ID ``d`` [m], ``density`` [kg/m³], Herschel-Bulkley ``tau_y`` [Pa],
    ``k`` [Pa·sⁿ], ``n`` [-], absolute ``roughness`` [m].  Requires τ_w > τ_y.

    Examples
    --------
    Water-like fluid at τ_w = 10 Pa in a 0.1 m pipe:

    >>> round(float(wilson_thomas_velocity(10.0, 0.1, 1000.0, 0.0, 1e-3, 1.0)), 3)
    2.292
    """
    tw = np.asarray(tau_w, dtype=float)
    xi = np.clip(tau_y / tw, 0.0, 1.0 - 1e-15)
    gamma_w = (np.maximum(tw - tau_y, 0.0) / k) ** (1.0 / n)
    mu_eq = tw / np.maximum(gamma_w, 1e-300)
    u_star = np.sqrt(tw / density)
    v_n = SQRT8 * colebrook_inverse_sqrt_darcy(SQRT8 * density * u_star * d / mu_eq, roughness / d)
    alpha = wilson_thomas_area_ratio(xi, n)
    extra = (
        SUBLAYER_CONSTANT * (alpha - 1.0) - INV_KAPPA * np.log(alpha) - wilson_thomas_plug_term(xi)
    )
    return u_star * (v_n + extra)


@SLURRY_METHODS.register(
    "wilson_thomas_1985",
    "Turbulent friction of a power-law, Bingham or Herschel-Bulkley fluid in a pipe: the "
    "Newtonian (Colebrook) velocity at the same wall stress and wall-secant viscosity plus the "
    "sublayer thickening 11.6(α−1) − 2.5 ln α − Ω; laminar flow exact",
    "Wilson & Thomas (1985) Can. J. Chem. Eng. 63(4):539-546; Thomas & Wilson (1987) "
    "Can. J. Chem. Eng. 65(2):335-338",
    status=Verification(
        "from_memory",
        "Reduces to Colebrook for τ_y → 0, n → 1: equal to fluids.friction.Colebrook within "
        "1e-9 (tests/test_slurry.py); α and Ω checked against their closed-form limits (power "
        "law 2/(1+n), Bingham 1+ξ, Ω = O(ξ³)). The constants 11.6 and the form of Ω are "
        "recalled, not checked against the paper; no published data point reproduced.",
        (
            "The sublayer constant 11.6 and the plug term Ω of Wilson & Thomas (1985) are from "
            "memory, not checked against the source (calc/METHODS.md §25.4).",
            "Laminar-turbulent transition taken where the turbulent and laminar curves cross.",
        ),
    ),
)
def wilson_thomas_wall_stress(v, d, density, tau_y, k, n, roughness=0.0):
    """Turbulent wall stress τ_w [Pa] of a Herschel-Bulkley fluid at mean velocity ``v`` [m/s].

    Solves :func:`wilson_thomas_velocity` (increasing in τ_w above the yield stress) for τ_w
    by vectorised bisection on ln τ_w.

    References
    ----------
    Wilson & Thomas (1985), Can. J. Chem. Eng. 63(4), 539-546.

    Examples
    --------
    >>> tw = wilson_thomas_wall_stress(2.0, 0.1, 1000.0, 2.0, 0.05, 0.7)
    >>> round(float(wilson_thomas_velocity(tw, 0.1, 1000.0, 2.0, 0.05, 0.7)), 9)
    2.0
    """
    v = np.asarray(v, dtype=float)
    lo = np.full(v.shape, tau_y * (1.0 + 1e-12) + 1e-9)
    hi = 0.1 * density * v**2 + 2.0 * tau_y + 10.0 * k * (8.0 * v / d) ** n + 1e-6

    def excess(tw):
        return wilson_thomas_velocity(tw, d, density, tau_y, k, n, roughness) - v

    return bisect_increasing(excess, lo, hi, iterations=90, log=True)


def carrier_wall_stress(v, d, carrier: Carrier, roughness=0.0):
    """Wall stress [Pa] of the carrier alone at mean velocity ``v`` and whether it is laminar.

    The larger of the exact laminar Herschel-Bulkley wall stress and the Wilson–Thomas
    turbulent one.

    Examples
    --------
    >>> tw, laminar = carrier_wall_stress(0.01, 0.1, Carrier.water())
    >>> round(float(tw), 9), bool(laminar)  # Hagen-Poiseuille 8μV/D = 8e-4 Pa
    (0.0008, True)
    """
    v = np.asarray(v, dtype=float)
    q = v * np.pi * d**2 / 4.0
    if carrier.tau_y == 0.0 and carrier.n == 1.0:
        lam = 8.0 * carrier.k * v / d
    else:
        lam = hb_pipe_wall_stress(q, d, carrier.tau_y, carrier.k, carrier.n)
    turb = wilson_thomas_wall_stress(
        v, d, carrier.density, carrier.tau_y, carrier.k, carrier.n, roughness
    )
    return np.maximum(lam, turb), lam >= turb


def carrier_gradient(v, d, carrier: Carrier, roughness=0.0):
    """Frictional pressure gradient of the carrier alone, 4τ_w/D [Pa/m].

    Examples
    --------
    Water at 2 m/s in a smooth 0.1 m pipe (Colebrook, Darcy λ ≈ 0.0156): about 312 Pa/m.

    >>> round(float(carrier_gradient(2.0, 0.1, Carrier.water())))
    312
    """
    tw, _ = carrier_wall_stress(v, d, carrier, roughness)
    return 4.0 * tw / d
