"""Rheology: viscometer readings, rheometer tables, models, fits and comparisons of checks.

Public API (all SI):

* readings — :class:`ViscometerReadings`, :class:`ViscometerGeometry`, :data:`STANDARD_GEOMETRY`,
  :class:`RheometerTable`, :func:`find_plateau`;
* models — :class:`Newtonian`, :class:`Bingham`, :class:`PowerLaw`, :class:`HerschelBulkley`,
  :class:`Cross`, :class:`CarreauYasuda`; ``model.parameters()`` gives SI values with kinds
  (the faces format them: ``addin.text.model``);
* fits — :func:`fit`, :func:`fit_all`, :func:`rank_fits`, :func:`methods_for`,
  :class:`FitResult`, :class:`FitQuality`, :class:`FitSet`, the viscometer fits
  :data:`VISCOMETER_FITS` and rheometer-table fits :data:`TABLE_FITS` (which fit a hydraulics
  method uses for pipe and annulus: :mod:`calc.hydraulics_method`);
* comparing checks — :func:`compare_checks`, :func:`compare_series`, :data:`DEFAULT_TOLERANCES`.
"""

from calc.rheology.compare import (
    DEFAULT_TOLERANCES,
    CheckComparison,
    ParameterChange,
    Tolerance,
    compare_checks,
    compare_series,
)
from calc.rheology.fitresult import (
    TABLE_FITS,
    VISCOMETER_FITS,
    FitQuality,
    FitResult,
    FitSet,
    Prediction,
    RankEntry,
)
from calc.rheology.fitting import fit, fit_all, methods_for, rank_fits
from calc.rheology.models import (
    Bingham,
    CarreauYasuda,
    Cross,
    HerschelBulkley,
    Model,
    Newtonian,
    PowerLaw,
)
from calc.rheology.table import Plateau, RheometerTable, find_plateau, shear_thinning_region
from calc.rheology.viscometer import (
    STANDARD_GEOMETRY,
    ViscometerGeometry,
    ViscometerReadings,
    couette_shear_rate_per_rpm,
    spring_stress_per_degree,
)

__all__ = [
    "DEFAULT_TOLERANCES",
    "STANDARD_GEOMETRY",
    "TABLE_FITS",
    "VISCOMETER_FITS",
    "Bingham",
    "CarreauYasuda",
    "CheckComparison",
    "Cross",
    "FitQuality",
    "FitResult",
    "FitSet",
    "HerschelBulkley",
    "Model",
    "Newtonian",
    "ParameterChange",
    "Plateau",
    "PowerLaw",
    "Prediction",
    "RankEntry",
    "RheometerTable",
    "Tolerance",
    "ViscometerGeometry",
    "ViscometerReadings",
    "compare_checks",
    "compare_series",
    "couette_shear_rate_per_rpm",
    "find_plateau",
    "fit",
    "fit_all",
    "methods_for",
    "rank_fits",
    "shear_thinning_region",
    "spring_stress_per_degree",
]
