"""Compare two mud checks (yesterday and today, batch A and batch B).

For each parameter — n, K, τy (from one fit method applied to both checks), PV, YP, LSYP and
the gels — the absolute change b − a and the relative change (b − a)/|a| are reported and
flagged when *both* exceed the tolerance: |Δ| > abs and |Δ/a| > rel (so a large percentage of
a tiny number, or a change inside the reading resolution, is not flagged).

Default tolerances (:data:`DEFAULT_TOLERANCES`, SI) — common practice, from memory, unverified;
set your own:

==========  ===========================  ======
parameter   absolute                     rel.
==========  ===========================  ======
PV          2 cP                         10 %
YP          2 lbf/100 ft²                10 %
LSYP        1 lbf/100 ft²                10 %
τy          1 lbf/100 ft²                15 %
gels        2 lbf/100 ft²                15 %
n           0.05                         0
K           0                            15 %
==========  ===========================  ======

Flow curves: the two fitted curves are evaluated on 200 log-spaced shear rates over the
measured range, and their stress difference is expressed in dial degrees of check ``a``'s
instrument.  They "differ" when the largest difference exceeds the combined resolution of two
readings, 2 × ±0.5° (common practice: a reading is good to about ±½ dial unit;
calc/METHODS.md §16.1).  The measured
differences at the speeds both checks share are reported too.
"""

from __future__ import annotations

import itertools
from collections.abc import Mapping, Sequence
from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_choice
from calc.notes import Note
from calc.rheology.fitting import fit
from calc.rheology.viscometer import CENTIPOISE, FIELD_STRESS, ViscometerReadings
from calc.values import Value

__all__ = [
    "DEFAULT_TOLERANCES",
    "PARAMETER_KINDS",
    "CheckComparison",
    "ParameterChange",
    "Tolerance",
    "compare_checks",
    "compare_series",
]

#: Temperature difference [K] above which two checks are not like for like (10 °F;
#: common practice, calc/METHODS.md §16.1).
TEMPERATURE_TOLERANCE = 10.0 * 5.0 / 9.0


@dataclass(frozen=True)
class Tolerance:
    """Flag when |Δ| > ``abs`` (SI) and |Δ/a| > ``rel`` (fraction)."""

    abs: float = 0.0
    rel: float = 0.0

    def __post_init__(self):
        for nm in ("abs", "rel"):
            v = getattr(self, nm)
            if isinstance(v, (str, bool)) or not np.isfinite(v) or v < 0:
                raise InputError(f"tolerance {nm}", v, "a finite number >= 0")


#: Parameter → quantity kind (for display through calc.units).
PARAMETER_KINDS = {
    "n": "dimensionless",
    "K": "consistency",
    "tau_y": "stress",
    "PV": "viscosity",
    "YP": "stress",
    "LSYP": "stress",
    "gel_10s": "stress",
    "gel_10min": "stress",
    "gel_30min": "stress",
}

DEFAULT_TOLERANCES: dict[str, Tolerance] = {
    "n": Tolerance(0.05, 0.0),
    "K": Tolerance(0.0, 0.15),
    "tau_y": Tolerance(1.0 * FIELD_STRESS, 0.15),
    "PV": Tolerance(2.0 * CENTIPOISE, 0.10),
    "YP": Tolerance(2.0 * FIELD_STRESS, 0.10),
    "LSYP": Tolerance(1.0 * FIELD_STRESS, 0.10),
    "gel_10s": Tolerance(2.0 * FIELD_STRESS, 0.15),
    "gel_10min": Tolerance(2.0 * FIELD_STRESS, 0.15),
    "gel_30min": Tolerance(2.0 * FIELD_STRESS, 0.15),
}


@dataclass(frozen=True)
class ParameterChange:
    """One parameter of two checks: values (SI), change, relative change, tolerance, flag."""

    name: str
    kind: str
    a: float
    b: float
    change: float
    relative: float | None  # None when a = 0
    tolerance: Tolerance
    flagged: bool


@dataclass(frozen=True, eq=False)
class CheckComparison:
    """Comparison of check ``a`` (earlier) with check ``b`` (later).

    Examples
    --------
    PV 19 → 24 cP and YP 18 → 20 lbf/100ft² (θ600 − θ300, θ300 − PV):

    >>> from calc.units import from_si
    >>> a = ViscometerReadings.from_mapping({600: 56, 300: 37, 200: 29, 100: 20}, label="D1")
    >>> b = ViscometerReadings.from_mapping({600: 68, 300: 44, 200: 35, 100: 25}, label="D2")
    >>> c = compare_checks(a, b)
    >>> round(from_si(c["PV"].change, "cP"), 1), round(from_si(c["YP"].b, "lbf/100ft2"), 1)
    (5.0, 20.0)
    """

    label_a: str
    label_b: str
    method: str
    changes: tuple[ParameterChange, ...]
    curves_differ: bool
    max_curve_difference: float  # dial degrees (of a's instrument), signed b − a
    max_difference_at: float  # shear rate [1/s]
    threshold: float  # dial degrees
    reading_differences: Mapping[float, float]  # rpm → θb − θa at shared speeds
    notes: tuple[Note, ...]

    @property
    def flagged(self) -> tuple[ParameterChange, ...]:
        return tuple(c for c in self.changes if c.flagged)

    def __getitem__(self, name: str) -> ParameterChange:
        for c in self.changes:
            if c.name == name:
                return c
        raise KeyError(name)


def _tolerances(user) -> dict[str, Tolerance]:
    tol = dict(DEFAULT_TOLERANCES)
    if user is None:
        return tol
    if not isinstance(user, Mapping):
        raise InputError("tolerances", user, "a mapping parameter → Tolerance or (abs, rel)")
    for key, val in user.items():
        if key not in PARAMETER_KINDS:
            check_choice("tolerance parameter", key, list(PARAMETER_KINDS))
        if isinstance(val, Tolerance):
            tol[key] = val
        elif isinstance(val, Sequence) and not isinstance(val, str) and len(val) == 2:
            tol[key] = Tolerance(*val)
        else:
            raise InputError(f"tolerance for {key}", val, "Tolerance(abs, rel) or (abs, rel)")
    return tol


def _values(r: ViscometerReadings, model) -> dict[str, float]:
    out = {"n": model.n, "K": model.k, "tau_y": model.tau_y}
    for name, attr in (("PV", "pv"), ("YP", "yp"), ("LSYP", "lsyp")):
        try:
            out[name] = getattr(r, attr)
        except InputError:
            pass
    for key, val in r.gels_si.items():
        out[f"gel_{key}"] = val
    return out


def _change(name, a, b, tol: Tolerance) -> ParameterChange:
    d = b - a
    rel = d / abs(a) if a != 0 else None
    eps = 1e-9  # values on the tolerance itself are not beyond it (floating-point round-off)
    flagged = abs(d) > tol.abs * (1 + eps) and (rel is None or abs(rel) > tol.rel * (1 + eps))
    return ParameterChange(name, PARAMETER_KINDS[name], a, b, d, rel, tol, bool(flagged))


def compare_checks(
    a: ViscometerReadings,
    b: ViscometerReadings,
    tolerances: Mapping | None = None,
    method: str = "hb_least_squares",
    resolution: float | None = None,
) -> CheckComparison:
    """Compare check ``a`` with check ``b`` (see the module docstring for the rules).

    Parameters
    ----------
    a, b : ViscometerReadings
        The earlier and the later check.
    tolerances : mapping, optional
        Parameter → :class:`Tolerance` or ``(abs, rel)`` (abs in SI), overriding
        :data:`DEFAULT_TOLERANCES` for the parameters given.
    method : str
        Fit method for n, K and τy (any viscometer method, default ``"hb_least_squares"``).
    resolution : float, optional
        Reading resolution [degree]; default that of ``a`` (±0.5°).

    Examples
    --------
    >>> a = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
    >>> b = ViscometerReadings([600, 300, 200, 100, 6, 3], [68, 44, 35, 25, 10, 9])
    >>> c = compare_checks(a, b)
    >>> c["PV"].flagged, c.curves_differ
    (True, True)
    """
    for nm, r in (("check a", a), ("check b", b)):
        if not isinstance(r, ViscometerReadings):
            raise InputError(nm, type(r).__name__, "ViscometerReadings")
    tol = _tolerances(tolerances)
    res = a.resolution if resolution is None else float(resolution)
    if not np.isfinite(res) or res < 0:
        raise InputError("reading resolution", res, ">= 0 degree")
    fa, fb = fit(a, method), fit(b, method)
    changes, notes = _parameter_changes(
        _values(a, fa.model), _values(b, fb.model), tol, fa.model.n - fb.model.n
    )
    grid, diff_deg, curve_notes = _curve_difference(a, b, fa, fb)
    i = int(np.argmax(np.abs(diff_deg)))
    threshold = 2.0 * res
    return CheckComparison(
        a.label,
        b.label,
        method,
        tuple(changes),
        bool(abs(diff_deg[i]) > threshold),
        float(diff_deg[i]),
        float(grid[i]),
        threshold,
        _shared_readings(a, b),
        tuple(notes + curve_notes + _like_for_like_notes(a, b)),
    )


def _parameter_changes(va, vb, tol, n_difference):
    """The change of each parameter both checks have; notes on those only one has, and on K
    when n moved (K of different n are not comparable)."""
    notes: list[Note] = []
    changes = []
    for name in PARAMETER_KINDS:
        if name in va and name in vb:
            changes.append(_change(name, va[name], vb[name], tol[name]))
        elif name in va or name in vb:
            notes.append(
                Note(
                    "info",
                    "not_compared",
                    "{parameter} is in one check only",
                    name,
                    (Value("parameter", name),),
                )
            )
    if abs(n_difference) > 0.1:
        notes.append(
            Note(
                "info",
                "k_needs_similar_n",
                "n differs by more than 0.1: compare K only at similar n",
                "K",
            )
        )
    return changes, notes


def _curve_difference(a, b, fa, fb):
    """The fitted curves' difference b − a [dial degrees of a's instrument] on 200 log-spaced
    shear rates over both measured ranges, with the fits' extrapolation notes there."""
    lo = min(a.shear_rate_range[0], b.shear_rate_range[0])
    hi = max(a.shear_rate_range[1], b.shear_rate_range[1])
    grid = np.geomspace(lo, hi, 200)
    notes = [n for f in (fa, fb) for n in f.extrapolation_notes(grid)]
    diff_deg = (fb.model.stress(grid) - fa.model.stress(grid)) / a.geometry.stress_per_reading
    return grid, diff_deg, notes


def _shared_readings(a, b) -> dict[float, float]:
    """rpm → θb − θa (in a's spring) at the speeds both checks read."""
    return {
        float(s): (
            b.reading(s) * b.geometry.spring_factor - a.reading(s) * a.geometry.spring_factor
        )
        / a.geometry.spring_factor
        for s in a.speeds
        if b.reading(s) is not None
    }


def _like_for_like_notes(a, b) -> list[Note]:
    """Whether the checks are like for like: the same instrument factors, cup temperatures."""
    notes = []
    if a.geometry.shear_rate_per_rpm != b.geometry.shear_rate_per_rpm or (
        a.geometry.stress_per_degree != b.geometry.stress_per_degree
    ):
        notes.append(
            Note(
                "warning",
                "different_instruments",
                "the checks used different "
                "instrument factors: compare model values, not dial readings",
            )
        )
    if a.temperature is None or b.temperature is None:
        notes.append(
            Note(
                "warning",
                "temperature_missing",
                "a cup temperature is missing: the checks may not be like for like",
            )
        )
    elif abs(a.temperature - b.temperature) > TEMPERATURE_TOLERANCE:
        notes.append(
            Note(
                "info",
                "temperature_differs",
                "cup temperatures differ by {difference:.3g} °F (> {limit:.3g} °F)",
                values=(
                    # a temperature difference: 1 K = 1.8 °F (no offset; no kind converts it)
                    Value("difference", abs(a.temperature - b.temperature) * 1.8),
                    Value("limit", TEMPERATURE_TOLERANCE * 1.8),
                ),
            )
        )
    return notes


def compare_series(checks: Sequence[ViscometerReadings], **kwargs) -> tuple[CheckComparison, ...]:
    """:func:`compare_checks` for each consecutive pair (oldest first).

    Examples
    --------
    Three checks give two comparisons; PV went 19 → 24 → 22 cP (θ600 − θ300):

    >>> from calc.units import from_si
    >>> dials = [{600: 56, 300: 37, 200: 29, 100: 20, 6: 8, 3: 7},
    ...          {600: 68, 300: 44, 200: 35, 100: 25, 6: 10, 3: 9},
    ...          {600: 64, 300: 42, 200: 33, 100: 23, 6: 9, 3: 8}]
    >>> checks = [ViscometerReadings.from_mapping(d, label=f"D{i + 1}")
    ...           for i, d in enumerate(dials)]
    >>> [(c.label_a, c.label_b, round(from_si(c["PV"].change, "cP"), 1))
    ...  for c in compare_series(checks)]
    [('D1', 'D2', 5.0), ('D2', 'D3', -2.0)]
    """
    checks = list(checks)
    return tuple(compare_checks(x, y, **kwargs) for x, y in itertools.pairwise(checks))
