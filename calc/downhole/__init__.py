"""Downhole temperature and mud density at temperature and pressure (calc/METHODS.md §20).

``temperature``: static geotherm (gradient or table) and the steady circulating model of
Holmes & Swift (1970); ``density``: water (IAPWS-IF97), brines, oil bases and the
compositional mud; ``profile``: the conditions object and ESD/ECD from the local density
integrated down the well.
"""

from calc.downhole.density import (
    BASE_FLUIDS,
    DENSITY_MODELS,
    MudComposition,
    base_fluid_ratio,
    diesel_density,
    mud_density,
    water_density,
)
from calc.downhole.profile import (
    CirculatingInputs,
    DownholeConditions,
    DownholeProfile,
    column_pressure,
    downhole_profile,
)
from calc.downhole.temperature import (
    CirculatingTemperature,
    TemperatureTable,
    circulating_temperature,
    static_temperature,
)

__all__ = [
    "BASE_FLUIDS",
    "DENSITY_MODELS",
    "CirculatingInputs",
    "CirculatingTemperature",
    "DownholeConditions",
    "DownholeProfile",
    "MudComposition",
    "TemperatureTable",
    "base_fluid_ratio",
    "circulating_temperature",
    "column_pressure",
    "diesel_density",
    "downhole_profile",
    "mud_density",
    "static_temperature",
    "water_density",
]
