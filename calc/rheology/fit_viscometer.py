"""Fits of viscometer readings: two-speed, API RP 13D field estimates, least squares.

All equations are written in SI on the instrument stress τ_N = θ_N·k₁k₂·f [Pa] and the bob
shear rate γ̇_N = 1.7023·N [1/s] (:mod:`calc.rheology.viscometer`).  The field forms printed in
the standards (dial readings, 511/1022 s⁻¹, 5.11 dyn/cm² per degree, 1.066 lbf/100 ft² per
degree) are these same equations with rounded constants; the tests show the agreement.

Two-speed (any two speeds N₁ > N₂; 600/300 rpm when present):

* Bingham: μp = (τ₁ − τ₂)/(γ̇₁ − γ̇₂), τy = τ₁ − μp·γ̇₁.  With 600/300 this is PV = θ600 − θ300
  and YP = 2θ300 − θ600 of API RP 13B-1, but with τy in instrument stress (6.7 % above the
  field YP, which reads a degree as 1 lbf/100 ft²).
* Power law: n = ln(τ₁/τ₂)/ln(γ̇₁/γ̇₂), K = τ₁/γ̇₁ⁿ.  API RP 13D (3rd ed., 1995) uses the 600/300
  pair for pipe flow (n_p = 3.32 log(θ600/θ300), K_p = 5.11θ600/1022^n_p dyn·sⁿ/cm²) and the
  100/3 pair for the annulus (n_a = 0.657 log(θ100/θ3), K_a = 5.11θ100/170.2^n_a) — the 1995
  equations as published, taken from a secondary account (calc/METHODS.md §3.2, §3.3).

Herschel–Bulkley field estimate (Zamora & Power 2002, adopted by API RP 13D from the 5th ed.
(2006); registered as ``api13d_2010_hb`` for the 6th ed. (2010); factor and adoption from memory,
not yet checked against the source — calc/METHODS.md §3.5): τy = 2τ3 − τ6, n = log₂[(τ600 −
τy)/(τ300 − τy)], K = (τ300 − τy)/γ̇300ⁿ (field form τy = 1.066(2θ3 − θ6) lbf/100 ft²).  Guo & Liu
(2011) warn
that 2θ3 − θ6 can overstate τy in polymer-rich water-based muds; compare ``hb_least_squares``.

Least squares over all readings (``*_least_squares``): unweighted residuals in stress (see
:mod:`calc.rheology.fitresult` for why).  For fixed n the HB model is linear in (τy, K), so
τy and K come from the normal equations and only n is searched (a grid over 0.02–2.5, then a
bounded scalar refinement).  τy ≥ 0 is enforced: where the unconstrained optimum has τy < 0
the fit is redone with τy = 0 and a note says so (Kelessidis et al. 2006).

References
----------
API RP 13D, *Rheology and Hydraulics of Oil-well Drilling Fluids*, 3rd ed. 1995; 6th ed. 2010.
API RP 13B-1 (ISO 10414-1).  Zamora, M. and Power, D. (2002) AADE-02-DFWM-HO-13.  Kelessidis,
V.C., Maglione, R., Tsamantaki, C. and Aspirtakis, Y. (2006) J. Pet. Sci. Eng. 53:203–224.
"""

from __future__ import annotations

import numpy as np
from scipy.optimize import minimize_scalar

from calc.errors import InputError
from calc.flow.methods_api import api95_constants
from calc.notes import Note
from calc.rheology.fitresult import STRESS_SPACE, VISCOMETER_FITS, FitResult, quality_of
from calc.rheology.models import Bingham, HerschelBulkley, Newtonian, PowerLaw
from calc.rheology.viscometer import CENTIPOISE, FIELD_STRESS, ViscometerReadings
from calc.values import Value

__all__ = ["PRINTED_CONSTANT_FITS", "fit_hb_stress", "n_notes", "profile_fit"]

_N_GRID = np.linspace(0.02, 2.5, 249)
# Primary references only; how each fit was checked (and its caveats: the 1995 equations read
# second-hand, the 2010 factor from memory) is its status in calc/verification.py.
_API95 = "API RP 13D, 3rd ed. (1995), power law"
_API10 = (
    "API RP 13D, 6th ed. (2010), Herschel-Bulkley field estimate after Zamora & Power (2002) "
    "AADE-02-DFWM-HO-13"
)
_LSQ = "least squares, " + STRESS_SPACE


def _readings(data) -> ViscometerReadings:
    if not isinstance(data, ViscometerReadings):
        raise InputError("readings", type(data).__name__, "ViscometerReadings")
    return data


def n_notes(n: float, method: str) -> list[Note]:
    """Warning when n is outside the usual 0.2–1 range (common practice, calc/METHODS.md §16.1).

    Examples
    --------
    >>> n_notes(0.6, "fit"), [x.code for x in n_notes(1.3, "fit")]
    ([], ['n_unusual'])
    """
    if 0.2 <= n <= 1.0:
        return []
    return [
        Note(
            "warning",
            "n_unusual",
            "n = {n:.3g} is outside the usual 0.2–1 range",
            method,
            (Value("n", float(n)),),
        )
    ]


def _at(r: ViscometerReadings, rpm: float, what: str):
    val = r.reading(rpm)
    if val is None:
        raise InputError(
            f"speeds [rpm] for {what}",
            [float(f"{s:g}") for s in r.speeds],
            f"a reading at {rpm:g} rpm",
            problem=f"no {rpm:g}-rpm reading",
        )
    return rpm * r.geometry.shear_rate_per_rpm, val * r.geometry.stress_per_reading, val


def _two_speeds(r: ViscometerReadings, method: str) -> tuple[float, float, list[Note]]:
    if r.reading(600) is not None and r.reading(300) is not None:
        return 600.0, 300.0, []
    if r.mode == "cement" and r.reading(300) is not None and r.reading(100) is not None:
        return (
            300.0,
            100.0,
            [
                Note(
                    "info",
                    "two_speed_choice",
                    "cement/spacer: used 300/100 rpm (the cement PV pair)",
                    method,
                )
            ],
        )
    hi, lo = float(r.speeds[-1]), float(r.speeds[-2])
    return (
        hi,
        lo,
        [
            Note(
                "info",
                "two_speed_choice",
                "no 600/300 pair: used {high:g}/{low:g} rpm",
                method,
                (Value("high", hi), Value("low", lo)),
            )
        ],
    )


def _power_law_pair(r, hi, lo, method, description, source, scales=(1.0, 1.0, 1.0)) -> FitResult:
    """Power law through two speeds; ``scales`` = (n, stress, rate) ratios printed/exact of the
    1995 field constants (:class:`calc.flow.methods_api.Api1995Constants`; 1 for exact)."""
    g1, t1, th1 = _at(r, hi, method)
    g2, t2, th2 = _at(r, lo, method)
    if th2 <= 0 or th1 <= th2:
        raise InputError(
            f"{hi:g}/{lo:g}-rpm readings for {method}",
            [th1, th2],
            f"0 < θ{lo:g} < θ{hi:g} (a power-law pair needs rising, non-zero readings)",
        )
    n_scale, stress_scale, rate_scale = scales
    n = float(np.log(t1 / t2) / np.log(g1 / g2)) * n_scale
    model = PowerLaw(t1 * stress_scale / (g1 * rate_scale) ** n, n)
    q = quality_of(model, r.shear_rate, r.shear_stress, STRESS_SPACE, 2)
    inter = {
        f"theta{hi:g}": th1,
        f"theta{lo:g}": th2,
        "n": n,
        "K_dyn_s^n_per_cm2": model.k / 0.1,
    }  # 1 dyn/cm² = 0.1 Pa (exact, CGS)
    return FitResult(
        model, method, q, tuple(n_notes(n, method)), (g2, g1), description, source, inter
    )


@VISCOMETER_FITS.register(
    "power_law_two_speed",
    "power law through the two highest speeds (600/300 when read)",
    "Ostwald–de Waele power law; two-point form as API RP 13D (1995)",
)
def power_law_two_speed(data) -> FitResult:
    """Power law n, K through 600/300 rpm (or the two highest speeds)."""
    r = _readings(data)
    hi, lo, notes = _two_speeds(r, "power_law_two_speed")
    res = _power_law_pair(
        r, hi, lo, "power_law_two_speed", f"power law through {hi:g}/{lo:g} rpm", _API95
    )
    return _with_notes(res, notes + _two_point_notes(r))


@VISCOMETER_FITS.register(
    "api13d_1995_pipe", "API RP 13D (1995) pipe pair n_p, K_p from 600/300 rpm", _API95
)
def api13d_1995_pipe(data, constants: str = "exact") -> FitResult:
    """API RP 13D (1995) pipe power law: n_p = 3.32 log(θ600/θ300), K_p = 5.11θ600/1022^n_p.

    ``constants="exact"`` evaluates it with the constants derived from SI (n = ln(τ600/τ300)/ln 2,
    K = τ600/γ̇600ⁿ), ``"as_printed"`` with the printed 3.32, 5.11 and 1022 (calc/METHODS.md
    §3.2, §7.9).
    """
    c = api95_constants(constants)
    return _power_law_pair(
        _readings(data),
        600,
        300,
        "api13d_1995_pipe",
        "API RP 13D (1995) pipe power law, 600/300 rpm",
        _API95,
        (c.ratio("n_pipe"), c.ratio("dial_stress"), c.ratio("rate_600")),
    )


@VISCOMETER_FITS.register(
    "api13d_1995_annulus", "API RP 13D (1995) annulus pair n_a, K_a from 100/3 rpm", _API95
)
def api13d_1995_annulus(data, constants: str = "exact") -> FitResult:
    """API RP 13D (1995) annulus power law: n_a = 0.657 log(θ100/θ3), K_a = 5.11θ100/170.2^n_a.

    ``constants`` as for :func:`api13d_1995_pipe` (printed 0.657, 5.11, 170.2).
    """
    c = api95_constants(constants)
    return _power_law_pair(
        _readings(data),
        100,
        3,
        "api13d_1995_annulus",
        "API RP 13D (1995) annulus power law, 100/3 rpm",
        _API95,
        (c.ratio("n_annulus"), c.ratio("dial_stress"), c.ratio("rate_100")),
    )


#: Fits that can be computed with the printed constants (``fit(..., constants="as_printed")``).
PRINTED_CONSTANT_FITS = ("api13d_1995_pipe", "api13d_1995_annulus")


def _two_point_notes(r):
    return (
        [
            Note(
                "info",
                "two_point_fit",
                "a two-point fit matches two readings only; compare "
                "the least-squares fits over all readings",
                "fit",
            )
        ]
        if r.speeds.size > 2
        else []
    )


def _with_notes(res: FitResult, extra) -> FitResult:
    if not extra:
        return res
    return FitResult(
        res.model,
        res.method,
        res.quality,
        tuple(extra) + res.notes,
        res.shear_rate_range,
        res.description,
        res.source,
        res.intermediates,
    )


@VISCOMETER_FITS.register(
    "bingham_two_speed",
    "Bingham μp, τy through 600/300 rpm (PV/YP), or the two highest speeds",
    "Bingham (1916); PV/YP field definitions API RP 13B-1",
)
def bingham_two_speed(data) -> FitResult:
    """Bingham plastic through two speeds: μp = Δτ/Δγ̇, τy = τ₁ − μp·γ̇₁ (τy clipped at 0)."""
    r = _readings(data)
    method = "bingham_two_speed"
    hi, lo, notes = _two_speeds(r, method)
    g1, t1, th1 = _at(r, hi, method)
    g2, t2, th2 = _at(r, lo, method)
    if th1 <= th2:
        raise InputError(f"{hi:g}/{lo:g}-rpm readings", [th1, th2], f"θ{hi:g} > θ{lo:g}")
    mu = (t1 - t2) / (g1 - g2)
    ty = t1 - mu * g1
    if ty < 0:
        notes.append(
            Note(
                "warning",
                "tau_y_clipped",
                "two-speed yield stress {tau_y:.4g} < 0; set to 0",
                method,
                (Value("tau_y", float(ty), "stress"),),
            )
        )
        ty = 0.0
    model = Bingham(ty, mu)
    q = quality_of(model, r.shear_rate, r.shear_stress, STRESS_SPACE, 2)
    inter = {
        f"theta{hi:g}": th1,
        f"theta{lo:g}": th2,
        "mu_p_cP": mu / CENTIPOISE,
        "tau_y_lbf_100ft2": ty / FIELD_STRESS,
    }
    notes.append(
        Note(
            "info",
            "yp_convention",
            "τy is instrument stress (0.5107 Pa per degree); "
            "the field YP reads a degree as 1 lbf/100ft² and is 6.7 % lower",
            method,
        )
    )
    return FitResult(
        model,
        method,
        q,
        tuple(notes + _two_point_notes(r)),
        (g2, g1),
        f"Bingham through {hi:g}/{lo:g} rpm",
        "Bingham (1916); API RP 13B-1",
        inter,
    )


@VISCOMETER_FITS.register(
    "api13d_2010_hb",
    "API RP 13D (2010) Herschel-Bulkley estimate: τy from 3/6 rpm, n and K from 600/300",
    _API10,
)
def api13d_2010_hb(data) -> FitResult:
    """HB estimate τy = 2τ3 − τ6, n = log₂[(τ600 − τy)/(τ300 − τy)], K = (τ300 − τy)/γ̇300ⁿ."""
    r = _readings(data)
    method = "api13d_2010_hb"
    g3, t3, th3 = _at(r, 3, method)
    _, t6, th6 = _at(r, 6, method)
    g300, t300, th300 = _at(r, 300, method)
    g600, t600, th600 = _at(r, 600, method)
    notes: list[Note] = []
    ty = 2.0 * t3 - t6
    if ty < 0:
        notes.append(
            Note(
                "warning",
                "tau_y_clipped",
                "2θ3 − θ6 = {lsyp_dial:g} < 0: τy set to 0",
                method,
                (Value("lsyp_dial", 2 * th3 - th6),),
            )
        )
        ty = 0.0
    if t300 <= ty:
        raise InputError(
            "300-rpm reading for api13d_2010_hb",
            th300,
            f"> the yield-stress estimate 2θ3 − θ6 = {2 * th3 - th6:g}",
        )
    n = float(np.log((t600 - ty) / (t300 - ty)) / np.log(g600 / g300))
    model = HerschelBulkley(ty, (t300 - ty) / g300**n, n)
    q = quality_of(model, r.shear_rate, r.shear_stress, STRESS_SPACE, 3)
    notes += n_notes(n, method)
    inter = {
        "theta600": th600,
        "theta300": th300,
        "theta6": th6,
        "theta3": th3,
        "tau_y_lbf_100ft2": ty / FIELD_STRESS,
        "n": n,
        "K_lbf_s^n_100ft2": model.k / FIELD_STRESS,
    }
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        (g3, g600),
        "API RP 13D (2010) Herschel-Bulkley field estimate (3, 6, 300, 600 rpm)",
        _API10,
        inter,
    )


# ---------------------------------------------------------------- least squares
def profile_fit(shear_rate, stress, n, with_yield: bool, clip: bool = True):
    """τy, K and SSE of the best τ = τy + Kγ̇ⁿ for each fixed n (vectorised over n).

    For fixed n the model is linear in (τy, K): the normal equations give them directly
    (τy ≡ 0 when ``with_yield`` is False; with ``clip`` a negative τy is replaced by the
    τy = 0 solution).  SSE is +inf where K ≤ 0.
    """
    g = np.asarray(shear_rate, dtype=float)
    tau = np.asarray(stress, dtype=float)
    nn = np.atleast_1d(np.asarray(n, dtype=float))
    x = g[None, :] ** nn[:, None]
    sx, sxx = x.sum(axis=1), (x * x).sum(axis=1)
    sy, sxy = tau.sum(), (x * tau).sum(axis=1)
    k0 = sxy / sxx
    if with_yield:
        det = g.size * sxx - sx**2
        with np.errstate(divide="ignore", invalid="ignore"):
            k = np.where(det > 0, (g.size * sxy - sx * sy) / det, k0)
        ty = (sy - k * sx) / g.size
        if clip:
            neg = ty < 0
            k = np.where(neg, k0, k)
            ty = np.where(neg, 0.0, ty)
    else:
        k, ty = k0, np.zeros_like(k0)
    sse = ((ty[:, None] + k[:, None] * x - tau) ** 2).sum(axis=1)
    sse = np.where(k > 0, sse, np.inf)
    return ty, k, sse


def _best_n(g, tau, with_yield, clip):
    tau = np.asarray(tau, dtype=float)
    _, _, sse = profile_fit(g, tau, _N_GRID, with_yield, clip)
    if not np.any(np.isfinite(sse)) or not np.max(tau) > np.min(tau):
        raise InputError(
            "shear stresses",
            tau.tolist(),
            "stresses that rise with shear rate (a flow curve with K > 0)",
            problem="no flow curve fits",
        )
    # finite penalty for K <= 0 (an admissible fit has SSE below Σ(τ − τ̄)² <= Στ²)
    penalty = 10.0 * float(np.sum(tau**2)) + 1.0
    sse = np.where(np.isfinite(sse), sse, penalty)
    i = int(np.argmin(sse))
    lo, hi = _N_GRID[max(i - 1, 0)], _N_GRID[min(i + 1, _N_GRID.size - 1)]

    def objective(v):
        val = float(profile_fit(g, tau, v, with_yield, clip)[2][0])
        return val if np.isfinite(val) else penalty

    with np.errstate(all="ignore"):  # near-flat data: fall back to the grid point below
        res = minimize_scalar(
            objective, bounds=(lo, hi), method="bounded", options={"xatol": 1e-12}
        )
    n = float(res.x) if np.isfinite(res.fun) and res.fun <= sse[i] else float(_N_GRID[i])
    ty, k, _ = profile_fit(g, tau, n, with_yield, clip)
    at_edge = i in (0, _N_GRID.size - 1)
    return float(ty[0]), float(k[0]), n, at_edge


def fit_hb_stress(shear_rate, stress, method: str = "hb_least_squares"):
    """Least-squares HB in stress with τy ≥ 0: returns (model, notes, unconstrained τy [Pa]).

    Examples
    --------
    Stresses computed from τ = 4 + 0.3·γ̇^0.65 Pa give that model back:

    >>> g = np.array([5.1, 10.2, 170.3, 340.5, 510.8, 1021.6])
    >>> model, notes, ty_free = fit_hb_stress(g, 4.0 + 0.3 * g**0.65)
    >>> round(model.tau_y, 4), round(model.k, 4), round(model.n, 4), notes
    (4.0, 0.3, 0.65, [])
    """
    g = np.asarray(shear_rate, dtype=float)
    tau = np.asarray(stress, dtype=float)
    if g.size < 3:
        raise InputError(
            "number of readings for a Herschel-Bulkley fit",
            g.size,
            "at least 3 speeds (three parameters)",
            problem="too few",
        )
    notes: list[Note] = []
    ty_free, _, _, _ = _best_n(g, tau, True, clip=False)
    ty, k, n, edge = _best_n(g, tau, True, clip=True)
    if ty_free < -1e-9 * float(np.max(tau)):
        notes.append(
            Note(
                "warning",
                "tau_y_clipped",
                "least-squares τy would be {tau_y:.4g} (< 0); set to 0 and refitted "
                "(Kelessidis et al. 2006)",
                method,
                (Value("tau_y", float(ty_free), "stress"),),
            )
        )
    if edge:
        notes.append(
            Note(
                "warning",
                "n_at_bound",
                "n = {n:.3g} at the search bound 0.02–2.5",
                method,
                (Value("n", float(n)),),
            )
        )
    return HerschelBulkley(ty, k, n), notes + n_notes(n, method), ty_free


def _lsq_result(r, model, method, notes, description, n_params, inter):
    q = quality_of(model, r.shear_rate, r.shear_stress, STRESS_SPACE, n_params)
    if r.speeds.size <= n_params:
        notes = [
            *notes,
            Note(
                "info",
                "exact_fit",
                "{readings:.0f} readings for {parameters:.0f} parameters: the fit passes "
                "through every reading",
                method,
                (Value("readings", float(r.speeds.size)), Value("parameters", float(n_params))),
            ),
        ]
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        r.shear_rate_range,
        description,
        _LSQ + "; " + ("Kelessidis et al. (2006)" if n_params == 3 else "linear"),
        inter,
    )


@VISCOMETER_FITS.register(
    "hb_least_squares",
    "Herschel-Bulkley least squares over all readings, τy ≥ 0",
    "Herschel & Bulkley (1926); Kelessidis et al. (2006)",
)
def hb_least_squares(data) -> FitResult:
    """Least-squares Herschel–Bulkley over all readings (stress residuals, τy ≥ 0)."""
    r = _readings(data)
    model, notes, ty_free = fit_hb_stress(r.shear_rate, r.shear_stress)
    inter = {
        "tau_y_unconstrained_Pa": ty_free,
        "tau_y_lbf_100ft2": model.tau_y / FIELD_STRESS,
        "K_lbf_s^n_100ft2": model.k / FIELD_STRESS,
        "n": model.n,
    }
    return _lsq_result(
        r,
        model,
        "hb_least_squares",
        notes,
        "Herschel-Bulkley, least squares over all readings",
        3,
        inter,
    )


@VISCOMETER_FITS.register(
    "power_law_least_squares",
    "power law least squares over all readings",
    "Ostwald–de Waele power law; least squares in stress",
)
def power_law_least_squares(data) -> FitResult:
    """Least-squares power law over all readings (stress residuals)."""
    r = _readings(data)
    if np.any(r.dial <= 0):
        raise InputError("dial readings for a power-law fit", r.dial.tolist(), "all > 0")
    _, k, n, edge = _best_n(r.shear_rate, r.shear_stress, False, clip=True)
    notes = n_notes(n, "power_law_least_squares")
    if edge:
        notes.append(
            Note(
                "warning",
                "n_at_bound",
                "n = {n:.3g} at the search bound",
                "power_law_least_squares",
                (Value("n", float(n)),),
            )
        )
    model = PowerLaw(k, n)
    return _lsq_result(
        r,
        model,
        "power_law_least_squares",
        notes,
        "power law, least squares over all readings",
        2,
        {"n": n, "K_lbf_s^n_100ft2": k / FIELD_STRESS},
    )


@VISCOMETER_FITS.register(
    "bingham_least_squares",
    "Bingham least squares over all readings, τy ≥ 0 (API RP 10B-2 practice for cement)",
    "Bingham (1916); API RP 10B-2 (2013)",
)
def bingham_least_squares(data) -> FitResult:
    """Least-squares Bingham over all readings (linear regression; τy clipped at 0)."""
    r = _readings(data)
    method = "bingham_least_squares"
    ty_free, _, _ = profile_fit(r.shear_rate, r.shear_stress, 1.0, True, clip=False)
    ty, mu, _ = profile_fit(r.shear_rate, r.shear_stress, 1.0, True, clip=True)
    notes = []
    if ty_free[0] < 0:
        notes.append(
            Note(
                "warning",
                "tau_y_clipped",
                "least-squares τy would be {tau_y:.4g} (< 0); set to 0 and refitted",
                method,
                (Value("tau_y", float(ty_free[0]), "stress"),),
            )
        )
    model = Bingham(float(ty[0]), float(mu[0]))
    return _lsq_result(
        r,
        model,
        method,
        notes,
        "Bingham, least squares over all readings",
        2,
        {"mu_p_cP": model.mu_p / CENTIPOISE, "tau_y_lbf_100ft2": model.tau_y / FIELD_STRESS},
    )


@VISCOMETER_FITS.register(
    "newtonian_least_squares",
    "Newtonian least squares (reference)",
    "Newton; least squares through the origin",
)
def newtonian_least_squares(data) -> FitResult:
    """Least-squares Newtonian viscosity μ = Σγ̇τ/Σγ̇² (a reference for the ranking)."""
    r = _readings(data)
    _, mu, _ = profile_fit(r.shear_rate, r.shear_stress, 1.0, False)
    model = Newtonian(float(mu[0]))
    return _lsq_result(
        r,
        model,
        "newtonian_least_squares",
        [],
        "Newtonian, least squares through the origin",
        1,
        {"mu_cP": model.mu / CENTIPOISE},
    )


@VISCOMETER_FITS.register(
    "power_law_loglog",
    "power law by straight-line regression of log τ on log γ̇ over all readings",
    "Ostwald–de Waele power law; linear least squares on log-log axes (common practice)",
)
def power_law_loglog(data) -> FitResult:
    """Power law log₁₀τ = log₁₀K + n·log₁₀γ̇, least squares over all readings on log-log axes.

    The straight line of the log-log plot: equal weights in log stress, i.e. in relative
    stress, so the low-speed readings count as much as the high ones (the stress fits let the
    600/300 readings dominate).  Quality is reported in stress over all readings, as for every
    viscometer fit, so the ranking compares like with like; the RMSE in log₁₀ stress is an
    intermediate.

    >>> r = ViscometerReadings([600, 300, 200, 100, 6, 3], [68, 44, 35, 25, 10, 9])
    >>> f = power_law_loglog(r)
    >>> round(f.model.n, 4), f.quality.space
    (0.3684, 'shear stress [Pa], unweighted')
    """
    r = _readings(data)
    method = "power_law_loglog"
    if np.any(r.dial <= 0):
        raise InputError("dial readings for a log-log power-law fit", r.dial.tolist(), "all > 0")
    x, y = np.log10(r.shear_rate), np.log10(r.shear_stress)
    n, logk = (float(c) for c in np.polyfit(x, y, 1))
    if not n > 0:
        raise InputError(
            "dial readings for a log-log power-law fit",
            r.dial.tolist(),
            "readings that rise with speed (a log-log slope n > 0)",
        )
    model = PowerLaw(10.0**logk, n)
    q = quality_of(model, r.shear_rate, r.shear_stress, STRESS_SPACE, 2)
    rmse_log = float(np.sqrt(np.mean((logk + n * x - y) ** 2)))
    notes = n_notes(n, method)
    if r.speeds.size <= 2:
        notes.append(
            Note(
                "info",
                "exact_fit",
                "{readings:.0f} readings for {parameters:.0f} parameters: the fit passes "
                "through every reading",
                method,
                (Value("readings", float(r.speeds.size)), Value("parameters", 2.0)),
            )
        )
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        r.shear_rate_range,
        "power law, log-log regression over all readings",
        "Ostwald–de Waele power law; linear least squares in log10 stress on log10 shear rate",
        {"n": n, "K_lbf_s^n_100ft2": model.k / FIELD_STRESS, "rmse_log10_stress": rmse_log},
    )
