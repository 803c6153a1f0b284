"""The circulating system end to end: surface lines → string → tools → bit → annulus.

One call evaluates every flow interval at every flow rate (and density) of a sweep in one numpy
pass: rates run along the leading axes, intervals along the last axis.  :func:`circulate` runs
the named steps: validation (:func:`_validate`), the loop pass (:func:`_loop_pass`), the flow
notes (:func:`_flow_notes`), assembly of the result (:func:`_assemble`) and the margins.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np

from calc.bit import BitHydraulics
from calc.circulation import well_parts as wp
from calc.circulation.checks import (
    dedupe_notes,
    interval_note,
    margin_notes,
    margin_table,
    sweep_part,
)
from calc.circulation.fluid import HydraulicsFluid
from calc.circulation.hydrostatics import equivalent_circulating_density, hydrostatic_pressure
from calc.circulation.pore_fracture import Margins, PressureWindow, WeakPoint
from calc.circulation.result import (
    MARGIN_STEP,
    CirculationResult,
    LoopContext,
    PathLosses,
    Profile,
    ToolLosses,
    as_scalar,
    reshape_flow,
)
from calc.circulation.well_parts import WellParts
from calc.errors import InputError, check_choice, check_positive, check_range
from calc.flow import FlowResult
from calc.flow.minor_losses import check_joint_losses
from calc.flow.rotation import check_rpm
from calc.hydraulics_method import HydraulicsMethod
from calc.notes import Note
from calc.values import Value

__all__ = ["CirculationResult", "Profile", "circulate"]


def circulate(
    well,
    fluid: HydraulicsFluid,
    q,
    *,
    method: str | HydraulicsMethod | None = None,
    eccentricity: float = 0.0,
    back_pressure: float = 0.0,
    friction_multiplier: float = 1.0,
    hydrostatic: str = "exact",
    window: PressureWindow | None = None,
    weak_points=(),
    margins: Margins | None = None,
    surface_rating: float | None = None,
    margin_step: float = MARGIN_STEP,
    annulus_multiplier: float | None = None,
    rpm: float = 0.0,
    joint_losses: str = "bore_friction",
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
    method : str or HydraulicsMethod, optional
        Hydraulics method (:func:`calc.hydraulics_method.resolve_method`; None: the default,
        API RP 13D 2010 Herschel-Bulkley); its friction law computes every gradient, with its
        constant set (``resolve_method(name, constants="as_printed")``: the printed constants
        for the pipe, annulus and bit drops, calc/METHODS.md §7.9).  Fit the fluid with the same
        method (:func:`~calc.circulation.hydraulics_fluid`).
    eccentricity : float
        Pipe offset in the annulus, e = 2δ/(D_hole − D_pipe), 0 ≤ e < 1; annulus rows around a
        string component with a ``standoff`` take e = (1 − s)·sin θ instead
        (:func:`calc.flow.eccentricity.eccentricity_from_standoff`, calc/METHODS.md §22).
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
    annulus_multiplier : float, optional
        Calibration factor on the annular friction alone, > 0 (then ``friction_multiplier``
        scales the surface lines and the string only; :func:`calc.circulation.calibrate_two_part`).
        None: ``friction_multiplier`` scales the annulus too.
    rpm : float
        String rotary speed [rpm], 0 ≤ rpm ≤ 600 (default 0: no rotation); the annular gradient
        carries the laminar helical-flow factor of :func:`calc.flow.rotation.rotation_factor`.
    joint_losses : {"bore_friction", "bore_change_k"}
        Tool-joint losses in the string: bore friction only (default), or also a sharp
        contraction and a Borda–Carnot expansion per joint
        (:mod:`calc.flow.minor_losses`, calc/METHODS.md §22).

    Returns
    -------
    CirculationResult
        Losses grouped per flow path (``surface``, ``string``, ``tools``, ``bit``,
        ``annulus``), each row with its :class:`~calc.span.Span`; notes carry SI values.

    Notes
    -----
    Steady, isothermal, incompressible flow; no cuttings load, no pipe rotation, one fluid in the
    whole system.  Pore and fracture limits are checked over the exposed formation only: from
    the deepest casing/liner shoe to the bit, on the well's depth grid (every ``margin_step``
    plus all interval boundaries), at the pressure-window stations, the shoe, the bit and the
    weak points above the bit.  A fixed tool drop whose ``components`` name string components
    (:class:`calc.geometry.ToolPressureDrop`: the supplier's figure includes their bore loss)
    replaces their bore friction: those string intervals carry zero loss in ``string.losses``
    (listed in ``CirculationResult.tools.covered``, with an info note); otherwise the drop is
    added on top of the bore friction.

    Examples
    --------
    A vertical 3,000 m well (9-5/8 in casing to 1,500 m, 8-1/2 in open hole, 150 m of
    6-1/2 in collars under 5 in drill pipe, bit with 3x12 3x11 nozzles), 11.0 ppg mud:

    >>> from calc.bit import Bit
    >>> from calc.circulation import hydraulics_fluid_from_readings
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
    >>> r = circulate(well, fluid, to_si(500.0, "gpm"))
    >>> {k: round(from_si(v, "psi")) for k, v in r.breakdown().items() if v}
    {'string': 980, 'bit': 681, 'annulus': 256}
    >>> round(from_si(r.standpipe_pressure, "psi")), round(from_si(r.ecd_bit, "ppg"), 2)
    (1917, 11.5)

    The parts add up to the standpipe pressure; the bit's 681 psi is the field form
    8.311e-5·11·500²/(0.95²·0.6098²) (Bourgoyne et al. 1986, ch. 4); the ECD at the bit is
    ρ + Δp_ann/(g·TVD) (:func:`~calc.circulation.hydrostatics.equivalent_circulating_density`):

    >>> bool(np.isclose(sum(r.breakdown().values()), r.standpipe_pressure, rtol=1e-12))
    True
    >>> round(8.311e-5 * 11.0 * 500.0**2 / (0.95**2 * 0.6098**2))
    681
    >>> ecd = equivalent_circulating_density(fluid.density, r.annulus.total, 3000.0)
    >>> bool(np.isclose(r.ecd_bit, ecd, rtol=1e-12))
    True

    At the shoe (1,500 m) less annular loss lies above, so the ECD is lower:

    >>> round(from_si(r.ecd_at(1500.0), "ppg"), 2)
    11.43

    References
    ----------
    API RP 13D, *Rheology and Hydraulics of Oil-well Drilling Fluids*, 6th ed. (2010) (method
    structure; from memory, not yet checked against the source — calc/METHODS.md §7, §9.4).
    Bourgoyne et al. (1986) *Applied Drilling Engineering*, SPE Textbook Series 2, ch. 4.
    """
    inp = _validate(
        fluid, q, method, eccentricity, back_pressure, friction_multiplier, hydrostatic,
        window, weak_points, margins, surface_rating, margin_step,
    )  # fmt: skip
    if annulus_multiplier is not None:  # own multiplier on the annulus (two-part calibration)
        am = check_positive("annulus friction multiplier", annulus_multiplier)
        if am.size not in (1, int(np.prod(inp.shape))) or am.ndim > len(inp.shape):
            raise InputError("annulus friction multiplier shape", am.shape, f"{inp.shape}")
        inp = replace(inp, amult=np.broadcast_to(am, inp.shape).ravel())
    inp = replace(inp, rpm=float(check_rpm(rpm)), joint_losses=check_joint_losses(joint_losses))
    parts = wp.parts(well)
    lp = _loop_pass(well, fluid, parts, inp)
    notes: list[Note] = [*fluid.notes, *lp.notes]
    notes.extend(_flow_notes(lp, parts, inp))
    notes.extend(wp.loss_option_notes(inp.rpm, inp.joint_losses, lp.ecc_rows is not None))
    res = _assemble(well, fluid, parts, inp, lp, margins=None, notes=())
    table = None
    if inp.window is not None or inp.weak_points or parts.shoe_test is not None:
        table = margin_table(res, parts, inp.window, inp.weak_points, inp.margins, inp.step, notes)
        margin_notes(table, inp.margins, inp.q, notes)
    return _assemble(well, fluid, parts, inp, lp, margins=table, notes=tuple(dedupe_notes(notes)))


@dataclass(frozen=True, eq=False)
class _Inputs:
    """Validated inputs; ``q``, ``rho``, ``mult`` flattened over the sweep ``shape``."""

    q: np.ndarray
    rho: np.ndarray
    mult: np.ndarray
    shape: tuple[int, ...]
    method: str
    constants: str
    hydrostatic: str
    ecc: float
    pb: float
    step: float
    margins: Margins
    window: PressureWindow | None
    weak_points: tuple[WeakPoint, ...]
    surface_rating: float | None
    amult: np.ndarray | None = None  # annulus multiplier (None: ``mult``)
    rpm: float = 0.0
    joint_losses: str = "bore_friction"


def _validate(
    fluid, q, method, eccentricity, back_pressure, friction_multiplier, hydrostatic,
    window, weak_points, margins, surface_rating, margin_step,
) -> _Inputs:  # fmt: skip
    """Check every input (InputError naming it) and broadcast rate, density and multiplier."""
    qv = check_positive("flow rate", q, "m³/s")
    if not isinstance(fluid, HydraulicsFluid):
        raise InputError("fluid", type(fluid).__name__, "a HydraulicsFluid")
    constants = wp.method_constants(method)
    method = wp.check_method(method)
    hydrostatic = check_choice("hydrostatic", hydrostatic, ("exact", "0.052"))
    ecc = float(check_range("eccentricity", eccentricity, 0.0, 1.0, hi_open=True))
    pb = float(check_range("back pressure", back_pressure, 0.0, np.inf, "Pa"))
    mult_in = check_positive("friction multiplier", friction_multiplier)
    step = float(check_positive("margin step", margin_step, "m"))
    margins = Margins() if margins is None else margins
    if window is not None and not isinstance(window, PressureWindow):
        raise InputError("window", type(window).__name__, "a PressureWindow or None")
    weak_points = tuple(weak_points)
    for w in weak_points:
        if not isinstance(w, WeakPoint):
            raise InputError("weak point", type(w).__name__, "a WeakPoint")
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
    return _Inputs(
        q=np.broadcast_to(qv, shape).ravel(),
        rho=np.broadcast_to(rho_in, shape).ravel(),
        mult=np.broadcast_to(mult_in, shape).ravel(),
        shape=shape,
        method=method,
        constants=constants,
        hydrostatic=hydrostatic,
        ecc=ecc,
        pb=pb,
        step=step,
        margins=margins,
        window=window,
        weak_points=weak_points,
        surface_rating=surface_rating,
    )


@dataclass(frozen=True, eq=False)
class _Pass:
    """One numpy pass through the loop: (N, rows) losses [Pa] and flow results per path."""

    sflow: FlowResult | None
    s_losses: np.ndarray
    pflow: FlowResult
    p_losses: np.ndarray
    covered: tuple[str, ...]
    t_losses: np.ndarray
    bit_loss: np.ndarray
    aflow: FlowResult
    a_losses: np.ndarray
    spp: np.ndarray
    bit: BitHydraulics
    notes: tuple[Note, ...]
    ecc_rows: np.ndarray | None = None


def _loop_pass(well, fluid: HydraulicsFluid, parts: WellParts, inp: _Inputs) -> _Pass:
    """Surface lines, string, fixed tool drops, bit and annulus at every sweep point."""
    Q, R, M = inp.q[:, None], inp.rho[:, None], inp.mult[:, None]
    pipe_args, ann_args, method = fluid.pipe_parameters, fluid.annulus_parameters, inp.method
    const = inp.constants
    notes: list[Note] = []
    if parts.line_d.size:
        sflow = wp.pipe(Q, parts.line_d[None, :], R, pipe_args, method, const)
        s_losses = sflow.gradient * parts.line_len[None, :] * M
    else:
        sflow, s_losses = None, np.zeros((inp.q.size, 0))
    pflow = wp.pipe(Q, parts.string_d[None, :], R, pipe_args, method, const)
    p_losses = pflow.gradient * parts.string_len[None, :] * M
    p_losses = p_losses + wp.joint_minor_losses(well, Q, R, inp.joint_losses) * M
    covered = tuple(well.tool_covered)
    if covered:
        skip = np.array([c in covered for c in parts.string_components])
        p_losses = np.where(skip[None, :], 0.0, p_losses)
        notes.append(
            Note(
                "info",
                "bore_covered_by_tool_drop",
                "bore friction not added for {covered}: the supplier's fixed tool drop includes it",
                "; ".join(s.item for s in parts.tool_spans),
                values=(Value("covered", ", ".join(covered)),),
            )
        )
    t_losses = wp.tool_drops(parts.tools, Q, R)
    for tool in parts.tools:
        notes.extend(tool.rate_notes(inp.q))
    bit_loss = wp.bit_drop(well, inp.q, inp.rho, const)
    ecc_rows = wp.annulus_eccentricity(well, inp.ecc)
    ecc = inp.ecc if ecc_rows is None else ecc_rows[None, :]
    aflow = wp.annulus(
        Q, parts.ann_hole[None, :], parts.ann_pipe[None, :], R, ann_args, method, ecc, const,
        inp.rpm,
    )  # fmt: skip
    MA = M if inp.amult is None else inp.amult[:, None]
    a_losses = aflow.gradient * parts.ann_len[None, :] * MA
    spp = inp.pb + s_losses.sum(-1) + p_losses.sum(-1) + t_losses.sum(-1) + bit_loss
    spp = spp + a_losses.sum(-1)
    bit = wp.bit_hydraulics(well, inp.q, inp.rho, spp, const)
    notes.extend(bit.notes)
    return _Pass(
        sflow, s_losses, pflow, p_losses, covered, t_losses, bit_loss, aflow, a_losses, spp, bit,
        tuple(notes), ecc_rows,
    )  # fmt: skip


def _flow_notes(lp: _Pass, parts: WellParts, inp: _Inputs) -> list[Note]:
    """Transitional flow per path, laminar annular flow, and the SPP above the rating."""
    notes: list[Note] = []
    for path, flow, spans in (
        ("surface lines", lp.sflow, parts.line_spans),
        ("string", lp.pflow, parts.string_spans),
        ("annulus", lp.aflow, parts.ann_spans),
    ):
        if flow is None:
            continue
        notes.extend(wp.flow_notes(flow))
        note = interval_note(
            "warning",
            "transitional_flow",
            f"transitional flow in the {path}",
            "friction there is blended between the laminar and turbulent laws",
            np.asarray(flow.regime) == 1,
            spans,
            inp.q,
        )
        if note is not None:
            notes.append(note)
    below = np.asarray(lp.aflow.velocity) < np.asarray(lp.aflow.critical_velocity)
    note = interval_note(
        "info",
        "below_critical_velocity",
        "annular velocity below the critical velocity",
        "laminar flow there",
        below,
        parts.ann_spans,
        inp.q,
    )
    if note is not None:
        notes.append(note)
    if inp.surface_rating is not None:
        over = lp.spp > inp.surface_rating
        if np.any(over):
            where, sweep = sweep_part(over, inp.q)
            notes.append(
                Note(
                    "warning",
                    "spp_above_rating",
                    "standpipe pressure above the surface rating ({rating})"
                    + where
                    + ": this rate is not achievable",
                    "standpipe",
                    values=(Value("rating", inp.surface_rating, "pressure"), *sweep),
                )
            )
    return notes


def _assemble(
    well, fluid: HydraulicsFluid, parts: WellParts, inp: _Inputs, lp: _Pass, *, margins, notes
) -> CirculationResult:
    """The result: per-path losses in the sweep shape, bottom-hole pressures and ECD."""
    shape = inp.shape

    def shaped(a):
        return as_scalar(np.asarray(a).reshape(shape + np.shape(a)[1:]))

    def path(spans, losses, flow):
        return PathLosses(
            spans=spans,
            losses=np.asarray(shaped(losses)),
            total=shaped(losses.sum(axis=-1)),
            flow=reshape_flow(flow, shape),
        )

    rf, pb = inp.rho, inp.pb
    a_loss = lp.a_losses.sum(axis=-1)
    bit_tvd = float(well.survey.tvd_at(parts.bit_md))
    static_bhp = np.asarray(hydrostatic_pressure(rf, bit_tvd, hydrostatic=inp.hydrostatic))
    ecd_bit = equivalent_circulating_density(
        rf, a_loss, bit_tvd, back_pressure=pb, hydrostatic=inp.hydrostatic
    )
    return CirculationResult(
        method=f"{inp.method}: {wp.method_label(lp.pflow)}"
        + (f"; fits: {fluid.fits}" if fluid.fits else ""),
        fluid_label=fluid.label,
        hydrostatic=inp.hydrostatic,
        friction_multiplier=shaped(inp.mult),
        eccentricity=inp.ecc,
        back_pressure=pb,
        q=shaped(inp.q),
        density=shaped(rf),
        standpipe_pressure=shaped(lp.spp),
        surface=path(parts.line_spans, lp.s_losses, lp.sflow),
        string=path(parts.string_spans, lp.p_losses, lp.pflow),
        tools=ToolLosses(
            spans=parts.tool_spans,
            covered=lp.covered,
            losses=np.asarray(shaped(lp.t_losses)),
            total=shaped(lp.t_losses.sum(axis=-1)),
        ),
        bit=wp.reshape_bit(lp.bit, shape),
        annulus=path(parts.ann_spans, lp.a_losses, lp.aflow),
        bit_md=parts.bit_md,
        bit_tvd=bit_tvd,
        static_bhp=shaped(static_bhp),
        circulating_bhp=shaped(static_bhp + a_loss + pb),
        esd_bit=shaped(rf),
        ecd_bit=shaped(ecd_bit),
        pump_power=shaped(lp.spp * inp.q),
        margins=margins,
        context=LoopContext(
            well=well,
            window=inp.window,
            weak_points=inp.weak_points,
            annulus_top=parts.ann_top,
            annulus_bottom=parts.ann_bottom,
        ),
        notes=notes,
        rpm=inp.rpm,
        joint_losses=inp.joint_losses,
        annulus_eccentricity=lp.ecc_rows,
    )
