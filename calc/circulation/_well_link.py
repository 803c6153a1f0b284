"""Adapters between the circulation loop and :mod:`calc.geometry`, :mod:`calc.bit`,
:mod:`calc.flow` — the one place that knows their attribute names."""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from calc.hydraulics_method import resolve_method
from calc.units import from_si, unit_for
from calc.units import label as unit_label

__all__ = ["WellParts", "parts"]


@dataclass(frozen=True, eq=False)
class WellParts:
    """The arrays the loop needs, read once from a :class:`calc.geometry.Well`."""

    line_names: tuple[str, ...]
    line_d: np.ndarray
    line_len: np.ndarray
    string_names: tuple[str, ...]
    string_components: tuple[str, ...]
    string_d: np.ndarray
    string_len: np.ndarray
    tools: tuple
    tool_names: tuple[str, ...]
    ann_names: tuple[str, ...]
    ann_components: tuple[str, ...]
    ann_hole: np.ndarray
    ann_pipe: np.ndarray
    ann_len: np.ndarray
    ann_top: np.ndarray
    ann_bottom: np.ndarray
    bit_md: float
    exposed_top: float
    shoe_name: str
    shoe_test: float | None


def depth_span(top: float, bottom: float, system: str = "oilfield") -> str:
    """'MD 6,000-8,200 ft' (oilfield) / 'MD 1828.8-2499.4 m' (metric, si): an MD range [m]
    in the unit system's depth unit.

    >>> depth_span(1828.8, 2499.36)
    'MD 6,000-8,200 ft'
    >>> depth_span(1828.8, 2499.36, "metric")
    'MD 1,828.8-2,499.4 m'
    """
    u = unit_for("depth", system)
    a, b = (float(from_si(float(x), u)) for x in (top, bottom))
    digits = 0 if u == "ft" else 1
    return f"MD {a:,.{digits}f}-{b:,.{digits}f} {unit_label(u)}"


def depth_point(md: float, system: str = "oilfield") -> str:
    """'MD 10,680 ft' (oilfield) / 'MD 3,255.3 m' (metric, si): one MD [m] in the system's unit.

    >>> depth_point(3255.264)
    'MD 10,680 ft'
    """
    u = unit_for("depth", system)
    digits = 0 if u == "ft" else 1
    return f"MD {float(from_si(float(md), u)):,.{digits}f} {unit_label(u)}"


def _row_names(iv, path: str, system: str = "oilfield") -> tuple[str, ...]:
    out = []
    for comp, sec, tj, top, bot in zip(
        iv.component, iv.section, iv.is_tool_joint, iv.top_md, iv.bottom_md, strict=True
    ):
        part = f"{comp} tool joints" if tj else str(comp)
        where = f"{part} in {sec}" if path == "annulus" else part
        out.append(f"{where}, {depth_span(top, bot, system)}")
    return tuple(out)


def parts(well, system: str = "oilfield") -> WellParts:
    """Surface lines, string and annulus rows, tools, bit depth and the exposed-hole top;
    interval names carry their MD range in ``system``'s depth unit."""
    iv = well.flow_intervals()
    s = iv.select("string")
    a = iv.select("annulus")
    lines = tuple(well.surface_lines)
    tools = tuple(well.tool_drops)
    bit_md = float(well.bit_depth)
    cased = [sec for sec in well.hole.sections if not sec.is_open_hole and sec.bottom <= bit_md]
    if cased:
        last = max(cased, key=lambda sec: sec.bottom)
        exposed_top, shoe_name, shoe_test = float(last.bottom), f"{last.name} shoe", last.shoe_test
    else:
        exposed_top, shoe_name, shoe_test = 0.0, "", None
    return WellParts(
        line_names=tuple(x.name for x in lines),
        line_d=np.array([x.id for x in lines], dtype=float),
        line_len=np.array([x.length for x in lines], dtype=float),
        string_names=_row_names(s, "string", system),
        string_components=tuple(str(x) for x in s.component),
        string_d=np.asarray(s.outer_diameter, dtype=float),
        string_len=np.asarray(s.length, dtype=float),
        tools=tools,
        tool_names=tuple(t.name for t in tools),
        ann_names=_row_names(a, "annulus", system),
        ann_components=tuple(f"{c} in {h}" for c, h in zip(a.component, a.section, strict=True)),
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


def check_method(method: str) -> str:
    """The friction law of a hydraulics method (:func:`calc.hydraulics_method.resolve_method`)."""
    return resolve_method(method).friction


def pipe(Q, d, R, params, method):
    from calc.flow import pipe_flow

    ty, k, n = params
    return pipe_flow(Q, d, density=R, tau_y=ty, k=k, n=n, method=method)


def annulus(Q, d_hole, d_pipe, R, params, method, ecc):
    from calc.flow import annulus_flow

    ty, k, n = params
    return annulus_flow(
        Q, d_hole, d_pipe, density=R, tau_y=ty, k=k, n=n, method=method, eccentricity=ecc
    )


def tool_drops(tools, Q, R) -> np.ndarray:
    """(N, T) fixed tool drops [Pa] (each tool's own ∝ ρQ² scaling)."""
    if not tools:
        return np.zeros((Q.shape[0], 0))
    return np.concatenate([np.asarray(t.pressure_drop(Q, R), dtype=float) for t in tools], axis=1)


def tool_window(tool):
    w = getattr(tool, "flow_window", None)
    return (None, None) if w is None else w


def bit_hydraulics(well, q, rho, spp=None):
    from calc.bit import bit_hydraulics as _bh

    return _bh(q, rho, well.bit, standpipe_pressure=spp)


def bit_drop(well, q, rho) -> np.ndarray:
    """Bit pressure drop [Pa] (:func:`calc.bit.bit_pressure_drop`)."""
    from calc.bit import bit_pressure_drop

    b = well.bit
    return np.asarray(bit_pressure_drop(q, rho, b.tfa, b.discharge_coefficient), dtype=float)


def reshape_bit(bit, shape):
    """Give the bit result's per-rate arrays the sweep shape (scalars for a single rate)."""
    changes = {}
    for f in dataclasses.fields(bit):
        v = getattr(bit, f.name)
        if isinstance(v, np.ndarray) and v.ndim == 1:
            r = v.reshape(shape)
            changes[f.name] = float(r) if r.ndim == 0 else r
    return dataclasses.replace(bit, **changes) if changes else bit


#: calc.flow note codes the loop re-issues per named interval (so they are not repeated).
_REISSUED = {"transitional_flow", "below_critical_velocity"}


def flow_notes(flow) -> tuple:
    return tuple(n for n in (getattr(flow, "notes", ()) or ()) if n.code not in _REISSUED)


def method_label(flow) -> str:
    return str(getattr(flow, "method_label", "") or getattr(flow, "method", ""))


def unit_text(kind: str, system: str) -> str:
    return unit_for(kind, system)


def label(unit: str) -> str:
    return unit_label(unit)
