"""Fit one method, fit all candidates, and rank them (methods resolved through the registries).

>>> from calc.rheology.viscometer import ViscometerReadings
>>> r = ViscometerReadings([600, 300, 200, 100, 6, 3], [56, 37, 29, 20, 8, 7])
>>> round(fit(r, "api13d_1995_pipe").model.n, 3)
0.598
>>> fs = fit_all(r)
>>> fs.ranking[0].method in fs.methods
True
"""

from __future__ import annotations

import numpy as np

from calc.errors import InputError, check_choice
from calc.flow.result import CONSTANT_SETS
from calc.notes import Note

# importing the fit modules registers their methods
from calc.rheology import fit_table as _fit_table  # noqa: F401
from calc.rheology import fit_viscometer as _fit_viscometer  # noqa: F401
from calc.rheology.fit_viscometer import PRINTED_CONSTANT_FITS
from calc.rheology.fitresult import (
    LOG_SPACE,
    STRESS_SPACE,
    TABLE_FITS,
    VISCOMETER_FITS,
    FitResult,
    FitSet,
    RankEntry,
    quality_of,
)
from calc.rheology.table import RheometerTable
from calc.rheology.viscometer import ViscometerReadings
from calc.values import Value

__all__ = ["fit", "fit_all", "methods_for", "rank_fits"]


def _registry(data):
    if isinstance(data, ViscometerReadings):
        return VISCOMETER_FITS, STRESS_SPACE
    if isinstance(data, RheometerTable):
        return TABLE_FITS, LOG_SPACE
    raise InputError("data to fit", type(data).__name__, "ViscometerReadings or RheometerTable")


def methods_for(data) -> list[str]:
    """Names of the fit methods that apply to ``data`` (readings or a table).

    Examples
    --------
    >>> from calc.rheology import ViscometerReadings
    >>> names = methods_for(ViscometerReadings.from_mapping({600: 56, 300: 37, 3: 7}))
    >>> "bingham_two_speed" in names, "hb_least_squares" in names
    (True, True)
    """
    return _registry(data)[0].names()


def fit(data, method: str = "hb_least_squares", constants: str = "exact") -> FitResult:
    """Fit ``data`` (:class:`ViscometerReadings` or :class:`RheometerTable`) by ``method``.

    ``constants="as_printed"`` evaluates a fit of :data:`PRINTED_CONSTANT_FITS` with the
    rounded constants of its printed recipe (calc/METHODS.md §7.9).

    Raises
    ------
    InputError
        unknown method (with the nearest name), readings the method cannot use, or printed
        constants asked of a fit that has none.

    Examples
    --------
    The two-speed Bingham fit of θ600 = 56, θ300 = 37 gives PV = θ600 − θ300 = 19 cP
    (API RP 13B-1); the least-squares Herschel-Bulkley fit of readings computed from
    τ = 4 + 0.3·γ̇^0.65 Pa returns those parameters:

    >>> from calc.rheology import HerschelBulkley, ViscometerReadings
    >>> from calc.rheology.viscometer import STANDARD_GEOMETRY as g
    >>> from calc.units import from_si
    >>> b = fit(ViscometerReadings.from_mapping({600: 56, 300: 37}), "bingham_two_speed")
    >>> round(from_si(b.model.mu_p, "cP"), 3)
    19.0
    >>> hb = HerschelBulkley(4.0, 0.3, 0.65)
    >>> rpm = [600, 300, 200, 100, 6, 3]
    >>> dial = {s: float(hb.stress(s * g.shear_rate_per_rpm) / g.stress_per_reading) for s in rpm}
    >>> m = fit(ViscometerReadings.from_mapping(dial), "hb_least_squares").model
    >>> round(m.tau_y, 3), round(m.k, 4), round(m.n, 4)
    (4.0, 0.3, 0.65)
    """
    reg, _ = _registry(data)
    func = reg.get(method).func
    if check_choice("constants", constants, CONSTANT_SETS) == "exact":
        return func(data)
    if method not in PRINTED_CONSTANT_FITS:
        raise InputError(
            "constants",
            constants,
            f"'exact' for fit '{method}'; '{constants}' is available for: "
            + ", ".join(PRINTED_CONSTANT_FITS),
            problem="no printed constants for this fit",
        )
    return func(data, constants=constants)


def rank_fits(data, fits) -> tuple[RankEntry, ...]:
    """Rank fitted models on *all* points of ``data`` in its space by √(SSE/(N − p)).

    Viscometer readings are scored in stress [Pa], tables in log₁₀ stress, so every candidate
    is judged on the same points with the same weights (a two-point fit is scored on all
    readings, not only its two).  Ties go to the model with fewer parameters.

    Examples
    --------
    Readings that are exactly a Bingham fluid (τ = 5 + 0.02·γ̇ Pa): the least-squares Bingham
    fit ranks above the power law and leaves no residual:

    >>> from calc.rheology import Bingham, ViscometerReadings, fit
    >>> from calc.rheology.viscometer import STANDARD_GEOMETRY as g
    >>> rpm = [600, 300, 200, 100, 6, 3]
    >>> dial = {s: float(Bingham(5.0, 0.02).stress(s * g.shear_rate_per_rpm)
    ...                  / g.stress_per_reading) for s in rpm}
    >>> r = ViscometerReadings.from_mapping(dial)
    >>> fits = [fit(r, "power_law_least_squares"), fit(r, "bingham_least_squares")]
    >>> top = rank_fits(r, fits)[0]
    >>> top.method, top.rank, round(top.rmse, 9)
    ('bingham_least_squares', 1, 0.0)
    """
    _, space = _registry(data)
    g, tau = data.shear_rate, (data.shear_stress if space == STRESS_SPACE else data.stress)
    rows = []
    for f in fits:
        q = quality_of(f.model, g, tau, space, f.quality.n_params)
        s = q.std_error
        rows.append((s is None, np.inf if s is None else s, q.n_params, f, q))
    rows.sort(key=lambda r: (r[0], r[1], r[2]))
    return tuple(
        RankEntry(i + 1, f.method, f.model.name, q.std_error, q.rmse, q.r2, q.n_params, space)
        for i, (_, _, _, f, q) in enumerate(rows)
    )


def fit_all(data, methods=None) -> FitSet:
    """Every applicable fit (or those named in ``methods``), ranked; unusable ones become notes.

    A method that cannot use these readings (e.g. the API annulus pair without a 3-rpm
    reading) is skipped with an info note naming why; an unknown method name raises.

    Examples
    --------
    Without a 3-rpm reading the API RP 13D (1995) annulus pair (100/3 rpm) cannot be fitted;
    it becomes a note and the other fits are ranked:

    >>> from calc.rheology import ViscometerReadings
    >>> r = ViscometerReadings.from_mapping({600: 56, 300: 37, 200: 29, 100: 20, 6: 8})
    >>> fits = fit_all(r)
    >>> "api13d_1995_annulus" in fits, [n.code for n in fits.notes][:1]
    (False, ['fit_skipped'])
    >>> fits.ranking[0].rank
    1
    """
    reg, _ = _registry(data)
    names = reg.names() if methods is None else [reg.get(m).name for m in methods]
    results, notes = [], []
    for name in names:
        try:
            results.append(reg.get(name).func(data))
        except InputError as exc:
            notes.append(
                Note(
                    "info",
                    "fit_skipped",
                    "{method} not fitted: {reason}",
                    name,
                    (Value("method", name), Value("reason", str(exc))),
                )
            )
    return FitSet(tuple(results), rank_fits(data, results), tuple(notes))
