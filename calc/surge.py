"""Surge and swab: pressure change from moving pipe, trip-speed limits, breaking circulation.

Steady-state method after Burkhardt (1961): the annulus is treated as a stationary-wall flow at
the *effective* velocity

.. math:: V_e = \\frac{Q_a}{A_a} + K_c V_p,\\qquad
          Q_a = V_p\\frac{\\pi}{4}D_1^2 - q_{rel}

(V_p pipe speed, D1 the local pipe OD, K_c the clinging constant, q_rel the flow entering an
open pipe relative to it; closed end q_rel = 0).  Any :mod:`calc.flow` method gives the
friction gradient at V_e in each annular interval; running in raises the pressure (surge),
pulling out lowers it by the same amount (swab) in this steady model.  Open end: q_rel is found
by bracketed bisection so that the annulus and the bore (friction at the velocity relative to
the pipe wall, plus the bit nozzles) give the same pressure change at the bit.

Clinging constants (fits to Burkhardt's chart; Guo & Liu 2011, eqs. 2.81-2.82):
laminar K_c = 0.275(D1/D2) + 0.25, turbulent K_c = 0.1(D1/D2) + 0.41.  For Newtonian laminar
flow in a concentric annulus the exact value is :func:`clinging_constant_exact_newtonian`.

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Guo, B. & Liu, G. (2011) Applied Drilling Circulation Systems, ch. 2.
Bourgoyne, A.T. et al. (1986) Applied Drilling Engineering, SPE Textbook Series 2, ch. 4.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.bit import DEFAULT_DISCHARGE_COEFFICIENT
from calc.cleaning._numeric import bisect_increasing, scalar_or_array
from calc.errors import (
    InputError,
    Note,
    check_choice,
    check_finite,
    check_nonnegative,
    check_positive,
)

__all__ = [
    "BreakCirculationResult",
    "IntervalSurge",
    "IntervalTripLimit",
    "SurgeResult",
    "TripLimits",
    "break_circulation_pressure",
    "clinging_constant",
    "clinging_constant_exact_newtonian",
    "gel_break_pressure",
    "interval_surge",
    "surge_pressure",
    "trip_allowance",
    "trip_emw",
    "trip_speed_limit",
    "trip_speed_limits",
]

#: Ratio of peak to average stand speed used by default, 1.5 (from memory, unverified —
#: METHODS §8).  Set ``peak_factor=1`` when the speed given is already the peak speed.
PEAK_FACTOR = 1.5

_SIGN = {"running": 1.0, "pulling": -1.0}


def clinging_constant(d_pipe, d_hole, regime="laminar"):
    """Burkhardt clinging constant K_c from the fits to his chart [-].

    .. math:: K_c = 0.275\\,\\frac{D_1}{D_2} + 0.25\\ \\text{(laminar)},\\qquad
              K_c = 0.1\\,\\frac{D_1}{D_2} + 0.41\\ \\text{(turbulent)}

    Parameters
    ----------
    d_pipe, d_hole : array_like
        Pipe OD D1 and hole ID D2 [m].
    regime : {"laminar", "turbulent"} or array of bool
        ``True`` entries of a boolean array mean turbulent.

    References
    ----------
    Guo & Liu (2011), eqs. 2.81-2.82 (placement of D1/D2 inferred; METHODS §8, §11 item 10).

    >>> round(clinging_constant(0.5, 1.0), 4)
    0.3875
    """
    k = np.asarray(d_pipe, dtype=float) / np.asarray(d_hole, dtype=float)
    if isinstance(regime, str):
        turb = check_choice("regime", regime, ("laminar", "turbulent")) == "turbulent"
    else:
        turb = np.asarray(regime, dtype=bool)
    return scalar_or_array(np.where(turb, 0.1 * k + 0.41, 0.275 * k + 0.25))


def clinging_constant_exact_newtonian(d_pipe, d_hole):
    """Exact clinging constant for laminar Newtonian flow in a concentric annulus [-].

    .. math:: K_c = \\frac{1}{2\\ln(1/\\kappa)} - \\frac{\\kappa^2}{1 - \\kappa^2},\\quad
              \\kappa = D_1/D_2

    Derivation: the axial drag (Couette) flow of an inner cylinder moving at V_p in a fixed outer
    cylinder, u = V_p ln(R2/r)/ln(R2/R1), carries Q_d = πV_p[(R2² - R1²)/(2 ln(R2/R1)) - R1²];
    by linearity of Stokes flow the moving-wall problem equals a stationary-wall flow of
    Q_a + Q_d, so K_c = Q_d/(V_p·π(R2² - R1²)) (Bird, Stewart & Lightfoot 2002, problem 2B.7
    type axial annular flow with a moving rod).

    >>> round(clinging_constant_exact_newtonian(0.5, 1.0), 4)
    0.388
    """
    k = np.asarray(d_pipe, dtype=float) / np.asarray(d_hole, dtype=float)
    return scalar_or_array(1.0 / (2.0 * np.log(1.0 / k)) - k**2 / (1.0 - k**2))


@dataclass(frozen=True, eq=False)
class SurgeResult:
    """Pressure change from pipe movement (SI; arrays: speed axes + interval axis).

    speed              pipe speed given [m/s] (average stand speed)
    peak_speed         speed used, speed × peak_factor [m/s]
    direction          "running" (surge, +) or "pulling" (swab, −)
    string_end         "closed" or "open"
    names, top_md, bottom_md     annular intervals, bit upwards
    clinging           K_c per interval
    relative_inflow    q_rel, flow entering the open pipe relative to it [m³/s] (0 closed)
    effective_rate     V_e·A_a per interval [m³/s]; ``effective_velocity`` V_e [m/s]
    gradient           friction gradient per interval [Pa/m]
    interval_pressure  gradient × length [Pa]
    pressure_bit       signed pressure change at the bit [Pa] (+ surge, − swab)
    regime             flow regime per interval (0 laminar, 1 transitional, 2 turbulent)
    """

    speed: object
    peak_speed: object
    direction: str
    string_end: str
    names: tuple[str, ...]
    top_md: np.ndarray
    bottom_md: np.ndarray
    clinging: np.ndarray
    relative_inflow: object
    effective_rate: np.ndarray
    effective_velocity: np.ndarray
    gradient: np.ndarray
    interval_pressure: np.ndarray
    pressure_bit: object
    regime: np.ndarray
    method: str
    density: float
    notes: tuple[Note, ...] = field(default=())
    _well: object = field(default=None, repr=False)

    @property
    def sign(self) -> float:
        return 1.0 if self.direction == "running" else -1.0

    def pressure_at(self, md):
        """Signed pressure change at measured depth(s) ``md`` [Pa] (friction from md to surface;
        below the bit the bit value).  Shape: speed axes + md axes."""
        mdv = check_nonnegative("MD", md, "m")
        w = np.clip(
            (mdv.ravel()[:, None] - self.top_md[None, :]) / (self.bottom_md - self.top_md)[None, :],
            0.0,
            1.0,
        )
        p = np.asarray(self.interval_pressure) @ w.T
        return scalar_or_array(self.sign * p.reshape(p.shape[:-1] + mdv.shape))

    def emw_at(self, md, *, hydrostatic: str = "exact"):
        """Equivalent mud weight while tripping, ρ ± Δp/(g·TVD) [kg/m³], at ``md`` [m] (> 0)."""
        mdv = check_positive("MD", md, "m")
        tvd = np.asarray(self._well.tvd_at(mdv), dtype=float)
        return trip_emw(self.density, self.pressure_at(mdv), tvd, hydrostatic=hydrostatic)


def _annulus(well):
    a = well.flow_intervals().annulus
    names = tuple(
        f"{c}{' tool joints' if tj else ''} in {s}, MD {t:.1f}-{b:.1f} m"
        for c, s, tj, t, b in zip(
            a.component, a.section, a.is_tool_joint, a.top_md, a.bottom_md, strict=True
        )
    )
    return a, names


def _string_end(well, string_end):
    end = check_choice("string end", string_end, ("closed", "open", "auto"))
    has_float = any(c.float_valve for c in well.string.components)
    if end == "auto":
        return ("closed" if has_float else "open"), ()
    if end == "open" and has_float:
        return end, (
            Note(
                "warning",
                "open_end_with_float",
                "open-ended trip computed although the string has a float valve (it would "
                "close when running in).",
                "string end",
            ),
        )
    return end, ()


@dataclass(frozen=True, eq=False)
class _Paths:
    """The arrays the surge solver works on: annular intervals along the last axis, the bore
    (open end only) and the nozzles.  Built from a well (:func:`_paths_from_well`) or from
    flat arguments (:func:`interval_surge`, :func:`trip_speed_limit`)."""

    d2: np.ndarray
    d1: np.ndarray
    length: np.ndarray
    rho: float
    ann_params: tuple
    pipe_params: tuple
    method: str
    ecc: object
    bore_d: np.ndarray | None = None
    bore_length: np.ndarray | None = None
    tfa: float | None = None
    cd: float = DEFAULT_DISCHARGE_COEFFICIENT

    @property
    def area_a(self):
        return np.pi / 4.0 * (self.d2**2 - self.d1**2)

    @property
    def area_o(self):
        return np.pi / 4.0 * self.d1**2


def _one_density(rho) -> float:
    rho = np.asarray(rho, dtype=float)
    if rho.ndim:
        raise InputError("fluid density", "an array", "one density for surge and swab")
    return float(check_positive("density", rho, "kg/m³"))


def _paths_from_well(well, fluid, method, eccentricity) -> tuple[_Paths, object, tuple]:
    a, names = _annulus(well)
    s = well.flow_intervals().string
    p = _Paths(
        d2=np.asarray(a.outer_diameter, dtype=float),
        d1=np.asarray(a.inner_diameter, dtype=float),
        length=np.asarray(a.length, dtype=float),
        rho=_one_density(fluid.density),
        ann_params=fluid.annulus_parameters,
        pipe_params=fluid.pipe_parameters,
        method=method,
        ecc=eccentricity,
        bore_d=np.asarray(s.outer_diameter, dtype=float),
        bore_length=np.asarray(s.length, dtype=float),
        tfa=well.bit.tfa,
        cd=well.bit.discharge_coefficient,
    )
    return p, a, names


def _annulus_gradient(p: _Paths, q_e):
    """Friction gradient [Pa/m] and regime at the effective rates; no movement, no friction."""
    from calc.flow import annulus_flow

    ty, k, n = p.ann_params
    fr = annulus_flow(
        np.maximum(q_e, 1e-12), p.d2, p.d1, density=p.rho, tau_y=ty, k=k, n=n,
        method=p.method, eccentricity=p.ecc,
    )  # fmt: skip
    moving = np.asarray(q_e) > 0
    grad = np.where(moving, np.asarray(fr.gradient, dtype=float), 0.0)
    return grad, np.where(moving, np.asarray(fr.regime), 0), fr


def _bore_pressure(p: _Paths, q_rel):
    """Bore friction at the relative flow plus the nozzle drop [Pa] (shape of q_rel)."""
    from calc.bit import bit_pressure_drop
    from calc.flow import pipe_flow

    ty, k, n = p.pipe_params
    q = np.maximum(np.asarray(q_rel, dtype=float), 1e-12)
    fr = pipe_flow(q[..., None], p.bore_d, density=p.rho, tau_y=ty, k=k, n=n,
                   method=p.method)  # fmt: skip
    total = np.sum(np.asarray(fr.gradient) * p.bore_length, axis=-1)
    if p.tfa is not None:
        total = total + np.asarray(bit_pressure_drop(q, p.rho, p.tfa, p.cd))
    return total


def _annulus_state(p: _Paths, vp, q_rel, clinging):
    """(K_c, q_e, gradient, regime, FlowResult) with the regime-dependent Burkhardt fit.

    The one place of the effective-rate formula q_e = V_p·πD1²/4 − q_rel + K_c·V_p·A_a."""
    q_disp = vp[..., None] * p.area_o - np.asarray(q_rel)[..., None]
    drag = vp[..., None] * p.area_a
    if isinstance(clinging, str):
        kc = np.broadcast_to(clinging_constant(p.d1, p.d2, "laminar"), q_disp.shape)
        grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
        turb = regime == 2
        if np.any(turb):
            kc = np.asarray(clinging_constant(p.d1, p.d2, turb))
            grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
    else:
        kc = np.broadcast_to(np.asarray(clinging, dtype=float), q_disp.shape)
        grad, regime, fr = _annulus_gradient(p, q_disp + kc * drag)
    return kc, q_disp + kc * drag, grad, regime, fr


def _solve(p: _Paths, vp, end, clinging, iterations=50):
    """Annulus state for pipe speeds ``vp`` (any shape), closed or open end."""
    if end == "closed":
        q_rel = np.zeros_like(vp)
    else:
        q_max = vp * float(np.min(p.area_o))

        def f(qr):
            _, _, grad, _, _ = _annulus_state(p, vp, qr, clinging)
            return _bore_pressure(p, qr) - np.sum(grad * p.length, axis=-1)

        q_rel = bisect_increasing(f, np.zeros_like(vp), q_max, iterations=iterations)
    return q_rel, *_annulus_state(p, vp, q_rel, clinging)


def _safe_side(mid, lo, hi, iterations):
    """Step a log-bisection midpoint down by its final bracket width: the result lies below
    the last bracket's lower end, where the excess is ≤ 0.  Where Δp(V) jumps (the Burkhardt
    fit changes K_c with the regime) the limit is so the speed just below the jump."""
    return mid * np.exp(-np.log(hi / lo) / 2.0**iterations)


def _speed_limit(p: _Paths, allow, weights, end, clinging, pf, speed_bracket):
    """Average speed at which Σ gradient·length·weights reaches ``allow`` [m/s] (vectorised
    bisection in ln V over every entry of ``allow`` at once).

    Returns (speeds, stuck): 0 where ``allow`` ≤ 0, and 0 where even the slowest speed of the
    bracket exceeds the allowance (``stuck``: a yield stress gives a finite pressure change at
    any motion in the steady model)."""
    allow = np.asarray(allow, dtype=float)

    def excess(v_avg):
        _, _, _, grad, _, _ = _solve(p, v_avg * pf, end, clinging, iterations=30)
        return np.sum(grad * p.length * weights, axis=-1) - allow

    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    stuck = (allow > 0) & (np.asarray(excess(lo)) >= 0)
    lim = _safe_side(bisect_increasing(excess, lo, hi, iterations=32, log=True), lo, hi, 32)
    return np.where((allow <= 0) | stuck, 0.0, lim), stuck


def _open_speed_limit(p: _Paths, allow, clinging, pf, speed_bracket):
    """:func:`_speed_limit` for an open string when the allowance applies at the bit.

    At the limit both paths carry the allowed pressure change: the bore gives q_rel from
    bore(q_rel) = allow, then the annulus gives V from annulus(V, q_rel) = allow — two
    sequential bisections on the same equations instead of one nested in the other."""
    allow = np.asarray(allow, dtype=float)
    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    q_hi = hi * pf * float(np.min(p.area_o))
    q_rel = bisect_increasing(
        lambda q: _bore_pressure(p, q) - allow, np.zeros_like(allow), q_hi, iterations=60
    )

    def excess(v_avg):
        vp = v_avg * pf
        qr = np.minimum(q_rel, vp * float(np.min(p.area_o)))
        _, _, grad, _, _ = _annulus_state(p, vp, qr, clinging)
        return np.sum(grad * p.length, axis=-1) - allow

    stuck = (allow > 0) & (np.asarray(excess(lo)) >= 0)
    lim = _safe_side(bisect_increasing(excess, lo, hi, iterations=50, log=True), lo, hi, 50)
    return np.where((allow <= 0) | stuck, 0.0, lim), stuck


def _yield_note(what: str, count: int, slowest: float) -> Note:
    return Note(
        "caution",
        f"{what}_exceeded_at_slowest_speed",
        f"at {count} point(s) the {what} at the slowest speed searched ({slowest:g} m/s) "
        f"already exceeds the allowance (the yield stress alone): no safe {what} speed.",
        "trip speed",
    )


def _check_bracket(speed_bracket):
    lo, hi = (float(x) for x in check_positive("speed bracket", speed_bracket, "m/s"))
    if hi <= lo:
        raise InputError("speed bracket", (lo, hi), "(low, high) with low < high")
    return lo, hi


def _check_clinging(clinging):
    if isinstance(clinging, str):
        check_choice("clinging", clinging, ("burkhardt",))
        return clinging
    kc = check_nonnegative("clinging constant", clinging)
    if np.any(kc >= 1.0):
        raise InputError("clinging constant", float(np.max(kc)), "in [0, 1)")
    return kc


def _check_peak(peak_factor) -> float:
    pf = float(check_positive("peak factor", peak_factor))
    if pf < 1.0:
        raise InputError("peak factor", pf, ">= 1 (peak over average speed)")
    return pf


def _clinging_text(clinging) -> str:
    return "fits (Guo & Liu 2011)" if isinstance(clinging, str) else "given"


def surge_pressure(
    well,
    fluid,
    speed,
    *,
    direction: str = "running",
    string_end: str = "auto",
    method: str = "api13d_2010_hb",
    clinging="burkhardt",
    peak_factor: float = PEAK_FACTOR,
    eccentricity: float = 0.0,
) -> SurgeResult:
    """Surge (running in) or swab (pulling out) pressure in every annular interval.

    .. math:: \\Delta p(z) = \\sum_{i\\ \\mathrm{above}\\ z} \\left(\\frac{dp}{dL}\\right)_i
              \\!(V_{e,i})\\,L_i,\\quad V_{e,i} = \\frac{V_p\\,\\pi D_{1,i}^2/4 - q_{rel}}{A_{a,i}}
              + K_{c,i} V_p

    Parameters
    ----------
    well : calc.geometry.Well
    fluid : calc.circulation.HydraulicsFluid
        One density; annulus model for the annulus, pipe model for the bore.
    speed : float or array_like
        Average pipe (stand) speed [m/s], ≥ 0.
    direction : {"running", "pulling"}
    string_end : {"auto", "closed", "open"}
        ``auto``: closed when the string has a float valve, else open.
    method : str
        Friction method of :mod:`calc.flow` (every rheological model/method it offers).
    clinging : "burkhardt" or float or array
        Burkhardt fits (laminar/turbulent by the interval's regime) or given K_c per interval.
    peak_factor : float
        Peak/average speed ratio, default 1.5 (METHODS §8, from memory).
    eccentricity : float
        Passed to :func:`calc.flow.annulus_flow` (ignoring it is conservative).

    Returns
    -------
    SurgeResult

    Notes
    -----
    Steady, incompressible, no inertia, no gel breaking, no pipe rotation; the annulus below the
    bit carries no relative flow.  Steady models can miss measured surges (Lal 1983).
    """
    direction = check_choice("direction", direction, ("running", "pulling"))
    v = check_nonnegative("trip speed", speed, "m/s")
    pf = _check_peak(peak_factor)
    clinging = _check_clinging(clinging)
    end, notes = _string_end(well, string_end)
    p, a, names = _paths_from_well(well, fluid, method, eccentricity)
    vp = np.asarray(v * pf, dtype=float)
    q_rel, kc, q_e, grad, regime, fr = _solve(p, vp, end, clinging)
    ip = grad * p.length
    notes = list(notes) + list(getattr(fr, "notes", ()))
    return SurgeResult(
        speed=scalar_or_array(v),
        peak_speed=scalar_or_array(vp),
        direction=direction,
        string_end=end,
        names=names,
        top_md=np.asarray(a.top_md),
        bottom_md=np.asarray(a.bottom_md),
        clinging=np.asarray(kc),
        relative_inflow=scalar_or_array(q_rel),
        effective_rate=q_e,
        effective_velocity=q_e / p.area_a,
        gradient=grad,
        interval_pressure=ip,
        pressure_bit=scalar_or_array(_SIGN[direction] * ip.sum(-1)),
        regime=regime,
        method=f"Burkhardt (1961) steady surge; clinging {_clinging_text(clinging)}; "
        f"friction {method}",
        density=p.rho,
        notes=tuple(dict.fromkeys(notes)),
        _well=well,
    )


@dataclass(frozen=True, eq=False)
class TripLimits:
    """Maximum trip speeds keeping surge EMW below fracture − margin and swab EMW above
    pore + margin at every check depth (SI; speeds are average stand speeds).

    max_running_speed, max_pulling_speed   [m/s] (the tightest depth governs)
    running_point, pulling_point          (name, md, tvd) of the governing depth
    md, tvd, names                        check depths (last shoe to bit, weak points)
    running_limit, pulling_limit          per-depth speed limits [m/s]
    surge_allowance, swab_allowance       allowed pressure change per depth [Pa]
    """

    max_running_speed: float
    max_pulling_speed: float
    running_point: tuple
    pulling_point: tuple
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


def _check_points(well, weak_points, step):
    bit = float(well.bit_depth)
    cased = [s for s in well.hole.sections if not s.is_open_hole and s.bottom <= bit]
    top = max((s.bottom for s in cased), default=0.0)
    shoe = max(cased, key=lambda s: s.bottom).name + " shoe" if cased else ""
    md = np.unique(np.append(np.arange(top, bit, step), bit))
    md = md[md > 0]
    names = [f"MD {m:.1f} m" for m in md]
    names[-1] = "bit"
    if shoe and md[0] == top:
        names[0] = shoe
    for wp in weak_points:
        if 0 < wp.md <= bit:
            md = np.append(md, wp.md)
            names.append(wp.name)
    return md, tuple(names)


def trip_speed_limits(
    well,
    fluid,
    *,
    window,
    weak_points=(),
    fracture_margin: float = 0.0,
    pore_margin: float = 0.0,
    string_end: str = "auto",
    method: str = "api13d_2010_hb",
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
    Limits are average stand speeds (the surge uses ``peak_factor`` × speed).  Rules:
    METHODS §8 (from memory) — the tightest point is often the last shoe for surge, the
    deepest permeable zone for swab.
    """
    from calc.circulation.pressure_window import limits_at

    mf = float(check_nonnegative("fracture margin", fracture_margin, "kg/m³"))
    mp = float(check_nonnegative("pore margin", pore_margin, "kg/m³"))
    stp = float(check_positive("check-depth step", step, "m"))
    pf = _check_peak(peak_factor)
    bracket = _check_bracket(speed_bracket)
    clinging = _check_clinging(clinging)
    end, notes = _string_end(well, string_end)
    notes = list(notes)
    p, a, _ = _paths_from_well(well, fluid, method, eccentricity)
    md, names = _check_points(well, tuple(weak_points), stp)
    tvd = np.asarray(well.tvd_at(md), dtype=float)
    pore, frac = limits_at(md, tvd, names, window, tuple(weak_points))
    allow_surge = trip_allowance(frac - mf, p.rho, tvd, "running", hydrostatic=hydrostatic)
    allow_swab = trip_allowance(pore + mp, p.rho, tvd, "pulling", hydrostatic=hydrostatic)
    top, bot = np.asarray(a.top_md), np.asarray(a.bottom_md)
    w = np.clip((md[:, None] - top[None, :]) / (bot - top)[None, :], 0.0, 1.0)

    # surge and swab have the same magnitude in the steady model: bisect both sets of depths in
    # one vectorised pass (running limits first, pulling limits second)
    allow = np.concatenate([allow_surge, allow_swab])
    lim, stuck = _speed_limit(p, allow, np.concatenate([w, w]), end, clinging, pf, bracket)
    limits = [lim[: md.size], lim[md.size :]]
    for al, st, what in (
        (allow_surge, stuck[: md.size], "surge"),
        (allow_swab, stuck[md.size :], "swab"),
    ):
        if np.any(al <= 0):
            notes.append(_static_violation_note(what, int(np.sum(al <= 0))))
        if np.any(st):
            notes.append(_yield_note(what, int(np.sum(st)), bracket[0]))
    run, pull = limits
    ir, ip = int(np.argmin(run)), int(np.argmin(pull))
    for lim, what in ((run, "running"), (pull, "pulling")):
        if np.min(lim) >= 0.999 * bracket[1]:
            notes.append(_not_limiting_note(what, bracket[1]))
    return TripLimits(
        max_running_speed=float(run[ir]),
        max_pulling_speed=float(pull[ip]),
        running_point=(names[ir], float(md[ir]), float(tvd[ir])),
        pulling_point=(names[ip], float(md[ip]), float(tvd[ip])),
        md=md,
        tvd=tvd,
        names=names,
        running_limit=run,
        pulling_limit=pull,
        surge_allowance=allow_surge,
        swab_allowance=allow_swab,
        peak_factor=pf,
        string_end=end,
        method=f"Burkhardt (1961) steady surge/swab, friction {method}, vectorised bisection",
        fracture_margin=mf,
        pore_margin=mp,
        notes=tuple(dict.fromkeys(notes)),
    )


def _static_violation_note(what: str, count: int) -> Note:
    return Note(
        "caution",
        f"{what}_margin_violated_static",
        f"the static mud weight already violates the {what} margin at {count} check depth(s): "
        f"no safe {what} speed.",
        "trip speed",
    )


def _not_limiting_note(what: str, top: float) -> Note:
    return Note(
        "info",
        f"{what}_not_limiting",
        f"{what} speed not limited within {top:g} m/s.",
        "trip speed",
    )


# ------------------------------------------------------------------ flat (per-interval) forms


def trip_allowance(limit_emw, density, tvd, direction: str = "running", *, hydrostatic="exact"):
    """Pressure change a trip may cause at a depth before the EMW reaches its limit [Pa].

    .. math:: \\Delta p_{surge} = (\\rho_{lim} - \\rho)\\,g\\,TVD,\\qquad
              \\Delta p_{swab} = (\\rho - \\rho_{lim})\\,g\\,TVD

    Parameters
    ----------
    limit_emw : array_like
        Limit EMW [kg/m³]: fracture − margin when running in, pore + margin when pulling.
    density : array_like
        Static mud density [kg/m³].
    tvd : array_like
        True vertical depth of the point [m], > 0.
    direction : {"running", "pulling"}
    hydrostatic : {"exact", "0.052"}
        Which g (:func:`calc.circulation.hydrostatics.gravity_for`).

    Notes
    -----
    A negative allowance means the static mud already breaks the limit (METHODS §8, from
    memory: ΔP_surge,max = 0.052·TVD(ρ_frac − ρ − margin) in field units).

    >>> round(trip_allowance(1100.0, 1000.0, 100.0), 1)  # 100 kg/m³ · g · 100 m
    98066.5
    """
    from calc.circulation.hydrostatics import gravity_for

    direction = check_choice("direction", direction, ("running", "pulling"))
    lim = check_positive("limit EMW", limit_emw, "kg/m³")
    rho = check_positive("mud density", density, "kg/m³")
    h = check_positive("tvd", tvd, "m")
    return scalar_or_array(_SIGN[direction] * (lim - rho) * gravity_for(hydrostatic) * h)


def trip_emw(density, pressure_change, tvd, *, hydrostatic: str = "exact"):
    """Equivalent mud weight while tripping, ρ + Δp/(g·TVD) [kg/m³] (Δp signed: + surge).

    Parameters
    ----------
    density : array_like
        Static mud density [kg/m³].
    pressure_change : array_like
        Signed surge (+) or swab (−) pressure change at the depth [Pa].
    tvd : array_like
        True vertical depth [m], > 0.

    >>> round(trip_emw(1000.0, -98066.5, 100.0), 6)
    900.0
    """
    from calc.circulation.hydrostatics import equivalent_density

    rho = check_positive("mud density", density, "kg/m³")
    return scalar_or_array(rho + equivalent_density(pressure_change, tvd, hydrostatic=hydrostatic))


def _paths_flat(d_hole, d_pipe, length, *, density, tau_y, k, n, d_bore, tfa, cd,
                bore_parameters, string_end, method, eccentricity):  # fmt: skip
    """Flat arguments → (:class:`_Paths`, string end, geometry-was-scalar)."""
    end = check_choice("string end", string_end, ("closed", "open"))
    geo = [
        check_positive("hole diameter d_hole", d_hole, "m"),
        check_positive("pipe outside diameter d_pipe", d_pipe, "m"),
        check_nonnegative("interval length", length, "m"),
    ]
    if end == "open":
        if d_bore is None:
            raise InputError("bore diameter d_bore", None, "the pipe bore for an open string")
        geo.append(check_positive("bore diameter d_bore", d_bore, "m"))
    try:
        geo = np.broadcast_arrays(*geo)
    except ValueError as exc:
        shapes = " and ".join(str(np.shape(g)) for g in geo)
        raise InputError("interval geometry", shapes, "shapes that broadcast together") from exc
    if geo[0].ndim > 1:
        raise InputError("interval geometry", f"{geo[0].ndim}-D arrays", "one value or a 1-D array")
    scalar = geo[0].ndim == 0
    d2, d1, ln, *bore = (np.atleast_1d(g).astype(float) for g in geo)
    if np.any(d1 >= d2):
        i = int(np.flatnonzero(d1 >= d2)[0])
        raise InputError("pipe outside diameter d_pipe", d1[i], f"< hole diameter ({d2[i]:.6g} m)")
    if bore and np.any(bore[0] >= d1):
        i = int(np.flatnonzero(bore[0] >= d1)[0])
        raise InputError("bore diameter d_bore", bore[0][i], f"< pipe OD ({d1[i]:.6g} m)")
    ann = []
    for name, value, check in (
        ("yield stress tau_y", tau_y, check_nonnegative),
        ("consistency k", k, check_positive),
        ("flow behaviour index n", n, check_positive),
    ):
        if np.ndim(value):
            raise InputError(name, "an array", "one value (one fluid for surge and swab)")
        ann.append(float(check(name, value)))
    pipe = tuple(ann) if bore_parameters is None else tuple(float(x) for x in bore_parameters)
    tfa_v = None if tfa is None or end == "closed" else float(check_positive("TFA", tfa, "m²"))
    paths = _Paths(
        d2=d2, d1=d1, length=ln, rho=_one_density(density), ann_params=tuple(ann),
        pipe_params=pipe, method=method, ecc=eccentricity,
        bore_d=bore[0] if bore else None, bore_length=ln if bore else None, tfa=tfa_v, cd=cd,
    )  # fmt: skip
    return paths, end, scalar


@dataclass(frozen=True, eq=False)
class IntervalSurge:
    """Surge or swab in annular intervals given by their dimensions (SI).

    Per-interval arrays have the speed's shape plus the interval axis (dropped when the
    geometry was one interval given as scalars).

    speed, peak_speed     average speed given and speed × peak_factor used [m/s]
    clinging              K_c per interval
    relative_inflow       q_rel entering an open pipe relative to it [m³/s] (0 closed)
    effective_rate        V_e·A_a [m³/s]; ``effective_velocity`` V_e [m/s]
    regime                0 laminar, 1 transitional, 2 turbulent (at V_e)
    gradient              friction gradient [Pa/m] (magnitude)
    pressure_change       signed gradient × length per interval [Pa] (+ surge, − swab)
    total_pressure_change signed sum over the intervals [Pa] (speed's shape)
    """

    speed: object
    peak_speed: object
    direction: str
    string_end: str
    clinging: object
    relative_inflow: object
    effective_rate: object
    effective_velocity: object
    regime: object
    gradient: object
    pressure_change: object
    total_pressure_change: object
    method: str
    notes: tuple[Note, ...] = ()


def interval_surge(
    speed,
    d_hole,
    d_pipe,
    length,
    *,
    density,
    tau_y,
    k,
    n,
    d_bore=None,
    tfa=None,
    discharge_coefficient: float = DEFAULT_DISCHARGE_COEFFICIENT,
    bore_parameters=None,
    string_end: str = "closed",
    direction: str = "running",
    method: str = "api13d_2010_hb",
    clinging="burkhardt",
    peak_factor: float = PEAK_FACTOR,
    eccentricity=0.0,
) -> IntervalSurge:
    """Surge (running) or swab (pulling) pressure change in annular intervals from their sizes.

    The flat form of :func:`surge_pressure` (the same solver): one interval as scalars, or the
    annular intervals of one string as 1-D arrays (an open string splits its displacement over
    all of them together).

    .. math:: \\Delta p_i = \\pm\\left(\\frac{dp}{dL}\\right)_i\\!(V_{e,i})\\,L_i,\\quad
              V_{e,i} = \\frac{V_p\\,\\pi D_{1,i}^2/4 - q_{rel}}{A_{a,i}} + K_{c,i} V_p,
              \\quad V_p = f_{peak}\\,V

    Parameters
    ----------
    speed : float or array_like
        Average pipe (stand) speed V [m/s], ≥ 0; any shape (leading result axes).
    d_hole, d_pipe, length : float or 1-D array_like
        Hole/casing ID D2 [m], pipe OD D1 [m] (< D2), interval length [m] (≥ 0).
    density : float
        Mud density [kg/m³] (one fluid).
    tau_y, k, n : float
        Herschel-Bulkley yield stress [Pa], consistency [Pa·sⁿ], flow index [-] of the
        annulus model (Bingham: YP, PV, 1; Newtonian: 0, μ, 1).
    d_bore : float or 1-D array_like, optional
        Pipe bore [m] of each interval (same lengths), needed for ``string_end="open"``.
    tfa : float, optional
        Bit nozzle total flow area [m²] at the bottom of an open string (None: open pipe).
    discharge_coefficient : float
        Nozzle C_d [-] (default 0.95, :mod:`calc.bit`).
    bore_parameters : (tau_y, k, n), optional
        Rheology for the bore (default the annulus one).
    string_end : {"closed", "open"}
        Closed: float valve or plugged pipe, the full OD displaces mud.
    direction : {"running", "pulling"}
    method : str
        Friction method of :mod:`calc.flow`.
    clinging : "burkhardt" or float or array
        Burkhardt fits (laminar/turbulent by the interval's regime) or given K_c.
    peak_factor : float
        Peak/average speed ratio ≥ 1 (default 1.5, METHODS §8, from memory).
    eccentricity : float or array_like
        Passed to :func:`calc.flow.annulus_flow`.

    Returns
    -------
    IntervalSurge

    Notes
    -----
    Steady, incompressible, no inertia, no gel breaking; swab is the mirror of surge in this
    model.  A speed of 0 gives 0 (no flow, no friction; the gel is :func:`gel_break_pressure`).

    References
    ----------
    Burkhardt (1961) JPT 13(6), SPE-1546-G; Guo & Liu (2011) eqs. 2.80-2.83.

    >>> r = interval_surge(0.5, 0.2, 0.1, 1000.0, density=1200.0, tau_y=0.0, k=0.05, n=1.0,
    ...                    method="newtonian", peak_factor=1.0)
    >>> r.regime, round(r.clinging, 4)
    (0, 0.3875)
    """
    direction = check_choice("direction", direction, ("running", "pulling"))
    v = check_nonnegative("trip speed", speed, "m/s")
    pf = _check_peak(peak_factor)
    clinging = _check_clinging(clinging)
    p, end, scalar = _paths_flat(
        d_hole, d_pipe, length, density=density, tau_y=tau_y, k=k, n=n, d_bore=d_bore,
        tfa=tfa, cd=discharge_coefficient, bore_parameters=bore_parameters,
        string_end=string_end, method=method, eccentricity=eccentricity,
    )  # fmt: skip
    vp = np.asarray(v * pf, dtype=float)
    q_rel, kc, q_e, grad, regime, fr = _solve(p, vp, end, clinging)
    dp = _SIGN[direction] * grad * p.length

    def per(x, as_int=False):
        arr = np.asarray(x)[..., 0] if scalar else np.asarray(x)
        arr = arr.astype(int) if as_int else arr.astype(float)
        return (int(arr) if as_int else float(arr)) if arr.ndim == 0 else arr

    return IntervalSurge(
        speed=scalar_or_array(v),
        peak_speed=scalar_or_array(vp),
        direction=direction,
        string_end=end,
        clinging=per(np.broadcast_to(kc, q_e.shape)),
        relative_inflow=scalar_or_array(q_rel),
        effective_rate=per(q_e),
        effective_velocity=per(q_e / p.area_a),
        regime=per(regime, as_int=True),
        gradient=per(grad),
        pressure_change=per(dp),
        total_pressure_change=scalar_or_array(dp.sum(-1)),
        method=f"Burkhardt (1961) steady surge; clinging {_clinging_text(clinging)}; "
        f"friction {method}",
        notes=tuple(dict.fromkeys(getattr(fr, "notes", ()))),
    )


@dataclass(frozen=True, eq=False)
class IntervalTripLimit:
    """Highest trip speed keeping the summed surge (or swab) of a set of intervals within an
    allowed pressure change (SI; shape of the allowance).

    max_speed          average stand speed at the limit [m/s] (0: no safe speed, see notes)
    peak_speed         max_speed × peak_factor [m/s]
    allowed_pressure   allowance [Pa]; ``pressure_at_limit`` the signed change at max_speed
    limited            False where the speed is not limited within the search bracket
    """

    max_speed: object
    peak_speed: object
    allowed_pressure: object
    pressure_at_limit: object
    limited: object
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
    method: str = "api13d_2010_hb",
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
    pf = _check_peak(peak_factor)
    bracket = _check_bracket(speed_bracket)
    clinging = _check_clinging(clinging)
    p, end, _ = _paths_flat(
        d_hole, d_pipe, length, density=density, tau_y=tau_y, k=k, n=n, d_bore=d_bore,
        tfa=tfa, cd=discharge_coefficient, bore_parameters=bore_parameters,
        string_end=string_end, method=method, eccentricity=eccentricity,
    )  # fmt: skip
    if end == "open":
        lim, stuck = _open_speed_limit(p, allow, clinging, pf, bracket)
    else:
        lim, stuck = _speed_limit(p, allow, 1.0, end, clinging, pf, bracket)
    _, _, _, grad, _, _ = _solve(p, lim * pf, end, clinging)
    at = _SIGN[direction] * np.sum(grad * p.length, axis=-1)
    limited = lim < 0.999 * bracket[1]
    what = "surge" if direction == "running" else "swab"
    notes = []
    if np.any(allow <= 0):
        notes.append(_static_violation_note(what, int(np.sum(allow <= 0))))
    if np.any(stuck):
        notes.append(_yield_note(what, int(np.sum(stuck)), bracket[0]))
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
        method=f"Burkhardt (1961) steady {what}, friction {method}, vectorised bisection",
        notes=tuple(notes),
    )


def gel_break_pressure(gel_strength, d_outer, length, d_inner=0.0):
    """Pressure to break a gelled column in one interval, 4τ_g·L/(D_outer − D_inner) [Pa].

    Force balance of the plug on its walls: τ_g × wall area = Δp × flow area; a pipe bore when
    ``d_inner`` is 0 (then D_outer is the bore).

    Parameters
    ----------
    gel_strength : array_like
        Gel strength τ_g [Pa], ≥ 0.
    d_outer : array_like
        Pipe bore, or hole/casing ID [m], > 0.
    length : array_like
        Interval length [m], ≥ 0.
    d_inner : array_like
        Pipe OD for an annulus [m], 0 ≤ d_inner < d_outer.

    References
    ----------
    Bourgoyne et al. (1986) Applied Drilling Engineering, ch. 4 (from memory) — also common
    practice.

    >>> round(gel_break_pressure(5.0, 0.1, 1000.0) / 1e6, 3)  # 4·5·1000/0.1
    0.2
    """
    tg = check_nonnegative("gel strength", gel_strength, "Pa")
    do = check_positive("outer diameter", d_outer, "m")
    ln = check_nonnegative("interval length", length, "m")
    di = check_nonnegative("inner diameter", d_inner, "m")
    tg, do, ln, di = np.broadcast_arrays(tg, do, ln, di)
    if np.any(di >= do):
        i = np.unravel_index(int(np.argmax(di >= do)), di.shape)
        raise InputError("inner diameter", float(di[i]), f"< outer diameter ({do[i]:.6g} m)")
    return scalar_or_array(4.0 * tg * ln / (do - di))


@dataclass(frozen=True)
class BreakCirculationResult:
    """Pressure to break the gel and start circulation (SI).

    pressure            total over the string and annulus [Pa]
    string_pressure     Σ 4τ_g L/D over the bore [Pa]
    annulus_pressure    Σ 4τ_g L/(D2 − D1) over the annulus [Pa]
    annulus_intervals   per annular interval [Pa]; ``string_intervals`` per bore interval
    bottom_emw          ρ + annulus_pressure/(g·TVD_bit) [kg/m³] (what the open hole feels)
    """

    pressure: float
    string_pressure: float
    annulus_pressure: float
    string_intervals: np.ndarray
    annulus_intervals: np.ndarray
    bottom_emw: float
    gel_strength: float
    method: str
    notes: tuple[Note, ...] = ()


def break_circulation_pressure(
    well, gel_strength, *, density, hydrostatic: str = "exact"
) -> BreakCirculationResult:
    """Pressure needed to break circulation after a static period, from the gel strength.

    .. math:: \\Delta p = \\sum_{bore} \\frac{4\\tau_g L}{D} + \\sum_{annulus}
              \\frac{4\\tau_g L}{D_2 - D_1}

    Force balance of a gelled plug on its wall: τ_g × wall area = Δp × flow area.

    Parameters
    ----------
    well : calc.geometry.Well
    gel_strength : float
        Gel strength τ_g [Pa] (usually the 10-minute gel; common practice).
    density : float
        Mud density [kg/m³] (for the bottom-hole EMW).

    References
    ----------
    Bourgoyne et al. (1986) Applied Drilling Engineering, ch. 4 (pressure to break circulation;
    from memory) — also common practice.

    >>> # 4·τ·L/D for 1000 m of 0.1 m pipe at 5 Pa gives 0.2 MPa
    >>> round(4 * 5.0 * 1000.0 / 0.1 / 1e6, 3)
    0.2
    """
    tg = float(check_nonnegative("gel strength", gel_strength, "Pa"))
    rho = float(check_positive("mud density", density, "kg/m³"))
    iv = well.flow_intervals()
    s, a = iv.string, iv.annulus
    sp = np.atleast_1d(gel_break_pressure(tg, s.outer_diameter, s.length))
    ap = np.atleast_1d(gel_break_pressure(tg, a.outer_diameter, a.length, a.inner_diameter))
    emw = trip_emw(rho, float(ap.sum()), well.bit_tvd, hydrostatic=hydrostatic)
    return BreakCirculationResult(
        pressure=float(sp.sum() + ap.sum()),
        string_pressure=float(sp.sum()),
        annulus_pressure=float(ap.sum()),
        string_intervals=sp,
        annulus_intervals=ap,
        bottom_emw=emw,
        gel_strength=tg,
        method="gel plug force balance 4τ_g·L/D per interval (Bourgoyne et al. 1986; common "
        "practice)",
    )
