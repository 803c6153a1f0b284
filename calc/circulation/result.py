"""Result objects of the circulating-system calculation: losses per flow path, ECD/ESD queries,
profile.

Shapes: for one rate every per-rate quantity is a float and every per-row quantity a 1-d array
over the rows; for a sweep the sweep's axes lead (shape of ``q`` broadcast with the density)
and per-row quantities add a last axis over the rows.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from calc.bit import BitHydraulics
from calc.circulation.hydrostatics import equivalent_circulating_density, hydrostatic_pressure
from calc.circulation.pore_fracture import MarginTable, PressureWindow, WeakPoint, limits_at
from calc.errors import check_positive, check_range
from calc.flow import FlowResult
from calc.geometry import Well
from calc.notes import Note
from calc.numeric import depth_weights
from calc.span import Span

__all__ = [
    "BREAKDOWN_KEYS",
    "MARGIN_STEP",
    "CirculationResult",
    "LoopContext",
    "PathLosses",
    "Profile",
    "ToolLosses",
    "as_scalar",
    "reshape_flow",
]

#: Default spacing of the margin check points and profile grid [m] (≈ 33 ft).
MARGIN_STEP = 10.0

#: Keys of :meth:`CirculationResult.breakdown`, in flow order.
BREAKDOWN_KEYS = ("back_pressure", "surface", "string", "tools", "bit", "annulus")


def as_scalar(x):
    """A 0-d array as a Python scalar; other arrays unchanged."""
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
class PathLosses:
    """Friction along one flow path (surface lines, drill string or annulus), row by row.

    Attributes
    ----------
    spans : tuple of Span
        Where each row lies (string and annulus bit up; surface lines in flow order).
    losses : ndarray
        Friction loss of each row [Pa] (sweep axes + rows).
    total : float or ndarray
        Sum over the rows [Pa].
    flow : FlowResult or None
        :mod:`calc.flow` result per row (velocity, regime, Reynolds number, gradient …;
        sweep axes + rows); None for a path without rows (no surface lines).
    """

    spans: tuple[Span, ...]
    losses: np.ndarray
    total: float | np.ndarray
    flow: FlowResult | None

    @property
    def top_md(self) -> np.ndarray:
        """Top MD of each row [m] (NaN for rows without depth)."""
        return np.array([np.nan if s.top_md is None else s.top_md for s in self.spans])

    @property
    def bottom_md(self) -> np.ndarray:
        """Bottom MD of each row [m] (NaN for rows without depth)."""
        return np.array([np.nan if s.bottom_md is None else s.bottom_md for s in self.spans])


@dataclass(frozen=True, eq=False)
class ToolLosses:
    """The suppliers' fixed tool drops (∝ ρQ²).

    ``spans`` one per tool (path ``"tools"``, the tool's name); ``losses`` [Pa] per tool
    (sweep axes + tools); ``total`` [Pa]; ``covered``: string components whose bore loss the
    drops include (:attr:`calc.geometry.Well.tool_covered`; their rows of the string losses are
    zero).
    """

    spans: tuple[Span, ...]
    covered: tuple[str, ...]
    losses: np.ndarray
    total: float | np.ndarray


@dataclass(frozen=True, eq=False)
class LoopContext:
    """What the ECD/ESD queries and the profile need besides the losses: the well, the
    pore/fracture window (or None), the weak points checked, and the MD span of each annulus
    row [m]."""

    well: Well
    window: PressureWindow | None
    weak_points: tuple[WeakPoint, ...]
    annulus_top: np.ndarray
    annulus_bottom: np.ndarray


@dataclass(frozen=True, eq=False)
class CirculationResult:
    """Standpipe-pressure breakdown, bottom-hole pressures, ECD and margins.

    Pressures [Pa], densities [kg/m³], depths [m], power [W], rates [m³/s] (shapes: module
    docstring).

    Attributes
    ----------
    method : str
        Friction method (``calc.flow`` name and label) and the fluid's fits.
    fluid_label, hydrostatic : str
        The fluid's label; the hydrostatic convention ("exact" or "0.052").
    friction_multiplier : float or ndarray
        Calibration factor applied to surface, string and annular friction [-].
    eccentricity : float
        Pipe offset in the annulus [-].
    back_pressure : float
        Surface annular back-pressure [Pa].
    q, density : float or ndarray
        Flow rate [m³/s] and density [kg/m³] of each sweep point.
    standpipe_pressure : float or ndarray
        back_pressure + surface.total + string.total + tools.total + bit.pressure_drop +
        annulus.total [Pa].
    surface, string, annulus : PathLosses
        Friction per surface line, string interval and annular interval (bit up), their totals
        and the per-row flow results.
    tools : ToolLosses
        Fixed tool drops and the string components they cover.
    bit : BitHydraulics
        Bit result of :mod:`calc.bit` (``bit.pressure_drop`` the bit's share of the SPP).
    bit_md, bit_tvd : float
        Bit depth [m].
    static_bhp, circulating_bhp : float or ndarray
        ρ·g·TVD_bit and static_bhp + annulus.total + back_pressure [Pa].
    esd_bit, ecd_bit : float or ndarray
        Equivalent densities at the bit [kg/m³].
    pump_power : float or ndarray
        Hydraulic power at the standpipe, SPP·Q [W].
    margins : MarginTable or None
        Margins at the check points (last shoe to bit and weak points) and the tightest point.
    context : LoopContext
        Well, window, weak points and annulus row depths (for :meth:`ecd_at`, :meth:`profile`).
    notes : tuple of Note
    rpm : float
        String rotary speed used for the annular rotation factor [rpm] (0: none).
    joint_losses : str
        Tool-joint loss option (:data:`calc.flow.minor_losses.JOINT_LOSS_OPTIONS`).
    annulus_eccentricity : ndarray or None
        Eccentricity per annulus row [-] where stand-offs set it (None: ``eccentricity``
        everywhere).
    """

    method: str
    fluid_label: str
    hydrostatic: str
    friction_multiplier: float | np.ndarray
    eccentricity: float
    back_pressure: float
    q: float | np.ndarray
    density: float | np.ndarray
    standpipe_pressure: float | np.ndarray
    surface: PathLosses
    string: PathLosses
    tools: ToolLosses
    bit: BitHydraulics
    annulus: PathLosses
    bit_md: float
    bit_tvd: float
    static_bhp: float | np.ndarray
    circulating_bhp: float | np.ndarray
    esd_bit: float | np.ndarray
    ecd_bit: float | np.ndarray
    pump_power: float | np.ndarray
    margins: MarginTable | None
    context: LoopContext
    notes: tuple[Note, ...]
    rpm: float = 0.0
    joint_losses: str = "bore_friction"
    annulus_eccentricity: np.ndarray | None = None

    # ------------------------------------------------------------------ derived quantities
    @property
    def frictional_loss(self) -> float | np.ndarray:
        """Surface + string + annulus friction [Pa] (what ``friction_multiplier`` scales)."""
        return as_scalar(
            np.asarray(self.surface.total) + self.string.total + np.asarray(self.annulus.total)
        )

    @property
    def bit_share(self) -> float | np.ndarray:
        """Share of the standpipe pressure spent at the bit [-]."""
        return as_scalar(np.asarray(self.bit.pressure_drop) / self.standpipe_pressure)

    def breakdown(self) -> dict[str, float | np.ndarray]:
        """Standpipe-pressure components [Pa], in flow order, summing to ``standpipe_pressure``.

        Keys (:data:`BREAKDOWN_KEYS`): ``back_pressure``, ``surface``, ``string``, ``tools``,
        ``bit``, ``annulus``.
        """
        return {
            "back_pressure": self.back_pressure,
            "surface": self.surface.total,
            "string": self.string.total,
            "tools": self.tools.total,
            "bit": self.bit.pressure_drop,
            "annulus": self.annulus.total,
        }

    def shares(self) -> dict[str, float | np.ndarray]:
        """Share of the standpipe pressure of each :meth:`breakdown` part [-] (same keys)."""
        spp = np.asarray(self.standpipe_pressure, dtype=float)
        return {k: as_scalar(np.asarray(v, dtype=float) / spp) for k, v in self.breakdown().items()}

    def annular_loss_above(self, md):
        """Annular friction between the surface and ``md`` [Pa] (linear within each interval)."""
        mdv = np.asarray(md, dtype=float)
        ctx = self.context
        w = depth_weights(mdv.ravel(), ctx.annulus_top, ctx.annulus_bottom)
        p = np.asarray(self.annulus.losses) @ w.T
        return as_scalar(p.reshape(np.shape(self.standpipe_pressure) + mdv.shape))

    def _check_md(self, md):
        return check_range("MD", md, 0.0, self.bit_md, "m", lo_open=True)

    def ecd_at(self, md):
        """ECD [kg/m³] at measured depth(s) ``md`` [m], 0 < md ≤ bit depth.

        ECD = ρ + (Δp_ann above md + p_back)/(g·TVD(md)).  Result shape: sweep axes + md axes.
        """
        mdv = self._check_md(md)
        tvd = np.asarray(self.context.well.survey.tvd_at(mdv), dtype=float)
        rho = np.asarray(self.density, dtype=float).reshape(
            np.shape(self.density) + (1,) * mdv.ndim
        )
        return as_scalar(
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
        return as_scalar(np.broadcast_to(rho, np.shape(self.density) + mdv.shape).copy())

    def profile(self, step: float = MARGIN_STEP) -> Profile:
        """ESD, ECD, pressure, pore and fracture on an MD grid from ``step`` to the bit [m].

        The grid (:meth:`calc.geometry.Well.annulus_depth_grid`) holds every interval boundary,
        so the piecewise-linear annular pressure is exact at the grid points.
        """
        step = float(check_positive("profile step", step, "m"))
        grid = self.context.well.annulus_depth_grid(step)
        keep = grid.md > 0
        md = np.asarray(grid.md[keep], dtype=float)
        tvd = np.asarray(grid.tvd[keep], dtype=float)
        ecd = np.asarray(self.ecd_at(md))
        names = [""] * md.size
        pore, frac = limits_at(md, tvd, names, self.context.window, ())
        return Profile(
            md=md,
            tvd=tvd,
            pressure=np.asarray(hydrostatic_pressure(ecd, tvd, hydrostatic=self.hydrostatic)),
            esd=np.asarray(self.esd_at(md)),
            ecd=ecd,
            pore=pore,
            fracture=frac,
        )


def reshape_flow(fr: FlowResult | None, shape) -> FlowResult | None:
    """Give every array field of a FlowResult computed on (N, I) the sweep shape + (I,)."""
    if fr is None:
        return None
    changes = {}
    for f in dataclasses.fields(fr):
        v = getattr(fr, f.name)
        if isinstance(v, np.ndarray) and v.ndim == 2:
            changes[f.name] = v.reshape(shape + v.shape[1:])
    return dataclasses.replace(fr, **changes) if changes else fr
