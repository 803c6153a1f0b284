"""Adapters between the circulation loop and :mod:`calc.geometry`, :mod:`calc.bit`,
:mod:`calc.flow` — the one place that knows their attribute names.

:func:`parts` reads once from a :class:`~calc.geometry.Well` what the loop needs (diameters,
lengths, the :class:`~calc.span.Span` of every row, the exposed-hole top); the other functions
call the flow and bit layers in the loop's array layout (sweep points × rows).
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from calc.bit import bit_hydraulics as _bit_hydraulics
from calc.bit import bit_pressure_drop
from calc.bit.hydraulics import BitHydraulics
from calc.flow import annulus_flow, pipe_flow
from calc.flow.eccentricity import eccentricity_from_standoff
from calc.flow.minor_losses import JOINT_LOSS_METHODS
from calc.geometry import ToolPressureDrop, Well
from calc.hydraulics_method import resolve_method
from calc.notes import Note
from calc.span import Span
from calc.values import Value

__all__ = [
    "REISSUED_FLOW_NOTES",
    "WellParts",
    "annulus",
    "annulus_eccentricity",
    "bit_drop",
    "bit_hydraulics",
    "check_method",
    "flow_notes",
    "joint_minor_losses",
    "loss_option_notes",
    "method_constants",
    "method_label",
    "parts",
    "pipe",
    "reshape_bit",
    "tool_drops",
]


@dataclass(frozen=True, eq=False)
class WellParts:
    """The arrays the loop needs, read once from a :class:`calc.geometry.Well`.

    Diameters, lengths and depths [m]; ``*_spans`` say where each row lies (bit up in the
    string and annulus); ``exposed_top`` is the deepest casing/liner shoe above the bit (0
    without one), ``shoe_name`` its name + " shoe", ``shoe_test`` its shoe-test EMW [kg/m³].
    """

    line_spans: tuple[Span, ...]
    line_d: np.ndarray
    line_len: np.ndarray
    string_spans: tuple[Span, ...]
    string_d: np.ndarray
    string_len: np.ndarray
    tools: tuple[ToolPressureDrop, ...]
    tool_spans: tuple[Span, ...]
    ann_spans: tuple[Span, ...]
    ann_hole: np.ndarray
    ann_pipe: np.ndarray
    ann_len: np.ndarray
    ann_top: np.ndarray
    ann_bottom: np.ndarray
    bit_md: float
    exposed_top: float
    shoe_name: str
    shoe_test: float | None

    @property
    def string_components(self) -> tuple[str, ...]:
        """String component of each string row."""
        return tuple(s.item for s in self.string_spans)


def parts(well: Well) -> WellParts:
    """Surface lines, string and annulus rows, tools, bit depth and the exposed-hole top."""
    iv = well.flow_intervals()
    s = iv.select("string")
    a = iv.select("annulus")
    lines = tuple(well.surface_lines)
    tools = tuple(well.tool_drops)
    bit_md = float(well.bit_depth)
    last = well.last_shoe
    if last is not None:
        exposed_top, shoe_name, shoe_test = float(last.bottom), f"{last.name} shoe", last.shoe_test
    else:
        exposed_top, shoe_name, shoe_test = 0.0, "", None
    return WellParts(
        line_spans=tuple(Span("surface", x.name) for x in lines),
        line_d=np.array([x.id for x in lines], dtype=float),
        line_len=np.array([x.length for x in lines], dtype=float),
        string_spans=s.spans(),
        string_d=np.asarray(s.outer_diameter, dtype=float),
        string_len=np.asarray(s.length, dtype=float),
        tools=tools,
        tool_spans=tuple(Span("tools", t.name) for t in tools),
        ann_spans=a.spans(),
        ann_hole=np.asarray(a.outer_diameter, dtype=float),
        ann_pipe=np.asarray(a.inner_diameter, dtype=float),
        ann_len=np.asarray(a.length, dtype=float),
        ann_top=np.asarray(a.top_md, dtype=float),
        ann_bottom=np.asarray(a.bottom_md, dtype=float),
        bit_md=bit_md,
        exposed_top=exposed_top,
        shoe_name=shoe_name,
        shoe_test=shoe_test,
    )


def check_method(method) -> str:
    """The friction law of a hydraulics method (:func:`calc.hydraulics_method.resolve_method`)."""
    return resolve_method(method).friction


def method_constants(method) -> str:
    """The constant set of a hydraulics method (``"exact"`` or ``"as_printed"``).

    Examples
    --------
    >>> from calc.hydraulics_method import resolve_method
    >>> method_constants("api13d_1995_power_law")
    'exact'
    >>> method_constants(resolve_method("api13d_1995_power_law", constants="as_printed"))
    'as_printed'
    """
    return resolve_method(method).constants


def pipe(Q, d, R, params, method, constants="exact"):
    """:func:`calc.flow.pipe_flow` with the fluid's (τy, K, n)."""
    ty, k, n = params
    return pipe_flow(Q, d, density=R, tau_y=ty, k=k, n=n, method=method, constants=constants)


def annulus(Q, d_hole, d_pipe, R, params, method, ecc, constants="exact", rpm=0.0):
    """:func:`calc.flow.annulus_flow` with the fluid's (τy, K, n), eccentricity and rpm."""
    ty, k, n = params
    return annulus_flow(
        Q, d_hole, d_pipe, density=R, tau_y=ty, k=k, n=n, method=method, eccentricity=ecc,
        constants=constants, rpm=rpm,
    )  # fmt: skip


def tool_drops(tools, Q, R) -> np.ndarray:
    """(N, T) fixed tool drops [Pa] (each tool's own ∝ ρQ² scaling)."""
    if not tools:
        return np.zeros((Q.shape[0], 0))
    return np.concatenate([np.asarray(t.pressure_drop(Q, R), dtype=float) for t in tools], axis=1)


def bit_hydraulics(well: Well, q, rho, spp=None, constants="exact") -> BitHydraulics:
    """:func:`calc.bit.bit_hydraulics` of the well's bit."""
    return _bit_hydraulics(q, rho, well.bit, standpipe_pressure=spp, constants=constants)


def bit_drop(well: Well, q, rho, constants="exact") -> np.ndarray:
    """Bit pressure drop [Pa] (:func:`calc.bit.bit_pressure_drop`)."""
    b = well.bit
    dp = bit_pressure_drop(q, rho, b.tfa, b.discharge_coefficient, constants)
    return np.asarray(dp, dtype=float)


def reshape_bit(bit: BitHydraulics, shape) -> BitHydraulics:
    """Give the bit result's per-rate arrays the sweep shape (scalars for a single rate)."""
    changes = {}
    for f in dataclasses.fields(bit):
        v = getattr(bit, f.name)
        if isinstance(v, np.ndarray) and v.ndim == 1:
            r = v.reshape(shape)
            changes[f.name] = float(r) if r.ndim == 0 else r
    return dataclasses.replace(bit, **changes) if changes else bit


#: calc.flow note codes the loop re-issues per named interval (so they are not repeated).
REISSUED_FLOW_NOTES = frozenset({"transitional_flow", "below_critical_velocity"})


def flow_notes(flow) -> tuple[Note, ...]:
    """The notes of a flow result, less those the loop re-issues per interval."""
    return tuple(n for n in (getattr(flow, "notes", ()) or ()) if n.code not in REISSUED_FLOW_NOTES)


def method_label(flow) -> str:
    """The flow method's label (its name when it has none)."""
    return str(getattr(flow, "method_label", "") or getattr(flow, "method", ""))


def _components(well: Well) -> dict:
    return {c.name: c for c in well.string.components}


def annulus_eccentricity(well: Well, ecc: float) -> np.ndarray | None:
    """Eccentricity per annulus row from the components' stand-offs, or None without any.

    Rows around a component with a ``standoff`` get
    :func:`calc.flow.eccentricity.eccentricity_from_standoff` at the row's mean inclination;
    the other rows keep the loop's single ``ecc``.

    Examples
    --------
    A vertical-then-60° well with 5 in pipe at stand-off 0.5: rows in the 60° part lie at
    e = 0.5·sin 60° = 0.433, vertical rows at 0:

    >>> import numpy as np
    >>> from calc.bit import Bit
    >>> from calc.geometry import DrillString, Hole, StringComponent, Survey, Well
    >>> sv = Survey([0.0, 1000.0, 1200.0, 3000.0], [0.0, 0.0, 60.0, 60.0], [0.0] * 4)
    >>> pipe = StringComponent("drill pipe", 0.127, 0.1086, "fill", standoff=0.5)
    >>> well = Well(sv, Hole.from_casing([], 3000.0, bit_size=0.2159), DrillString([pipe]),
    ...             Bit(0.2159, "3x12"), bit_depth=3000.0)
    >>> e = annulus_eccentricity(well, 0.0)
    >>> round(float(e.max()), 3), round(float(e.min()), 3)
    (0.433, 0.0)
    """
    comps = _components(well)
    if all(c.standoff is None for c in comps.values()):
        return None
    a = well.flow_intervals().select("annulus")
    so = np.array([np.nan if comps[c].standoff is None else comps[c].standoff for c in a.component])
    inc = np.radians(np.asarray(a.inclination, dtype=float))
    given = np.isfinite(so)
    e = eccentricity_from_standoff(np.where(given, so, 1.0), inc)
    return np.where(given, e, ecc)


def joint_minor_losses(well: Well, Q, R, option: str) -> np.ndarray:
    """(N, string rows) contraction + expansion losses at the tool joints [Pa].

    Each tool-joint row of a component stands for length/tool-joint length joints; the option
    ``"bore_friction"`` gives zeros (:data:`calc.flow.minor_losses.JOINT_LOSS_METHODS`).

    Examples
    --------
    300 m of 5 in pipe (4.276 in bore) in 9.144 m joints with 3.25 in tool-joint bores:
    300/9.144 = 32.8 joints at 8,917 Pa each for 500 gpm of 1,318 kg/m³ mud
    (:func:`calc.flow.minor_losses.joint_minor_loss`):

    >>> import numpy as np
    >>> from calc.bit import Bit
    >>> from calc.geometry import DrillString, Hole, StringComponent, Survey, Well
    >>> dp = StringComponent("drill pipe", 0.127, 0.1086104, 300.0, tool_joint_od=0.1683,
    ...                      tool_joint_id=0.08255, joint_length=9.144, tool_joint_length=0.4572)
    >>> well = Well(Survey([0.0, 300.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole.from_casing([], 300.0, bit_size=0.2159), DrillString([dp]),
    ...             Bit(0.2159, "3x12"), bit_depth=300.0)
    >>> q, rho = np.array([[0.0315451]]), np.array([[1318.0]])
    >>> round(float(joint_minor_losses(well, q, rho, "bore_change_k").sum()))
    292551
    >>> float(joint_minor_losses(well, q, rho, "bore_friction").sum())
    0.0
    """
    s = well.flow_intervals().select("string")
    out = np.zeros((Q.shape[0], len(s.component)))
    if option == "bore_friction":
        return out
    comps = _components(well)
    func = JOINT_LOSS_METHODS.get(option).func
    for j, (name, tj) in enumerate(zip(s.component, s.is_tool_joint, strict=True)):
        c = comps[name]
        if not tj or c.tool_joint_id is None or c.tool_joint_id <= 0 or c.id <= 0:
            continue
        joints = float(s.length[j]) / c.tool_joint_length
        small, large = min(c.tool_joint_id, c.id), max(c.tool_joint_id, c.id)
        out[:, j] = func(Q[:, 0], small, large, R[:, 0], joints)
    return out


def loss_option_notes(rpm: float, joint_losses: str, eccentric_rows: bool) -> list[Note]:
    """Info notes saying which of rotation, stand-off eccentricity and joint losses applied.

    Examples
    --------
    >>> [n.code for n in loss_option_notes(140.0, "bore_friction", False)]
    ['rotation_applied']
    >>> loss_option_notes(0.0, "bore_friction", False)
    []
    """
    notes = []
    if rpm > 0:
        notes.append(
            Note(
                "info",
                "rotation_applied",
                "annular friction includes string rotation at {rpm:.0f} rpm (laminar "
                "helical-flow factor: it lowers the loss of a shear-thinning mud; eccentric "
                "secondary flow and cuttings, which raise it, are not modelled)",
                "annulus",
                values=(Value("rpm", float(rpm)),),
            )
        )
    if eccentric_rows:
        notes.append(
            Note(
                "info",
                "standoff_eccentricity",
                "annulus eccentric where the string has a stand-off: e = (1 - stand-off) x "
                "sin(inclination), Haciislamoglu-Langlinais factor",
                "annulus",
            )
        )
    if joint_losses != "bore_friction":
        notes.append(
            Note(
                "info",
                "joint_minor_losses",
                "string loss includes a sharp contraction and a sudden expansion at every tool "
                "joint (sharp-edged coefficients: an upper bound for tapered joint bores)",
                "string",
            )
        )
    return notes
