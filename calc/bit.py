"""Bit hydraulics: nozzles and TFA, nozzle velocity, bit pressure drop, power, HSI, jet impact,
and nozzle selection for maximum bit hydraulic power or maximum jet impact force.

SI throughout (m, m², m³/s, kg/m³, Pa, W, N).  Nozzle sizes are given as the trade designates
them, in whole 32nds of an inch ("12" = 12/32 in); they are converted to metres here.

The governing relations (METHODS §5; SI forms derived from Bernoulli with a discharge
coefficient C_d):

* TFA  A = Σ (π/4)·d_i²
* nozzle (jet) velocity  v_n = Q/A
* bit pressure drop  ΔP_b = ρQ²/(2C_d²A²)
* bit hydraulic power  P_b = ΔP_b·Q;  HSI = P_b/(π d_bit²/4)
* jet impact force  F_j = C_d·Q·√(2ρΔP_b)  (= ρ·Q·C_d·√(2ΔP_b/ρ))

References
----------
.. [1] Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied Drilling
   Engineering*, SPE Textbook Series 2, ch. 4 (bit hydraulics, nozzle selection).
.. [2] Guo, B., Liu, G. (2011). *Applied Drilling Circulation Systems: Hydraulics, Calculations
   and Models*. Gulf Professional Publishing, eqs. 4.15–4.21.
.. [3] Lyons, W.C. (ed.) (1996). *Standard Handbook of Petroleum & Natural Gas Engineering*,
   vol. 1, eqs. 4-77, 4-78, 4-81.
"""

from __future__ import annotations

import itertools
import re
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

import numpy as np

from calc.errors import InputError, Note, check_positive, check_range
from calc.registry import MethodRegistry
from calc.units import from_si, to_si

__all__ = [
    "DEFAULT_DISCHARGE_COEFFICIENT",
    "OPTIMISATION_CRITERIA",
    "TURBULENT_PARASITIC_EXPONENT",
    "Bit",
    "BitHydraulics",
    "NozzleCombination",
    "NozzleOptimum",
    "NozzleSet",
    "ParasiticLoss",
    "bit_hydraulic_power",
    "bit_hydraulics",
    "bit_pressure_drop",
    "fit_parasitic_loss",
    "hsi",
    "impact_force",
    "nozzle_combinations",
    "nozzle_velocity",
    "optimum_nozzles",
    "parasitic_loss_from_model",
    "parse_nozzles",
    "total_flow_area",
]

#: Default nozzle discharge coefficient (METHODS §5; field data suggest up to ≈ 1.03,
#: Robinson 2010, AADE-10-DF-HO-26).
DEFAULT_DISCHARGE_COEFFICIENT = 0.95
#: One 32nd of an inch [m] (exact from in = 0.0254 m).
NOZZLE_UNIT = 0.0254 / 32.0
#: Usual nozzle sizes, 6/32 to 32/32 in (PRACTICE §2.4, common practice).
NOZZLE_RANGE = (6, 32)
#: Nozzle velocity above which a note warns: ~450 ft/s (PRACTICE §3.4, from memory).
JET_VELOCITY_WARN = to_si(450.0, "ft/s")
#: HSI below which a note warns: ~1 hp/in² (PRACTICE §2.3/§3.4, from memory).
HSI_WARN = to_si(1.0, "hp/in**2")
#: Theoretical parasitic-loss exponent for turbulent flow: Blasius' Fanning friction factor
#: f = 0.0791·Re^-0.25 gives Δp ∝ ρ^0.75·μ^0.25·Q^1.75 (Bourgoyne et al. 1986, ch. 4).
TURBULENT_PARASITIC_EXPONENT = 1.75


def _out(x):
    x = np.asarray(x, dtype=float)
    return float(x) if x.ndim == 0 else x


# ------------------------------------------------------------------------------- nozzles
@dataclass(frozen=True)
class NozzleSet:
    """Parsed nozzle sizes (32nds of an inch; 0 = blanked) with their port count and notes."""

    sizes: tuple[int, ...]
    ports: int | None
    notes: tuple[Note, ...] = ()

    @property
    def tfa(self) -> float:
        """Total flow area [m²]."""
        return total_flow_area(self.sizes)


_GROUP = re.compile(r"^\s*(\d+)\s*[x×*]\s*(\d+(?:\.\d*)?)\s*$", re.IGNORECASE)


def _parse_text(text: str) -> list[float]:
    sizes: list[float] = []
    compact = re.sub(r"\s*([x×*])\s*", r"\1", text.strip())
    for part in re.split(r"[,;+\s]+", compact):
        if not part:
            continue
        m = _GROUP.match(part)
        if m:
            sizes.extend([float(m.group(2))] * int(m.group(1)))
            continue
        try:
            sizes.append(float(part))
        except ValueError as exc:
            raise InputError(
                "nozzles", text, "sizes in 32nds such as '12, 12, 11' or '3x12 3x11'"
            ) from exc
    return sizes


def parse_nozzles(nozzles, ports: int | None = None) -> NozzleSet:
    """Read nozzle sizes in 32nds of an inch ("3x12 3x11", "12,12,11", or a list of numbers).

    Parameters
    ----------
    nozzles : str or sequence of int
        Nozzle sizes in 1/32 in; ``"NxS"`` means N nozzles of size S; 0 is a blanked port.
    ports : int, optional
        Number of nozzle ports of the bit; more nozzles than ports is an error.

    Notes
    -----
    Sizes must be whole 32nds (PRACTICE §3.4): ``0.375`` is refused with the hint "12/32?".
    Sizes outside 6–32 and fewer nozzles than ports give notes.

    Examples
    --------
    >>> parse_nozzles("3x12 3x11").sizes
    (12, 12, 12, 11, 11, 11)
    """
    raw = _parse_text(nozzles) if isinstance(nozzles, str) else nozzles
    try:
        arr = np.asarray(raw, dtype=float).ravel()
    except (TypeError, ValueError) as exc:
        raise InputError("nozzles", nozzles, "sizes in 32nds of an inch") from exc
    if arr.size == 0:
        raise InputError("nozzles", nozzles, "at least one nozzle size in 32nds")
    if not np.all(np.isfinite(arr)) or np.any(arr < 0):
        bad = arr[~np.isfinite(arr) | (arr < 0)][0]
        raise InputError("nozzle size", float(bad), "whole 32nds of an inch, >= 0 (0 = blanked)")
    frac = np.abs(arr - np.round(arr)) > 1e-9
    if np.any(frac):
        bad = float(arr[frac][0])
        hint = f" ({bad:g} in → {bad * 32:g}/32?)" if bad < 2 else ""
        raise InputError("nozzle size", bad, f"whole 32nds of an inch, e.g. 12{hint}")
    sizes = tuple(round(x) for x in arr)
    notes: list[Note] = []
    if ports is not None:
        if isinstance(ports, bool) or int(ports) != ports or ports <= 0:
            raise InputError("nozzle ports", ports, "a whole number > 0")
        ports = int(ports)
        if len(sizes) > ports:
            raise InputError(
                "nozzle count",
                f"{len(sizes)} nozzles for {ports} ports ({nozzles!s})",
                f"at most {ports} nozzles (one per port; 0 = blanked)",
                problem="nozzles do not match the port count",
            )
        if len(sizes) < ports:
            notes.append(
                Note(
                    "info",
                    "ports_unlisted",
                    f"{ports - len(sizes)} of {ports} ports have no nozzle listed: "
                    "taken as blanked",
                    "bit",
                )
            )
    lo, hi = NOZZLE_RANGE
    odd = [s for s in sizes if s != 0 and not lo <= s <= hi]
    if odd:
        notes.append(
            Note(
                "warning",
                "unusual_nozzle_size",
                f"nozzle size(s) {odd} /32 in outside the usual 6–32: check the unit",
                "bit",
            )
        )
    if all(s == 0 for s in sizes):
        raise InputError("nozzles", nozzles, "at least one open (non-zero) nozzle")
    return NozzleSet(sizes, ports, tuple(notes))


def total_flow_area(nozzles_32nds, ports: int | None = None):
    """Total flow area [m²] of nozzles given in 32nds of an inch.

    A = Σ (π/4)(N_i·in/32)²; in field units TFA[in²] = Σ N_i²/1303.8 (1303.8 = 4096/π).

    Parameters
    ----------
    nozzles_32nds : str, sequence of int, or 2-D array
        Nozzle sizes [1/32 in] (0 = blanked).  A 2-D integer array is read as one nozzle set
        per row and gives one TFA per row (no text parsing or port check).
    ports : int, optional
        Port count (see :func:`parse_nozzles`).

    Examples
    --------
    >>> round(from_si(total_flow_area([12, 12, 12, 11, 11, 11]), "in**2"), 4)
    0.6098
    """
    if not isinstance(nozzles_32nds, str) and np.ndim(nozzles_32nds) == 2:
        n = np.asarray(nozzles_32nds, dtype=float)
        return np.pi / 4.0 * np.sum((n * NOZZLE_UNIT) ** 2, axis=-1)
    sizes = np.asarray(parse_nozzles(nozzles_32nds, ports).sizes, dtype=float)
    return float(np.pi / 4.0 * np.sum((sizes * NOZZLE_UNIT) ** 2))


# ------------------------------------------------------------------------------- hydraulics
def nozzle_velocity(q, tfa):
    """Mean nozzle (jet) velocity v_n = Q/A [m/s]; ``q`` [m³/s], ``tfa`` [m²].

    Field form v_n[ft/s] = Q[gpm]/(3.117·A[in²]) (Lyons 1996, eq. 4-81).
    """
    return _out(np.asarray(q, dtype=float) / check_positive("TFA", tfa, "m2"))


def bit_pressure_drop(q, density, tfa, discharge_coefficient=DEFAULT_DISCHARGE_COEFFICIENT):
    """Pressure drop across the nozzles ΔP_b = ρQ²/(2C_d²A²) [Pa].

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s].
    density : array_like
        Fluid density [kg/m³].
    tfa : array_like
        Total flow area [m²].
    discharge_coefficient : float
        Nozzle discharge coefficient C_d [-], default 0.95.

    Notes
    -----
    Bernoulli across the nozzle with the jet velocity v = C_d·√(2ΔP/ρ) and continuity
    v = Q/A.  The field form 8.311e-5·ρQ²/(C_d²A²) (psi, ppg, gpm, in²) is this equation in
    field units (Bourgoyne et al. 1986, ch. 4; METHODS §0.1, §5).

    Examples
    --------
    >>> round(bit_pressure_drop(0.03, 1000.0, 2e-4, 1.0) / 1e6, 4)
    11.25
    """
    cd = check_range("discharge coefficient", discharge_coefficient, 0.5, 1.2)
    a = check_positive("TFA", tfa, "m2")
    q = np.asarray(q, dtype=float)
    rho = np.asarray(density, dtype=float)
    return _out(rho * q**2 / (2.0 * cd**2 * a**2))


def bit_hydraulic_power(q, pressure_drop):
    """Hydraulic power spent at the bit P_b = ΔP_b·Q [W] (field: HHP = ΔP·Q/1714, Lyons eq. 4-77).

    ``q`` [m³/s], ``pressure_drop`` [Pa].
    """
    return _out(np.asarray(pressure_drop, dtype=float) * np.asarray(q, dtype=float))


def hsi(power, bit_size):
    """Hydraulic power per bit area HSI = P_b/(π d_bit²/4) [W/m²].

    ``power`` [W], ``bit_size`` [m].  Field: hp/in².
    """
    d = check_positive("bit size", bit_size, "m")
    return _out(np.asarray(power, dtype=float) / (np.pi / 4.0 * d**2))


def impact_force(q, density, pressure_drop, discharge_coefficient=DEFAULT_DISCHARGE_COEFFICIENT):
    """Jet impact force F_j = C_d·Q·√(2ρΔP_b) [N] (the jet's momentum flux ρ·Q·v_jet).

    ``q`` [m³/s], ``density`` [kg/m³], ``pressure_drop`` [Pa].  Field form
    0.01823·C_d·Q·√(ρΔP_b) lbf (Lyons 1996, eq. 4-78; Guo & Liu 2011, eq. 2.89).
    """
    cd = np.asarray(discharge_coefficient, dtype=float)
    q = np.asarray(q, dtype=float)
    dp = np.asarray(pressure_drop, dtype=float)
    rho = np.asarray(density, dtype=float)
    return _out(cd * q * np.sqrt(2.0 * rho * np.maximum(dp, 0.0)))


@dataclass(frozen=True)
class Bit:
    """A bit with its nozzles.

    Parameters
    ----------
    size : float
        Bit diameter [m].
    nozzles : str or sequence of int, optional
        Nozzle sizes in 32nds of an inch (see :func:`parse_nozzles`).
    tfa : float, optional
        Total flow area [m²], when nozzles are not listed (or to cross-check them: a given TFA
        more than 2 % from the nozzles' gives a warning, PRACTICE §3.4).
    discharge_coefficient : float
        Nozzle discharge coefficient [-], default 0.95.
    ports : int, optional
        Number of nozzle ports.
    name : str
    """

    size: float
    nozzles: tuple[int, ...] | str | None = None
    tfa: float | None = None
    discharge_coefficient: float = DEFAULT_DISCHARGE_COEFFICIENT
    ports: int | None = None
    name: str = "bit"
    notes: tuple[Note, ...] = field(init=False, repr=False)

    def __post_init__(self):
        object.__setattr__(self, "size", float(check_positive("bit size", self.size, "m")))
        check_range("discharge coefficient", self.discharge_coefficient, 0.5, 1.2)
        object.__setattr__(self, "discharge_coefficient", float(self.discharge_coefficient))
        notes: list[Note] = []
        if self.nozzles is None and self.tfa is None:
            raise InputError("bit nozzles", None, "nozzle sizes in 32nds, or a TFA")
        if self.nozzles is not None:
            ns = parse_nozzles(self.nozzles, self.ports)
            notes.extend(ns.notes)
            object.__setattr__(self, "nozzles", ns.sizes)
            area = ns.tfa
            if self.tfa is not None:
                given = float(check_positive("TFA", self.tfa, "m2"))
                if abs(given - area) > 0.02 * area:
                    notes.append(
                        Note(
                            "warning",
                            "tfa_mismatch",
                            f"given TFA {from_si(given, 'in**2'):.3f} in² differs from the "
                            f"nozzles' {from_si(area, 'in**2'):.3f} in² by more than 2 %: "
                            "the nozzles are used",
                            self.name,
                        )
                    )
            object.__setattr__(self, "tfa", area)
        else:
            object.__setattr__(self, "tfa", float(check_positive("TFA", self.tfa, "m2")))
        object.__setattr__(self, "notes", tuple(notes))

    @property
    def area(self) -> float:
        """Bit face area π d²/4 [m²]."""
        return np.pi / 4.0 * self.size**2


@dataclass(frozen=True, eq=False)
class BitHydraulics:
    """Bit hydraulics at one or many flow rates (arrays broadcast over the rates given)."""

    flow_rate: np.ndarray | float  # [m³/s]
    density: np.ndarray | float  # [kg/m³]
    tfa: float  # [m²]
    discharge_coefficient: float
    bit_size: float  # [m]
    nozzle_velocity: np.ndarray | float  # [m/s]
    pressure_drop: np.ndarray | float  # [Pa]
    hydraulic_power: np.ndarray | float  # [W]
    hsi: np.ndarray | float  # [W/m²]
    impact_force: np.ndarray | float  # [N]
    standpipe_pressure: np.ndarray | float | None  # [Pa]
    share_of_standpipe: np.ndarray | float | None  # [-]
    method: str = "nozzle Bernoulli with discharge coefficient (Bourgoyne et al. 1986, ch. 4)"
    notes: tuple[Note, ...] = ()


def bit_hydraulics(q, density, bit: Bit, standpipe_pressure=None) -> BitHydraulics:
    """All bit-hydraulics quantities for ``bit`` at flow rate(s) ``q`` [m³/s], ``density`` [kg/m³].

    ``standpipe_pressure`` [Pa], if given, yields the bit's share ΔP_b/p_sp.  Notes warn of a
    nozzle velocity above ~450 ft/s or an HSI below ~1 hp/in² (PRACTICE §3.4, from memory).
    """
    qv = check_positive("flow rate", q, "m3/s")
    rho = check_positive("density", density, "kg/m3")
    cd = bit.discharge_coefficient
    vn = nozzle_velocity(qv, bit.tfa)
    dp = bit_pressure_drop(qv, rho, bit.tfa, cd)
    pw = bit_hydraulic_power(qv, dp)
    h = hsi(pw, bit.size)
    fj = impact_force(qv, rho, dp, cd)
    notes = list(bit.notes)
    share = None
    if standpipe_pressure is not None:
        spp = check_positive("standpipe pressure", standpipe_pressure, "Pa")
        share = _out(np.asarray(dp) / spp)
        if np.any(np.asarray(share) > 1.0):
            notes.append(
                Note(
                    "warning",
                    "bit_above_standpipe",
                    "the bit pressure drop exceeds the standpipe pressure given: check the "
                    "nozzles, the rate and the pressure",
                    bit.name,
                )
            )
        spp = _out(spp)
    else:
        spp = None
    if np.any(np.asarray(vn) > JET_VELOCITY_WARN):
        notes.append(
            Note(
                "warning",
                "high_jet_velocity",
                f"nozzle velocity up to {from_si(np.max(vn), 'ft/s'):.0f} ft/s, above ~450 ft/s: "
                "erosion risk",
                bit.name,
            )
        )
    if np.any(np.asarray(h) < HSI_WARN):
        notes.append(
            Note(
                "warning",
                "low_hsi",
                f"HSI down to {from_si(np.min(h), 'hp/in**2'):.2f} hp/in², below ~1: poor bit "
                "cleaning or balling risk",
                bit.name,
            )
        )
    return BitHydraulics(
        flow_rate=_out(qv),
        density=_out(rho),
        tfa=bit.tfa,
        discharge_coefficient=cd,
        bit_size=bit.size,
        nozzle_velocity=vn,
        pressure_drop=dp,
        hydraulic_power=pw,
        hsi=h,
        impact_force=fj,
        standpipe_pressure=spp,
        share_of_standpipe=share,
        notes=tuple(notes),
    )


# ------------------------------------------------------------------------------- optimisation
@dataclass(frozen=True)
class ParasiticLoss:
    """Parasitic (everything but the bit) pressure loss ΔP_d = c·Q^m at constant mud and string.

    Attributes
    ----------
    c : float
        Coefficient [Pa/(m³/s)^m].
    m : float
        Flow exponent [-]; theory for turbulent flow 1.75 (Blasius), field values ~1.4–1.9
        (from memory, unverified — METHODS §5).
    method : str
        How ``m`` was obtained.
    rates, losses : tuple of float
        The two (Q [m³/s], ΔP_d [Pa]) points used, if any.
    """

    c: float
    m: float
    method: str
    rates: tuple[float, ...] = ()
    losses: tuple[float, ...] = ()
    notes: tuple[Note, ...] = ()

    def loss(self, q):
        """ΔP_d = c·Q^m [Pa] at flow rate(s) ``q`` [m³/s]."""
        return _out(self.c * np.asarray(q, dtype=float) ** self.m)

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
    (Bourgoyne et al. 1986, ch. 4; METHODS §5).

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
        flow_rate=_out(q),
        parasitic_drop=_out(dpd),
        bit_drop=_out(dpb),
        tfa=_out(tfa),
        bit_share=_out(dpb / p),
        hydraulic_power=_out(dpb * q),
        impact_force=impact_force(q, rho, dpb, cd),
        limited_by=lim,
        method=f"{info.description} [{info.source}]",
        notes=tuple(notes),
    )


@dataclass(frozen=True)
class NozzleCombination:
    """A nozzle set from stock: sizes (32nds, largest first), TFA [m²], deviation from target."""

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
