"""Worksheet functions: rheology from viscometer readings (over :mod:`calc.rheology`).

Every function takes the readings range first (see *Readings* in the conventions), then a
shear rate where one is needed, then the ``method`` argument, here a viscometer fit (blank =
calc's default, Herschel-Bulkley least squares; not a hydraulics method), then the units.  Fits:
the names of :data:`calc.rheology.VISCOMETER_FITS` (``api13d_2010_hb``, ``hb_least_squares``,
``api13d_1995_pipe``, ``api13d_1995_annulus``, ``bingham_two_speed``, …).
"""

from typing import Any

from addin import text
from addin.sheets import cells
from addin.sheets.framework import Cells, Text, sheet_function
from calc import rheology as cr

__all__ = [
    "BF_AV",
    "BF_FIT",
    "BF_FITS",
    "BF_K",
    "BF_LSYP",
    "BF_N",
    "BF_PV",
    "BF_SHEAR_RATE",
    "BF_STRESS",
    "BF_TAU_Y",
    "BF_VISC",
    "BF_YP",
]

FAMILY = "rheology"

_UNITS = "Unit system (blank = oilfield), overrides 'kind=unit; …', or a kind/unit range"
_READINGS = (
    "Viscometer readings: two columns rpm and dial, or one column of 6 dial readings (600…3 rpm)"
)
_METHOD = "Viscometer fit, e.g. 'api13d_2010_hb', 'hb_least_squares' (blank), 'bingham_two_speed'"
_RATE = "Shear rate (1/s); a range gives a range of results"


def viscometer(readings_range) -> cr.ViscometerReadings:
    """A readings range → :class:`calc.rheology.ViscometerReadings` (standard R1-B1-F1)."""
    speeds, dial = cells.readings(readings_range)
    return cr.ViscometerReadings(speeds, dial)


def fitted(readings_range, method) -> cr.FitResult:
    """Fit the readings by ``method`` (blank → calc's default method)."""
    r = viscometer(readings_range)
    if cells.blank(method):
        return cr.fit(r)
    name = cells.text(method, "method", choices=cr.VISCOMETER_FITS.names())
    return cr.fit(r, name)


def consistency_label(uset: cells.UnitSet) -> str:
    """Label of K: the stress unit with ·sⁿ (e.g. ``lbf·sⁿ/100ft²``, ``Pa·sⁿ``)."""
    return text.parameter_unit("consistency", uset)


@sheet_function(FAMILY)
def BF_PV(readings: Cells(_READINGS), units: Cells(_UNITS) = None) -> Any:
    """Plastic viscosity PV = θ600 − θ300 (cP in oilfield units; API RP 13B-1).

    >>> BF_PV([[600, 56], [300, 37], [200, 29], [100, 20], [6, 8], [3, 7]])
    19.0
    """
    uset = cells.unit_set(units)
    return uset.from_si(viscometer(readings).pv, "viscosity")


@sheet_function(FAMILY)
def BF_YP(readings: Cells(_READINGS), units: Cells(_UNITS) = None) -> Any:
    """Yield point YP = θ300 − PV (lbf/100ft² in oilfield units; API RP 13B-1).

    >>> round(BF_YP([[56], [37], [29], [20], [8], [7]]), 9)
    18.0
    """
    uset = cells.unit_set(units)
    return uset.from_si(viscometer(readings).yp, "stress")


@sheet_function(FAMILY)
def BF_LSYP(readings: Cells(_READINGS), units: Cells(_UNITS) = None) -> Any:
    """Low-shear yield point LSYP = 2θ3 − θ6 (lbf/100ft² in oilfield units).

    >>> round(BF_LSYP([[56, 37, 29, 20, 8, 7]]), 9)
    6.0
    """
    uset = cells.unit_set(units)
    return uset.from_si(viscometer(readings).lsyp, "stress")


@sheet_function(FAMILY)
def BF_AV(readings: Cells(_READINGS), units: Cells(_UNITS) = None) -> Any:
    """Apparent viscosity AV = θ600 / 2 (cP in oilfield units; API RP 13B-1).

    >>> BF_AV([[56, 37, 29, 20, 8, 7]])
    28.0
    """
    uset = cells.unit_set(units)
    return uset.from_si(viscometer(readings).av, "viscosity")


@sheet_function(FAMILY)
def BF_SHEAR_RATE(rpm: Cells("Rotor speed (rpm); a range gives a range")) -> Any:
    """Shear rate at the bob of the standard R1-B1-F1 viscometer for a rotor speed (1/s).

    >>> round(BF_SHEAR_RATE(600), 1)
    1021.4
    """
    speeds = cells.positive_values(rpm, "rotor speed")
    return speeds * cr.STANDARD_GEOMETRY.shear_rate_per_rpm


@sheet_function(FAMILY)
def BF_TAU_Y(
    readings: Cells(_READINGS), method: Text(_METHOD) = None, units: Cells(_UNITS) = None
) -> Any:
    """Yield stress τy of a fitted model (lbf/100ft² in oilfield units; 0 for power law).

    >>> round(BF_TAU_Y([[56, 37, 29, 20, 8, 7]], "bingham_two_speed"), 4)
    19.1983
    """
    uset = cells.unit_set(units)
    return uset.from_si(fitted(readings, method).model.tau_y, "stress")


@sheet_function(FAMILY)
def BF_K(
    readings: Cells(_READINGS), method: Text(_METHOD) = None, units: Cells(_UNITS) = None
) -> Any:
    """Consistency index K of a fitted model (lbf·sⁿ/100ft² in oilfield units).

    For Bingham and Newtonian fits K is the plastic viscosity / viscosity, in the same unit.
    """
    uset = cells.unit_set(units)
    return uset.from_si(fitted(readings, method).model.k, "consistency")


@sheet_function(FAMILY)
def BF_N(readings: Cells(_READINGS), method: Text(_METHOD) = None) -> Any:
    """Flow-behaviour index n of a fitted model (dimensionless; 1 for Bingham, Newtonian).

    >>> round(BF_N([[56, 37, 29, 20, 8, 7]], "api13d_1995_pipe"), 4)
    0.5979
    """
    return fitted(readings, method).model.n


def _prediction(readings, shear_rate, method):
    """The fitted model's prediction at the shear-rate argument (one cell or a range) [1/s]."""
    g = cells.positive_values(shear_rate, "shear rate")
    return fitted(readings, method).predict(g)


@sheet_function(FAMILY)
def BF_STRESS(
    readings: Cells(_READINGS),
    shear_rate: Cells(_RATE),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Shear stress of the fitted model at a shear rate (lbf/100ft² in oilfield units)."""
    uset = cells.unit_set(units)
    return uset.from_si(_prediction(readings, shear_rate, method).stress, "stress")


@sheet_function(FAMILY)
def BF_VISC(
    readings: Cells(_READINGS),
    shear_rate: Cells(_RATE),
    method: Text(_METHOD) = None,
    units: Cells(_UNITS) = None,
) -> Any:
    """Apparent viscosity τ/γ̇ of the fitted model at a shear rate (cP in oilfield units)."""
    uset = cells.unit_set(units)
    return uset.from_si(_prediction(readings, shear_rate, method).apparent_viscosity, "viscosity")


@sheet_function(FAMILY)
def BF_FIT(
    readings: Cells(_READINGS), method: Text(_METHOD) = None, units: Cells(_UNITS) = None
) -> Any:
    """A spilled table of one fit: model, τy, K, n, fit quality, method and notes (header row)."""
    uset = cells.unit_set(units)
    res = fitted(readings, method)
    m = res.model
    stress = uset.label("stress")
    rows = [
        ["item", "value", "unit"],
        ["model", m.name, ""],
        ["method", res.method, ""],
        ["τy", uset.from_si(m.tau_y, "stress"), stress],
        ["K", uset.from_si(m.k, "consistency"), consistency_label(uset)],
        ["n", m.n, ""],
        ["R²", res.quality.r2, ""],
        ["RMSE", uset.from_si(res.quality.rmse, "stress"), stress],
        ["lowest shear rate", res.shear_rate_range[0], "1/s"],
        ["highest shear rate", res.shear_rate_range[1], "1/s"],
        ["description", res.description, ""],
    ]
    rows += [["note", text.note_line(n, uset), n.level] for n in res.notes]
    return rows


@sheet_function(FAMILY)
def BF_FITS(readings: Cells(_READINGS), units: Cells(_UNITS) = None) -> Any:
    """A spilled table of every applicable fit, best first: rank, method, model, τy, K, n, R²
    and residual standard error on all readings (header row with units).
    """
    uset = cells.unit_set(units)
    fs = cr.fit_all(viscometer(readings))
    stress = uset.label("stress")
    rows = [
        [
            "rank",
            "method",
            "model",
            f"τy [{stress}]",
            f"K [{consistency_label(uset)}]",
            "n",
            "R²",
            f"std error [{stress}]",
        ]
    ]
    for entry in fs.ranking:
        m = fs[entry.method].model
        err = "" if entry.std_error is None else uset.from_si(entry.std_error, "stress")
        rows.append(
            [
                entry.rank,
                entry.method,
                entry.model_name,
                uset.from_si(m.tau_y, "stress"),
                uset.from_si(m.k, "consistency"),
                m.n,
                entry.r2,
                err,
            ]
        )
    return rows
