"""The circulating system: standpipe-pressure breakdown, ECD/ESD, margins, calibration.

Public API (SI throughout):

* :func:`circulate` → :class:`CirculationResult` (breakdown, BHP, ECD/ESD at any MD, profile,
  margins with the tightest point, pump power, notes); :class:`Profile`;
* :class:`HydraulicsFluid`, :func:`hydraulics_fluid_from_readings` (fitted as a hydraulics
  method of :mod:`calc.hydraulics_method` says);
* :class:`PressureWindow`, :class:`WeakPoint`, :class:`Margins`, :class:`MarginTable`,
  :class:`TightestPoint`;
* :func:`calibrate_friction` → :class:`FrictionCalibration`;
* hydrostatics: :func:`hydrostatic_pressure`, :func:`equivalent_density`,
  :func:`equivalent_circulating_density`, :func:`gravity_for`.
"""

from calc.circulation.calibration import CALIBRATION_LABEL, FrictionCalibration, calibrate_friction
from calc.circulation.fluid import HydraulicsFluid, hydraulics_fluid_from_readings
from calc.circulation.hydrostatics import (
    equivalent_circulating_density,
    equivalent_density,
    gravity_for,
    hydrostatic_pressure,
)
from calc.circulation.loop import CirculationResult, Profile, circulate
from calc.circulation.pressure_window import (
    Margins,
    MarginTable,
    PressureWindow,
    TightestPoint,
    WeakPoint,
)

__all__ = [
    "CALIBRATION_LABEL",
    "CirculationResult",
    "FrictionCalibration",
    "HydraulicsFluid",
    "MarginTable",
    "Margins",
    "PressureWindow",
    "Profile",
    "TightestPoint",
    "WeakPoint",
    "calibrate_friction",
    "circulate",
    "equivalent_circulating_density",
    "equivalent_density",
    "gravity_for",
    "hydraulics_fluid_from_readings",
    "hydrostatic_pressure",
]
