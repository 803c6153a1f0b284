"""Surface lines (standpipe, hose, swivel/top drive as pipe runs) and fixed tool pressure drops.

SI throughout: lengths and diameters m, densities kg/m³, flow rates m³/s, pressures Pa.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, check_positive
from calc.notes import Note
from calc.values import Value

__all__ = ["SurfaceLine", "ToolPressureDrop"]


@dataclass(frozen=True)
class SurfaceLine:
    """A surface-equipment pipe run between the pump manifold and the string.

    Parameters
    ----------
    name : str
    length : float
        Length [m] (an actual run, or an equivalent length of a chosen ID).
    id : float
        Inside diameter [m].
    """

    name: str
    length: float
    id: float

    def __post_init__(self):
        object.__setattr__(
            self, "length", float(check_positive(f"length of '{self.name}'", self.length, "m"))
        )
        object.__setattr__(self, "id", float(check_positive(f"ID of '{self.name}'", self.id, "m")))


@dataclass(frozen=True)
class ToolPressureDrop:
    """A fixed downhole-tool pressure drop (motor, MWD/LWD, RSS) from the supplier's sheet.

    Scaled from the reference point as ΔP = ΔP_ref·(ρ/ρ_ref)·(Q/Q_ref)², the usual scaling of
    supplier sheets for turbulent, orifice-like losses (common practice).

    Parameters
    ----------
    reference_drop : float
        Pressure drop at the reference point [Pa].
    reference_density : float
        Fluid density of the reference point [kg/m³].
    reference_rate : float
        Flow rate of the reference point [m³/s].
    flow_window : (float, float), optional
        Supplier's allowed flow-rate range [m³/s]; rates outside it get a warning note.
    name : str
    components : sequence of str
        Names of the drill-string components whose bore loss the supplier's figure already
        includes (a supplier's drop for an MWD, RSS or motor usually covers the tool's whole
        internal loss).  :func:`calc.circulation.circulate` then adds no bore friction for
        them; :class:`calc.geometry.Well` checks the names against its string.  Empty (the
        default): the figure is taken as an extra loss on top of the bore friction.

    Notes
    -----
    Which bore losses a supplier's figure covers is the user's statement from the supplier's
    sheet; getting it wrong double-counts (or omits) the tools' bore friction in the standpipe
    pressure.  It does not change the annulus, so ECD is unaffected.

    Examples
    --------
    >>> t = ToolPressureDrop(2.0e6, 1300.0, 0.03)
    >>> round(t.pressure_drop(0.06, 1300.0) / 1e6, 6)
    8.0
    >>> ToolPressureDrop(2.0e6, 1300.0, 0.03, components=["MWD"]).components
    ('MWD',)
    """

    reference_drop: float
    reference_density: float
    reference_rate: float
    flow_window: tuple[float, float] | None = None
    name: str = "downhole tools"
    components: tuple[str, ...] = ()
    method: str = field(default="supplier sheet scaled ∝ ρQ² (common practice)", init=False)

    def __post_init__(self):
        w = self.name
        for attr, unit in (
            ("reference_drop", "Pa"),
            ("reference_density", "kg/m3"),
            ("reference_rate", "m3/s"),
        ):
            v = check_positive(f"{attr.replace('_', ' ')} of '{w}'", getattr(self, attr), unit)
            object.__setattr__(self, attr, float(v))
        if self.flow_window is not None:
            lo, hi = (float(x) for x in check_positive(f"flow window of '{w}'", self.flow_window))
            if not lo < hi:
                raise InputError(f"flow window of '{w}'", (lo, hi), "(low, high) with low < high")
            object.__setattr__(self, "flow_window", (lo, hi))
        comps = (self.components,) if isinstance(self.components, str) else self.components
        try:
            comps = tuple(comps)
        except TypeError as exc:
            raise InputError(
                f"components of '{w}'", comps, "a list of string-component names"
            ) from exc
        for c in comps:
            if not isinstance(c, str) or not c.strip():
                raise InputError(f"components of '{w}'", c, "string-component names (text)")
        if len(set(comps)) != len(comps):
            raise InputError(f"components of '{w}'", comps, "each component named once")
        object.__setattr__(self, "components", comps)

    def pressure_drop(self, q, density):
        """Pressure drop [Pa] at flow rate(s) ``q`` [m³/s] and density ``density`` [kg/m³]."""
        qv = np.asarray(q, dtype=float)
        rho = np.asarray(density, dtype=float)
        out = self.reference_drop * (rho / self.reference_density) * (qv / self.reference_rate) ** 2
        return float(out) if np.ndim(out) == 0 else out

    def rate_notes(self, q) -> tuple[Note, ...]:
        """A warning note when any rate in ``q`` [m³/s] is outside the flow window."""
        if self.flow_window is None:
            return ()
        qv = np.asarray(q, dtype=float)
        lo, hi = self.flow_window
        out = (qv < lo) | (qv > hi)
        if not np.any(out):
            return ()
        bad = float(qv[out].ravel()[0]) if qv.ndim else float(qv)
        return (
            Note(
                "warning",
                "tool_flow_window",
                "flow rate {q} is outside the tool's window {window}: the scaled drop is an "
                "extrapolation and the tool may not work",
                self.name,
                values=(Value("q", bad, "flow_rate"), Value("window", (lo, hi), "flow_rate")),
            ),
        )
