"""The safe operating window of flow RATES: every limit at once, with the curves to chart.

(Not the pore/fracture pressure window of :mod:`calc.circulation.pore_fracture`: that one is an
input here.)

A rate q is inside the window when, simultaneously,

* ECD(z) ≤ fracture(z) − margin at every check depth (cuttings-loaded ECD when ``rop`` > 0),
* ECD(z) ≥ pore(z) + margin at every check depth (clean ECD: the lower, conservative value),
* standpipe pressure ≤ the pump / surface rating,
* every annular interval is cleaned (verdict at least ``require``, :mod:`calc.cleaning`),
* q lies in the flow window of every downhole tool that states one.

Each limit is a margin curve over the sweep (≥ 0 where met): pore and cleaning usually rise with
q, fracture (loaded with cuttings at low rates) and SPP usually fall, but no monotony is assumed.
The window is the widest run of sweep rates meeting every limit; each end is refined by linear
interpolation of the limit that fails just outside it, and that limit is named as binding.
One vectorised :func:`calc.circulation.circulate` call over all rates gives ECD and SPP.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.circulation import Margins, circulate
from calc.cleaning import Cuttings, cuttings_ecd_increment, hole_cleaning
from calc.cleaning.indicators import cleaning_score
from calc.errors import InputError, check_positive
from calc.notes import Note
from calc.span import Span
from calc.values import Value

__all__ = ["OperatingWindow", "operating_window"]


@dataclass(frozen=True, eq=False)
class OperatingWindow:
    """Flow-rate window and the curves behind it (SI; per-rate arrays over the sweep ``q``).

    q                       sweep rates [m³/s]
    q_low, q_high           window ends [m³/s] (``feasible`` False → empty window)
    binding_low, binding_high   name of the limit that binds at each end (a key of ``limits``,
                            "lowest rate swept" / "highest rate swept", or the failing limits'
                            names joined by " and " when no rate is feasible)
    limits                  name → margin curve over q (≥ 0 inside; units per limit:
                            kg/m³ for ECD limits, Pa for SPP, m³/s for tool windows,
                            relative for cleaning)
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


def _cleaning_side(well, fluid, qv, *, rop, cuttings, slip_method, criteria, require):
    """Hole cleaning over the sweep: the worst interval's score per rate and the loads."""
    zero = np.zeros_like(qv)
    if cuttings is None:
        return _Cleaning(zero, zero, zero, 0.0, None, None)
    hc = hole_cleaning(
        well, fluid, qv, rop=rop, cuttings=cuttings, method=slip_method, criteria=criteria,
        require=require,
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
    """(q_low, q_high, binding_low, binding_high, feasible, notes) of the widest run of sweep
    rates meeting every limit; each end refined between sweep points (:func:`_end`)."""
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
        return float(qv[0]), float(qv[-1]), both, both, False, notes
    edges = np.diff(np.concatenate([[0], ok.astype(int), [0]]))
    starts, stops = np.flatnonzero(edges == 1), np.flatnonzero(edges == -1) - 1
    j = int(np.argmax(stops - starts))
    a, b = int(starts[j]), int(stops[j])
    if starts.size > 1:
        notes.append(
            Note(
                "warning",
                "window_split",
                "the rates meeting every limit form {count} separate ranges; the widest is "
                "reported.",
                "operating window",
                values=(Value("count", float(starts.size)),),
            )
        )
    q_lo, b_lo = _end(qv, m_all, names_all, a, a - 1, "lowest rate swept")
    q_hi, b_hi = _end(qv, m_all, names_all, b, b + 1, "highest rate swept")
    return q_lo, q_hi, b_lo, b_hi, True, notes


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
    slip_method, criteria, require
        Passed to :func:`calc.cleaning.hole_cleaning`.
    eccentricity, hydrostatic
        Passed to :func:`calc.circulation.circulate`.

    Returns
    -------
    OperatingWindow

    Notes
    -----
    Steady circulation; the margins shrink as the required margins grow (the window can only
    get narrower).  Cuttings load raises ECD by ΔECD of :func:`calc.cleaning.cuttings_ecd_increment`
    (friction of the laden mud neglected).
    """
    qv = np.atleast_1d(check_positive("flow rate", q, "m³/s")).astype(float)
    if qv.ndim != 1 or qv.size < 2 or np.any(np.diff(qv) <= 0):
        raise InputError("flow rate sweep", qv.tolist() if qv.size < 7 else qv, "increasing, ≥ 2")
    margins = Margins() if margins is None else margins
    res = circulate(
        well, fluid, qv, method=method, eccentricity=eccentricity, hydrostatic=hydrostatic,
        window=window, weak_points=tuple(weak_points), margins=margins,
        surface_rating=surface_rating,
    )  # fmt: skip
    mt = res.margins
    ecd = np.asarray(mt.ecd, dtype=float)  # (N, P)
    notes = []
    limits = {}
    cl = _cleaning_side(
        well, fluid, qv, rop=rop, cuttings=cuttings, slip_method=slip_method, criteria=criteria,
        require=require,
    )  # fmt: skip
    loaded = ecd
    if cuttings is not None:
        limits["hole cleaning"] = cl.indicator
        if rop > 0:
            loaded = ecd + np.asarray(
                cuttings_ecd_increment(well, cl.loaded_density, float(fluid.density), mt.md)
            )
    else:
        notes.append(
            Note("info", "no_cleaning_limit", "no cuttings given: cleaning not limited", "window")
        )
    frac_m = np.asarray(mt.fracture)[None, :] - loaded - margins.fracture
    pore_m = ecd - np.asarray(mt.pore)[None, :] - margins.pore
    limits["fracture"] = frac_m.min(axis=-1)
    limits["pore"] = pore_m.min(axis=-1)
    spp = np.asarray(res.standpipe_pressure, dtype=float)
    if surface_rating is not None:
        limits["surface rating"] = float(surface_rating) - spp
    limits.update(_tool_limits(well, qv))
    q_lo, q_hi, b_lo, b_hi, feasible, end_notes = _window_ends(qv, limits)
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
    )
