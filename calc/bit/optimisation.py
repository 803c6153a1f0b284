"""Nozzle selection: the parasitic-loss law ΔP_d = c·Q^m, the optimum flow rate and TFA for
maximum bit hydraulic power or maximum jet impact force, and nozzle sets from stock.

References
----------
Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied Drilling
Engineering*, SPE Textbook Series 2, ch. 4 (nozzle selection).
Guo, B., Liu, G. (2011). *Applied Drilling Circulation Systems: Hydraulics, Calculations and
Models*. Gulf Professional Publishing, eqs. 4.15–4.21.
"""

from __future__ import annotations

import itertools
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np

from calc.bit.hydraulics import (
    DEFAULT_DISCHARGE_COEFFICIENT,
    bit_pressure_drop,
    impact_force,
)
from calc.bit.nozzles import parse_nozzles, total_flow_area
from calc.errors import InputError, check_positive, check_range
from calc.notes import Note
from calc.numeric import float_or_array
from calc.registry import MethodRegistry
from calc.units import to_si  # noqa: F401  (doctest)

__all__ = [
    "OPTIMISATION_CRITERIA",
    "TURBULENT_PARASITIC_EXPONENT",
    "NozzleCombination",
    "NozzleOptimum",
    "ParasiticLoss",
    "fit_parasitic_loss",
    "nozzle_combinations",
    "optimum_nozzles",
    "parasitic_loss_from_model",
]

#: Theoretical parasitic-loss exponent for turbulent flow: Blasius' Fanning friction factor
#: f = 0.0791·Re^-0.25 gives Δp ∝ ρ^0.75·μ^0.25·Q^1.75 (Bourgoyne et al. 1986, ch. 4).
TURBULENT_PARASITIC_EXPONENT = 1.75


@dataclass(frozen=True)
class ParasiticLoss:
    """Parasitic (everything but the bit) pressure loss ΔP_d = c·Q^m at constant mud and string.

    Attributes
    ----------
    c : float
        Coefficient [Pa/(m³/s)^m].
    m : float
        Flow exponent [-]; theory for turbulent flow 1.75 (Blasius), field values ~1.4–1.9
        (from memory, not yet checked against the source — calc/METHODS.md §8.7).
    method : str
        How ``m`` was obtained.
    rates, losses : tuple of float
        The two (Q [m³/s], ΔP_d [Pa]) points used, if any.

    Examples
    --------
    Through 1,200 psi at 500 gpm with the turbulent exponent 1.75, doubling the rate
    multiplies the loss by 2^1.75 = 3.3636:

    >>> from calc.units import from_si, to_si
    >>> law = ParasiticLoss.turbulent_theory(to_si(500.0, "gpm"), to_si(1200.0, "psi"))
    >>> law.m, round(from_si(law.loss(to_si(1000.0, "gpm")), "psi") / 1200.0, 4)
    (1.75, 3.3636)
    """

    c: float
    m: float
    method: str
    rates: tuple[float, ...] = ()
    losses: tuple[float, ...] = ()
    notes: tuple[Note, ...] = ()

    def loss(self, q):
        """ΔP_d = c·Q^m [Pa] at flow rate(s) ``q`` [m³/s]."""
        return float_or_array(self.c * np.asarray(q, dtype=float) ** self.m)

    @classmethod
    def turbulent_theory(cls, q_ref: float, loss_ref: float) -> ParasiticLoss:
        """m = 1.75 (Blasius turbulent friction) through one known point (Q_ref, ΔP_d,ref)."""
        q = float(check_positive("reference flow rate", q_ref, "m3/s"))
        p = float(check_positive("reference parasitic loss", loss_ref, "Pa"))
        m = TURBULENT_PARASITIC_EXPONENT
        return cls(p / q**m, m, "theory: m = 1.75 (Blasius turbulent friction)", (q,), (p,))


def _two_point(q, dpd, method: str) -> ParasiticLoss:
    q1, q2 = (float(x) for x in q)
    d1, d2 = (float(x) for x in dpd)
    if q1 == q2:
        raise InputError("flow rates", (q1, q2), "two different flow rates")
    for qq, dd in ((q1, d1), (q2, d2)):
        if dd <= 0:
            raise InputError(
                "parasitic loss",
                dd,
                "> 0 Pa (pump pressure above the bit pressure drop)",
                problem=f"not positive at {qq:g} m³/s",
            )
    m = np.log(d2 / d1) / np.log(q2 / q1)
    if m <= 0:
        raise InputError(
            "parasitic-loss exponent", float(m), "> 0 (loss rising with the flow rate)"
        )
    notes = []
    if not 1.4 <= m <= 1.9:
        notes.append(
            Note(
                "warning",
                "unusual_exponent",
                f"parasitic-loss exponent {m:.2f} is outside the usual 1.4–1.9 (from memory): "
                "check the two pump readings",
                "parasitic loss",
            )
        )
    return ParasiticLoss(d1 / q1**m, float(m), method, (q1, q2), (d1, d2), tuple(notes))


def fit_parasitic_loss(
    rates, pressures, density, tfa, discharge_coefficient=DEFAULT_DISCHARGE_COEFFICIENT
) -> ParasiticLoss:
    """Fit ΔP_d = c·Q^m to two measured (rate, pump pressure) pairs with the same nozzles and mud.

    ΔP_d,i = p_i - ΔP_b(Q_i);  m = ln(ΔP_d,2/ΔP_d,1)/ln(Q₂/Q₁);  c = ΔP_d,1/Q₁^m
    (Bourgoyne et al. 1986, ch. 4; calc/METHODS.md §8.7).

    Parameters
    ----------
    rates : (float, float)
        Flow rates [m³/s].
    pressures : (float, float)
        Pump (standpipe) pressures at those rates [Pa].
    density : float
        Mud density [kg/m³].
    tfa : float
        Total flow area of the nozzles in the hole [m²].
    discharge_coefficient : float

    Examples
    --------
    Two pump readings built from a known law (1,500 psi parasitic at 400 gpm, m = 1.75) plus
    the bit drop of 3x12 3x11 nozzles in 11.2 ppg mud: the fit returns that law.

    >>> import numpy as np
    >>> from calc.units import from_si, to_si
    >>> tfa, rho = total_flow_area("3x12 3x11"), to_si(11.2, "ppg")
    >>> q = to_si(np.array([400.0, 522.0]), "gpm")
    >>> p = to_si(1500.0, "psi") * (q / q[0]) ** 1.75 + bit_pressure_drop(q, rho, tfa)
    >>> law = fit_parasitic_loss(q, p, rho, tfa)
    >>> round(law.m, 6), round(from_si(law.loss(q[0]), "psi"), 3)
    (1.75, 1500.0)
    """
    q = check_positive("flow rates", rates, "m3/s").ravel()
    p = check_positive("pump pressures", pressures, "Pa").ravel()
    if q.size != 2 or p.size != 2:
        raise InputError("rate/pressure pairs", (q.size, p.size), "exactly two of each")
    dpb = np.asarray(bit_pressure_drop(q, density, tfa, discharge_coefficient))
    return _two_point(q, p - dpb, "fitted from two measured rate/pressure pairs")


def parasitic_loss_from_model(loss_func: Callable, q_low: float, q_high: float) -> ParasiticLoss:
    """c and m computed from a hydraulics model of the parasitic loss at two rates [m³/s].

    ``loss_func(q)`` takes an array of rates [m³/s] and returns the parasitic loss [Pa]
    (surface lines + string + tools + annulus), e.g. from :mod:`calc.circulation`.

    Examples
    --------
    A loss that is exactly c·Q^1.8 gives back c and m:

    >>> law = parasitic_loss_from_model(lambda q: 2.0e9 * q**1.8, 0.02, 0.04)
    >>> round(law.m, 9), round(float(law.c) / 2.0e9, 9)
    (1.8, 1.0)
    """
    q = check_positive("flow rates", [q_low, q_high], "m3/s")
    dpd = np.asarray(loss_func(q), dtype=float).ravel()
    return _two_point(q, dpd, "computed from the hydraulics model at two rates")


OPTIMISATION_CRITERIA = MethodRegistry("nozzle optimisation criterion")


@OPTIMISATION_CRITERIA.register(
    "max_power",
    "maximum bit hydraulic power: ΔP_d = p/(m + 1), ΔP_b = m·p/(m + 1)",
    "Guo & Liu (2011), eqs. 4.16–4.18; Bourgoyne et al. (1986), ch. 4",
)
def _parasitic_share_power(m):
    return 1.0 / (m + 1.0)


@OPTIMISATION_CRITERIA.register(
    "max_impact",
    "maximum jet impact force: ΔP_d = 2p/(m + 2), ΔP_b = m·p/(m + 2)",
    "Guo & Liu (2011), eqs. 4.19–4.21; Bourgoyne et al. (1986), ch. 4",
)
def _parasitic_share_impact(m):
    return 2.0 / (m + 2.0)


@dataclass(frozen=True, eq=False)
class NozzleOptimum:
    """Optimum hydraulics design for a surface-pressure limit (arrays broadcast over inputs)."""

    criterion: str
    flow_rate: np.ndarray | float  # [m³/s]
    parasitic_drop: np.ndarray | float  # [Pa]
    bit_drop: np.ndarray | float  # [Pa]
    tfa: np.ndarray | float  # [m²]
    bit_share: np.ndarray | float  # ΔP_b / p_max [-]
    hydraulic_power: np.ndarray | float  # [W]
    impact_force: np.ndarray | float  # [N]
    limited_by: np.ndarray | str  # "optimum", "maximum rate" or "minimum rate"
    method: str
    notes: tuple[Note, ...] = ()


def optimum_nozzles(
    max_surface_pressure,
    c,
    m,
    criterion: str = "max_power",
    q_max=None,
    q_min=None,
    density=None,
    discharge_coefficient=DEFAULT_DISCHARGE_COEFFICIENT,
) -> NozzleOptimum:
    """Optimum flow rate, bit pressure drop and TFA at a fixed surface-pressure limit.

    With p the allowed surface pressure and ΔP_d = c·Q^m the parasitic loss:
    max bit power ΔP_d = p/(m + 1); max impact ΔP_d = 2p/(m + 2); Q_opt = (ΔP_d/c)^(1/m);
    Q limited to [q_min, q_max] (at a limit ΔP_b = p - c·Q^m);
    A = Q·√(ρ/(2ΔP_b))/C_d (field A_T = 0.00912·Q·√(ρ/ΔP_b)/C_d).

    Parameters
    ----------
    max_surface_pressure : array_like
        Allowed pump/standpipe pressure p [Pa].
    c, m : array_like
        Parasitic-loss coefficient [Pa/(m³/s)^m] and exponent [-] (see :class:`ParasiticLoss`).
    criterion : {"max_power", "max_impact"}
    q_max : array_like
        Largest rate the pumps give [m³/s].
    q_min : array_like, optional
        Smallest acceptable rate (hole cleaning, motor, PDC cooling) [m³/s]; default 0.
    density : array_like
        Mud density [kg/m³].
    discharge_coefficient : float

    References
    ----------
    Guo & Liu (2011), eqs. 4.15–4.21; Bourgoyne et al. (1986), ch. 4.

    Examples
    --------
    3,000 psi allowed, parasitic loss 1,200 psi at 500 gpm with m = 1.75: for maximum bit power
    the bit takes m/(m + 1) = 0.6364 of the pressure, for maximum impact m/(m + 2) = 0.4667;
    the rates follow from ΔP_d = c·Q^m, Q = 500·(ΔP_d/1200)^(1/1.75) gpm with
    ΔP_d = 3000/2.75 = 1,090.9 psi (473 gpm) and 2·3000/3.75 = 1,600 psi (589 gpm):

    >>> from calc.units import from_si, to_si
    >>> law = ParasiticLoss.turbulent_theory(to_si(500.0, "gpm"), to_si(1200.0, "psi"))
    >>> kw = dict(q_max=to_si(800.0, "gpm"), density=to_si(11.2, "ppg"))
    >>> hp = optimum_nozzles(to_si(3000.0, "psi"), law.c, law.m, "max_power", **kw)
    >>> round(hp.bit_share, 4), round(from_si(hp.flow_rate, "gpm")), hp.limited_by
    (0.6364, 473, 'optimum')
    >>> jet = optimum_nozzles(to_si(3000.0, "psi"), law.c, law.m, "max_impact", **kw)
    >>> round(jet.bit_share, 4), round(from_si(jet.flow_rate, "gpm"))
    (0.4667, 589)
    """
    info = OPTIMISATION_CRITERIA.get(criterion)
    if q_max is None or density is None:
        raise InputError(
            "q_max/density", (q_max, density), "the pump's maximum rate and the mud density"
        )
    p = check_positive("max surface pressure", max_surface_pressure, "Pa")
    c = check_positive("parasitic-loss coefficient c", c)
    m = check_range("parasitic-loss exponent m", m, 0.0, 3.0, lo_open=True)
    qmax = check_positive("maximum flow rate", q_max, "m3/s")
    qmin = np.zeros_like(qmax) if q_min is None else check_positive("minimum flow rate", q_min)
    if np.any(qmin > qmax):
        raise InputError("minimum flow rate", float(np.max(qmin)), "<= maximum flow rate")
    rho = check_positive("density", density, "kg/m3")
    cd = float(check_range("discharge coefficient", discharge_coefficient, 0.5, 1.2))
    q_opt = (info.func(m) * p / c) ** (1.0 / m)
    q = np.clip(q_opt, qmin, qmax)
    limited = np.where(
        q_opt > qmax, "maximum rate", np.where(q_opt < qmin, "minimum rate", "optimum")
    )
    dpd = c * q**m
    dpb = p - dpd
    if np.any(dpb <= 0):
        raise InputError(
            "max surface pressure",
            float(np.min(p)),
            "above the parasitic loss at the chosen rate",
            problem="no pressure left for the bit at the minimum rate",
        )
    tfa = q * np.sqrt(rho / (2.0 * dpb)) / cd
    notes = []
    if np.any(limited == "maximum rate"):
        notes.append(
            Note(
                "info",
                "rate_at_pump_maximum",
                "optimum rate above the pump maximum: rate held at the maximum and nozzles sized "
                "for it (Guo & Liu 2011, eq. 4.15)",
                "nozzle optimisation",
            )
        )
    if np.any(limited == "minimum rate"):
        notes.append(
            Note(
                "info",
                "rate_at_minimum",
                "optimum rate below the minimum acceptable rate: rate held at the minimum",
                "nozzle optimisation",
            )
        )
    lim = str(limited) if limited.ndim == 0 else limited
    return NozzleOptimum(
        criterion=criterion,
        flow_rate=float_or_array(q),
        parasitic_drop=float_or_array(dpd),
        bit_drop=float_or_array(dpb),
        tfa=float_or_array(tfa),
        bit_share=float_or_array(dpb / p),
        hydraulic_power=float_or_array(dpb * q),
        impact_force=impact_force(q, rho, dpb, cd),
        limited_by=lim,
        method=f"{info.description} [{info.source}]",
        notes=tuple(notes),
    )


@dataclass(frozen=True)
class NozzleCombination:
    """A nozzle set from stock: sizes (32nds, largest first), TFA [m²], deviation from target.

    Examples
    --------
    >>> combo = NozzleCombination((12, 12, 12, 11, 11, 11), total_flow_area("3x12 3x11"), 0.0)
    >>> combo.text
    '3x12 3x11'
    """

    sizes: tuple[int, ...]
    tfa: float
    deviation: float  # (tfa - target)/target [-]

    @property
    def text(self) -> str:
        """Trade notation, e.g. ``"3x12 3x11"``."""
        groups = itertools.groupby(self.sizes)
        return " ".join(f"{len(list(g))}x{s}" for s, g in groups)


def nozzle_combinations(
    target_tfa: float, stock_sizes: Sequence[int], count: int, best: int = 5
) -> list[NozzleCombination]:
    """The nozzle sets of ``count`` nozzles from ``stock_sizes`` closest to ``target_tfa`` [m²].

    Every multiset of ``count`` sizes (32nds; 0 = blank, if stocked) is scored by |ΔTFA|;
    ties go to fewer distinct sizes, then to the smaller spread of sizes.

    Examples
    --------
    >>> combo = nozzle_combinations(to_si(0.610, "in**2"), [10, 11, 12, 13], 6)[0]
    >>> combo.text
    '3x12 3x11'
    """
    target = float(check_positive("target TFA", target_tfa, "m2"))
    stock = sorted(set(parse_nozzles(list(stock_sizes)).sizes), reverse=True)
    if isinstance(count, bool) or int(count) != count or not 1 <= count <= 12:
        raise InputError("nozzle count", count, "a whole number from 1 to 12")
    count = int(count)
    n_combos = int(np.prod(range(len(stock), len(stock) + count)) // np.prod(range(1, count + 1)))
    if n_combos > 2_000_000:
        raise InputError("stock sizes", len(stock), "fewer sizes (at most 2 million combinations)")
    combos = np.array(list(itertools.combinations_with_replacement(stock, count)), dtype=float)
    tfa = total_flow_area(combos)
    dev = np.abs(tfa - target)
    distinct = 1 + np.sum(np.diff(combos, axis=1) != 0, axis=1)
    spread = combos[:, 0] - combos[:, -1]
    order = np.lexsort((spread, distinct, np.round(dev / target, 6)))[: int(best)]
    return [
        NozzleCombination(
            tuple(int(s) for s in combos[k]), float(tfa[k]), float((tfa[k] - target) / target)
        )
        for k in order
    ]
