"""Trip allowances and trip EMW: the surge/swab side of the hydrostatic conversions.

Both are thin forms of :mod:`calc.circulation.hydrostatics` (the one place of p = ρ·g·TVD and
ρ_eq = ρ + Δp/(g·TVD)), with the sign convention of surge (+, running in) and swab (−, pulling).
"""

from __future__ import annotations

from calc.circulation.hydrostatics import equivalent_circulating_density, hydrostatic_pressure
from calc.errors import check_choice, check_positive
from calc.numeric import scalar_or_array
from calc.surge.solver import DIRECTION_SIGN

__all__ = ["trip_allowance", "trip_emw"]


def trip_allowance(limit_emw, density, tvd, direction: str = "running", *, hydrostatic="exact"):
    """Pressure change a trip may cause at a depth before the EMW reaches its limit [Pa].

    .. math:: \\Delta p_{surge} = (\\rho_{lim} - \\rho)\\,g\\,TVD,\\qquad
              \\Delta p_{swab} = (\\rho - \\rho_{lim})\\,g\\,TVD

    Parameters
    ----------
    limit_emw : array_like
        Limit EMW [kg/m³]: fracture − margin when running in, pore + margin when pulling.
    density : array_like
        Static mud density [kg/m³].
    tvd : array_like
        True vertical depth of the point [m], > 0.
    direction : {"running", "pulling"}
    hydrostatic : {"exact", "0.052"}
        Which g (:func:`calc.circulation.hydrostatics.gravity_for`).

    Returns
    -------
    float or ndarray
        Signed allowance [Pa]: the limit column's hydrostatic pressure minus the static one
        (:func:`calc.circulation.hydrostatic_pressure`), swab sign reversed.

    Notes
    -----
    A negative allowance means the static mud already breaks the limit
    (calc/METHODS.md §11.6; field form from memory: ΔP_surge,max = 0.052·TVD(ρ_frac − ρ − margin)
    in field units).

    >>> round(trip_allowance(1100.0, 1000.0, 100.0), 1)  # 100 kg/m³ · g · 100 m
    98066.5
    """
    direction = check_choice("direction", direction, ("running", "pulling"))
    lim = check_positive("limit EMW", limit_emw, "kg/m³")
    rho = check_positive("mud density", density, "kg/m³")
    h = check_positive("tvd", tvd, "m")
    p_lim = hydrostatic_pressure(lim, h, hydrostatic=hydrostatic)
    p_static = hydrostatic_pressure(rho, h, hydrostatic=hydrostatic)
    return scalar_or_array(DIRECTION_SIGN[direction] * (p_lim - p_static))


def trip_emw(density, pressure_change, tvd, *, hydrostatic: str = "exact"):
    """Equivalent mud weight while tripping, ρ + Δp/(g·TVD) [kg/m³] (Δp signed: + surge).

    Parameters
    ----------
    density : array_like
        Static mud density [kg/m³].
    pressure_change : array_like
        Signed surge (+) or swab (−) pressure change at the depth [Pa].
    tvd : array_like
        True vertical depth [m], > 0.
    hydrostatic : {"exact", "0.052"}
        Which g (:func:`calc.circulation.hydrostatics.gravity_for`).

    Notes
    -----
    The ECD formula of :func:`calc.circulation.equivalent_circulating_density` with the signed
    trip pressure change in place of the annular loss.

    >>> round(trip_emw(1000.0, -98066.5, 100.0), 6)
    900.0
    """
    rho = check_positive("mud density", density, "kg/m³")
    return scalar_or_array(
        equivalent_circulating_density(rho, pressure_change, tvd, hydrostatic=hydrostatic)
    )
