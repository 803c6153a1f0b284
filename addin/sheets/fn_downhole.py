"""Worksheet functions: downhole temperature and mud density at temperature and pressure
(over :mod:`calc.downhole`; calc/METHODS.md §20).

Argument order: fluid (surface density, base fluid, composition) → conditions (temperature,
pressure) → options (reference temperature, aqueous phase) → units.
"""

from typing import Any

from addin.sheets import cells
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc import downhole as cd
from calc.errors import InputError

__all__ = ["BF_DENSITY_TP", "BF_TEMP_STATIC"]

FAMILY = "downhole"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"


def _composition(base, owr, solids, water_phase):
    base = cells.text(base, "base fluid", "water", choices=list(cd.BASE_FLUIDS))
    phase = cd.BASE_FLUIDS[base][0]
    s = cells.optional_number(solids, "solids", 0.0)
    if not 0.0 <= s < 100.0:
        raise InputError("solids", s, "0 to < 100 % by volume")
    if phase == "water":
        return cd.MudComposition(0.0, 1.0 - s / 100.0, s / 100.0, water_base=base)
    owr_v = cells.number(owr, "oil/water ratio")
    wp = cells.text(water_phase, "water phase", "water", choices=["water", "brine"])
    return cd.MudComposition.from_ratio(owr_v, s / 100.0, oil_base=base, water_base=wp)


@sheet_function(FAMILY)
def BF_DENSITY_TP(
    surface_density: Num("Mud weight at the surface (ppg in oilfield units)"),
    temperature: Cells("Temperature (°F in oilfield units); a range gives a range"),
    pressure: Cells("Gauge pressure (psi in oilfield units), same shape as the temperature"),
    base_fluid: Text("water (blank), brine, diesel, mineral_oil or synthetic") = None,
    oil_water_ratio: Num("Oil/water ratio, % oil of the liquid (oil bases only), 0–100") = None,
    solids: Num("Retort solids, % by volume (blank = 0)") = None,
    reference_temperature: Num("Temperature of the surface mud weight (blank = 70 °F)") = None,
    water_phase: Text("Aqueous phase of an oil mud: water (blank) or brine") = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Mud density at temperature and pressure by the compositional model (ppg in oilfield).

    Water and brine by IAPWS-IF97, diesel by Sorelle et al. (1982), mineral and synthetic bases
    by diesel's relative change; solids incompressible (calc/METHODS.md §20).

    >>> round(BF_DENSITY_TP(11.0, 70.0, 0.0, "water", None, 11.5), 6)
    11.0
    >>> round(BF_DENSITY_TP(11.0, 232.0, 6700.0, "mineral_oil", 80, 14), 2)
    10.65
    """
    uset = cells.unit_set(units)
    rho0 = cells.positive_number(surface_density, "surface density", "density", uset)
    t = cells.values(temperature, "temperature", "temperature", uset)
    p = cells.values(pressure, "pressure", "pressure", uset)
    cells.broadcast(temperature=t, pressure=p)
    # blank: 70 °F (294.26 K), a common surface reference (common practice)
    t0 = cells.optional_number(
        reference_temperature, "reference temperature", 294.26111111111111, "temperature", uset
    )
    comp = _composition(base_fluid, oil_water_ratio, solids, water_phase)
    return uset.from_si(cd.mud_density(rho0, comp, t, p, t0), "density")


@sheet_function(FAMILY)
def BF_TEMP_STATIC(
    tvd: Cells("True vertical depth (ft in oilfield units); a range gives a range"),
    surface_temperature: Num("Mean surface temperature (°F in oilfield units)"),
    gradient: Num("Geothermal gradient (°F/100ft in oilfield units), >= 0"),
    units: Cells(_UNITS) = None,
) -> Any:
    """Static formation temperature T = T_s + G·TVD (°F in oilfield units).

    >>> round(BF_TEMP_STATIC(10000.0, 70.0, 1.5), 6)
    220.0
    """
    uset = cells.unit_set(units)
    z = cells.positive_values(tvd, "tvd", "depth", uset, allow_zero=True)
    ts = cells.number(surface_temperature, "surface temperature", "temperature", uset)
    g = cells.number(gradient, "gradient", "temperature_gradient", uset)
    return uset.from_si(cd.static_temperature(z, ts, g), "temperature")
