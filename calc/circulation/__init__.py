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
* :func:`ecd_band` → :class:`EcdBand` (:class:`QuantityBand` per quantity, :class:`InputEffect`
  per input): the input-uncertainty band on ECD and SPP and the method spread
  (:mod:`~calc.circulation.band`, calc/METHODS.md §18);
* hydrostatics: :func:`hydrostatic_pressure`, :func:`equivalent_density`,
  :func:`equivalent_circulating_density`, :func:`gravity_for`.
"""

from calc.circulation.band import (
    BALANCE_RESOLUTION,
    BALANCE_RESOLUTION_PRESSURISED,
    BAND_INPUTS,
    DIAL_RESOLUTION,
    RATE_UNCERTAINTY,
    SPREAD_METHODS,
    EcdBand,
    InputEffect,
    QuantityBand,
    annulus_ecd_band,
    check_band_inputs,
    ecd_band,
)
from calc.circulation.calibration import (
    CALIBRATION_LABEL,
    FrictionCalibration,
    TwoPartCalibration,
    calibrate_friction,
    calibrate_two_part,
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
    "BALANCE_RESOLUTION",
    "BALANCE_RESOLUTION_PRESSURISED",
    "BAND_INPUTS",
    "BREAKDOWN_KEYS",
    "CALIBRATION_LABEL",
    "DIAL_RESOLUTION",
    "RATE_UNCERTAINTY",
    "SPREAD_METHODS",
    "CheckPoint",
    "CirculationResult",
    "EcdBand",
    "FrictionCalibration",
    "HydraulicsFluid",
    "InputEffect",
    "LoopContext",
    "MarginTable",
    "Margins",
    "PathLosses",
    "PressureWindow",
    "Profile",
    "QuantityBand",
    "TightestPoint",
    "ToolLosses",
    "TwoPartCalibration",
    "WeakPoint",
    "annulus_ecd_band",
    "calibrate_friction",
    "calibrate_two_part",
    "check_band_inputs",
    "circulate",
    "ecd_band",
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
