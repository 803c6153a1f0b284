"""The circulating system end to end: surface lines → string → tools → bit → annulus.

One call evaluates every flow interval at every flow rate (and density) of a sweep in one numpy
pass: rates run along the leading axes, intervals along the last axis.
"""

from __future__ import annotations

import numpy as np

from calc.circulation import _well_link as wl
from calc.circulation.checks import (
    _dedupe,
    _interval_note,
    _margin_notes,
    _margin_table,
    _sweep_text,
)
from calc.circulation.fluid import HydraulicsFluid
from calc.circulation.hydrostatics import equivalent_circulating_density, hydrostatic_pressure
from calc.circulation.pressure_window import Margins, PressureWindow, WeakPoint
from calc.circulation.result import (
    MARGIN_STEP,
    CirculationResult,
    Profile,
    _reshape_flow,
    _scalar,
)
from calc.errors import InputError, check_choice, check_positive, check_range
from calc.notes import Note
from calc.units import from_si

__all__ = ["CirculationResult", "Profile", "circulate"]


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
    margin_step : float
        Spacing of the margin check points from the last shoe to the bit [m].
    message_units : str
        Unit system of the depths in interval names and of the values in note messages
        ("oilfield", "metric", "si").

    Returns
    -------
    CirculationResult

    Notes
    -----
    Steady, isothermal, incompressible flow; no cuttings load, no pipe rotation, one fluid in the
    whole system.  Pore and fracture limits are checked over the exposed formation only: from
    the deepest casing/liner shoe to the bit, on the well's depth grid (every ``margin_step``
    plus all interval boundaries), at the pressure-window stations, the shoe, the bit and the
    weak points above the bit.  A fixed tool drop whose ``components`` name string components
    (:class:`calc.geometry.ToolPressureDrop`: the supplier's figure includes their bore loss)
    replaces their bore friction: those string intervals carry zero loss in ``string_losses``
    (listed in ``CirculationResult.tool_covered``, with an info note); otherwise the drop is
    added on top of the bore friction.

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
    parts = wl.parts(well, message_units)
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
    covered = tuple(getattr(well, "tool_covered", ()))
    if covered:
        skip = np.array([c in covered for c in parts.string_components])
        p_losses = np.where(skip[None, :], 0.0, p_losses)
        notes.append(
            Note(
                "info",
                "bore_covered_by_tool_drop",
                "bore friction not added for " + ", ".join(covered) + ": the supplier's fixed "
                "tool drop includes it",
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
    bit_md = parts.bit_md
    bit_tvd = float(well.survey.tvd_at(bit_md))
    static_bhp = np.asarray(hydrostatic_pressure(rf, bit_tvd, hydrostatic=hydrostatic))
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
            fmt,
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
        fmt,
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
                    f"({fmt(surface_rating, 'pressure')}){_sweep_text(over, qf, fmt)}: "
                    "this rate is not achievable",
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
        tool_covered=covered,
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
