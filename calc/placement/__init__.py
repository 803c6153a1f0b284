"""Cement placement: the fluid train, the placement timeline with free fall, displacement
checks (calc/METHODS.md §24)."""

from calc.placement.checks import (
    DisplacementCheck,
    contact_time,
    density_hierarchy,
    friction_hierarchy,
)
from calc.placement.simulate import (
    PLACEMENT_POINT_ROLES,
    PlacementPoint,
    PlacementTimeline,
    PumpStage,
    Tightest,
    simulate_placement,
)
from calc.placement.train import (
    FLUID_ROLES,
    FluidTrain,
    PlacementFluid,
    PlacementGeometry,
    liner_job_geometry,
    train_hydrostatic,
)

__all__ = [
    "FLUID_ROLES",
    "PLACEMENT_POINT_ROLES",
    "DisplacementCheck",
    "FluidTrain",
    "PlacementFluid",
    "PlacementGeometry",
    "PlacementPoint",
    "PlacementTimeline",
    "PumpStage",
    "Tightest",
    "contact_time",
    "density_hierarchy",
    "friction_hierarchy",
    "liner_job_geometry",
    "simulate_placement",
    "train_hydrostatic",
]
