"""Rheological models: stress and apparent viscosity as functions of shear rate (SI).

=================  =========================================================  =================
model              shear stress τ(γ̇) [Pa] / viscosity η(γ̇) [Pa·s]              source
=================  =========================================================  =================
Newtonian          τ = μγ̇                                                     Newton
Bingham            τ = τy + μp·γ̇                                              Bingham (1916)
PowerLaw           τ = Kγ̇ⁿ                                                    Ostwald–de Waele
HerschelBulkley    τ = τy + Kγ̇ⁿ                                               H&B (1926)
Cross              η = η∞ + (η₀ − η∞)/[1 + (λγ̇)^m]                            Cross (1965)
CarreauYasuda      η = η∞ + (η₀ − η∞)[1 + (λγ̇)^a]^((n−1)/a)                   Yasuda et al. (1981)
=================  =========================================================  =================

The four yield-type models share one formula, τ = τy + Kγ̇ⁿ, through their ``tau_y``, ``k``
and ``n`` attributes (Newtonian: τy = 0, K = μ, n = 1; Bingham: K = μp, n = 1; power law:
τy = 0), so flow code may take any of them as Herschel–Bulkley parameters.  For γ̇ > 0 the
stress of a yield-stress fluid is the flowing branch; at γ̇ = 0 it is τy (the yield limit).

References
----------
Bingham, E.C. (1916) Bull. US Bureau of Standards 13:309.  Herschel, W.H. and Bulkley, R. (1926)
Kolloid-Z. 39:291.  Cross, M.M. (1965) J. Colloid Sci. 20:417.  Carreau, P.J. (1972) Trans. Soc.
Rheol. 16:99.  Yasuda, K., Armstrong, R.C. and Cohen, R.E. (1981) Rheol. Acta 20:163.
"""

from __future__ import annotations

from dataclasses import dataclass, fields
from typing import ClassVar

import numpy as np

from calc.errors import InputError, check_finite
from calc.values import Value

__all__ = [
    "MODEL_TYPES",
    "Bingham",
    "CarreauYasuda",
    "Cross",
    "HerschelBulkley",
    "Model",
    "Newtonian",
    "PowerLaw",
]


def _out(arr):
    return float(arr) if np.ndim(arr) == 0 else arr


def _rates(shear_rate, positive: bool = False) -> np.ndarray:
    g = check_finite("shear rate", shear_rate, "1/s")
    if positive and np.any(g <= 0):
        raise InputError(
            "shear rate",
            float(g[g <= 0].ravel()[0]) if g.ndim else float(g),
            "> 0 1/s (the apparent viscosity of this model is unbounded at zero shear rate)",
        )
    if np.any(g < 0):
        raise InputError("shear rate", float(np.min(g)), ">= 0 1/s")
    return g


def _param(cls_name, name, value, lo=0.0, lo_open=True, hi=None):
    if isinstance(value, (str, bool)) or value is None:
        raise InputError(f"{cls_name} {name}", value, "a number")
    v = float(check_finite(f"{cls_name} {name}", value))
    if (v <= lo if lo_open else v < lo) or (hi is not None and v > hi):
        bound = f"> {lo:g}" if lo_open else f">= {lo:g}"
        raise InputError(f"{cls_name} {name}", v, bound + (f" and <= {hi:g}" if hi else ""))
    return v


class Model:
    """Shared behaviour: ``stress``, ``apparent_viscosity`` and ``parameters``.

    ``symbols`` maps each parameter field to its symbol and quantity kind
    (:data:`calc.kinds.KINDS`; ``""`` for a pure number), so a face can show any model's
    parameters in a unit system without knowing the class (``addin.text.model``).

    Examples
    --------
    Every model answers the same questions; η = τ/γ̇ for all of them:

    >>> m = HerschelBulkley(3.0, 0.5, 0.6)
    >>> bool(np.isclose(m.apparent_viscosity(100.0), m.stress(100.0) / 100.0, rtol=1e-15))
    True
    >>> [v.name for v in m.parameters()]
    ['τy', 'K', 'n']
    """

    name: ClassVar[str] = "model"
    #: parameter field → (symbol, quantity kind of calc.kinds, "" for a pure number)
    symbols: ClassVar[dict[str, tuple[str, str]]] = {}
    n_params: ClassVar[int] = 0

    def stress(self, shear_rate):  # pragma: no cover - overridden
        raise NotImplementedError

    def apparent_viscosity(self, shear_rate):  # pragma: no cover - overridden
        raise NotImplementedError

    def parameters(self) -> tuple[Value, ...]:
        """The parameters in SI, each a :class:`~calc.values.Value` named by its symbol.

        >>> [(v.name, v.value, v.kind) for v in HerschelBulkley(3.0, 0.5, 0.6).parameters()]
        [('τy', 3.0, 'stress'), ('K', 0.5, 'consistency'), ('n', 0.6, '')]
        """
        out = []
        for f in fields(self):
            sym, kind = self.symbols[f.name]
            out.append(Value(sym, float(getattr(self, f.name)), kind))
        return tuple(out)


class _YieldPowerLaw(Model):
    """τ = τy + Kγ̇ⁿ, the one formula behind the four yield-type models."""

    def stress(self, shear_rate):
        """Shear stress τ = τy + Kγ̇ⁿ [Pa] at ``shear_rate`` [1/s] (≥ 0), vectorised."""
        g = _rates(shear_rate)
        return _out(self.tau_y + self.k * g**self.n)

    def apparent_viscosity(self, shear_rate):
        """Apparent viscosity η = τ/γ̇ [Pa·s] at ``shear_rate`` [1/s] (> 0 with a yield stress)."""
        g = _rates(shear_rate, positive=self.tau_y > 0 or self.n < 1)
        if self.tau_y == 0 and self.n >= 1:
            return _out(self.k * g ** (self.n - 1.0))
        return _out(self.tau_y / g + self.k * g ** (self.n - 1.0))

    def shear_rate(self, stress):
        """Shear rate [1/s] at ``stress`` [Pa]: ((τ − τy)/K)^(1/n), 0 where τ ≤ τy."""
        t = check_finite("shear stress", stress, "Pa")
        excess = np.maximum(t - self.tau_y, 0.0)
        return _out((excess / self.k) ** (1.0 / self.n))


@dataclass(frozen=True)
class Newtonian(_YieldPowerLaw):
    """Newtonian fluid, τ = μγ̇.  ``mu`` [Pa·s] > 0.

    Examples
    --------
    >>> Newtonian(0.02).stress(100.0)
    2.0
    """

    mu: float
    name: ClassVar[str] = "Newtonian"
    n_params: ClassVar[int] = 1
    symbols: ClassVar = {"mu": ("μ", "viscosity")}

    def __post_init__(self):
        object.__setattr__(self, "mu", _param(self.name, "μ", self.mu))

    tau_y = property(lambda self: 0.0, doc="Yield stress [Pa] (0).")
    k = property(lambda self: self.mu, doc="Consistency [Pa·sⁿ] (= μ).")
    n = property(lambda self: 1.0, doc="Flow-behaviour index (1).")


@dataclass(frozen=True)
class Bingham(_YieldPowerLaw):
    """Bingham plastic, τ = τy + μp·γ̇.  ``tau_y`` [Pa] ≥ 0, ``mu_p`` [Pa·s] > 0.

    Examples
    --------
    τy = 5 Pa, μp = 20 mPa·s: 5 + 0.02·100 = 7 Pa at 100 1/s; as a Herschel-Bulkley fluid
    K = μp and n = 1:

    >>> b = Bingham(5.0, 0.02)
    >>> round(b.stress(100.0), 12), b.k, b.n
    (7.0, 0.02, 1.0)
    """

    tau_y: float
    mu_p: float
    name: ClassVar[str] = "Bingham"
    n_params: ClassVar[int] = 2
    symbols: ClassVar = {"tau_y": ("τy", "stress"), "mu_p": ("μp", "viscosity")}

    def __post_init__(self):
        object.__setattr__(self, "tau_y", _param(self.name, "τy", self.tau_y, lo_open=False))
        object.__setattr__(self, "mu_p", _param(self.name, "μp", self.mu_p))

    k = property(lambda self: self.mu_p, doc="Consistency [Pa·s] (= μp).")
    n = property(lambda self: 1.0, doc="Flow-behaviour index (1).")


@dataclass(frozen=True)
class PowerLaw(_YieldPowerLaw):
    """Power law, τ = Kγ̇ⁿ.  ``k`` [Pa·sⁿ] > 0, ``n`` [-] > 0.

    Examples
    --------
    K = 0.5 Pa·sⁿ, n = 0.5: τ = 0.5·√100 = 5 Pa and η = 0.05 Pa·s at 100 1/s; no yield stress:

    >>> p = PowerLaw(0.5, 0.5)
    >>> round(p.stress(100.0), 12), round(p.apparent_viscosity(100.0), 12), p.tau_y
    (5.0, 0.05, 0.0)
    """

    k: float
    n: float
    name: ClassVar[str] = "power law"
    n_params: ClassVar[int] = 2
    symbols: ClassVar = {"k": ("K", "consistency"), "n": ("n", "")}

    def __post_init__(self):
        object.__setattr__(self, "k", _param(self.name, "K", self.k))
        object.__setattr__(self, "n", _param(self.name, "n", self.n))

    tau_y = property(lambda self: 0.0, doc="Yield stress [Pa] (0).")


@dataclass(frozen=True)
class HerschelBulkley(_YieldPowerLaw):
    """Herschel–Bulkley, τ = τy + Kγ̇ⁿ.  ``tau_y`` [Pa] ≥ 0, ``k`` [Pa·sⁿ] > 0, ``n`` > 0.

    Examples
    --------
    >>> round(HerschelBulkley(3.0, 0.5, 0.6).stress(100.0), 4)
    10.9245
    """

    tau_y: float
    k: float
    n: float
    name: ClassVar[str] = "Herschel-Bulkley"
    n_params: ClassVar[int] = 3
    symbols: ClassVar = {
        "tau_y": ("τy", "stress"),
        "k": ("K", "consistency"),
        "n": ("n", ""),
    }

    def __post_init__(self):
        object.__setattr__(self, "tau_y", _param(self.name, "τy", self.tau_y, lo_open=False))
        object.__setattr__(self, "k", _param(self.name, "K", self.k))
        object.__setattr__(self, "n", _param(self.name, "n", self.n))


class _Plateau(Model):
    def stress(self, shear_rate):
        """Shear stress τ = η(γ̇)·γ̇ [Pa] at ``shear_rate`` [1/s] (≥ 0)."""
        g = _rates(shear_rate)
        return _out(self._eta(g) * g)

    def apparent_viscosity(self, shear_rate):
        """Viscosity η(γ̇) [Pa·s] at ``shear_rate`` [1/s] (≥ 0; η(0) = η₀)."""
        return _out(self._eta(_rates(shear_rate)))

    def _check_plateaus(self):
        e0 = _param(self.name, "η₀", self.eta0)
        einf = _param(self.name, "η∞", self.eta_inf, lo_open=False)
        if einf >= e0:
            raise InputError(f"{self.name} η∞", einf, f"< η₀ ({e0:g} Pa·s)")
        object.__setattr__(self, "eta0", e0)
        object.__setattr__(self, "eta_inf", einf)
        object.__setattr__(self, "lam", _param(self.name, "λ", self.lam))


@dataclass(frozen=True)
class Cross(_Plateau):
    """Cross (1965): η = η∞ + (η₀ − η∞)/[1 + (λγ̇)^m].

    ``eta0`` > ``eta_inf`` ≥ 0 [Pa·s], ``lam`` [s] > 0, ``m`` [-] > 0.  At high shear
    d ln η / d ln γ̇ → −m (a power law with n = 1 − m) while η ≫ η∞.

    Examples
    --------
    At γ̇ = 1/λ the viscosity is halfway between η₀ and η∞; at rest it is η₀:

    >>> c = Cross(1.0, 0.01, 2.0, 0.7)
    >>> round(c.apparent_viscosity(0.5), 12), round(c.apparent_viscosity(0.0), 12)
    (0.505, 1.0)
    """

    eta0: float
    eta_inf: float
    lam: float
    m: float
    name: ClassVar[str] = "Cross"
    n_params: ClassVar[int] = 4
    symbols: ClassVar = {
        "eta0": ("η₀", "viscosity"),
        "eta_inf": ("η∞", "viscosity"),
        "lam": ("λ", "time"),
        "m": ("m", ""),
    }

    def __post_init__(self):
        self._check_plateaus()
        object.__setattr__(self, "m", _param(self.name, "m", self.m))

    @staticmethod
    def formula(g, eta0, eta_inf, lam, m):
        """η [Pa·s] from the Cross equation (no validation; used by the fits)."""
        return eta_inf + (eta0 - eta_inf) / (1.0 + (lam * g) ** m)

    def _eta(self, g):
        return self.formula(g, self.eta0, self.eta_inf, self.lam, self.m)


@dataclass(frozen=True)
class CarreauYasuda(_Plateau):
    """Carreau–Yasuda: η = η∞ + (η₀ − η∞)[1 + (λγ̇)^a]^((n−1)/a); a = 2 is Carreau (1972).

    ``eta0`` > ``eta_inf`` ≥ 0 [Pa·s], ``lam`` [s] > 0, ``n`` [-] > 0, ``a`` [-] > 0.  At high
    shear d ln η / d ln γ̇ → n − 1 while η ≫ η∞.

    Examples
    --------
    >>> round(CarreauYasuda(1.0, 0.0, 1.0, 0.5).apparent_viscosity(0.0), 6)
    1.0
    """

    eta0: float
    eta_inf: float
    lam: float
    n: float
    a: float = 2.0
    name: ClassVar[str] = "Carreau-Yasuda"
    n_params: ClassVar[int] = 5
    symbols: ClassVar = {
        "eta0": ("η₀", "viscosity"),
        "eta_inf": ("η∞", "viscosity"),
        "lam": ("λ", "time"),
        "n": ("n", ""),
        "a": ("a", ""),
    }

    def __post_init__(self):
        self._check_plateaus()
        object.__setattr__(self, "n", _param(self.name, "n", self.n))
        object.__setattr__(self, "a", _param(self.name, "a", self.a))

    @staticmethod
    def formula(g, eta0, eta_inf, lam, n, a):
        """η [Pa·s] from the Carreau–Yasuda equation (no validation; used by the fits)."""
        return eta_inf + (eta0 - eta_inf) * (1.0 + (lam * g) ** a) ** ((n - 1.0) / a)

    def _eta(self, g):
        return self.formula(g, self.eta0, self.eta_inf, self.lam, self.n, self.a)


MODEL_TYPES = (Newtonian, Bingham, PowerLaw, HerschelBulkley, Cross, CarreauYasuda)
