"""Worksheet functions: rheology at another temperature and the finite-gap shear rate.

Over :mod:`calc.rheology.temperature` and :func:`calc.rheology.viscometer.krieger_shear_rate`
(calc/METHODS.md §21).  Readings ranges as in the rheology family; temperatures in the unit
system's temperature unit (°F in oilfield units).
"""

from typing import Any

from addin.sheets import cells
from addin.sheets.fn_rheology import fitted
from addin.sheets.framework import Cells, Text, sheet_function
from calc.rheology import STANDARD_GEOMETRY
from calc.rheology.temperature import fit_temperature_dependence
from calc.rheology.viscometer import krieger_shear_rate

__all__ = ["BF_PARAM_AT_T", "BF_SHEAR_RATE_KRIEGER"]

FAMILY = "rheology"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_READINGS = (
    "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings (600…3 rpm)"
)
_METHOD = "Viscometer fit, e.g. 'api13d_2010_hb', 'hb_least_squares' (blank), 'bingham_two_speed'"
_PARAMS = {"tau_y": ("tau_y", "stress"), "k": ("k", "consistency"), "n": ("n", None)}


@sheet_function(FAMILY)
def BF_SHEAR_RATE_KRIEGER(readings: Cells(_READINGS)) -> Any:
    """Finite-gap (Krieger) shear rate at the bob for each reading (1/s), standard rotor/bob.

    2Ω/[n'(1 − s^(−2/n'))] with n' = d ln θ/d ln N from the readings (calc/METHODS.md §21.2);
    one value per reading, slowest speed first.

    >>> [round(float(g[0]), 1) for g in BF_SHEAR_RATE_KRIEGER([[300, 20], [600, 28.2842712]])]
    [544.2, 1088.3]
    """
    speeds, dial = cells.readings(readings)
    order = speeds.argsort()
    return krieger_shear_rate(speeds[order], dial[order], STANDARD_GEOMETRY)[0]


@sheet_function(FAMILY)
def BF_PARAM_AT_T(
    readings_1: Cells(_READINGS),
    temperature_1: Cells("Cup temperature of the first readings"),
    readings_2: Cells(_READINGS),
    temperature_2: Cells("Cup temperature of the second readings"),
    temperature: Cells("Temperature to evaluate at"),
    parameter: Text("Model parameter: tau_y, k or n"),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """A model parameter at a temperature from the same mud read at two temperatures.

    Both readings are fitted by ``method``; K follows an Arrhenius law in temperature, τy and n
    straight lines, exact at the two temperatures (calc/METHODS.md §21.1).  τy in lbf/100ft², K
    in lbf·sⁿ/100ft² (oilfield units), n plain.

    >>> cool = [[600, 68], [300, 44], [200, 35], [100, 25], [6, 10], [3, 9]]
    >>> hot = [[600, 55], [300, 37], [200, 29], [100, 21], [6, 9], [3, 8]]
    >>> round(BF_PARAM_AT_T(cool, 120, hot, 150, 150, "n", "bingham_two_speed"), 6)
    1.0
    >>> round(BF_PARAM_AT_T(cool, 120, hot, 150, 135, "tau_y", "api13d_2010_hb"), 3)
    7.999
    """
    uset = cells.unit_set(units)
    key = cells.text(parameter, "parameter", choices=tuple(_PARAMS)).lower()
    name, kind = _PARAMS[key]
    t1 = cells.number(temperature_1, "temperature_1", "temperature", uset)
    t2 = cells.number(temperature_2, "temperature_2", "temperature", uset)
    t = cells.number(temperature, "temperature", "temperature", uset)
    m1, m2 = fitted(readings_1, method).model, fitted(readings_2, method).model
    dep = fit_temperature_dependence([m1, m2], [t1, t2])
    vals = dep.parameters_at(t)
    if key == "k":  # K of a Bingham fit is μp, of a Newtonian fit μ
        value = next(vals[n] for n in ("k", "mu_p", "mu") if n in vals)
    else:  # a power-law or Newtonian fit has τy = 0; Bingham and Newtonian n = 1
        value = vals.get(name, 0.0 if key == "tau_y" else 1.0)
    if kind is None:
        return float(value)
    return uset.from_si(float(value), kind)
