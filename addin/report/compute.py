"""Run the calc layer for a case: everything the report and ``--json`` show (SI throughout).

No engineering formula lives here: each number comes from a :mod:`calc` function; this module
only chooses the inputs (latest check, its bit depth, the case's methods) and collects results.
"""

from __future__ import annotations

import datetime as _dt
from dataclasses import dataclass, field

import numpy as np

import calc
from addin.case import Case, CaseInputError
from addin.cement_job import CementJob, cement_job
from addin.report.downhole import DownholeRun, compute_downhole
from addin.report.rheology_temperature import TemperatureTable, rheology_notes, temperature_table
from addin.report.trace import bed_method_of, slip_method_of
from addin.slurry_case import slurry_lines
from calc.circulation import (
    BALANCE_RESOLUTION,
    BALANCE_RESOLUTION_PRESSURISED,
    DIAL_RESOLUTION,
    RATE_UNCERTAINTY,
    CirculationResult,
    EcdBand,
    FrictionCalibration,
    HydraulicsFluid,
    Margins,
    MarginTable,
    Profile,
    TightestPoint,
    TwoPartCalibration,
    calibrate_friction,
    calibrate_two_part,
    check_band_inputs,
    circulate,
    ecd_band,
    hydraulics_fluid_from_readings,
    spp_deviation_percent,
)
from calc.cleaning import (
    Cuttings,
    HoleCleaningResult,
    LoadedProfile,
    WellBeds,
    cuttings_ecd_increment,
    hole_cleaning,
    loaded_ecd_profile,
    loaded_margins,
    well_cuttings_beds,
)
from calc.errors import InputError
from calc.geometry import Well
from calc.hydraulics_method import HydraulicsMethod  # None → the case's method or calc's default
from calc.notes import Note
from calc.pumps import Pump, pumps_rate, pumps_spm
from calc.rate_window import OperatingWindow, operating_window
from calc.rheology import (
    CheckComparison,
    FitSet,
    ViscometerReadings,
    compare_checks,
    fit_all,
)
from calc.slurry import SlurryCurve, operating_curve
from calc.surge import (
    DEFAULT_ACCELERATION_TIME,
    GEL_CHOICES,
    BreakCirculationResult,
    SurgeResult,
    TripLimits,
    TripSchedule,
    break_circulation_pressure,
    surge_pressure,
    trip_schedule,
)
from calc.values import Value
from calc.verification import caveat_notes

__all__ = [
    "CheckHydraulics",
    "CheckResults",
    "CleaningRun",
    "LoadedECD",
    "PumpRun",
    "Results",
    "TripRun",
    "band_inputs",
    "compute",
    "pump_run",
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
#: The report's operating window holds the cuttings-loaded ECD against fracture
#: (calc.rate_window.ECD_BASES).
WINDOW_ECD_BASIS = "loaded"


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
class LoadedECD:
    """ECD with the annular cuttings load at the latest check's rate (SI, kg/m³).

    ``margins``: :func:`calc.cleaning.loaded_margins` (fracture margins and the tightest point
    on the loaded ECD; None without a pressure window); ``ecd_bit`` / ``ecd_bit_clean``: loaded
    and clean ECD at the bit; ``increment_bit``: their difference; ``profile``:
    :func:`calc.cleaning.loaded_ecd_profile` on the report's grid.
    """

    margins: MarginTable | None
    ecd_bit: float
    ecd_bit_clean: float
    increment_bit: float
    profile: LoadedProfile


@dataclass(frozen=True)
class TripRun:
    """Trip-speed limits (bit at the bottom), the schedule per depth band, surge/swab at the
    planned speeds [m/s] (running and pulling) and breaking circulation after the trip.

    stand_gel, circulation_gel   (which gel of the latest check, its value [Pa] or None)
    acceleration_time            time to reach the peak speed [s]
    """

    limits: TripLimits
    running: SurgeResult
    pulling: SurgeResult
    speeds: np.ndarray
    notes: tuple[Note, ...]
    schedule: TripSchedule | None = None
    break_circulation: BreakCirculationResult | None = None
    stand_gel: tuple[str, float | None] = ("10s", None)
    circulation_gel: tuple[str, float | None] = ("10min", None)
    acceleration_time: float = DEFAULT_ACCELERATION_TIME


#: Relative gap between the rate the pumps' spm give and the check's flow rate beyond which a
#: note is given (common practice: about the spread of volumetric efficiency between pumps).
PUMP_RATE_TOLERANCE = 0.03


@dataclass(frozen=True)
class PumpRun:
    """The case's pumps at the latest check (SI).

    pumps        every pump (:class:`calc.pumps.Pump`)
    running      the pumps running (spm > 0 in ``pump_spm``; every pump without it)
    spm          the latest check's ``pump_spm`` (None if not given)
    q_from_spm   the rate those spm give [m³/s] (None without ``spm``)
    notes        a note when ``q_from_spm`` and the check's rate differ by more than 3 %
    """

    pumps: tuple[Pump, ...]
    running: tuple[Pump, ...]
    spm: tuple[float, ...] | None
    q_from_spm: float | None
    notes: tuple[Note, ...] = ()

    def spm_at(self, q) -> float | None:
        """Strokes per minute of each running pump at total rate ``q`` [m³/s] (the same on each,
        :func:`calc.pumps.pumps_spm`); None without running pumps or above the pumps' speed."""
        if not self.running:
            return None
        try:
            return float(pumps_spm(self.running, q))
        except InputError:  # the rate needs more strokes than a pump can make
            return None


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
    loaded: LoadedECD | None = None  # with the cuttings load (needs cleaning)
    beds: WellBeds | None = None  # stationary cuttings beds (needs cleaning)
    band: EcdBand | None = None  # the input-uncertainty band (clean circulating mud)
    pumps: PumpRun | None = None  # the pumps (needs [[pump]] with liner and stroke)
    two_part: TwoPartCalibration | None = None  # string and annulus calibration (needs pwd)
    downhole: DownholeRun | None = None  # density at downhole T and p (needs [temperature])
    slurry_lines: tuple[SlurryCurve, ...] | None = None  # only with [[slurry_line]]
    cement: CementJob | None = None  # the placement of [cement_job] (only with that section)
    temperature_table: TemperatureTable | None = None  # latest check read at 2+ temperatures

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


def compute(
    case, *, method: str | HydraulicsMethod | None = None, run_time: str | None = None
) -> Results:
    """Run rheology, circulation, ECD profile (and cleaning/surge where available) for a case.

    ``method``: a hydraulics-method name or preset; None → the case's ``[case].method`` and
    ``[case].constants`` (:meth:`addin.case.Case.hydraulics_method`; default
    :data:`~calc.hydraulics_method.DEFAULT_METHOD`, exact constants).  ``Results.method`` is its
    label, e.g. ``"api13d_1995_power_law (constants=as_printed)"``.
    """
    method = method if isinstance(method, HydraulicsMethod) else case.hydraulics_method(method)
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
    notes.extend(rheology_notes(case.checks[-1], fluid))
    t_table = temperature_table(case.checks[-1], method, density)
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
    band = ecd_band(
        well,
        checks[-1].readings,
        density,
        q,
        method=method,
        window=case.window,
        weak_points=case.weak_points,
        margins=_circulate_options(case)["margins"],
        **band_inputs(case, density),
        **case.loss_options(),
    )
    notes.extend(band.notes)
    downhole = compute_downhole(case, res, step)
    if downhole is not None:
        notes.extend(downhole.profile.notes)
    cleaning = _cleaning(case, well, fluid, q)
    loaded = _loaded(well, res, cleaning, step)
    beds = _beds(case, well, fluid, q, cleaning, method)
    surge = _trips(case, well, fluid, method)
    pumps = pump_run(case, q)
    window = _operating_window(case, well, fluid, method, cleaning, pumps)
    two_part = _two_part(case, well, fluid, q, method, cleaning, float(res.bit_md))
    if isinstance(two_part, Note):  # no positive multiplier reproduces the measurements
        notes.append(two_part)
        two_part = None
    for part in (pumps, two_part):
        if part is not None:
            notes.extend(part.notes)
    if beds is not None:
        notes.extend(beds.notes)
    for part in (cleaning, surge):
        if part is not None:
            notes.extend(part.notes)
    if window is not None:
        notes.extend(window.notes)
    # one note per caveat of the methods used (calc.verification), shown with the others
    slip = slip_method_of(cleaning.result.method) if cleaning is not None else None
    slurry = _slurry_lines(case)
    used = ()
    if slurry is not None:
        for curve in slurry:
            notes.extend(curve.notes)
        used = tuple(dict.fromkeys(m for curve in slurry for m in curve.methods))
    notes.extend(caveat_notes(method, slip, bed_method_of(beds), used))
    return Results(
        case=case,
        run_time=run_time,
        version=calc.__version__,
        method=method.label,
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
        loaded=loaded,
        beds=beds,
        band=band,
        pumps=pumps,
        two_part=two_part,
        downhole=downhole,
        slurry_lines=slurry,
        cement=cement_job(case, method),
        temperature_table=t_table,
    )


def pump_run(case, q) -> PumpRun | None:
    """The case's pumps, the latest check's spm and the rate they give (None without pumps)."""
    pumps = case.pumps
    if not pumps:
        return None
    spm = case.pump_spm(-1)
    running = case.running_pumps(-1)
    q_spm = None if spm is None else pumps_rate(pumps, spm)
    notes = ()
    if q_spm is not None and abs(q_spm - q) > PUMP_RATE_TOLERANCE * q:
        notes = (
            Note(
                "warning",
                "pump_rate_mismatch",
                "the pumps' strokes per minute give {pump_rate}, the check's flow rate is "
                "{rate}: check the spm, the liners and the volumetric efficiency",
                "pumps",
                values=(Value("pump_rate", q_spm, "flow_rate"), Value("rate", q, "flow_rate")),
            ),
        )
    return PumpRun(pumps=pumps, running=running, spm=spm, q_from_spm=q_spm, notes=notes)


def gauge_increment(case, well, cleaning) -> float:
    """The cuttings load's ECD increment at the latest check's downhole gauge [kg/m³] (0
    without cleaning): what the two-part calibration leaves out of the friction it fits."""
    if cleaning is None:
        return 0.0
    v = case.checks[-1].values
    return float(
        cuttings_ecd_increment(
            well, cleaning.result.transport.loaded_density, v["density"], v["pwd"]["md"]
        )
    )


def _two_part(case, well, fluid, q, method, cleaning, bit_md) -> TwoPartCalibration | Note | None:
    """calc.circulation.calibrate_two_part for the latest check when it has a downhole gauge
    above the bit (with its measured SPP when given); the gauge is fitted with the
    cuttings-loaded ECD when the report has the cuttings load.  None otherwise, or when no
    positive multiplier reproduces the measurements (then a note saying why)."""
    v = case.checks[-1].values
    pwd = v.get("pwd", {})
    md, ecd = pwd.get("md"), pwd.get("ecd")
    if md is None or ecd is None or not 0 < md <= bit_md:
        return None
    try:
        return calibrate_two_part(
            well, fluid, q, measured_spp=v.get("measured_spp"), gauge_ecd=ecd, gauge_md=md,
            gauge_increment=gauge_increment(case, well, cleaning), method=method,
            **_circulate_options(case),
        )  # fmt: skip
    except InputError as exc:  # e.g. a gauge below the static density: shown uncalibrated
        return Note(
            "warning",
            "two_part_not_calibrated",
            "two-part calibration not possible: {reason}",
            "calibration",
            values=(Value("reason", str(exc)),),
        )


def _slurry_lines(case) -> tuple[SlurryCurve, ...] | None:
    """The operating curve of every ``[[slurry_line]]`` (calc.slurry; None without one)."""
    lines = slurry_lines(case)
    if not lines:
        return None
    return tuple(operating_curve(line) for line in lines)


def _loaded(well, res, cleaning, step) -> LoadedECD | None:
    """The cuttings-loaded ECD at the check's rate (calc.cleaning; None without cleaning)."""
    if cleaning is None:
        return None
    hc = cleaning.result
    rho = float(res.density)
    clean_bit = scalar(res.ecd_bit)
    inc = float(cuttings_ecd_increment(well, hc.transport.loaded_density, rho, float(res.bit_md)))
    mt = None if res.margins is None else loaded_margins(res.margins, hc, well, rho)
    return LoadedECD(
        margins=mt,
        ecd_bit=clean_bit + inc,
        ecd_bit_clean=clean_bit,
        increment_bit=inc,
        profile=loaded_ecd_profile(res, hc, well, step),
    )


def _beds(case, well, fluid, q, cleaning, method) -> WellBeds | None:
    """Stationary cuttings beds at the check's rate (calc.cleaning.well_cuttings_beds)."""
    if cleaning is None:
        return None
    return well_cuttings_beds(
        well, fluid, q, rop=case.checks[-1].values["rop"], cuttings=cleaning.cuttings,
        method=method,
    )  # fmt: skip


#: The mud balances of a case's ``[uncertainty] balance`` and their resolutions [kg/m³].
BALANCES = {"standard": BALANCE_RESOLUTION, "pressurised": BALANCE_RESOLUTION_PRESSURISED}
#: calc's names of the band inputs → the keys of the case's ``[uncertainty]`` section.
_BAND_KEYS = {
    "dial-reading resolution": "dial_resolution",
    "mud-balance resolution": "balance_resolution",
    "flow-rate uncertainty (pump volumetric efficiency)": "rate_uncertainty",
}


def band_inputs(case, density: float) -> dict:
    """The ECD band's half-widths from the case's optional ``[uncertainty]`` section: keywords
    of :func:`calc.circulation.ecd_band` (defaults: calc's, a standard balance).

    An impossible value raises an InputError naming the case file and key.
    """
    u = case.sections.get("uncertainty", {})
    balance = (
        str(u.get("balance", "standard")).strip().lower().replace("pressurized", "pressurised")
    )
    if balance not in BALANCES:
        raise CaseInputError(
            case.unit_system,
            f"{case.source}: uncertainty.balance",
            u.get("balance"),
            "standard or pressurised",
        )
    kw = dict(
        dial_resolution=u.get("dial_resolution", DIAL_RESOLUTION),
        balance_resolution=u.get("balance_resolution", BALANCES[balance]),
        rate_uncertainty=u.get("rate_uncertainty", RATE_UNCERTAINTY),
    )
    try:
        check_band_inputs(density=density, **kw)
    except InputError as exc:
        key = _BAND_KEYS.get(exc.name)
        if key is None:
            raise
        raise CaseInputError.of(case.unit_system, exc, f"{case.source}: uncertainty.{key}") from exc
    return kw


def _circulate_options(case, index: int = -1) -> dict:
    lim = case.limits
    return dict(
        window=case.window,
        weak_points=case.weak_points,
        margins=Margins(fracture=lim["fracture_margin"], pore=lim["pore_margin"]),
        surface_rating=lim["surface_rating"],
        **case.loss_options(index),
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
    opts = _circulate_options(case, index)
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


def _operating_window(case, well, fluid, method, cleaning, pumps=None) -> OperatingWindow | None:
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
        ecd_basis=WINDOW_ECD_BASIS,
        rpm=case.checks[-1].values.get("rpm") if cleaning else None,
        pumps=pumps.running if pumps is not None else (),
    )


#: Depth band of the trip schedule when [trip] schedule_band is not given [m] (1000 ft).
SCHEDULE_BAND = 304.8
#: Gels a trip may name ([trip] stand_gel, circulation_gel): keys of a check's ``gels``.
GEL_KEYS = ("10s", "10min", "30min")


def _gel_choice(trip, key, default, gels):
    """(gel key, value [Pa] or None) for a [trip] choice; an unknown key is an InputError."""
    name = trip.get(key, default)
    if name not in GEL_KEYS:
        raise InputError(f"trip.{key}", name, ", ".join(GEL_KEYS))
    return name, gels.get(name)


def _trips(case, well, fluid, method) -> TripRun | None:
    """Trip-speed limits, the schedule per depth band and surge/swab at the planned speeds
    (needs [trip] and a window); gels from the latest check (calc.surge.GEL_CHOICES)."""
    trip = case.trip
    if trip is None or case.window is None:
        return None
    lim = case.limits
    end = trip.get("string_end", "auto")
    t_acc = trip.get("acceleration_time_s", DEFAULT_ACCELERATION_TIME)
    if not isinstance(t_acc, int | float) or isinstance(t_acc, bool) or not t_acc > 0:
        raise InputError("trip.acceleration_time_s", t_acc, "a time > 0 s")
    gels = case.checks[-1].values.get("gels", {})
    stand = _gel_choice(trip, "stand_gel", GEL_CHOICES["stand"], gels)
    circ = _gel_choice(trip, "circulation_gel", GEL_CHOICES["break_circulation"], gels)
    for name, value in (stand, circ):
        if value is not None and value < 0:
            raise InputError(f"check.gels.{name}", value, "a gel strength >= 0")
    schedule = trip_schedule(
        well,
        fluid,
        window=case.window,
        weak_points=case.weak_points,
        fracture_margin=lim["trip_fracture_margin"],
        pore_margin=lim["trip_pore_margin"],
        string_end=end,
        method=method,
        band_length=trip.get("schedule_band", SCHEDULE_BAND),
        acceleration_time=float(t_acc),
        stand_gel=stand[1],
    )
    limits = schedule.at_bit[-1]  # the bit at the bottom: calc.surge.trip_speed_limits
    speeds = np.asarray(trip["speeds"], dtype=float)
    run = surge_pressure(well, fluid, speeds, direction="running", string_end=end, method=method)
    pull = surge_pressure(well, fluid, speeds, direction="pulling", string_end=end, method=method)
    bc = None
    if circ[1] is not None:
        bc = break_circulation_pressure(well, circ[1], density=fluid.density)
    notes = tuple(schedule.notes) + tuple(run.notes) + tuple(pull.notes)
    if stand[1] is None or circ[1] is None:
        notes += (
            Note(
                "info",
                "trip_gel_not_measured",
                "the latest check has no {gel} gel: the gel-breaking terms of the trip are left "
                "out.",
                "trip",
                values=(Value("gel", stand[0] if stand[1] is None else circ[0]),),
            ),
        )
    return TripRun(
        limits=limits,
        running=run,
        pulling=pull,
        speeds=speeds,
        notes=notes,
        schedule=schedule,
        break_circulation=bc,
        stand_gel=stand,
        circulation_gel=circ,
        acceleration_time=float(t_acc),
    )


def _dedupe(notes) -> tuple[Note, ...]:
    return tuple(dict.fromkeys(notes))


def scalar(x) -> float:
    """A 0-d result as a float (the report runs one rate)."""
    return float(np.asarray(x, dtype=float).reshape(-1)[0]) if np.ndim(x) else float(x)
