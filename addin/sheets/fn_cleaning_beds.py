"""Worksheet functions: stationary cuttings beds at high angle and circulation before a trip
(over :mod:`calc.cleaning.bed`).

Argument order as in :mod:`addin.sheets.fn_cleaning`: fluid (density, readings) → cuttings
(size) → geometry (hole or casing ID, pipe OD, inclination) → rates (flow rate, ROP) → options
(hydraulics method) → units.  Listed with the hole-cleaning family.
"""

from typing import Any

from addin.sheets import cells
from addin.sheets.fn_cleaning import annulus, annulus_fluid
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc.cleaning.bed import BED_ONSET, circulation_factor, cuttings_bed, no_bed_rate
from calc.errors import InputError

__all__ = ["BF_BED_AREA", "BF_BED_HEIGHT", "BF_BU_FACTOR", "BF_NO_BED_RATE"]

FAMILY = "cleaning"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_DENSITY = "Mud density (ppg in oilfield units; or with its unit, '1.32 sg')"
_READINGS = "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings"
_CUT_SIZE = "Cuttings equivalent diameter (in)"
_D_HOLE = "Hole or casing inner diameter (in)"
_D_PIPE = "Pipe outer diameter (in)"
_INC = "Inclination (degrees); a bed is considered from 35°"
_RATE = "Flow rate (gpm); a range gives a range of results"
_ROP = "Rate of penetration (ft/h)"
_HYD = "Hydraulics method whose annulus fit and friction law are used (blank = 'api13d_2010_hb')"


def _bed(density, readings, cuttings_size, d_hole, d_pipe, inclination, q, rop, method, uset):
    rho, tau_y, k, n = annulus_fluid(density, readings, method, uset)
    d2, d1 = annulus(d_hole, d_pipe, uset)
    return cuttings_bed(
        cells.flow_rates(q, uset),
        d2,
        d1,
        inclination=cells.number(inclination, "inclination"),
        rop=cells.positive_number(rop, "ROP", "rop", uset, allow_zero=True),
        density=rho,
        k=k,
        tau_y=tau_y,
        n=n,
        cuttings_size=cells.positive_number(cuttings_size, "cuttings size", "diameter", uset),
        method=None if cells.blank(method) else cells.text(method, "hydraulics method"),
    )


@sheet_function(FAMILY)
def BF_BED_HEIGHT(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    inclination: Num(_INC),
    q: Cells(_RATE),
    rop: Num(_ROP),
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Equilibrium height of a stationary cuttings bed on the low side (in in oilfield units;
    0 where no bed forms): the bed grows until the velocity over it reaches the
    Larsen-Pilehvari-Azar critical velocity (calc/METHODS.md §10.15)."""
    uset = cells.unit_set(units)
    r = _bed(density, readings, cuttings_size, d_hole, d_pipe, inclination, q, rop,
             hydraulics_method, uset)  # fmt: skip
    return uset.from_si(r.bed_height, "diameter")


@sheet_function(FAMILY)
def BF_BED_AREA(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    inclination: Num(_INC),
    q: Cells(_RATE),
    rop: Num(_ROP),
    hydraulics_method: Text(_HYD) = None,
) -> Any:
    """Fraction of the annulus filled by the equilibrium cuttings bed (0-1; format as %)."""
    r = _bed(density, readings, cuttings_size, d_hole, d_pipe, inclination, q, rop,
             hydraulics_method, cells.unit_set(None))  # fmt: skip
    return r.bed_fraction


@sheet_function(FAMILY)
def BF_NO_BED_RATE(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    inclination: Num(_INC),
    rop: Num(_ROP),
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Smallest flow rate at which no stationary cuttings bed forms (gpm in oilfield units;
    '#BF!' text below 35°, where no bed is considered)."""
    uset = cells.unit_set(units)
    rho, tau_y, k, n = annulus_fluid(density, readings, hydraulics_method, uset)
    d2, d1 = annulus(d_hole, d_pipe, uset)
    inc = cells.number(inclination, "inclination")
    q0 = no_bed_rate(
        d2,
        d1,
        inclination=inc,
        rop=cells.positive_number(rop, "ROP", "rop", uset, allow_zero=True),
        density=rho,
        k=k,
        tau_y=tau_y,
        n=n,
        cuttings_size=cells.positive_number(cuttings_size, "cuttings size", "diameter", uset),
        method=None
        if cells.blank(hydraulics_method)
        else cells.text(hydraulics_method, "hydraulics method"),
    )
    if q0 == float("inf") and inc < BED_ONSET:
        raise InputError("inclination", inc, f"≥ {BED_ONSET:g}° (no bed is considered below)")
    if q0 == float("inf"):
        raise InputError("no-bed rate", "above 0.2 m³/s", "a rate inside the search bracket")
    return uset.from_si(q0, "flow_rate")


@sheet_function(FAMILY)
def BF_BU_FACTOR(
    inclination: Cells("Inclination (degrees); a range gives a range"),
    d_hole: Num(_D_HOLE),
    units: Cells(_UNITS) = None,
) -> Any:
    """Bottoms-up multiplier before a trip for an inclination band and hole size (common
    practice, values from memory, not checked against a source; calc/METHODS.md §10.16)."""
    uset = cells.unit_set(units)
    inc = cells.numbers(inclination, "inclination")
    d2 = cells.positive_number(d_hole, "hole diameter", "diameter", uset)
    return circulation_factor(inc, d2)
