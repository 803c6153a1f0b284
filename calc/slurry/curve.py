"""The operating curve of a slurry line: gradient against velocity, its minimum, the
deposition velocity and the pressure over the line at each rate (calc/METHODS.md §25.5).

The pressure over the line is the frictional gradient (horizontal method, the solids' excess
× cos θ for an inclined line, Worster & Denny 1955) times the length, plus the weight of the
mixture column ρ_m·g·Δz.

References
----------
Wilson, Addie, Sellgren & Clift (2006). Slurry Transport Using Centrifugal Pumps, 3rd ed.
Worster, R. C. & Denny, D. F. (1955). Proc. Inst. Mech. Eng. 169, 563-586.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np
from scipy.optimize import minimize_scalar

from calc.errors import InputError, check_choice, check_nonnegative, check_positive, check_range
from calc.notes import Note
from calc.slurry.deposition import DepositionResult, deposition_velocities
from calc.slurry.gradient import settling_gradient
from calc.slurry.homogeneous import carrier_wall_stress
from calc.slurry.methods import DEPOSITION_NAMES, GRADIENT_NAMES
from calc.slurry.settling import PACKING_LIMIT, Carrier, G, Solids
from calc.values import Value

__all__ = [
    "CV_TOLERANCE",
    "SlurryCurve",
    "SlurryLine",
    "operating_curve",
    "volume_concentration",
]


#: largest difference between a given C_v and the one implied by a given slurry density [-]
#: (0.005 ≈ a mud-balance reading of ±0.01 sg on a 1.2 sg slurry; common practice)
CV_TOLERANCE = 0.005


def volume_concentration(slurry_density, carrier_density, solids_density, cv=None):
    """Solids volume fraction from densities, C_v = (ρ_m − ρ_f)/(ρ_s − ρ_f) [-].

    Raises :class:`~calc.errors.InputError` when the slurry density implies a C_v outside
    0 to the packing limit, or differs from a given ``cv`` by more than ``CV_TOLERANCE``.

    Examples
    --------
    >>> round(volume_concentration(1190.0, 1000.0, 2600.0), 6)
    0.11875
    """
    if solids_density <= carrier_density:
        raise InputError(
            "solids density",
            float(solids_density),
            "> the carrier density {rho}",
            kind="density",
            values=(Value("rho", float(carrier_density), "density"),),
        )
    c = float((slurry_density - carrier_density) / (solids_density - carrier_density))
    lo = float(carrier_density)
    hi = float(carrier_density + PACKING_LIMIT * (solids_density - carrier_density))
    if not 0.0 <= c <= PACKING_LIMIT:
        raise InputError(
            "slurry density",
            float(slurry_density),
            "{lo} (carrier alone) to {hi} (solids at the packing limit)",
            kind="density",
            values=(Value("lo", lo, "density"), Value("hi", hi, "density")),
        )
    if cv is not None and abs(c - cv) > CV_TOLERANCE:
        want = float(carrier_density + cv * (solids_density - carrier_density))
        raise InputError(
            "slurry density",
            float(slurry_density),
            "consistent with the solids concentration and densities given: {want}",
            problem="inconsistent",
            kind="density",
            values=(Value("want", want, "density"),),
        )
    return c


@dataclass(frozen=True)
class SlurryLine:
    """A slurry line: pipe ID ``d_pipe`` [m], absolute ``roughness`` [m], ``length`` [m],
    ``inclination`` [° from horizontal, + uphill], ``elevation_change`` [m, outlet above inlet;
    None: length·sin θ], the solids and the carrier, the operating ``rates`` [m³/s] and the
    gradient ``method``.

    Examples
    --------
    >>> line = SlurryLine("l", 0.1, 50.0, Solids(2600.0, 0.1, 2e-4, 4e-4), Carrier.water(),
    ...                   inclination=30.0)
    >>> round(line.rise, 9)  # 50 m at 30° uphill
    25.0
    """

    name: str
    d_pipe: float
    length: float
    solids: Solids
    carrier: Carrier
    rates: tuple[float, ...] = ()
    roughness: float = 4.6e-5  # commercial steel, 0.046 mm (Moody 1944)
    inclination: float = 0.0
    elevation_change: float | None = None
    method: str = "four_component_2006"

    def __post_init__(self):
        check_positive("pipe ID", self.d_pipe, "m")
        check_positive("line length", self.length, "m")
        check_nonnegative("roughness", self.roughness, "m")
        check_range("inclination", self.inclination, -90.0, 90.0, "°")
        check_choice("slurry gradient method", self.method, GRADIENT_NAMES)
        for q in self.rates:
            check_positive("slurry rate", q, "m³/s")
        if self.elevation_change is not None and abs(self.elevation_change) > self.length:
            raise InputError(
                "elevation change",
                float(self.elevation_change),
                "within ± the line length {len}",
                kind="length",
                values=(Value("len", float(self.length), "length"),),
            )
        if self.solids.d50 >= self.d_pipe:
            raise InputError(
                "d50",
                float(self.solids.d50),
                "< the pipe ID {d}",
                kind="diameter",
                values=(Value("d", float(self.d_pipe), "diameter"),),
            )

    @property
    def area(self) -> float:
        return math.pi * self.d_pipe**2 / 4.0

    @property
    def rise(self) -> float:
        """Outlet above inlet [m]."""
        if self.elevation_change is not None:
            return float(self.elevation_change)
        return self.length * math.sin(math.radians(self.inclination))


@dataclass(frozen=True)
class SlurryCurve:
    """The operating curve of a line and its operating points (SI).

    velocity, rate, gradient (frictional [Pa/m]), carrier_gradient [Pa/m], pressure (over the
    line with the static term [Pa]), below_deposition and laminar (per point); the minimum of
    the gradient; the deposition velocities; the operating points at the line's rates.

    Examples
    --------
    >>> line = SlurryLine("l", 0.1, 50.0, Solids(2600.0, 0.1, 2e-4, 4e-4), Carrier.water())
    >>> c = operating_curve(line)
    >>> bool(c.deposition_rate == c.deposition_velocity * line.area)
    True
    """

    line: SlurryLine
    velocity: np.ndarray
    rate: np.ndarray
    gradient: np.ndarray
    carrier_gradient: np.ndarray
    pressure: np.ndarray
    below_deposition: np.ndarray
    laminar: np.ndarray
    minimum_velocity: float
    minimum_gradient: float
    deposition: DepositionResult
    mixture_density: float
    static_pressure: float
    op_rate: np.ndarray
    op_velocity: np.ndarray
    op_gradient: np.ndarray
    op_pressure: np.ndarray
    op_below: np.ndarray
    notes: tuple[Note, ...] = field(default=())

    @property
    def deposition_velocity(self) -> float:
        return self.deposition.velocity

    @property
    def deposition_rate(self) -> float:
        return self.deposition.velocity * self.line.area

    @property
    def methods(self) -> tuple[str, ...]:
        """Names of the :data:`calc.slurry.SLURRY_METHODS` entries this curve used."""
        return (*self.deposition.by_method, self.line.method, "wilson_thomas_1985")


def _gradient(line: SlurryLine, v):
    return settling_gradient(
        v,
        line.d_pipe,
        line.solids,
        line.carrier,
        line.roughness,
        inclination=line.inclination,
        method=line.method,
    )


def operating_curve(line: SlurryLine, points: int = 41, *, deposition_methods=DEPOSITION_NAMES):
    """The operating curve i(V) of a slurry line, its minimum and the deposition velocity.

    Velocities span 0.3·V_D to the larger of 3·V_D and 1.5× the fastest operating rate, spaced
    geometrically; the minimum of the frictional gradient is refined by a bounded scalar
    search.

    Examples
    --------
    A 4 in line of 150 µm solids (C_v 0.12) in water:

    >>> line = SlurryLine("demo", 0.1016, 100.0, Solids(2600.0, 0.12, 150e-6, 300e-6),
    ...                   Carrier.water(), rates=(0.02,))
    >>> c = operating_curve(line)
    >>> c.deposition.governing, round(c.deposition_velocity, 2), bool(c.op_below[0])
    ('wilson_1979_deposition', 1.49, False)
    """
    sub = line.name or "slurry line"
    dep = deposition_velocities(
        line.d_pipe,
        line.solids.d50,
        line.solids.density,
        line.carrier.density,
        line.solids.cv,
        methods=deposition_methods,
        subject=sub,
    )
    vd = dep.velocity
    a = line.area
    v_ops = np.array([q / a for q in line.rates], dtype=float)
    v_hi = max(3.0 * vd, 1.5 * float(v_ops.max()) if v_ops.size else 0.0)
    v_lo = 0.3 * min(vd, float(v_ops.min()) if v_ops.size else vd)
    v = np.geomspace(v_lo, v_hi, points)
    grad = _gradient(line, v)
    tw_c, laminar = carrier_wall_stress(v, line.d_pipe, line.carrier, line.roughness)
    rho_m = line.solids.mixture_density(line.carrier.density)
    static = rho_m * G * line.rise
    k = int(np.argmin(grad))
    lo_b, hi_b = v[max(k - 1, 0)], v[min(k + 1, points - 1)]
    if hi_b > lo_b:
        res = minimize_scalar(
            lambda x: float(_gradient(line, x)),
            bounds=(lo_b, hi_b),
            method="bounded",
            options={"xatol": 1e-6 * vd},
        )
        v_min, g_min = float(res.x), float(res.fun)
    else:
        v_min, g_min = float(v[k]), float(grad[k])
    op_grad = _gradient(line, v_ops) if v_ops.size else np.zeros(0)
    notes = []
    for q, vo in zip(line.rates, v_ops, strict=True):
        if vo < vd:
            notes.append(
                Note(
                    "caution",
                    "slurry_below_deposition",
                    "rate {rate} gives {vel}, below the deposition velocity {vd} ({method}): "
                    "solids settle and may block the line",
                    sub,
                    values=(
                        Value("rate", float(q), "flow_rate"),
                        Value("vel", float(vo), "velocity"),
                        Value("vd", vd, "velocity"),
                        Value("method", dep.governing),
                    ),
                )
            )
    if not line.carrier.newtonian:
        notes.append(
            Note(
                "warning",
                "slurry_non_newtonian_carrier",
                "the settling-slurry methods were fitted to water carriers; applied here with "
                "a Herschel-Bulkley carrier (its friction by Wilson-Thomas)",
                sub,
            )
        )
    if line.inclination != 0.0:
        notes.append(
            Note(
                "info",
                "slurry_inclined_deposition",
                "deposition velocity is that of a horizontal pipe; an inclination of {inc} "
                "can raise it",
                sub,
                values=(Value("inc", float(line.inclination), "angle"),),
            )
        )
    return SlurryCurve(
        line=line,
        velocity=v,
        rate=v * a,
        gradient=grad,
        carrier_gradient=4.0 * tw_c / line.d_pipe,
        pressure=grad * line.length + static,
        below_deposition=v < vd,
        laminar=np.asarray(laminar),
        minimum_velocity=v_min,
        minimum_gradient=g_min,
        deposition=dep,
        mixture_density=rho_m,
        static_pressure=static,
        op_rate=np.array(line.rates, dtype=float),
        op_velocity=v_ops,
        op_gradient=np.asarray(op_grad),
        op_pressure=np.asarray(op_grad) * line.length + static,
        op_below=v_ops < vd,
        notes=tuple(dep.notes) + tuple(notes),
    )
