"""The safe operating window of flow RATES: every limit at once, with the curves to chart.

(Not the pore/fracture pressure window of :mod:`calc.circulation.pore_fracture`: that one is an
input here.)

A rate q is inside the window when, simultaneously,

* ECD(z) ≤ fracture(z) − margin at every check depth (``ecd_basis="loaded"``, the default: the
  cuttings-loaded ECD at that rate when ``rop`` > 0 and cuttings are given; ``"clean"``: the
  clean-mud ECD),
* ECD(z) ≥ pore(z) + margin at every check depth (clean ECD: the lower, conservative value),
* standpipe pressure ≤ the pump / surface rating,
* with ``pumps``: standpipe pressure ≤ the lowest liner rating of the running pumps, and each
  pump's share of the hydraulic power p·Q ≤ its rated hydraulic power
  (:func:`calc.pumps.pump_limits`),
* every annular interval is cleaned (verdict at least ``require``, :mod:`calc.cleaning`),
* q lies in the flow window of every downhole tool that states one.

Each limit is a margin curve over the sweep (≥ 0 where met): pore and cleaning usually rise with
q, fracture (loaded with cuttings at low rates) and SPP usually fall, but no monotony is assumed.
The window is the widest run of sweep rates meeting every limit; each end is refined by linear
interpolation of the limit that fails just outside it, and that limit is named as binding.
One vectorised :func:`calc.circulation.circulate` call over all rates gives ECD and SPP.

A friction law without a transitional zone makes the margins jump where a row of the loop
changes regime, so a limit may fail between two sweep rates that both meet it, or an end may
lie elsewhere than interpolation says.  Every regime change is therefore added to the sweep as
a tight bracket; where a margin is not monotone over an end's sweep cell, or a limit fails at an
added rate, the window is taken on that finer scan and the end is the first failing rate going
outward from inside it (a ``non_monotone_curve`` note).  Monotone curves keep the sweep's ends.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.circulation import CirculationResult, Margins, circulate
from calc.circulation import well_parts as wp
from calc.cleaning import Cuttings, cuttings_ecd_increment, hole_cleaning
from calc.cleaning.indicators import cleaning_score
from calc.errors import InputError, check_choice, check_positive
from calc.notes import Note
from calc.numeric import first_change, grid_with_switches
from calc.pumps import pump_limits
from calc.span import Span
from calc.values import Value

__all__ = ["ECD_BASES", "OperatingWindow", "operating_window"]

#: What ECD the window's fracture limit holds: with the cuttings load at each rate, or clean.
ECD_BASES = ("loaded", "clean")


@dataclass(frozen=True, eq=False)
class OperatingWindow:
    """Flow-rate window and the curves behind it (SI; per-rate arrays over the sweep ``q``).

    q                       sweep rates [m³/s]
    q_low, q_high           window ends [m³/s] (``feasible`` False → empty window)
    binding_low, binding_high   name of the limit that binds at each end (a key of ``limits``,
                            "lowest rate swept" / "highest rate swept", or the failing limits'
                            names joined by " and " when no rate is feasible)
    limits                  name → margin curve over q (≥ 0 inside; units per limit:
                            kg/m³ for ECD limits, Pa for SPP and liner rating, W for
                            rated hydraulic power, m³/s for tool windows, relative for
                            cleaning)
    spp                     standpipe pressure [Pa]; ``surface_rating`` [Pa] (inf: none)
    ecd_fracture_point      ECD at the check point tightest against fracture [kg/m³]
    fracture_at_point       that point's fracture EMW [kg/m³]
    fracture_point_name     that point's name as the circulation's margin table gives it
    fracture_point_md, fracture_point_tvd   that point's depth [m]
    ecd_pore_point, pore_at_point, pore_point_name, pore_point_md, pore_point_tvd
                            likewise against pore
    ecd_max_at_point, ecd_min_at_point   the ECD limits there: fracture − margin and pore +
                            margin [kg/m³] (the lines the window's ECD must stay between)
    cleaning_indicator      the cleaning score of the worst interval [-] (≥ 0: cleaned)
    min_transport_ratio, max_concentration   per rate, over the intervals [-]
    min_cleaning_rate       rate needed to clean every interval [m³/s] (0 without cuttings)
    controlling_interval    the interval needing it (None without cuttings)
    fracture_margin, pore_margin   required ECD margins [kg/m³]
    method                  circulation and cleaning methods
    ecd_basis               "loaded" (fracture limit on the cuttings-loaded ECD) or "clean"
    loaded                  whether a cuttings load was added (``ecd_basis`` "loaded" with
                            cuttings and ROP > 0)
    ecd_clean_fracture_point  the clean ECD at the point tightest against fracture [kg/m³]
    """

    q: np.ndarray
    q_low: float
    q_high: float
    feasible: bool
    binding_low: str
    binding_high: str
    limits: dict[str, np.ndarray]
    spp: np.ndarray
    surface_rating: float
    ecd_fracture_point: np.ndarray
    fracture_at_point: np.ndarray
    fracture_point_name: np.ndarray
    fracture_point_md: np.ndarray
    fracture_point_tvd: np.ndarray
    ecd_pore_point: np.ndarray
    pore_at_point: np.ndarray
    pore_point_name: np.ndarray
    pore_point_md: np.ndarray
    pore_point_tvd: np.ndarray
    ecd_max_at_point: np.ndarray
    ecd_min_at_point: np.ndarray
    cleaning_indicator: np.ndarray
    min_transport_ratio: np.ndarray
    max_concentration: np.ndarray
    min_cleaning_rate: float
    controlling_interval: Span | None
    fracture_margin: float
    pore_margin: float
    method: str
    notes: tuple[Note, ...] = field(default=())
    ecd_basis: str = "loaded"
    loaded: bool = False
    ecd_clean_fracture_point: np.ndarray | None = None


@dataclass(frozen=True, eq=False)
class _Cleaning:
    """The cleaning side of the window over the sweep (zeros without cuttings)."""

    indicator: np.ndarray
    min_transport_ratio: np.ndarray
    max_concentration: np.ndarray
    rate: float
    controlling: Span | None
    loaded_density: np.ndarray | None


def _end(q, m_all, names, inside: int, outside: int, default: str):
    """Window end between sweep points ``inside`` (every limit met) and ``outside``.

    Each limit failing at ``outside`` is interpolated linearly to its zero; the one closest to
    the inside point binds.  Returns (rate, name of the binding limit).
    """
    if outside < 0 or outside >= q.size:
        return float(q[inside]), default
    mi, mo = m_all[:, inside], m_all[:, outside]
    fail = mo < 0
    t = np.where(fail, mi / np.where(fail, mi - mo, 1.0), np.inf)
    k = int(np.argmin(t))
    return float(q[inside] + t[k] * (q[outside] - q[inside])), names[k]


def _cleaning_side(well, fluid, qv, *, rop, cuttings, slip_method, criteria, require, rpm=None):
    """Hole cleaning over the sweep: the worst interval's score per rate and the loads."""
    zero = np.zeros_like(qv)
    if cuttings is None:
        return _Cleaning(zero, zero, zero, 0.0, None, None)
    hc = hole_cleaning(
        well, fluid, qv, rop=rop, cuttings=cuttings, method=slip_method, criteria=criteria,
        require=require, rpm=rpm,
    )  # fmt: skip
    tr = hc.transport
    score = cleaning_score(
        hc.criteria, require, hc.vertical, np.asarray(tr.transport_ratio),
        np.asarray(tr.concentration), np.asarray(hc.cci.cci), np.asarray(hc.critical_ratio),
    )  # fmt: skip
    return _Cleaning(
        indicator=score.min(axis=-1),
        min_transport_ratio=np.asarray(tr.transport_ratio).min(axis=-1),
        max_concentration=np.asarray(tr.concentration).max(axis=-1),
        rate=float(hc.controlling_rate),
        controlling=hc.controlling_interval,
        loaded_density=np.asarray(tr.loaded_density),
    )


def _tool_limits(well, qv) -> dict[str, np.ndarray]:
    """Margins to the flow window of every downhole tool that states one [m³/s]."""
    limits = {}
    for t in well.tool_drops:
        fw = getattr(t, "flow_window", None)
        if fw is not None:
            limits[f"{t.name} flow window (min)"] = qv - fw[0]
            limits[f"{t.name} flow window (max)"] = fw[1] - qv
    return limits


def _window_ends(qv, limits: dict[str, np.ndarray]):
    """(q_low, q_high, binding_low, binding_high, feasible, notes, run) of the widest run of
    sweep rates meeting every limit (``run``: its first and last sweep index, None when no rate
    is feasible); each end refined between sweep points (:func:`_end`)."""
    names_all = list(limits)
    m_all = np.stack([limits[k] for k in names_all])  # (L, N)
    ok = np.all(m_all >= 0, axis=0)
    notes = []
    if not ok.any():
        worst = np.argmin(m_all / np.maximum(np.abs(m_all).max(axis=1, keepdims=True), 1e-300),
                          axis=0)  # fmt: skip
        failing = sorted({names_all[i] for i in worst})
        notes.append(
            Note(
                "caution",
                "no_operating_window",
                "no flow rate in the sweep meets every limit at once (failing: {failing}).",
                "operating window",
                values=(Value("failing", ", ".join(failing)),),
            )
        )
        both = " and ".join(failing)
        return float(qv[0]), float(qv[-1]), both, both, False, notes, None
    edges = np.diff(np.concatenate([[0], ok.astype(int), [0]]))
    starts, stops = np.flatnonzero(edges == 1), np.flatnonzero(edges == -1) - 1
    j = int(np.argmax(stops - starts))
    a, b = int(starts[j]), int(stops[j])
    if starts.size > 1:
        notes.append(_split_note(int(starts.size)))
    q_lo, b_lo = _end(qv, m_all, names_all, a, a - 1, "lowest rate swept")
    q_hi, b_hi = _end(qv, m_all, names_all, b, b + 1, "highest rate swept")
    return q_lo, q_hi, b_lo, b_hi, True, notes, (a, b)


@dataclass(frozen=True, eq=False)
class _Sweep:
    """Every limit of the window at a set of rates, with what the result reports."""

    result: CirculationResult
    limits: dict[str, np.ndarray]
    cleaning: _Cleaning
    loaded: np.ndarray
    ecd: np.ndarray
    fracture: np.ndarray
    pore: np.ndarray
    spp: np.ndarray


def _sweep(
    well,
    fluid,
    qv,
    *,
    rop,
    cuttings,
    slip_method,
    criteria,
    require,
    method,
    eccentricity,
    hydrostatic,
    window,
    weak_points,
    margins,
    surface_rating,
    ecd_basis,
    rpm=None,
    pumps=(),
) -> _Sweep:
    """The margin curve of every limit at the rates ``qv`` (one vectorised circulate call)."""
    res = circulate(
        well, fluid, qv, method=method, eccentricity=eccentricity, hydrostatic=hydrostatic,
        window=window, weak_points=weak_points, margins=margins, surface_rating=surface_rating,
    )  # fmt: skip
    mt = res.margins
    ecd = np.asarray(mt.ecd, dtype=float)  # (N, P)
    limits = {}
    cl = _cleaning_side(
        well, fluid, qv, rop=rop, cuttings=cuttings, slip_method=slip_method, criteria=criteria,
        require=require, rpm=rpm,
    )  # fmt: skip
    loaded = ecd
    if cuttings is not None:
        limits["hole cleaning"] = cl.indicator
        if rop > 0 and ecd_basis == "loaded":
            loaded = ecd + np.asarray(
                cuttings_ecd_increment(well, cl.loaded_density, float(fluid.density), mt.md)
            )
    frac_m = np.asarray(mt.fracture)[None, :] - loaded - margins.fracture
    pore_m = ecd - np.asarray(mt.pore)[None, :] - margins.pore
    limits["fracture"] = frac_m.min(axis=-1)
    limits["pore"] = pore_m.min(axis=-1)
    spp = np.asarray(res.standpipe_pressure, dtype=float)
    if surface_rating is not None:
        limits["surface rating"] = float(surface_rating) - spp
    if pumps:
        limits.update(pump_limits(pumps, spp, qv))
    limits.update(_tool_limits(well, qv))
    return _Sweep(res, limits, cl, loaded, ecd, frac_m, pore_m, spp)


def _regime_function(well, fluid, method, eccentricity):
    """``regimes(q)``: the flow regime of every row of the loop (surface lines, string,
    annulus) at the rates ``q`` — the flow layer's calls of :func:`calc.circulation.circulate`
    without the rest of the loop (one density, the fluid's pipe and annulus parameters)."""
    pa = wp.parts(well)
    law = wp.check_method(method)
    rho = float(np.asarray(fluid.density, dtype=float).reshape(-1)[0])
    pipe_d = np.concatenate([pa.line_d, pa.string_d])

    def regimes(q):
        qq = np.asarray(q, dtype=float)[:, None]
        pf = wp.pipe(qq, pipe_d[None, :], rho, fluid.pipe_parameters, law)
        af = wp.annulus(qq, pa.ann_hole[None, :], pa.ann_pipe[None, :], rho,
                        fluid.annulus_parameters, law, eccentricity)  # fmt: skip
        return np.concatenate([np.asarray(pf.regime), np.asarray(af.regime)], axis=-1)

    return regimes


def _monotone(m):
    """Whether every row of ``m`` (limits × points) is monotone along the points."""
    d = np.diff(m, axis=-1)
    return bool(np.all(np.all(d >= 0, axis=-1) | np.all(d <= 0, axis=-1)))


def _first_crossings(well, fluid, qv, limits, old, run, kw):
    """The window's ends as the first failing rate going outward from its inside, where a
    limit curve is not monotone between sweep rates.

    Friction may jump where a row of the loop changes regime (a law without a transitional
    zone), so ECD and SPP can fall as the rate rises; linear interpolation between sweep rates
    then misplaces an end, and a limit may fail between two sweep rates that both meet it.
    Every regime change is added to the sweep as a tight bracket
    (:func:`calc.numeric.grid_with_switches`), so each local extreme of a margin is a scan
    rate.  An end of the sweep's window (``old``, from sweep indices ``run``) stands where the
    window on the scan has the same sweep rates and every margin is monotone over the scan rates
    of that end's sweep cell; otherwise the end is bisected between the last rate meeting every
    limit and the first failing one (a ``non_monotone_curve`` note gives both rates).
    """
    method, ecc = kw["method"], kw["eccentricity"]
    regimes = _regime_function(well, fluid, method, ecc)
    g = grid_with_switches(regimes, qv, iterations=10, points=15)
    orig = np.isin(g, qv)
    if orig.all():
        return old
    names = list(limits)
    extra = _sweep(well, fluid, g[~orig], **kw).limits
    m = np.empty((len(names), g.size))
    m[:, orig] = np.stack([limits[k] for k in names])
    m[:, ~orig] = np.stack([extra[k] for k in names])
    ok = np.all(m >= 0, axis=0)
    edges = np.diff(np.concatenate([[0], ok.astype(int), [0]]))
    starts, stops = np.flatnonzero(edges == 1), np.flatnonzero(edges == -1) - 1
    counts = np.array([orig[i : k + 1].sum() for i, k in zip(starts, stops, strict=True)])
    j = int(np.argmax(counts))  # the widest run by sweep rates (≥ 1: old run is feasible)
    sweep_at = np.searchsorted(qv, g)  # sweep index of each scan rate that is a sweep rate
    in_run = np.flatnonzero(orig[starts[j] : stops[j] + 1]) + starts[j]
    ia, ib = int(sweep_at[in_run[0]]), int(sweep_at[in_run[-1]])
    q_lo, q_hi, b_lo, b_hi, feasible, notes = old
    todo, moved = [], False
    for inside, outside, si, so, side in (
        (starts[j], starts[j] - 1, ia, ia - 1, "low"),
        (stops[j], stops[j] + 1, ib, ib + 1, "high"),
    ):
        if outside < 0 or outside >= g.size:  # the window reaches the sweep's first/last rate
            if side == "low" and si != run[0]:
                notes.append(_non_monotone_note(side, "lowest rate swept", qv[0], q_lo))
                q_lo, b_lo, moved = float(qv[0]), "lowest rate swept", True
            if side == "high" and si != run[1]:
                notes.append(_non_monotone_note(side, "highest rate swept", qv[-1], q_hi))
                q_hi, b_hi, moved = float(qv[-1]), "highest rate swept", True
            continue
        if (si, so) == ((run[0], run[0] - 1) if side == "low" else (run[1], run[1] + 1)):
            lo_q, hi_q = sorted((qv[si], qv[so]))
            if _monotone(m[:, (g >= lo_q) & (g <= hi_q)]):
                continue  # the sweep's end (linear interpolation on a monotone cell) stands
        todo.append((float(g[inside]), float(g[outside]), side))
    if not todo and not moved:
        return old
    n_runs = int((counts > 0).sum())
    notes = [n for n in notes if n.code != "window_split"]
    notes[:0] = [_split_note(n_runs)] if n_runs > 1 else []
    q_in, q_out = _bisect_ends(well, fluid, todo, names, kw) if todo else ((), ())
    for (_, _, side), k_in, k_out in zip(todo, q_in, q_out, strict=True):
        mi = _sweep(well, fluid, np.array([k_in, k_out]), **kw).limits
        q_end, name = _end(
            np.array([k_in, k_out]), np.stack([mi[k] for k in names]), names, 0, 1, ""
        )
        q_old = q_lo if side == "low" else q_hi
        if abs(q_end - q_old) <= 1e-9 * q_old:
            continue  # the sweep's end was right after all (to the rounding of its search)
        notes.append(_non_monotone_note(side, name, q_end, q_old))
        moved = True
        if side == "low":
            q_lo, b_lo = q_end, name
        else:
            q_hi, b_hi = q_end, name
    return (q_lo, q_hi, b_lo, b_hi, feasible, notes) if moved else old


def _bisect_ends(well, fluid, todo, names, kw):
    """Narrow each (inside rate, outside rate) bracket onto the first rate failing a limit
    going outward (:func:`calc.numeric.first_change`, 15 rates per bracket and step, all ends
    in one sweep call per step; 10 steps: 16⁻¹⁰ ≈ 1e-12 of the scan cell)."""
    q_in = np.array([t[0] for t in todo])
    q_out = np.array([t[1] for t in todo])

    def fails(x):
        lim = _sweep(well, fluid, x.reshape(-1), **kw).limits
        bad = np.any(np.stack([lim[k] for k in names]) < 0, axis=0)
        return bad.reshape(x.shape)

    return first_change(fails, q_in, q_out, iterations=10, points=15)


def _split_note(count: int) -> Note:
    return Note(
        "warning",
        "window_split",
        "the rates meeting every limit form {count} separate ranges; the widest is reported.",
        "operating window",
        values=(Value("count", float(count)),),
    )


def _non_monotone_note(side: str, name: str, q_end: float, q_old: float) -> Note:
    return Note(
        "warning",
        "non_monotone_curve",
        f"a limit does not change steadily with the flow rate (it jumps where part of the "
        f"loop changes flow regime): the window's {side} end is the first rate at which a "
        f"limit fails going outward from inside the window, {{rate}} ({{limit}}), not "
        f"{{interpolated}} from the sweep rates alone.",
        "operating window",
        values=(
            Value("rate", float(q_end), "flow_rate"),
            Value("limit", name),
            Value("interpolated", float(q_old), "flow_rate"),
        ),
    )


def operating_window(
    well,
    fluid,
    q,
    *,
    window,
    weak_points=(),
    margins=None,
    surface_rating: float | None = None,
    method: str | None = None,
    rop: float = 0.0,
    cuttings: Cuttings | None = None,
    slip_method: str = "moore",
    criteria=None,
    require: str = "adequate",
    eccentricity: float = 0.0,
    hydrostatic: str = "exact",
    ecd_basis: str = "loaded",
    rpm: float | None = None,
    pumps=(),
) -> OperatingWindow:
    """Range of flow rates meeting the ECD, pressure-rating, cleaning and tool limits together.

    Parameters
    ----------
    well : calc.geometry.Well
    fluid : calc.circulation.HydraulicsFluid
        One density.
    q : array_like
        Sweep of flow rates [m³/s], > 0, increasing (e.g. 200 points); the window is resolved
        to the sweep spacing by linear interpolation.
    window : calc.circulation.PressureWindow
    weak_points : sequence of calc.circulation.WeakPoint
    margins : calc.circulation.Margins
        ECD margins to fracture and pore [kg/m³].
    surface_rating : float, optional
        Pump / surface-equipment rating [Pa]; None → no SPP limit.
    method : str, optional
        Hydraulics method (:func:`calc.hydraulics_method.resolve_method`; None: the default).
    rop : float
        Rate of penetration [m/s]; with ``cuttings`` it adds the cuttings load to the fracture
        check and the cleaning limit.
    cuttings : Cuttings, optional
        Without cuttings no cleaning limit is applied (a note says so).
    slip_method, criteria, require, rpm
        Passed to :func:`calc.cleaning.hole_cleaning` (``rpm``: the string rotary speed
        [rev/min] that Rubiandini's method uses; None: 0 rpm with a note, the most demanding).
    eccentricity, hydrostatic
        Passed to :func:`calc.circulation.circulate`.
    ecd_basis : {"loaded", "clean"}
        ECD the fracture limit holds at each rate: ``"loaded"`` adds the cuttings load at that
        rate (ΔECD of :func:`calc.cleaning.cuttings_ecd_increment` from the loaded density of
        :func:`calc.cleaning.hole_cleaning`, which falls as the transport ratio rises with the
        rate) when ``cuttings`` and ``rop`` > 0 are given; ``"clean"`` ignores it.  The pore
        limit always holds the clean ECD (the lower value).
    pumps : sequence of calc.pumps.Pump
        The running pumps: their lowest liner rating and their rated hydraulic powers become
        the limits ``"liner rating"`` and ``"rated hydraulic power"``
        (:func:`calc.pumps.pump_limits`); empty: no pump limits.

    Returns
    -------
    OperatingWindow

    Notes
    -----
    Steady circulation; the margins shrink as the required margins grow (the window can only
    get narrower).  Cuttings load raises ECD by ΔECD of :func:`calc.cleaning.cuttings_ecd_increment`
    (friction of the laden mud neglected).

    Examples
    --------
    A vertical 3,000 m well (9-5/8 in casing to 1,500 m, 8-1/2 in open hole, 150 m of
    6-1/2 in collars under 5 in drill pipe, bit with 3x12 3x11 nozzles), 11.0 ppg mud, pore
    9.0 → 10.5 ppg and fracture 14.0 → 12.0 ppg from surface to TD, a 3,000 psi surface
    rating, no cuttings (so no cleaning limit):

    >>> from calc.bit import Bit
    >>> from calc.circulation import PressureWindow, circulate, hydraulics_fluid_from_readings
    >>> from calc.geometry import DrillString, Hole, HoleSection, StringComponent, Survey, Well
    >>> from calc.rheology import ViscometerReadings
    >>> from calc.units import from_si, to_si
    >>> casing = HoleSection("9-5/8 in casing", 0.0, 1500.0, to_si(8.681, "in"))
    >>> pipe = [StringComponent("collars", to_si(6.5, "in"), to_si(2.8125, "in"), 150.0),
    ...         StringComponent("drill pipe", to_si(5.0, "in"), to_si(4.276, "in"), "fill")]
    >>> well = Well(Survey([0.0, 3000.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole.from_casing([casing], 3000.0, bit_size=to_si(8.5, "in")),
    ...             DrillString(pipe), Bit(to_si(8.5, "in"), "3x12 3x11"), bit_depth=3000.0)
    >>> mud = ViscometerReadings.from_mapping({600: 56, 300: 37, 200: 29, 100: 20, 6: 8, 3: 7})
    >>> fluid = hydraulics_fluid_from_readings(mud, density=to_si(11.0, "ppg"))
    >>> import numpy as np
    >>> w = PressureWindow([0.0, 3000.0], to_si([9.0, 10.5], "ppg"), to_si([14.0, 12.0], "ppg"))
    >>> win = operating_window(well, fluid, to_si(np.linspace(200, 900, 141), "gpm"), window=w,
    ...                        surface_rating=to_si(3000.0, "psi"))
    >>> round(from_si(win.q_low, "gpm")), round(from_si(win.q_high, "gpm")), win.binding_high
    (200, 656, 'surface rating')

    At the upper end the standpipe pressure is the rating:

    >>> round(from_si(circulate(well, fluid, win.q_high).standpipe_pressure, "psi"))
    3000

    Two triplex pumps with 2,800 psi liners bind first:

    >>> from calc.pumps import Pump
    >>> pump = Pump("p", to_si(6.0, "in"), to_si(12, "in"), 0.97, liner_rating=to_si(2800, "psi"))
    >>> win = operating_window(well, fluid, to_si(np.linspace(200, 900, 141), "gpm"), window=w,
    ...                        surface_rating=to_si(3000.0, "psi"), pumps=[pump, pump])
    >>> win.binding_high
    'liner rating'
    >>> round(from_si(circulate(well, fluid, win.q_high).standpipe_pressure, "psi"))
    2800
    """
    qv = np.atleast_1d(check_positive("flow rate", q, "m³/s")).astype(float)
    if qv.ndim != 1 or qv.size < 2 or np.any(np.diff(qv) <= 0):
        raise InputError("flow rate sweep", qv.tolist() if qv.size < 7 else qv, "increasing, ≥ 2")
    margins = Margins() if margins is None else margins
    ecd_basis = check_choice("ECD basis", ecd_basis, ECD_BASES)
    kw = dict(
        rop=rop, cuttings=cuttings, slip_method=slip_method, criteria=criteria, require=require,
        method=method, eccentricity=eccentricity, hydrostatic=hydrostatic, window=window,
        weak_points=tuple(weak_points), margins=margins, surface_rating=surface_rating,
        ecd_basis=ecd_basis, rpm=rpm, pumps=tuple(pumps),
    )  # fmt: skip
    sw = _sweep(well, fluid, qv, **kw)
    res, mt, limits, cl, loaded = sw.result, sw.result.margins, sw.limits, sw.cleaning, sw.loaded
    ecd = sw.ecd
    notes = []
    if cuttings is None:
        notes.append(
            Note("info", "no_cleaning_limit", "no cuttings given: cleaning not limited", "window")
        )
    frac_m, pore_m, spp = sw.fracture, sw.pore, sw.spp
    *old, run = _window_ends(qv, limits)
    q_lo, q_hi, b_lo, b_hi, feasible, end_notes = (
        old if run is None else _first_crossings(well, fluid, qv, limits, old, run, kw)
    )
    notes += end_notes
    fi = np.argmin(frac_m, axis=-1)
    pi = np.argmin(pore_m, axis=-1)
    rows = np.arange(qv.size)
    names = np.empty(len(mt.points), dtype=object)
    names[:] = list(mt.points)
    md, tvd = np.asarray(mt.md, dtype=float), np.asarray(mt.tvd, dtype=float)
    return OperatingWindow(
        q=qv,
        q_low=float(q_lo),
        q_high=float(q_hi),
        feasible=feasible,
        binding_low=b_lo,
        binding_high=b_hi,
        limits=limits,
        spp=spp,
        surface_rating=float("inf") if surface_rating is None else float(surface_rating),
        ecd_fracture_point=loaded[rows, fi],
        fracture_at_point=np.asarray(mt.fracture)[fi],
        fracture_point_name=names[fi],
        fracture_point_md=md[fi],
        fracture_point_tvd=tvd[fi],
        ecd_pore_point=ecd[rows, pi],
        pore_at_point=np.asarray(mt.pore)[pi],
        pore_point_name=names[pi],
        pore_point_md=md[pi],
        pore_point_tvd=tvd[pi],
        ecd_max_at_point=np.asarray(mt.fracture)[fi] - float(margins.fracture),
        ecd_min_at_point=np.asarray(mt.pore)[pi] + float(margins.pore),
        cleaning_indicator=cl.indicator,
        min_transport_ratio=cl.min_transport_ratio,
        max_concentration=cl.max_concentration,
        min_cleaning_rate=cl.rate,
        controlling_interval=cl.controlling,
        fracture_margin=float(margins.fracture),
        pore_margin=float(margins.pore),
        method=f"circulation {res.method}; cleaning {slip_method}" if cuttings else res.method,
        notes=tuple(dict.fromkeys(notes)),
        ecd_basis=ecd_basis,
        loaded=bool(ecd_basis == "loaded" and cuttings is not None and rop > 0),
        ecd_clean_fracture_point=ecd[rows, fi],
    )
