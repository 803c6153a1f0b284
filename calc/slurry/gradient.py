"""Frictional pressure gradient of a settling slurry in a pipe (calc/METHODS.md §25.4).

* Durand–Condolios–Gibert (1952): (i − i_f)/(C_v·i_f) = K·Ψ^−1.5, Ψ = V²√C_D/(gD(S−1)),
  K = 81, C_D the drag coefficient of the d50 grain at its terminal velocity.
* The four-component model (Wilson, Addie, Sellgren & Clift 2006; Sellgren & Wilson 2007):
  the solids split by size into a fine part (d < 40 µm, part of the carrier), a pseudo-
  homogeneous part (40-200 µm, friction as an equivalent fluid of the mixture's density), a
  heterogeneous part (200 µm to 0.015·D, Δ = 0.22(ρ_s−ρ_f)g·C_h·(V50/V)^M) and a fully
  stratified part (> 0.015·D, Δ = 0.5μ_s(ρ_s−ρ_f)g·C_s·(V/(0.55·V_sm))^−0.25), each capped at
  the Coulomb limit μ_s(ρ_s−ρ_f)g·C of a sliding bed.
  V50 = w·√(8/λ_f)·cosh(60d/D), M = 1/ln(d85/d50) capped at 1.7.

Inclined pipes: the solids' excess over the carrier is multiplied by cos θ (Worster & Denny
1955); the weight of the column is the static term (:mod:`calc.slurry.curve`).

References
----------
Durand, R. & Condolios, E. (1952). Étude expérimentale du refoulement des matériaux en conduite.
2èmes Journées de l'Hydraulique, SHF, Grenoble.
Wilson, K. C., Clift, R. & Sellgren, A. (2002). Operating points for pipelines carrying
concentrated heterogeneous slurries. Powder Technology 123, 19-24.
Wilson, Addie, Sellgren & Clift (2006). Slurry Transport Using Centrifugal Pumps, 3rd ed.
Sellgren, A. & Wilson, K. C. (2007). Validation of a four-component pipeline friction-loss
model. Proc. Hydrotransport 17, BHR Group, 193-204.
Worster, R. C. & Denny, D. F. (1955). Hydraulic transport of solid material in pipes. Proc.
Inst. Mech. Eng. 169, 563-586.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from scipy.special import ndtri

from calc.errors import check_choice, check_range
from calc.registry import Verification
from calc.slurry.deposition import MU_S, wilson_deposition_velocity
from calc.slurry.homogeneous import carrier_wall_stress
from calc.slurry.methods import GRADIENT_NAMES, SLURRY_METHODS
from calc.slurry.settling import (
    Z85,
    Carrier,
    G,
    Solids,
    lognormal_fraction_below,
    terminal_velocity,
)

__all__ = [
    "DURAND_K",
    "FINE_LIMIT",
    "PSEUDO_LIMIT",
    "STRATIFIED_RATIO",
    "FourComponent",
    "SizeFractions",
    "durand_gradient",
    "four_component_gradient",
    "settling_gradient",
    "size_fractions",
]

#: Durand–Condolios constant K = 81 (Durand 1952; 121 in Zandi & Govatos 1967) — from memory
DURAND_K = 81.0
#: size limits of the four components (Sellgren & Wilson 2007; from memory, §25.4): fines
#: below 40 µm, pseudo-homogeneous to 200 µm, heterogeneous to 0.015·D, stratified above
FINE_LIMIT = 40e-6
PSEUDO_LIMIT = 200e-6
STRATIFIED_RATIO = 0.015
#: heterogeneous excess at V = V50 as a fraction of (S−1)·C: 0.22 (Wilson et al. 1997)
HET_AT_V50 = 0.22
#: the largest heterogeneous exponent M (Wilson et al. 1997)
M_MAX = 1.7


@dataclass(frozen=True)
class SizeFractions:
    """Volume fractions of the solids in each size range [-] (sum 1) and the median size of
    the heterogeneous and the stratified parts [m]."""

    fine: float
    pseudo: float
    heterogeneous: float
    stratified: float
    d_heterogeneous: float
    d_stratified: float


def _median_between(lo, hi, d50, d85):
    """The size that halves the part of the log-normal distribution between lo and hi."""
    f_lo, f_hi = (float(lognormal_fraction_below(x, d50, d85)) for x in (lo, hi))
    if d85 == d50:
        return d50
    target = 0.5 * (f_lo + f_hi)
    z = float(ndtri(min(max(target, 1e-12), 1 - 1e-12)))
    return float(d50 * math.exp(z * math.log(d85 / d50) / Z85))


def size_fractions(d50, d85, d_pipe) -> SizeFractions:
    """Split a log-normal size distribution into the four components' ranges.

    Examples
    --------
    150 µm solids with d85 = 300 µm in a 4 in pipe: mostly pseudo-homogeneous:

    >>> f = size_fractions(150e-6, 300e-6, 0.1016)
    >>> [round(x, 3) for x in (f.fine, f.pseudo, f.heterogeneous, f.stratified)]
    [0.024, 0.642, 0.333, 0.0]
    """
    limits = [FINE_LIMIT, PSEUDO_LIMIT, max(STRATIFIED_RATIO * d_pipe, PSEUDO_LIMIT)]
    cum = [float(lognormal_fraction_below(x, d50, d85)) for x in limits]
    fine = cum[0]
    pseudo = cum[1] - cum[0]
    het = cum[2] - cum[1]
    strat = 1.0 - cum[2]
    d_het = _median_between(limits[1], limits[2], d50, d85) if het > 0 else limits[1]
    d_str = _median_between(limits[2], 1.0, d50, d85) if strat > 0 else limits[2]
    return SizeFractions(fine, pseudo, het, strat, d_het, d_str)


def _carrier_parts(v, d_pipe, carrier, roughness):
    tw, laminar = carrier_wall_stress(v, d_pipe, carrier, roughness)
    grad = 4.0 * tw / d_pipe
    darcy = 8.0 * tw / (carrier.density * np.asarray(v, dtype=float) ** 2)
    return grad, darcy, laminar


@SLURRY_METHODS.register(
    "durand_condolios_1952",
    "Durand–Condolios–Gibert excess gradient (i − i_f)/(C_v·i_f) = 81·Ψ^−1.5, "
    "Ψ = V²√C_D/(gD(S−1)); C_D of the d50 grain at its terminal velocity",
    "Durand & Condolios (1952) 2èmes Journées de l'Hydraulique, SHF Grenoble",
    status=Verification(
        "from_memory",
        "Form and K = 81 recalled; tests/test_slurry.py checks the exact limit C_v → 0 (the "
        "carrier's gradient) and the V^−3 decay of the excess. No tabulated value of the "
        "source reproduced.",
        (
            "K = 81 and the form of Ψ are from memory, not checked against the source "
            "(calc/METHODS.md §25.4).",
            "Fitted to uniform sands and gravels in water above the deposition velocity.",
        ),
    ),
)
def durand_gradient(v, d_pipe, solids: Solids, carrier: Carrier, roughness=0.0):
    """Horizontal frictional gradient of a settling slurry by Durand–Condolios [Pa/m].

    .. math:: \\frac{dp}{dL} = \\frac{dp_f}{dL}\\left[1 + K C_v Ψ^{-1.5}\\right]

    References
    ----------
    Durand & Condolios (1952).

    Examples
    --------
    >>> s = Solids(2650.0, 0.1, 0.5e-3, 0.5e-3)
    >>> round(float(durand_gradient(3.0, 0.15, s, Carrier.water())))
    661
    """
    v = np.asarray(v, dtype=float)
    jf, _, _ = _carrier_parts(v, d_pipe, carrier, roughness)
    s = solids.density / carrier.density
    w = terminal_velocity(
        solids.d50, solids.density, carrier.density, carrier.viscosity_for_settling()
    )
    c_d = 4.0 * G * solids.d50 * (s - 1.0) / (3.0 * w**2)
    psi = v**2 * np.sqrt(c_d) / (G * d_pipe * (s - 1.0))
    return jf * (1.0 + DURAND_K * solids.cv * psi**-1.5)


@dataclass(frozen=True)
class FourComponent:
    """The four-component gradient [Pa/m] and its parts at each velocity."""

    total: np.ndarray
    fluid: np.ndarray  # carrier with fines and pseudo-homogeneous solids (equivalent fluid)
    heterogeneous: np.ndarray
    stratified: np.ndarray
    carrier: np.ndarray  # carrier alone
    laminar: np.ndarray
    fractions: SizeFractions
    v50: np.ndarray
    exponent_m: float


@SLURRY_METHODS.register(
    "four_component_2006",
    "Four-component settling-slurry gradient: fines with the carrier, pseudo-homogeneous as an "
    "equivalent fluid, heterogeneous 0.22(S−1)C(V50/V)^M, fully stratified 0.5μ_s(S−1)C"
    "(V/0.55V_sm)^−0.25, by size ranges of a log-normal distribution",
    "Wilson, Addie, Sellgren & Clift (2006) Slurry Transport Using Centrifugal Pumps, 3rd ed.; "
    "Sellgren & Wilson (2007) Hydrotransport 17",
    status=Verification(
        "from_memory",
        "Structure and constants recalled; tests/test_slurry.py checks the exact limit C_v → 0 "
        "(the carrier's gradient), the equivalent-fluid limit for all-pseudo-homogeneous "
        "solids, monotone growth with C_v (hypothesis) and the Coulomb cap. No worked example "
        "of the handbook reproduced.",
        (
            "Size limits (40 µm, 200 µm, 0.015·D), 0.22, M = 1/ln(d85/d50) ≤ 1.7, V50 = "
            "w√(8/λ)cosh(60d/D) and the stratified fit are from memory, not checked against "
            "the source (calc/METHODS.md §25.4).",
            "Fines are not given extra viscosity; a viscous carrier's settling uses its "
            "apparent viscosity at 100 1/s.",
            "Developed for water carriers; with a non-Newtonian carrier a note.",
        ),
    ),
)
def four_component_gradient(v, d_pipe, solids: Solids, carrier: Carrier, roughness=0.0):
    """Horizontal frictional gradient of a settling slurry, four-component model [Pa/m].

    .. math:: \\frac{dp}{dL} = \\frac{dp_f}{dL}\\,\\frac{ρ_{eq}}{ρ_f}
              + 0.22 Δρ g C_h (V_{50}/V)^M + 0.5 μ_s Δρ g C_s (V/0.55V_{sm})^{-0.25}

    ρ_eq = ρ_f + (C_fine + C_pseudo)(ρ_s − ρ_f); each settling part capped at μ_s·Δρ·g·C.

    References
    ----------
    Wilson, Addie, Sellgren & Clift (2006); Sellgren & Wilson (2007).

    Examples
    --------
    With no solids the gradient is the carrier's:

    >>> s = Solids(2600.0, 0.0, 150e-6, 300e-6)
    >>> r = four_component_gradient(2.0, 0.1016, s, Carrier.water())
    >>> bool(r.total == r.carrier)
    True
    """
    v = np.asarray(v, dtype=float)
    jf, darcy, laminar = _carrier_parts(v, d_pipe, carrier, roughness)
    fr = size_fractions(solids.d50, solids.d85, d_pipe)
    drho = solids.density - carrier.density
    c = solids.cv
    rho_eq = carrier.density + (fr.fine + fr.pseudo) * c * drho
    fluid = jf * rho_eq / carrier.density
    coulomb = MU_S * drho * G * c
    spread = math.log(solids.d85 / solids.d50)
    m = M_MAX if spread <= 1.0 / M_MAX else 1.0 / spread
    w = terminal_velocity(
        fr.d_heterogeneous, solids.density, carrier.density, carrier.viscosity_for_settling()
    )
    v50 = w * np.sqrt(8.0 / darcy) * np.cosh(60.0 * fr.d_heterogeneous / d_pipe)
    het = np.minimum(
        HET_AT_V50 * drho * G * c * fr.heterogeneous * (v50 / v) ** m, coulomb * fr.heterogeneous
    )
    if fr.stratified > 0.0:
        v_sm = wilson_deposition_velocity(
            d_pipe, min(fr.d_stratified, 0.5 * d_pipe), solids.density, carrier.density
        )
        strat = np.minimum(
            0.5 * MU_S * drho * G * c * fr.stratified * (v / (0.55 * v_sm)) ** -0.25,
            coulomb * fr.stratified,
        )
    else:
        strat = np.zeros_like(v)
    total = fluid + het + strat
    return FourComponent(total, fluid, het, strat, jf, laminar, fr, v50, m)


def settling_gradient(
    v,
    d_pipe,
    solids: Solids,
    carrier: Carrier,
    roughness=0.0,
    *,
    inclination=0.0,
    method="four_component_2006",
):
    """Frictional gradient [Pa/m] of a settling slurry in a pipe inclined ``inclination``
    degrees from horizontal, by the named method (Worster & Denny: excess × cos θ).

    Excludes the static weight of the column (ρ_m·g·sin θ).

    Examples
    --------
    >>> s = Solids(2600.0, 0.12, 150e-6, 300e-6)
    >>> h = float(settling_gradient(2.0, 0.1016, s, Carrier.water()))
    >>> up = float(settling_gradient(2.0, 0.1016, s, Carrier.water(), inclination=60.0))
    >>> h > up
    True
    """
    check_choice("slurry gradient method", method, GRADIENT_NAMES)
    cos = math.cos(math.radians(float(check_range("inclination", inclination, -90.0, 90.0))))
    if method == "durand_condolios_1952":
        total = durand_gradient(v, d_pipe, solids, carrier, roughness)
        jf, _, _ = _carrier_parts(v, d_pipe, carrier, roughness)
        return jf + (total - jf) * cos
    r = four_component_gradient(v, d_pipe, solids, carrier, roughness)
    return r.fluid + (r.heterogeneous + r.stratified) * cos
