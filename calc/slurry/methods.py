"""The registry of settling-slurry methods (deposition velocity, gradient, homogeneous turbulence).

Entries are registered beside their code in the sibling modules; this module only holds the
table so that every module can add to it without import circles.
"""

from __future__ import annotations

from calc.registry import MethodRegistry

__all__ = ["DEPOSITION_NAMES", "GRADIENT_NAMES", "SLURRY_METHODS"]

SLURRY_METHODS = MethodRegistry("settling-slurry method")

#: the deposition-velocity methods (names in :data:`SLURRY_METHODS`)
DEPOSITION_NAMES = ("durand_1952_deposition", "wilson_1979_deposition")
#: the settling-slurry gradient methods a line may name
GRADIENT_NAMES = ("four_component_2006", "durand_condolios_1952")
