"""Worksheet functions: hydrostatic pressure, equivalent densities, ECD
(over :mod:`calc.circulation`).

Argument order: fluid (density) → geometry (TVD) → pressures → options (``hydrostatic``:
``"exact"`` g = 9.80665 m/s², or ``"0.052"`` for the rounded field constant) → units.  The TVD
may be a range (a depth column); the result then has the same shape.
"""

from typing import Any

from addin.sheets import cells
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc import circulation as cc
from calc.circulation.hydrostatics import HYDROSTATIC_OPTIONS

__all__ = ["BF_ECD", "BF_EMW", "BF_HYDROSTATIC"]

FAMILY = "pressure"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_DENSITY = "Mud density (ppg in oilfield units; or with its unit, '1.32 sg')"
_TVD = "True vertical depth (ft in oilfield units); a range gives a range of results"
_HYDRO = "'exact' (blank; g = 9.80665 m/s², 12/231 psi/ft per ppg) or '0.052' (hand-calc constant)"


def _hydro(value) -> str:
    return cells.text(value, "hydrostatic", "exact", choices=list(HYDROSTATIC_OPTIONS))


def _density(value, uset) -> float:
    return cells.positive_number(value, "density", "density", uset)


@sheet_function(FAMILY)
def BF_HYDROSTATIC(
    density: Num(_DENSITY),
    tvd: Cells(_TVD),
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Hydrostatic pressure of a mud column p = ρ·g·TVD (psi in oilfield units).

    >>> round(BF_HYDROSTATIC(10.0, 10000.0, "0.052"), 6)
    5200.0
    """
    uset = cells.unit_set(units)
    tvd_si = cells.positive_values(tvd, "tvd", "depth", uset, allow_zero=True)
    p = cc.hydrostatic_pressure(_density(density, uset), tvd_si, hydrostatic=_hydro(hydrostatic))
    return uset.from_si(p, "pressure")


@sheet_function(FAMILY)
def BF_EMW(
    pressure: Cells("Pressure at the depth, gauge (psi in oilfield units); may be a range"),
    tvd: Cells(_TVD),
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Equivalent mud weight of a pressure at a depth, p/(g·TVD) (ppg in oilfield units).

    Use it for ESD from a static pressure, or to express a PWD reading or a formation
    pressure as a density.

    >>> round(BF_EMW(5200.0, 10000.0, "0.052"), 6)
    10.0
    """
    uset = cells.unit_set(units)
    p = cells.values(pressure, "pressure", "pressure", uset)
    tvd_si = cells.positive_values(tvd, "tvd", "depth", uset)
    cells.broadcast(pressure=p, tvd=tvd_si)
    rho = cc.equivalent_density(p, tvd_si, hydrostatic=_hydro(hydrostatic))
    return uset.from_si(rho, "density")


@sheet_function(FAMILY)
def BF_ECD(
    density: Num(_DENSITY),
    tvd: Cells(_TVD),
    annular_loss: Cells("Annular friction loss from surface to the depth (psi); may be a range"),
    back_pressure: Num("Surface annular back-pressure (psi; blank = 0, open annulus)") = None,
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Equivalent circulating density ρ + (ΔP_annulus + p_back)/(g·TVD) (ppg in oilfield units).

    >>> round(BF_ECD(11.0, 10000.0, 312.0, None, "0.052"), 6)
    11.6
    """
    uset = cells.unit_set(units)
    tvd_si = cells.positive_values(tvd, "tvd", "depth", uset)
    loss = cells.values(annular_loss, "annular loss", "pressure", uset)
    cells.positive(loss, "annular loss", "pressure", uset, allow_zero=True)
    back = cells.optional_number(back_pressure, "back pressure", 0.0, "pressure", uset)
    cells.broadcast(tvd=tvd_si, annular_loss=loss)
    ecd = cc.equivalent_circulating_density(
        _density(density, uset),
        loss,
        tvd_si,
        back_pressure=back,
        hydrostatic=_hydro(hydrostatic),
    )
    return uset.from_si(ecd, "density")
