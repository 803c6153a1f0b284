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
from calc.geometry import ToolPressureDrop, Well
from calc.hydraulics_method import resolve_method
from calc.notes import Note
from calc.span import Span

__all__ = [
    "REISSUED_FLOW_NOTES",
    "WellParts",
    "annulus",
    "bit_drop",
    "bit_hydraulics",
    "check_method",
    "flow_notes",
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


def annulus(Q, d_hole, d_pipe, R, params, method, ecc, constants="exact"):
    """:func:`calc.flow.annulus_flow` with the fluid's (τy, K, n) and the eccentricity."""
    ty, k, n = params
    return annulus_flow(
        Q, d_hole, d_pipe, density=R, tau_y=ty, k=k, n=n, method=method, eccentricity=ecc,
        constants=constants,
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
