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
    window: dict | None = None
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
    cleaning = _cleaning(case, well, fluid, q)
    surge = _trips(case, well, fluid, method)
    window = flow_window(case, well, fluid, method, cleaning)
    for part in (cleaning, surge):
        if part is not None:
            notes.extend(part["notes"])
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
        cleaning=cleaning,
        surge=surge,
        window=window,
        notes=_dedupe(notes),
    )


def _cleaning(case, well, fluid, q):
    """Hole cleaning at the check's rate (needs ROP and cuttings on the latest check)."""
    from calc.cleaning import Cuttings, hole_cleaning

    v = case.checks[-1].values
    cut = v.get("cuttings", {})
    if "rop" not in v or "size" not in cut or "density" not in cut:
        return None
    cuttings = Cuttings(
        size=cut["size"], density=cut["density"], sphericity=cut.get("sphericity", 1.0)
    )
    hc = hole_cleaning(well, fluid, q, rop=v["rop"], cuttings=cuttings)
    return {"result": hc, "cuttings": cuttings, "notes": tuple(hc.notes) + cuttings.notes}


def _trips(case, well, fluid, method):
    """Trip-speed limits and surge/swab at the planned speeds (needs [trip] and a window)."""
    from calc.surge import surge_pressure, trip_speed_limits

    trip = case.trip
    if trip is None or case.window is None:
        return None
    lim = case.limits
    end = trip.get("string_end", "auto")
    limits = trip_speed_limits(
        well,
        fluid,
        window=case.window,
        weak_points=case.weak_points,
        fracture_margin=lim["trip_fracture_margin"],
        pore_margin=lim["trip_pore_margin"],
        string_end=end,
        method=method,
    )
    speeds = np.asarray(trip["speeds"], dtype=float)
    run = surge_pressure(well, fluid, speeds, direction="running", string_end=end, method=method)
    pull = surge_pressure(well, fluid, speeds, direction="pulling", string_end=end, method=method)
    notes = tuple(limits.notes) + tuple(run.notes) + tuple(pull.notes)
    return {"limits": limits, "running": run, "pulling": pull, "speeds": speeds, "notes": notes}


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


def flow_window(case, well, fluid, method, cleaning, *, points: int = 61):
    """Flow-rate operating window on a grid of rates (SI).

    Low end: the hole-cleaning minimum rate (controlling interval) when cleaning was computed.
    High end: the largest grid rate at which every check point keeps the required fracture
    margin and the standpipe pressure stays within the surface rating (calc.circulation on the
    whole grid in one call).  Grid: 0.4 to 1.8 × the check's rate; the answer is a grid value.
    """
    from calc.circulation import Margins
    from calc.circulation.loop import circulate

    q0 = case.check_value(-1, "flow_rate")
    lim = case.limits
    qs = np.linspace(0.4 * q0, 1.8 * q0, points)
    res = circulate(
        well,
        fluid,
        qs,
        method=method,
        window=case.window,
        weak_points=case.weak_points,
        margins=Margins(fracture=lim["fracture_margin"], pore=lim["pore_margin"]),
        surface_rating=lim["surface_rating"],
        message_units=case.system,
    )
    ok = np.ones(qs.shape, dtype=bool)
    reasons = []
    if res.margins is not None:
        fm = np.min(np.asarray(res.margins.fracture_margin), axis=-1)
        ok &= fm >= lim["fracture_margin"]
        reasons.append("fracture margin")
    if lim["surface_rating"] is not None:
        ok &= np.asarray(res.standpipe_pressure) <= lim["surface_rating"]
        reasons.append("surface rating")
    q_hi = float(qs[ok].max()) if ok.any() else None
    q_lo = float(cleaning["result"].controlling_rate) if cleaning else None
    return {
        "low": q_lo,
        "high": q_hi,
        "grid": (float(qs[0]), float(qs[-1]), points),
        "high_limited_by": " and ".join(reasons),
    }
