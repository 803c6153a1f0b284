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

from calc.cleaning._numeric import bisect_increasing, scalar_or_array
from calc.errors import InputError, Note, check_choice, check_nonnegative, check_positive

__all__ = [
    "BreakCirculationResult",
    "SurgeResult",
    "TripLimits",
    "break_circulation_pressure",
    "clinging_constant",
    "clinging_constant_exact_newtonian",
    "surge_pressure",
    "trip_speed_limits",
]

#: Ratio of peak to average stand speed used by default, 1.5 (from memory, unverified —
#: METHODS §8).  Set ``peak_factor=1`` when the speed given is already the peak speed.
PEAK_FACTOR = 1.5


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
        from calc.circulation.hydrostatics import gravity_for

        mdv = check_positive("MD", md, "m")
        tvd = np.asarray(self._well.tvd_at(mdv), dtype=float)
        return scalar_or_array(
            self.density + np.asarray(self.pressure_at(mdv)) / (gravity_for(hydrostatic) * tvd)
        )


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


class _Geometry:
    """Arrays of one well for the surge solver."""

    def __init__(self, well, fluid, method, eccentricity):
        a, self.names = _annulus(well)
        self.a = a
        self.d2 = np.asarray(a.outer_diameter, dtype=float)
        self.d1 = np.asarray(a.inner_diameter, dtype=float)
        self.length = np.asarray(a.length, dtype=float)
        self.area_a = np.pi / 4.0 * (self.d2**2 - self.d1**2)
        self.area_o = np.pi / 4.0 * self.d1**2
        s = well.flow_intervals().string
        self.di = np.asarray(s.outer_diameter, dtype=float)
        self.ls = np.asarray(s.length, dtype=float)
        self.bit = well.bit
        rho = np.asarray(fluid.density, dtype=float)
        if rho.ndim:
            raise InputError("fluid density", "an array", "one density for surge and swab")
        self.rho = float(rho)
        self.ann_params = fluid.annulus_parameters
        self.pipe_params = fluid.pipe_parameters
        self.method = method
        self.ecc = eccentricity

    def annulus_gradient(self, q_e):
        from calc.flow import annulus_flow

        ty, k, n = self.ann_params
        fr = annulus_flow(
            np.maximum(q_e, 1e-12), self.d2, self.d1, density=self.rho, tau_y=ty, k=k, n=n,
            method=self.method, eccentricity=self.ecc,
        )  # fmt: skip
        return np.asarray(fr.gradient, dtype=float), np.asarray(fr.regime), fr

    def bore_pressure(self, q_rel):
        """Bore friction at the relative flow plus the nozzle drop [Pa] (shape of q_rel)."""
        from calc.bit import bit_pressure_drop
        from calc.flow import pipe_flow

        ty, k, n = self.pipe_params
        q = np.maximum(np.asarray(q_rel, dtype=float), 1e-12)
        fr = pipe_flow(q[..., None], self.di, density=self.rho, tau_y=ty, k=k, n=n,
                       method=self.method)  # fmt: skip
        friction = np.sum(np.asarray(fr.gradient) * self.ls, axis=-1)
        nozzles = bit_pressure_drop(q, self.rho, self.bit.tfa, self.bit.discharge_coefficient)
        return friction + np.asarray(nozzles)


def _annulus_state(g: _Geometry, vp, q_rel, clinging):
    """(K_c, q_e, gradient, regime, FlowResult) with the regime-dependent Burkhardt fit."""
    q_disp = vp[..., None] * g.area_o - np.asarray(q_rel)[..., None]
    if isinstance(clinging, str):
        kc = np.broadcast_to(clinging_constant(g.d1, g.d2, "laminar"), q_disp.shape)
        q_e = q_disp + kc * vp[..., None] * g.area_a
        grad, regime, fr = g.annulus_gradient(q_e)
        turb = regime == 2
        if np.any(turb):
            kc = np.asarray(clinging_constant(g.d1, g.d2, turb))
            q_e = q_disp + kc * vp[..., None] * g.area_a
            grad, regime, fr = g.annulus_gradient(q_e)
    else:
        kc = np.broadcast_to(np.asarray(clinging, dtype=float), q_disp.shape)
        q_e = q_disp + kc * vp[..., None] * g.area_a
        grad, regime, fr = g.annulus_gradient(q_e)
    return kc, q_e, grad, regime, fr


def _solve(g: _Geometry, vp, end, clinging, iterations=50):
    """Annulus state for pipe speeds ``vp`` (any shape), closed or open end."""
    if end == "closed":
        q_rel = np.zeros_like(vp)
    else:
        q_max = vp * float(np.min(g.area_o))

        def f(qr):
            _, _, grad, _, _ = _annulus_state(g, vp, qr, clinging)
            return g.bore_pressure(qr) - np.sum(grad * g.length, axis=-1)

        q_rel = bisect_increasing(f, np.zeros_like(vp), q_max, iterations=iterations)
    return q_rel, *_annulus_state(g, vp, q_rel, clinging)


def _check_clinging(clinging):
    if isinstance(clinging, str):
        check_choice("clinging", clinging, ("burkhardt",))
        return clinging
    kc = check_nonnegative("clinging constant", clinging)
    if np.any(kc >= 1.0):
        raise InputError("clinging constant", float(np.max(kc)), "in [0, 1)")
    return kc


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
    pf = float(check_positive("peak factor", peak_factor))
    if pf < 1.0:
        raise InputError("peak factor", pf, ">= 1 (peak over average speed)")
    clinging = _check_clinging(clinging)
    end, notes = _string_end(well, string_end)
    g = _Geometry(well, fluid, method, eccentricity)
    vp = np.asarray(v * pf, dtype=float)
    q_rel, kc, q_e, grad, regime, fr = _solve(g, vp, end, clinging)
    ip = grad * g.length
    kc_text = "fits (Guo & Liu 2011)" if isinstance(clinging, str) else "given"
    notes = list(notes) + list(getattr(fr, "notes", ()))
    return SurgeResult(
        speed=scalar_or_array(v),
        peak_speed=scalar_or_array(vp),
        direction=direction,
        string_end=end,
        names=g.names,
        top_md=np.asarray(g.a.top_md),
        bottom_md=np.asarray(g.a.bottom_md),
        clinging=np.asarray(kc),
        relative_inflow=scalar_or_array(q_rel),
        effective_rate=q_e,
        effective_velocity=q_e / g.area_a,
        gradient=grad,
        interval_pressure=ip,
        pressure_bit=scalar_or_array((1.0 if direction == "running" else -1.0) * ip.sum(-1)),
        regime=regime,
        method=f"Burkhardt (1961) steady surge; clinging {kc_text}; friction {method}",
        density=g.rho,
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
    from calc.circulation.hydrostatics import gravity_for
    from calc.circulation.window import limits_at

    mf = float(check_nonnegative("fracture margin", fracture_margin, "kg/m³"))
    mp = float(check_nonnegative("pore margin", pore_margin, "kg/m³"))
    stp = float(check_positive("check-depth step", step, "m"))
    pf = float(check_positive("peak factor", peak_factor))
    clinging = _check_clinging(clinging)
    end, notes = _string_end(well, string_end)
    notes = list(notes)
    g = _Geometry(well, fluid, method, eccentricity)
    md, names = _check_points(well, tuple(weak_points), stp)
    tvd = np.asarray(well.tvd_at(md), dtype=float)
    pore, frac = limits_at(md, tvd, names, window, tuple(weak_points))
    grav = gravity_for(hydrostatic)
    allow_surge = (frac - mf - g.rho) * grav * tvd
    allow_swab = (g.rho - pore - mp) * grav * tvd
    top, bot = np.asarray(g.a.top_md), np.asarray(g.a.bottom_md)
    w = np.clip((md[:, None] - top[None, :]) / (bot - top)[None, :], 0.0, 1.0)

    # surge and swab have the same magnitude in the steady model: bisect both sets of depths in
    # one vectorised pass (running limits first, pulling limits second)
    allow = np.concatenate([allow_surge, allow_swab])
    w2 = np.concatenate([w, w])

    def excess(v_avg):
        _, _, _, grad, _, _ = _solve(g, v_avg * pf, end, clinging, iterations=30)
        return np.sum(grad * g.length * w2, axis=-1) - allow

    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    lim = bisect_increasing(excess, lo, hi, iterations=32, log=True)
    lim = np.where(allow <= 0, 0.0, lim)
    limits = [lim[: md.size], lim[md.size :]]
    for a, what in ((allow_surge, "surge"), (allow_swab, "swab")):
        if np.any(a <= 0):
            notes.append(
                Note(
                    "caution",
                    f"{what}_margin_violated_static",
                    f"the static mud weight already violates the {what} margin at "
                    f"{int(np.sum(a <= 0))} check depth(s): no safe {what} speed.",
                    "trip speed",
                )
            )
    run, pull = limits
    ir, ip = int(np.argmin(run)), int(np.argmin(pull))
    for lim, what in ((run, "running"), (pull, "pulling")):
        if np.min(lim) >= 0.999 * speed_bracket[1]:
            notes.append(
                Note(
                    "info",
                    f"{what}_not_limiting",
                    f"{what} speed not limited within {speed_bracket[1]:g} m/s.",
                    "trip speed",
                )
            )
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
    from calc.circulation.hydrostatics import gravity_for

    tg = float(check_nonnegative("gel strength", gel_strength, "Pa"))
    rho = float(check_positive("mud density", density, "kg/m³"))
    iv = well.flow_intervals()
    s, a = iv.string, iv.annulus
    sp = 4.0 * tg * np.asarray(s.length) / np.asarray(s.outer_diameter)
    ap = 4.0 * tg * np.asarray(a.length) / (np.asarray(a.outer_diameter) - a.inner_diameter)
    emw = rho + float(ap.sum()) / (gravity_for(hydrostatic) * well.bit_tvd)
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
