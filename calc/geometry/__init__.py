"""Well description: survey, hole sections, drill string, bit, surface lines, tool drops, and the
split of the circulating system into flow intervals.

SI inside (m, kg/m³, m³/s, Pa); angles in degrees.  Modules: :mod:`~calc.geometry.survey`
(minimum curvature), :mod:`~calc.geometry.hole`, :mod:`~calc.geometry.string`,
:mod:`~calc.geometry.surface`, :mod:`~calc.geometry.well` (flow intervals and depth grids).
:class:`~calc.bit.Bit` lives in :mod:`calc.bit` and is re-exported here.
"""

from calc.bit import Bit
from calc.geometry.hole import HOLE_KINDS, Hole, HoleSection
from calc.geometry.string import FILL, DrillString, StringComponent
from calc.geometry.surface import SurfaceLine, ToolPressureDrop
from calc.geometry.survey import Survey
from calc.geometry.well import DepthGrid, FlowIntervals, Well

__all__ = [
    "FILL",
    "HOLE_KINDS",
    "Bit",
    "DepthGrid",
    "DrillString",
    "FlowIntervals",
    "Hole",
    "HoleSection",
    "StringComponent",
    "SurfaceLine",
    "Survey",
    "ToolPressureDrop",
    "Well",
]
