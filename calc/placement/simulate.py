"""The placement timeline of a cement job: positions, pressures, ECD, free fall (calc/METHODS.md
§24).

Model (a two-leg U-tube, quasi-steady):

* incompressible fluids moving as plugs (no mixing, :mod:`calc.placement.train`);
* friction of every fluid in every segment from the one friction law of :mod:`calc.flow`
  (:func:`~calc.flow.pipe_flow`, :func:`~calc.flow.annulus_flow`) at the *liquid* flow rate;
  steady-flow gradients at each step (no inertia, no gel break-over);
* returns open at surface (annulus outlet at atmospheric pressure, no choke);
* the string top is at atmospheric pressure whenever the string is not full (free fall), so
  the return rate q_out then solves the balance of the two legs

  .. math:: G(q) = p_{h,string} - p_{h,annulus} - \\Delta p_{f,string}(q) - \\Delta p_{f,ann}(q) = 0

  and the gap above the falling column grows by (q_out − q_pump)·dt.  With the string full,
  q_out = q_pump and the surface pressure is −G(q_pump) ≥ 0; when G(q_pump) > 0 the column
  runs away from the pumps (free fall, q_out > q_pump).  No reverse flow (q_out ≥ 0): a
  column held by the yield stress stays put.

The state (pumped P, returned R) is integrated in time with explicit steps (the pump schedule
gives dt = ΔP/q_pump; shut-downs are stepped in time); pressures and ECDs are then evaluated
for all steps at once (vectorised over steps × fluids × segments).

References
----------
Nelson, E. B. & Guillot, D. (eds.) (2006). *Well Cementing*, 2nd ed. Schlumberger, ch. 5 (mud
removal) and ch. 12 (cementing calculations: U-tubing, free fall).
API RP 13D, 6th ed. (2010) — the friction law of the mud side.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from calc.circulation.hydrostatics import gravity_for
from calc.circulation.pore_fracture import Margins, PressureWindow
from calc.errors import InputError
from calc.flow.core import DEFAULT_FRICTION_LAW, annulus_flow, pipe_flow
from calc.notes import Note
from calc.placement.train import FluidTrain, PlacementGeometry
from calc.values import Value

__all__ = [
    "PLACEMENT_POINT_ROLES",
    "PlacementPoint",
    "PlacementTimeline",
    "PumpStage",
    "Tightest",
    "simulate_placement",
]

#: Roles of the fixed check points of a placement; the moving top of cement is added as "toc".
PLACEMENT_POINT_ROLES = ("casing_shoe", "liner_top", "weak_point", "shoe", "td")


@dataclass(frozen=True)
class PumpStage:
    """One stage of the pump schedule.

    ``rate`` [m³/s] ≥ 0; ``volume`` [m³] pumped in the stage (None on the last stage: until the
    plug bumps); ``duration`` [s] for a shut-down (rate 0); ``label`` free text.

    Examples
    --------
    >>> PumpStage(0.02, 5.0).rate
    0.02
    """

    rate: float
    volume: float | None = None
    duration: float | None = None
    label: str = ""

    def __post_init__(self):
        r = float(self.rate)
        if not np.isfinite(r) or r < 0:
            raise InputError(f"pump rate{self._where}", r, "≥ 0", kind="flow_rate")
        if r == 0:
            d = self.duration
            if d is None or not np.isfinite(d) or d <= 0:
                raise InputError(f"shut-down duration{self._where}", d, "> 0 s", kind="time")
        elif self.volume is not None and not (np.isfinite(self.volume) and self.volume > 0):
            raise InputError(f"stage volume{self._where}", self.volume, "> 0", kind="volume")
        object.__setattr__(self, "rate", r)

    @property
    def _where(self) -> str:
        return f" ({self.label})" if self.label else ""


@dataclass(frozen=True)
class PlacementPoint:
    """A depth where the ECD is checked: ``role`` of :data:`PLACEMENT_POINT_ROLES`, ``name``,
    ``md`` [m]; ``fracture``/``pore`` EMW [kg/m³] where known (else from the window).

    Examples
    --------
    >>> PlacementPoint("shoe", "7 in liner shoe", 3600.0).role
    'shoe'
    """

    role: str
    name: str
    md: float
    fracture: float | None = None
    pore: float | None = None


@dataclass(frozen=True)
class Tightest:
    """The tightest moment: step ``index``, pumped volume [m³], time [s], the point's name and
    role, ``limit`` ("fracture", "pore" or "surface"), ``margin`` (limit distance: kg/m³, Pa
    for the surface), ``required`` margin, ``ecd`` [kg/m³] (surface: pressure [Pa])."""

    index: int
    pumped: float
    time: float
    point: str
    role: str
    limit: str
    margin: float
    required: float
    ecd: float


@dataclass(frozen=True, eq=False)
class PlacementTimeline:
    """The placement, step by step (arrays over steps ``N``; ``(N, K)`` over check points,
    ``(N, F)`` over fluids, ``(N, F-1)`` over interfaces).

    time [s], pumped, returned, gap (string not full of liquid) [m³], pump_rate, return_rate
    [m³/s], free_fall (bool); string_hydrostatic, annulus_hydrostatic (at the shoe),
    string_friction, annulus_friction, surface_pressure [Pa]; points (PlacementPoint, the last
    the moving top of cement "toc"), point_md, point_tvd (N, K) [m], ecd, fracture, pore,
    fracture_margin, pore_margin (N, K) [kg/m³]; fluid_top_md, fluid_bottom_md (N, F) [m] with
    fluid_leg_top/… (True in the annulus) and in_well (N, F); fluid_volume_in_well,
    fluid_returned (N, F) [m³]; interface_md (N, F-1), interface_in_annulus, interface_in_well;
    toc_md [m]; annulus_velocity (N, S_ann) [m/s], annulus_regime (N, F, S_ann) (0/1/2), bump
    index (the last step), bump_differential (static annulus − string at the shoe at bump [Pa]),
    final_circulating_pressure [Pa], static_ecd / static_margin (K,) after the pumps stop,
    tightest (:class:`Tightest`, ECD limits), surface_tightest, key moments
    (name → step index), notes.

    Examples
    --------
    5 m³ of cement behind water in a vertical 1,000 m well at 0.01 m³/s:

    >>> from calc.geometry import Survey
    >>> from calc.circulation import PressureWindow
    >>> from calc.placement import (FluidTrain, PlacementFluid, PlacementGeometry,
    ...                             PlacementPoint, PumpStage, simulate_placement)
    >>> w = (0.0, 0.3, 1.0)
    >>> g = PlacementGeometry(Survey([0.0, 1000.0], [0.0, 0.0], [0.0, 0.0]),
    ...     [("string", 0.0, 1000.0, 0.1, 0.0), ("annulus", 1000.0, 0.0, 0.2, 0.12)], 1000.0)
    >>> t = FluidTrain((PlacementFluid("water", "mud", 1000.0, w, w),
    ...                 PlacementFluid("spacer", "spacer", 1100.0, w, w),
    ...                 PlacementFluid("cement", "slurry", 1900.0, w, w),
    ...                 PlacementFluid("water", "displacement", 1000.0, w, w)), (2.0, 5.0))
    >>> win = PressureWindow([0.0, 1000.0], [900.0, 900.0], [2500.0, 2500.0])
    >>> tl = simulate_placement(g, t, [PumpStage(0.01)], [PlacementPoint("shoe", "shoe", 1000.0)],
    ...                         window=win, method="newtonian", steps=200)
    >>> tl.free_fall_periods, tl.key_moments["bump"]
    ([(52, 171)], 200)
    """

    train: FluidTrain
    geometry: PlacementGeometry
    time: np.ndarray
    pumped: np.ndarray
    returned: np.ndarray
    gap: np.ndarray
    pump_rate: np.ndarray
    return_rate: np.ndarray
    free_fall: np.ndarray
    string_hydrostatic: np.ndarray
    annulus_hydrostatic: np.ndarray
    string_friction: np.ndarray
    annulus_friction: np.ndarray
    surface_pressure: np.ndarray
    points: tuple[PlacementPoint, ...]
    point_tvd: np.ndarray
    point_md: np.ndarray
    ecd: np.ndarray
    fracture: np.ndarray
    pore: np.ndarray
    fracture_margin: np.ndarray
    pore_margin: np.ndarray
    fluid_top_s: np.ndarray
    fluid_bottom_s: np.ndarray
    fluid_volume_in_well: np.ndarray
    fluid_returned: np.ndarray
    interface_s: np.ndarray
    interface_in_well: np.ndarray
    toc_md: np.ndarray
    annulus_velocity: np.ndarray
    annulus_regime: np.ndarray
    annulus_gradient: np.ndarray
    bump_differential: float
    final_circulating_pressure: float
    static_ecd: np.ndarray
    static_fracture_margin: np.ndarray
    static_pore_margin: np.ndarray
    tightest: Tightest
    surface_tightest: Tightest | None
    key_moments: dict[str, int]
    margins: Margins
    surface_rating: float | None
    method: str
    notes: tuple[Note, ...] = field(default=())

    def position(self, s):
        """(leg, MD [m]) of path volume(s) ``s`` [m³]: leg "string" or "annulus"."""
        i, md = self.geometry.md_of(s)
        return np.asarray(self.geometry.leg)[i], md

    @property
    def free_fall_periods(self) -> list[tuple[int, int]]:
        """(first, last) step index of each run of free fall."""
        ff = np.asarray(self.free_fall, dtype=int)
        edges = np.flatnonzero(np.diff(np.concatenate([[0], ff, [0]])))
        return [(int(a), int(b) - 1) for a, b in zip(edges[::2], edges[1::2], strict=True)]


def _gradients(geom: PlacementGeometry, train: FluidTrain, q, method, eccentricity):
    """Friction gradient [Pa/m], velocity [m/s] and regime of every fluid in every segment at
    the liquid rates ``q`` (shape (N,)); → arrays (N, F, S) and (N, S)."""
    q = np.asarray(q, dtype=float)
    flowing = q > 0
    qs = np.where(flowing, q, 1e-6)[:, None, None]
    fl = train.fluids
    rho = np.array([f.density for f in fl])[None, :, None]
    out = np.zeros((q.size, len(fl), geom.leg.size))
    regime = np.zeros(out.shape, dtype=int)
    for leg in ("string", "annulus"):
        sel = geom.leg == leg
        par = np.array([getattr(f, "pipe" if leg == "string" else "annulus") for f in fl])
        ty, k, n = (par[:, i][None, :, None] for i in range(3))
        if leg == "string":
            r = pipe_flow(
                qs, geom.d_outer[sel][None, None, :], density=rho, tau_y=ty, k=k, n=n, method=method
            )
        else:
            r = annulus_flow(
                qs,
                geom.d_outer[sel][None, None, :],
                geom.d_inner[sel][None, None, :],
                density=rho,
                tau_y=ty,
                k=k,
                n=n,
                method=method,
                eccentricity=eccentricity,
            )
        out[:, :, sel] = np.broadcast_to(r.gradient, out[:, :, sel].shape)
        regime[:, :, sel] = np.broadcast_to(r.regime, regime[:, :, sel].shape)
    out *= flowing[:, None, None]
    vel = q[:, None] / geom.area[None, :]
    return out, vel, regime


def _steps(stages: Sequence[PumpStage], dv: float):
    """Expand the schedule: per planned step (rate, dv or None, dt or None, stage index)."""
    plan = []
    for i, st in enumerate(stages):
        if st.rate == 0:
            n = 30
            plan += [(0.0, None, st.duration / n, i)] * n
        elif st.volume is None:
            plan.append((st.rate, None, None, i))  # open-ended: until bump
        else:
            n = max(1, int(np.ceil(st.volume / dv - 1e-9)))
            plan += [(st.rate, st.volume / n, None, i)] * n
    return plan


def simulate_placement(
    geometry: PlacementGeometry,
    train: FluidTrain,
    stages: Sequence[PumpStage],
    points: Sequence[PlacementPoint],
    *,
    window: PressureWindow,
    margins: Margins | None = None,
    method: str = DEFAULT_FRICTION_LAW,
    steps: int = 2000,
    eccentricity: float = 0.0,
    surface_rating: float | None = None,
    hydrostatic: str = "exact",
    rate_grid: int = 160,
) -> PlacementTimeline:
    """Simulate the placement of a fluid train (module docstring for the model).

    Parameters
    ----------
    geometry : PlacementGeometry
        Its segment ends must include every check point's MD above the shoe.
    train : FluidTrain
    stages : sequence of PumpStage
        In order; the last has ``volume=None`` and a rate > 0 (pumped until the plug bumps).
    points : sequence of PlacementPoint
        Check points in the annulus (or below the shoe, in the rathole, for TD).
    window : PressureWindow
    margins : Margins
    method : str
        Friction law (:func:`calc.flow.list_friction_laws`).
    steps : int
        About this many volume steps over the nominal job volume (cement + displacement).
    eccentricity : float
        Pipe offset in the annulus [-] (the friction law's eccentricity factor).
    surface_rating : float, optional
        Equipment rating [Pa]: surface pressure margin.
    rate_grid : int
        Rates tabulated for the free-fall balance (log-spaced up to 4 × the highest pump rate).

    Returns
    -------
    PlacementTimeline

    Raises
    ------
    InputError
        cement volume larger than the well; a schedule whose last stage is not open-ended at a
        rate > 0; a check point off the path.

    References
    ----------
    Nelson & Guillot (2006), *Well Cementing*, 2nd ed., ch. 12 (U-tube/free fall).

    Examples
    --------
    A vertical 1,000 m well, 5 m³ of 1,900 kg/m³ cement behind water: the cement shows free fall
    while it goes down the string (module tests check the hand balance):

    >>> from calc.geometry import Survey
    >>> from calc.placement.train import PlacementFluid, PlacementGeometry, FluidTrain
    >>> w = (0.0, 0.001, 1.0)
    >>> g = PlacementGeometry(Survey([0.0, 1000.0], [0.0, 0.0], [0.0, 0.0]),
    ...     [("string", 0.0, 1000.0, 0.1, 0.0), ("annulus", 1000.0, 0.0, 0.2, 0.12)], 1000.0)
    >>> t = FluidTrain((PlacementFluid("water", "mud", 1000.0, w, w),
    ...                 PlacementFluid("cement", "slurry", 1900.0, w, w),
    ...                 PlacementFluid("water", "displacement", 1000.0, w, w)), (5.0,))
    >>> win = PressureWindow([0.0, 1000.0], [900.0, 900.0], [2500.0, 2500.0])
    >>> tl = simulate_placement(g, t, [PumpStage(0.01)], [PlacementPoint("shoe", "shoe", 1000.0)],
    ...                         window=win, steps=200)
    >>> bool(tl.free_fall.any()), round(float(tl.pumped[-1]), 2)
    (True, 12.85)
    """
    gv = gravity_for(hydrostatic)
    margins = Margins() if margins is None else margins
    vt = geometry.total_volume
    s_fc = geometry.float_collar_s
    cem = train.cement_end
    if cem > vt:
        raise InputError(
            "spacer and cement volume",
            cem,
            "≤ the well's volume {v} (string and annulus)",
            kind="volume",
            values=(Value("v", vt, "volume"),),
        )
    stages = tuple(stages)
    if not stages or stages[-1].volume is not None or stages[-1].rate <= 0:
        raise InputError(
            "pump schedule",
            len(stages),
            "a last stage at a rate > 0 pumped until the plug bumps (no volume)",
        )
    if any(s.volume is None and s.rate > 0 for s in stages[:-1]):
        raise InputError("pump schedule", len(stages), "a volume on every stage but the last")
    steps = int(steps)
    if steps < 10:
        raise InputError("steps", steps, "≥ 10")
    dv = (cem + s_fc) / steps
    rho = train.density
    # ---------------------------------------------------------------- friction table in q
    q_top = 4.0 * max(s.rate for s in stages)
    qgrid = q_top * np.geomspace(1e-4, 1.0, int(rate_grid))
    table, _, _ = _gradients(geometry, train, qgrid, method, eccentricity)  # (Q, F, S)
    is_str = geometry.leg == "string"

    def balance(p, r):
        lo, hi = train.intervals(p, r, vt)
        length, height = geometry.columns(lo, hi)  # (F, S)
        ph = gv * rho[:, None] * height
        g_hyd = ph[:, is_str].sum() - ph[:, ~is_str].sum()
        fr = np.einsum("fs,qfs->q", length, table)
        return g_hyd - fr

    def rate_out(p, r, qp):
        g = balance(p, r)
        full = r - p <= 1e-12 * vt
        if full and qp > 0 and np.interp(qp, qgrid, g) <= 0:
            return qp, False
        if g[0] <= 0:
            return 0.0, not full
        k = int(np.argmax(g <= 0))
        if g[k] > 0:
            clamped.append(p)
            return float(qgrid[-1]), True
        q = qgrid[k - 1] + (qgrid[k] - qgrid[k - 1]) * g[k - 1] / (g[k - 1] - g[k])
        return float(q), True

    clamped: list[float] = []
    t = p = r = 0.0
    rec = []
    plan = _steps(stages, dv)
    pi = 0
    limit = 20 * steps + len(plan)
    bumped = False
    while pi < len(plan) and len(rec) < limit:
        qp, dvp, dt, si = plan[pi]
        q_out, ff = rate_out(p, r, qp)
        rec.append((t, p, r, qp, q_out, ff, si))
        if dvp is None and dt is None:  # open-ended last stage
            dt = dv / qp
        elif dt is None:
            dt = dvp / qp
            pi += 1
        else:
            pi += 1
        p_new, r_new = p + qp * dt, r + q_out * dt
        # the gap closes within the step: from then on the string is full and the returns
        # equal the pump rate, which brings R exactly to P at the end of the step
        r_new = max(r_new, p_new)
        s_plug_new = r_new - cem
        if p_new > cem and s_plug_new >= s_fc:  # the plug lands within this step
            s_plug = r - cem
            frac = (s_fc - s_plug) / max(s_plug_new - s_plug, 1e-30)
            frac = float(np.clip(frac, 0.0, 1.0))
            t, p, r = t + frac * dt, p + frac * qp * dt, r + frac * (r_new - r)
            bumped = True
            break
        t, p, r = t + dt, p_new, r_new
    if not bumped:
        raise InputError(
            "pump schedule",
            len(rec),
            "a schedule that brings the plug to the float collar (check the volumes and the rates)",
        )
    q_last = stages[-1].rate
    rec.append((t, p, r, q_last, q_last, False, len(stages) - 1))
    a = np.array([x[:5] for x in rec], dtype=float)
    time, pumped, returned, qpump, qout = a.T
    free_fall = np.array([x[5] for x in rec], dtype=bool)
    tl = evaluate_states(
        geometry,
        train,
        points,
        window,
        margins,
        method,
        eccentricity,
        surface_rating,
        gv,
        time,
        pumped,
        returned,
        qpump,
        qout,
        free_fall,
    )
    if clamped:
        note = Note(
            "caution",
            "placement.free_fall_beyond_grid",
            "the free-fall rate exceeds {q} (4 × the highest pump rate) from {volume} "
            "pumped: friction does not hold the column, inertia (not modelled) would; "
            "treat the free-fall rates as an upper bound",
            values=(
                Value("q", float(qgrid[-1]), "flow_rate"),
                Value("volume", clamped[0], "volume"),
            ),
        )
        object.__setattr__(tl, "notes", (*tl.notes, note))
    return tl


def evaluate_states(
    geometry,
    train,
    points,
    window,
    margins,
    method,
    eccentricity,
    surface_rating,
    gv,
    time,
    pumped,
    returned,
    qpump,
    qout,
    free_fall,
):
    """Pressures, ECDs and positions of the states (pumped, returned, rates) of a placement, all
    steps at once (used by :func:`simulate_placement`; the benchmark calls it per step too)."""
    vs, vt = geometry.string_volume, geometry.total_volume
    rho = train.density
    lo, hi = train.intervals(pumped, returned, vt)  # (N, F)
    length, height = geometry.columns(lo, hi)  # (N, F, S)
    grad, vel, regime = _gradients(geometry, train, qout, method, eccentricity)
    is_str = geometry.leg == "string"
    hyd = gv * rho[None, :, None] * height
    fr = grad * length
    p_hs = hyd[:, :, is_str].sum(axis=(1, 2))
    p_ha = hyd[:, :, ~is_str].sum(axis=(1, 2))
    f_s = fr[:, :, is_str].sum(axis=(1, 2))
    f_a = fr[:, :, ~is_str].sum(axis=(1, 2))
    surface = np.where(free_fall, 0.0, np.maximum(p_ha + f_a + f_s - p_hs, 0.0))
    per_seg = (hyd + fr).sum(axis=1)  # (N, S)
    per_seg_static = hyd[-1].sum(axis=0)  # (S,)
    # ---------------------------------------------------------------- check points
    shoe_s = vs
    pts = list(points)
    n = pumped.size
    p_pt, p_static, md_pt, tvd_pt = [], [], [], []
    for pt in pts:
        md = float(pt.md)
        if md > geometry.shoe_md + 1e-9:  # rathole below the shoe: mud, static
            s_x = shoe_s
            below = (
                gv
                * rho[0]
                * (
                    float(geometry.survey.tvd_at(md))
                    - float(geometry.survey.tvd_at(geometry.shoe_md))
                )
            )
        else:
            s_x = float(geometry.s_at("annulus", md))
            below = 0.0
        sel = (~is_str) & (geometry.s_start >= s_x - 1e-9 * vt)
        if abs(geometry.s_start[sel].min(initial=vt) - s_x) > 1e-6 * vt and s_x < vt - 1e-9:
            raise InputError(
                f"check point {pt.name} MD",
                md,
                "a segment end of the placement "
                "geometry (build it with split_md including the point)",
                kind="depth",
            )
        p_pt.append(per_seg[:, sel].sum(axis=1) + below)
        p_static.append(per_seg_static[sel].sum() + below)
        md_pt.append(np.full(n, md))
        tvd_pt.append(np.full(n, float(geometry.survey.tvd_at(md))))
    # the moving top of cement (first slurry's top in the annulus; the shoe before)
    i_lead = next(i for i, f in enumerate(train.fluids) if f.role == "slurry")
    toc_s = np.clip(hi[:, i_lead], shoe_s, vt)
    toc_s = np.where(hi[:, i_lead] > shoe_s, toc_s, shoe_s)
    _, toc_md = geometry.md_of(toc_s)
    lo2, hi2 = np.maximum(lo, toc_s[:, None]), np.maximum(hi, toc_s[:, None])
    l2, h2 = geometry.columns(lo2, hi2)
    sel_a = ~is_str
    p_toc = (gv * rho[None, :, None] * h2 + grad * l2)[:, :, sel_a].sum(axis=(1, 2))
    p_pt.append(p_toc)
    p_static.append(float((gv * rho[:, None] * h2[-1])[:, sel_a].sum()))
    md_pt.append(toc_md)
    tvd_pt.append(np.asarray(geometry.survey.tvd_at(toc_md), dtype=float))
    pts.append(PlacementPoint("toc", "top of cement", float(toc_md[-1])))
    P = np.stack(p_pt, axis=1)
    md_pt, tvd_pt = np.stack(md_pt, axis=1), np.stack(tvd_pt, axis=1)
    ecd = P / (gv * tvd_pt)
    frac = np.empty_like(ecd)
    pore = np.empty_like(ecd)
    for k, pt in enumerate(pts):
        frac[:, k] = pt.fracture if pt.fracture is not None else window.fracture_at(tvd_pt[:, k])
        pore[:, k] = pt.pore if pt.pore is not None else window.pore_at(tvd_pt[:, k])
    fm = frac - ecd
    pm = ecd - pore
    static_ecd = np.array(p_static) / (gv * tvd_pt[-1])
    # ---------------------------------------------------------------- tightest moments
    slack_f = fm - margins.fracture
    slack_p = pm - margins.pore
    kf = np.unravel_index(np.argmin(slack_f), slack_f.shape)
    kp = np.unravel_index(np.argmin(slack_p), slack_p.shape)
    if slack_f[kf] <= slack_p[kp]:
        (i, k), lim, mar, req = kf, "fracture", fm[kf], margins.fracture
    else:
        (i, k), lim, mar, req = kp, "pore", pm[kp], margins.pore
    tight = Tightest(
        int(i),
        float(pumped[i]),
        float(time[i]),
        pts[k].name,
        pts[k].role,
        lim,
        float(mar),
        float(req),
        float(ecd[i, k]),
    )
    s_tight = None
    if surface_rating is not None:
        j = int(np.argmax(surface))
        s_tight = Tightest(
            j,
            float(pumped[j]),
            float(time[j]),
            "surface",
            "surface",
            "surface",
            float(surface_rating - surface[j]),
            0.0,
            float(surface[j]),
        )
    # ---------------------------------------------------------------- fluids, interfaces
    seg_area = geometry.area
    vol_in = np.einsum("nfs,s->nf", length, seg_area)
    ret = train.returned(pumped, returned, vt)
    iface = returned[:, None] - train.end[None, :-1]
    iface_in = (pumped[:, None] >= train.end[None, :-1]) & (iface <= vt) & (iface >= 0)
    # key moments: lead slurry at the shoe, top of cement at the liner top, bump
    key: dict[str, int] = {}
    front = returned - train.start[i_lead]
    if np.any(front >= shoe_s):
        key["cement_at_shoe"] = int(np.argmax(front >= shoe_s))
    lt = next((p for p in points if p.role == "liner_top"), None)
    if lt is not None:
        s_lt = float(geometry.s_at("annulus", lt.md))
        lead = next(i for i, f in enumerate(train.fluids) if f.role in ("spacer", "slurry"))
        for name, top in (("spacer_at_liner_top", hi[:, lead]), ("cement_at_liner_top", toc_s)):
            if lead == i_lead and name.startswith("spacer"):
                continue
            if np.any(top >= s_lt - 1e-9 * vt):
                key[name] = int(np.argmax(top >= s_lt - 1e-9 * vt))
    key["tightest"] = tight.index
    key["bump"] = n - 1
    notes: list[Note] = []
    if free_fall.any():
        notes.append(
            Note(
                "info",
                "placement.free_fall",
                "the column free-falls (returns above the pump rate) over {volume} of pumping",
                values=(Value("volume", float(np.sum(np.diff(pumped)[free_fall[:-1]])), "volume"),),
            )
        )
    sa = ~is_str
    return PlacementTimeline(
        train=train,
        geometry=geometry,
        time=time,
        pumped=pumped,
        returned=returned,
        gap=np.maximum(returned - pumped, 0.0),
        pump_rate=qpump,
        return_rate=qout,
        free_fall=free_fall,
        string_hydrostatic=p_hs,
        annulus_hydrostatic=p_ha,
        string_friction=f_s,
        annulus_friction=f_a,
        surface_pressure=surface,
        points=tuple(pts),
        point_tvd=tvd_pt,
        point_md=md_pt,
        ecd=ecd,
        fracture=frac,
        pore=pore,
        fracture_margin=fm,
        pore_margin=pm,
        fluid_top_s=lo,
        fluid_bottom_s=hi,
        fluid_volume_in_well=vol_in,
        fluid_returned=ret,
        interface_s=np.clip(iface, 0.0, vt),
        interface_in_well=iface_in,
        toc_md=toc_md,
        annulus_velocity=vel[:, sa],
        annulus_regime=regime[:, :, sa],
        annulus_gradient=grad[:, :, sa],
        bump_differential=float(p_ha[-1] - p_hs[-1]),
        final_circulating_pressure=float(max(p_ha[-1] + f_a[-1] + f_s[-1] - p_hs[-1], 0.0)),
        static_ecd=static_ecd,
        static_fracture_margin=frac[-1] - static_ecd,
        static_pore_margin=static_ecd - pore[-1],
        tightest=tight,
        surface_tightest=s_tight,
        key_moments=key,
        margins=margins,
        surface_rating=surface_rating,
        method=method,
        notes=tuple(notes),
    )
