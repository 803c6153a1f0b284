"""The circulating system end to end: surface lines → string → tools → bit → annulus.

One call evaluates every flow interval at every flow rate (and density) of a sweep in one numpy
pass: rates run along the leading axes, intervals along the last axis.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field

import numpy as np

from calc.circulation import _well_link as wl
from calc.circulation.fluid import HydraulicsFluid
from calc.circulation.hydrostatics import equivalent_circulating_density, gravity_for
from calc.circulation.window import (
    Margins,
    MarginTable,
    PressureWindow,
    WeakPoint,
    limits_at,
    tabulate_margins,
)
from calc.errors import InputError, Note, check_choice, check_positive, check_range
from calc.units import from_si

__all__ = ["CirculationResult", "Profile", "circulate"]

#: Default spacing of the margin check points between the last shoe and the bit [m] (≈ 33 ft).
MARGIN_STEP = 10.0


def _scalar(x):
    x = np.asarray(x)
    return x.item() if x.ndim == 0 else x


@dataclass(frozen=True, eq=False)
class Profile:
    """ESD/ECD along the annulus on an MD grid.

    ``md``, ``tvd`` [m] (grid); ``pressure`` circulating annulus pressure [Pa]; ``esd``, ``ecd``
    [kg/m³]; ``pore``, ``fracture`` [kg/m³] from the window (NaN-free: ``0``/``inf`` where no
    window was given).  ``pressure``, ``esd``, ``ecd`` carry the sweep's leading axes.
    """

    md: np.ndarray
    tvd: np.ndarray
    pressure: np.ndarray
    esd: np.ndarray
    ecd: np.ndarray
    pore: np.ndarray
    fracture: np.ndarray


@dataclass(frozen=True, eq=False)
class CirculationResult:
    """Standpipe-pressure breakdown, bottom-hole pressures, ECD and margins.

    Pressures [Pa], densities [kg/m³], depths [m], power [W], rates [m³/s].  For a sweep every
    per-rate quantity has the sweep's leading axes (shape of ``q`` broadcast with the density);
    per-interval quantities add a last axis over the intervals.

    Attributes
    ----------
    method : str
        Friction method (``calc.flow`` name) and the fluid's fits.
    q, density : float or ndarray
        Flow rate and density of each sweep point.
    standpipe_pressure : float or ndarray
        back_pressure + surface_loss + string_loss + tool_loss + bit_loss + annulus_loss.
    surface_names, surface_losses, surface_loss
        Each surface line and their sum.
    string_names, string_losses, string_loss, string_flow
        Each string interval (bit up), the sum and the per-interval ``FlowResult``.
    tool_names, tool_losses, tool_loss
        Fixed tool drops ∝ ρQ² and their sum.
    bit : BitHydraulics
        Bit result of :mod:`calc.bit`; ``bit_loss`` its pressure drop.
    annulus_names, annulus_losses, annulus_loss, annulus_flow
        Each annular interval (bit up), the sum and the per-interval ``FlowResult``.
    static_bhp, circulating_bhp : float or ndarray
        ρ·g·TVD_bit and static_bhp + annulus_loss + back_pressure at the bit.
    esd_bit, ecd_bit : float or ndarray
        Equivalent densities at the bit.
    pump_power : float or ndarray
        Hydraulic power at the standpipe, SPP·Q [W].
    margins : MarginTable or None
        Margins at the check points (last shoe to bit and weak points) and the tightest point.
    notes : tuple of Note
    """

    method: str
    fluid_label: str
    hydrostatic: str
    friction_multiplier: object
    eccentricity: float
    back_pressure: float
    q: object
    density: object
    standpipe_pressure: object
    surface_names: tuple[str, ...]
    surface_losses: object
    surface_loss: object
    surface_flow: object
    string_names: tuple[str, ...]
    string_losses: object
    string_loss: object
    string_flow: object
    tool_names: tuple[str, ...]
    tool_losses: object
    tool_loss: object
    bit: object
    bit_loss: object
    annulus_names: tuple[str, ...]
    annulus_losses: object
    annulus_loss: object
    annulus_flow: object
    bit_md: float
    bit_tvd: float
    static_bhp: object
    circulating_bhp: object
    esd_bit: object
    ecd_bit: object
    pump_power: object
    margins: MarginTable | None
    notes: tuple[Note, ...]
    _annulus_top: np.ndarray = field(repr=False)
    _annulus_bottom: np.ndarray = field(repr=False)
    _well: object = field(repr=False)
    _window: PressureWindow | None = field(repr=False)
    _weak_points: tuple[WeakPoint, ...] = field(repr=False)

    # ------------------------------------------------------------------ derived quantities
    @property
    def frictional_loss(self):
        """Surface + string + annulus friction [Pa] (what ``friction_multiplier`` scales)."""
        return _scalar(
            np.asarray(self.surface_loss) + self.string_loss + np.asarray(self.annulus_loss)
        )

    @property
    def bit_share(self):
        """Share of the standpipe pressure spent at the bit [-]."""
        return _scalar(np.asarray(self.bit_loss) / self.standpipe_pressure)

    def breakdown(self) -> dict[str, object]:
        """Standpipe-pressure components [Pa], in flow order, summing to ``standpipe_pressure``."""
        return {
            "back pressure": self.back_pressure,
            "surface lines": self.surface_loss,
            "drill string": self.string_loss,
            "fixed tool drops": self.tool_loss,
            "bit": self.bit_loss,
            "annulus": self.annulus_loss,
        }

    def annular_loss_above(self, md):
        """Annular friction between the surface and ``md`` [Pa] (linear within each interval)."""
        mdv = np.asarray(md, dtype=float)
        w = _depth_weights(mdv.ravel(), self._annulus_top, self._annulus_bottom)
        p = np.asarray(self.annulus_losses) @ w.T
        return _scalar(p.reshape(np.shape(self.standpipe_pressure) + mdv.shape))

    def _check_md(self, md):
        mdv = check_range("MD", md, 0.0, self.bit_md, "m", lo_open=True)
        return mdv

    def ecd_at(self, md):
        """ECD [kg/m³] at measured depth(s) ``md`` [m], 0 < md ≤ bit depth.

        ECD = ρ + (Δp_ann above md + p_back)/(g·TVD(md)).  Result shape: sweep axes + md axes.
        """
        mdv = self._check_md(md)
        tvd = np.asarray(self._well.survey.tvd_at(mdv), dtype=float)
        rho = np.asarray(self.density, dtype=float).reshape(
            np.shape(self.density) + (1,) * mdv.ndim
        )
        return _scalar(
            equivalent_circulating_density(
                rho,
                self.annular_loss_above(mdv),
                tvd,
                back_pressure=self.back_pressure,
                hydrostatic=self.hydrostatic,
            )
        )

    def esd_at(self, md):
        """ESD [kg/m³] at ``md`` [m]: the static column's EMW (constant-density fluid: ρ)."""
        mdv = self._check_md(md)
        rho = np.asarray(self.density, dtype=float).reshape(
            np.shape(self.density) + (1,) * mdv.ndim
        )
        return _scalar(np.broadcast_to(rho, np.shape(self.density) + mdv.shape).copy())

    def profile(self, step: float = MARGIN_STEP) -> Profile:
        """ESD, ECD, pressure, pore and fracture on an MD grid from ``step`` to the bit [m].

        The grid (:meth:`calc.geometry.Well.annulus_depth_grid`) holds every interval boundary,
        so the piecewise-linear annular pressure is exact at the grid points.
        """
        step = float(check_positive("profile step", step, "m"))
        grid = self._well.annulus_depth_grid(step)
        keep = grid.md > 0
        md = np.asarray(grid.md[keep], dtype=float)
        tvd = np.asarray(grid.tvd[keep], dtype=float)
        g = gravity_for(self.hydrostatic)
        ecd = np.asarray(self.ecd_at(md))
        names = [""] * md.size
        pore, frac = limits_at(md, tvd, names, self._window, ())
        return Profile(
            md=md,
            tvd=tvd,
            pressure=ecd * g * tvd,
            esd=np.asarray(self.esd_at(md)),
            ecd=ecd,
            pore=pore,
            fracture=frac,
        )


def _depth_weights(md, top, bottom):
    """Fraction of each interval lying above each depth: W[j, i] ∈ [0, 1]."""
    span = bottom - top
    return np.clip((md[:, None] - top[None, :]) / span[None, :], 0.0, 1.0)


def _reshape_flow(fr, shape):
    """Give every array field of a FlowResult computed on (N, I) the sweep shape + (I,)."""
    if fr is None:
        return None
    changes = {}
    for f in dataclasses.fields(fr):
        v = getattr(fr, f.name)
        if isinstance(v, np.ndarray) and v.ndim == 2:
            changes[f.name] = v.reshape(shape + v.shape[1:])
    return dataclasses.replace(fr, **changes) if changes else fr


def _sweep_text(mask, q_flat):
    """'at all rates' / 'at 12 of 10000 sweep points (q 0.020-0.025 m³/s)'."""
    n = int(mask.sum())
    if mask.size == 1:
        return ""
    if n == mask.size:
        return " at every sweep point"
    qs = q_flat[mask]
    return f" at {n} of {mask.size} sweep points (q {qs.min():.4g}-{qs.max():.4g} m³/s)"


def circulate(
    well,
    fluid: HydraulicsFluid,
    q,
    *,
    method: str = "api13d_2010_hb",
    eccentricity: float = 0.0,
    back_pressure: float = 0.0,
    friction_multiplier: float = 1.0,
    hydrostatic: str = "exact",
    window: PressureWindow | None = None,
    weak_points=(),
    margins: Margins | None = None,
    surface_rating: float | None = None,
    margin_step: float = MARGIN_STEP,
    message_units: str = "oilfield",
    covered_by_tool_drops=(),
) -> CirculationResult:
    """Pressure losses around the circulating system, ECD and margins, for one rate or a sweep.

    .. math::

        p_{SPP} = p_s + \\sum_{lines}\\Delta p + \\sum_{string}\\Delta p + \\sum_{tools}\\Delta p
                  + \\Delta p_{bit} + \\sum_{annulus}\\Delta p

        \\mathrm{ECD}(z) = \\rho + \\frac{\\Delta p_{ann}(0 \\to z) + p_s}{g\\,\\mathrm{TVD}(z)}

    Each interval loss is the friction gradient of :func:`calc.flow.pipe_flow` (lines, string)
    or :func:`calc.flow.annulus_flow` (annulus, with the eccentricity and the geometry's
    tool-joint sub-intervals) times its length and ``friction_multiplier``.  Fixed tool drops
    scale as Δp_ref·(ρ/ρ_ref)·(Q/Q_ref)²; the bit drop is :func:`calc.bit.bit_pressure_drop`.
    Hydrostatic heads cancel around the U-tube (one fluid), so the standpipe pressure is the
    sum of the frictional and jet losses plus the back-pressure.

    Parameters
    ----------
    well : calc.geometry.Well
        The well (survey, hole, string, bit, surface lines, tool drops, bit depth).
    fluid : HydraulicsFluid
        Density [kg/m³] (scalar or array: a density sweep) and the pipe/annulus models.
    q : float or array_like
        Flow rate(s) [m³/s], > 0; broadcast against ``fluid.density``.
    method : str
        Friction method of :mod:`calc.flow` (default ``"api13d_2010_hb"``).
    eccentricity : float
        Pipe offset in the annulus, e = 2δ/(D_hole − D_pipe), 0 ≤ e < 1.
    back_pressure : float
        Surface annular back-pressure [Pa], ≥ 0 (adds to SPP, circulating BHP and ECD only).
    friction_multiplier : float
        Calibration factor on surface, string and annular friction (not on bit or tools), > 0.
    hydrostatic : {"exact", "0.052"}
        Hydrostatic convention (see :mod:`calc.circulation.hydrostatics`).
    window : PressureWindow, optional
        Pore and fracture EMW versus TVD.
    weak_points : sequence of WeakPoint
        Named depths with their own limits; checked when above the bit.
    margins : Margins, optional
        Required margins to fracture and pore (default 0 and 0).
    surface_rating : float, optional
        Surface-system pressure rating [Pa]; a note is given where the SPP exceeds it.
    covered_by_tool_drops : sequence of str
        Names of string components whose bore friction the fixed tool drops already include
        (a supplier's figure for an MWD or motor usually covers the tool's whole internal
        loss); their string-interval friction is then not added (a note says so).
    margin_step : float
        Spacing of the margin check points from the last shoe to the bit [m].
    message_units : str
        Unit system used in note messages ("oilfield", "metric", "si").

    Returns
    -------
    CirculationResult

    Notes
    -----
    Steady, isothermal, incompressible flow; no cuttings load, no pipe rotation, one fluid in the
    whole system.  Pore and fracture limits are checked over the exposed formation only: from
    the deepest casing/liner shoe to the bit, on the well's depth grid (every ``margin_step``
    plus all interval boundaries), at the pressure-window stations, the shoe, the bit and the
    weak points above the bit.  The fixed tool drops are added to the bore friction of the tool
    intervals unless those components are listed in ``covered_by_tool_drops``.

    References
    ----------
    API RP 13D, *Rheology and Hydraulics of Oil-well Drilling Fluids*, 6th ed. (2010) (method
    structure; from memory, unverified — METHODS §3, §6).  Bourgoyne et al. (1986) *Applied
    Drilling Engineering*, SPE Textbook Series 2, ch. 4.
    """
    # ---------------------------------------------------------------- validation
    qv = check_positive("flow rate", q, "m³/s")
    if not isinstance(fluid, HydraulicsFluid):
        raise InputError("fluid", type(fluid).__name__, "a HydraulicsFluid")
    method = wl.check_method(method)
    hydrostatic = check_choice("hydrostatic", hydrostatic, ("exact", "0.052"))
    ecc = float(check_range("eccentricity", eccentricity, 0.0, 1.0, hi_open=True))
    pb = float(check_range("back pressure", back_pressure, 0.0, np.inf, "Pa"))
    mult_in = check_positive("friction multiplier", friction_multiplier)
    step = float(check_positive("margin step", margin_step, "m"))
    margins = Margins() if margins is None else margins
    if window is not None and not isinstance(window, PressureWindow):
        raise InputError("window", type(window).__name__, "a PressureWindow or None")
    weak_points = tuple(weak_points)
    for wp in weak_points:
        if not isinstance(wp, WeakPoint):
            raise InputError("weak point", type(wp).__name__, "a WeakPoint")
    if surface_rating is not None:
        surface_rating = float(check_positive("surface rating", surface_rating, "Pa"))

    rho_in = np.asarray(fluid.density, dtype=float)
    try:
        shape = np.broadcast_shapes(qv.shape, rho_in.shape, mult_in.shape)
    except ValueError as exc:
        raise InputError(
            "flow rate / density / friction multiplier shapes",
            (qv.shape, rho_in.shape, mult_in.shape),
            "arrays that broadcast together",
        ) from exc
    qf = np.broadcast_to(qv, shape).ravel()
    rf = np.broadcast_to(rho_in, shape).ravel()
    mf = np.broadcast_to(mult_in, shape).ravel()
    Q = qf[:, None]
    R = rf[:, None]
    M = mf[:, None]
    notes: list[Note] = list(fluid.notes)

    def fmt(v, kind):
        u = wl.unit_text(kind, message_units)
        x = float(from_si(v, u))
        txt = f"{x:,.0f}" if abs(x) >= 1000 else (f"{x:.1f}" if kind == "depth" else f"{x:.3g}")
        return f"{txt} {wl.label(u)}"

    # ---------------------------------------------------------------- the well
    parts = wl.parts(well)
    pipe_args = fluid.pipe_parameters
    ann_args = fluid.annulus_parameters

    def shaped(a):
        return _scalar(np.asarray(a).reshape(shape + np.shape(a)[1:]))

    # surface lines
    if parts.line_d.size:
        sflow = wl.pipe(Q, parts.line_d[None, :], R, pipe_args, method)
        s_losses = sflow.gradient * parts.line_len[None, :] * M
    else:
        sflow, s_losses = None, np.zeros((qf.size, 0))
    # drill string
    pflow = wl.pipe(Q, parts.string_d[None, :], R, pipe_args, method)
    p_losses = pflow.gradient * parts.string_len[None, :] * M
    covered = tuple(covered_by_tool_drops)
    if covered:
        known = set(parts.string_components)
        for name in covered:
            if name not in known:
                raise InputError(
                    "component covered by the tool drops",
                    name,
                    "a string component name: " + ", ".join(dict.fromkeys(parts.string_components)),
                )
        if not parts.tools:
            raise InputError(
                "covered_by_tool_drops", covered, "empty when the well has no fixed tool drops"
            )
        skip = np.array([c in covered for c in parts.string_components])
        p_losses = np.where(skip[None, :], 0.0, p_losses)
        notes.append(
            Note(
                "info",
                "bore_covered_by_tool_drop",
                "bore friction not added for " + ", ".join(covered) + ": the fixed tool drop "
                "includes it",
                "; ".join(parts.tool_names),
            )
        )
    # fixed tool drops
    t_losses = wl.tool_drops(parts.tools, Q, R)
    for tool in parts.tools:
        notes.extend(tool.rate_notes(qf, message_units))
    # bit
    bit_loss = wl.bit_drop(well, qf, rf)
    # annulus
    aflow = wl.annulus(
        Q, parts.ann_hole[None, :], parts.ann_pipe[None, :], R, ann_args, method, ecc
    )
    a_losses = aflow.gradient * parts.ann_len[None, :] * M

    s_loss = s_losses.sum(axis=-1)
    p_loss = p_losses.sum(axis=-1)
    t_loss = t_losses.sum(axis=-1)
    a_loss = a_losses.sum(axis=-1)
    spp = pb + s_loss + p_loss + t_loss + bit_loss + a_loss
    bit = wl.bit_hydraulics(well, qf, rf, spp)
    notes.extend(bit.notes)

    # ---------------------------------------------------------------- hydrostatics and ECD
    g = gravity_for(hydrostatic)
    bit_md = parts.bit_md
    bit_tvd = float(well.survey.tvd_at(bit_md))
    static_bhp = rf * g * bit_tvd
    circ_bhp = static_bhp + a_loss + pb
    ecd_bit = equivalent_circulating_density(
        rf, a_loss, bit_tvd, back_pressure=pb, hydrostatic=hydrostatic
    )

    # ---------------------------------------------------------------- notes on flow
    for path, flow, names in (
        ("surface lines", sflow, parts.line_names),
        ("string", pflow, parts.string_components),
        ("annulus", aflow, parts.ann_components),
    ):
        if flow is None:
            continue
        notes.extend(wl.flow_notes(flow))
        trans = np.asarray(flow.regime) == 1
        note = _interval_note(
            "warning",
            "transitional_flow",
            f"transitional flow in the {path}",
            "friction there is blended between the laminar and turbulent laws",
            trans,
            names,
            qf,
        )
        if note is not None:
            notes.append(note)
    below = np.asarray(aflow.velocity) < np.asarray(aflow.critical_velocity)
    note = _interval_note(
        "info",
        "annular_velocity_below_critical",
        "annular velocity below the critical velocity",
        "laminar flow there",
        below,
        parts.ann_components,
        qf,
    )
    if note is not None:
        notes.append(note)
    if surface_rating is not None:
        over = spp > surface_rating
        if np.any(over):
            notes.append(
                Note(
                    "warning",
                    "spp_above_rating",
                    "standpipe pressure above the surface rating "
                    f"({fmt(surface_rating, 'pressure')}){_sweep_text(over, qf)}: this rate is "
                    "not achievable",
                    "standpipe",
                )
            )

    # ---------------------------------------------------------------- margins
    result_kwargs = dict(
        method=f"{method}: {wl.method_label(pflow)}"
        + (f"; fits: {fluid.fits}" if fluid.fits else ""),
        fluid_label=fluid.label,
        hydrostatic=hydrostatic,
        friction_multiplier=shaped(mf),
        eccentricity=ecc,
        back_pressure=pb,
        q=shaped(qf),
        density=shaped(rf),
        standpipe_pressure=shaped(spp),
        surface_names=parts.line_names,
        surface_losses=shaped(s_losses),
        surface_loss=shaped(s_loss),
        surface_flow=_reshape_flow(sflow, shape),
        string_names=parts.string_names,
        string_losses=shaped(p_losses),
        string_loss=shaped(p_loss),
        string_flow=_reshape_flow(pflow, shape),
        tool_names=parts.tool_names,
        tool_losses=shaped(t_losses),
        tool_loss=shaped(t_loss),
        bit=wl.reshape_bit(bit, shape),
        bit_loss=shaped(bit_loss),
        annulus_names=parts.ann_names,
        annulus_losses=shaped(a_losses),
        annulus_loss=shaped(a_loss),
        annulus_flow=_reshape_flow(aflow, shape),
        bit_md=bit_md,
        bit_tvd=bit_tvd,
        static_bhp=shaped(static_bhp),
        circulating_bhp=shaped(circ_bhp),
        esd_bit=shaped(rf),
        ecd_bit=shaped(ecd_bit),
        pump_power=shaped(spp * qf),
        _annulus_top=parts.ann_top,
        _annulus_bottom=parts.ann_bottom,
        _well=well,
        _window=window,
        _weak_points=weak_points,
    )
    provisional = CirculationResult(margins=None, notes=(), **result_kwargs)
    table = None
    if window is not None or weak_points or parts.shoe_test is not None:
        table = _margin_table(provisional, parts, window, weak_points, margins, step, notes, fmt)
        _margin_notes(table, margins, qf, notes, fmt)
    return CirculationResult(margins=table, notes=tuple(_dedupe(notes)), **result_kwargs)


def _interval_note(level, code, what, consequence, mask, names, q_flat):
    """One note for all intervals flagged by ``mask`` (N sweep points × I intervals)."""
    hit = mask.any(axis=0)
    if not np.any(hit):
        return None
    idx = np.flatnonzero(hit)
    listed = list(dict.fromkeys(names[i] for i in idx))
    where = "; ".join(listed)
    count = f" ({idx.size} intervals)" if idx.size > 1 else ""
    return Note(
        level,
        code,
        f"{what}{count}{_sweep_text(mask.any(axis=1), q_flat)}: {consequence}",
        where,
    )


def _dedupe(notes):
    seen, out = set(), []
    for n in notes:
        key = (n.code, n.subject, n.message)
        if key not in seen:
            seen.add(key)
            out.append(n)
    return out


def _margin_table(res, parts, window, weak_points, margins, step, notes, fmt):
    """Check points from the last shoe to the bit, the shoe, the bit and weak points."""
    top = parts.exposed_top
    names: list[str] = []
    md: list[float] = []
    grid = np.asarray(res._well.annulus_depth_grid(step).md, dtype=float)
    grid = grid[(grid >= top) & (grid > 0)]
    names += [f"MD {fmt(m, 'depth')}" for m in grid]
    md += list(grid)
    at_shoe = any(abs(wp.md - top) < 0.5 for wp in weak_points)
    if top > 0 and parts.shoe_name and not at_shoe:
        names.append(parts.shoe_name)
        md.append(top)
    names.append("bit")
    md.append(res.bit_md)
    if window is not None:
        g = res._well.annulus_depth_grid(step)
        gmd, gtvd = np.asarray(g.md, dtype=float), np.asarray(g.tvd, dtype=float)
        if np.all(np.diff(gtvd) > 0):
            lo = float(np.interp(top, gmd, gtvd))
            for t in window.tvd:
                if lo <= t <= gtvd[-1] and t > 0:
                    names.append(f"window station, TVD {fmt(t, 'depth')}")
                    md.append(float(np.interp(t, gtvd, gmd)))
    fracture_override: dict[str, float] = {}
    if parts.shoe_test is not None and parts.shoe_name:
        fracture_override[parts.shoe_name] = parts.shoe_test
    for wp in weak_points:
        if wp.md > res.bit_md or wp.md <= 0:
            notes.append(
                Note(
                    "info",
                    "weak_point_not_reached",
                    f"weak point at MD {fmt(wp.md, 'depth')} is not in the circulated annulus "
                    f"(bit at {fmt(res.bit_md, 'depth')}): not assessed",
                    wp.name,
                )
            )
            continue
        names.append(wp.name)
        md.append(wp.md)
    md_arr = np.asarray(md, dtype=float)
    tvd = np.asarray(res._well.survey.tvd_at(md_arr), dtype=float)
    usable = [wp for wp in weak_points if 0 < wp.md <= res.bit_md]
    pore, frac = limits_at(md_arr, tvd, names, window, usable)
    for name, value in fracture_override.items():
        at = np.array([n == name for n in names])
        if not any(wp.name == name for wp in usable):
            frac[at] = value
    if window is None:
        # only the weak points and the shoe test carry limits
        pass
    elif not np.all(window.covers(tvd)):
        outside = ~np.asarray(window.covers(tvd))
        notes.append(
            Note(
                "info",
                "window_extrapolated",
                f"pore/fracture window held constant beyond its stations at {int(outside.sum())}"
                " check point(s)",
                "pressure window",
            )
        )
    ecd = np.asarray(res.ecd_at(md_arr))
    esd = np.asarray(res.esd_at(md_arr))
    return tabulate_margins(names, md_arr, tvd, pore, frac, ecd, esd, margins)


def _margin_notes(table: MarginTable, margins: Margins, qf, notes, fmt):
    fm = table.fracture_margin.reshape(qf.size, -1)
    pm = table.pore_margin.reshape(qf.size, -1)
    spm = table.static_pore_margin.reshape(qf.size, -1)
    for j, name in enumerate(table.names):
        near_f = fm[:, j] < margins.fracture
        if np.any(near_f):
            notes.append(
                Note(
                    "caution",
                    "ecd_near_fracture",
                    f"ECD within {fmt(margins.fracture, 'density')} of the fracture EMW "
                    f"({fmt(table.fracture[j], 'density')}){_sweep_text(near_f, qf)}",
                    name,
                )
            )
        low_p = pm[:, j] < margins.pore
        if np.any(low_p):
            notes.append(
                Note(
                    "caution",
                    "ecd_near_pore",
                    f"ECD below the pore EMW ({fmt(table.pore[j], 'density')}) plus the margin "
                    f"{fmt(margins.pore, 'density')}{_sweep_text(low_p, qf)}",
                    name,
                )
            )
        static_low = spm[:, j] < 0
        if np.any(static_low):
            notes.append(
                Note(
                    "warning",
                    "static_below_pore",
                    f"static mud weight below the pore EMW ({fmt(table.pore[j], 'density')})"
                    f"{_sweep_text(static_low, qf)}. This tool does not assess well control; "
                    "follow your procedures.",
                    name,
                )
            )
