"""Rheometer tables: shear rate with shear stress or viscosity, and the zero-shear plateau.

A table is held in SI (shear rate [1/s], stress [Pa], viscosity [Pa·s]) with τ = η·γ̇.  Build it
from columns in any units with :meth:`RheometerTable.from_units`.

Plateau and shear-thinning region (:func:`find_plateau`, :func:`shear_thinning_region`):

* the **zero-shear plateau** is the leading run (≥ 2 points) of viscosities within ``tol``
  (default 10 %) of the lowest-shear viscosity; η₀ ≈ the highest of them (a geometric mean
  would be pulled down by the points already thinning);
* **onset of shear thinning**: the shear rate where η first falls to (1 − tol)·η₀, found by
  log-log interpolation between the bracketing points;
* the **shear-thinning (power-law) region**: the contiguous points whose adjacent log-log
  segments have slope d log η/d log γ̇ at least half as steep as the steepest segment, which
  drops both plateaus and the curved transitions next to them.

These are working definitions of this program (no standard fixes them); ``tol`` is settable.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, as_float_array
from calc.notes import Note
from calc.units import to_si
from calc.values import Value

__all__ = ["Plateau", "RheometerTable", "find_plateau", "shear_thinning_region"]


@dataclass(frozen=True)
class Plateau:
    """Zero-shear plateau found in a table.

    found           whether ≥ 2 leading points lie within ``tol`` of each other
    eta0            plateau viscosity [Pa·s] (highest viscosity on the plateau; the
                    lowest-shear viscosity when no plateau was found)
    n_points        number of plateau points
    last_rate       highest shear rate still on the plateau [1/s]
    onset_rate      shear rate where η falls to (1 − tol)·η₀ [1/s] (None if it never does)
    tol             relative tolerance used
    """

    found: bool
    eta0: float
    n_points: int
    last_rate: float
    onset_rate: float | None
    tol: float


def find_plateau(shear_rate, viscosity, tol: float = 0.1) -> Plateau:
    """Identify the zero-shear plateau of a sorted table (see the module docstring).

    Examples
    --------
    >>> g = np.logspace(-2, 2, 9)
    >>> p = find_plateau(g, 1.0 / (1.0 + g))
    >>> p.found, p.n_points, round(p.onset_rate, 3)
    (True, 3, 0.114)
    """
    g = np.asarray(shear_rate, dtype=float)
    eta = np.asarray(viscosity, dtype=float)
    ref = eta[0]
    inside = np.abs(eta / ref - 1.0) <= tol
    run = int(np.argmin(inside)) if not inside.all() else inside.size
    found = run >= 2
    eta0 = float(np.max(eta[:run])) if found else float(ref)
    below = np.flatnonzero(eta < (1.0 - tol) * eta0)
    onset = None
    if below.size:
        j = below[0]
        if j == 0:
            onset = float(g[0])
        else:
            x0, x1 = np.log(g[j - 1]), np.log(g[j])
            y0, y1 = np.log(eta[j - 1]), np.log(eta[j])
            yt = np.log((1.0 - tol) * eta0)
            onset = float(np.exp(x0 + (yt - y0) * (x1 - x0) / (y1 - y0)))
    return Plateau(found, eta0, run if found else 0, float(g[max(run, 1) - 1]), onset, tol)


def shear_thinning_region(shear_rate, viscosity) -> np.ndarray:
    """Boolean mask of the straight shear-thinning part of a sorted table.

    All points when no segment thins (slope > −0.02 everywhere, e.g. a Newtonian table).

    Examples
    --------
    A Newtonian table is all "region"; a Cross-like table η = 1/(1 + γ̇) thins past γ̇ ≈ 1
    (its zero-shear plateau is left out):

    >>> g = np.logspace(-2, 2, 9)
    >>> bool(shear_thinning_region(g, np.full(9, 0.02)).all())
    True
    >>> shear_thinning_region(g, 1.0 / (1.0 + g)).astype(int).tolist()
    [0, 0, 0, 0, 1, 1, 1, 1, 1]
    """
    lg, le = np.log10(shear_rate), np.log10(viscosity)
    slope = np.diff(le) / np.diff(lg)
    steepest = slope.min()
    mask = np.zeros(lg.size, dtype=bool)
    if steepest > -0.02:
        mask[:] = True
        return mask
    good = slope <= 0.5 * steepest
    # the longest contiguous run of qualifying segments
    best_len, best_start, i = 0, 0, 0
    while i < good.size:
        if good[i]:
            j = i
            while j < good.size and good[j]:
                j += 1
            if j - i > best_len:
                best_len, best_start = j - i, i
            i = j
        else:
            i += 1
    mask[best_start : best_start + best_len + 1] = True
    return mask


@dataclass(frozen=True, eq=False)
class RheometerTable:
    """A flow curve in SI: ``shear_rate`` [1/s] with ``stress`` [Pa] or ``viscosity`` [Pa·s].

    Raises
    ------
    InputError
        fewer than two points, non-numeric / non-finite / non-positive values, duplicate shear
        rates with different values, both or neither of stress and viscosity, stress that falls
        as shear rate rises.

    Examples
    --------
    A viscosity table of η = 1/(1 + γ̇) Pa·s: stress = η·γ̇, zero-shear plateau η₀ = 1 Pa·s:

    >>> g = np.logspace(-2, 2, 9)
    >>> t = RheometerTable(g, viscosity=1.0 / (1.0 + g))
    >>> round(float(t.stress[-1]), 4), t.plateau().found, round(t.plateau().eta0, 2)
    (0.9901, True, 0.99)
    """

    shear_rate: np.ndarray
    stress: np.ndarray | None = None
    viscosity: np.ndarray | None = None
    label: str = ""
    plateau_tol: float = 0.1
    notes: tuple[Note, ...] = field(default=(), compare=False)

    def __post_init__(self):
        notes = list(self.notes)
        if (self.stress is None) == (self.viscosity is None):
            raise InputError("rheometer table", "stress and viscosity", "exactly one of them")
        g = self._column("shear rate", self.shear_rate, "1/s")
        given_stress = self.stress is not None
        vals = self._column(
            "shear stress" if given_stress else "viscosity",
            self.stress if given_stress else self.viscosity,
            "Pa" if given_stress else "Pa·s",
        )
        if vals.shape != g.shape:
            raise InputError(
                "rheometer table", f"{g.size} rates, {vals.size} values", "one value per shear rate"
            )
        order = np.argsort(g, kind="stable")
        g, vals = g[order], vals[order]
        uniq, idx, counts = np.unique(g, return_index=True, return_counts=True)
        for s in uniq[counts > 1]:
            if np.ptp(vals[g == s]) > 0:
                raise InputError(
                    f"rheometer values at {s:g} 1/s",
                    vals[g == s].tolist(),
                    "one value per shear rate",
                    "duplicate shear rate",
                )
            notes.append(
                Note(
                    "info",
                    "duplicate_rate",
                    "{rate:g} listed twice; used once",
                    values=(Value("rate", float(s), "shear_rate"),),
                )
            )
        keep = np.sort(idx)
        g, vals = g[keep], vals[keep]
        if g.size < 2:
            raise InputError("rheometer table", g.size, "at least two shear rates", "too few")
        tau = vals if given_stress else vals * g
        drops = np.flatnonzero(np.diff(tau) < 0)
        if drops.size:
            i = drops[0] + 1
            raise InputError(
                f"shear stress at {g[i]:g} 1/s",
                float(tau[i]),
                f">= the stress at {g[i - 1]:g} 1/s ({tau[i - 1]:.4g} Pa)",
                "falls as shear rate rises",
            )
        if not tau[-1] > tau[0]:
            raise InputError(
                "shear stress",
                tau.tolist(),
                "stresses that rise with shear rate",
                "flat flow curve",
            )
        tol = float(self.plateau_tol)
        if not 0 < tol < 1:
            raise InputError("plateau tolerance", tol, "in (0, 1)")
        object.__setattr__(self, "shear_rate", g)
        object.__setattr__(self, "stress", tau)
        object.__setattr__(self, "viscosity", tau / g)
        object.__setattr__(self, "notes", tuple(notes))

    @staticmethod
    def _column(name, value, unit):
        if isinstance(value, str):
            raise InputError(name, value, f"numbers in {unit}")
        arr = as_float_array(name, value)
        if arr.ndim != 1:
            raise InputError(name, value, "a one-dimensional column of numbers")
        bad = ~np.isfinite(arr) | (arr <= 0)
        if np.any(bad):
            raise InputError(name, float(arr[bad][0]), f"finite numbers > 0 {unit}")
        return arr

    @classmethod
    def from_units(
        cls,
        shear_rate,
        stress=None,
        viscosity=None,
        *,
        shear_rate_unit: str = "1/s",
        stress_unit: str = "Pa",
        viscosity_unit: str = "Pa*s",
        **kwargs,
    ) -> RheometerTable:
        """Build from columns in any units, e.g. ``viscosity_unit="cP"``, ``stress_unit="psi"``.

        >>> t = RheometerTable.from_units([1, 10], viscosity=[500, 100], viscosity_unit="cP")
        >>> t.stress.tolist()
        [0.5, 1.0]
        """
        g = to_si(
            cls._column("shear rate", shear_rate, shear_rate_unit),
            shear_rate_unit,
            "shear_rate",
            "shear rate",
        )
        if stress is not None:
            stress = to_si(
                cls._column("shear stress", stress, stress_unit),
                stress_unit,
                "stress",
                "shear stress",
            )
        if viscosity is not None:
            viscosity = to_si(
                cls._column("viscosity", viscosity, viscosity_unit),
                viscosity_unit,
                "viscosity",
                "viscosity",
            )
        return cls(
            np.atleast_1d(g),
            stress=stress if stress is None else np.atleast_1d(stress),
            viscosity=viscosity if viscosity is None else np.atleast_1d(viscosity),
            **kwargs,
        )

    @property
    def shear_rate_range(self) -> tuple[float, float]:
        """(lowest, highest) measured shear rate [1/s]."""
        return float(self.shear_rate[0]), float(self.shear_rate[-1])

    def plateau(self) -> Plateau:
        """The zero-shear plateau (:func:`find_plateau` with this table's tolerance)."""
        return find_plateau(self.shear_rate, self.viscosity, self.plateau_tol)

    def thinning_mask(self) -> np.ndarray:
        """Points of the straight shear-thinning region (:func:`shear_thinning_region`)."""
        return shear_thinning_region(self.shear_rate, self.viscosity)
