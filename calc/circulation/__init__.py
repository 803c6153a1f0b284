"""The circulating system: standpipe-pressure breakdown, ECD/ESD, margins, calibration.

Public API (SI throughout):

* :func:`circulate` → :class:`CirculationResult` (losses per flow path — :class:`PathLosses`
  for ``surface``, ``string``, ``annulus``, :class:`ToolLosses`, the bit's
  :class:`~calc.bit.BitHydraulics` — breakdown, BHP, ECD/ESD at any MD, profile, margins with
  the tightest point, pump power, notes); :class:`Profile`; :class:`LoopContext`;
* :class:`HydraulicsFluid`, :func:`hydraulics_fluid_from_readings` (fitted as a hydraulics
  method of :mod:`calc.hydraulics_method` says);
* :mod:`~calc.circulation.pore_fracture` (the pore/fracture window, not the operating window
  of flow rates): :class:`PressureWindow`, :class:`WeakPoint`, :class:`Margins`,
  :class:`CheckPoint`, :class:`MarginTable`, :class:`TightestPoint`, :func:`fracture_margin`,
  :func:`pore_margin`, :func:`margin_status`;
* :func:`calibrate_friction` → :class:`FrictionCalibration`; :func:`spp_deviation`,
  :func:`spp_deviation_percent`, :func:`ecd_deviation` (predicted − measured);
* hydrostatics: :func:`hydrostatic_pressure`, :func:`equivalent_density`,
  :func:`equivalent_circulating_density`, :func:`gravity_for`.
"""

from calc.circulation.calibration import (
    CALIBRATION_LABEL,
    FrictionCalibration,
    calibrate_friction,
    ecd_deviation,
    spp_deviation,
    spp_deviation_percent,
)
from calc.circulation.fluid import HydraulicsFluid, hydraulics_fluid_from_readings
from calc.circulation.hydrostatics import (
    equivalent_circulating_density,
    equivalent_density,
    gravity_for,
    hydrostatic_pressure,
)
from calc.circulation.loop import circulate
from calc.circulation.pore_fracture import (
    CheckPoint,
    Margins,
    MarginTable,
    PressureWindow,
    TightestPoint,
    WeakPoint,
    fracture_margin,
    margin_status,
    pore_margin,
    worst_status,
)
from calc.circulation.result import (
    BREAKDOWN_KEYS,
    CirculationResult,
    LoopContext,
    PathLosses,
    Profile,
    ToolLosses,
)

__all__ = [
    "BREAKDOWN_KEYS",
    "CALIBRATION_LABEL",
    "CheckPoint",
    "CirculationResult",
    "FrictionCalibration",
    "HydraulicsFluid",
    "LoopContext",
    "MarginTable",
    "Margins",
    "PathLosses",
    "PressureWindow",
    "Profile",
    "TightestPoint",
    "ToolLosses",
    "WeakPoint",
    "calibrate_friction",
    "circulate",
    "ecd_deviation",
    "equivalent_circulating_density",
    "equivalent_density",
    "fracture_margin",
    "gravity_for",
    "hydraulics_fluid_from_readings",
    "hydrostatic_pressure",
    "margin_status",
    "pore_margin",
    "spp_deviation",
    "spp_deviation_percent",
    "worst_status",
]
