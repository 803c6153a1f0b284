"""Hole cleaning: cuttings slip velocity, transport per annular interval, indicators, verdicts.

Modules: :mod:`~calc.cleaning.slip` (slip-velocity correlations, :data:`SLIP_METHODS`),
:mod:`~calc.cleaning.transport` (annular velocity, transport ratio, concentration, loading),
:mod:`~calc.cleaning.indicators` (CCI, Larsen-Pilehvari-Azar, thresholds),
:mod:`~calc.cleaning.deviated` (Rubiandini, the deviated-hole method registry),
:mod:`~calc.cleaning.hole` (a whole well: per-interval table, minimum rates, loaded ECD).
All SI.
"""

from calc.cleaning.deviated import (
    DEVIATED_METHODS,
    RubiandiniResult,
    rubiandini_critical_velocity,
)
from calc.cleaning.hole import (
    CLEANING_METHODS,
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
    "CLEANING_METHODS",
    "DEVIATED_METHODS",
    "SLIP_METHODS",
    "VERDICTS",
    "CCIResult",
    "CleaningCriteria",
    "Cuttings",
    "HoleCleaningResult",
    "LarsenResult",
    "LoadedProfile",
    "RubiandiniResult",
    "SlipResult",
    "TransportResult",
    "annular_apparent_viscosity",
    "annular_transport",
    "annular_velocity",
    "carrying_capacity_index",
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
    "robinson_power_law",
    "rubiandini_critical_velocity",
    "slip_velocity",
]
