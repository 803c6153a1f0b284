"""Solids and carrier of a slurry, the particles' terminal velocity and size distribution.

The terminal velocity is the closed form of Ferguson & Church (2004); the size distribution is
log-normal, set by d50 and d85 (calc/METHODS.md §25.2).

References
----------
Ferguson, R. I. & Church, M. (2004). A simple universal equation for grain settling velocity.
J. Sedimentary Research 74(6), 933-937, eq. 4.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from scipy.special import ndtr

from calc.errors import InputError, check_positive, check_range
from calc.values import Value

__all__ = [
    "FC_C1",
    "FC_C2_NATURAL",
    "PACKING_LIMIT",
    "SETTLING_SHEAR_RATE",
    "Z85",
    "Carrier",
    "G",
    "Solids",
    "lognormal_fraction_below",
    "terminal_velocity",
]

#: standard gravity [m/s²] (CGPM 1901, exact)
G = 9.80665
#: Ferguson & Church (2004) constants: C1 = 18 (Stokes), C2 = 1.0 for natural grains measured
#: by sieve (0.4 smooth spheres) — from memory, not checked against the source (§25.2)
FC_C1 = 18.0
FC_C2_NATURAL = 1.0
#: the volume fraction of solids above which a slurry cannot flow as a suspension: random
#: loose-to-close packing of grains is 0.55-0.64 (common practice); 0.6 is used
PACKING_LIMIT = 0.6
#: the standard normal quantile of 85 % (d85 of a log-normal distribution): Φ⁻¹(0.85)
Z85 = 1.0364333894937898
#: shear rate [1/s] at which a Herschel-Bulkley carrier's apparent viscosity is taken for the
#: particles' settling (a stated choice of this program, calc/METHODS.md §25.2)
SETTLING_SHEAR_RATE = 100.0
#: smallest d50 treated as a settling solid [m]: finer solids are part of the carrier
MIN_D50 = 10e-6


@dataclass(frozen=True)
class Carrier:
    """The carrier liquid: density [kg/m³] and Herschel-Bulkley τ = τ_y + K·γ̇ⁿ (τ_y [Pa],
    K [Pa·sⁿ], n [-]); a Newtonian liquid has τ_y = 0, n = 1 and K its viscosity.

    Examples
    --------
    >>> Carrier.water().viscosity_for_settling()
    0.001
    """

    density: float
    tau_y: float = 0.0
    k: float = 1.0e-3
    n: float = 1.0

    def __post_init__(self):
        check_range("carrier density", self.density, 500.0, 3000.0, "kg/m³")
        check_range("carrier yield stress", self.tau_y, 0.0, 500.0, "Pa")
        check_positive("carrier consistency K", self.k, "Pa·s^n")
        check_range("carrier flow index n", self.n, 0.1, 1.5)

    @classmethod
    def water(cls, density: float = 998.2, viscosity: float = 1.0e-3) -> Carrier:
        """Water at about 20 °C (998.2 kg/m³, 1.0 mPa·s; IAPWS values rounded)."""
        return cls(density, 0.0, viscosity, 1.0)

    @property
    def newtonian(self) -> bool:
        return self.tau_y == 0.0 and self.n == 1.0

    def viscosity_for_settling(self) -> float:
        """Apparent viscosity [Pa·s] for the particles' settling: K for a Newtonian liquid,
        (τ_y + K·γ̇ⁿ)/γ̇ at γ̇ = :data:`SETTLING_SHEAR_RATE` otherwise."""
        if self.newtonian:
            return float(self.k)
        g = SETTLING_SHEAR_RATE
        return float((self.tau_y + self.k * g**self.n) / g)


@dataclass(frozen=True)
class Solids:
    """Settling solids: density ρ_s [kg/m³], delivered volume concentration C_v [-], median
    size d50 [m] and d85 [m] (≥ d50) of a log-normal size distribution.

    Examples
    --------
    >>> s = Solids(2600.0, 0.12, 150e-6, 300e-6)
    >>> round(s.sigma_g, 4)  # geometric standard deviation (d85/d50)^(1/z85)
    1.9519
    """

    density: float
    cv: float
    d50: float
    d85: float

    def __post_init__(self):
        check_range("solids density", self.density, 1000.0, 8000.0, "kg/m³")
        check_range("solids volume concentration", self.cv, 0.0, PACKING_LIMIT)
        check_positive("d50", self.d50, "m")
        if self.d50 < MIN_D50:
            raise InputError(
                "d50",
                float(self.d50),
                ">= {lim} (finer solids do not settle: treat them as part of the carrier)",
                kind="diameter",
                values=(Value("lim", MIN_D50, "diameter"),),
            )
        if not self.d85 >= self.d50:
            raise InputError(
                "d85",
                float(self.d85),
                ">= d50 {d50}",
                kind="diameter",
                values=(Value("d50", float(self.d50), "diameter"),),
            )

    @property
    def sigma_g(self) -> float:
        """Geometric standard deviation of the log-normal sizes, (d85/d50)^(1/z85) [-]."""
        return math.exp(math.log(self.d85 / self.d50) / Z85)

    def mixture_density(self, carrier_density: float) -> float:
        """ρ_m = ρ_f + C_v(ρ_s − ρ_f) [kg/m³] (volume average)."""
        return float(carrier_density + self.cv * (self.density - carrier_density))


def lognormal_fraction_below(size, d50, d85):
    """Mass (volume) fraction of a log-normal size distribution finer than ``size`` [-].

    .. math:: F(x) = Φ\\big(z_{85}\\,\\ln(x/d_{50}) / \\ln(d_{85}/d_{50})\\big)

    A one-size solid (d85 = d50) is a step at d50.

    Examples
    --------
    >>> round(float(lognormal_fraction_below(300e-6, 150e-6, 300e-6)), 2)
    0.85
    """
    x = np.asarray(size, dtype=float)
    spread = math.log(d85 / d50)
    if spread == 0.0:
        return np.where(x > d50, 1.0, np.where(x < d50, 0.0, 0.5))
    with np.errstate(divide="ignore"):
        z = Z85 * np.log(np.maximum(x, 0.0) / d50) / spread
    return ndtr(z)


def terminal_velocity(d, solids_density, fluid_density, viscosity, c2=FC_C2_NATURAL):
    """Terminal settling velocity of a grain in a still Newtonian liquid [m/s].

    .. math:: w = \\frac{R g d^2}{C_1 ν + \\sqrt{0.75\\,C_2 R g d^3}}, \\quad
              R = (ρ_s − ρ_f)/ρ_f

    Parameters
    ----------
    d : array_like
        Grain diameter [m].
    solids_density, fluid_density : float
        [kg/m³].
    viscosity : float
        Liquid viscosity [Pa·s].
    c2 : float
        Drag constant: 1.0 natural grains (sieve size), 0.4 smooth spheres.

    Notes
    -----
    Tends to Stokes' law w = (ρ_s−ρ_f)g d²/(18μ) for small grains (exact limit) and to a
    constant drag coefficient C_D = 4C_2/3 for large ones.

    References
    ----------
    Ferguson & Church (2004), J. Sedimentary Research 74(6), eq. 4.

    Examples
    --------
    Stokes' law for a 10 µm quartz grain in water, w ≈ 9.0e-5 m/s:

    >>> float(terminal_velocity(10e-6, 2650.0, 1000.0, 1e-3)) / (1650 * G * 1e-10 / 18e-3)
    ... # doctest: +ELLIPSIS
    0.99...
    """
    d = np.asarray(d, dtype=float)
    r = (solids_density - fluid_density) / fluid_density
    nu = viscosity / fluid_density
    return r * G * d**2 / (FC_C1 * nu + np.sqrt(0.75 * c2 * r * G * d**3))
