"""Surge and swab pressure from pipe movement: whole well and flat per-interval forms.

:func:`surge_pressure` takes a :class:`calc.geometry.Well` and a
:class:`calc.circulation.HydraulicsFluid`; :func:`interval_surge` takes the annular intervals'
sizes.  Both call the same solver (:mod:`calc.surge.solver`): running in raises the pressure
(surge), pulling out lowers it by the same amount (swab) in this steady model.

References
----------
Burkhardt, J.A. (1961) Wellbore pressure surges produced by pipe movement. JPT 13(6), 595-605,
SPE-1546-G.  Guo, B. & Liu, G. (2011) Applied Drilling Circulation Systems, eqs. 2.80-2.83.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.bit import DEFAULT_DISCHARGE_COEFFICIENT
from calc.errors import check_nonnegative, check_positive
from calc.flow import mean_velocity
from calc.geometry import Survey
from calc.notes import Note
from calc.numeric import depth_weights, scalar_or_array
from calc.span import Span
from calc.surge.emw import trip_emw
from calc.surge.solver import (
    DIRECTION_SIGN,
    PEAK_FACTOR,
    check_trip,
    method_text,
    paths_flat,
    paths_from_well,
    solve,
    string_end_for,
)

__all__ = ["IntervalSurge", "SurgeResult", "interval_surge", "surge_pressure"]


@dataclass(frozen=True, eq=False)
class SurgeResult:
    """Pressure change from pipe movement (SI; arrays: speed axes + interval axis).

    speed              pipe speed given [m/s] (average stand speed)
    peak_speed         speed used, speed × peak_factor [m/s]
    direction          "running" (surge, +) or "pulling" (swab, −)
    string_end         "closed" or "open"
    spans              where each annular interval lies, bit upwards (:class:`~calc.span.Span`)
    top_md, bottom_md  MD span of each annular interval [m]
    clinging           K_c per interval [-]
    relative_inflow    q_rel, flow entering the open pipe relative to it [m³/s] (0 closed)
    effective_rate     V_e·A_a per interval [m³/s]; ``effective_velocity`` V_e [m/s]
    gradient           friction gradient per interval [Pa/m]
    interval_pressure  gradient × length [Pa]
    pressure_bit       signed pressure change at the bit [Pa] (+ surge, − swab)
    regime             flow regime per interval (0 laminar, 1 transitional, 2 turbulent)
    method             Burkhardt model, clinging constants and friction method
    density            mud density [kg/m³]
    survey             the well's survey (TVD at any MD, for :meth:`emw_at`)
    """

    speed: float | np.ndarray
    peak_speed: float | np.ndarray
    direction: str
    string_end: str
    spans: tuple[Span, ...]
    top_md: np.ndarray
    bottom_md: np.ndarray
    clinging: np.ndarray
    relative_inflow: float | np.ndarray
    effective_rate: np.ndarray
    effective_velocity: np.ndarray
    gradient: np.ndarray
    interval_pressure: np.ndarray
    pressure_bit: float | np.ndarray
    regime: np.ndarray
    method: str
    density: float
    survey: Survey = field(repr=False)
    notes: tuple[Note, ...] = field(default=())

    @property
    def sign(self) -> float:
        return 1.0 if self.direction == "running" else -1.0

    def pressure_at(self, md):
        """Signed pressure change at measured depth(s) ``md`` [Pa] (friction from md to surface;
        below the bit the bit value).  Shape: speed axes + md axes."""
        mdv = check_nonnegative("MD", md, "m")
        w = depth_weights(mdv.ravel(), self.top_md, self.bottom_md)
        p = np.asarray(self.interval_pressure) @ w.T
        return scalar_or_array(self.sign * p.reshape(p.shape[:-1] + mdv.shape))

    def emw_at(self, md, *, hydrostatic: str = "exact"):
        """Equivalent mud weight while tripping, ρ ± Δp/(g·TVD) [kg/m³], at ``md`` [m] (> 0)."""
        mdv = check_positive("MD", md, "m")
        tvd = np.asarray(self.survey.tvd_at(mdv), dtype=float)
        return trip_emw(self.density, self.pressure_at(mdv), tvd, hydrostatic=hydrostatic)


def surge_pressure(
    well,
    fluid,
    speed,
    *,
    direction: str = "running",
    string_end: str = "auto",
    method: str | None = None,
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
    method : str, optional
        Hydraulics method (:func:`calc.hydraulics_method.resolve_method`; None: the default);
        its friction law computes the gradients.
    clinging : "burkhardt" or float or array
        Burkhardt fits (laminar/turbulent by the interval's regime) or given K_c per interval.
    peak_factor : float
        Peak/average speed ratio, default 1.5 (from memory; calc/METHODS.md §11.5).
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
    direction, v, pf, clinging = check_trip(direction, speed, peak_factor, clinging)
    end, notes = string_end_for(well, string_end)
    p = paths_from_well(well, fluid, method, eccentricity)
    a = well.flow_intervals().annulus
    vp = np.asarray(v * pf, dtype=float)
    st = solve(p, vp, end, clinging)
    ip = st.gradient * p.length
    notes = list(notes) + list(getattr(st.flow, "notes", ()))
    return SurgeResult(
        speed=scalar_or_array(v),
        peak_speed=scalar_or_array(vp),
        direction=direction,
        string_end=end,
        spans=a.spans(),
        top_md=np.asarray(a.top_md),
        bottom_md=np.asarray(a.bottom_md),
        clinging=np.asarray(st.clinging),
        relative_inflow=scalar_or_array(st.relative_inflow),
        effective_rate=st.effective_rate,
        effective_velocity=mean_velocity(st.effective_rate, p.d2, p.d1),
        gradient=st.gradient,
        interval_pressure=ip,
        pressure_bit=scalar_or_array(DIRECTION_SIGN[direction] * ip.sum(-1)),
        regime=st.regime,
        method=method_text(clinging, p.method),
        density=p.rho,
        survey=well.survey,
        notes=tuple(dict.fromkeys(notes)),
    )


@dataclass(frozen=True, eq=False)
class IntervalSurge:
    """Surge or swab in annular intervals given by their dimensions (SI).

    Per-interval arrays have the speed's shape plus the interval axis (dropped when the
    geometry was one interval given as scalars: then a float, or an int for ``regime``, for one
    speed).

    speed, peak_speed     average speed given and speed × peak_factor used [m/s]
    direction             "running" (surge, +) or "pulling" (swab, −)
    string_end            "closed" or "open"
    clinging              K_c per interval [-]
    relative_inflow       q_rel entering an open pipe relative to it [m³/s] (0 closed)
    effective_rate        V_e·A_a [m³/s]; ``effective_velocity`` V_e [m/s]
    regime                0 laminar, 1 transitional, 2 turbulent (at V_e)
    gradient              friction gradient [Pa/m] (magnitude)
    pressure_change       signed gradient × length per interval [Pa] (+ surge, − swab)
    total_pressure_change signed sum over the intervals [Pa] (speed's shape)
    method                Burkhardt model, clinging constants and friction method
    """

    speed: float | np.ndarray
    peak_speed: float | np.ndarray
    direction: str
    string_end: str
    clinging: float | np.ndarray
    relative_inflow: float | np.ndarray
    effective_rate: float | np.ndarray
    effective_velocity: float | np.ndarray
    regime: int | np.ndarray
    gradient: float | np.ndarray
    pressure_change: float | np.ndarray
    total_pressure_change: float | np.ndarray
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
    method: str | None = None,
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
    method : str, optional
        Hydraulics method (:func:`calc.hydraulics_method.resolve_method`; None: the default);
        its friction law computes the gradients.
    clinging : "burkhardt" or float or array
        Burkhardt fits (laminar/turbulent by the interval's regime) or given K_c.
    peak_factor : float
        Peak/average speed ratio ≥ 1 (default 1.5, from memory; calc/METHODS.md §11.5).
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
    direction, v, pf, clinging = check_trip(direction, speed, peak_factor, clinging)
    p, end, scalar = paths_flat(
        d_hole, d_pipe, length, density=density, tau_y=tau_y, k=k, n=n, d_bore=d_bore,
        tfa=tfa, cd=discharge_coefficient, bore_parameters=bore_parameters,
        string_end=string_end, method=method, eccentricity=eccentricity,
    )  # fmt: skip
    vp = np.asarray(v * pf, dtype=float)
    st = solve(p, vp, end, clinging)
    dp = DIRECTION_SIGN[direction] * st.gradient * p.length

    def per(x, as_int=False):
        arr = np.asarray(x)[..., 0] if scalar else np.asarray(x)
        arr = arr.astype(int) if as_int else arr.astype(float)
        return (int(arr) if as_int else float(arr)) if arr.ndim == 0 else arr

    return IntervalSurge(
        speed=scalar_or_array(v),
        peak_speed=scalar_or_array(vp),
        direction=direction,
        string_end=end,
        clinging=per(np.broadcast_to(st.clinging, st.effective_rate.shape)),
        relative_inflow=scalar_or_array(st.relative_inflow),
        effective_rate=per(st.effective_rate),
        effective_velocity=per(mean_velocity(st.effective_rate, p.d2, p.d1)),
        regime=per(st.regime, as_int=True),
        gradient=per(st.gradient),
        pressure_change=per(dp),
        total_pressure_change=scalar_or_array(dp.sum(-1)),
        method=method_text(clinging, p.method),
        notes=tuple(dict.fromkeys(getattr(st.flow, "notes", ()))),
    )
