"""Worksheet functions: mud pumps (over :mod:`calc.pumps`).

Argument order as everywhere: geometry (liner, stroke) → efficiency → speed or rate →
options (pumps running, pump kind, rod) → units.  Liner, stroke and rod are diameters/lengths in the
unit system's diameter unit (in in oilfield units).  A stroke is one crank revolution; the
strokes per minute (spm) are those of each pump, every running pump at the same spm.
"""

from typing import Any

import numpy as np

from addin.sheets import cells
from addin.sheets.framework import Cells, Num, sheet_function
from calc import pumps as cp
from calc.errors import InputError

__all__ = ["BF_PUMP_OUTPUT", "BF_PUMP_RATE", "BF_PUMP_SPM"]

FAMILY = "pumps"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_LINER = "Liner (piston) diameter (in in oilfield units)"
_STROKE = "Stroke length (in in oilfield units)"
_EFF = "Volumetric efficiency, a fraction 0 < η ≤ 1 (blank = 1)"
_SPM = "Strokes per minute of each pump (0 to 250); a range gives a range of results"
_RATE = "Total flow rate (gpm in oilfield units); a range gives a range of results"
_PUMPS = "Number of identical pumps running (blank = 1)"
_KIND = "triplex (single-acting, blank) or duplex (double-acting)"
_ROD = "Piston-rod diameter for a duplex pump (blank = 0)"


def _displacement(liner, stroke, efficiency, pump_kind, rod, uset) -> float:
    d = cells.positive_number(liner, "pump liner", "diameter", uset)
    s = cells.positive_number(stroke, "pump stroke", "diameter", uset)
    eta = cells.optional_number(efficiency, "pump efficiency", 1.0)
    k = cells.text(pump_kind, "pump kind", "triplex", choices=tuple(cp.PUMP_KINDS))
    r = cells.optional_number(rod, "pump rod", 0.0, "diameter", uset)
    return float(cp.pump_displacement(d, s, eta, k, r))


def _count(pumps) -> float:
    n = cells.optional_number(pumps, "pumps running", 1.0)
    if not (n >= 1 and float(n).is_integer()):
        raise InputError("pumps running", n, "a whole number ≥ 1")
    return float(n)


@sheet_function(FAMILY)
def BF_PUMP_OUTPUT(
    liner: Num(_LINER),
    stroke: Num(_STROKE),
    efficiency: Num(_EFF) = None,
    pump_kind: Cells(_KIND) = None,
    rod: Num(_ROD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Volume one pump delivers per stroke (bbl in oilfield units).

    Triplex V = π/4·d²·L·3·η, duplex V = π/4·(2d² − rod²)·L·2·η (calc.pumps.pump_displacement;
    Bourgoyne et al. 1986, Applied Drilling Engineering §4.2).

    >>> round(BF_PUMP_OUTPUT(6.5, 12, 0.97), 5)
    0.11943
    """
    uset = cells.unit_set(units)
    return uset.from_si(_displacement(liner, stroke, efficiency, pump_kind, rod, uset), "volume")


@sheet_function(FAMILY)
def BF_PUMP_RATE(
    liner: Num(_LINER),
    stroke: Num(_STROKE),
    efficiency: Num(_EFF),
    spm: Cells(_SPM),
    pumps: Num(_PUMPS) = None,
    pump_kind: Cells(_KIND) = None,
    rod: Num(_ROD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Total flow rate of ``pumps`` identical pumps at ``spm`` strokes per minute each (gpm in
    oilfield units).

    Q = n·V·N/60 (calc.pumps.rate_from_spm).

    >>> round(BF_PUMP_RATE(6.5, 12, 0.97, 52, 2), 1)
    521.7
    """
    uset = cells.unit_set(units)
    v = _displacement(liner, stroke, efficiency, pump_kind, rod, uset)
    n = cells.values(spm, "pump speed (strokes per minute)")
    q = _count(pumps) * np.asarray(cp.rate_from_spm(v, n))
    return uset.from_si(q if np.ndim(q) else float(q), "flow_rate")


@sheet_function(FAMILY)
def BF_PUMP_SPM(
    liner: Num(_LINER),
    stroke: Num(_STROKE),
    efficiency: Num(_EFF),
    q: Cells(_RATE),
    pumps: Num(_PUMPS) = None,
    pump_kind: Cells(_KIND) = None,
    rod: Num(_ROD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Strokes per minute of each of ``pumps`` identical pumps giving the total rate ``q``.

    N = 60·Q/(n·V) (calc.pumps.spm_from_rate); above 250 spm is an error.

    >>> round(BF_PUMP_SPM(6.5, 12, 0.97, 522, 2), 2)
    52.04
    """
    uset = cells.unit_set(units)
    v = _displacement(liner, stroke, efficiency, pump_kind, rod, uset)
    n = cp.spm_from_rate(_count(pumps) * v, cells.flow_rates(q, uset))
    return n if np.ndim(n) else float(n)
