"""Run the calc layer for a case: everything the report and ``--json`` show (SI throughout).

No engineering formula lives here: each number comes from a :mod:`calc` function; this module
only chooses the inputs (latest check, its bit depth, the case's methods) and collects results.
"""

from __future__ import annotations

import datetime as _dt
from dataclasses import dataclass, field

import numpy as np

import calc
from calc.errors import Note

__all__ = ["CheckResults", "Results", "compute"]

#: Hydraulics method used for the report (API RP 13D 2010 Herschel-Bulkley, as in calc.flow).
DEFAULT_METHOD = "api13d_2010_hb"
#: Fits shown on the rheology sheet, in this order (calc.rheology registry names).
SHOWN_FITS = (
    "bingham_two_speed",
    "api13d_1995_pipe",
    "api13d_1995_annulus",
    "api13d_2010_hb",
    "hb_least_squares",
    "power_law_least_squares",
    "bingham_least_squares",
)


@dataclass(frozen=True)
class CheckResults:
    """Rheology of one mud check."""

    label: str
    readings: object  # ViscometerReadings
    fits: object  # FitSet
    comparison: object | None  # CheckComparison with the previous check


@dataclass(frozen=True)
class Results:
    """All results of one report run (the latest check drives hydraulics)."""

    case: object
    run_time: str
    version: str
    method: str
    checks: tuple[CheckResults, ...]
    well: object
    fluid: object
    circulation: object
    profile: object
    cleaning: object | None
    surge: object | None
    notes: tuple[Note, ...] = field(default=())

    @property
    def latest(self) -> CheckResults:
        return self.checks[-1]


def fluid_for(readings, density: float, method: str, label: str):
    """HydraulicsFluid with the fits the hydraulics ``method`` prescribes (calc.circulation)."""
    from calc.circulation.fluid import FLUID_FITS, HydraulicsFluid
    from calc.rheology import fit

    choice = FLUID_FITS.get(method).func
    pipe = fit(readings, choice.pipe).model
    ann = pipe if choice.annulus == choice.pipe else fit(readings, choice.annulus).model
    fits = choice.pipe if choice.pipe == choice.annulus else f"{choice.pipe} | {choice.annulus}"
    return HydraulicsFluid(density, pipe, ann, label=label, fits=fits)


def compute(case, *, method: str = DEFAULT_METHOD, run_time: str | None = None) -> Results:
    """Run rheology, circulation, ECD profile (and cleaning/surge where available) for a case."""
    from calc.circulation import Margins
    from calc.circulation.loop import circulate
    from calc.rheology import compare_checks, fit_all

    run_time = run_time or _dt.datetime.now(_dt.UTC).strftime("%Y-%m-%d %H:%M:%S UTC")
    checks = []
    prev = None
    for chk in case.checks:
        r = chk.readings
        fs = fit_all(r)
        cmp_ = compare_checks(prev, r) if prev is not None else None
        checks.append(CheckResults(chk.label, r, fs, cmp_))
        prev = r
    well = case.well(-1)
    density = case.check_value(-1, "density")
    q = case.check_value(-1, "flow_rate")
    fluid = fluid_for(checks[-1].readings, density, method, case.checks[-1].label)
    lim = case.limits
    res = circulate(
        well,
        fluid,
        q,
        method=method,
        window=case.window,
        weak_points=case.weak_points,
        margins=Margins(fracture=lim["fracture_margin"], pore=lim["pore_margin"]),
        surface_rating=lim["surface_rating"],
        message_units=case.system,
    )
    step = 30.48 if case.system == "oilfield" else 25.0  # profile grid: 100 ft or 25 m
    prof = res.profile(step)
    notes = list(well.notes) + list(res.notes)
    for c in checks:
        notes.extend(c.readings.notes)
        notes.extend(c.fits.notes)
    return Results(
        case=case,
        run_time=run_time,
        version=calc.__version__,
        method=method,
        checks=tuple(checks),
        well=well,
        fluid=fluid,
        circulation=res,
        profile=prof,
        cleaning=None,
        surge=None,
        notes=_dedupe(notes),
    )


def _dedupe(notes) -> tuple[Note, ...]:
    seen, out = set(), []
    for n in notes:
        key = (n.level, n.code, n.message, n.subject)
        if key not in seen:
            seen.add(key)
            out.append(n)
    return tuple(out)


def scalar(x) -> float:
    """A 0-d result as a float (the report runs one rate)."""
    return float(np.asarray(x, dtype=float).reshape(-1)[0]) if np.ndim(x) else float(x)
