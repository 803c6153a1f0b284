"""Worksheet functions: annular velocity and hole cleaning (over :mod:`calc.cleaning`).

Argument order: fluid (density, readings) → cuttings (size, density) → geometry (hole or
casing ID, pipe OD, bit size) → rates (flow rate, ROP) → options (slip method, hydraulics
fit) → units.  The mud model in the annulus is the one the hydraulics method uses there
(:func:`calc.circulation.hydraulics_fluid_from_readings`; blank = API RP 13D 2010 HB).
"""

from typing import Any

import numpy as np

from addin import text
from addin.sheets import cells
from addin.sheets.fn_rheology import viscometer
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc import circulation as cc
from calc.cleaning.hole import CLEANING_METHODS, USES_ROTATION, annulus_cleaning_rates
from calc.cleaning.indicators import carrying_capacity_index
from calc.cleaning.slip import SLIP_METHODS
from calc.cleaning.transport import Cuttings, annular_transport, annular_velocity
from calc.errors import InputError
from calc.hydraulics_method import HYDRAULICS_METHODS

__all__ = [
    "BF_ANN_VEL",
    "BF_CCI",
    "BF_CLEANING_RATE",
    "BF_CUTTINGS_CONC",
    "BF_SLIP",
    "BF_TRANSPORT",
    "BF_TRANSPORT_RATIO",
]

FAMILY = "cleaning"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_DENSITY = "Mud density (ppg in oilfield units; or with its unit, '1.32 sg')"
_READINGS = "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings"
_D_HOLE = "Hole or casing inner diameter (in)"
_D_PIPE = "Pipe outer diameter (in)"
_RATE = "Flow rate (gpm); a range gives a range of results"
_CUT_SIZE = "Cuttings equivalent diameter (in)"
_CUT_DENSITY = "Cuttings density (ppg; e.g. '2.6 sg')"
_SLIP = "Slip-velocity method: 'moore' (blank), 'chien', 'walker_mayes', 'api13d', 'drag_balance'"
_HYD = "Hydraulics method whose annulus fit describes the mud (blank = 'api13d_2010_hb')"


def annulus_fluid(density, readings, hydraulics_method, uset):
    """(density [kg/m³], τy, K, n) of the mud in the annulus for a hydraulics method."""
    rho = cells.positive_number(density, "density", "density", uset)
    r = viscometer(readings)
    if cells.blank(hydraulics_method):
        fluid = cc.hydraulics_fluid_from_readings(r, density=rho)
    else:
        name = cells.text(
            hydraulics_method, "hydraulics method", choices=HYDRAULICS_METHODS.names()
        )
        fluid = cc.hydraulics_fluid_from_readings(r, name, density=rho)
    return (rho, *fluid.annulus_parameters)


def annulus(d_hole, d_pipe, uset):
    """Annulus diameters [m], checked: hole > pipe ≥ 0."""
    d2 = cells.positive_number(d_hole, "hole diameter", "diameter", uset)
    d1 = cells.number(d_pipe, "pipe diameter", "diameter", uset)
    cells.positive(d1, "pipe diameter", "diameter", uset, allow_zero=True)
    if d1 >= d2:
        raise InputError(
            "pipe diameter",
            round(uset.from_si(d1, "diameter"), 6),
            f"< hole diameter ({uset.from_si(d2, 'diameter'):g} {uset.label('diameter')})",
        )
    return d2, d1


def _slip_method(value) -> str | None:
    if cells.blank(value):
        return None
    return cells.text(value, "slip method", choices=SLIP_METHODS.names())


def _transport(
    density,
    readings,
    cuttings_size,
    cuttings_density,
    d_hole,
    d_pipe,
    bit_size,
    q,
    rop,
    slip_method,
    hydraulics_method,
    uset,
):
    rho, tau_y, k, n = annulus_fluid(density, readings, hydraulics_method, uset)
    cut = Cuttings(
        cells.number(cuttings_size, "cuttings size", "diameter", uset),
        cells.number(cuttings_density, "cuttings density", "density", uset),
    )
    d2, d1 = annulus(d_hole, d_pipe, uset)
    bit = d2 if bit_size is None else cells.number(bit_size, "bit size", "diameter", uset)
    rop_si = 0.0 if rop is None else cells.number(rop, "ROP", "rop", uset)
    kwargs = {"method": m} if (m := _slip_method(slip_method)) else {}
    return annular_transport(
        cells.flow_rates(q, uset),
        d2,
        d1,
        density=rho,
        k=k,
        tau_y=tau_y,
        n=n,
        cuttings=cut,
        rop=rop_si,
        bit_diameter=bit,
        **kwargs,
    )


@sheet_function(FAMILY)
def BF_ANN_VEL(
    d_hole: Num(_D_HOLE), d_pipe: Num(_D_PIPE), q: Cells(_RATE), units: Cells(_UNITS) = None
) -> Any:
    """Mean annular velocity 4Q/(π(D_hole² − D_pipe²)) (ft/min in oilfield units).

    >>> round(BF_ANN_VEL(8.5, 5.0, 500), 2)
    259.36
    """
    uset = cells.unit_set(units)
    d2, d1 = annulus(d_hole, d_pipe, uset)
    return uset.from_si(annular_velocity(cells.flow_rates(q, uset), d2, d1), "velocity")


@sheet_function(FAMILY)
def BF_SLIP(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    cuttings_density: Num(_CUT_DENSITY),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    q: Cells(_RATE),
    slip_method: Text(_SLIP) = None,
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Cuttings slip (settling) velocity in the annulus (ft/min in oilfield units)."""
    uset = cells.unit_set(units)
    res = _transport(
        density,
        readings,
        cuttings_size,
        cuttings_density,
        d_hole,
        d_pipe,
        None,
        q,
        None,
        slip_method,
        hydraulics_method,
        uset,
    )
    return uset.from_si(res.slip_velocity, "velocity")


@sheet_function(FAMILY)
def BF_TRANSPORT_RATIO(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    cuttings_density: Num(_CUT_DENSITY),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    q: Cells(_RATE),
    slip_method: Text(_SLIP) = None,
    hydraulics_method: Text(_HYD) = None,
) -> Any:
    """Transport ratio 1 − V_slip/V_annular (dimensionless; ≥ 0.5 is the usual minimum)."""
    res = _transport(
        density,
        readings,
        cuttings_size,
        cuttings_density,
        d_hole,
        d_pipe,
        None,
        q,
        None,
        slip_method,
        hydraulics_method,
        cells.unit_set(None),
    )
    return res.transport_ratio


@sheet_function(FAMILY)
def BF_CUTTINGS_CONC(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    cuttings_density: Num(_CUT_DENSITY),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    bit_size: Num("Bit diameter (in)"),
    q: Cells(_RATE),
    rop: Num("Rate of penetration (ft/h)"),
    slip_method: Text(_SLIP) = None,
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """In-situ cuttings concentration in the annulus, volume fraction (format the cell as %)."""
    uset = cells.unit_set(units)
    res = _transport(
        density,
        readings,
        cuttings_size,
        cuttings_density,
        d_hole,
        d_pipe,
        bit_size,
        q,
        rop,
        slip_method,
        hydraulics_method,
        uset,
    )
    return res.concentration


@sheet_function(FAMILY)
def BF_TRANSPORT(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    cuttings_density: Num(_CUT_DENSITY),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    bit_size: Num("Bit diameter (in)"),
    q: Num("Flow rate (gpm), one value"),
    rop: Num("Rate of penetration (ft/h)"),
    slip_method: Text(_SLIP) = None,
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """A spilled table of cuttings transport in one annular interval: velocities, transport
    ratio, cuttings rate and concentrations, loaded density, method and notes (header row).
    """
    uset = cells.unit_set(units)
    cells.number(q, "flow rate", "flow_rate", uset)  # one rate for a table
    res = _transport(
        density,
        readings,
        cuttings_size,
        cuttings_density,
        d_hole,
        d_pipe,
        bit_size,
        q,
        rop,
        slip_method,
        hydraulics_method,
        uset,
    )
    rows = [["quantity", "value", "unit"]]
    for label, value, kind in (
        ("annular velocity", res.annular_velocity, "velocity"),
        ("slip velocity", res.slip_velocity, "velocity"),
        ("net rise velocity", res.net_rise_velocity, "velocity"),
        ("transport ratio", res.transport_ratio, None),
        ("cuttings volume rate", res.cuttings_rate, "flow_rate"),
        ("feed concentration", res.feed_concentration, None),
        ("in-situ concentration", res.concentration, None),
        ("loaded mud density", res.loaded_density, "density"),
    ):
        v = float(np.asarray(value))
        rows.append([label, uset.from_si(v, kind) if kind else v, uset.label(kind) if kind else ""])
    rows.append(["method", res.method, ""])
    rows += [["note", text.note_line(n, uset), n.level] for n in res.notes]
    return rows


@sheet_function(FAMILY)
def BF_CCI(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    q: Cells(_RATE),
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Carrying capacity index ρ·AV·K/400,000 (Robinson; ≥ 1 good, ≤ 0.5 poor; below ~35°)."""
    uset = cells.unit_set(units)
    rho, tau_y, k, n = annulus_fluid(density, readings, hydraulics_method, uset)
    d2, d1 = annulus(d_hole, d_pipe, uset)
    va = annular_velocity(cells.flow_rates(q, uset), d2, d1)
    return carrying_capacity_index(va, density=rho, k=k, tau_y=tau_y, n=n).cci


@sheet_function(FAMILY)
def BF_CLEANING_RATE(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    cuttings_size: Num(_CUT_SIZE),
    cuttings_density: Num(_CUT_DENSITY),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    bit_size: Num("Bit diameter (in)"),
    inclination: Num("Hole inclination (degree, 0-180)"),
    rop: Num("Rate of penetration (ft/h), > 0"),
    rpm: Num("String rotary speed (rpm, 0-600; blank = 0, the most demanding)") = None,
    slip_method: Text(_SLIP) = None,
    hydraulics_method: Text(_HYD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Spilled table: minimum rate for 'adequate' cleaning of one annular interval at any
    inclination, per method (vertical criteria, Rubiandini, Larsen), rotary-speed use, and the
    governing rate.
    """
    uset = cells.unit_set(units)
    rho, tau_y, k, n = annulus_fluid(density, readings, hydraulics_method, uset)
    cut = Cuttings(
        cells.number(cuttings_size, "cuttings size", "diameter", uset),
        cells.number(cuttings_density, "cuttings density", "density", uset),
    )
    d2, d1 = annulus(d_hole, d_pipe, uset)
    bit = cells.number(bit_size, "bit size", "diameter", uset)
    kwargs = {"method": m} if (m := _slip_method(slip_method)) else {}
    res = annulus_cleaning_rates(
        d2, d1, cells.number(inclination, "inclination", None, uset), density=rho, k=k,
        tau_y=tau_y, n=n, cuttings=cut, rop=cells.number(rop, "ROP", "rop", uset),
        bit_diameter=bit, rpm=0.0 if cells.blank(rpm) else cells.number(rpm, "rotary speed"),
        **kwargs,
    )  # fmt: skip
    unit = uset.label("flow_rate")
    gov = str(res.governing[0])
    rows = [["method", "minimum rate", "unit", "uses rotary speed", "governs"]]
    for m in CLEANING_METHODS:
        q = float(res.rates[m][0])
        rows.append([m, uset.from_si(q, "flow_rate") if np.isfinite(q) else "not reached", unit,
                     "yes" if USES_ROTATION[m] else "no", "yes" if m == gov else ""])  # fmt: skip
    q = float(res.minimum[0])
    rows.append(["minimum (governing)", uset.from_si(q, "flow_rate") if np.isfinite(q) else
                 "not reached", unit, "", gov])  # fmt: skip
    return rows
