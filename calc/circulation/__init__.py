"""The circulating system: standpipe-pressure breakdown, ECD/ESD, margins, calibration."""

from calc.circulation.hydrostatics import (
    equivalent_circulating_density,
    equivalent_density,
    gravity_for,
    hydrostatic_pressure,
)
from calc.circulation.window import Margins, PressureWindow, WeakPoint

__all__ = [
    "Margins",
    "PressureWindow",
    "WeakPoint",
    "equivalent_circulating_density",
    "equivalent_density",
    "gravity_for",
    "hydrostatic_pressure",
]
