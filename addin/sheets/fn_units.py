"""Worksheet functions: unit conversion, unit labels, caution text (over :mod:`calc.units`)."""

from typing import Any

import numpy as np

import calc
from addin.sheets import cells
from addin.sheets.framework import Cells, Text, sheet_function
from calc import cautions
from calc import units as cu
from calc.errors import InputError

__all__ = ["BF_CAUTION", "BF_CONVERT", "BF_UNIT", "BF_UNITS", "BF_VERSION"]

FAMILY = "units"

_UNITS_DOC = (
    "Unit system 'oilfield' (default), 'metric' or 'si', optionally with overrides "
    "'kind=unit; …', or a two-column range of kind and unit"
)


@sheet_function(FAMILY)
def BF_CONVERT(
    value: Cells("Number, range of numbers, or a number with its unit such as '12.43 bbl/min'"),
    from_unit: Text("Unit of value, e.g. 'bbl/min' (an empty cell if value carries its unit)"),
    to_unit: Text("Unit wanted, e.g. 'gpm'"),
) -> Any:
    """Convert a value or a range of values between two units of the same dimension.

    A blank ``from_unit`` means the value carries its own unit.
    Oilfield spellings are understood (ppg, sg, bbl, bbl/min, gpm, lbf/100ft2, 32nds, cP, °F).
    A range gives a range of the same shape.

    Examples
    --------
    >>> BF_CONVERT(12.43, "bbl/min", "gpm")
    522.06
    >>> round(BF_CONVERT("2.6 sg", "", "ppg"), 4)
    21.6981
    """
    to_u = cells.text(to_unit, "to_unit")
    grid = cells.as_grid(value)
    single = len(grid) == 1 and len(grid[0]) == 1
    if cells.blank(from_unit):
        if not single:
            raise InputError("from_unit", None, "a unit when converting a range")
        si = cells.number(grid, "value", kind=_kind_of(to_u))
        return cu.from_si(si, to_u)
    from_u = cells.text(from_unit, "from_unit")
    out = cu.convert(cells.numbers(grid, "value"), from_u, to_u)
    return float(np.asarray(out).item()) if single else np.asarray(out)


def _kind_of(unit: str) -> str:
    """The quantity kind whose dimension matches ``unit`` (first match in :data:`KINDS`)."""
    dim = cu.ureg.Quantity(1.0, cu.parse_unit(unit)).dimensionality
    for kind, want in cu.KINDS.items():
        if want and dim == cu.ureg.get_dimensionality(want):
            return kind
    return "dimensionless"


@sheet_function(FAMILY)
def BF_UNIT(
    kind: Text("Quantity kind, e.g. 'pressure', 'density', 'flow_rate', 'stress'"),
    units: Cells(_UNITS_DOC) = None,
) -> Any:
    """The unit label used for a quantity kind in a unit system (for column headers).

    >>> BF_UNIT("stress")
    'lbf/100ft²'
    >>> BF_UNIT("pressure", "metric")
    'bar'
    """
    uset = cells.unit_set(units)
    k = cells.text(kind, "kind", choices=sorted(cu.KINDS))
    return uset.label(k)


@sheet_function(FAMILY)
def BF_UNITS(units: Cells(_UNITS_DOC) = None) -> Any:
    """A spilled table of every quantity kind and its unit in a unit system (header row).

    >>> BF_UNITS("si")[:2]
    [['quantity', 'unit'], ['depth', 'm']]
    """
    uset = cells.unit_set(units)
    return [["quantity", "unit"]] + [[k, uset.label(k)] for k in cu.UNIT_SYSTEMS["oilfield"]]


@sheet_function(FAMILY)
def BF_CAUTION() -> Any:
    """The one-line engineering caution for the top of a hydraulics sheet.

    >>> BF_CAUTION().startswith("Estimates only")
    True
    """
    return cautions.CELL


@sheet_function(FAMILY)
def BF_VERSION() -> Any:
    """The boreflow version that computed the sheet (for the audit trail).

    >>> BF_VERSION() == "boreflow " + calc.__version__
    True
    """
    return f"boreflow {calc.__version__}"
