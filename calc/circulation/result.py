"""Result objects of the circulating-system calculation: breakdown, ECD/ESD queries, profile."""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field

import numpy as np

from calc.circulation.hydrostatics import equivalent_circulating_density, hydrostatic_pressure
from calc.circulation.pressure_window import MarginTable, PressureWindow, WeakPoint, limits_at
from calc.errors import check_positive, check_range
from calc.notes import Note

__all__ = ["MARGIN_STEP", "CirculationResult", "Profile"]

#: Default spacing of the margin check points and profile grid [m] (≈ 33 ft).
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
    tool_covered : tuple of str
        String components whose bore loss the fixed tool drops include
        (:attr:`calc.geometry.Well.tool_covered`); their rows of ``string_losses`` are zero.
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
    tool_covered: tuple[str, ...]
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
        ecd = np.asarray(self.ecd_at(md))
        names = [""] * md.size
        pore, frac = limits_at(md, tvd, names, self._window, ())
        return Profile(
            md=md,
            tvd=tvd,
            pressure=np.asarray(hydrostatic_pressure(ecd, tvd, hydrostatic=self.hydrostatic)),
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
