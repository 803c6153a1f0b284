"""Cuttings transport in an annular interval: velocities, transport ratio, concentration, loading.

.. math::
    V_a = \\frac{4Q}{\\pi(D_2^2 - D_1^2)},\\quad F_T = 1 - \\frac{V_s}{V_a},\\quad
    q_c = \\frac{\\pi}{4} d_b^2 \\cdot ROP,\\quad
    C_a = \\frac{q_c}{q_c + F_T Q},\\quad \\rho_{eff} = \\rho(1 - C_a) + \\rho_s C_a

(calc/METHODS.md §10.9, §10.10; the in-situ concentration from the transport ratio is from
memory, not yet checked against the source.)  The feed concentration C_f = q_c/(Q + q_c) is what the
annulus would hold if the cuttings rose at the mud's mean velocity.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from calc.cleaning.slip import SlipResult, slip_velocity
from calc.errors import InputError, check_nonnegative, check_positive
from calc.flow.area import cross_section_area, mean_velocity
from calc.notes import Note
from calc.numeric import scalar_or_array
from calc.units import si_factor
from calc.values import Value

__all__ = [
    "Cuttings",
    "TransportResult",
    "annular_transport",
    "annular_velocity",
    "cuttings_volume_rate",
    "in_situ_concentration",
    "loaded_density",
]

_IN = si_factor("in")
_FT_PER_H = si_factor("ft/hour")


@dataclass(frozen=True)
class Cuttings:
    """Drilled cuttings (SI).

    size        equivalent diameter d_s [m] (field estimate d_s ≈ 0.2·ROP/RPM in, ft/h, rpm —
                Guo & Liu 2011, ch. 2)
    density     grain density ρ_s [kg/m³] (shale/sandstone ≈ 2600, common practice)
    sphericity  Wadell sphericity ψ in (0, 1] (0.8 a conservative cuttings value, Guo & Liu 2011)
    thickness   thickness of platy cuttings [m] (Walker-Mayes); None → ``size``
    notes       doubtful-but-possible inputs (size outside 0.05-1 in, SG outside 2.0-2.8:
                common practice, calc/METHODS.md §16.6)
    """

    size: float
    density: float
    sphericity: float = 1.0
    thickness: float | None = None
    notes: tuple[Note, ...] = field(default=(), compare=False)

    def __post_init__(self):
        size = float(check_positive("cuttings size", self.size, "m"))
        dens = float(check_positive("cuttings density", self.density, "kg/m³"))
        psi = float(check_positive("sphericity", self.sphericity))
        if psi > 1.0:
            raise InputError("sphericity", psi, "in (0, 1]")
        object.__setattr__(self, "size", size)
        object.__setattr__(self, "density", dens)
        object.__setattr__(self, "sphericity", psi)
        if self.thickness is not None:
            t = float(check_positive("cuttings thickness", self.thickness, "m"))
            object.__setattr__(self, "thickness", t)
        notes = []
        if not 0.05 * _IN <= size <= 1.0 * _IN:
            notes.append(
                Note(
                    "warning",
                    "cuttings_size",
                    "cuttings size outside {usual}",
                    "cuttings",
                    values=(Value("usual", (0.05 * _IN, 1.0 * _IN), "diameter"),),
                )
            )
        if not 2000.0 <= dens <= 2800.0:
            notes.append(
                Note("warning", "cuttings_density", "cuttings SG outside 2.0-2.8", "cuttings")
            )
        object.__setattr__(self, "notes", tuple(notes))


def annular_velocity(q, d_hole, d_pipe):
    """Mean annular velocity V_a = 4Q/(π(D2² - D1²)) [m/s].

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s].
    d_hole, d_pipe : array_like
        Outer (hole/casing ID) and inner (pipe OD) diameters [m].

    Notes
    -----
    Field form AV[ft/min] = 24.51·Q[gpm]/(D2² - D1²)[in²] (calc/METHODS.md §10.9; 24.51 = 77/π
    exactly);
    computed by :func:`calc.flow.mean_velocity`.

    >>> round(annular_velocity(0.01, 0.2, 0.1), 6)
    0.424413
    """
    return scalar_or_array(mean_velocity(q, d_hole, d_pipe))


def cuttings_volume_rate(rop, bit_diameter):
    """Volume rate of cuttings generated, q_c = (π/4)d_b²·ROP [m³/s].

    Parameters
    ----------
    rop : array_like
        Rate of penetration [m/s], ≥ 0.
    bit_diameter : array_like
        Bit (hole) diameter d_b [m].

    Notes
    -----
    Field form q_c[gpm] = d_b²[in]·ROP[ft/h]/1470.6 (calc/METHODS.md §10.10; 1470.6 = 4620/π
    exactly).
    Solid rock volume, no porosity correction.

    >>> round(cuttings_volume_rate(0.01, 0.2), 8)
    0.00031416
    """
    r = check_nonnegative("rate of penetration", rop, "m/s")
    db = check_positive("bit diameter", bit_diameter, "m")
    return scalar_or_array(cross_section_area(db) * r)


def in_situ_concentration(cuttings_rate, q, transport_ratio):
    """Cuttings volume fraction in the annulus, C_a = q_c/(q_c + F_T·Q) [-].

    The cuttings rise at F_T·V_a, the mud at V_a; with F_T ≤ 0 (cuttings not lifted) there is no
    steady state and C_a is reported as 1 (the interval loads up).

    >>> round(in_situ_concentration(0.001, 0.03, 0.5), 6)
    0.0625
    """
    qc = np.asarray(cuttings_rate, dtype=float)
    lift = np.maximum(np.asarray(transport_ratio, dtype=float), 0.0) * q
    denom = qc + lift
    return scalar_or_array(np.where(denom > 0, qc / np.where(denom > 0, denom, 1.0), 0.0))


def loaded_density(density, cuttings_density, concentration):
    """Effective density of the cuttings-laden mud, ρ_eff = ρ(1 - C_a) + ρ_s·C_a [kg/m³].

    >>> loaded_density(1300.0, 2600.0, 0.1)
    1430.0
    """
    c = np.asarray(concentration, dtype=float)
    return scalar_or_array(density * (1.0 - c) + cuttings_density * c)


@dataclass(frozen=True)
class TransportResult:
    """Cuttings transport per interval (arrays broadcast over rates × intervals; SI).

    annular_velocity     V_a [m/s]
    slip                 the :class:`SlipResult` (velocity, Re_p, drag, μ_a, method)
    slip_velocity        V_s [m/s]
    transport_ratio      F_T = 1 - V_s/V_a [-]
    net_rise_velocity    V_a - V_s [m/s] (negative: cuttings fall back)
    cuttings_rate        q_c [m³/s]
    feed_concentration   q_c/(Q + q_c) [-]
    concentration        in-situ C_a [-]
    loaded_density       ρ_eff [kg/m³]
    """

    annular_velocity: np.ndarray | float
    slip: SlipResult
    slip_velocity: np.ndarray | float
    transport_ratio: np.ndarray | float
    net_rise_velocity: np.ndarray | float
    cuttings_rate: np.ndarray | float
    feed_concentration: np.ndarray | float
    concentration: np.ndarray | float
    loaded_density: np.ndarray | float
    method: str
    notes: tuple[Note, ...] = ()


def annular_transport(
    q,
    d_hole,
    d_pipe,
    *,
    density,
    k,
    tau_y=0.0,
    n=1.0,
    cuttings: Cuttings,
    rop,
    bit_diameter,
    method: str = "moore",
) -> TransportResult:
    """Cuttings transport in annular intervals at flow rate(s) ``q``.

    Parameters
    ----------
    q : array_like
        Flow rate [m³/s], > 0 (broadcast against the interval arrays).
    d_hole, d_pipe : array_like
        Annulus outer and inner diameters [m].
    density, k, tau_y, n : array_like
        Mud density [kg/m³] and Herschel-Bulkley parameters [Pa·sⁿ], [Pa], [-].
    cuttings : Cuttings
    rop : float
        Rate of penetration [m/s], ≥ 0.
    bit_diameter : float
        Bit diameter [m].
    method : str
        Slip-velocity method (:data:`calc.cleaning.slip.SLIP_METHODS`).

    Raises
    ------
    InputError
        negative ROP; cuttings larger than the radial gap; cuttings lighter than the mud.

    Notes
    -----
    Transport ratio ≥ 0.5 is the common-practice minimum for vertical holes; cuttings
    concentration up to ~4-5 % by volume (common practice, calc/METHODS.md §16.6).

    References
    ----------
    Guo, B. & Liu, G. (2011) Applied Drilling Circulation Systems, ch. 2 (eq. 2.98 minimum
    velocity); Bourgoyne et al. (1986) Applied Drilling Engineering, §4.13.

    >>> c = Cuttings(0.00635, 2600.0)
    >>> r = annular_transport(0.033, 0.2184, 0.127, density=1318.0, k=0.4, tau_y=3.0, n=0.6,
    ...                       cuttings=c, rop=0.0049, bit_diameter=0.2159)
    >>> round(r.transport_ratio, 2) > 0.5
    True
    """
    r = check_nonnegative("rate of penetration", rop, "m/s")
    qq = check_positive("flow rate", q, "m³/s")
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    va = np.asarray(annular_velocity(qq, d2, d1))
    s = slip_velocity(
        cuttings.size,
        cuttings.density,
        density=density,
        k=k,
        tau_y=tau_y,
        n=n,
        method=method,
        sphericity=cuttings.sphericity,
        thickness=cuttings.thickness,
        annular_velocity=va,
        d_hole=d2,
        d_pipe=d1,
    )
    vs = np.broadcast_to(np.asarray(s.velocity), va.shape) if np.ndim(s.velocity) else s.velocity
    ft = 1.0 - vs / va
    qc = np.asarray(cuttings_volume_rate(r, bit_diameter))
    ca = np.asarray(in_situ_concentration(qc, qq, ft))
    notes = list(cuttings.notes) + list(s.notes)
    if np.any(ft <= 0):
        notes.append(
            Note(
                "caution",
                "cuttings_not_lifted",
                "slip velocity at or above the annular velocity: cuttings are not lifted in at "
                "least one interval (concentration shown as 1).",
                "hole cleaning",
            )
        )
    if np.any(r > 500.0 * _FT_PER_H):
        notes.append(
            Note(
                "warning",
                "rop_high",
                "ROP above {limit}",
                "rate of penetration",
                values=(Value("limit", 500.0 * _FT_PER_H, "rop"),),
            )
        )
    return TransportResult(
        annular_velocity=scalar_or_array(va),
        slip=s,
        slip_velocity=scalar_or_array(vs),
        transport_ratio=scalar_or_array(ft),
        net_rise_velocity=scalar_or_array(va - vs),
        cuttings_rate=scalar_or_array(qc),
        feed_concentration=scalar_or_array(qc / (qq + qc)),
        concentration=scalar_or_array(ca),
        loaded_density=scalar_or_array(loaded_density(density, cuttings.density, ca)),
        method=s.method,
        notes=tuple(notes),
    )
