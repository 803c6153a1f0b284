"""Run the calc layer for a case: everything the report and ``--json`` show (SI throughout).

No engineering formula lives here: each number comes from a :mod:`calc` function; this module
only chooses the inputs (latest check, its bit depth, the case's methods) and collects results.
"""

from __future__ import annotations

import datetime as _dt
from dataclasses import dataclass, field

import numpy as np

import calc
from addin.case import Case
from calc.circulation import (
    CirculationResult,
    FrictionCalibration,
    HydraulicsFluid,
    Margins,
    Profile,
    TightestPoint,
    calibrate_friction,
    circulate,
    hydraulics_fluid_from_readings,
    spp_deviation_percent,
)
from calc.cleaning import Cuttings, HoleCleaningResult, hole_cleaning
from calc.geometry import Well
from calc.hydraulics_method import DEFAULT_METHOD  # the report's default: calc's one default
from calc.notes import Note
from calc.rate_window import OperatingWindow, operating_window
from calc.rheology import (
    CheckComparison,
    FitSet,
    ViscometerReadings,
    compare_checks,
    fit_all,
)
from calc.surge import SurgeResult, TripLimits, surge_pressure, trip_speed_limits

__all__ = [
    "CheckHydraulics",
    "CheckResults",
    "CleaningRun",
    "Results",
    "TripRun",
    "compute",
    "report_fluid",
    "scalar",
]

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
#: Rate sweep of the operating window: (first, last) × the latest check's rate, and the count.
WINDOW_SWEEP = (0.3, 1.8, 200)


@dataclass(frozen=True)
class CheckResults:
    """Rheology of one mud check: its readings, every fit, and the comparison with the previous
    check (None for the first)."""

    label: str
    readings: ViscometerReadings
    fits: FitSet
    comparison: CheckComparison | None


@dataclass(frozen=True)
class CheckHydraulics:
    """Hydraulics of one mud check at its own bit depth, rate and density (SI), for the trend.

    ``circulation`` is None (and ``missing`` names the keys) when the check lacks a bit depth,
    density or flow rate.  ``calibration`` is :func:`calc.circulation.calibrate_friction` when
    the check has a measured standpipe pressure the model can reproduce.  Depths [m], densities
    [kg/m³], rates [m³/s], pressures [Pa], PV [Pa·s], YP [Pa].
    """

    label: str
    bit_md: float | None
    density: float | None
    q: float | None
    pv: float | None
    yp: float | None
    circulation: CirculationResult | None
    measured_spp: float | None = None
    calibration: FrictionCalibration | None = None
    pwd_md: float | None = None
    pwd_ecd: float | None = None
    model_ecd_at_pwd: float | None = None
    missing: tuple[str, ...] = ()

    @property
    def spp(self) -> float | None:
        """Predicted standpipe pressure [Pa]."""
        return None if self.circulation is None else scalar(self.circulation.standpipe_pressure)

    @property
    def spp_deviation_percent(self) -> float | None:
        """:func:`calc.circulation.spp_deviation_percent`: 100·(predicted − measured)/measured
        [%] (None without a measurement)."""
        if self.spp is None or not self.measured_spp:
            return None
        return float(spp_deviation_percent(self.spp, self.measured_spp))

    @property
    def tightest(self) -> TightestPoint | None:
        res = self.circulation
        return None if res is None or res.margins is None else res.margins.tightest


@dataclass(frozen=True)
class CleaningRun:
    """Hole cleaning at the latest check's rate, the cuttings it assumed and its notes."""

    result: HoleCleaningResult
    cuttings: Cuttings
    notes: tuple[Note, ...]


@dataclass(frozen=True)
class TripRun:
    """Trip-speed limits and surge/swab at the planned speeds [m/s] (running and pulling)."""

    limits: TripLimits
    running: SurgeResult
    pulling: SurgeResult
    speeds: np.ndarray
    notes: tuple[Note, ...]


@dataclass(frozen=True)
class Results:
    """All results of one report run (the latest check drives hydraulics)."""

    case: Case
    run_time: str
    version: str
    method: str
    checks: tuple[CheckResults, ...]
    well: Well
    fluid: HydraulicsFluid
    circulation: CirculationResult
    profile: Profile
    cleaning: CleaningRun | None
    surge: TripRun | None
    window: OperatingWindow | None = None  # over WINDOW_SWEEP
    notes: tuple[Note, ...] = field(default=())
    trend: tuple[CheckHydraulics, ...] = field(default=())
    profile_step: float = 30.48

    @property
    def calibration(self) -> FrictionCalibration | None:
        """Friction calibration of the latest check (None without a usable measured SPP)."""
        return self.trend[-1].calibration if self.trend else None

    @property
    def latest(self) -> CheckResults:
        return self.checks[-1]


def report_fluid(readings, density: float, method: str, label: str) -> HydraulicsFluid:
    """The fluid as the hydraulics ``method`` fits it, without the fits' notes (the report shows
    them once, on its rheology sheet)."""
    return hydraulics_fluid_from_readings(
        readings, method, density=density, label=label, fit_notes=False
    )


def compute(case, *, method: str = DEFAULT_METHOD, run_time: str | None = None) -> Results:
    """Run rheology, circulation, ECD profile (and cleaning/surge where available) for a case."""
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
    fluid = report_fluid(checks[-1].readings, density, method, case.checks[-1].label)
    res = circulate(well, fluid, q, method=method, **_circulate_options(case))
    step = 30.48 if case.unit_system == "oilfield" else 25.0  # profile grid: 100 ft or 25 m
    prof = res.profile(step)
    notes = list(well.notes) + list(res.notes)
    for c in checks:
        notes.extend(c.readings.notes)
        notes.extend(c.fits.notes)
    latest = (res, fluid)
    trend = tuple(
        _check_hydraulics(case, i, checks[i], method, latest if i == len(checks) - 1 else None)
        for i in range(len(checks))
    )
    if trend[-1].calibration is not None:
        notes.extend(trend[-1].calibration.notes)
    cleaning = _cleaning(case, well, fluid, q)
    surge = _trips(case, well, fluid, method)
    window = _operating_window(case, well, fluid, method, cleaning)
    for part in (cleaning, surge):
        if part is not None:
            notes.extend(part.notes)
    if window is not None:
        notes.extend(window.notes)
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
        trend=trend,
        profile_step=step,
    )


def _circulate_options(case) -> dict:
    lim = case.limits
    return dict(
        window=case.window,
        weak_points=case.weak_points,
        margins=Margins(fracture=lim["fracture_margin"], pore=lim["pore_margin"]),
        surface_rating=lim["surface_rating"],
    )


def _check_hydraulics(case, index, chk, method, latest=None) -> CheckHydraulics:
    """One check's hydraulics at its own bit depth, rate and density.

    ``latest``: the (result, fluid) already computed for this check (reused, not refitted).
    """
    values = case.checks[index].values
    r = chk.readings
    pv = _try(lambda: r.pv)
    yp = _try(lambda: r.yp)
    missing = tuple(k for k in ("bit_depth", "density", "flow_rate") if k not in values)
    if missing:
        return CheckHydraulics(chk.label, values.get("bit_depth"), values.get("density"),
                               values.get("flow_rate"), pv, yp, None, missing=missing)  # fmt: skip
    depth, rho, q = values["bit_depth"], values["density"], values["flow_rate"]
    opts = _circulate_options(case)
    if latest is None:
        well = case.well(index)
        fluid = report_fluid(r, rho, method, chk.label)
        res = circulate(well, fluid, q, method=method, **opts)
    else:
        res, fluid = latest
        well = res.context.well
    meas = values.get("measured_spp")
    cal = None
    if meas is not None and meas > scalar(res.standpipe_pressure) - scalar(res.frictional_loss):
        cal = calibrate_friction(well, fluid, q, meas, method=method, **opts)
    pwd = values.get("pwd", {})
    pwd_md, pwd_ecd = pwd.get("md"), pwd.get("ecd")
    model = None
    if pwd_md is not None and 0 < pwd_md <= res.bit_md:
        model = scalar(res.ecd_at(pwd_md))
    return CheckHydraulics(
        label=chk.label,
        bit_md=depth,
        density=rho,
        q=q,
        pv=pv,
        yp=yp,
        circulation=res,
        measured_spp=meas,
        calibration=cal,
        pwd_md=pwd_md,
        pwd_ecd=pwd_ecd,
        model_ecd_at_pwd=model,
    )


def _try(get):
    try:
        return float(get())
    except Exception:  # the readings lack the speeds this property needs
        return None


def _cleaning(case, well, fluid, q) -> CleaningRun | None:
    """Hole cleaning at the check's rate (needs ROP and cuttings on the latest check)."""
    v = case.checks[-1].values
    cut = v.get("cuttings", {})
    if "rop" not in v or "size" not in cut or "density" not in cut:
        return None
    cuttings = Cuttings(
        size=cut["size"], density=cut["density"], sphericity=cut.get("sphericity", 1.0)
    )
    hc = hole_cleaning(well, fluid, q, rop=v["rop"], cuttings=cuttings, rpm=v.get("rpm"))
    return CleaningRun(result=hc, cuttings=cuttings, notes=tuple(hc.notes) + cuttings.notes)


def _operating_window(case, well, fluid, method, cleaning) -> OperatingWindow | None:
    """calc.rate_window.operating_window over the WINDOW_SWEEP rates, in one vectorised call.

    Limits of the case (pressure window, weak points, margins, surface rating) and, when the
    latest check gives them, its ROP and cuttings (the cleaning limit and cuttings-loaded ECD).
    None without a pressure window (no ECD limits to hold).
    """
    if case.window is None:
        return None
    lo, hi, n = WINDOW_SWEEP
    q0 = case.check_value(-1, "flow_rate")
    lim = case.limits
    cut = cleaning.cuttings if cleaning else None
    return operating_window(
        well,
        fluid,
        np.linspace(lo * q0, hi * q0, n),
        window=case.window,
        weak_points=case.weak_points,
        margins=Margins(fracture=lim["fracture_margin"], pore=lim["pore_margin"]),
        surface_rating=lim["surface_rating"],
        method=method,
        rop=case.checks[-1].values["rop"] if cleaning else 0.0,
        cuttings=cut,
    )


def _trips(case, well, fluid, method) -> TripRun | None:
    """Trip-speed limits and surge/swab at the planned speeds (needs [trip] and a window)."""
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
    return TripRun(limits=limits, running=run, pulling=pull, speeds=speeds, notes=notes)


def _dedupe(notes) -> tuple[Note, ...]:
    return tuple(dict.fromkeys(notes))


def scalar(x) -> float:
    """A 0-d result as a float (the report runs one rate)."""
    return float(np.asarray(x, dtype=float).reshape(-1)[0]) if np.ndim(x) else float(x)
