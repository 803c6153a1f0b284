"""Worksheet functions: settling slurries in a pipe (over :mod:`calc.slurry`).

Arguments: solids (density, concentration, sizes) → geometry (pipe ID) → rate → options
(roughness, inclination, carrier density, method) → units.  The carrier is water (its density
adjustable); calc/METHODS.md §25.
"""

from typing import Any

import numpy as np

from addin.sheets import cells
from addin.sheets.framework import Cells, Num, Text, sheet_function
from calc.slurry import Carrier, Solids, deposition_velocities, settling_gradient
from calc.slurry.methods import DEPOSITION_NAMES, GRADIENT_NAMES

__all__ = ["BF_DEPOSIT_VEL", "BF_SLURRY_GRAD"]

FAMILY = "slurry"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_RHO_S = "Solids (grain) density (ppg in oilfield units; or with its unit, '2.6 sg')"
_CV = "Solids volume concentration (fraction, 0 to 0.6)"
_D50 = "Median particle size d50 (in; or with its unit, '0.15 mm')"
_D85 = "Particle size d85 (blank = d50; in, or with its unit)"
_D_PIPE = "Pipe inside diameter (in)"
_RATE = "Slurry flow rate (gpm); a range gives a range of results"
_WATER = "Density of the water carrier (blank = 998.2 kg/m³)"
_WATER_DENSITY = 998.2  # kg/m³, water at about 20 °C (IAPWS-95, rounded)


def _solids(rho_s, cv, d50, d85, uset):
    c = cells.number(cv, "solids volume concentration")
    d = cells.positive_number(d50, "d50", "diameter", uset)
    d_hi = cells.optional_number(d85, "d85", d, "diameter", uset)
    rho = cells.positive_number(rho_s, "solids density", "density", uset)
    return Solids(rho, c, d, d_hi)  # checks C_v in [0, PACKING_LIMIT], d50 ≥ 10 µm, d85 ≥ d50


def _carrier(carrier_density, uset):
    rho = cells.optional_number(carrier_density, "carrier density", _WATER_DENSITY, "density", uset)
    return Carrier.water(rho)


@sheet_function(FAMILY)
def BF_DEPOSIT_VEL(
    solids_density: Num(_RHO_S),
    concentration: Num(_CV),
    d50: Num(_D50),
    d_pipe: Num(_D_PIPE),
    carrier_density: Num(_WATER) = None,
    method: Text("durand_1952_deposition, wilson_1979_deposition or blank (the larger)") = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Deposition (limit) velocity of a settling slurry in a horizontal pipe (ft/min in
    oilfield units): Durand (1952) or the Wilson (1979) nomograph fit; blank gives the larger
    (calc/METHODS.md §25.3)."""
    uset = cells.unit_set(units)
    sol = _solids(solids_density, concentration, d50, None, uset)
    car = _carrier(carrier_density, uset)
    d = cells.positive_number(d_pipe, "pipe ID", "diameter", uset)
    names = DEPOSITION_NAMES
    if not cells.blank(method):
        names = (cells.text(method, "deposition method", choices=DEPOSITION_NAMES),)
    r = deposition_velocities(d, sol.d50, sol.density, car.density, sol.cv, methods=names)
    return uset.from_si(r.velocity, "velocity")


@sheet_function(FAMILY)
def BF_SLURRY_GRAD(
    solids_density: Num(_RHO_S),
    concentration: Num(_CV),
    d50: Num(_D50),
    d85: Num(_D85),
    d_pipe: Num(_D_PIPE),
    q: Cells(_RATE),
    roughness: Num("Absolute wall roughness (in; blank = 0.046 mm steel)") = None,
    inclination: Num("Inclination from horizontal (degrees, + uphill; blank = 0)") = None,
    carrier_density: Num(_WATER) = None,
    method: Text("four_component_2006 (blank) or durand_condolios_1952") = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Frictional pressure gradient of a settling slurry in water (psi/ft in oilfield units;
    without the static weight of the column): the four-component model or Durand-Condolios,
    the solids' excess × cos(inclination) (calc/METHODS.md §25.4)."""
    uset = cells.unit_set(units)
    sol = _solids(solids_density, concentration, d50, d85, uset)
    car = _carrier(carrier_density, uset)
    d = cells.positive_number(d_pipe, "pipe ID", "diameter", uset)
    rough = cells.optional_number(roughness, "roughness", 4.6e-5, "diameter", uset)
    cells.positive(rough, "roughness", "diameter", uset, allow_zero=True)
    inc = cells.optional_number(inclination, "inclination", 0.0)
    name = "four_component_2006"
    if not cells.blank(method):
        name = cells.text(method, "slurry gradient method", choices=GRADIENT_NAMES)
    qs = cells.flow_rates(q, uset)
    v = np.asarray(qs) / (np.pi * d**2 / 4.0)
    g = settling_gradient(v, d, sol, car, rough, inclination=inc, method=name)
    return uset.from_si(g, "pressure_gradient")
