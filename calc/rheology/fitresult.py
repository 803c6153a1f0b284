"""Fit results, fit quality, ranking of candidate models, and the two fit-method registries.

Every fit returns a frozen :class:`FitResult`: the fitted model, the method name (with edition
where a standard is meant), its :class:`FitQuality` (residuals, RMSE, R² and the space they are
computed in), notes, the shear-rate range the fit rests on, and the intermediate numbers an
engineer checks by hand.

Quality spaces
--------------
* Viscometer readings: residuals in shear stress [Pa], unweighted (:data:`STRESS_SPACE`).  The
  dial's reading error is an absolute ±½ degree at every speed (common practice,
  calc/METHODS.md §16.1), so equal weights in stress are the least-squares choice for equal,
  independent reading errors; relative weights would hand the most weight to the least precise
  readings (3 and 6 rpm).
* Rheometer tables: residuals in log₁₀ stress, unweighted (:data:`LOG_SPACE`).  Tables span
  decades and rheometer error is roughly a fixed fraction of the torque; log residuals weight
  every decade alike.  Residuals in log τ equal residuals in log η (log τ − log η = log γ̇).

R² = 1 − SSE/SST in the same space.  Models are ranked by the residual standard error
s = √(SSE/(N − p)) (p fitted parameters), which penalises extra parameters; fits with no
residual degree of freedom (N ≤ p) rank last.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

import numpy as np

from calc.errors import check_finite
from calc.notes import Note
from calc.registry import MethodRegistry
from calc.rheology.models import Model
from calc.values import Value

__all__ = [
    "LOG_SPACE",
    "STRESS_SPACE",
    "TABLE_FITS",
    "VISCOMETER_FITS",
    "FitQuality",
    "FitResult",
    "FitSet",
    "Prediction",
    "RankEntry",
    "quality_of",
]

STRESS_SPACE = "shear stress [Pa], unweighted"
LOG_SPACE = "log10 shear stress (≡ log10 viscosity), unweighted"

#: Fit methods for viscometer readings (:class:`~calc.rheology.viscometer.ViscometerReadings`).
VISCOMETER_FITS = MethodRegistry("viscometer fit")
#: Fit methods for rheometer tables (:class:`~calc.rheology.table.RheometerTable`).
TABLE_FITS = MethodRegistry("rheometer-table fit")


@dataclass(frozen=True, eq=False)
class FitQuality:
    """Residuals (model − data) in ``space``, RMSE, R², point and parameter counts.

    Examples
    --------
    Residuals ±1 Pa at four points with two parameters: RMSE 1, standard error √(4/2):

    >>> q = FitQuality("stress", np.array([1.0, -1.0, 1.0, -1.0]), 1.0, 0.9, 4, 2)
    >>> round(q.std_error, 6)
    1.414214
    """

    space: str
    residuals: np.ndarray
    rmse: float
    r2: float
    n_points: int
    n_params: int

    @property
    def std_error(self) -> float | None:
        """Residual standard error √(SSE/(N − p)) in ``space``; None when N ≤ p."""
        dof = self.n_points - self.n_params
        if dof <= 0:
            return None
        return float(np.sqrt(np.sum(self.residuals**2) / dof))


def quality_of(model, shear_rate, stress, space: str, n_params: int) -> FitQuality:
    """Fit quality of ``model`` against measured (shear rate [1/s], stress [Pa]) points.

    Examples
    --------
    A model scored on its own stresses is perfect; 1 Pa too high everywhere gives RMSE 1 Pa:

    >>> from calc.rheology.models import Bingham
    >>> g = np.array([5.0, 170.0, 511.0, 1022.0])
    >>> m = Bingham(5.0, 0.02)
    >>> q = quality_of(m, g, m.stress(g), STRESS_SPACE, 2)
    >>> round(q.rmse, 12), q.r2
    (0.0, 1.0)
    >>> round(quality_of(m, g, m.stress(g) - 1.0, STRESS_SPACE, 2).rmse, 12)
    1.0
    """
    g = np.asarray(shear_rate, dtype=float)
    tau = np.asarray(stress, dtype=float)
    pred = np.asarray(model.stress(g), dtype=float)
    if space == LOG_SPACE:
        obs, fit = np.log10(tau), np.log10(pred)
    else:
        obs, fit = tau, pred
    res = fit - obs
    sse = float(np.sum(res**2))
    sst = float(np.sum((obs - obs.mean()) ** 2))
    if sst > 0:
        r2 = 1.0 - sse / sst
    else:
        r2 = 1.0 if sse == 0 else 0.0
    return FitQuality(space, res, float(np.sqrt(sse / g.size)), r2, int(g.size), int(n_params))


@dataclass(frozen=True, eq=False)
class Prediction:
    """Model output at requested shear rates, with any out-of-range notes."""

    shear_rate: np.ndarray | float
    stress: np.ndarray | float
    apparent_viscosity: np.ndarray | float
    notes: tuple[Note, ...]


@dataclass(frozen=True, eq=False)
class FitResult:
    """A fitted model with method, quality, notes, fitted range and hand-check intermediates.

    model            the fitted model (a :mod:`calc.rheology.models` class instance)
    method           registry name, e.g. ``"api13d_2010_hb"``
    quality          :class:`FitQuality` over the points the fit used
    notes            :class:`~calc.errors.Note` objects (clipping, unusual n, two-point fit …)
    shear_rate_range (lowest, highest) shear rate [1/s] of the points the fit rests on
    description      one line: what was done (with edition and memory marks)
    source           the published method
    intermediates    named numbers for a hand check (dial readings, field-unit values …)
    """

    model: Model
    method: str
    quality: FitQuality
    notes: tuple[Note, ...]
    shear_rate_range: tuple[float, float]
    description: str = ""
    source: str = ""
    intermediates: Mapping[str, float] = field(default_factory=dict)

    def extrapolation_notes(self, shear_rate) -> tuple[Note, ...]:
        """A warning when any ``shear_rate`` [1/s] lies outside :attr:`shear_rate_range`.

        >>> from calc.rheology.models import Newtonian
        >>> q = FitQuality(STRESS_SPACE, np.zeros(2), 0.0, 1.0, 2, 1)
        >>> f = FitResult(Newtonian(0.01), "demo", q, (), (5.0, 1000.0))
        >>> [n.code for n in f.extrapolation_notes([1.0, 50.0])]
        ['extrapolated']
        """
        g = check_finite("shear rate", shear_rate, "1/s")
        lo, hi = self.shear_rate_range
        tol = 1e-9
        below = g < lo * (1 - tol)
        above = g > hi * (1 + tol)
        if not (np.any(below) or np.any(above)):
            return ()
        used = (float(np.min(g)), float(np.max(g))) if g.size > 1 else float(g)
        return (
            Note(
                "warning",
                "extrapolated",
                "{model} ({method}) used at shear rate {used:.4g}, outside the range it was "
                "fitted over ({fitted:.4g})",
                self.method,
                (
                    Value("model", self.model.name),
                    Value("method", self.method),
                    Value("used", used, "shear_rate"),
                    Value("fitted", (float(lo), float(hi)), "shear_rate"),
                ),
            ),
        )

    def predict(self, shear_rate) -> Prediction:
        """Stress [Pa] and apparent viscosity [Pa·s] at ``shear_rate`` [1/s] (> 0), with notes."""
        return Prediction(
            shear_rate,
            self.model.stress(shear_rate),
            self.model.apparent_viscosity(shear_rate),
            self.extrapolation_notes(shear_rate),
        )


@dataclass(frozen=True)
class RankEntry:
    """One line of a ranking: all models scored on the same points in the same space."""

    rank: int
    method: str
    model_name: str
    std_error: float | None
    rmse: float
    r2: float
    n_params: int
    space: str


@dataclass(frozen=True, eq=False)
class FitSet:
    """All fits of one data set: results by method, their ranking, and notes (skipped fits)."""

    results: tuple[FitResult, ...]
    ranking: tuple[RankEntry, ...]
    notes: tuple[Note, ...]

    def __getitem__(self, method: str) -> FitResult:
        for r in self.results:
            if r.method == method:
                return r
        raise KeyError(method)

    def __contains__(self, method: str) -> bool:
        return any(r.method == method for r in self.results)

    @property
    def methods(self) -> list[str]:
        return [r.method for r in self.results]

    @property
    def best(self) -> FitResult | None:
        """The top-ranked fit (None if nothing could be fitted)."""
        return self[self.ranking[0].method] if self.ranking else None
