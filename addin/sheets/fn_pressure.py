"""Worksheet functions: hydrostatic pressure, equivalent densities, ECD and its band
(over :mod:`calc.circulation`).

Argument order: fluid (density, readings) → geometry (TVD; annular intervals) → pressures or
rate → options (``hydrostatic``: ``"exact"`` g = 9.80665 m/s², or ``"0.052"`` for the rounded
field constant; method; resolutions) → units.  The TVD of BF_HYDROSTATIC, BF_EMW and BF_ECD
may be a range (a depth column); the result then has the same shape.
"""

from typing import Any

import numpy as np

from addin import text
from addin.sheets import cells
from addin.sheets.fn_rheology import viscometer
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc import circulation as cc
from calc.circulation.hydrostatics import HYDROSTATIC_OPTIONS
from calc.errors import InputError
from calc.hydraulics_method import HYDRAULICS_METHODS
from calc.placement import train_hydrostatic

__all__ = ["BF_ECD", "BF_ECD_BAND", "BF_EMW", "BF_HYDROSTATIC", "BF_TRAIN_HYDROSTATIC"]

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
def BF_TRAIN_HYDROSTATIC(
    tvd: Cells(_TVD),
    tops: Cells("TVD of the top of each fluid, shallowest first (ft in oilfield units)"),
    densities: Cells("Density of each fluid, same order (ppg in oilfield units)"),
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Hydrostatic pressure at a TVD under a stack of fluids, each from its top to the next
    top (a cement job's fluid train; psi in oilfield units).

    10 ppg from surface to 8,000 ft over 15 ppg to 10,000 ft:
    0.052 × (10 × 8,000 + 15 × 2,000) = 5,720 psi.

    >>> round(BF_TRAIN_HYDROSTATIC(10000.0, [[0.0, 8000.0]], [[10.0, 15.0]], "0.052"), 6)
    5720.0
    """
    uset = cells.unit_set(units)
    tvd_si = cells.positive_values(tvd, "tvd", "depth", uset, allow_zero=True)
    top_si = cells.numbers(tops, "tops", "depth", uset).ravel()
    rho_si = cells.numbers(densities, "densities", "density", uset).ravel()
    if top_si.size != rho_si.size:
        raise InputError(
            "tops and densities", f"{top_si.size} tops, {rho_si.size} densities", "one of each"
        )
    p = train_hydrostatic(tvd_si, top_si, rho_si, hydrostatic=_hydro(hydrostatic))
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


_READINGS = "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings"
_METHOD = "Hydraulics method (blank = 'api13d_2010_hb'); picks the fit and the friction law"
_BALANCE = "Mud-balance resolution (ppg; blank or 'standard' = 0.1, 'pressurised' = 0.05 ppg)"
_BALANCES = {"standard": cc.BALANCE_RESOLUTION, "pressurised": cc.BALANCE_RESOLUTION_PRESSURISED}


def _balance(value, uset) -> float:
    """A number (density unit of the call) or the words standard / pressurised."""
    cell = cells.as_grid(value)[0][0] if not cells.blank(value) else None
    if isinstance(cell, str) and cell.strip().lower().replace("z", "s") in _BALANCES:
        return _BALANCES[cell.strip().lower().replace("z", "s")]
    return cells.optional_number(
        value, "balance resolution", cc.BALANCE_RESOLUTION, "density", uset
    )


@sheet_function(FAMILY)
def BF_ECD_BAND(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Cells("Hole or casing inside diameter (in); a column, surface down to the depth"),
    d_pipe: Cells("Pipe outside diameter (in); a column beside d_hole"),
    length: Cells("Interval length (ft); a column beside d_hole"),
    tvd: Num("True vertical depth of the point (ft)"),
    q: Num("Flow rate (gpm), one value"),
    method: Text(_METHOD) = None,
    dial_resolution: Num("Dial-reading resolution, degrees (blank = 0.5; each reading)") = None,
    balance_resolution: Cells(_BALANCE) = None,
    rate_uncertainty: Num("Flow-rate uncertainty, fraction of rate (blank = 0.03)") = None,
    hydrostatic: Text(_HYDRO) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """ECD at a depth with its input-uncertainty band: one row ECD | ± band | dominant input.

    The ECD (ppg in oilfield units) from the annular intervals above the depth (the method's
    annulus fit and friction law), and the half-width of its band: each dial reading ±0.5°,
    the mud balance ±0.1 ppg and the rate ±3 % carried through by finite differences and
    combined in quadrature (calc/METHODS.md §18); the third cell names the input that
    dominates.  Clean mud, no cuttings.

    >>> r = [[600, 68], [300, 44], [200, 35], [100, 25], [6, 10], [3, 9]]
    >>> ecd, band, dominant = BF_ECD_BAND(11.2, r, 8.5, 5.0, 10000.0, 10000.0, 522.0)[0]
    >>> round(band, 3), dominant
    (0.1, 'mud balance')
    """
    uset = cells.unit_set(units)
    name = (
        None
        if cells.blank(method)
        else cells.text(method, "method", choices=HYDRAULICS_METHODS.names())
    )
    d2 = cells.positive_values(d_hole, "hole diameter", "diameter", uset)
    d1 = cells.positive_values(d_pipe, "pipe diameter", "diameter", uset)
    ln = cells.positive_values(length, "length", "length", uset, allow_zero=True)
    shape = cells.broadcast(d_hole=d2, d_pipe=d1, length=ln)
    band = cc.annulus_ecd_band(
        viscometer(readings),
        _density(density, uset),
        cells.positive_number(q, "flow rate", "flow_rate", uset),
        *(np.broadcast_to(a, shape).ravel() for a in (d2, d1, ln)),
        cells.positive_number(tvd, "tvd", "depth", uset),
        method=name,
        hydrostatic=_hydro(hydrostatic),
        dial_resolution=cells.optional_number(
            dial_resolution, "dial resolution", cc.DIAL_RESOLUTION
        ),
        balance_resolution=_balance(balance_resolution, uset),
        rate_uncertainty=cells.optional_number(
            rate_uncertainty, "rate uncertainty", cc.RATE_UNCERTAINTY
        ),
    )
    words = text.BAND_INPUT_WORDS.get(band.dominant, "none")
    return [
        [uset.from_si(band.nominal, "density"), uset.from_si(band.half_width, "density"), words]
    ]
