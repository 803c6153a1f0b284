"""Settling and non-settling slurries in pipes: deposition velocity, pressure gradient, and the
operating curve of a slurry line (calc/METHODS.md §25).

Modules: ``homogeneous`` (Wilson–Thomas turbulent friction of a Herschel-Bulkley carrier, the
carrier's gradient), ``settling`` (terminal velocity, size distribution), ``deposition``
(Durand and Wilson deposition velocities), ``gradient`` (Durand–Condolios and the
four-component model), ``curve`` (the operating curve of a line).
"""

from calc.slurry.curve import SlurryCurve, SlurryLine, operating_curve, volume_concentration
from calc.slurry.deposition import (
    DepositionResult,
    deposition_velocities,
    durand_deposition_velocity,
    durand_fl,
    wilson_deposition_velocity,
)
from calc.slurry.gradient import (
    durand_gradient,
    four_component_gradient,
    settling_gradient,
    size_fractions,
)
from calc.slurry.homogeneous import (
    carrier_gradient,
    wilson_thomas_area_ratio,
    wilson_thomas_wall_stress,
)
from calc.slurry.methods import SLURRY_METHODS
from calc.slurry.settling import Carrier, Solids, terminal_velocity

__all__ = [
    "SLURRY_METHODS",
    "Carrier",
    "DepositionResult",
    "SlurryCurve",
    "SlurryLine",
    "Solids",
    "carrier_gradient",
    "deposition_velocities",
    "durand_deposition_velocity",
    "durand_fl",
    "durand_gradient",
    "four_component_gradient",
    "operating_curve",
    "settling_gradient",
    "size_fractions",
    "terminal_velocity",
    "volume_concentration",
    "wilson_deposition_velocity",
    "wilson_thomas_area_ratio",
    "wilson_thomas_wall_stress",
]
