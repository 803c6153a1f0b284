"""Static and circulating temperatures in the well (calc/METHODS.md §20).

Static: the undisturbed formation (geotherm) from a surface temperature and a gradient,
T(z) = T_s + G·z, or a table of TVD and temperature (linear between rows).

Circulating: the steady counter-current heat-exchanger model of Holmes & Swift (1970): mud
flows down the string, up the annulus, exchanges heat with the string through the pipe wall
(overall coefficient U_p on the pipe radius r_p) and with the formation at the geotherm
(overall coefficient U_a on the wellbore radius r_w).  With w·c the heat-capacity rate
[W/K], a = 2π r_p U_p/(w c), b = 2π r_w U_a/(w c) [1/m] and the path coordinate x (0 at the
surface, L at the bit), the energy balances are

.. math::

    \\frac{dT_p}{dx} = a\\,(T_a - T_p),\\qquad
    -\\frac{dT_a}{dx} = b\\,(T_f - T_a) - a\\,(T_a - T_p),\\qquad T_f = T_s + G_x x

with T_p(0) = T_in (the inlet temperature) and T_a(L) = T_p(L) (the bit).  The solution is

.. math::

    T_p = C_1 e^{\\lambda_1 x} + C_2 e^{\\lambda_2 x} + T_s + G_x x - G_x/a,\\qquad
    T_a = C_1(1+\\lambda_1/a) e^{\\lambda_1 x} + C_2(1+\\lambda_2/a) e^{\\lambda_2 x}
          + T_s + G_x x

with λ₁,₂ = (b ± √(b² + 4ab))/2 and C₁, C₂ from the two boundary conditions.  In a deviated
well the formation temperature is taken linear along the measured depth between the surface and
the bit (G_x = G·TVD_bit/MD_bit).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.errors import InputError, check_finite, check_nonnegative, check_positive, check_range
from calc.notes import Note
from calc.numeric import float_or_array
from calc.values import Value

__all__ = [
    "CirculatingTemperature",
    "TemperatureTable",
    "circulating_temperature",
    "static_temperature",
]

#: Largest geothermal gradient accepted [K/m] (0.2 K/m = 11 °F/100 ft, well above volcanic
#: areas' ~0.1 K/m; common practice bound against unit mistakes).
MAX_GRADIENT = 0.2


def _gradient(g) -> float:
    """A geothermal gradient [K/m] in [0, MAX_GRADIENT] (InputError in the user's unit)."""
    v = float(check_finite("geothermal gradient", g, "K/m"))
    if not 0.0 <= v <= MAX_GRADIENT:
        raise InputError(
            "geothermal gradient", v, "from {lo} to {hi} (temperature not falling with depth)",
            kind="temperature_gradient",
            values=(Value("lo", 0.0, "temperature_gradient"),
                    Value("hi", MAX_GRADIENT, "temperature_gradient")),
        )  # fmt: skip
    return v


def _surface(name, t):
    return float(check_range(name, t, 200.0, 700.0, "K"))


def static_temperature(tvd, surface_temperature, gradient):
    """Static formation temperature T = T_s + G·TVD [K].

    Parameters
    ----------
    tvd : float or array_like
        True vertical depth [m], ≥ 0.
    surface_temperature : float
        Mean surface (or mudline) temperature T_s [K].
    gradient : float
        Geothermal gradient G [K/m], 0 ≤ G ≤ 0.2.

    References
    ----------
    Holmes, C.S., Swift, S.C. (1970). Calculation of Circulating Mud Temperatures. *J. Pet.
    Tech.* 22(6), 670–674 (the linear geotherm as the far-field temperature).

    Examples
    --------
    70 °F at the surface and 1.5 °F/100 ft: 145 °F (335.93 K) at 5,000 ft (1,524 m):

    >>> g = 1.5 * (5.0 / 9.0) / (100 * 0.3048)   # 1.5 °F/100 ft in K/m
    >>> round(static_temperature(1524.0, (70 - 32) / 1.8 + 273.15, g), 2)
    335.93
    """
    z = check_nonnegative("tvd", tvd, "m")
    ts = _surface("surface temperature", surface_temperature)
    g = _gradient(gradient)
    return float_or_array(ts + g * z)


@dataclass(frozen=True)
class TemperatureTable:
    """Static temperature from a table of TVD [m] and temperature [K], linear between rows.

    Below the last row the last segment's gradient is continued (``at`` says so with a note).

    Examples
    --------
    >>> tab = TemperatureTable((0.0, 1000.0, 2000.0), (293.15, 318.15, 353.15))
    >>> tab.at(1500.0)
    335.65
    """

    tvd: tuple[float, ...]
    temperature: tuple[float, ...]

    def __post_init__(self):
        z = check_nonnegative("temperature table TVD", self.tvd, "m")
        t = check_range("temperature table temperature", self.temperature, 200.0, 700.0, "K")
        if z.ndim != 1 or z.size < 2 or z.shape != t.shape:
            raise InputError(
                "temperature table", (z.size, t.size), "two or more rows of TVD and temperature"
            )
        if np.any(np.diff(z) <= 0):
            raise InputError("temperature table TVD", self.tvd, "strictly increasing depths")
        grad = np.diff(t) / np.diff(z)
        if np.any(grad < 0):
            bad = float(grad[np.argmax(grad < 0)])
            raise InputError(
                "temperature table gradient", bad, ">= 0 K/m (temperature not falling with depth)"
            )

    @property
    def surface_temperature(self) -> float:
        """Temperature at the first row [K]."""
        return float(self.temperature[0])

    def at(self, tvd):
        """Temperature [K] at TVD [m] (linear; the last gradient continued below the table)."""
        z = check_nonnegative("tvd", tvd, "m")
        zt, tt = np.asarray(self.tvd), np.asarray(self.temperature)
        out = np.interp(z, zt, tt)
        g_last = (tt[-1] - tt[-2]) / (zt[-1] - zt[-2])
        g_first = (tt[1] - tt[0]) / (zt[1] - zt[0])
        out = np.where(z > zt[-1], tt[-1] + g_last * (z - zt[-1]), out)
        out = np.where(z < zt[0], tt[0] - g_first * (zt[0] - z), out)
        return float_or_array(out)

    def notes(self, tvd) -> tuple[Note, ...]:
        """A note where ``tvd`` goes below the table's last row."""
        z = np.asarray(tvd, dtype=float)
        if z.size and float(np.max(z)) > self.tvd[-1]:
            return (
                Note(
                    "warning",
                    "temperature_table_extrapolated",
                    "temperature below the table's last depth {last} continued at its last "
                    "gradient, down to {deepest}",
                    "temperature table",
                    values=(
                        Value("last", float(self.tvd[-1]), "depth"),
                        Value("deepest", float(np.max(z)), "depth"),
                    ),
                ),
            )
        return ()


@dataclass(frozen=True)
class CirculatingTemperature:
    """Steady circulating temperatures along the flow path.

    ``md`` [m] the path coordinate; ``string``, ``annulus``, ``formation`` [K] at each ``md``;
    ``a``, ``b`` [1/m] the exchange parameters; ``inlet`` [K]; ``bit`` [K] T at the bit.
    """

    md: np.ndarray
    string: np.ndarray
    annulus: np.ndarray
    formation: np.ndarray
    a: float
    b: float
    inlet: float
    bit: float

    @property
    def outlet(self) -> float:
        """Annulus temperature at the surface (flow-line temperature) [K]."""
        return float(self.annulus[0])


def circulating_temperature(
    md,
    *,
    bit_md: float,
    bit_tvd: float,
    flow_rate: float,
    density: float,
    heat_capacity: float,
    pipe_radius: float,
    well_radius: float,
    u_pipe: float,
    u_annulus: float,
    inlet_temperature: float,
    surface_temperature: float,
    gradient: float,
) -> CirculatingTemperature:
    """Steady circulating string and annulus temperatures (Holmes & Swift 1970) [K].

    Equations in the module docstring.  ``flow_rate`` = 0 returns the static geotherm.

    Parameters
    ----------
    md : array_like
        Measured depths at which to report [m], 0 ≤ md ≤ ``bit_md``.
    bit_md, bit_tvd : float
        Measured and true vertical depth of the bit [m], > 0.
    flow_rate : float
        Circulating rate [m³/s], ≥ 0.
    density : float
        Mud density [kg/m³], > 0 (with the rate: mass rate w = ρ·Q).
    heat_capacity : float
        Specific heat capacity of the mud c [J/(kg·K)], > 0.
    pipe_radius, well_radius : float
        Outer radius of the string and radius of the wellbore [m], 0 < r_p < r_w.
    u_pipe, u_annulus : float
        Overall heat-transfer coefficients string↔annulus and annulus↔formation [W/(m²·K)], > 0.
    inlet_temperature : float
        Mud temperature entering the string [K].
    surface_temperature : float
        Surface formation temperature T_s [K].
    gradient : float
        Geothermal gradient G [K/m], 0 ≤ G ≤ 0.2.

    Notes
    -----
    Steady state (long circulation), constant properties, no frictional or bit heating, formation
    at the undisturbed geotherm beyond the film (all lumped in U_a).  The two exponentials are
    evaluated scaled (e^{λ₁(x−L)}) so large exchange rates do not overflow.

    References
    ----------
    Holmes, C.S., Swift, S.C. (1970). Calculation of Circulating Mud Temperatures. *J. Pet.
    Tech.* 22(6), 670–674 (the equations here were derived again from the two energy balances;
    the paper's form was not checked: calc/METHODS.md §20).

    Examples
    --------
    Zero flow: the mud takes the geotherm (the static limit):

    >>> r = circulating_temperature([0.0, 3000.0], bit_md=3000.0, bit_tvd=3000.0, flow_rate=0.0,
    ...     density=1200.0, heat_capacity=1675.0, pipe_radius=0.0635, well_radius=0.108,
    ...     u_pipe=500.0, u_annulus=50.0, inlet_temperature=300.0, surface_temperature=294.26,
    ...     gradient=0.0273)
    >>> [round(float(x), 2) for x in r.annulus]
    [294.26, 376.16]
    """
    L = float(check_positive("bit MD", bit_md, "m"))
    tvd_bit = float(check_positive("bit TVD", bit_tvd, "m"))
    x = check_range("md", md, 0.0, L, "m")
    q = float(check_nonnegative("flow rate", flow_rate, "m³/s"))
    rho = float(check_positive("density", density, "kg/m³"))
    c = float(check_positive("heat capacity", heat_capacity, "J/(kg·K)"))
    rp = float(check_positive("pipe radius", pipe_radius, "m"))
    rw = float(check_positive("well radius", well_radius, "m"))
    if rp >= rw:
        raise InputError("pipe radius", rp, "< the well radius {rw}", kind="length",
                         values=(Value("rw", rw, "length"),))  # fmt: skip
    up = float(check_positive("string heat-transfer coefficient", u_pipe, "W/(m²·K)"))
    ua = float(check_positive("annulus heat-transfer coefficient", u_annulus, "W/(m²·K)"))
    t_in = _surface("inlet temperature", inlet_temperature)
    ts = _surface("surface temperature", surface_temperature)
    g = _gradient(gradient)
    gx = g * tvd_bit / L
    tf = ts + gx * x
    if q == 0.0:
        tf = np.asarray(check_finite("formation temperature", tf))
        return CirculatingTemperature(x, tf.copy(), tf.copy(), tf, np.inf, np.inf, t_in,
                                      float(ts + gx * L))  # fmt: skip
    wc = rho * q * c
    a = 2.0 * np.pi * rp * up / wc
    b = 2.0 * np.pi * rw * ua / wc
    root = np.sqrt(b * b + 4.0 * a * b)
    l1, l2 = 0.5 * (b + root), 0.5 * (b - root)
    # unknowns D1 = C1·e^{λ1 L}, C2:  Tp(0) = T_in;  λ1 D1 + λ2 C2 e^{λ2 L} = -G_x (Ta = Tp at L)
    m = np.array([[np.exp(-l1 * L), 1.0], [l1, l2 * np.exp(l2 * L)]])
    rhs = np.array([t_in - ts + gx / a, -gx])
    d1, c2 = np.linalg.solve(m, rhs)
    e1, e2 = d1 * np.exp(l1 * (x - L)), c2 * np.exp(l2 * x)
    tp = e1 + e2 + ts + gx * x - gx / a
    ta = e1 * (1.0 + l1 / a) + e2 * (1.0 + l2 / a) + ts + gx * x
    t_bit = float(d1 + c2 * np.exp(l2 * L) + ts + gx * L - gx / a)
    return CirculatingTemperature(x, tp, ta, tf, float(a), float(b), t_in, t_bit)
