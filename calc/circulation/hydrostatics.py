"""Hydrostatic pressure and equivalent densities (ESD, ECD) — the one place for these formulas.

A column of fluid of density ρ over a true vertical depth h exerts

.. math:: p = \\rho\\, g\\, h

and a pressure ``p`` at TVD ``h`` is expressed as an equivalent mud weight (EMW)
:math:`\\rho_{eq} = p / (g h)`.  The equivalent circulating density adds the annular friction
above the depth and any surface back-pressure :math:`p_s` to the static column:

.. math:: \\mathrm{ECD} = \\rho + \\frac{\\Delta p_{ann} + p_s}{g\\, h}

Two values of *g* are offered (``hydrostatic=``):

``"exact"`` (default)
    :math:`g = g_n = 9.80665` m/s² (CGPM 1901), i.e. the field constant
    12/231 = 0.0519481 psi/ft per ppg (calc/METHODS.md §0.4, derived from lbf = lb·gₙ and
    US gal = 231 in³).
``"0.052"``
    the rounded field constant 0.052 psi/ft per ppg (common practice), i.e.
    :math:`g = g_n \\times 0.052 \\times 231/12` ≈ 9.8165 m/s² — 0.1 % higher, to reproduce
    hand calculations.

Both ESD and ECD use the same *g* as the hydrostatic pressure, so an EMW converts back to the
same pressure in either convention.
"""

from __future__ import annotations

from calc.errors import check_choice, check_finite, check_positive
from calc.numeric import float_or_array
from calc.units import G_N

__all__ = [
    "FIELD_HYDROSTATIC_CONSTANT",
    "HYDROSTATIC_OPTIONS",
    "equivalent_circulating_density",
    "equivalent_density",
    "gravity_for",
    "hydrostatic_pressure",
]

#: The rounded oilfield hydrostatic constant [psi/ft per ppg] (common practice; exact 12/231).
FIELD_HYDROSTATIC_CONSTANT = 0.052

#: Exact oilfield hydrostatic constant 12/231 psi/ft per ppg (calc/METHODS.md §0.4:
#: lbf = lb·gₙ, gal = 231 in³, 12 in/ft).
_EXACT_FIELD_CONSTANT = 12.0 / 231.0

#: ``hydrostatic=`` option → gravitational acceleration used for columns and EMWs [m/s²].
HYDROSTATIC_OPTIONS: dict[str, float] = {
    "exact": G_N,
    "0.052": G_N * FIELD_HYDROSTATIC_CONSTANT / _EXACT_FIELD_CONSTANT,
}


def gravity_for(hydrostatic: str = "exact") -> float:
    """Gravitational acceleration [m/s²] used by the ``hydrostatic`` convention.

    Parameters
    ----------
    hydrostatic : {"exact", "0.052"}
        ``"exact"``: gₙ; ``"0.052"``: the value that makes ρ·g·h equal 0.052·ρ[ppg]·h[ft] psi.

    Examples
    --------
    >>> round(gravity_for("exact"), 5)
    9.80665
    >>> round(gravity_for("0.052"), 4)
    9.8165
    """
    return HYDROSTATIC_OPTIONS[check_choice("hydrostatic", hydrostatic, HYDROSTATIC_OPTIONS)]


def hydrostatic_pressure(density, tvd, *, hydrostatic: str = "exact"):
    """Hydrostatic pressure of a fluid column, p = ρ·g·h [Pa].

    Parameters
    ----------
    density : float or array_like
        Fluid density ρ [kg/m³], > 0.
    tvd : float or array_like
        True vertical depth h [m], ≥ 0 (finite).
    hydrostatic : {"exact", "0.052"}
        Which *g* (module docstring).

    Returns
    -------
    float or ndarray
        Pressure [Pa], broadcast over the inputs.

    Notes
    -----
    Constant density over the column (no compressibility or temperature expansion).

    References
    ----------
    Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied Drilling
    Engineering*, SPE Textbook Series 2, ch. 4 (hydrostatic pressure, 0.052 constant).

    Examples
    --------
    >>> round(hydrostatic_pressure(1000.0, 10.0), 3)
    98066.5
    """
    rho = check_positive("density", density, "kg/m³")
    h = check_finite("tvd", tvd, "m")
    return float_or_array(rho * gravity_for(hydrostatic) * h)


def equivalent_density(pressure, tvd, *, hydrostatic: str = "exact"):
    """Equivalent mud weight of a pressure at a depth, ρ_eq = p/(g·h) [kg/m³].

    Parameters
    ----------
    pressure : float or array_like
        Pressure [Pa] (gauge, relative to the surface).
    tvd : float or array_like
        True vertical depth [m], > 0.
    hydrostatic : {"exact", "0.052"}
        Which *g* (module docstring).

    Examples
    --------
    >>> round(equivalent_density(98066.5, 10.0), 6)
    1000.0
    """
    p = check_finite("pressure", pressure, "Pa")
    h = check_positive("tvd", tvd, "m")
    return float_or_array(p / (gravity_for(hydrostatic) * h))


def equivalent_circulating_density(
    density, annular_loss, tvd, *, back_pressure=0.0, hydrostatic: str = "exact"
):
    """ECD = ρ + (Δp_ann + p_s)/(g·h) [kg/m³].

    Parameters
    ----------
    density : float or array_like
        Static fluid density ρ in the annulus [kg/m³], > 0.
    annular_loss : float or array_like
        Annular friction pressure loss between the surface and the depth, Δp_ann [Pa], ≥ 0.
    tvd : float or array_like
        True vertical depth of the point [m], > 0.
    back_pressure : float or array_like
        Surface annular back-pressure p_s [Pa] (0 for an open annulus).
    hydrostatic : {"exact", "0.052"}
        Which *g* (module docstring).

    Notes
    -----
    Field form ECD = ρ + ΣΔp_ann/(0.052·TVD) (ppg, psi, ft; calc/METHODS.md §9.3) is this equation
    with the ``"0.052"`` convention.

    References
    ----------
    API RP 13D, *Rheology and Hydraulics of Oil-well Drilling Fluids*, 6th ed. (2010),
    section on equivalent circulating density (from memory, not yet checked against the source —
    calc/METHODS.md §9.3).

    Examples
    --------
    >>> round(equivalent_circulating_density(1000.0, 9806.65, 10.0), 6)
    1100.0
    """
    rho = check_positive("density", density, "kg/m³")
    dp = check_finite("annular_loss", annular_loss, "Pa")
    h = check_positive("tvd", tvd, "m")
    ps = check_finite("back_pressure", back_pressure, "Pa")
    return float_or_array(rho + (dp + ps) / (gravity_for(hydrostatic) * h))
