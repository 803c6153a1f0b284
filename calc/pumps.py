"""Positive-displacement mud pumps: volume per stroke, rate from strokes per minute and back.

A *stroke* here is one revolution of the crank (every piston moves once forward and once back),
the way pump speed is counted at the rig (strokes per minute, spm).  The volume a pump delivers
per stroke is its swept volume times its volumetric efficiency η:

.. math::

    \\text{triplex, single-acting:}\\quad V = \\frac{\\pi}{4}\\, d_L^2\\, L_s \\cdot 3 \\cdot \\eta

    \\text{duplex, double-acting:}\\quad V = \\frac{\\pi}{4}\\,(2 d_L^2 - d_r^2)\\, L_s \\cdot 2
    \\cdot \\eta

with liner (piston) diameter d_L, stroke length L_s and piston-rod diameter d_r (the rod takes
its cross-section from the back chamber of each duplex cylinder).  Rate Q = V·N/60 for N spm.
Source: Bourgoyne, Millheim, Chenevert & Young (1986), *Applied Drilling Engineering*, SPE
Textbook Series vol. 2, §4.2 "Pump" (pump displacement of duplex and triplex pumps) — quoted
from memory, not checked against the printed page; the two forms are the geometric swept
volumes, which the tests check from the cylinder geometry.

Several pumps: every running pump turns at its own spm and the rates add.  Going back from a
total rate to spm, every running pump is given the **same spm** (the usual way of running
matched pumps, common practice), so each delivers in proportion to its volume per stroke.

Hydraulic power delivered at the standpipe is P = p·Q (:attr:`calc.circulation.CirculationResult.
pump_power`); as a limit each pump is held at its share of the rate: p·Q·V_i/ΣV ≤ P_rated,i.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from calc.errors import InputError, check_choice, check_positive, check_range
from calc.numeric import float_or_array
from calc.plausibility import RANGES

__all__ = [
    "PUMP_KINDS",
    "SPM_MAX",
    "Pump",
    "hydraulic_power",
    "pump_displacement",
    "pump_limits",
    "pumps_rate",
    "pumps_spm",
    "rate_from_spm",
    "spm_from_rate",
]

#: Pump kinds and their (cylinders, double-acting).
PUMP_KINDS = {"triplex": (3, False), "duplex": (2, True)}
#: Highest pump speed accepted [strokes/min]: above it the value cannot be a mud pump's speed
#: (the possible range of ``spm`` in :data:`calc.plausibility.RANGES`: common practice, from
#: memory: triplex mud pumps are rated at ~100–175 spm, duplex pumps at ~40–80 spm; 250 leaves
#: room for small fast pumps).
SPM_MAX = RANGES["spm"].possible[1]


def _geometry(kind, liner, stroke, efficiency, rod):
    kind = check_choice("pump kind", kind, PUMP_KINDS)
    d = check_positive("pump liner", liner, "m")
    s = check_positive("pump stroke", stroke, "m")
    eta = check_range("pump efficiency", efficiency, 0.0, 1.0, lo_open=True)
    r = check_range("pump rod", rod, 0.0, np.inf, "m")
    if kind == "duplex" and np.any(r >= d):
        raise InputError("pump rod", float(np.max(r)), "< the liner diameter", kind="diameter")
    return kind, d, s, eta, r


def pump_displacement(liner, stroke, efficiency=1.0, kind="triplex", rod=0.0):
    """Volume delivered per stroke (one crank revolution) [m³] (module docstring).

    Parameters
    ----------
    liner, stroke : float or array_like
        Liner (piston) diameter and stroke length [m], > 0.
    efficiency : float or array_like
        Volumetric efficiency [-], 0 < η ≤ 1.
    kind : {"triplex", "duplex"}
        Triplex single-acting or duplex double-acting.
    rod : float or array_like
        Piston-rod diameter [m] (duplex only; 0 ≤ rod < liner).

    Returns
    -------
    float or ndarray

    References
    ----------
    Bourgoyne et al. (1986), *Applied Drilling Engineering*, SPE, §4.2 (from memory).

    Examples
    --------
    A 6.5 in × 12 in triplex at 97 % volumetric efficiency, about 5.02 US gal per stroke:

    >>> from calc.units import from_si, to_si
    >>> round(from_si(pump_displacement(to_si(6.5, "in"), to_si(12, "in"), 0.97), "gal"), 3)
    5.016
    """
    kind, d, s, eta, r = _geometry(kind, liner, stroke, efficiency, rod)
    cyl, double = PUMP_KINDS[kind]
    area = (2.0 * d**2 - r**2) if double else d**2
    return float_or_array(math.pi / 4.0 * area * s * cyl * eta)


def _check_spm(spm):
    return check_range("pump speed (strokes per minute)", spm, 0.0, SPM_MAX, "spm")


def rate_from_spm(displacement, spm):
    """Flow rate [m³/s] of a pump of ``displacement`` [m³/stroke] at ``spm`` strokes/min.

    Q = V·N/60; 0 ≤ N ≤ :data:`SPM_MAX`.

    Examples
    --------
    >>> from calc.units import from_si, to_si
    >>> round(from_si(rate_from_spm(to_si(5.0, "gal"), 100.0), "gpm"), 9)
    500.0
    """
    v = check_positive("pump displacement", displacement, "m³")
    return float_or_array(v * _check_spm(spm) / 60.0)


def spm_from_rate(displacement, q):
    """Strokes per minute giving rate ``q`` [m³/s] from a pump of ``displacement`` [m³/stroke].

    N = 60·Q/V; an InputError when N exceeds :data:`SPM_MAX`.

    Examples
    --------
    >>> from calc.units import to_si
    >>> round(float(spm_from_rate(to_si(5.0, "gal"), to_si(500.0, "gpm"))), 9)
    100.0
    """
    v = check_positive("pump displacement", displacement, "m³")
    qv = check_range("flow rate", q, 0.0, np.inf, "m³/s")
    n = 60.0 * qv / v
    _check_spm(n)
    return float_or_array(n)


@dataclass(frozen=True)
class Pump:
    """One mud pump (SI).

    name          label
    liner, stroke liner diameter and stroke length [m]
    efficiency    volumetric efficiency [-], 0 < η ≤ 1
    kind          "triplex" (single-acting) or "duplex" (double-acting)
    rod           piston-rod diameter [m] (duplex; 0 for triplex)
    rated_power   rated hydraulic (output) power [W] (None: not limited)
    liner_rating  pressure rating of the fitted liners [Pa] (None: not limited)

    Examples
    --------
    >>> from calc.units import from_si, to_si
    >>> p = Pump("pump 1", to_si(6.5, "in"), to_si(12, "in"), 0.97)
    >>> round(from_si(p.displacement, "gal"), 3)
    5.016
    """

    name: str
    liner: float
    stroke: float
    efficiency: float = 1.0
    kind: str = "triplex"
    rod: float = 0.0
    rated_power: float | None = None
    liner_rating: float | None = None

    def __post_init__(self):
        _geometry(self.kind, self.liner, self.stroke, self.efficiency, self.rod)
        if self.rated_power is not None:
            check_positive(f"{self.name}: rated power", self.rated_power, "W")
        if self.liner_rating is not None:
            check_positive(f"{self.name}: liner rating", self.liner_rating, "Pa")

    @property
    def displacement(self) -> float:
        """Volume per stroke [m³] (:func:`pump_displacement`)."""
        return float(
            pump_displacement(self.liner, self.stroke, self.efficiency, self.kind, self.rod)
        )


def _pumps(pumps) -> tuple[Pump, ...]:
    pumps = tuple(pumps)
    if not pumps or not all(isinstance(p, Pump) for p in pumps):
        raise InputError("pumps", len(pumps), "one or more Pump")
    return pumps


def pumps_rate(pumps, spm) -> Any:
    """Total rate [m³/s] of ``pumps``, each at its own ``spm`` (a sequence, one per pump).

    Examples
    --------
    Two 6.5 in × 12 in triplex pumps at 97 %, 52 spm each:

    >>> from calc.units import from_si, to_si
    >>> p = Pump("p1", to_si(6.5, "in"), to_si(12, "in"), 0.97)
    >>> round(from_si(pumps_rate([p, p], [52, 52]), "gpm"), 1)
    521.7
    """
    pumps = _pumps(pumps)
    n = np.atleast_1d(np.asarray(spm, dtype=float))
    if n.shape != (len(pumps),):
        raise InputError("pump speeds", n.tolist(), f"one per pump ({len(pumps)})")
    return float(sum(rate_from_spm(p.displacement, k) for p, k in zip(pumps, n, strict=True)))


def pumps_spm(pumps, q):
    """Strokes per minute of every running pump giving total rate ``q`` [m³/s]: the same spm on
    each, N = 60·Q/ΣV (module docstring).

    Examples
    --------
    >>> from calc.units import to_si
    >>> p = Pump("p1", to_si(6.5, "in"), to_si(12, "in"), 0.97)
    >>> round(float(pumps_spm([p, p], to_si(522.0, "gpm"))), 2)
    52.04
    """
    pumps = _pumps(pumps)
    return spm_from_rate(sum(p.displacement for p in pumps), q)


def hydraulic_power(pressure, q):
    """Hydraulic power P = p·Q [W] of pressure [Pa] and rate [m³/s].

    Examples
    --------
    4,000 psi at 500 gpm, 1,166.7 hp (field form P[hp] = p[psi]·Q[gpm]/1714.3):

    >>> from calc.units import from_si, to_si
    >>> round(from_si(hydraulic_power(to_si(4000, "psi"), to_si(500, "gpm")), "hp"), 1)
    1166.7
    """
    return float_or_array(np.asarray(pressure, dtype=float) * np.asarray(q, dtype=float))


def pump_limits(pumps, spp, q) -> dict[str, np.ndarray]:
    """Margins of the pump limits at standpipe pressures ``spp`` [Pa] and rates ``q`` [m³/s].

    ``"liner rating"``: the lowest liner rating of ``pumps`` − spp [Pa];
    ``"rated hydraulic power"``: min over pumps of P_rated,i − spp·q·V_i/ΣV [W] (each pump at
    its share of the rate, the same spm on each).  A limit is left out when no pump gives it.

    Examples
    --------
    >>> from calc.units import to_si
    >>> p = Pump("p1", to_si(6.5, "in"), to_si(12, "in"), 0.97, liner_rating=to_si(4000, "psi"))
    >>> lim = pump_limits([p, p], to_si(np.array([3000.0, 4500.0]), "psi"), 0.03)
    >>> list(lim), [bool(x >= 0) for x in lim["liner rating"]]
    (['liner rating'], [True, False])
    """
    pumps = _pumps(pumps)
    p = np.asarray(spp, dtype=float)
    out = {}
    ratings = [x.liner_rating for x in pumps if x.liner_rating is not None]
    if ratings:
        out["liner rating"] = min(ratings) - p
    total = sum(x.displacement for x in pumps)
    powered = [x for x in pumps if x.rated_power is not None]
    if powered:
        power = np.asarray(hydraulic_power(p, q), dtype=float)
        out["rated hydraulic power"] = np.min(
            [x.rated_power - power * x.displacement / total for x in powered], axis=0
        )
    return out
