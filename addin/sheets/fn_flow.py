"""Worksheet functions: pipe and annular pressure gradient, loss and critical rate.

Over :mod:`calc.flow`, with the fluid from
:func:`calc.circulation.hydraulics_fluid_from_readings`.

Argument order: fluid (density, readings) → geometry (diameters outer before inner, then the
interval length) → rate → options (``method``, eccentricity) → units.  The hydraulics
``method`` picks both the friction law and the rheology fit each path uses (blank =
``api13d_2010_hb``; ``api13d_1995_power_law`` uses 600/300 rpm in pipe and 100/3 rpm in the
annulus).  The flow rate may be a range: the result then has its shape.

The worksheet functions always use the exact field constants (derived from SI).  The printed,
rounded constants of API RP 13D (1995) (``constants="as_printed"``, calc/METHODS.md §7.9) are
available from Python (``resolve_method("api13d_1995_power_law", constants="as_printed")``),
the case file (``[case].constants``) and the command line (``--constants``), not here: a
worksheet argument for them would shift the position of ``units`` in existing formulas.
"""

from typing import Any

import numpy as np

from addin import text
from addin.sheets import cells
from addin.sheets.fn_cleaning import annulus
from addin.sheets.fn_rheology import viscometer
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc import circulation as cc
from calc import flow as cf
from calc.errors import check_range
from calc.flow.eccentricity import eccentricity_from_standoff
from calc.hydraulics_method import HYDRAULICS_METHODS, resolve_method

__all__ = [
    "BF_ANN_FLOW",
    "BF_ANN_GRAD",
    "BF_ANN_LOSS",
    "BF_CRIT_RATE",
    "BF_ECC_STANDOFF",
    "BF_PIPE_FLOW",
    "BF_PIPE_GRAD",
    "BF_PIPE_LOSS",
    "BF_ROT_FACTOR",
]

FAMILY = "flow"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_DENSITY = "Mud density (ppg in oilfield units; or with its unit, '1.32 sg')"
_READINGS = "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings"
_METHOD = (
    "Hydraulics method: 'api13d_2010_hb' (blank), 'api13d_1995_power_law', 'bingham', "
    "'bingham_darby_1992', 'power_law', 'newtonian', 'exact_laminar'"
)
_RATE = "Flow rate (gpm); a range gives a range of results"
_D_IN = "Pipe inside diameter (in)"
_D_HOLE = "Hole or casing inside diameter (in)"
_D_PIPE = "Pipe outside diameter (in)"
_LENGTH = "Interval length (ft)"
_ECC = "Eccentricity 0 (concentric, blank) to < 1"


def _method(value) -> str | None:
    if cells.blank(value):
        return None
    return cells.text(value, "method", choices=HYDRAULICS_METHODS.names())


def hydraulics_fluid(density, readings, method, uset):
    """(HydraulicsFluid, flow keywords) of a worksheet call: the readings fitted as the
    hydraulics ``method`` argument says (blank = the default), and ``method=`` its friction law
    for :mod:`calc.flow` (and :mod:`calc.surge`)."""
    rho = cells.positive_number(density, "density", "density", uset)
    preset = resolve_method(_method(method))
    fluid = cc.hydraulics_fluid_from_readings(viscometer(readings), preset, density=rho)
    return fluid, {"method": preset.friction}


def _pipe(density, readings, d_inner, q, method, uset) -> cf.FlowResult:
    fluid, kw = hydraulics_fluid(density, readings, method, uset)
    d = cells.positive_number(d_inner, "pipe inside diameter", "diameter", uset)
    tau_y, k, n = fluid.pipe_parameters
    qv = cells.flow_rates(q, uset)
    return cf.pipe_flow(qv, d, density=fluid.density, tau_y=tau_y, k=k, n=n, **kw)


def _annulus(density, readings, d_hole, d_pipe, q, method, eccentricity, uset) -> cf.FlowResult:
    fluid, kw = hydraulics_fluid(density, readings, method, uset)
    d2, d1 = annulus(d_hole, d_pipe, uset)
    e = cells.optional_number(eccentricity, "eccentricity", 0.0)
    tau_y, k, n = fluid.annulus_parameters
    return cf.annulus_flow(
        cells.flow_rates(q, uset), d2, d1, density=fluid.density, tau_y=tau_y, k=k, n=n,
        eccentricity=e, **kw,
    )  # fmt: skip


def _length(value, uset) -> float:
    return cells.positive_number(value, "length", "length", uset, allow_zero=True)


@sheet_function(FAMILY)
def BF_PIPE_GRAD(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_inner: Num(_D_IN),
    q: Cells(_RATE),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Frictional pressure gradient inside a pipe (psi/ft in oilfield units)."""
    uset = cells.unit_set(units)
    res = _pipe(density, readings, d_inner, q, method, uset)
    return uset.from_si(res.gradient, "pressure_gradient")


@sheet_function(FAMILY)
def BF_PIPE_LOSS(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_inner: Num(_D_IN),
    length: Num(_LENGTH),
    q: Cells(_RATE),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Frictional pressure loss over a pipe interval, gradient × length (psi in oilfield units)."""
    uset = cells.unit_set(units)
    res = _pipe(density, readings, d_inner, q, method, uset)
    return uset.from_si(np.asarray(res.gradient) * _length(length, uset), "pressure")


@sheet_function(FAMILY)
def BF_ANN_GRAD(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    q: Cells(_RATE),
    method: Text(_METHOD) = None,
    eccentricity: Num(_ECC) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Frictional pressure gradient in an annulus (psi/ft in oilfield units)."""
    uset = cells.unit_set(units)
    res = _annulus(density, readings, d_hole, d_pipe, q, method, eccentricity, uset)
    return uset.from_si(res.gradient, "pressure_gradient")


@sheet_function(FAMILY)
def BF_ANN_LOSS(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    length: Num(_LENGTH),
    q: Cells(_RATE),
    method: Text(_METHOD) = None,
    eccentricity: Num(_ECC) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Frictional pressure loss over an annular interval, gradient × length (psi)."""
    uset = cells.unit_set(units)
    res = _annulus(density, readings, d_hole, d_pipe, q, method, eccentricity, uset)
    return uset.from_si(np.asarray(res.gradient) * _length(length, uset), "pressure")


@sheet_function(FAMILY)
def BF_CRIT_RATE(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_outer: Num("Pipe inside diameter, or hole/casing inside diameter for an annulus (in)"),
    d_pipe: Num("Pipe outside diameter for an annulus (in); blank for flow inside a pipe") = None,
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Flow rate at which laminar flow ends, by the method's Reynolds number (gpm)."""
    uset = cells.unit_set(units)
    fluid, kw = hydraulics_fluid(density, readings, method, uset)
    if cells.blank(cells.as_grid(d_pipe)[0][0]):
        d = cells.positive_number(d_outer, "pipe inside diameter", "diameter", uset)
        tau_y, k, n = fluid.pipe_parameters
        qc = cf.critical_flow_rate(d, density=fluid.density, tau_y=tau_y, k=k, n=n, **kw)
    else:
        d2, d1 = annulus(d_outer, d_pipe, uset)
        tau_y, k, n = fluid.annulus_parameters
        qc = cf.critical_flow_rate(d2, d1, density=fluid.density, tau_y=tau_y, k=k, n=n, **kw)
    return uset.from_si(qc, "flow_rate")


def _flow_table(res: cf.FlowResult, uset) -> list[list]:
    rows = [["quantity", "value", "unit"]]
    for label, value, kind in (
        ("mean velocity", res.velocity, "velocity"),
        ("hydraulic diameter", res.hydraulic_diameter, "diameter"),
        ("wall shear rate", res.wall_shear_rate, None),
        ("wall shear stress", res.wall_shear_stress, "stress"),
        ("Reynolds number", res.reynolds, None),
        ("laminar limit (Re)", res.reynolds_laminar_limit, None),
        ("turbulent limit (Re)", res.reynolds_turbulent_limit, None),
        ("Fanning friction factor", res.friction_factor, None),
        ("pressure gradient", res.gradient, "pressure_gradient"),
        ("critical velocity", res.critical_velocity, "velocity"),
        ("critical flow rate", res.critical_flow_rate, "flow_rate"),
    ):
        v = float(np.asarray(value))
        unit = "1/s" if label == "wall shear rate" else ""
        rows.append(
            [label, uset.from_si(v, kind) if kind else v, uset.label(kind) if kind else unit]
        )
    rows.append(["regime", str(res.regime_label), ""])
    rows.append(["method", res.method_label, ""])
    rows += [["note", text.note_line(n, uset), n.level] for n in res.notes]
    return rows


@sheet_function(FAMILY)
def BF_PIPE_FLOW(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_inner: Num(_D_IN),
    q: Num("Flow rate (gpm), one value"),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """A spilled table of pipe flow for a hand check: velocity, wall shear, Reynolds number
    and limits, regime, friction factor, gradient, critical rate, method, notes (header row).
    """
    uset = cells.unit_set(units)
    cells.number(q, "flow rate", "flow_rate", uset)  # one rate for a table
    return _flow_table(_pipe(density, readings, d_inner, q, method, uset), uset)


@sheet_function(FAMILY)
def BF_ANN_FLOW(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    q: Num("Flow rate (gpm), one value"),
    method: Text(_METHOD) = None,
    eccentricity: Num(_ECC) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """A spilled table of annular flow for a hand check: velocity, wall shear, Reynolds
    number and limits, regime, friction factor, gradient, critical rate, method, notes.
    """
    uset = cells.unit_set(units)
    cells.number(q, "flow rate", "flow_rate", uset)  # one rate for a table
    res = _annulus(density, readings, d_hole, d_pipe, q, method, eccentricity, uset)
    return _flow_table(res, uset)


@sheet_function(FAMILY)
def BF_ROT_FACTOR(
    density: Num(_DENSITY),
    readings: Cells(_READINGS),
    d_hole: Num(_D_HOLE),
    d_pipe: Num(_D_PIPE),
    q: Cells(_RATE),
    rpm: Num("String rotary speed (rpm), 0 to 600"),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Rotation factor on the annular friction gradient (rotating / not rotating, –).

    The laminar helical-flow factor of a power-law fluid in the annular gap, from the
    annulus fit's n and the ratio of the string's surface speed to the mean velocity; 1 for
    Newtonian and Bingham fluids and in turbulent flow.

    >>> round(BF_ROT_FACTOR(11, [[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]],
    ...                     8.5, 5.0, 300, 140), 3)
    0.99
    """
    uset = cells.unit_set(units)
    fluid, kw = hydraulics_fluid(density, readings, method, uset)
    d2, d1 = annulus(d_hole, d_pipe, uset)
    n_rpm = cells.number(rpm, "rpm")
    tau_y, k, n = fluid.annulus_parameters
    res = cf.annulus_flow(
        cells.flow_rates(q, uset), d2, d1, density=fluid.density, tau_y=tau_y, k=k, n=n,
        rpm=n_rpm, **kw,
    )  # fmt: skip
    return res.rotation_factor


@sheet_function(FAMILY)
def BF_ECC_STANDOFF(
    standoff: Num("Stand-off ratio 0 (on the wall) to 1 (centred)"),
    inclination: Num("Hole inclination (degrees from vertical), 0 to 180"),
) -> Any:
    """Eccentricity of a string held off the low side by its stand-off, (1 − s)·sin θ (–).

    Capped at 0.95, the upper end of the eccentricity correction's range.

    >>> round(BF_ECC_STANDOFF(0.5, 60), 3)
    0.433
    """
    s = cells.number(standoff, "stand-off")
    inc = float(check_range("inclination", cells.number(inclination, "inclination"), 0.0, 180.0,
                            "degree"))  # fmt: skip
    return float(eccentricity_from_standoff(s, np.radians(inc)))
