"""Worksheet functions: bit hydraulics (over :mod:`calc.bit`).

Argument order as everywhere: fluid (density) → geometry (nozzles, bit size) → rate → options
(discharge coefficient) → units.  Nozzle sizes are always in 32nds of an inch, as the trade
designates them (a range of sizes, blank cells for unused ports, or text ``"3x12 3x11"``).
The flow rate may be a range; the result then has the same shape.
"""

from typing import Any

from addin import text
from addin.sheets import cells
from addin.sheets.framework import Cells, Num, sheet_function
from calc import bit as cb

__all__ = ["BF_BIT", "BF_BIT_DP", "BF_BIT_HHP", "BF_HSI", "BF_IMPACT", "BF_JET_VEL", "BF_TFA"]

FAMILY = "bit"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_DENSITY = "Mud density (ppg in oilfield units; or with its unit, '1.32 sg')"
_NOZZLES = "Nozzle sizes in 32nds of an inch: a range (blank = unused port) or text '3x12 3x11'"
_RATE = "Flow rate (gpm in oilfield units); a range gives a range of results"
_CD = "Nozzle discharge coefficient (blank = 0.95)"
_BIT_SIZE = "Bit diameter (in in oilfield units)"


def _tfa(nozzles) -> float:
    return cb.total_flow_area(cells.nozzle_sizes(nozzles))


def _cd(value) -> float:
    return cells.optional_number(value, "discharge coefficient", cb.DEFAULT_DISCHARGE_COEFFICIENT)


def _density(density, uset) -> float:
    return cells.positive_number(density, "density", "density", uset)


def _bit_drop(density, nozzles, q, discharge_coefficient, uset):
    """(flow rates [m³/s], bit pressure drop [Pa]) of the arguments every bit function shares."""
    rho, qv = _density(density, uset), cells.flow_rates(q, uset)
    return qv, cb.bit_pressure_drop(qv, rho, _tfa(nozzles), _cd(discharge_coefficient))


@sheet_function(FAMILY)
def BF_TFA(nozzles: Cells(_NOZZLES), units: Cells(_UNITS) = None) -> Any:
    """Total flow area of the bit nozzles (in² in oilfield units).

    TFA = Σ (π/4)·dᵢ², dᵢ the nozzle diameters (calc.bit.total_flow_area).

    >>> round(BF_TFA([[12, 12, 12, 11, 11, 11]]), 4)
    0.6098
    >>> round(BF_TFA("3x12 3x11"), 4)
    0.6098
    """
    uset = cells.unit_set(units)
    return uset.from_si(_tfa(nozzles), "area")


@sheet_function(FAMILY)
def BF_JET_VEL(nozzles: Cells(_NOZZLES), q: Cells(_RATE), units: Cells(_UNITS) = None) -> Any:
    """Mean nozzle (jet) velocity v = Q/TFA (ft/s in oilfield units).

    >>> round(BF_JET_VEL("3x12 3x11", 522), 1)
    274.7
    """
    uset = cells.unit_set(units)
    v = cb.nozzle_velocity(cells.flow_rates(q, uset), _tfa(nozzles))
    return uset.from_si(v, "jet_velocity")


@sheet_function(FAMILY)
def BF_BIT_DP(
    density: Num(_DENSITY),
    nozzles: Cells(_NOZZLES),
    q: Cells(_RATE),
    discharge_coefficient: Num(_CD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Pressure drop across the bit nozzles ΔP = ρQ²/(2·Cd²·TFA²) (psi in oilfield units).

    >>> round(BF_BIT_DP(11.0, "3x12 3x11", 522), 1)
    742.3
    """
    uset = cells.unit_set(units)
    _, dp = _bit_drop(density, nozzles, q, discharge_coefficient, uset)
    return uset.from_si(dp, "pressure")


def _hydraulics(density, nozzles, bit_size, q, discharge_coefficient, uset):
    size = cells.number(bit_size, "bit size", "diameter", uset)
    sizes = cells.nozzle_sizes(nozzles)
    bit = cb.Bit(
        size=size,
        nozzles=sizes if isinstance(sizes, str) else tuple(sizes),
        discharge_coefficient=_cd(discharge_coefficient),
    )
    return cb.bit_hydraulics(cells.flow_rates(q, uset), _density(density, uset), bit)


@sheet_function(FAMILY)
def BF_BIT_HHP(
    density: Num(_DENSITY),
    nozzles: Cells(_NOZZLES),
    q: Cells(_RATE),
    discharge_coefficient: Num(_CD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Hydraulic power spent at the bit ΔP·Q (hp in oilfield units).

    >>> round(BF_BIT_HHP(11.0, "3x12 3x11", 522), 1)
    226.0
    """
    uset = cells.unit_set(units)
    qv, dp = _bit_drop(density, nozzles, q, discharge_coefficient, uset)
    return uset.from_si(cb.bit_hydraulic_power(qv, dp), "power")


@sheet_function(FAMILY)
def BF_HSI(
    density: Num(_DENSITY),
    nozzles: Cells(_NOZZLES),
    bit_size: Num(_BIT_SIZE),
    q: Cells(_RATE),
    discharge_coefficient: Num(_CD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Hydraulic power per square inch of bit face, HSI (hp/in² in oilfield units).

    >>> round(BF_HSI(11.0, "3x12 3x11", 8.5, 522), 2)
    3.98
    """
    uset = cells.unit_set(units)
    res = _hydraulics(density, nozzles, bit_size, q, discharge_coefficient, uset)
    return uset.from_si(res.hsi, "power_density")


@sheet_function(FAMILY)
def BF_IMPACT(
    density: Num(_DENSITY),
    nozzles: Cells(_NOZZLES),
    q: Cells(_RATE),
    discharge_coefficient: Num(_CD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Jet impact force Cd·Q·√(2ρΔP) (lbf in oilfield units).

    >>> round(BF_IMPACT(11.0, "3x12 3x11", 522), 0)
    817.0
    """
    uset = cells.unit_set(units)
    rho, qv = _density(density, uset), cells.flow_rates(q, uset)
    cd = _cd(discharge_coefficient)
    dp = cb.bit_pressure_drop(qv, rho, _tfa(nozzles), cd)
    return uset.from_si(cb.impact_force(qv, rho, dp, cd), "force")


@sheet_function(FAMILY)
def BF_BIT(
    density: Num(_DENSITY),
    nozzles: Cells(_NOZZLES),
    bit_size: Num(_BIT_SIZE),
    q: Num("Flow rate (gpm in oilfield units), one value"),
    discharge_coefficient: Num(_CD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """A spilled table of the bit hydraulics at one rate: TFA, jet velocity, pressure drop,
    hydraulic power, HSI, impact force, the method and any notes (header row).
    """
    uset = cells.unit_set(units)
    q_single = cells.number(q, "flow rate", "flow_rate", uset)  # one rate for a table
    res = _hydraulics(density, nozzles, bit_size, q, discharge_coefficient, uset)
    del q_single
    rows = [["quantity", "value", "unit"]]
    for label, value, kind in (
        ("TFA", res.tfa, "area"),
        ("jet velocity", res.nozzle_velocity, "jet_velocity"),
        ("bit pressure drop", res.pressure_drop, "pressure"),
        ("bit hydraulic power", res.hydraulic_power, "power"),
        ("HSI", res.hsi, "power_density"),
        ("impact force", res.impact_force, "force"),
    ):
        rows.append([label, uset.from_si(value, kind), uset.label(kind)])
    rows.append(["discharge coefficient", res.discharge_coefficient, ""])
    rows.append(["method", res.method, ""])
    rows += [["note", text.note_line(note, uset), note.level] for note in res.notes]
    return rows
