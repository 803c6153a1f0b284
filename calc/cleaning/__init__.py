"""Hole cleaning: cuttings slip velocity, transport per annular interval, indicators, verdicts.

Modules: :mod:`~calc.cleaning.slip` (slip-velocity correlations, :data:`SLIP_METHODS`),
:mod:`~calc.cleaning.transport` (annular velocity, transport ratio, concentration, loading),
:mod:`~calc.cleaning.indicators` (CCI, Larsen-Pilehvari-Azar, thresholds),
:mod:`~calc.cleaning.hole` (a whole well: per-interval table, minimum rates, loaded ECD),
:mod:`~calc.cleaning.bed` (stationary cuttings beds at high angle, circulation before a trip).
All SI.
"""

from calc.cleaning.bed import (
    BED_METHODS,
    BED_ONSET,
    CleanupCirculation,
    CuttingsBedResult,
    WellBeds,
    bed_geometry,
    bed_height,
    circulation_factor,
    cleanup_circulation,
    cuttings_bed,
    no_bed_rate,
    well_cuttings_beds,
)
from calc.cleaning.hole import (
    HoleCleaningResult,
    LoadedProfile,
    cuttings_ecd_increment,
    hole_cleaning,
    loaded_ecd_profile,
)
from calc.cleaning.indicators import (
    VERDICTS,
    CCIResult,
    CleaningCriteria,
    LarsenResult,
    carrying_capacity_index,
    larsen_critical_velocity,
    robinson_power_law,
)
from calc.cleaning.slip import (
    SLIP_METHODS,
    SlipResult,
    annular_apparent_viscosity,
    fang_drag,
    haider_levenspiel_drag,
    hb_apparent_viscosity,
    slip_velocity,
)
from calc.cleaning.transport import (
    Cuttings,
    TransportResult,
    annular_transport,
    annular_velocity,
    cuttings_volume_rate,
    in_situ_concentration,
    loaded_density,
)

__all__ = [
    "BED_METHODS",
    "BED_ONSET",
    "SLIP_METHODS",
    "VERDICTS",
    "CCIResult",
    "CleaningCriteria",
    "CleanupCirculation",
    "Cuttings",
    "CuttingsBedResult",
    "HoleCleaningResult",
    "LarsenResult",
    "LoadedProfile",
    "SlipResult",
    "TransportResult",
    "WellBeds",
    "annular_apparent_viscosity",
    "annular_transport",
    "annular_velocity",
    "bed_geometry",
    "bed_height",
    "carrying_capacity_index",
    "circulation_factor",
    "cleanup_circulation",
    "cuttings_bed",
    "cuttings_ecd_increment",
    "cuttings_volume_rate",
    "fang_drag",
    "haider_levenspiel_drag",
    "hb_apparent_viscosity",
    "hole_cleaning",
    "in_situ_concentration",
    "larsen_critical_velocity",
    "loaded_density",
    "loaded_ecd_profile",
    "no_bed_rate",
    "robinson_power_law",
    "slip_velocity",
    "well_cuttings_beds",
]
