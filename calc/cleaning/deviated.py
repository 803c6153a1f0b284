"""Hole cleaning in deviated holes: Rubiandini's inclination- and rotation-corrected slip, the
registry of deviated-hole methods, and the rotary-speed input check.

Two published deviated-hole minimum velocities are applied at every inclination, beside the
vertical criteria (:mod:`calc.cleaning.indicators`); the most demanding governs
(:func:`calc.cleaning.hole_cleaning`, calc/METHODS.md §10.13):

``rubiandini_1999``  Moore's vertical slip velocity times Rubiandini's inclination/rotation/
                     mud-weight factor, plus Larsen's cuttings travel velocity; 0-90°; uses RPM.
``larsen_1997``      Larsen, Pilehvari & Azar (1997) critical velocity
                     (:func:`calc.cleaning.indicators.larsen_critical_velocity`); fitted for
                     55-90°, applied below with its own angle factor (a note says so); no RPM.

Both change continuously with inclination, so the governing (largest) requirement does too.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.cleaning.indicators import larsen_critical_velocity, larsen_cuttings_velocity
from calc.cleaning.slip import slip_velocity
from calc.errors import InputError, check_finite, check_positive, check_range
from calc.flow.area import cross_section_area
from calc.notes import Note
from calc.numeric import bisect_increasing, scalar_or_array
from calc.registry import MethodRegistry, Verification
from calc.units import si_factor

__all__ = [
    "DEVIATED_METHODS",
    "RPM_MAX",
    "RUBIANDINI_RANGE",
    "RubiandiniResult",
    "check_rotary_speed",
    "rubiandini_angle_slope_bound",
    "rubiandini_critical_velocity",
    "rubiandini_factor",
]

_PPG = si_factor("ppg")

#: Rubiandini's factor C_R = 1 + θ·(600 - RPM)·(3 + ρ[ppg])/202,500 with θ held at 45° above 45°
#: (from memory, not checked against the source; for RPM = 0 and 12 ppg it reduces to
#: 1 + 2θ/45, the form a second-hand public code comment gives — calc/METHODS.md §10.17).
RUBIANDINI_RPM_ZERO = 600.0
RUBIANDINI_DIVISOR = 202_500.0
RUBIANDINI_MW_OFFSET = 3.0
RUBIANDINI_ANGLE_CAP = 45.0
#: Inclination range Rubiandini states ("inclined until horizontal") [degree], as remembered.
RUBIANDINI_RANGE = (0.0, 90.0)
#: Largest accepted string rotary speed [rpm]: Rubiandini's rotation term (600 - RPM) changes
#: sign there, and drill strings are not turned that fast (surface drives run to a few hundred
#: rpm, common practice).
RPM_MAX = RUBIANDINI_RPM_ZERO

#: Deviated-hole cleaning methods: name → implementation, description, source, status.
DEVIATED_METHODS = MethodRegistry("deviated-hole cleaning method")


def check_rotary_speed(rpm) -> np.ndarray:
    """String rotary speed [rpm] in [0, RPM_MAX]; InputError naming value and range otherwise.

    >>> float(check_rotary_speed(140.0))
    140.0
    """
    v = check_finite("rotary speed", rpm, "rpm")
    bad = (v < 0) | (v > RPM_MAX)
    if np.any(bad):
        raise InputError(
            "rotary speed",
            float(np.ravel(v)[np.argmax(np.ravel(bad))]),
            f"in [0, {RPM_MAX:g}] rpm (Rubiandini's rotation term (600 - RPM) changes sign at "
            "600 rpm; no drill string turns that fast)",
        )
    return v


def rubiandini_factor(inclination, rpm, density):
    """Rubiandini's slip-velocity factor for inclination, pipe rotation and mud weight [-].

    .. math:: C_R = 1 + \\frac{\\theta^*\\,(600 - RPM)\\,(3 + \\rho_{ppg})}{202\\,500},\\quad
              \\theta^* = \\min(\\theta, 45°)

    Parameters
    ----------
    inclination : array_like
        θ [degree], 0-180 (above 90° read as 180° - θ).
    rpm : array_like
        String rotary speed [rpm], 0-600.
    density : array_like
        Mud density [kg/m³] (the formula takes ppg).

    Notes
    -----
    From memory, not checked against the source (calc/METHODS.md §10.17).  C_R = 1 in a vertical
    hole and at 600 rpm; it rises linearly to 45° and stays there.

    References
    ----------
    Rubiandini, R. (1999) Equation for estimating mud minimum rate for cuttings transport in an
    inclined-until-horizontal well, SPE/IADC 57541, SPE/IADC Middle East Drilling Technology
    Conference (the abstract was read; the factor's constants are from memory).

    Examples
    --------
    >>> round(float(rubiandini_factor(45.0, 0.0, 12.0 * 119.826427)), 3)   # 1 + 2·45/45
    3.0
    """
    inc = check_range("inclination", inclination, 0.0, 180.0, "degree")
    inc = np.where(inc > 90.0, 180.0 - inc, inc)
    r = check_rotary_speed(rpm)
    rho = check_positive("mud density", density, "kg/m³")
    th = np.minimum(inc, RUBIANDINI_ANGLE_CAP)
    out = 1.0 + th * (RUBIANDINI_RPM_ZERO - r) * (RUBIANDINI_MW_OFFSET + rho / _PPG) / (
        RUBIANDINI_DIVISOR
    )
    return scalar_or_array(out)


@dataclass(frozen=True)
class RubiandiniResult:
    """Rubiandini's minimum annular velocity and its parts (SI).

    critical_velocity   V_min = V_cut + C_R·V_s,Moore(V_min) [m/s]
    critical_rate       Q_min = V_min × annulus area [m³/s]
    cuttings_velocity   V_cut, Larsen's cuttings travel velocity [m/s]
    vertical_slip       Moore's slip velocity V_s at V_min [m/s]
    slip_velocity       C_R·V_s [m/s]
    factor              C_R [-]
    rpm                 the rotary speed used [rpm]
    """

    critical_velocity: np.ndarray | float
    critical_rate: np.ndarray | float
    cuttings_velocity: np.ndarray | float
    vertical_slip: np.ndarray | float
    slip_velocity: np.ndarray | float
    factor: np.ndarray | float
    rpm: float
    method: str
    notes: tuple[Note, ...] = ()


def rubiandini_critical_velocity(
    rop,
    d_hole,
    d_pipe,
    *,
    density,
    k,
    tau_y=0.0,
    n=1.0,
    cuttings_size,
    cuttings_density,
    inclination,
    rpm=0.0,
) -> RubiandiniResult:
    """Minimum annular velocity for cuttings transport at any inclination, Rubiandini (1999).

    .. math:: V_{min} = V_{cut} + C_R(\\theta, RPM, \\rho)\\,V_{s,Moore}(V_{min})

    V_s,Moore is Moore's slip velocity (:func:`calc.cleaning.slip.slip_velocity`,
    ``method="moore"``, μ_a at the annular wall shear rate of V_min), C_R
    :func:`rubiandini_factor`, V_cut Larsen's cuttings travel velocity
    (:func:`calc.cleaning.indicators.larsen_cuttings_velocity`).  Solved for V_min by vectorised
    bisection.

    Parameters
    ----------
    rop : array_like
        Rate of penetration [m/s], > 0.
    d_hole, d_pipe : array_like
        Annulus diameters [m].
    density, k, tau_y, n : array_like
        Mud density [kg/m³] and Herschel-Bulkley parameters [Pa·sⁿ], [Pa], [-].
    cuttings_size, cuttings_density : array_like
        d_s [m] (smaller than the radial gap) and ρ_s [kg/m³].
    inclination : array_like
        [degree], 0-180.
    rpm : float
        String rotary speed [rpm], 0-600; 0 (no rotation) is the most demanding.

    Notes
    -----
    Constants and the use of Larsen's V_cut from memory, not checked against the source
    (calc/METHODS.md §10.17).  Moore's drag law jumps at Re_p = 3 (≤ 5 % in slip), so V_min can
    step there by at most 5 % of its slip part.

    References
    ----------
    Rubiandini, R. (1999) SPE/IADC 57541 (abstract read, constants from memory); Moore (1974)
    as in Bourgoyne et al. (1986) Applied Drilling Engineering §4.13.

    Examples
    --------
    >>> r = rubiandini_critical_velocity(0.0049, 0.2184, 0.127, density=1342.0, k=0.19,
    ...     tau_y=4.1, n=0.74, cuttings_size=0.00635, cuttings_density=2600.0,
    ...     inclination=30.0, rpm=140.0)
    >>> 0.3 < r.critical_velocity < 1.5 and 1.9 < r.factor < 2.1
    True
    """
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = np.asarray(d_pipe, dtype=float)
    v_cut = np.asarray(larsen_cuttings_velocity(rop, d2, d1))
    c_r = np.asarray(rubiandini_factor(inclination, rpm, density))
    rpm_v = float(np.max(check_rotary_speed(rpm)))

    def vs(v):
        return np.asarray(
            slip_velocity(
                cuttings_size, cuttings_density, density=density, k=k, tau_y=tau_y, n=n,
                method="moore", annular_velocity=v, d_hole=d2, d_pipe=d1,
            ).velocity
        )  # fmt: skip

    shape = np.broadcast_shapes(np.shape(v_cut), np.shape(c_r))
    floor = np.broadcast_to(np.maximum(v_cut, 1e-3), shape)
    upper = floor + c_r * np.maximum(vs(floor), vs(floor + 10.0)) + 1.0
    v = bisect_increasing(lambda x: x - v_cut - c_r * vs(x), floor, upper, iterations=60)
    v_s = vs(v)
    area = cross_section_area(d2, d1)
    notes = ()
    if np.any(np.asarray(inclination, dtype=float) > 90.0):
        notes = (
            Note(
                "info",
                "rubiandini_beyond_horizontal",
                "rubiandini_1999: inclination above 90° read as 180° minus the inclination.",
                "deviated-hole cleaning",
            ),
        )
    return RubiandiniResult(
        critical_velocity=scalar_or_array(v),
        critical_rate=scalar_or_array(v * area),
        cuttings_velocity=scalar_or_array(np.broadcast_to(v_cut, shape)),
        vertical_slip=scalar_or_array(v_s),
        slip_velocity=scalar_or_array(c_r * v_s),
        factor=scalar_or_array(np.broadcast_to(c_r, shape)),
        rpm=rpm_v,
        method="rubiandini_1999: Rubiandini (1999) SPE/IADC 57541, Moore slip × C_R(θ, RPM, ρ) + "
        "Larsen V_cut (constants from memory, not checked against the source; "
        "calc/METHODS.md §10.17)",
        notes=notes,
    )


def rubiandini_angle_slope_bound(result: RubiandiniResult, density) -> np.ndarray:
    """Upper bound of |dV_min/dθ| of :func:`rubiandini_critical_velocity` [m/s per degree].

    .. math:: \\left|\\frac{dV_{min}}{d\\theta}\\right| \\le
              \\frac{(600 - RPM)(3 + \\rho_{ppg})}{202\\,500}\\,V_s\\,\\frac{V_{min}}{V_{cut}}

    From V = V_cut + C_R·V_s(V): dV/dθ = C_R'·V_s/(1 - C_R·dV_s/dV); Moore's slip depends on V
    only through μ_a(V), with d ln V_s/d ln V ≤ 1 on every branch, so C_R·dV_s/dV ≤ C_R·V_s/V
    = 1 - V_cut/V.  C_R' is taken without the 45° cap, so the bound does not fall with θ and
    bounds every angle below the one it is evaluated at (calc/METHODS.md §10.13).  Moore's own
    ≤ 5 % step at Re_p = 3 is not covered.

    >>> r = rubiandini_critical_velocity(0.0049, 0.2184, 0.127, density=1342.0, k=0.19,
    ...     tau_y=4.1, n=0.74, cuttings_size=0.00635, cuttings_density=2600.0,
    ...     inclination=30.0, rpm=140.0)
    >>> 0.0 < float(rubiandini_angle_slope_bound(r, 1342.0)) < 0.01
    True
    """
    rho = check_positive("mud density", density, "kg/m³")
    slope = (RUBIANDINI_RPM_ZERO - result.rpm) * (RUBIANDINI_MW_OFFSET + rho / _PPG)
    v, v_cut = np.asarray(result.critical_velocity), np.asarray(result.cuttings_velocity)
    return scalar_or_array(
        slope / RUBIANDINI_DIVISOR * np.asarray(result.vertical_slip) * v / v_cut
    )


DEVIATED_METHODS.register(
    "rubiandini_1999",
    "Moore slip × Rubiandini's inclination/rotation/mud-weight factor + Larsen's cuttings "
    "velocity; 0-90°; uses the rotary speed",
    "Rubiandini, R. (1999) SPE/IADC 57541",
    status=Verification(
        "from_memory",
        "The paper's abstract (SPE-57541-MS, 1999) confirms the structure: minimum rate = "
        "slip velocity + cuttings velocity (from geometry and ROP), Moore's vertical slip "
        "corrected for inclination, RPM and mud weight after Larsen's procedure. The factor "
        "C_R = 1 + θ(600 - RPM)(3 + ρ_ppg)/202500 (θ ≤ 45°) is recalled; its RPM = 0, 12 ppg case "
        "1 + 2θ/45 agrees with a second-hand public code comment. Tests: C_R identities and the "
        "continuity/ordering properties (tests/test_cleaning_deviated.py).",
        (
            "factor constants not checked against the source (only the abstract was read; "
            "calc/METHODS.md §10.17)",
            "the abstract says the method agrees with Larsen's above 45°; in the demo mud it "
            "asks for about half Larsen's rate there, so the recalled factor may be wrong",
            "V_cut taken as Larsen's, from memory",
            "Moore slip inherits Moore's unverified constants (calc/METHODS.md §10.3)",
        ),
    ),
)(rubiandini_critical_velocity)

DEVIATED_METHODS.register(
    "larsen_1997",
    "Larsen, Pilehvari & Azar critical velocity V_cut + C_ang·C_size·C_mw·V_slip0(μ_a); fitted "
    "55-90°, applied below with its own angle factor; no rotation term",
    "Larsen, T.I., Pilehvari, A.A. & Azar, J.J. (1997) SPE Drilling & Completion 12(2):129-135",
    status=Verification(
        "from_memory",
        "Cuttings concentration corrected to C_conc = 0.01778·ROP + 0.505 % with "
        "V_cut = ROP/(36(1-(D1/D2)²)C_conc): the remembered alternative "
        "V_cut = 1/[(1-(D1/D2)²)(0.64 + 18.16/ROP)] is the same formula (36×0.01778 = 0.640, "
        "36×0.505 = 18.18), so the code's former C_conc = (0.64 + 18.16/ROP) % mixed the two and "
        "overstated V_cut by ROP/36 (ft/h). C_ang coefficients agree with a second-hand public "
        "code comment citing SPE 25872. The paper itself was not reached.",
        (
            "constants not checked against the source (calc/METHODS.md §10.12)",
            "fitted for 55-90°; below 55° extrapolated, C_ang held at 0 below 6.6°",
            "no pipe-rotation term",
        ),
    ),
)(larsen_critical_velocity)
