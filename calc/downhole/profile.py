"""Downhole conditions and the ESD/ECD from the local density integrated down the well.

The pressure at TVD z is the integral of the local density:

.. math::

    p(z) = p_0 + \\int_0^z \\rho\\big(T(\\zeta), p(\\zeta)\\big)\\,g\\,d\\zeta
           \\;(+\\,\\Delta p_{ann}(0\\to z)\\ \\text{while circulating})

solved on a grid of measured depths by fixed-point iteration of the trapezoidal integral (the
pressure feeds back into the density; the change per pass shrinks by the factor
g·z·ρ·compressibility ≈ 10⁻³, so a few passes reach rounding level).  ESD and ECD are
p(z)/(g·TVD(z)) (calc/METHODS.md §20).  The static column uses the static temperature; the
circulating column uses the annulus temperature of the circulating model when its inputs are
given, else the static temperature.  The friction losses themselves are those of the
circulation result (at the surface density).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.circulation.hydrostatics import gravity_for
from calc.circulation.result import CirculationResult
from calc.downhole.density import MudComposition, mud_density
from calc.downhole.temperature import (
    CirculatingTemperature,
    TemperatureTable,
    circulating_temperature,
    static_temperature,
)
from calc.errors import InputError, check_positive, check_range
from calc.notes import Note

__all__ = [
    "CirculatingInputs",
    "DownholeConditions",
    "DownholeProfile",
    "column_pressure",
    "downhole_profile",
]


@dataclass(frozen=True)
class CirculatingInputs:
    """Inputs of the circulating-temperature model (Holmes & Swift 1970), SI.

    ``inlet_temperature`` [K]; ``heat_capacity`` [J/(kg·K)]; ``u_pipe``, ``u_annulus``
    [W/(m²·K)]; ``pipe_radius``/``well_radius`` [m] (None: the top string component's OD/2 and
    the bit radius).
    """

    inlet_temperature: float
    heat_capacity: float
    u_pipe: float
    u_annulus: float
    pipe_radius: float | None = None
    well_radius: float | None = None


@dataclass(frozen=True)
class DownholeConditions:
    """Temperatures in the well and the mud's composition: what density at T and p needs.

    ``surface_temperature`` [K] and ``gradient`` [K/m], or ``table``; ``composition`` the
    mud's retort; ``reference_temperature`` [K] where the mud weight was measured (None: the
    surface temperature); ``circulating`` the inputs of the circulating model (None: the
    static temperature also while circulating).

    Examples
    --------
    70 °F (294.26 K) at the surface, 1.5 °F/100 ft (0.02734 K/m): 145 °F at 5,000 ft:

    >>> c = DownholeConditions(MudComposition(0.0, 0.885, 0.115), 294.261, 0.0273403)
    >>> round((c.static_at(1524.0) - 273.15) * 1.8 + 32.0, 1)
    145.0
    """

    composition: MudComposition
    surface_temperature: float | None = None
    gradient: float | None = None
    table: TemperatureTable | None = None
    reference_temperature: float | None = None
    circulating: CirculatingInputs | None = None

    def __post_init__(self):
        if self.table is None and (self.surface_temperature is None or self.gradient is None):
            raise InputError(
                "temperature", "none", "a surface temperature and a gradient, or a table"
            )
        if not isinstance(self.composition, MudComposition):
            raise InputError("composition", type(self.composition).__name__, "a MudComposition")

    @property
    def t_surface(self) -> float:
        """Static temperature at the surface [K]."""
        if self.table is not None:
            return self.table.surface_temperature
        return float(self.surface_temperature)

    @property
    def t_reference(self) -> float:
        """Temperature of the surface mud-weight measurement [K]."""
        return self.t_surface if self.reference_temperature is None else self.reference_temperature

    def static_at(self, tvd):
        """Static temperature [K] at TVD [m]."""
        if self.table is not None:
            return self.table.at(tvd)
        return static_temperature(tvd, self.surface_temperature, self.gradient)

    def density(self, surface_density, temperature, pressure):
        """Mud density [kg/m³] at temperature [K] and gauge pressure [Pa] (per interval later)."""
        return mud_density(
            surface_density, self.composition, temperature, pressure, self.t_reference
        )


def column_pressure(tvd, density_of, *, g: float, extra=0.0, tol: float = 1e-9, max_iter=60):
    """Pressure down a column whose density depends on pressure [Pa].

    .. math:: p_{k+1}(z) = e(z) + \\int_0^z \\rho(\\zeta, p_k(\\zeta))\\,g\\,d\\zeta

    (trapezoidal rule on the grid), iterated to a change below ``tol`` [Pa] (plus 1e-13 of
    the pressure: rounding).

    Parameters
    ----------
    tvd : array_like
        TVD of the grid points [m], starting at the surface, non-decreasing.
    density_of : callable
        p (array, Pa gauge) → density (array, kg/m³) at the grid points.
    g : float
        Gravitational acceleration [m/s²].
    extra : float or array_like
        Pressure added at each point [Pa] (back-pressure and friction above it).

    Examples
    --------
    A constant density gives ρ·g·h exactly:

    >>> p = column_pressure([0.0, 500.0, 1000.0], lambda p: np.full(3, 1000.0), g=9.80665)
    >>> round(float(p[-1]), 3)
    9806650.0
    """
    z = np.asarray(tvd, dtype=float)
    if z.ndim != 1 or z.size < 2 or np.any(np.diff(z) < 0):
        raise InputError("tvd grid", z.size, "two or more non-decreasing depths")
    e = np.broadcast_to(np.asarray(extra, dtype=float), z.shape)
    dz = np.diff(z)
    p = e.copy()
    change = np.inf
    for _ in range(max_iter):
        rho = np.asarray(density_of(p), dtype=float)
        inc = 0.5 * (rho[1:] + rho[:-1]) * g * dz
        new = e + np.concatenate(([0.0], np.cumsum(inc)))
        change = float(np.max(np.abs(new - p)))
        p = new
        if change <= tol + 1e-13 * float(np.max(np.abs(p))):
            return p
    raise InputError("column pressure change per pass", change, f"<= {tol:g} Pa (no convergence)")


@dataclass(frozen=True)
class DownholeProfile:
    """Temperatures, densities, pressures, ESD and ECD down the well, with T/p effects.

    Arrays on the grid ``md``/``tvd`` [m]: ``t_static``, ``t_string``, ``t_annulus`` [K];
    ``rho_static``, ``rho_circulating`` [kg/m³] (local densities); ``p_static``,
    ``p_circulating`` [Pa gauge]; ``esd``, ``ecd`` [kg/m³] with T/p effects (NaN at the
    surface, where no EMW exists); ``esd_surface``, ``ecd_surface`` [kg/m³] the same with the
    surface mud weight everywhere (today's numbers).  ``circulating`` the circulating-model
    result or None; ``notes`` extrapolation notes.
    """

    md: np.ndarray
    tvd: np.ndarray
    t_static: np.ndarray
    t_string: np.ndarray
    t_annulus: np.ndarray
    rho_static: np.ndarray
    rho_circulating: np.ndarray
    p_static: np.ndarray
    p_circulating: np.ndarray
    esd: np.ndarray
    ecd: np.ndarray
    esd_surface: np.ndarray
    ecd_surface: np.ndarray
    circulating: CirculatingTemperature | None
    notes: tuple[Note, ...]

    def at(self, name: str, md):
        """Quantity ``name`` (a field of this profile) interpolated at MD [m]."""
        arr = getattr(self, name)
        x = check_range("md", md, float(self.md[1]) * 0.0, float(self.md[-1]), "m")
        return (
            np.interp(x, self.md[1:], arr[1:])
            if np.ndim(x)
            else float(np.interp(float(x), self.md[1:], arr[1:]))
        )

    @property
    def ecd_bit(self) -> float:
        """ECD at the bit with T/p effects [kg/m³]."""
        return float(self.ecd[-1])

    @property
    def esd_bit(self) -> float:
        """ESD at the bit with T/p effects [kg/m³]."""
        return float(self.esd[-1])


def downhole_profile(
    result: CirculationResult, conditions: DownholeConditions, *, step: float = 30.0, at=()
) -> DownholeProfile:
    """ESD and ECD with the mud's density at downhole temperature and pressure.

    Parameters
    ----------
    result : CirculationResult
        One circulation (scalar rate and density) of :func:`calc.circulation.circulate`.
    conditions : DownholeConditions
        Temperatures and the mud's composition.
    step : float
        Grid spacing in measured depth [m], > 0 (the bit and ``at`` are added).
    at : sequence of float
        Further measured depths to put on the grid [m] (weak points, shoes).

    Returns
    -------
    DownholeProfile

    Notes
    -----
    See the module docstring.  With a mud of solids only (nothing compressible) the profile's
    ESD and ECD equal the surface-mud values exactly.

    References
    ----------
    Sorelle et al. (1982) SPE 11118 (density integrated down a static column);
    Holmes & Swift (1970) *J. Pet. Tech.* 22(6) (circulating temperatures).

    Examples
    --------
    >>> from calc.bit import Bit
    >>> from calc.circulation import circulate, hydraulics_fluid_from_readings
    >>> from calc.downhole.density import MudComposition
    >>> from calc.geometry import DrillString, Hole, HoleSection, StringComponent, Survey, Well
    >>> from calc.rheology import ViscometerReadings
    >>> well = Well(Survey([0.0, 3000.0], [0.0, 0.0], [0.0, 0.0]),
    ...             Hole.from_casing([HoleSection("casing", 0.0, 1500.0, 0.2205)], 3000.0,
    ...                              bit_size=0.2159),
    ...             DrillString([StringComponent("pipe", 0.127, 0.1086, "fill")]),
    ...             Bit(0.2159, "3x12"), bit_depth=3000.0)
    >>> mud = ViscometerReadings.from_mapping({600: 56, 300: 37, 6: 8, 3: 7})
    >>> r = circulate(well, hydraulics_fluid_from_readings(mud, density=1318.0), 0.0315)
    >>> cond = DownholeConditions(MudComposition(0.0, 0.85, 0.15), 294.26, 0.0273)
    >>> prof = downhole_profile(r, cond)
    >>> round(prof.ecd_bit - r.ecd_bit, 1)   # hot water expands more than it is compressed
    -9.9
    """
    if not isinstance(result, CirculationResult):
        raise InputError("result", type(result).__name__, "a CirculationResult")
    if not isinstance(conditions, DownholeConditions):
        raise InputError("conditions", type(conditions).__name__, "DownholeConditions")
    if np.ndim(result.q) or np.ndim(result.density):
        raise InputError("result", np.shape(result.q), "one rate and one density (no sweep)")
    h = float(check_positive("step", step, "m"))
    well = result.context.well
    bit_md = float(result.bit_md)
    extra = [float(x) for x in np.atleast_1d(np.asarray(at, dtype=float)) if 0 < x < bit_md]
    md = np.unique(np.concatenate((np.arange(0.0, bit_md, h), [bit_md], extra)))
    tvd = np.asarray(well.survey.tvd_at(md), dtype=float)
    g = gravity_for(result.hydrostatic)
    rho0 = float(result.density)
    comp = conditions.composition
    t_static = np.asarray(conditions.static_at(tvd), dtype=float)
    circ = None
    t_string = t_annulus = t_static
    if conditions.circulating is not None:
        ci = conditions.circulating
        top = well.string.components[-1]
        rp = ci.pipe_radius if ci.pipe_radius is not None else 0.5 * float(top.od)
        rw = ci.well_radius if ci.well_radius is not None else 0.5 * float(well.bit.size)
        grad = (t_static[-1] - conditions.t_surface) / tvd[-1] if tvd[-1] > 0 else 0.0
        circ = circulating_temperature(
            md, bit_md=bit_md, bit_tvd=float(tvd[-1]), flow_rate=float(result.q), density=rho0,
            heat_capacity=ci.heat_capacity, pipe_radius=rp, well_radius=rw, u_pipe=ci.u_pipe,
            u_annulus=ci.u_annulus, inlet_temperature=ci.inlet_temperature,
            surface_temperature=conditions.t_surface, gradient=max(grad, 0.0),
        )  # fmt: skip
        t_string, t_annulus = circ.string, circ.annulus
    t_ref = conditions.t_reference

    def dens(temp):
        return lambda p: np.asarray(mud_density(rho0, comp, temp, p, t_ref))

    p_static = column_pressure(tvd, dens(t_static), g=g)
    loss = np.concatenate(([0.0], np.asarray(result.annular_loss_above(md[1:]), dtype=float)))
    p_circ = column_pressure(tvd, dens(t_annulus), g=g, extra=result.back_pressure + loss)
    with np.errstate(invalid="ignore", divide="ignore"):
        deep = tvd > 0
        esd = np.where(deep, p_static / (g * np.where(deep, tvd, 1.0)), np.nan)
        ecd = np.where(deep, p_circ / (g * np.where(deep, tvd, 1.0)), np.nan)
    ecd_surface = np.concatenate(([np.nan], np.asarray(result.ecd_at(md[1:]), dtype=float)))
    notes = [*comp.range_notes(np.maximum(t_static, t_annulus), p_circ)]
    if conditions.table is not None:
        notes.extend(conditions.table.notes(tvd))
    return DownholeProfile(
        md=md, tvd=tvd, t_static=t_static, t_string=np.asarray(t_string),
        t_annulus=np.asarray(t_annulus), rho_static=dens(t_static)(p_static),
        rho_circulating=dens(t_annulus)(p_circ), p_static=p_static, p_circulating=p_circ,
        esd=esd, ecd=ecd, esd_surface=np.where(deep, rho0, np.nan), ecd_surface=ecd_surface,
        circulating=circ, notes=tuple(notes),
    )  # fmt: skip
