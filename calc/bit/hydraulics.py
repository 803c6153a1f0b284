"""Bit hydraulics: nozzle velocity, bit pressure drop, hydraulic power, HSI, jet impact force,
the :class:`Bit` and the per-rate :func:`bit_hydraulics` summary.

* nozzle (jet) velocity  v_n = Q/A
* bit pressure drop  ΔP_b = ρQ²/(2C_d²A²)
* bit hydraulic power  P_b = ΔP_b·Q;  HSI = P_b/(π d_bit²/4)
* jet impact force  F_j = C_d·Q·√(2ρΔP_b)

References
----------
Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E., Young, F.S. (1986). *Applied Drilling
Engineering*, SPE Textbook Series 2, ch. 4.
Lyons, W.C. (ed.) (1996). *Standard Handbook of Petroleum & Natural Gas Engineering*, vol. 1,
eqs. 4-77, 4-78, 4-81.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.bit.nozzles import parse_nozzles
from calc.errors import InputError, check_positive, check_range
from calc.flow.area import cross_section_area
from calc.flow.methods_api import api95_constants
from calc.notes import Note
from calc.numeric import float_or_array
from calc.units import to_si
from calc.values import Value

__all__ = [
    "DEFAULT_DISCHARGE_COEFFICIENT",
    "HSI_WARN",
    "JET_VELOCITY_WARN",
    "Bit",
    "BitHydraulics",
    "bit_hydraulic_power",
    "bit_hydraulics",
    "bit_pressure_drop",
    "hsi",
    "impact_force",
    "nozzle_velocity",
]

#: Default nozzle discharge coefficient (calc/METHODS.md §8.3; field data suggest up to
#: ≈ 1.03,
#: Robinson 2010, AADE-10-DF-HO-26).
DEFAULT_DISCHARGE_COEFFICIENT = 0.95
#: Nozzle velocity above which a note warns: ~450 ft/s (common practice, from memory —
#: calc/METHODS.md §16.4).
JET_VELOCITY_WARN = to_si(450.0, "ft/s")
#: HSI below which a note warns: ~1 hp/in² (common practice, from memory —
#: calc/METHODS.md §16.4).
HSI_WARN = to_si(1.0, "hp/in**2")


def nozzle_velocity(q, tfa):
    """Mean nozzle (jet) velocity v_n = Q/A [m/s]; ``q`` [m³/s], ``tfa`` [m²].

    Field form v_n[ft/s] = Q[gpm]/(3.117·A[in²]) (Lyons 1996, eq. 4-81).

    Examples
    --------
    0.03 m³/s through 2 cm² is 150 m/s; in field units the SI form reproduces Lyons' 3.117
    (522 gpm through 0.6098 in², six nozzles 3x12 3x11):

    >>> nozzle_velocity(0.03, 2e-4)
    150.0
    >>> from calc.units import from_si, to_si
    >>> v = from_si(nozzle_velocity(to_si(522.0, "gpm"), to_si(0.6098, "in**2")), "ft/s")
    >>> round(v, 1), round(522.0 / (3.117 * 0.6098), 1)
    (274.6, 274.6)
    """
    return float_or_array(np.asarray(q, dtype=float) / check_positive("TFA", tfa, "m2"))


def bit_pressure_drop(
    q, density, tfa, discharge_coefficient=DEFAULT_DISCHARGE_COEFFICIENT, constants="exact"
):
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
    constants : str
        ``"exact"``, or ``"as_printed"`` for the API RP 13D (1995) printed form
        ΔP = 156ρQ²/(ΣD_N²)² (psi, ppg, gpm, nozzles in 32nds): the Bernoulli drop times
        156/156.52, the printed over the exact constant at C_d = 0.95 — so at C_d = 0.95 it is
        the printed formula (calc/METHODS.md §8.3, §7.9).

    Notes
    -----
    Bernoulli across the nozzle with the jet velocity v = C_d·√(2ΔP/ρ) and continuity
    v = Q/A.  The field form 8.311e-5·ρQ²/(C_d²A²) (psi, ppg, gpm, in²) is this equation in
    field units (Bourgoyne et al. 1986, ch. 4; calc/METHODS.md §0.4, §8.3).

    Examples
    --------
    >>> round(bit_pressure_drop(0.03, 1000.0, 2e-4, 1.0) / 1e6, 4)
    11.25
    >>> exact = bit_pressure_drop(0.03, 1000.0, 2e-4)
    >>> round(bit_pressure_drop(0.03, 1000.0, 2e-4, constants="as_printed") / exact, 5)
    0.99668
    """
    cd = check_range("discharge coefficient", discharge_coefficient, 0.5, 1.2)
    a = check_positive("TFA", tfa, "m2")
    q = np.asarray(q, dtype=float)
    rho = np.asarray(density, dtype=float)
    scale = api95_constants(constants).ratio("bit")
    return float_or_array(rho * q**2 / (2.0 * cd**2 * a**2) * scale)


def bit_hydraulic_power(q, pressure_drop):
    """Hydraulic power spent at the bit P_b = ΔP_b·Q [W] (field: HHP = ΔP·Q/1714, Lyons eq. 4-77).

    ``q`` [m³/s], ``pressure_drop`` [Pa].

    Examples
    --------
    Lyons' 1714 is psi·gpm per hydraulic horsepower (1,714.25 from the unit definitions),
    so 1,714 psi at 500 gpm is 500·1714/1714.25 = 499.9 hp:

    >>> from calc.units import from_si, to_si
    >>> p = bit_hydraulic_power(to_si(500.0, "gpm"), to_si(1714.0, "psi"))
    >>> round(from_si(p, "hp"), 1)
    499.9
    """
    return float_or_array(np.asarray(pressure_drop, dtype=float) * np.asarray(q, dtype=float))


def hsi(power, bit_size):
    """Hydraulic power per bit area HSI = P_b/(π d_bit²/4) [W/m²].

    ``power`` [W], ``bit_size`` [m].  Field: hp/in².

    Examples
    --------
    An 8-1/2 in bit has a face of π·8.5²/4 = 56.75 in², so 56.75 hp at the bit is 1 hp/in²:

    >>> import math
    >>> from calc.units import from_si, to_si
    >>> power = to_si(math.pi * 8.5**2 / 4, "hp")
    >>> round(from_si(hsi(power, to_si(8.5, "in")), "hp/in**2"), 6)
    1.0
    """
    d = check_positive("bit size", bit_size, "m")
    return float_or_array(np.asarray(power, dtype=float) / cross_section_area(d))


def impact_force(q, density, pressure_drop, discharge_coefficient=DEFAULT_DISCHARGE_COEFFICIENT):
    """Jet impact force F_j = C_d·Q·√(2ρΔP_b) [N] (the jet's momentum flux ρ·Q·v_jet).

    ``q`` [m³/s], ``density`` [kg/m³], ``pressure_drop`` [Pa].  Field form
    0.01823·C_d·Q·√(ρΔP_b) lbf (Lyons 1996, eq. 4-78; Guo & Liu 2011, eq. 2.89).

    Examples
    --------
    With C_d = 1, 11.25 MPa across the nozzles of water (1000 kg/m³) gives a jet of
    √(2ΔP/ρ) = 150 m/s, so at 0.03 m³/s the momentum flux is ρQv = 4,500 N:

    >>> round(impact_force(0.03, 1000.0, 11.25e6, 1.0), 6)
    4500.0
    """
    cd = np.asarray(discharge_coefficient, dtype=float)
    q = np.asarray(q, dtype=float)
    dp = np.asarray(pressure_drop, dtype=float)
    rho = np.asarray(density, dtype=float)
    return float_or_array(cd * q * np.sqrt(2.0 * rho * np.maximum(dp, 0.0)))


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
        more than 2 % from the nozzles' gives a warning, common practice —
        calc/METHODS.md §16.4).
    discharge_coefficient : float
        Nozzle discharge coefficient [-], default 0.95.
    ports : int, optional
        Number of nozzle ports.
    name : str

    Examples
    --------
    An 8-1/2 in bit with 3x12 3x11 nozzles: TFA = (π/4)·(3·(12/32)² + 3·(11/32)²) in² and a
    face of π·8.5²/4 in²:

    >>> from calc.units import from_si, to_si
    >>> b = Bit(size=to_si(8.5, "in"), nozzles="3x12 3x11")
    >>> b.nozzles, round(from_si(b.tfa, "in**2"), 4), round(from_si(b.area, "in**2"), 2)
    ((12, 12, 12, 11, 11, 11), 0.6098, 56.75)
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
                            "given TFA {given:.3f} differs from the nozzles' {area:.3f} by more "
                            "than 2 %: the nozzles are used",
                            self.name,
                            values=(
                                Value("given", given, "area"),
                                Value("area", float(area), "area"),
                            ),
                        )
                    )
            object.__setattr__(self, "tfa", area)
        else:
            object.__setattr__(self, "tfa", float(check_positive("TFA", self.tfa, "m2")))
        object.__setattr__(self, "notes", tuple(notes))

    @property
    def area(self) -> float:
        """Bit face area π d²/4 [m²]."""
        return float(cross_section_area(self.size))


#: Method text of the bit drop computed with the printed API RP 13D (1995) constant.
BIT_METHOD_PRINTED = (
    "API RP 13D (1995) printed form 156ρQ²/(ΣD_N²)², times (0.95/C_d)² for another C_d "
    "(constants=as_printed; calc/METHODS.md §8.3)"
)


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


def bit_hydraulics(
    q, density, bit: Bit, standpipe_pressure=None, constants="exact"
) -> BitHydraulics:
    """All bit-hydraulics quantities for ``bit`` at flow rate(s) ``q`` [m³/s], ``density`` [kg/m³].

    ``constants`` as for :func:`bit_pressure_drop` (the power, HSI and impact force follow the
    pressure drop it gives).

    ``standpipe_pressure`` [Pa], if given, yields the bit's share ΔP_b/p_sp.  Notes warn of a
    nozzle velocity above ~450 ft/s or an HSI below ~1 hp/in² (common practice, from
    memory — calc/METHODS.md §16.4).

    Examples
    --------
    Lapeyrouse (2002), "Bit nozzle selection — optimized hydraulics" example, impact-force
    branch: 297 gpm of 13.0 ppg mud through 0.26632 in² gives P_b = 1,489 psi (printed; its
    constant 10,858 is C_d = 0.95, 0.024 % from the exact 10,860.6, see
    tests/test_worked_examples_bit.py).  The bit size is not part of that step; 8-1/2 in here:

    >>> from calc.units import from_si, to_si
    >>> bit = Bit(size=to_si(8.5, "in"), tfa=to_si(0.26632, "in**2"))
    >>> h = bit_hydraulics(to_si(297.0, "gpm"), to_si(13.0, "ppg"), bit, to_si(2500.0, "psi"))
    >>> round(from_si(h.pressure_drop, "psi")), round(h.share_of_standpipe, 3)
    (1489, 0.595)
    >>> round(from_si(h.nozzle_velocity, "ft/s")), round(from_si(h.hydraulic_power, "hp"))
    (358, 258)
    """
    qv = check_positive("flow rate", q, "m3/s")
    rho = check_positive("density", density, "kg/m3")
    cd = bit.discharge_coefficient
    vn = nozzle_velocity(qv, bit.tfa)
    dp = bit_pressure_drop(qv, rho, bit.tfa, cd, constants)
    pw = bit_hydraulic_power(qv, dp)
    h = hsi(pw, bit.size)
    fj = impact_force(qv, rho, dp, cd)
    notes = list(bit.notes)
    share = None
    if standpipe_pressure is not None:
        spp = check_positive("standpipe pressure", standpipe_pressure, "Pa")
        share = float_or_array(np.asarray(dp) / spp)
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
        spp = float_or_array(spp)
    else:
        spp = None
    if np.any(np.asarray(vn) > JET_VELOCITY_WARN):
        notes.append(
            Note(
                "warning",
                "high_jet_velocity",
                "nozzle velocity up to {velocity:.0f}, above ~{limit:.0f}: erosion risk",
                bit.name,
                values=(
                    Value("velocity", float(np.max(vn)), "jet_velocity"),
                    Value("limit", JET_VELOCITY_WARN, "jet_velocity"),
                ),
            )
        )
    if np.any(np.asarray(h) < HSI_WARN):
        notes.append(
            Note(
                "warning",
                "low_hsi",
                "HSI down to {hsi:.2f}, below ~{limit:.0f}: poor bit cleaning or balling risk",
                bit.name,
                values=(
                    Value("hsi", float(np.min(h)), "power_density"),
                    Value("limit", HSI_WARN, "power_density"),
                ),
            )
        )
    return BitHydraulics(
        flow_rate=float_or_array(qv),
        density=float_or_array(rho),
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
        **({} if constants == "exact" else {"method": BIT_METHOD_PRINTED}),
    )
