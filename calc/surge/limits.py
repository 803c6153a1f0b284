"""Trip-speed limits: the highest running and pulling speeds keeping surge and swab inside the
pore/fracture window (whole well) or an allowed pressure change (flat intervals).

Δp rises monotonically with the pipe speed, so each limit is a vectorised bisection in ln V
over every allowance at once (``_speed_limit``; open string with the allowance at the bit:
``_open_speed_limit``).  Where Δp(V) jumps (the Burkhardt fit changes K_c with the regime)
the limit is the speed just below the jump, on the safe side.

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Trip margins and limits: calc/METHODS.md §11.6, §11.7 (field form from memory, not yet
checked against the source).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.bit import DEFAULT_DISCHARGE_COEFFICIENT
from calc.circulation.pore_fracture import limits_at
from calc.errors import InputError, check_choice, check_finite, check_nonnegative, check_positive
from calc.flow.solvers import itp_solve
from calc.notes import Note
from calc.numeric import bisect_increasing, depth_weights, scalar_or_array
from calc.surge.clinging import check_clinging
from calc.surge.emw import trip_allowance
from calc.surge.solver import (
    DIRECTION_SIGN,
    PEAK_FACTOR,
    SurgePaths,
    annulus_state,
    bore_pressure,
    check_peak,
    paths_flat,
    paths_from_well,
    solve,
    string_end_for,
)
from calc.values import Value

__all__ = [
    "IntervalTripLimit",
    "TripLimits",
    "TripPoint",
    "trip_speed_limit",
    "trip_speed_limits",
]


def _safe_side(mid, lo, hi, iterations):
    """Step a log-bisection midpoint down by its final bracket width: the result lies below
    the last bracket's lower end, where the excess is ≤ 0.  Where Δp(V) jumps (the Burkhardt
    fit changes K_c with the regime) the limit is so the speed just below the jump."""
    return mid * np.exp(-np.log(hi / lo) / 2.0**iterations)


def _speed_limit(p: SurgePaths, allow, weights, end, clinging, pf, speed_bracket):
    """Average speed at which Σ gradient·length·weights reaches ``allow`` [m/s] (vectorised
    bisection in ln V over every entry of ``allow`` at once).

    Returns (speeds, stuck): 0 where ``allow`` ≤ 0, and 0 where even the slowest speed of the
    bracket exceeds the allowance (``stuck``: a yield stress gives a finite pressure change at
    any motion in the steady model)."""
    allow = np.asarray(allow, dtype=float)

    def excess(v_avg):
        grad = solve(p, v_avg * pf, end, clinging, iterations=30).gradient
        return np.sum(grad * p.length * weights, axis=-1) - allow

    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    stuck = (allow > 0) & (np.asarray(excess(lo)) >= 0)
    lim = _safe_side(bisect_increasing(excess, lo, hi, iterations=32, log=True), lo, hi, 32)
    return np.where((allow <= 0) | stuck, 0.0, lim), stuck


def _open_speed_limit(p: SurgePaths, allow, clinging, pf, speed_bracket):
    """:func:`_speed_limit` for an open string when the allowance applies at the bit.

    At the limit both paths carry the allowed pressure change: the bore gives q_rel from
    bore(q_rel) = allow (ITP search to double precision), then the annulus gives V from
    annulus(V, q_rel) = allow (log-bisection, safe side) — two sequential searches on the
    same equations instead of one nested in the other."""
    allow = np.asarray(allow, dtype=float)
    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    q_hi = hi * pf * float(np.min(p.area_o))
    q_rel = itp_solve(lambda q: bore_pressure(p, q) - allow, np.zeros_like(allow), q_hi, rtol=2e-16)

    def excess(v_avg):
        vp = v_avg * pf
        qr = np.minimum(q_rel, vp * float(np.min(p.area_o)))
        grad = annulus_state(p, vp, qr, clinging).gradient
        return np.sum(grad * p.length, axis=-1) - allow

    stuck = (allow > 0) & (np.asarray(excess(lo)) >= 0)
    lim = _safe_side(bisect_increasing(excess, lo, hi, iterations=50, log=True), lo, hi, 50)
    return np.where((allow <= 0) | stuck, 0.0, lim), stuck


def _allowance_notes(what: str, allow, stuck, slowest: float) -> list[Note]:
    """Cautions for allowances ≤ 0 (static mud outside the margin) and for points where the
    slowest speed searched already exceeds the allowance."""
    notes = []
    if np.any(allow <= 0):
        notes.append(_static_violation_note(what, int(np.sum(allow <= 0))))
    if np.any(stuck):
        notes.append(_yield_note(what, int(np.sum(stuck)), slowest))
    return notes


def _yield_note(what: str, count: int, slowest: float) -> Note:
    return Note(
        "caution",
        f"{what}_exceeded_at_slowest_speed",
        f"at {{count}} point(s) the {what} at the slowest speed searched ({{slowest}}) "
        f"already exceeds the allowance (the yield stress alone): no safe {what} speed.",
        "trip speed",
        values=(Value("count", float(count)), Value("slowest", float(slowest), "trip_speed")),
    )


def _check_bracket(speed_bracket):
    lo, hi = (float(x) for x in check_positive("speed bracket", speed_bracket, "m/s"))
    if hi <= lo:
        raise InputError("speed bracket", (lo, hi), "(low, high) with low < high")
    return lo, hi


@dataclass(frozen=True)
class TripPoint:
    """A check depth of :class:`TripLimits`.

    index     position in :attr:`TripLimits.md` (and ``names``, the per-depth arrays)
    name      "<casing> shoe", "bit" or a weak point's name; ``""`` for a plain depth of the
              exposed hole (the faces say where it is from ``md``)
    md, tvd   measured and true vertical depth [m]
    """

    index: int
    name: str
    md: float
    tvd: float


@dataclass(frozen=True, eq=False)
class TripLimits:
    """Maximum trip speeds keeping surge EMW below fracture − margin and swab EMW above
    pore + margin at every check depth (SI; speeds are average stand speeds).

    max_running_speed, max_pulling_speed   [m/s] (the tightest depth governs)
    running_point, pulling_point          the governing check depth (:class:`TripPoint`)
    md, tvd                               check depths [m] (last shoe to bit, weak points)
    names                                 their names ("" for plain depths, see TripPoint)
    running_limit, pulling_limit          per-depth speed limits [m/s]
    surge_allowance, swab_allowance       allowed pressure change per depth [Pa]
    peak_factor                           peak over average stand speed [-]
    string_end                            "closed" or "open"
    method                                surge model, friction method, search
    fracture_margin, pore_margin          trip margins [kg/m³]
    """

    max_running_speed: float
    max_pulling_speed: float
    running_point: TripPoint
    pulling_point: TripPoint
    md: np.ndarray
    tvd: np.ndarray
    names: tuple[str, ...]
    running_limit: np.ndarray
    pulling_limit: np.ndarray
    surge_allowance: np.ndarray
    swab_allowance: np.ndarray
    peak_factor: float
    string_end: str
    method: str
    fracture_margin: float
    pore_margin: float
    notes: tuple[Note, ...] = ()


def _exposed_hole(well) -> tuple[float, str]:
    """Top of the exposed hole [m] (the deepest casing or liner shoe above the bit, 0 without
    one) and that shoe's name ("<section> shoe", "" without one)."""
    last = well.last_shoe
    return (0.0, "") if last is None else (float(last.bottom), f"{last.name} shoe")


def _check_points(well, weak_points, step):
    """Check depths: every ``step`` from the last shoe (the top of the exposed hole) to the bit,
    plus the weak points; named "<casing> shoe", "bit" and by weak point ("" elsewhere)."""
    bit = float(well.bit_depth)
    top, shoe = _exposed_hole(well)
    md = np.unique(np.append(np.arange(top, bit, step), bit))
    md = md[md > 0]
    names = [""] * md.size
    names[-1] = "bit"
    if shoe and md[0] == top:
        names[0] = shoe
    for wp in weak_points:
        if 0 < wp.md <= bit:
            md = np.append(md, wp.md)
            names.append(wp.name)
    return md, tuple(names)


def _point(i: int, names, md, tvd) -> TripPoint:
    return TripPoint(index=i, name=names[i], md=float(md[i]), tvd=float(tvd[i]))


def trip_speed_limits(
    well,
    fluid,
    *,
    window,
    weak_points=(),
    fracture_margin: float = 0.0,
    pore_margin: float = 0.0,
    string_end: str = "auto",
    method: str | None = None,
    clinging="burkhardt",
    peak_factor: float = PEAK_FACTOR,
    eccentricity: float = 0.0,
    step: float = 30.0,
    speed_bracket: tuple[float, float] = (1e-4, 10.0),
    hydrostatic: str = "exact",
) -> TripLimits:
    """Maximum running and pulling speeds at which surge and swab stay inside the margins.

    .. math:: \\Delta p_{surge}(z) \\le (\\rho_{frac}(z) - m_f - \\rho)\\,g\\,TVD(z),\\quad
              \\Delta p_{swab}(z) \\le (\\rho - \\rho_{pore}(z) - m_p)\\,g\\,TVD(z)

    Δp rises monotonically with the speed, so each depth's limit is found by vectorised
    bisection (all depths at once); the smallest governs and its depth is named.

    Parameters
    ----------
    well, fluid
        As :func:`surge_pressure`.
    window : calc.circulation.PressureWindow
        Pore and fracture EMW versus TVD.
    weak_points : sequence of calc.circulation.WeakPoint
        Override the window at their MD (shoe tests, depleted sands).
    fracture_margin, pore_margin : float
        Trip margins [kg/m³] (surge EMW ≤ fracture − margin; swab EMW ≥ pore + margin).
    step : float
        Spacing of check depths from the last shoe to the bit [m].
    speed_bracket : (float, float)
        Search range for the average speed [m/s]; a limit at the top end means "not limiting".

    Returns
    -------
    TripLimits

    Notes
    -----
    Limits are average stand speeds (the surge uses ``peak_factor`` × speed).  Rules
    (from memory, not yet checked against a source; calc/METHODS.md §11.7) — the tightest point is
    often the last shoe for surge, the deepest permeable zone for swab.
    """
    mf = float(check_nonnegative("fracture margin", fracture_margin, "kg/m³"))
    mp = float(check_nonnegative("pore margin", pore_margin, "kg/m³"))
    stp = float(check_positive("check-depth step", step, "m"))
    pf = check_peak(peak_factor)
    bracket = _check_bracket(speed_bracket)
    clinging = check_clinging(clinging)
    end, notes = string_end_for(well, string_end)
    notes = list(notes)
    p = paths_from_well(well, fluid, method, eccentricity)
    a = well.flow_intervals().annulus
    md, names = _check_points(well, tuple(weak_points), stp)
    tvd = np.asarray(well.tvd_at(md), dtype=float)
    pore, frac = limits_at(md, tvd, names, window, tuple(weak_points))
    allow_surge = trip_allowance(frac - mf, p.rho, tvd, "running", hydrostatic=hydrostatic)
    allow_swab = trip_allowance(pore + mp, p.rho, tvd, "pulling", hydrostatic=hydrostatic)
    top, bot = np.asarray(a.top_md), np.asarray(a.bottom_md)
    w = depth_weights(md, top, bot)

    # surge and swab have the same magnitude in the steady model: bisect both sets of depths in
    # one vectorised pass (running limits first, pulling limits second)
    allow = np.concatenate([allow_surge, allow_swab])
    lim, stuck = _speed_limit(p, allow, np.concatenate([w, w]), end, clinging, pf, bracket)
    limits = [lim[: md.size], lim[md.size :]]
    for al, st, what in (
        (allow_surge, stuck[: md.size], "surge"),
        (allow_swab, stuck[md.size :], "swab"),
    ):
        notes += _allowance_notes(what, al, st, bracket[0])
    run, pull = limits
    ir, ip = int(np.argmin(run)), int(np.argmin(pull))
    for lim, what in ((run, "running"), (pull, "pulling")):
        if np.min(lim) >= 0.999 * bracket[1]:
            notes.append(_not_limiting_note(what, bracket[1]))
    return TripLimits(
        max_running_speed=float(run[ir]),
        max_pulling_speed=float(pull[ip]),
        running_point=_point(ir, names, md, tvd),
        pulling_point=_point(ip, names, md, tvd),
        md=md,
        tvd=tvd,
        names=names,
        running_limit=run,
        pulling_limit=pull,
        surge_allowance=allow_surge,
        swab_allowance=allow_swab,
        peak_factor=pf,
        string_end=end,
        method=f"Burkhardt (1961) steady surge/swab, friction {p.method}, vectorised bisection",
        fracture_margin=mf,
        pore_margin=mp,
        notes=tuple(dict.fromkeys(notes)),
    )


def _static_violation_note(what: str, count: int) -> Note:
    return Note(
        "caution",
        f"{what}_margin_violated_static",
        f"the static mud weight already violates the {what} margin at {{count}} check "
        f"depth(s): no safe {what} speed.",
        "trip speed",
        values=(Value("count", float(count)),),
    )


def _not_limiting_note(what: str, top: float) -> Note:
    return Note(
        "info",
        f"{what}_not_limiting",
        f"{what} speed not limited within {{top}}.",
        "trip speed",
        values=(Value("top", float(top), "trip_speed"),),
    )


@dataclass(frozen=True, eq=False)
class IntervalTripLimit:
    """Highest trip speed keeping the summed surge (or swab) of a set of intervals within an
    allowed pressure change (SI; shape of the allowance).

    max_speed          average stand speed at the limit [m/s] (0: no safe speed, see notes)
    peak_speed         max_speed × peak_factor [m/s]
    allowed_pressure   allowance [Pa]; ``pressure_at_limit`` the signed change at max_speed [Pa]
    limited            False where the speed is not limited within the search bracket
    direction          "running" (surge) or "pulling" (swab)
    string_end         "closed" or "open"
    peak_factor        peak over average stand speed [-]
    method             surge model, friction method, search
    """

    max_speed: float | np.ndarray
    peak_speed: float | np.ndarray
    allowed_pressure: float | np.ndarray
    pressure_at_limit: float | np.ndarray
    limited: bool | np.ndarray
    direction: str
    string_end: str
    peak_factor: float
    method: str
    notes: tuple[Note, ...] = ()


def trip_speed_limit(
    allowed_pressure,
    d_hole,
    d_pipe,
    length,
    *,
    density,
    tau_y,
    k,
    n,
    direction: str = "running",
    d_bore=None,
    tfa=None,
    discharge_coefficient: float = DEFAULT_DISCHARGE_COEFFICIENT,
    bore_parameters=None,
    string_end: str = "closed",
    method: str | None = None,
    clinging="burkhardt",
    peak_factor: float = PEAK_FACTOR,
    eccentricity=0.0,
    speed_bracket: tuple[float, float] = (1e-4, 10.0),
) -> IntervalTripLimit:
    """Maximum average trip speed at which the intervals' summed |Δp| stays ≤ the allowance.

    .. math:: \\sum_i \\left(\\frac{dp}{dL}\\right)_i\\!(V_{e,i}(f_{peak}V))\\,L_i
              = \\Delta p_{allowed}

    Solved for V by vectorised bisection in ln V over every allowance at once (Δp rises
    monotonically with V).  The intervals are those from surface down to the depth whose
    allowance is given (:func:`trip_allowance`); with an open string they must reach the bit.

    Parameters
    ----------
    allowed_pressure : float or array_like
        Allowed pressure change [Pa] (≤ 0: no safe speed, the result is 0 with a caution).
    d_hole, d_pipe, length, density, tau_y, k, n, d_bore, tfa, discharge_coefficient,
    bore_parameters, string_end, method, clinging, peak_factor, eccentricity
        As for :func:`interval_surge`.
    direction : {"running", "pulling"}
        Surge or swab (the same magnitude in the steady model; sets the sign and the notes).
    speed_bracket : (float, float)
        Search range of the average speed [m/s]; a limit at its top means "not limiting".

    Returns
    -------
    IntervalTripLimit

    >>> r = trip_speed_limit(1e5, 0.2, 0.1, 1000.0, density=1200.0, tau_y=0.0, k=0.05, n=1.0)
    >>> round(r.pressure_at_limit / 1e5, 6), bool(r.limited)
    (1.0, True)
    """
    direction = check_choice("direction", direction, ("running", "pulling"))
    allow = np.asarray(check_finite("allowed pressure change", allowed_pressure, "Pa"))
    pf = check_peak(peak_factor)
    bracket = _check_bracket(speed_bracket)
    clinging = check_clinging(clinging)
    p, end, _ = paths_flat(
        d_hole, d_pipe, length, density=density, tau_y=tau_y, k=k, n=n, d_bore=d_bore,
        tfa=tfa, cd=discharge_coefficient, bore_parameters=bore_parameters,
        string_end=string_end, method=method, eccentricity=eccentricity,
    )  # fmt: skip
    if end == "open":
        lim, stuck = _open_speed_limit(p, allow, clinging, pf, bracket)
    else:
        lim, stuck = _speed_limit(p, allow, 1.0, end, clinging, pf, bracket)
    grad = solve(p, lim * pf, end, clinging).gradient
    at = DIRECTION_SIGN[direction] * np.sum(grad * p.length, axis=-1)
    limited = lim < 0.999 * bracket[1]
    what = "surge" if direction == "running" else "swab"
    notes = _allowance_notes(what, allow, stuck, bracket[0])
    if not np.all(limited):
        notes.append(_not_limiting_note(direction, bracket[1]))
    return IntervalTripLimit(
        max_speed=scalar_or_array(lim),
        peak_speed=scalar_or_array(lim * pf),
        allowed_pressure=scalar_or_array(allow),
        pressure_at_limit=scalar_or_array(at),
        limited=bool(limited) if np.ndim(limited) == 0 else limited,
        direction=direction,
        string_end=end,
        peak_factor=pf,
        method=f"Burkhardt (1961) steady {what}, friction {p.method}, vectorised bisection",
        notes=tuple(notes),
    )
