"""Cuttings slip (settling) velocity by several published correlations.

Every correlation takes the mud as Herschel-Bulkley parameters (τ_y, K, n in SI); Newtonian
(τ_y = 0, n = 1, K = μ), Bingham (n = 1) and power law (τ_y = 0) are special cases.  Each
correlation uses an apparent viscosity μ_a = τ(γ̇)/γ̇ evaluated at the shear rate its authors
chose (stated per method).  Field-unit constants of the published formulas are converted here
to SI once, at import, from the exact unit factors of :mod:`calc.units`; the tests prove the
field formula and the SI form agree.

Methods (``method=``, resolved through :data:`SLIP_METHODS`):

``moore``          Moore (1974) as given in Bourgoyne et al. (1986): drag 40/Re, 22/√Re, 1.5;
                   μ_a at the annular wall shear rate.  Needs the annular velocity and diameters.
``chien``          Chien (1971, 1994): drag 24/Re + 1.72 (implied by the printed field form);
                   μ_a at γ̇ = 8V_a/d_s.  Needs the annular velocity.
``walker_mayes``   Walker & Mayes (1975): particle shear stress from cuttings thickness, shear rate
                   read from the rheogram; transitional regime, disc drag when turbulent.
``api13d``         API RP 13D slip-velocity formula (as remembered, calc/METHODS.md §10.6):
                   μ_a at γ̇ = 12V_s/d_s; iterated.
``drag_balance``   Sphere-equivalent drag balance with the Haider & Levenspiel (1989) drag law for
                   non-spherical particles (sphericity ψ); μ_a at the combined shear rate
                   √((V_s/d_s)² + γ̇_a²), γ̇_a = 12V_a/(D2 - D1) the annular wall shear rate of
                   Moore's method (0 where no annular flow is given: mud at rest).
``fang_2008``      The same drag balance with the Fang et al. (2008) drag correlation for
                   cuttings (sphericity ψ), as printed in Guo & Liu (2011) eqs. 2.90-2.96; μ_a
                   as for ``drag_balance``.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from types import SimpleNamespace

import numpy as np

from calc.errors import InputError, check_nonnegative, check_positive
from calc.flow import api_wall_shear
from calc.notes import Note
from calc.numeric import bisect_increasing, scalar_or_array
from calc.registry import MethodRegistry
from calc.units import G_N, si_factor

__all__ = [
    "API13D_DRAG",
    "CHIEN_DRAG",
    "SLIP_METHODS",
    "SlipResult",
    "annular_apparent_viscosity",
    "combined_shear_rate",
    "fang_drag",
    "haider_levenspiel_drag",
    "hb_apparent_viscosity",
    "slip_velocity",
]

# Exact unit factors (NIST SP 811 App. B via calc.units).
_FT = si_factor("ft")
_IN = si_factor("in")
_PPG = si_factor("ppg")
_CP = si_factor("cP")
_LBF100 = si_factor("lbf/100ft2")


def _quadratic_drag(c1: float, c2: float) -> tuple[float, float]:
    """(a, b) of the drag law f = a/Re + b behind a printed field formula
    V = c1·(μ/(ρd))·[√(1 + c2·d·(Δρ/ρ)·(ρd/μ)²) - 1]  (V ft/s, μ cP, ρ ppg, d in).

    The drag balance V² = 4gdΔρ/(3fρ) with f = a/Re + b, Re = ρVd/μ, solves to
    V = (a/2b)(μ/ρd)[√(1 + (16b/3a²)·g·d(Δρ/ρ)(ρd/μ)²) - 1]; matching both constants in SI gives
    a/2b = c1·ft·ppg·in/cP and b/a² = 3c2·cP²/(16·g·ppg²·in³).
    """
    r = c1 * _FT * _PPG * _IN / _CP
    s = 3.0 * c2 * _CP**2 / (16.0 * G_N * _PPG**2 * _IN**3)
    b = 1.0 / (4.0 * r * r * s)
    return 2.0 * r * b, b


#: Chien's drag law (a, b) implied by V_s = 0.0075(μ_a/(ρd))[√(36,800·d(Δρ/ρ)(ρd/μ_a)² + 1) - 1]
#: ft/s (constants from memory, not yet checked against the source — calc/METHODS.md §10.4); works
#: out to ≈ (24.0, 1.72).
CHIEN_DRAG = _quadratic_drag(0.0075, 36_800.0)
#: API RP 13D slip formula V_s = 0.01344(μ/(ρd))[√(1 + 16,465·d(ρ_p/ρ - 1)(ρd/μ)²) - 1], read as
#: ft/s, cP, ppg, in (constants, units and grouping from memory, not yet checked against the
#: source — calc/METHODS.md §10.6); works out to ≈ (30.0, 1.20).
API13D_DRAG = _quadratic_drag(0.01344, 16_465.0)

# Moore (1974) drag coefficients and regime bounds, dimensionless (Bourgoyne et al. 1986, §4.13;
# from memory, not yet checked against the source — calc/METHODS.md §10.3).
_MOORE_RE_LOW, _MOORE_RE_HIGH = 3.0, 300.0
_MOORE_F_VISCOUS, _MOORE_F_INTER, _MOORE_F_TURB = 40.0, 22.0, 1.5

# Walker & Mayes (1975) constants, field units (lbf/100 ft², in, ppg, ft/s, 1/s); from memory,
# not yet checked against the source — calc/METHODS.md §10.5.
# τ_p = 7.9√(t·Δρ); V_s = 0.0203·τ_p·√(d·γ̇/√ρ).
_WM_TAU = 7.9 * _LBF100 / np.sqrt(_IN * _PPG)
_WM_VEL = 0.0203 * _FT / _LBF100 / np.sqrt(_IN) * _PPG**0.25
#: Particle Reynolds number above which the Walker-Mayes transitional form is replaced by the
#: turbulent (constant-drag) settling law: 100 (from memory, not yet checked against the source —
#: calc/METHODS.md §10.5).
WM_TURBULENT_RE = 100.0
#: Drag coefficient of a thin disc broadside to the flow at high Re, 1.17 (White, *Fluid
#: Mechanics*, Table 7.3; from memory) — our completion of the Walker-Mayes turbulent branch.
DISC_DRAG = 1.17

#: Slip-velocity methods: name → implementation, description, source.
SLIP_METHODS = MethodRegistry("slip-velocity method")


@dataclass(frozen=True)
class SlipResult:
    """Slip velocity and the intermediates behind it (SI).

    velocity            slip velocity V_s [m/s] (0 where the yield stress holds the particle)
    reynolds            particle Reynolds number ρV_s·d_s/μ_a [-]
    drag_coefficient    drag coefficient f used in V_s² = 4g·d_sΔρ/(3fρ) [-] (NaN-free; 0 where
                        the method has no drag coefficient, i.e. Walker-Mayes transitional)
    apparent_viscosity  μ_a [Pa·s] at ``shear_rate``
    shear_rate          shear rate at which μ_a was evaluated [1/s]
    regime              per-element label of the correlation branch used
    method              method name with its source
    notes               :class:`calc.errors.Note` findings
    """

    velocity: np.ndarray | float
    reynolds: np.ndarray | float
    drag_coefficient: np.ndarray | float
    apparent_viscosity: np.ndarray | float
    shear_rate: np.ndarray | float
    regime: np.ndarray | str
    method: str
    notes: tuple[Note, ...] = field(default=())


def hb_apparent_viscosity(shear_rate, tau_y, k, n):
    """Herschel-Bulkley apparent viscosity μ_a = (τ_y + Kγ̇ⁿ)/γ̇ [Pa·s].

    Parameters
    ----------
    shear_rate : array_like
        γ̇ [1/s], > 0.
    tau_y, k, n : array_like
        Yield stress [Pa], consistency [Pa·sⁿ], flow index [-].

    >>> round(hb_apparent_viscosity(100.0, 0.0, 0.02, 1.0), 6)
    0.02
    """
    g = np.asarray(shear_rate, dtype=float)
    return scalar_or_array((tau_y + k * g**n) / g)


def annular_apparent_viscosity(annular_velocity, d_hole, d_pipe, tau_y, k, n):
    """Annular apparent viscosity μ_a = τ_w/(12V_a/(D2 - D1)) [Pa·s] (laminar slot basis).

    .. math:: \\tau_w = (3/2)^n\\tau_y + K\\left(\\frac{2n+1}{3n}\\frac{12V_a}{D_2-D_1}\\right)^n

    The wall stress is the API RP 13D (2006+) annular laminar form (calc/METHODS.md §7.1, α = 1;
    §10.1), computed by :func:`calc.flow.api_wall_shear`.  For a power-law fluid this is exactly
    Moore's μ_a = (K/144)[(D2-D1)/V_a]^(1-n)[(2+1/n)/0.0208]ⁿ
    (Bourgoyne et al. 1986; field units, K eq. cP, ft/s, in; 0.0208 ≈ 1/48) and for a Bingham
    fluid exactly the Bingham annular μ_a = PV + 5·YP·(D2-D1)/V_a (cP, lbf/100 ft², in, ft/s).

    Parameters
    ----------
    annular_velocity : array_like
        Mean annular velocity V_a [m/s], > 0.
    d_hole, d_pipe : array_like
        Hole (or casing) inner diameter D2 and pipe outer diameter D1 [m].
    tau_y, k, n : array_like
        Herschel-Bulkley parameters [Pa], [Pa·sⁿ], [-].

    >>> round(annular_apparent_viscosity(1.0, 0.2, 0.1, 0.0, 0.03, 1.0), 6)
    0.03
    """
    gap = np.asarray(d_hole, dtype=float) - d_pipe
    v = np.asarray(annular_velocity, dtype=float)
    _, wall = api_wall_shear(v, gap, tau_y, k, n, 1.0)
    return scalar_or_array(wall / (12.0 * v / gap))


def haider_levenspiel_drag(reynolds, sphericity=1.0):
    """Drag coefficient of an isometric non-spherical particle, Haider & Levenspiel (1989).

    .. math:: C_D = \\frac{24}{Re}(1 + A\\,Re^B) + \\frac{C}{1 + D/Re}

    A = exp(2.3288 - 6.4581ψ + 2.4486ψ²), B = 0.0964 + 0.5565ψ,
    C = exp(4.905 - 13.8944ψ + 18.4222ψ² - 10.2599ψ³),
    D = exp(1.4681 + 12.2584ψ - 20.7322ψ² + 15.8855ψ³).

    Parameters
    ----------
    reynolds : array_like
        Particle Reynolds number [-], > 0.
    sphericity : array_like
        Wadell sphericity ψ [-], in (0, 1].

    Notes
    -----
    Coefficients from memory, unverified (the ψ = 1 values agree with the published sphere fit
    24/Re(1 + 0.1806Re^0.6459) + 0.4251/(1 + 6880.95/Re) to ~3 %; tests compare with ``fluids``).
    Valid for Re < 2.6e5, ψ ≥ ~0.67 (as remembered).

    References
    ----------
    Haider, A. & Levenspiel, O. (1989). Drag coefficient and terminal velocity of spherical and
    nonspherical particles. Powder Technology 58(1), 63-70.

    >>> round(haider_levenspiel_drag(1e4), 2)
    0.44
    """
    re = np.asarray(reynolds, dtype=float)
    p = np.asarray(sphericity, dtype=float)
    a = np.exp(2.3288 - 6.4581 * p + 2.4486 * p**2)
    b = 0.0964 + 0.5565 * p
    c = np.exp(4.905 - 13.8944 * p + 18.4222 * p**2 - 10.2599 * p**3)
    d = np.exp(1.4681 + 12.2584 * p - 20.7322 * p**2 + 15.8855 * p**3)
    return scalar_or_array(24.0 / re * (1.0 + a * re**b) + c / (1.0 + d / re))


# Fang et al. (2008) drag-correlation coefficients, cubic in sphericity ψ (Guo & Liu 2011,
# Applied Drilling Circulation Systems, eqs. 2.93-2.95, printed).
_FANG_A = (2.2954, -2.2626, 4.4395, -2.9825)
_FANG_B = (-0.4193, -1.9014, 3.3416, -2.0409)
_FANG_C = (0.1117, 0.0553, -0.1468, 0.1145)


def _cubic(coef, p):
    return coef[0] + coef[1] * p + coef[2] * p**2 + coef[3] * p**3


def fang_drag(re, sphericity=1.0):
    """Particle drag coefficient of Fang et al. (2008) for drilled cuttings.

    f_p = 10^(A′ + B′·log Re + C′·(log Re)²), with A′, B′, C′ cubic in the sphericity ψ
    (Guo & Liu 2011, eqs. 2.92-2.95).  Where the quadratic's log-log slope B′ + 2C′·log Re
    falls below -1 (creeping flow, Re ≲ 0.2 for ψ = 0.8) it is continued with slope -1, the
    Stokes-like form f ∝ 1/Re, joined with a continuous slope (our choice: the quadratic would
    let drag outgrow Stokes' law, and with a yield stress no particle would ever settle).

    Parameters
    ----------
    re : array_like
        Particle Reynolds number ρV_s d_s/μ [-], > 0.
    sphericity : array_like
        ψ in (0, 1] [-].

    References
    ----------
    Fang, Sun, Yu & Kui (2008), as printed in Guo, B. & Liu, G. (2011) Applied Drilling
    Circulation Systems, Gulf Professional Publishing, eqs. 2.92-2.96 and Table 2.4.

    Examples
    --------
    >>> round(float(fang_drag(240.0, 0.8)), 3)   # Guo & Liu (2011) Table 2.4 prints 2.9350
    2.935
    """
    p = np.asarray(sphericity, dtype=float)
    a, b, c = _cubic(_FANG_A, p), _cubic(_FANG_B, p), _cubic(_FANG_C, p)
    x = np.log10(np.asarray(re, dtype=float))
    x0 = (-1.0 - b) / (2.0 * c)  # where d log f / d log Re = -1
    low = a + b * x0 + c * x0 * x0 - (x - x0)
    return scalar_or_array(10.0 ** np.where(x >= x0, a + b * x + c * x * x, low))


def _moore_drag(re):
    return np.where(
        re < _MOORE_RE_LOW,
        _MOORE_F_VISCOUS / re,
        np.where(re < _MOORE_RE_HIGH, _MOORE_F_INTER / np.sqrt(re), _MOORE_F_TURB),
    )


def _solve_drag_balance(c, mu_of_v, drag_of_re, f_min):
    """V_s with 3f(Re)ρV² = 4g·dΔρ, Re = ρVd/μ(V); vectorised bisection on log V.

    Returns (V, held) where ``held`` marks particles whose drag at vanishing velocity already
    exceeds their buoyant weight (a yield stress holds them; V = 0 there).
    """
    weight = 4.0 * G_N * c.d * c.drho

    def residual(v):
        re = c.rho * v * c.d / mu_of_v(v)
        return 3.0 * drag_of_re(re) * c.rho * v * v - weight

    v_hi = 2.0 * np.sqrt(weight / (3.0 * f_min * c.rho))
    v_lo = np.full_like(v_hi, 1e-12)
    held = residual(v_lo) > 0.0
    v = bisect_increasing(residual, v_lo, v_hi, iterations=90, log=True)
    return np.where(held, 0.0, v), held


def _moore_branches(c, mu):
    """Moore's slip velocity in closed form, branch by branch (μ_a does not depend on V_s).

    The drag balance 3f(Re)ρV² = 4g·dΔρ is solved on each branch of Moore's drag law:
    viscous f = 40/Re → V = 4g·d²Δρ/(120μ); intermediate f = 22/√Re →
    V = [4g·dΔρ/(66√(ρμ/d))]^(2/3); turbulent f = 1.5 → V = √(4g·dΔρ/(4.5ρ)).  The published
    law is discontinuous (f falls from 13.3 to 12.7 at Re = 3 and rises from 1.27 to 1.5 at
    Re = 300), so near Re = 3 two branches can both be self-consistent and near Re = 300
    neither.  Where two are, the larger slip velocity is taken (the conservative choice for
    hole cleaning); where none is, V is held at the Re = 300 boundary, where the balance changes
    sign.  The choice is the same for every input, so slip varies monotonically within a branch
    and jumps only where the published law does (by at most 5 % at Re = 3).
    """
    weight = 4.0 * G_N * c.d * c.drho
    v_visc = weight * c.d / (3.0 * _MOORE_F_VISCOUS * mu)
    v_inter = (weight / (3.0 * _MOORE_F_INTER * np.sqrt(c.rho * mu / c.d))) ** (2.0 / 3.0)
    v_turb = np.sqrt(weight / (3.0 * _MOORE_F_TURB * c.rho))

    def re_of(v):
        return c.rho * v * c.d / mu

    ok_visc = re_of(v_visc) < _MOORE_RE_LOW
    ok_inter = (re_of(v_inter) >= _MOORE_RE_LOW) & (re_of(v_inter) < _MOORE_RE_HIGH)
    ok_turb = re_of(v_turb) >= _MOORE_RE_HIGH
    v = np.where(ok_turb, v_turb, 0.0)
    v = np.maximum(v, np.where(ok_inter, v_inter, 0.0))
    v = np.maximum(v, np.where(ok_visc, v_visc, 0.0))
    gap = ~(ok_visc | ok_inter | ok_turb)
    v = np.where(gap, _MOORE_RE_HIGH * mu / (c.rho * c.d), v)
    held = np.zeros(np.shape(v), dtype=bool)  # Moore's laws have no yield term: never held
    return v, held


def _held_note(held, method, flowing=False):
    """Why a slip velocity is 0: the yield stress exceeds the particle's buoyant-weight stress
    at the shear rate the method uses (at rest where no annular flow is given)."""
    if np.any(held):
        why = (
            "at the shear rate this method uses (its particle stress does not exceed the yield "
            "stress even in the flowing annulus)"
            if flowing
            else "at rest (no annular flow given)"
        )
        return (
            Note(
                "info",
                "cuttings_held",
                f"{method}: the mud's yield stress holds the cuttings in suspension {why}: "
                "slip velocity 0 in at least one case.",
                "slip velocity",
            ),
        )
    return ()


@SLIP_METHODS.register(
    "moore",
    "Moore: drag 40/Re (Re<3), 22/√Re (3-300), 1.5 (>300); μ_a at the annular wall shear rate",
    "Moore, P.L. (1974) Drilling Practices Manual; as in Bourgoyne et al. (1986) Applied Drilling "
    "Engineering, SPE Textbook Series 2, §4.13",
)
def _moore(c):
    mu = annular_apparent_viscosity(c.v_a, c.d_hole, c.d_pipe, c.tau_y, c.k, c.n)
    mu = np.broadcast_to(mu, c.shape)
    v, held = _moore_branches(c, mu)
    re = c.rho * v * c.d / mu
    regime = np.where(
        re < _MOORE_RE_LOW, "viscous", np.where(re < _MOORE_RE_HIGH, "intermediate", "turbulent")
    )
    f = np.where(v > 0, _moore_drag(np.maximum(re, 1e-300)), 0.0)
    gamma = 12.0 * c.v_a / (c.d_hole - c.d_pipe)
    return v, re, f, mu, np.broadcast_to(gamma, c.shape), regime, _held_note(held, "moore")


@SLIP_METHODS.register(
    "chien",
    "Chien: drag 24/Re + 1.72 (from the printed field form); μ_a at γ̇ = 8V_a/d_s",
    "Chien, S.F. (1971) SPE 3505; Chien, S.F. (1994) SPE Drilling & Completion 9(4)",
)
def _chien(c):
    a, b = CHIEN_DRAG
    gamma = np.broadcast_to(8.0 * c.v_a / c.d, c.shape)
    mu = np.broadcast_to(hb_apparent_viscosity(gamma, c.tau_y, c.k, c.n), c.shape)
    x = mu / (c.rho * c.d)
    v = (
        (a / (2 * b))
        * x
        * (np.sqrt(1.0 + 16.0 * b / (3.0 * a * a) * G_N * c.d * (c.drho / c.rho) / x**2) - 1.0)
    )
    re = c.rho * v * c.d / mu
    f = a / re + b
    return v, re, f, mu, gamma, np.full(c.shape, "quadratic drag"), ()


@SLIP_METHODS.register(
    "walker_mayes",
    "Walker-Mayes: particle shear stress from thickness, shear rate from the rheogram",
    "Walker, R.E. & Mayes, T.M. (1975) Design of muds for carrying capacity, JPT 27(7), SPE 4975; "
    "turbulent branch: disc drag, White, Fluid Mechanics, Table 7.3",
)
def _walker_mayes(c):
    tau_p = _WM_TAU * np.sqrt(c.t * c.drho)
    excess = tau_p - c.tau_y
    held = excess <= 0.0
    gamma = np.where(held, 0.0, (np.maximum(excess, 0.0) / c.k) ** (1.0 / c.n))
    v_tr = _WM_VEL * tau_p * np.sqrt(c.d * gamma / np.sqrt(c.rho))
    mu = np.where(held, np.inf, tau_p / np.where(held, 1.0, gamma))
    re_tr = np.where(held, 0.0, c.rho * v_tr * c.d / np.where(held, 1.0, mu))
    turbulent = re_tr >= WM_TURBULENT_RE
    v_turb = np.sqrt(2.0 * G_N * c.t * c.drho / (DISC_DRAG * c.rho))
    v = np.where(held, 0.0, np.where(turbulent, v_turb, v_tr))
    re = np.where(held, 0.0, c.rho * v * c.d / np.where(held, 1.0, mu))
    f = np.where(turbulent & ~held, DISC_DRAG, 0.0)
    regime = np.where(held, "held", np.where(turbulent, "turbulent", "transitional"))
    mu_out = np.where(held, 0.0, mu)  # no finite μ_a where the stress is below the yield stress
    notes = _held_note(held, "walker_mayes", c.flowing)
    if np.any(turbulent & ~held):
        notes += (
            Note(
                "info",
                "walker_mayes_turbulent",
                "walker_mayes: particle Reynolds number ≥ 100, so the settling law of a disc with "
                "drag coefficient 1.17 was used instead of the transitional form.",
                "slip velocity",
            ),
        )
    return v, re, f, mu_out, gamma, regime, notes


@SLIP_METHODS.register(
    "api13d",
    "API RP 13D slip formula: drag ≈ 30/Re + 1.2 (from the printed form); μ_a at 12V_s/d_s",
    "API RP 13D, Rheology and Hydraulics of Oil-well Drilling Fluids, 3rd ed. (1995)",
)
def _api13d(c):
    a, b = API13D_DRAG

    def mu_of_v(v):
        return hb_apparent_viscosity(12.0 * v / c.d, c.tau_y, c.k, c.n)

    v, held = _solve_drag_balance(c, mu_of_v, lambda re: a / re + b, b)
    vv = np.where(held, 1e-12, v)
    mu = np.asarray(mu_of_v(vv))
    re = np.where(held, 0.0, c.rho * v * c.d / mu)
    f = np.where(held, 0.0, a / np.where(held, 1.0, re) + b)
    gamma = 12.0 * v / c.d
    return (
        v,
        re,
        f,
        mu,
        gamma,
        np.where(held, "held", "quadratic drag"),
        _held_note(held, "api13d", c.flowing),
    )


def combined_shear_rate(particle_rate, annular_rate):
    """Magnitude of the shear rate a settling particle sees in a flowing annulus [1/s].

    .. math:: \\dot\\gamma = \\sqrt{\\dot\\gamma_p^2 + \\dot\\gamma_a^2},\\quad
              \\dot\\gamma_p = V_s/d_s,\\quad \\dot\\gamma_a = 12V_a/(D_2 - D_1)

    γ̇_a is the annular wall shear rate Moore's method evaluates μ_a at (Bourgoyne et al. 1986,
    §4.13); the quadrature sum is the magnitude (second invariant) of two superposed orthogonal
    simple shears — our combination, not a published correlation (calc/METHODS.md §10.2).  In a
    Newtonian fluid it changes nothing (μ does not depend on γ̇).

    >>> float(combined_shear_rate(3.0, 4.0))
    5.0
    """
    return scalar_or_array(np.hypot(particle_rate, annular_rate))


def _at_rest_note(c, method):
    """Drag-balance methods without annular flow: the yield stress acts at the particle's own
    shear rate only, so slip in a yield-stress mud is that of still mud (small or 0)."""
    if not c.flowing and np.any(c.tau_y > 0):
        return (
            Note(
                "info",
                "slip_mud_at_rest",
                f"{method}: no annular flow given, so the mud is taken at rest; its yield stress "
                "then acts at the particle's own shear rate and the slip is that of still mud "
                "(give the annular velocity and diameters for a flowing annulus).",
                "slip velocity",
            ),
        )
    return ()


def _mu_combined(c):
    def mu_of_v(v):
        return hb_apparent_viscosity(combined_shear_rate(v / c.d, c.gamma_a), c.tau_y, c.k, c.n)

    return mu_of_v


@SLIP_METHODS.register(
    "drag_balance",
    "sphere-equivalent drag balance, Haider-Levenspiel drag with sphericity; μ_a at the combined "
    "particle and annular shear rate √((V_s/d_s)² + (12V_a/(D2-D1))²)",
    "Haider, A. & Levenspiel, O. (1989) Powder Technology 58:63-70; drag balance as in "
    "Bird, Stewart & Lightfoot (2002) Transport Phenomena, 2nd ed., §6.3; annular shear rate as "
    "in Moore's method",
)
def _drag_balance(c):
    mu_of_v = _mu_combined(c)

    v, held = _solve_drag_balance(c, mu_of_v, lambda re: haider_levenspiel_drag(re, c.psi), 0.05)
    vv = np.where(held, 1e-12, v)
    mu = np.asarray(mu_of_v(vv))
    re = np.where(held, 0.0, c.rho * v * c.d / mu)
    f = np.where(held, 0.0, haider_levenspiel_drag(np.where(held, 1.0, re), c.psi))
    notes = _held_note(held, "drag_balance", c.flowing) + _at_rest_note(c, "drag_balance")
    if np.any(re > 2.6e5):
        notes += (
            Note(
                "warning",
                "drag_law_range",
                "drag_balance: particle Reynolds number above 2.6e5, beyond the drag law's range.",
                "slip velocity",
            ),
        )
    gamma = combined_shear_rate(v / c.d, c.gamma_a)
    return v, re, f, mu, gamma, np.where(held, "held", "drag law"), notes


@SLIP_METHODS.register(
    "fang_2008",
    "drag balance with the Fang et al. (2008) cuttings drag correlation; μ_a at the combined "
    "particle and annular shear rate",
    "Fang et al. (2008), as printed in Guo & Liu (2011) Applied Drilling Circulation Systems, "
    "eqs. 2.90-2.96; annular shear rate as in Moore's method",
)
def _fang(c):
    mu_of_v = _mu_combined(c)

    def drag(re):
        return fang_drag(re, c.psi)

    # smallest drag of the quadratic in log Re (its vertex; C′ > 0 for 0 < ψ ≤ 1) brackets V
    p = np.asarray(c.psi, dtype=float)
    a, b, cc = _cubic(_FANG_A, p), _cubic(_FANG_B, p), _cubic(_FANG_C, p)
    f_min = float(np.min(10.0 ** (a - b * b / (4.0 * cc))))
    v, held = _solve_drag_balance(c, mu_of_v, drag, f_min)
    vv = np.where(held, 1e-12, v)
    mu = np.asarray(mu_of_v(vv))
    re = np.where(held, 0.0, c.rho * v * c.d / mu)
    f = np.where(held, 0.0, drag(np.where(held, 1.0, re)))
    notes = _held_note(held, "fang_2008", c.flowing) + _at_rest_note(c, "fang_2008")
    if np.any((re > 0) & ((re < 0.1) | (re > 1e5))):
        notes += (
            Note(
                "warning",
                "drag_law_range",
                "fang_2008: particle Reynolds number outside 0.1-1e5; the correlation is "
                "extrapolated (its fitted range is not verified here).",
                "slip velocity",
            ),
        )
    gamma = combined_shear_rate(v / c.d, c.gamma_a)
    return v, re, f, mu, gamma, np.where(held, "held", "drag law"), notes


def slip_velocity(
    size,
    cuttings_density,
    *,
    density,
    k,
    tau_y=0.0,
    n=1.0,
    method: str = "moore",
    sphericity=1.0,
    thickness=None,
    annular_velocity=None,
    d_hole=None,
    d_pipe=None,
) -> SlipResult:
    """Settling (slip) velocity of drilled cuttings in a Herschel-Bulkley mud.

    .. math:: V_s = \\sqrt{\\frac{4 g d_s (\\rho_s - \\rho)}{3 f \\rho}},\\quad
              Re_p = \\frac{\\rho V_s d_s}{\\mu_a}

    with the drag coefficient f(Re_p) and apparent viscosity μ_a of the chosen correlation
    (Walker-Mayes uses its own particle-stress form instead, see the module notes).

    Parameters
    ----------
    size : array_like
        Cuttings equivalent diameter d_s [m].
    cuttings_density : array_like
        Cuttings density ρ_s [kg/m³]; must exceed the mud density.
    density : array_like
        Mud density ρ [kg/m³].
    k : array_like
        Consistency K [Pa·sⁿ] (the viscosity for a Newtonian fluid, the PV for Bingham).
    tau_y : array_like, optional
        Yield stress τ_y [Pa], default 0.
    n : array_like, optional
        Flow-behaviour index [-], default 1.
    method : str
        One of :data:`SLIP_METHODS` (``"moore"``, ``"chien"``, ``"walker_mayes"``, ``"api13d"``,
        ``"drag_balance"``, ``"fang_2008"``).
    sphericity : array_like, optional
        Wadell sphericity ψ in (0, 1] (used by ``drag_balance`` and ``fang_2008``).
    thickness : array_like, optional
        Cuttings thickness [m] (``walker_mayes``; defaults to ``size``).
    annular_velocity : array_like, optional
        Mean annular velocity V_a [m/s] (needed by ``moore`` and ``chien``; with ``d_hole`` and
        ``d_pipe`` it gives ``drag_balance`` and ``fang_2008`` the annular shear rate).
    d_hole, d_pipe : array_like, optional
        Annulus outer and inner diameters [m] (needed by ``moore``; when given, the cuttings
        must be smaller than the radial gap).  Without V_a, D2, D1 the drag-balance methods
        take the mud at rest: a yield stress may then hold the cuttings (slip 0, a note says
        why).

    Returns
    -------
    SlipResult

    Notes
    -----
    Correlations for vertical wells; slip correlations disagree widely (Sample & Bourgoyne 1977).
    Moore's piecewise drag law jumps at Re = 3 and 300; the solver returns the jump point where
    no branch is self-consistent.  ``chien`` at vanishing Re → Stokes' law; ``moore`` → 0.6 ×
    Stokes (its 40/Re law); ``drag_balance`` → Stokes and, at Re ~ 10³-10⁵, Newton's-law drag.

    References
    ----------
    Bourgoyne, A.T., Millheim, K.K., Chenevert, M.E. & Young, F.S. (1986) Applied Drilling
    Engineering, SPE Textbook Series 2, ch. 4.  Guo, B. & Liu, G. (2011) Applied Drilling
    Circulation Systems, ch. 2.  Sources of each method: ``SLIP_METHODS.describe()``.

    Examples
    --------
    >>> r = slip_velocity(0.00635, 2600.0, density=1318.0, k=0.02, method="chien",
    ...                   annular_velocity=0.6)
    >>> round(r.velocity, 3)
    0.2
    """
    info = SLIP_METHODS.get(method)
    d = check_positive("cuttings size", size, "m")
    rho_s = check_positive("cuttings density", cuttings_density, "kg/m³")
    rho = check_positive("mud density", density, "kg/m³")
    kk = check_positive("consistency K", k, "Pa·s^n")
    ty = check_nonnegative("yield stress", tau_y, "Pa")
    nn = check_positive("flow index n", n)
    psi = check_positive("sphericity", sphericity)
    if np.any(psi > 1.0):
        raise InputError("sphericity", float(np.max(psi)), "in (0, 1]")
    if np.any(rho_s <= rho):
        bad = np.broadcast_arrays(rho_s, rho)
        i = int(np.argmax((bad[0] <= bad[1]).ravel()))
        raise InputError(
            "cuttings density",
            float(bad[0].ravel()[i]),
            f"> mud density ({float(bad[1].ravel()[i]):.6g} kg/m³); lighter cuttings do not settle",
        )
    t = d if thickness is None else check_positive("cuttings thickness", thickness, "m")
    need_va = info.name in ("moore", "chien")
    if need_va and annular_velocity is None:
        raise InputError("annular velocity", None, f"a value > 0 m/s (method '{info.name}')")
    v_a = 1.0 if annular_velocity is None else check_positive("annular velocity", annular_velocity)
    if info.name == "moore" and (d_hole is None or d_pipe is None):
        raise InputError("d_hole, d_pipe", None, "annulus diameters [m] (method 'moore')")
    d2 = np.asarray(1.0) if d_hole is None else check_positive("hole diameter", d_hole, "m")
    d1 = np.asarray(0.0) if d_pipe is None else check_nonnegative("pipe diameter", d_pipe, "m")
    if d_hole is not None and d_pipe is not None:
        if np.any(d1 >= d2):
            raise InputError("pipe diameter", float(np.max(d1)), "< hole diameter")
        gap = 0.5 * (d2 - d1)
        if np.any(d >= gap):
            raise InputError("cuttings size", float(np.max(d)), f"< the radial annular gap {gap}")
    flowing = annular_velocity is not None and d_hole is not None and d_pipe is not None
    g_a = 12.0 * v_a / (d2 - d1) if flowing else np.asarray(0.0)
    arrays = np.broadcast_arrays(d, rho_s, rho, kk, ty, nn, psi, t, v_a, d2, d1, g_a)
    shape = arrays[0].shape
    c = SimpleNamespace(
        d=arrays[0], drho=arrays[1] - arrays[2], rho=arrays[2], k=arrays[3], tau_y=arrays[4],
        n=arrays[5], psi=arrays[6], t=arrays[7], v_a=arrays[8], d_hole=arrays[9],
        d_pipe=arrays[10], gamma_a=arrays[11], flowing=flowing, shape=shape,
    )  # fmt: skip
    v, re, f, mu, gamma, regime, notes = info.func(c)
    return SlipResult(
        velocity=scalar_or_array(v),
        reynolds=scalar_or_array(re),
        drag_coefficient=scalar_or_array(f),
        apparent_viscosity=scalar_or_array(mu),
        shear_rate=scalar_or_array(np.broadcast_to(gamma, shape)),
        regime=str(regime) if np.ndim(regime) == 0 else np.asarray(regime),
        method=f"{info.name}: {info.source}",
        notes=tuple(notes),
    )
