"""Trip-speed limits: the highest running and pulling speeds keeping surge and swab inside the
pore/fracture window (whole well) or an allowed pressure change (flat intervals).

Each limit is a vectorised bisection in ln V over every allowance at once (``_speed_limit``;
open string with the allowance at the bit: ``_open_speed_limit``).  Δp rises with the pipe
speed within each flow regime but may fall where an interval changes regime (a friction law
without a transitional zone, e.g. API RP 13D 1995 at Re = 2100; the Burkhardt K_c switch): a
scan of speeds with every regime change bracketed checks that no speed below the bisected limit
exceeds the allowance, and where one does the limit is the first crossing, re-bisected in the
first bracketing cell (a ``non_monotone_curve`` note).  Where Δp(V) jumps up through the
allowance the limit is the speed just below the jump, on the safe side.

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
from calc.flow import pipe_flow
from calc.flow.solvers import itp_solve
from calc.notes import Note
from calc.numeric import (
    bisect_increasing,
    depth_weights,
    first_positive,
    grid_with_switches,
    scalar_or_array,
)
from calc.surge.clinging import check_clinging
from calc.surge.emw import trip_allowance
from calc.surge.gel import check_gel, pipe_start_gel_pressure
from calc.surge.inertia import check_acceleration_time, inertial_pressure, peak_trip_pressure
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
    "TripComponents",
    "TripLimits",
    "TripPoint",
    "check_points",
    "exposed_hole",
    "limit_options",
    "limits_at_points",
    "limits_with_bit_at",
    "trip_speed_limit",
    "trip_speed_limits",
]


#: Speeds of the scan that checks each bisected limit for an earlier crossing: a log grid over
#: the search bracket (≈ 4 % apart over the default five decades), to which every regime change
#: of an interval is added as a tight bracket (:func:`calc.numeric.grid_with_switches`).
SCAN_POINTS = 289


def _safe_side(mid, lo, hi, iterations):
    """Step a log-bisection midpoint down by its final bracket width: the result lies below
    the last bracket's lower end, where the excess is ≤ 0.  Where Δp(V) jumps (the Burkhardt
    fit changes K_c with the regime) the limit is so the speed just below the jump."""
    return mid * np.exp(-np.log(hi / lo) / 2.0**iterations)


def _first_crossing(evaluate, excess_at, allow, lim, speed_bracket):
    """The first crossing of the allowance where the bisected ``lim`` is a later one.

    Δp(V) rises with V within each flow regime but may fall where an interval changes regime
    (a friction law without a transitional zone, or the Burkhardt K_c switch): bisection over
    the whole bracket then finds *a* crossing, not necessarily the first.  The check scans a
    log grid of speeds plus both sides of every regime change, so that every local maximum of
    Δp (the left limit at a jump) is a grid point; where some grid speed below ``lim`` already
    exceeds the allowance, the limit is re-bisected in the first cell that brackets a crossing
    (within a regime, so on a rising curve) and stepped to its safe side.

    evaluate(v) → (Δp per allowance (len(v), M) [Pa], regimes (len(v), columns)) for a 1-D
    array of speeds; excess_at(v, idx) → Δp − allowance of the entries ``idx`` at speeds ``v``.
    Returns (limits, moved, ambiguous, below): ``moved`` where the first crossing replaced
    the bisected limit; ``ambiguous`` where a regime falls back as the speed rises (an open
    string whose split has several solutions) and the limit is held at ``below`` [m/s], the
    speed just under the first regime change (None where no regime falls back).
    """
    grid = np.geomspace(speed_bracket[0], speed_bracket[1], SCAN_POINTS)
    grid = grid_with_switches(lambda v: evaluate(v)[1], grid)
    dp, reg = evaluate(grid)
    first, found = first_positive(dp - allow[None, :])
    moved = found & (first > 0) & (grid[first] < lim)
    out = lim.copy()
    if moved.any():
        idx = np.flatnonzero(moved)
        a, b = grid[first[idx] - 1], grid[first[idx]]
        v = bisect_increasing(lambda x: excess_at(x, idx), a, b, iterations=50, log=True)
        out[idx] = _safe_side(v, a, b, 50)
    # a regime that falls back as the speed rises (an open string's bore/annulus split with
    # more than one solution) leaves Δp(V) undefined between its branches: no limit above the
    # first regime change is guaranteed, so the limit is kept below it
    # (flips narrower than the scan spacing can hide inside one bracketed regime change: an
    # open-string limit is then not guaranteed beyond the scan's resolution)
    back = np.any(np.diff(reg, axis=0) < 0, axis=-1)
    ambiguous = np.zeros(out.shape, dtype=bool)
    change = np.flatnonzero(np.any(np.diff(reg, axis=0) != 0, axis=-1))
    if not change.size:
        return out, moved, ambiguous, None
    below = float(grid[change[0]])
    if back.any():
        ambiguous = out > below
    if not ambiguous.any():
        return out, moved, ambiguous, None
    return np.where(ambiguous, below, out), moved & ~ambiguous, ambiguous, below


def _regimes(p: SurgePaths, st, end):
    """Regime of every annular interval and, for an open string, of every bore interval at
    the relative inflow (speeds axis + columns)."""
    if end == "closed":
        return np.asarray(st.regime)
    ty, k, n = p.pipe_params
    q = np.maximum(np.asarray(st.relative_inflow, dtype=float), 1e-12)
    bore = pipe_flow(q[..., None], p.bore_d, density=p.rho, tau_y=ty, k=k, n=n, method=p.method)
    return np.concatenate([np.asarray(st.regime), np.asarray(bore.regime)], axis=-1)


def _speed_limit(p: SurgePaths, allow, weights, end, clinging, pf, speed_bracket, inertia=None):
    """Average speed at which Σ gradient·length·weights first reaches ``allow`` [m/s]
    (vectorised bisection in ln V over every entry of ``allow`` at once, checked for an
    earlier crossing by :func:`_first_crossing`).

    Returns (speeds, stuck, moved, bisected): 0 where ``allow`` ≤ 0, and 0 where even the
    slowest speed of the bracket exceeds the allowance (``stuck``: a yield stress gives a finite
    pressure change at any motion in the steady model); ``moved`` where the curve is not
    monotone and the first crossing lies below the bisected one (``bisected``: the crossing
    that bisection over the whole bracket found).  ``inertia``: a pressure change linear in
    the average speed added to the friction, c·V [Pa] with c per entry of ``allow``
    [Pa·s/m] (the inertial term, :mod:`calc.surge.inertia`; None: none)."""
    allow = np.asarray(allow, dtype=float)
    w = np.asarray(weights, dtype=float)
    c = np.zeros(allow.shape) if inertia is None else np.broadcast_to(inertia, allow.shape)
    c_flat = np.asarray(c, dtype=float).reshape(-1)

    def excess(v_avg):
        grad = solve(p, v_avg * pf, end, clinging, iterations=30).gradient
        return np.sum(grad * p.length * weights, axis=-1) + c * v_avg - allow

    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    stuck = (allow > 0) & (np.asarray(excess(lo)) >= 0)
    lim = _safe_side(bisect_increasing(excess, lo, hi, iterations=32, log=True), lo, hi, 32)
    flat = allow.reshape(-1)
    wf = w.reshape(-1, w.shape[-1]) if w.ndim else w

    def evaluate(v):
        st = solve(p, v * pf, end, clinging, iterations=30)
        dp = st.gradient * p.length
        per = dp @ wf.T if wf.ndim else np.sum(dp, axis=-1)[:, None] * np.ones(flat.size)
        return per + v[:, None] * c_flat[None, :], _regimes(p, st, end)

    def excess_at(v, idx):
        grad = solve(p, v * pf, end, clinging, iterations=30).gradient
        wi = wf[idx] if wf.ndim else wf
        return np.sum(grad * p.length * wi, axis=-1) + c_flat[idx] * v - flat[idx]

    checked, moved, amb, below = _first_crossing(
        evaluate, excess_at, flat, lim.reshape(-1), speed_bracket
    )
    off = (allow <= 0) | stuck
    moved = moved.reshape(allow.shape) & ~off
    amb = amb.reshape(allow.shape) & ~off
    return np.where(off, 0.0, checked.reshape(allow.shape)), stuck, moved, lim, (amb, below)


def _open_speed_limit(p: SurgePaths, allow, clinging, pf, speed_bracket):
    """:func:`_speed_limit` for an open string when the allowance applies at the bit.

    At the limit both paths carry the allowed pressure change: the bore gives q_rel from
    bore(q_rel) = allow (ITP search to double precision), then the annulus gives V from
    annulus(V, q_rel) = allow (log-bisection, safe side) — two sequential searches on the same
    equations instead of one nested in the other.  The result is checked for an earlier
    crossing of the surge solver's own Δp(V) (:func:`_first_crossing`), and re-bisected on it
    where one exists (a bore or annulus loss that falls at a regime change)."""
    allow = np.asarray(allow, dtype=float)
    lo = np.full(allow.shape, float(speed_bracket[0]))
    hi = np.full(allow.shape, float(speed_bracket[1]))
    a_min = float(np.min(p.area_o))
    q_hi = hi * pf * a_min
    q_rel = itp_solve(lambda q: bore_pressure(p, q) - allow, np.zeros_like(allow), q_hi, rtol=2e-16)

    def excess(v_avg):
        vp = v_avg * pf
        qr = np.minimum(q_rel, vp * a_min)
        grad = annulus_state(p, vp, qr, clinging).gradient
        return np.sum(grad * p.length, axis=-1) - allow

    stuck = (allow > 0) & (np.asarray(excess(lo)) >= 0)
    lim = _safe_side(bisect_increasing(excess, lo, hi, iterations=50, log=True), lo, hi, 50)
    flat = allow.reshape(-1)

    # the check runs on the pressure change the surge solver gives at each speed (q_rel from
    # the bore/annulus balance at that speed): the split found above assumes one q_rel per
    # allowance, which a bore loss that falls at a regime change need not give
    def evaluate(v):
        st = solve(p, v * pf, "open", clinging)
        dp = np.sum(st.gradient * p.length, axis=-1)
        return dp[:, None] * np.ones(flat.size), _regimes(p, st, "open")

    def excess_at(v, idx):
        return np.sum(solve(p, v * pf, "open", clinging).gradient * p.length, axis=-1) - flat[idx]

    checked, moved, amb, below = _first_crossing(
        evaluate, excess_at, flat, lim.reshape(-1), speed_bracket
    )
    off = (allow <= 0) | stuck
    moved = moved.reshape(allow.shape) & ~off
    amb = amb.reshape(allow.shape) & ~off
    return np.where(off, 0.0, checked.reshape(allow.shape)), stuck, moved, lim, (amb, below)


def _non_monotone_note(what: str, moved, first, later) -> Note | None:
    """Warning where Δp(V) falls at a regime change and the first crossing was taken."""
    if not np.any(moved):
        return None
    first, later = np.asarray(first).reshape(-1), np.asarray(later).reshape(-1)
    i = np.flatnonzero(np.asarray(moved).reshape(-1))
    j = i[int(np.argmin(first[i]))]
    return Note(
        "warning",
        "non_monotone_curve",
        f"the {what} does not rise steadily with the trip speed (it falls where the flow "
        f"regime changes): at {{count}} point(s) the allowance is first reached at a lower "
        f"speed than the next crossing; the limit is the first crossing ({{first}}, not "
        f"{{later}}).",
        "trip speed",
        values=(
            Value("count", float(i.size)),
            Value("first", float(first[j]), "trip_speed"),
            Value("later", float(later[j]), "trip_speed"),
        ),
    )


def _split_note(what: str, ambiguous, below) -> list[Note]:
    """Caution where an open string's split is not unique and the limit is held below it."""
    if not np.any(ambiguous):
        return []
    return [
        Note(
            "caution",
            "open_split_not_unique",
            f"the {what} of the open string is not unique above {{below}}: the split between "
            f"bore and annulus has more than one solution there (the flow regime flips back as "
            f"the speed rises), so no higher limit can be guaranteed; at {{count}} point(s) the "
            f"limit is held at {{below}}, just below the first regime change.",
            "trip speed",
            values=(Value("count", float(np.sum(ambiguous))), Value("below", below, "trip_speed")),
        )
    ]


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


@dataclass(frozen=True)
class TripComponents:
    """The parts of the peak surge (or swab) at a governing check depth at the limit speed (SI).

    speed        average stand speed [m/s] (the limit); ``peak_speed`` × peak factor [m/s]
    steady       Burkhardt steady friction at the peak speed [Pa] (magnitude)
    inertia      ρ·Σ r_i·a_p·L_i with a_p = peak speed / acceleration time [Pa] (0 without)
    gel          pressure to break the stand gel when the pipe starts [Pa] (0 without)
    peak         max(gel, steady + inertia) [Pa]: the gel acts at start-up, before the mud
                 flows; friction and inertia act together while the pipe speeds up
    stopping     inertia of the stop at the end of the stand, the opposite sign [Pa]
    allowance    allowed pressure change there [Pa]; ``opposite_allowance`` for the stop
    term         what governs: "friction", "inertia", "stopping", "gel", "static" or
                 "not limiting"
    """

    speed: float
    peak_speed: float
    steady: float
    inertia: float
    gel: float
    peak: float
    stopping: float
    allowance: float
    opposite_allowance: float
    term: str


@dataclass(frozen=True, eq=False)
class TripLimits:
    """Maximum trip speeds keeping surge EMW below fracture − margin and swab EMW above
    pore + margin at every check depth (SI; speeds are average stand speeds).

    max_running_speed, max_pulling_speed   [m/s] (the tightest depth governs)
    running_point, pulling_point          the governing check depth (:class:`TripPoint`)
    md, tvd                               check depths [m] (last shoe to bit, weak points;
                                          in a schedule also the exposed hole below the bit)
    names                                 their names ("" for plain depths, see TripPoint)
    running_limit, pulling_limit          per-depth speed limits [m/s]
    surge_allowance, swab_allowance       allowed pressure change per depth [Pa]
    running, pulling                      :class:`TripComponents` at the governing points
    peak_factor                           peak over average stand speed [-]
    acceleration_time                     time to reach the peak speed [s] (None: no inertia)
    stand_gel                             gel strength broken at each stand start [Pa] (None)
    string_end                            "closed" or "open"
    method                                surge model, friction method, search
    fracture_margin, pore_margin          trip margins [kg/m³]
    bit_md                                bit depth of this solve [m]
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
    running: TripComponents | None = None
    pulling: TripComponents | None = None
    acceleration_time: float | None = None
    stand_gel: float | None = None
    bit_md: float = 0.0
    notes: tuple[Note, ...] = ()


def exposed_hole(well) -> tuple[float, str]:
    """Top of the exposed hole [m] (the deepest casing or liner shoe above the bit, 0 without
    one) and that shoe's name ("<section> shoe", "" without one)."""
    last = well.last_shoe
    return (0.0, "") if last is None else (float(last.bottom), f"{last.name} shoe")


def check_points(well, weak_points, step):
    """Check depths: every ``step`` from the last shoe (the top of the exposed hole) to the bit,
    plus the weak points; named "<casing> shoe", "bit" and by weak point ("" elsewhere)."""
    bit = float(well.bit_depth)
    top, shoe = exposed_hole(well)
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


def _inertia_coefficients(p: SurgePaths, end, weights, pf, t_acc):
    """Inertial pressure per unit average speed at each check depth, c = ρ·Σ w·r·L·pf/t_a
    [Pa·s/m] (zeros without an acceleration time): :mod:`calc.surge.inertia`."""
    if t_acc is None:
        return np.zeros(weights.shape[0])
    per_interval = np.atleast_1d(inertial_pressure(p.rho, pf / t_acc, p.d2, p.d1, p.length,
                                                   d_bore=p.bore_d, bore_length=p.bore_length,
                                                   string_end=end))  # fmt: skip
    return weights @ per_interval


def _gel_at_points(p: SurgePaths, end, weights, gel):
    """Stand gel-break pressure at each check depth [Pa] (zeros without a gel strength)."""
    if gel is None:
        return np.zeros(weights.shape[0])
    ann, cap = pipe_start_gel_pressure(gel, p.d2, p.d1, p.length, d_bore=p.bore_d,
                                       bore_length=p.bore_length, string_end=end)  # fmt: skip
    return np.minimum(weights @ ann, cap)


def _gel_note(what: str, count: int) -> Note:
    return Note(
        "caution",
        f"{what}_gel_exceeds_allowance",
        f"at {{count}} check depth(s) breaking the stand gel alone exceeds the {what} "
        f"allowance: no trip speed keeps the start of a stand inside the margin (break the gel "
        f"first, e.g. by rotating or circulating, or lower the gels).",
        "trip speed",
        values=(Value("count", float(count)),),
    )


def _stop_note(what: str, count: int) -> Note:
    return Note(
        "info",
        f"{what}_limited_by_stopping",
        f"at {{count}} check depth(s) the {what} speed is limited by stopping the stand (the "
        f"inertia of the deceleration, of the opposite sign), not by its own "
        f"{'surge' if what == 'running' else 'swab'}.",
        "trip speed",
        values=(Value("count", float(count)),),
    )


def _components(p, end, clinging, pf, w_row, c, gel, v, allow, opp, term) -> TripComponents:
    """The parts of the peak pressure change at one check depth at speed ``v`` [m/s]."""
    grad = solve(p, np.asarray(v * pf), end, clinging).gradient
    steady = float(np.sum(grad * p.length * w_row))
    inertia = float(c * v)
    return TripComponents(
        speed=float(v), peak_speed=float(v * pf), steady=steady, inertia=inertia, gel=float(gel),
        peak=float(peak_trip_pressure(steady, inertia, gel)), stopping=inertia,
        allowance=float(allow), opposite_allowance=float(opp), term=term,
    )  # fmt: skip


def _term(i, lim, friction_lim, stop_lim, gel_bad, allow, steady_vs_inertia, top) -> str:
    if allow[i] <= 0:
        return "static"
    if gel_bad[i]:
        return "gel"
    if lim[i] >= 0.999 * top:
        return "not limiting"
    if stop_lim[i] < friction_lim[i]:
        return "stopping"
    return steady_vs_inertia


def _with_stop_and_gel(lim, allow_surge, allow_swab, c, g, bracket):
    """Limits (running entries first, pulling second) with the stop of the stand and the gel.

    Stopping a stand reverses the inertia: running in it swabs, pulling out it surges, so the
    speed is also held to (other allowance)/c; where the gel-break pressure exceeds the
    allowance no speed is safe (0).  Returns (limits, stop limits, gel exceeds)."""
    allow = np.concatenate([allow_surge, allow_swab])
    opp = np.concatenate([allow_swab, allow_surge])
    cc = np.concatenate([c, c])
    with np.errstate(divide="ignore", invalid="ignore"):
        stop = np.where(cc > 0, np.maximum(opp, 0.0) / cc, np.inf)
    stop = _safe_side(np.minimum(stop, bracket[1]), bracket[0], bracket[1], 50)
    stop = np.where(cc > 0, stop, np.inf)
    gel_bad = np.concatenate([g, g]) > allow
    return np.where(gel_bad, 0.0, np.minimum(lim, stop)), stop, gel_bad


def limits_with_bit_at(wells, fluid, names, *, window, weak_points, mf, mp, end, notes, method,
                       clinging, pf, eccentricity, bracket, hydrostatic, t_acc, gel):  # fmt: skip
    """Running and pulling limits at the bit of each well (each with its bit at its own depth).

    A closed string's annulus carries no coupling between intervals and an interval's friction
    gradient depends on its diameters only, so the wells are solved in one vectorised pass over
    the distinct (hole ID, pipe OD) pairs, each well weighing them by its own lengths (closed
    strings only).  Returns
    (running [m/s], pulling [m/s], running terms, pulling terms, notes)."""
    if end != "closed":
        raise InputError("string end", end, "closed (an open string's split couples its intervals)")
    parts = [paths_from_well(w, fluid, method, eccentricity) for w in wells]
    p0 = parts[0]
    # the friction gradient of an annular interval depends on its diameters, not its length:
    # one column per distinct (hole ID, pipe OD), weighted by each well's length of it
    d2 = np.concatenate([q.d2 for q in parts])
    d1 = np.concatenate([q.d1 for q in parts])
    ln = np.concatenate([q.length for q in parts])
    row = np.repeat(np.arange(len(parts)), [q.d2.size for q in parts])
    pairs, col = np.unique(np.round(np.stack([d2, d1], axis=1), 12), axis=0, return_inverse=True)
    w = np.zeros((len(parts), pairs.shape[0]))
    np.add.at(w, (row, col.reshape(-1)), ln)
    union = SurgePaths(
        d2=pairs[:, 0].copy(), d1=pairs[:, 1].copy(), length=np.ones(pairs.shape[0]),
        rho=p0.rho, ann_params=p0.ann_params, pipe_params=p0.pipe_params, method=p0.method,
        ecc=eccentricity,
    )  # fmt: skip
    md = np.array([float(x.bit_depth) for x in wells])
    tvd = np.array([float(x.bit_tvd) for x in wells])
    pore, frac = limits_at(md, tvd, names, window, tuple(weak_points))
    allow_surge = np.atleast_1d(trip_allowance(frac - mf, p0.rho, tvd, "running",
                                               hydrostatic=hydrostatic))  # fmt: skip
    allow_swab = np.atleast_1d(trip_allowance(pore + mp, p0.rho, tvd, "pulling",
                                              hydrostatic=hydrostatic))  # fmt: skip
    c = _inertia_coefficients(union, "closed", w, pf, t_acc)
    g = _gel_at_points(union, "closed", w, gel)
    allow = np.concatenate([allow_surge, allow_swab])
    lim, stuck, moved, later, _amb = _speed_limit(
        union, allow, np.concatenate([w, w]), "closed", clinging, pf, bracket,
        np.concatenate([c, c]),
    )  # fmt: skip
    total, stop, gel_bad = _with_stop_and_gel(lim, allow_surge, allow_swab, c, g, bracket)
    grad = solve(union, total * pf, "closed", clinging).gradient
    steady = np.sum(grad * union.length * np.concatenate([w, w]), axis=-1)
    inertia = np.concatenate([c, c]) * total
    terms = [
        _term(k, total, lim, stop, gel_bad, allow,
              "inertia" if inertia[k] > steady[k] else "friction", bracket[1])
        for k in range(allow.size)
    ]  # fmt: skip
    n = md.size
    out_notes = list(notes)
    for part, what in ((slice(None, n), "surge"), (slice(n, None), "swab")):
        out_notes += _allowance_notes(what, allow[part], stuck[part], bracket[0])
        nm = _non_monotone_note(what, moved[part], lim[part], later[part])
        out_notes += [nm] if nm else []
    return total[:n], total[n:], terms[:n], terms[n:], out_notes


def limits_at_points(well, fluid, md, names, *, window, weak_points, mf, mp, end, notes,
                      method, clinging, pf, eccentricity, bracket, hydrostatic, t_acc,
                      gel) -> TripLimits:  # fmt: skip
    """Trip-speed limits with the bit at ``well.bit_depth`` at the check depths ``md`` (those
    below the bit feel the bit's pressure change)."""
    notes = list(notes)
    p = paths_from_well(well, fluid, method, eccentricity)
    a = well.flow_intervals().annulus
    tvd = np.asarray(well.tvd_at(md), dtype=float)
    pore, frac = limits_at(md, tvd, names, window, tuple(weak_points))
    allow_surge = trip_allowance(frac - mf, p.rho, tvd, "running", hydrostatic=hydrostatic)
    allow_swab = trip_allowance(pore + mp, p.rho, tvd, "pulling", hydrostatic=hydrostatic)
    allow_surge, allow_swab = np.atleast_1d(allow_surge), np.atleast_1d(allow_swab)
    top, bot = np.asarray(a.top_md), np.asarray(a.bottom_md)
    w = depth_weights(md, top, bot)
    c = _inertia_coefficients(p, end, w, pf, t_acc)
    g = _gel_at_points(p, end, w, gel)

    # surge and swab have the same magnitude in the steady model: bisect both sets of depths in
    # one vectorised pass (running limits first, pulling limits second)
    allow = np.concatenate([allow_surge, allow_swab])
    lim, stuck, moved, later, amb = _speed_limit(
        p, allow, np.concatenate([w, w]), end, clinging, pf, bracket, np.concatenate([c, c])
    )
    total, stop, gel_bad = _with_stop_and_gel(lim, allow_surge, allow_swab, c, g, bracket)
    for part, what in ((slice(None, md.size), "surge"), (slice(md.size, None), "swab")):
        notes += _allowance_notes(what, allow[part], stuck[part], bracket[0])
        nm = _non_monotone_note(what, moved[part], lim[part], later[part])
        notes += [nm] if nm else []
        notes += _split_note(what, amb[0][part], amb[1])
        bad = gel_bad[part] & (allow[part] > 0)
        if np.any(bad):
            notes.append(_gel_note(what, int(np.sum(bad))))
        by_stop = (stop[part] < lim[part]) & ~gel_bad[part] & (allow[part] > 0)
        if np.any(by_stop):
            notes.append(_stop_note("running" if what == "surge" else "pulling",
                                    int(np.sum(by_stop))))  # fmt: skip
    n = md.size
    run, pull = total[:n], total[n:]
    ir, ip = int(np.argmin(run)), int(np.argmin(pull))
    for vals, what in ((run, "running"), (pull, "pulling")):
        if np.min(vals) >= 0.999 * bracket[1]:
            notes.append(_not_limiting_note(what, bracket[1]))
    comps = []
    for i, off, vals, own, other in ((ir, 0, run, allow_surge, allow_swab),
                                     (ip, n, pull, allow_swab, allow_surge)):  # fmt: skip
        k = off + i
        v = float(vals[i])
        steady = _components(p, end, clinging, pf, w[i], c[i], g[i], v, own[i], other[i], "")
        kind = "inertia" if steady.inertia > steady.steady else "friction"
        term = _term(k, total, lim, stop, gel_bad, allow, kind, bracket[1])
        comps.append(TripComponents(**{**steady.__dict__, "term": term}))
    extra = []
    if t_acc is not None:
        extra.append(f"inertia with the peak speed reached in {t_acc:g} s")
    if gel is not None:
        extra.append("stand gel breaking at start-up")
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
        method=f"Burkhardt (1961) steady surge/swab, friction {p.method}"
        + "".join(f"; {x}" for x in extra)
        + ", vectorised bisection",
        fracture_margin=mf,
        pore_margin=mp,
        running=comps[0],
        pulling=comps[1],
        acceleration_time=t_acc,
        stand_gel=gel,
        bit_md=float(well.bit_depth),
        notes=tuple(dict.fromkeys(notes)),
    )


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
    acceleration_time: float | None = None,
    stand_gel: float | None = None,
) -> TripLimits:
    """Maximum running and pulling speeds at which surge and swab stay inside the margins.

    .. math:: \\Delta p_{peak}(z) = \\max\\left(\\Delta p_{gel}(z),\\
              \\Delta p_{steady}(z, f_{peak}V) + \\rho\\,\\frac{f_{peak}V}{t_a}
              \\sum_i w_i(z)\\,r_i L_i\\right) \\le \\Delta p_{allowed}(z)

    with Δp_surge,allowed(z) = (ρ_frac(z) − m_f − ρ)·g·TVD(z) and Δp_swab,allowed(z) =
    (ρ − ρ_pore(z) − m_p)·g·TVD(z), and the stop at the end of the stand (the inertia alone,
    opposite sign) inside the other allowance.  The gel acts at start-up, before the mud flows;
    friction and inertia act together while the pipe speeds up (at the end of a constant
    acceleration both are largest), so the peak is the larger of the two, not their sum.

    Each depth's limit is the first speed at which the peak reaches the allowance: vectorised
    bisection (all depths at once), checked on a speed scan with every regime change bracketed
    where Δp falls as a regime changes; the smallest governs and its depth is named.

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
    acceleration_time : float, optional
        Time for the pipe to reach its peak speed from rest (and to stop) [s], > 0
        (:data:`calc.surge.inertia.DEFAULT_ACCELERATION_TIME` is the report's default);
        None: no inertia (steady surge only).
    stand_gel : float, optional
        Gel strength broken when the pipe starts at each stand [Pa], ≥ 0 (the 10-second gel,
        :data:`calc.surge.gel.GEL_CHOICES`); None: no gel term.

    Returns
    -------
    TripLimits

    Notes
    -----
    Limits are average stand speeds (the surge uses ``peak_factor`` × speed).  Rules
    (from memory, not yet checked against a source; calc/METHODS.md §11.7) — the tightest point is
    often the last shoe for surge, the deepest permeable zone for swab.  Each check depth uses
    the pore and fracture pressure at its own TVD.
    """
    opts = limit_options(
        well, fracture_margin, pore_margin, string_end, peak_factor, speed_bracket, clinging,
        acceleration_time, stand_gel,
    )  # fmt: skip
    stp = float(check_positive("check-depth step", step, "m"))
    md, names = check_points(well, tuple(weak_points), stp)
    return limits_at_points(
        well, fluid, md, names, window=window, weak_points=weak_points, method=method,
        eccentricity=eccentricity, hydrostatic=hydrostatic, **opts,
    )  # fmt: skip


def limit_options(well, fracture_margin, pore_margin, string_end, peak_factor, speed_bracket,
                   clinging, acceleration_time, stand_gel) -> dict:  # fmt: skip
    """Checked options shared by :func:`trip_speed_limits` and :func:`trip_schedule`."""
    end, notes = string_end_for(well, string_end)
    return dict(
        mf=float(check_nonnegative("fracture margin", fracture_margin, "kg/m³")),
        mp=float(check_nonnegative("pore margin", pore_margin, "kg/m³")),
        pf=check_peak(peak_factor),
        bracket=_check_bracket(speed_bracket),
        clinging=check_clinging(clinging),
        end=end,
        notes=notes,
        t_acc=check_acceleration_time(acceleration_time),
        gel=check_gel("stand gel strength", stand_gel),
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

    Solved for V by vectorised bisection in ln V over every allowance at once, checked for an
    earlier crossing where Δp falls as a regime changes (the limit is the first crossing).
    The intervals are those from surface down to the depth whose
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
        lim, stuck, moved, later, amb = _open_speed_limit(p, allow, clinging, pf, bracket)
    else:
        lim, stuck, moved, later, amb = _speed_limit(p, allow, 1.0, end, clinging, pf, bracket)
    grad = solve(p, lim * pf, end, clinging).gradient
    at = DIRECTION_SIGN[direction] * np.sum(grad * p.length, axis=-1)
    limited = lim < 0.999 * bracket[1]
    what = "surge" if direction == "running" else "swab"
    notes = _allowance_notes(what, allow, stuck, bracket[0])
    nm = _non_monotone_note(what, moved, lim, later)
    notes += [nm] if nm else []
    notes += _split_note(what, amb[0], amb[1])
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
