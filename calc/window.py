"""The safe operating window of flow rates: every limit at once, with the curves to chart.

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

from calc.cleaning import Cuttings, cuttings_ecd_increment, hole_cleaning
from calc.cleaning.indicators import cleaning_score
from calc.errors import InputError, check_positive
from calc.notes import Note

__all__ = ["OperatingWindow", "operating_window"]


@dataclass(frozen=True, eq=False)
class OperatingWindow:
    """Flow-rate window and the curves behind it (SI).

    q                       sweep rates [m³/s]
    q_low, q_high           window ends [m³/s] (``feasible`` False → empty window)
    binding_low, binding_high   name of the limit that binds at each end
    limits                  dict name → margin curve over q (≥ 0 inside; units per limit:
                            kg/m³ for ECD limits, Pa for SPP, m³/s for tool windows,
                            relative for cleaning)
    spp                     standpipe pressure [Pa]; ``surface_rating`` [Pa]
    ecd_fracture_point, fracture_at_point, fracture_point_name   ECD at the depth tightest
                            against fracture (per rate) and that depth's fracture EMW and name
    ecd_pore_point, pore_at_point, pore_point_name               likewise against pore
    ecd_max_at_point, ecd_min_at_point   the ECD limits there: fracture − margin and pore +
                            margin [kg/m³] (the lines the window's ECD must stay between)
    cleaning_indicator      the cleaning score of the worst interval (≥ 0: cleaned)
    min_transport_ratio, max_concentration   per rate, over the intervals
    min_cleaning_rate, controlling_interval  rate needed to clean every interval and where
    """

    q: np.ndarray
    q_low: float
    q_high: float
    feasible: bool
    binding_low: str
    binding_high: str
    limits: dict
    spp: np.ndarray
    surface_rating: float
    ecd_fracture_point: np.ndarray
    fracture_at_point: np.ndarray
    fracture_point_name: np.ndarray
    ecd_pore_point: np.ndarray
    pore_at_point: np.ndarray
    pore_point_name: np.ndarray
    ecd_max_at_point: np.ndarray
    ecd_min_at_point: np.ndarray
    cleaning_indicator: np.ndarray
    min_transport_ratio: np.ndarray
    max_concentration: np.ndarray
    min_cleaning_rate: float
    controlling_interval: str
    fracture_margin: float
    pore_margin: float
    method: str
    notes: tuple[Note, ...] = field(default=())


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


def operating_window(
    well,
    fluid,
    q,
    *,
    window,
    weak_points=(),
    margins=None,
    surface_rating: float | None = None,
    method: str = "api13d_2010_hb",
    rop: float = 0.0,
    cuttings: Cuttings | None = None,
    slip_method: str = "moore",
    criteria=None,
    require: str = "adequate",
    eccentricity: float = 0.0,
    hydrostatic: str = "exact",
    message_units: str = "oilfield",
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
    method : str
        Friction method (:mod:`calc.flow`).
    rop : float
        Rate of penetration [m/s]; with ``cuttings`` it adds the cuttings load to the fracture
        check and the cleaning limit.
    cuttings : Cuttings, optional
        Without cuttings no cleaning limit is applied (a note says so).
    slip_method, criteria, require
        Passed to :func:`calc.cleaning.hole_cleaning`.
    eccentricity, hydrostatic
        Passed to :func:`calc.circulation.circulate`.
    message_units : str
        Unit system of the depth names of the check points ("oilfield", "metric", "si").

    Returns
    -------
    OperatingWindow

    Notes
    -----
    Steady circulation; the margins shrink as the required margins grow (the window can only
    get narrower).  Cuttings load raises ECD by ΔECD of :func:`calc.cleaning.cuttings_ecd_increment`
    (friction of the laden mud neglected).
    """
    from calc.circulation import Margins, circulate

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
    cleaning_ind = np.zeros_like(qv)
    min_ft = np.zeros_like(qv)
    max_c = np.zeros_like(qv)
    q_clean, ctrl = 0.0, ""
    loaded = ecd
    if cuttings is not None:
        hc = hole_cleaning(
            well, fluid, qv, rop=rop, cuttings=cuttings, method=slip_method, criteria=criteria,
            require=require,
        )  # fmt: skip
        tr = hc.transport
        score = cleaning_score(
            hc.criteria, require, hc.vertical, np.asarray(tr.transport_ratio),
            np.asarray(tr.concentration), np.asarray(hc.cci.cci), np.asarray(hc.critical_ratio),
        )  # fmt: skip
        cleaning_ind = score.min(axis=-1)
        min_ft = np.asarray(tr.transport_ratio).min(axis=-1)
        max_c = np.asarray(tr.concentration).max(axis=-1)
        q_clean, ctrl = hc.controlling_rate, hc.controlling_interval
        limits["hole cleaning"] = cleaning_ind
        if rop > 0:
            loaded = ecd + np.asarray(
                cuttings_ecd_increment(well, tr.loaded_density, float(fluid.density), mt.md)
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
    for t in well.tool_drops:
        fw = getattr(t, "flow_window", None)
        if fw is not None:
            limits[f"{t.name} flow window (min)"] = qv - fw[0]
            limits[f"{t.name} flow window (max)"] = fw[1] - qv
    names_all = list(limits)
    m_all = np.stack([limits[k] for k in names_all])  # (L, N)
    ok = np.all(m_all >= 0, axis=0)
    q_lo, q_hi, b_lo, b_hi = float(qv[0]), float(qv[-1]), "", ""
    feasible = bool(ok.any())
    if feasible:
        # the longest run of rates meeting every limit; ends refined between sweep points
        edges = np.diff(np.concatenate([[0], ok.astype(int), [0]]))
        starts, stops = np.flatnonzero(edges == 1), np.flatnonzero(edges == -1) - 1
        j = int(np.argmax(stops - starts))
        a, b = int(starts[j]), int(stops[j])
        if starts.size > 1:
            notes.append(
                Note(
                    "warning",
                    "window_split",
                    f"the rates meeting every limit form {starts.size} separate ranges; the "
                    "widest is reported.",
                    "operating window",
                )
            )
        q_lo, b_lo = _end(qv, m_all, names_all, a, a - 1, "lowest rate swept")
        q_hi, b_hi = _end(qv, m_all, names_all, b, b + 1, "highest rate swept")
    else:
        worst = np.argmin(m_all / np.maximum(np.abs(m_all).max(axis=1, keepdims=True), 1e-300),
                          axis=0)  # fmt: skip
        failing = sorted({names_all[i] for i in worst})
        b_lo = b_hi = " and ".join(failing)
        notes.append(
            Note(
                "caution",
                "no_operating_window",
                "no flow rate in the sweep meets every limit at once (failing: "
                + ", ".join(failing)
                + ").",
                "operating window",
            )
        )
    fi = np.argmin(frac_m, axis=-1)
    pi = np.argmin(pore_m, axis=-1)
    rows = np.arange(qv.size)
    names = np.empty(len(mt.points), dtype=object)
    names[:] = list(mt.points)
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
        ecd_pore_point=ecd[rows, pi],
        pore_at_point=np.asarray(mt.pore)[pi],
        pore_point_name=names[pi],
        ecd_max_at_point=np.asarray(mt.fracture)[fi] - float(margins.fracture),
        ecd_min_at_point=np.asarray(mt.pore)[pi] + float(margins.pore),
        cleaning_indicator=cleaning_ind,
        min_transport_ratio=min_ft,
        max_concentration=max_c,
        min_cleaning_rate=float(q_clean),
        controlling_interval=ctrl,
        fracture_margin=float(margins.fracture),
        pore_margin=float(margins.pore),
        method=f"circulation {res.method}; cleaning {slip_method}" if cuttings else res.method,
        notes=tuple(dict.fromkeys(notes)),
    )
