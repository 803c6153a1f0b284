"""Hole-cleaning indicators: carrying capacity index, the Larsen-Pilehvari-Azar high-angle
critical velocity, and plain verdicts against user-settable thresholds.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calc.cleaning.slip import annular_apparent_viscosity
from calc.errors import InputError, check_nonnegative, check_positive, check_range
from calc.flow.area import cross_section_area
from calc.notes import Note
from calc.numeric import bisect_increasing, scalar_or_array
from calc.units import si_factor

__all__ = [
    "CCI_DIVISOR",
    "LARSEN_ANGLE",
    "LARSEN_CONCENTRATION",
    "LARSEN_RANGE",
    "VERDICTS",
    "CCIResult",
    "CleaningCriteria",
    "LarsenResult",
    "carrying_capacity_index",
    "larsen_angle_slope_bound",
    "larsen_concentration",
    "larsen_critical_velocity",
    "larsen_cuttings_velocity",
    "robinson_power_law",
]

_FT = si_factor("ft")
_IN = si_factor("in")
_PPG = si_factor("ppg")
_CP = si_factor("cP")
_FT_PER_MIN = si_factor("ft/min")
_FT_PER_H = si_factor("ft/hour")

#: CCI = ρ·AV·K/400,000 (ppg, ft/min, K eq. cP) in SI: CCI = ρ·V_a·K/CCI_DIVISOR with ρ kg/m³,
#: V_a m/s, K Pa·sⁿ; CCI_DIVISOR = 400,000 × ppg × (ft/min) × (eq. cP = 1e-3 Pa·sⁿ).
CCI_DIVISOR = 400_000.0 * _PPG * _FT_PER_MIN * _CP

#: Verdict labels, best first.
VERDICTS = ("adequate", "marginal", "poor")

# Robinson's power-law convention uses the 300 and 600 rpm shear rates, 511 and 1022 1/s.
_G300, _G600 = 511.0, 1022.0


def robinson_power_law(tau_y, k, n):
    """(K, n) of the power law through the mud's stresses at 511 and 1022 1/s (Robinson's CCI
    convention, calc/METHODS.md §10.11: n = 3.322 log(θ600/θ300), K = 511^(1-n)·θ300 eq. cP).

    Returns K [Pa·sⁿ] and n [-].

    >>> kk, nn = robinson_power_law(0.0, 0.02, 1.0)
    >>> round(kk, 6), round(nn, 6)
    (0.02, 1.0)
    """
    t300 = tau_y + k * _G300**n
    t600 = tau_y + k * _G600**n
    nr = np.log2(t600 / t300)
    return scalar_or_array(t300 / _G300**nr), scalar_or_array(nr)


@dataclass(frozen=True)
class CCIResult:
    """Carrying capacity index and its inputs (SI): ``cci`` [-]; ``k`` [Pa·sⁿ] and ``n`` of the
    Robinson power law; ``annular_velocity`` [m/s]; ``notes``."""

    cci: np.ndarray | float
    k: np.ndarray | float
    n: np.ndarray | float
    annular_velocity: np.ndarray | float
    method: str
    notes: tuple[Note, ...] = ()


def carrying_capacity_index(
    annular_velocity, *, density, k, tau_y=0.0, n=1.0, inclination=None
) -> CCIResult:
    """Carrying capacity index, CCI = ρ·AV·K/400,000 (ppg, ft/min, eq. cP).

    .. math:: CCI = \\frac{\\rho V_a K_R}{400\\,000\\ \\mathrm{ppg\\cdot ft/min\\cdot cP}}

    with K_R the Robinson power-law consistency from the mud's stresses at 511 and 1022 1/s.

    Parameters
    ----------
    annular_velocity : array_like
        V_a [m/s].
    density : array_like
        Mud density [kg/m³].
    k, tau_y, n : array_like
        Herschel-Bulkley parameters [Pa·sⁿ], [Pa], [-].
    inclination : array_like, optional
        Interval inclination [degree]; above 35° a note says the index does not apply.

    Notes
    -----
    Empirical; CCI ≥ 1 adequate, ≤ 0.5 poor, for holes below ~35° (trade glossaries, common
    practice; formula and limits from memory, not yet checked against the source —
    calc/METHODS.md §10.11).

    References
    ----------
    Attributed to L. Robinson (trade glossaries; no primary source confirmed).

    >>> round(carrying_capacity_index(0.508, density=1318.0, k=0.45, tau_y=0.0, n=0.6).cci, 3)
    1.237
    """
    va = check_positive("annular velocity", annular_velocity, "m/s")
    rho = check_positive("mud density", density, "kg/m³")
    kr, nr = robinson_power_law(
        check_nonnegative("yield stress", tau_y, "Pa"), check_positive("consistency K", k), n
    )
    notes = ()
    if inclination is not None:
        inc = check_range("inclination", inclination, 0.0, 180.0, "degree")
        if np.any(inc > 35.0):
            notes = (
                Note(
                    "warning",
                    "cci_angle_range",
                    "carrying capacity index applied above 35° inclination, outside its range "
                    "(near-vertical holes only).",
                    "carrying capacity index",
                ),
            )
    return CCIResult(
        cci=scalar_or_array(rho * va * np.asarray(kr) / CCI_DIVISOR),
        k=kr,
        n=nr,
        annular_velocity=scalar_or_array(va),
        method="carrying capacity index (Robinson; K from 300/600 rpm power law)",
        notes=notes,
    )


# Larsen, Pilehvari & Azar (1997) constants, field units (ft/s, cP, in, ppg, ft/h, degree);
# from memory, not checked against the source (calc/METHODS.md §10.12 says what was checked
# and how).  SI forms below.
_LPA_MU_BREAK = 53.0 * _CP
_LPA_A1, _LPA_B1 = 0.00516 * _FT / _CP, 3.006 * _FT
_LPA_A2, _LPA_B2 = 0.02554 * _FT / _CP, 3.28 * _FT
#: Larsen's angle factor C_ang = a0 + a1·θ + a2·θ² (θ in degrees); from memory — a second-hand
#: copy (a public code comment citing SPE 25872) prints the same three numbers.
LARSEN_ANGLE = (-0.213, 0.0342, -0.000233)
_LPA_SIZE = (1.286, -1.04 / _IN)  # C_size = 1.286 - 1.04·d50[in]
_LPA_MW = (8.7 * _PPG, 0.0333 / _PPG)  # C_mw = 1 - 0.0333(ρ - 8.7) for ρ > 8.7 ppg
#: Larsen's in-situ cuttings concentration C_conc = (0.01778·ROP[ft/h] + 0.505) % as a fraction:
#: (intercept, slope per m/s).  With V_cut = ROP/(36(1 - (D1/D2)²)C_conc) ft/s this is the
#: same formula as the form V_cut = 1/[(1 - (D1/D2)²)(0.64 + 18.16/ROP)] ft/s, since
#: 36 × 0.01778 = 0.640 and 36 × 0.505 = 18.18 (calc/METHODS.md §10.12).
LARSEN_CONCENTRATION = (0.505e-2, 0.01778e-2 / _FT_PER_H)
#: Inclination range of the correlation [degree] (Larsen et al. 1997, as remembered).
LARSEN_RANGE = (55.0, 90.0)


def larsen_cuttings_velocity(rop, d_hole, d_pipe):
    """Cuttings travel velocity of Larsen, Pilehvari & Azar (1997) [m/s].

    .. math:: V_{cut} = \\frac{ROP}{(1 - (D_1/D_2)^2)\\,C_{conc}},\\quad
              C_{conc} = (0.01778\\,ROP_{ft/h} + 0.505)\\ \\%

    field form V_cut = ROP/[36(1 - (D1/D2)²)C_conc] ft/s (ROP ft/h, C_conc in %), identical to
    V_cut = 1/[(1 - (D1/D2)²)(0.64 + 18.16/ROP)] ft/s.  Used by the Larsen and Rubiandini
    minimum velocities.

    Parameters
    ----------
    rop : array_like
        Rate of penetration [m/s], > 0.
    d_hole, d_pipe : array_like
        Annulus diameters [m].

    References
    ----------
    Larsen, T.I., Pilehvari, A.A. & Azar, J.J. (1997) SPE Drilling & Completion 12(2), 129-135
    (constants from memory, not checked against the source; calc/METHODS.md §10.12).

    Examples
    --------
    >>> round(larsen_cuttings_velocity(0.0049, 0.2184, 0.127), 3)   # 57.9 ft/h, 8.6 × 5 in
    0.483
    """
    r = check_positive("rate of penetration", rop, "m/s")
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    conc = LARSEN_CONCENTRATION[0] + LARSEN_CONCENTRATION[1] * r
    return scalar_or_array(r / ((1.0 - (d1 / d2) ** 2) * conc))


def larsen_concentration(rop):
    """Larsen's in-situ cuttings concentration (0.01778·ROP[ft/h] + 0.505) % as a fraction [-].

    >>> round(larsen_concentration(0.0049), 5)   # 57.9 ft/h → 1.534 %
    0.01534
    """
    r = check_positive("rate of penetration", rop, "m/s")
    return scalar_or_array(LARSEN_CONCENTRATION[0] + LARSEN_CONCENTRATION[1] * r)


@dataclass(frozen=True)
class LarsenResult:
    """Critical (minimum) annular velocity for cuttings transport at high angle (SI).

    critical_velocity   V_crit = V_cut + V_slip [m/s]
    critical_rate       Q_crit = V_crit × annulus area [m³/s]
    cuttings_velocity   V_cut [m/s] (cuttings travel velocity for the assumed concentration)
    slip_velocity       V_slip = C_ang·C_size·C_mw·V_slip0 [m/s]
    concentration       C_conc as a fraction [-]
    apparent_viscosity  μ_a at V_crit [Pa·s]
    angle_factor, size_factor, mud_weight_factor   C_ang, C_size, C_mw [-]
    """

    critical_velocity: np.ndarray | float
    critical_rate: np.ndarray | float
    cuttings_velocity: np.ndarray | float
    slip_velocity: np.ndarray | float
    concentration: np.ndarray | float
    apparent_viscosity: np.ndarray | float
    angle_factor: np.ndarray | float
    size_factor: np.ndarray | float
    mud_weight_factor: np.ndarray | float
    method: str
    notes: tuple[Note, ...] = ()


def larsen_critical_velocity(
    rop, d_hole, d_pipe, *, density, k, tau_y=0.0, n=1.0, cuttings_size, inclination
) -> LarsenResult:
    """Critical annular velocity for high-angle hole cleaning, Larsen, Pilehvari & Azar (1997).

    .. math::
        V_{crit} = V_{cut} + V_{slip},\\quad
        V_{cut} = \\frac{ROP}{(1 - (D_1/D_2)^2)\\,C_{conc}},\\quad
        V_{slip} = C_{ang} C_{size} C_{mw} V_{slip,0}(\\mu_a)

    field form: V_cut = ROP/[36(1 - (D1/D2)²)C_conc] ft/s, C_conc = 0.01778·ROP + 0.505 (%, ft/h)
    (:func:`larsen_cuttings_velocity`); V_slip0 = 0.00516μ_a + 3.006 (μ_a ≤ 53 cP) or
    0.02554(μ_a - 53) + 3.28 ft/s; C_ang = 0.0342θ - 0.000233θ² - 0.213; C_size = -1.04d50 + 1.286
    (in); C_mw = 1 - 0.0333(ρ - 8.7) for ρ > 8.7 ppg, else 1.  μ_a is the annular apparent
    viscosity at V_crit (Bingham form for n = 1,
    :func:`calc.cleaning.slip.annular_apparent_viscosity`), so V_crit is found by vectorised
    bisection.

    Parameters
    ----------
    rop : array_like
        Rate of penetration [m/s], > 0.
    d_hole, d_pipe : array_like
        Annulus diameters [m].
    density, k, tau_y, n : array_like
        Mud density [kg/m³] and Herschel-Bulkley parameters.
    cuttings_size : array_like
        d50 [m]; the size factor must stay positive (d50 < 1.24 in).
    inclination : array_like
        [degree], 0-180 (above 90° the hole is read as 180° - θ); outside 55-90° a note is
        attached (the correlation's range).  Below 6.6° the fitted C_ang turns negative; it is
        held at 0 there (the slip term vanishes, an extrapolation of ours).

    Notes
    -----
    Pipe rotation is not part of the correlation.  Constants from memory, not checked against
    the source (calc/METHODS.md §10.12 says what was checked).  45-60° is the hardest range for
    cleaning (Amanna & Khorsand Movaghar 2016).

    References
    ----------
    Larsen, T.I., Pilehvari, A.A. & Azar, J.J. (1997) Development of a new cuttings-transport
    model for high-angle wellbores including horizontal wells. SPE Drilling & Completion 12(2),
    129-135.

    >>> r = larsen_critical_velocity(0.0049, 0.2184, 0.127, density=1318.0, k=0.02, tau_y=7.0,
    ...                              n=1.0, cuttings_size=0.00635, inclination=70.0)
    >>> 0.5 < r.critical_velocity < 2.0
    True
    """
    r = check_positive("rate of penetration", rop, "m/s")
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    rho = check_positive("mud density", density, "kg/m³")
    ds = check_positive("cuttings size", cuttings_size, "m")
    inc = check_range("inclination", inclination, 0.0, 180.0, "degree")
    inc = np.where(inc > 90.0, 180.0 - inc, inc)
    notes = []
    lo, hi = LARSEN_RANGE
    if np.any((inc < lo) | (inc > hi)):
        notes.append(
            Note(
                "warning",
                "larsen_angle_range",
                f"Larsen-Pilehvari-Azar critical velocity used outside its {lo:g}-{hi:g}° range.",
                "high-angle cleaning",
            )
        )
    c_ang = np.maximum(LARSEN_ANGLE[0] + LARSEN_ANGLE[1] * inc + LARSEN_ANGLE[2] * inc**2, 0.0)
    c_size = _LPA_SIZE[0] + _LPA_SIZE[1] * ds
    if np.any(c_size <= 0):
        raise InputError("cuttings size", float(np.max(ds)), f"< {1.286 / 1.04:.3g} in (Larsen)")
    c_mw = np.where(rho > _LPA_MW[0], 1.0 - _LPA_MW[1] * (rho - _LPA_MW[0]), 1.0)
    conc = np.asarray(larsen_concentration(r))
    v_cut = np.asarray(larsen_cuttings_velocity(r, d2, d1))

    def v_slip(v):
        mu = np.asarray(annular_apparent_viscosity(v, d2, d1, tau_y, k, n))
        v0 = np.where(
            mu <= _LPA_MU_BREAK, _LPA_A1 * mu + _LPA_B1, _LPA_A2 * (mu - _LPA_MU_BREAK) + _LPA_B2
        )
        return c_ang * c_size * c_mw * v0, mu

    floor = np.maximum(v_cut, 1e-3)
    upper = floor + v_slip(floor)[0] + 1.0
    v = bisect_increasing(lambda x: x - v_cut - v_slip(x)[0], floor, upper, iterations=70)
    vs, mu = v_slip(v)
    area = cross_section_area(d2, d1)
    return LarsenResult(
        critical_velocity=scalar_or_array(v),
        critical_rate=scalar_or_array(v * area),
        cuttings_velocity=scalar_or_array(np.broadcast_to(v_cut, np.shape(v))),
        slip_velocity=scalar_or_array(vs),
        concentration=scalar_or_array(np.broadcast_to(conc, np.shape(v))),
        apparent_viscosity=scalar_or_array(mu),
        angle_factor=scalar_or_array(np.broadcast_to(c_ang, np.shape(v))),
        size_factor=scalar_or_array(np.broadcast_to(c_size, np.shape(v))),
        mud_weight_factor=scalar_or_array(np.broadcast_to(c_mw, np.shape(v))),
        method="larsen_1997: Larsen, Pilehvari & Azar (1997) SPE Drill. & Compl. 12(2):129-135 "
        "(constants from memory, not checked against the source; see calc/METHODS.md §10.12)",
        notes=tuple(notes),
    )


def larsen_angle_slope_bound(rop, d_hole, d_pipe, *, density, k, tau_y=0.0, n=1.0,
                             cuttings_size):  # fmt: skip
    """Upper bound of |dV_crit/dθ| of :func:`larsen_critical_velocity` [m/s per degree].

    .. math:: \\left|\\frac{dV_{crit}}{d\\theta}\\right| \\le a_1\\,C_{size}C_{mw}
              V_{slip,0}(\\mu_a(V_{cut}))

    with a₁ = 0.0342/degree, the largest slope of C_ang (at θ = 0; C_ang' = a₁ + 2a₂θ falls with
    θ).  dV/dθ = C_ang'·C_size·C_mw·V0/(1 - ∂V_slip/∂V) and ∂V_slip/∂V ≤ 0 (V0 rises with μ_a,
    μ_a falls with V for n ≤ 1), and V ≥ V_cut bounds μ_a by μ_a(V_cut) (calc/METHODS.md
    §10.13).  For n > 1 the larger μ_a at V_cut and at V_cut + 10 m/s is taken.

    >>> b = larsen_angle_slope_bound(0.0049, 0.2184, 0.127, density=1318.0, k=0.02, tau_y=7.0,
    ...                              cuttings_size=0.00635)
    >>> 0.01 < b < 0.1
    True
    """
    d2 = check_positive("hole diameter", d_hole, "m")
    d1 = check_nonnegative("pipe diameter", d_pipe, "m")
    rho = check_positive("mud density", density, "kg/m³")
    ds = check_positive("cuttings size", cuttings_size, "m")
    v_cut = np.maximum(np.asarray(larsen_cuttings_velocity(rop, d2, d1)), 1e-3)
    mu = np.maximum(
        np.asarray(annular_apparent_viscosity(v_cut, d2, d1, tau_y, k, n)),
        np.asarray(annular_apparent_viscosity(v_cut + 10.0, d2, d1, tau_y, k, n)),
    )
    v0 = np.where(
        mu <= _LPA_MU_BREAK, _LPA_A1 * mu + _LPA_B1, _LPA_A2 * (mu - _LPA_MU_BREAK) + _LPA_B2
    )
    c_size = _LPA_SIZE[0] + _LPA_SIZE[1] * ds
    c_mw = np.where(rho > _LPA_MW[0], 1.0 - _LPA_MW[1] * (rho - _LPA_MW[0]), 1.0)
    return scalar_or_array(LARSEN_ANGLE[1] * c_size * c_mw * v0)


@dataclass(frozen=True)
class CleaningCriteria:
    """Thresholds for the per-interval verdict (all user-settable).

    Defaults are common practice (calc/METHODS.md §10.13, §16.6) unless said otherwise:

    transport_ratio_adequate / _poor   F_T ≥ 0.7 adequate, < 0.5 poor
    concentration_adequate / _poor     C_a ≤ 4 % adequate, > 5 % poor (by volume)
    cci_adequate / cci_poor            CCI ≥ 1.0 adequate, < 0.5 poor
    critical_ratio_adequate / _poor    Q/Q_crit ≥ 1.0 adequate, < 0.9 poor, for every deviated-hole
                                       method (Larsen, Rubiandini) — the 0.9 band is this
                                       program's default, not a published value
    vertical_limit                     35°: the near-vertical range of the vertical criteria
                                       (F_T, CCI).  There is no switch: every criterion is applied
                                       at every inclination and the most demanding governs
                                       (calc/METHODS.md §10.13); above this angle a note says the
                                       vertical criteria are used outside their range.
    """

    transport_ratio_adequate: float = 0.7
    transport_ratio_poor: float = 0.5
    concentration_adequate: float = 0.04
    concentration_poor: float = 0.05
    cci_adequate: float = 1.0
    cci_poor: float = 0.5
    critical_ratio_adequate: float = 1.0
    critical_ratio_poor: float = 0.9
    vertical_limit: float = 35.0

    def __post_init__(self):
        for a, p, name in (
            ("transport_ratio_adequate", "transport_ratio_poor", "transport ratio"),
            ("cci_adequate", "cci_poor", "CCI"),
            ("critical_ratio_adequate", "critical_ratio_poor", "critical-rate ratio"),
        ):
            va, vp = float(getattr(self, a)), float(getattr(self, p))
            if not np.isfinite(va) or not np.isfinite(vp) or vp > va:
                raise InputError(f"{name} thresholds", (va, vp), "finite, poor ≤ adequate")
        cr = float(self.critical_ratio_poor)
        if cr <= 0:
            raise InputError("critical-rate ratio thresholds", cr, "> 0")
        ca, cp = float(self.concentration_adequate), float(self.concentration_poor)
        if not (0 < ca <= cp < 1):
            raise InputError("concentration thresholds", (ca, cp), "0 < adequate ≤ poor < 1")
        check_range("vertical limit", self.vertical_limit, 0.0, 90.0, "degree")

    def critical_ratio(self, level: str) -> float:
        """The Q/Q_crit threshold of ``level`` ("adequate" or "marginal")."""
        return float(
            self.critical_ratio_adequate if level == "adequate" else self.critical_ratio_poor
        )

    def describe(self) -> str:
        """The thresholds in one sentence, for results and reports."""
        return (
            f"adequate: transport ratio ≥ {self.transport_ratio_adequate:g}, cuttings "
            f"concentration ≤ {100 * self.concentration_adequate:g} %, CCI ≥ "
            f"{self.cci_adequate:g}, Q/Q_crit ≥ {self.critical_ratio_adequate:g} (Larsen and "
            f"Rubiandini); poor: transport ratio < {self.transport_ratio_poor:g}, concentration > "
            f"{100 * self.concentration_poor:g} %, CCI < {self.cci_poor:g}, Q/Q_crit < "
            f"{self.critical_ratio_poor:g}; marginal between; every criterion at every "
            "inclination, the most demanding governs"
        )


def _level_high(x, adequate, poor):
    """0/1/2 (adequate/marginal/poor) for a higher-is-better quantity."""
    return np.where(x >= adequate, 0, np.where(x < poor, 2, 1))


def _level_low(x, adequate, poor):
    return np.where(x <= adequate, 0, np.where(x > poor, 2, 1))


def verdict_levels(
    criteria: CleaningCriteria, vertical, transport_ratio, concentration, cci, ratio
):
    """Per-criterion levels and the overall level (worst of those that apply).

    ``vertical`` marks intervals where the vertical criteria (transport ratio, CCI) apply;
    ``ratio`` is Q/Q_crit of the governing deviated-hole method (``inf`` where none applies);
    the concentration applies everywhere.  Returns a dict of arrays with keys transport_ratio,
    concentration, cci, critical_ratio, overall (0/1/2; -1 where a criterion does not apply).
    """
    c = criteria
    lt = _level_high(transport_ratio, c.transport_ratio_adequate, c.transport_ratio_poor)
    lc = _level_low(concentration, c.concentration_adequate, c.concentration_poor)
    li = _level_high(cci, c.cci_adequate, c.cci_poor)
    ratio = np.asarray(ratio, dtype=float)
    lr = np.where(np.isinf(ratio), -1, _level_high(ratio, c.critical_ratio_adequate,
                                                     c.critical_ratio_poor))  # fmt: skip
    lt = np.where(vertical, lt, -1)
    li = np.where(vertical, li, -1)
    overall = np.maximum(np.maximum(lt, lc), np.maximum(li, lr))
    return {
        "transport_ratio": lt,
        "concentration": lc,
        "cci": li,
        "critical_ratio": lr,
        "overall": overall,
    }


def cleaning_score(
    criteria: CleaningCriteria, level: str, vertical, transport_ratio, concentration, cci, ratio
):
    """Smallest relative margin to the ``level`` thresholds ("adequate" or "marginal"); ≥ 0 where
    the interval is at least that good.  Increases with flow rate (used to find minimum rates).

    The concentration margin applies everywhere, the transport-ratio and CCI margins where
    ``vertical``, the Q/Q_crit margin where ``ratio`` is finite (calc/METHODS.md §10.13).
    """
    c = criteria
    if level == "adequate":
        t, cc, ci = c.transport_ratio_adequate, c.concentration_adequate, c.cci_adequate
    else:
        t, cc, ci = c.transport_ratio_poor, c.concentration_poor, c.cci_poor
    cr = c.critical_ratio(level)
    m_c = (cc - concentration) / cc
    m_t = (transport_ratio - t) / max(abs(t), 1e-9)
    m_i = (cci - ci) / max(abs(ci), 1e-9)
    m_r = (np.asarray(ratio, dtype=float) - cr) / cr
    vert = np.where(vertical, np.minimum(m_t, m_i), np.inf)
    return np.minimum(np.minimum(vert, m_c), m_r)
