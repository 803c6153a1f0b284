"""Fits of rheometer tables: log-log power law, Herschel–Bulkley, Cross, Carreau–Yasuda.

All table fits minimise unweighted residuals in log₁₀ stress (≡ log₁₀ viscosity; see
:mod:`calc.rheology.fitresult`).

* ``power_law_loglog``: straight line log τ = log K + n log γ̇ (slope of log η is n − 1) over the
  shear-thinning region (:func:`~calc.rheology.table.shear_thinning_region`).
* ``hb_least_squares``: τ = τy + Kγ̇ⁿ, bounded (0 ≤ τy < τ_min), started from the stress-space
  profile fit.
* ``cross`` and ``carreau_yasuda``: bounded nonlinear least squares (scipy ``least_squares``,
  trust-region reflective) on log η with η₀ > η∞ ≥ 0, λ > 0, from several starts built from the
  identified plateau (η₀), onset (λ ≈ 1/onset) and power-law slope (m ≈ 1 − n).  Carreau–Yasuda
  fits ``a`` when the table has ≥ 7 points, else holds a = 2 (Carreau).

References
----------
Cross (1965) J. Colloid Sci. 20:417; Carreau (1972) Trans. Soc. Rheol. 16:99; Yasuda, Armstrong
& Cohen (1981) Rheol. Acta 20:163; Herschel & Bulkley (1926) Kolloid-Z. 39:291.
"""

from __future__ import annotations

import numpy as np
from scipy.optimize import least_squares

from calc.errors import InputError
from calc.notes import Note
from calc.rheology.fit_viscometer import fit_hb_stress, n_notes
from calc.rheology.fitresult import LOG_SPACE, TABLE_FITS, FitResult, quality_of
from calc.rheology.models import CarreauYasuda, Cross, HerschelBulkley, Newtonian, PowerLaw
from calc.rheology.table import RheometerTable
from calc.values import Value

__all__: list[str] = []

_SRC_LOG = "least squares, " + LOG_SPACE


def _table(data) -> RheometerTable:
    if not isinstance(data, RheometerTable):
        raise InputError("rheometer table", type(data).__name__, "RheometerTable")
    return data


def _need(t: RheometerTable, k: int, method: str):
    if t.shear_rate.size < k:
        raise InputError(
            f"points for {method}", t.shear_rate.size, f"at least {k}", problem="too few"
        )


def _plateau_notes(t: RheometerTable, method: str) -> tuple[list[Note], dict]:
    p = t.plateau()
    inter = {
        "plateau_found": float(p.found),
        "plateau_eta0_Pa_s": p.eta0,
        "plateau_points": float(p.n_points),
    }
    if p.onset_rate is not None:
        inter["onset_shear_rate_1_s"] = p.onset_rate
    if p.found:
        msg = "zero-shear plateau η₀ ≈ {eta0:.4g} over {points:.0f} points up to {last_rate:.4g}"
        values = [
            Value("eta0", float(p.eta0), "viscosity"),
            Value("points", float(p.n_points)),
            Value("last_rate", float(p.last_rate), "shear_rate"),
        ]
        if p.onset_rate is not None:
            msg += "; shear thinning begins near {onset:.4g} (η < {fraction:.0%} of η₀)"
            values += [
                Value("onset", float(p.onset_rate), "shear_rate"),
                Value("fraction", float(1 - p.tol)),
            ]
        else:
            msg += "; no shear thinning in the table"
        return [Note("info", "plateau", msg, method, tuple(values))], inter
    return [
        Note(
            "warning",
            "no_plateau",
            "no zero-shear plateau in the measured range: η₀ is an "
            "extrapolation and poorly determined",
            method,
        )
    ], inter


@TABLE_FITS.register(
    "power_law_loglog",
    "power law by straight-line regression on log-log axes over the shear-thinning region",
    "Ostwald–de Waele power law",
)
def power_law_loglog(data) -> FitResult:
    """Power law log τ = log K + n log γ̇ on the shear-thinning region (log η slope n − 1)."""
    t = _table(data)
    method = "power_law_loglog"
    mask = t.thinning_mask()
    g, tau = t.shear_rate[mask], t.stress[mask]
    notes: list[Note] = []
    if mask.all():
        notes.append(Note("info", "thinning_region", "all points used", method))
    else:
        notes.append(
            Note(
                "info",
                "thinning_region",
                "shear-thinning region {region:.4g} ({used:.0f} of {points:.0f} points)",
                method,
                (
                    Value("region", (float(g[0]), float(g[-1])), "shear_rate"),
                    Value("used", float(mask.sum())),
                    Value("points", float(mask.size)),
                ),
            )
        )
    x, y = np.log10(g), np.log10(tau)
    n, logk = np.polyfit(x, y, 1)
    model = PowerLaw(10.0**logk, float(n))
    q = quality_of(model, g, tau, LOG_SPACE, 2)
    notes += n_notes(float(n), method)
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        (float(g[0]), float(g[-1])),
        "power law, log-log regression over the shear-thinning region",
        "Ostwald–de Waele power law; " + _SRC_LOG,
        {"n": float(n), "log10_K": float(logk), "points_used": float(mask.sum())},
    )


@TABLE_FITS.register(
    "hb_least_squares",
    "Herschel-Bulkley, least squares in log stress, τy ≥ 0",
    "Herschel & Bulkley (1926)",
)
def hb_least_squares_table(data) -> FitResult:
    """Herschel–Bulkley fitted to a table in log₁₀ stress, 0 ≤ τy < τ_min."""
    t = _table(data)
    method = "hb_least_squares"
    _need(t, 4, method)
    g, tau = t.shear_rate, t.stress
    start, _, _ = fit_hb_stress(g, tau, method)
    tmin = float(tau[0])
    ly = np.log10(tau)

    def resid(p):
        return np.log10(p[0] * tmin + 10.0 ** p[1] * g ** p[2]) - ly

    x0 = [min(start.tau_y / tmin, 0.9), np.log10(start.k), float(np.clip(start.n, 0.02, 2.9))]
    sol = least_squares(
        resid,
        x0,
        bounds=([0.0, -12, 0.01], [0.999, 12, 3.0]),
        method="trf",
        xtol=1e-14,
        ftol=1e-14,
        gtol=1e-14,
    )
    ty, k, n = sol.x[0] * tmin, 10.0 ** sol.x[1], float(sol.x[2])
    notes = n_notes(n, method)
    grad = sol.jac.T @ sol.fun
    if sol.x[0] <= 1e-12 and grad[0] > 0:
        notes.append(
            Note(
                "warning",
                "tau_y_clipped",
                "the fit pushes τy below 0; held at 0 (Kelessidis et al. 2006)",
                method,
            )
        )
    model = HerschelBulkley(ty, k, n)
    q = quality_of(model, g, tau, LOG_SPACE, 3)
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        t.shear_rate_range,
        "Herschel-Bulkley, least squares in log stress",
        _SRC_LOG,
        {"tau_y_Pa": ty, "K_Pa_s^n": k, "n": n},
    )


@TABLE_FITS.register(
    "newtonian_least_squares", "Newtonian viscosity, least squares in log (reference)", "Newton"
)
def newtonian_table(data) -> FitResult:
    """Newtonian reference: log μ = mean(log η)."""
    t = _table(data)
    model = Newtonian(float(10.0 ** np.mean(np.log10(t.viscosity))))
    q = quality_of(model, t.shear_rate, t.stress, LOG_SPACE, 1)
    return FitResult(
        model,
        "newtonian_least_squares",
        q,
        (),
        t.shear_rate_range,
        "Newtonian, least squares in log viscosity",
        _SRC_LOG,
        {},
    )


def _starts(t: RheometerTable):
    p = t.plateau()
    pl = power_law_loglog(t).model
    m0 = float(np.clip(1.0 - pl.n, 0.1, 1.5))
    onset = (
        p.onset_rate
        if p.onset_rate is not None
        else float(np.sqrt(t.shear_rate[0] * t.shear_rate[-1]))
    )
    eta0 = p.eta0 * (1.02 if p.found else 1.5)
    return eta0, m0, [1.0 / onset, 0.1 / onset, 10.0 / onset]


def _fit_log_eta(t, formula, pack, x0s, lo, hi):
    g, le = t.shear_rate, np.log10(t.viscosity)

    def resid(p):
        return np.log10(formula(g, *pack(p))) - le

    best = None
    for x0 in x0s:
        x0 = np.clip(x0, np.asarray(lo) + 1e-9, np.asarray(hi) - 1e-9)
        sol = least_squares(
            resid,
            x0,
            bounds=(lo, hi),
            method="trf",
            x_scale="jac",
            xtol=1e-15,
            ftol=1e-15,
            gtol=1e-15,
            max_nfev=4000,
        )
        if best is None or sol.cost < best.cost:
            best = sol
    return pack(best.x)


def _plateau_fit(t):
    lmax = float(np.log10(t.viscosity.max()))
    emin = float(t.viscosity.min())
    eta0, m0, lams = _starts(t)
    gspan = (float(np.log10(1e-3 / t.shear_rate[-1])), float(np.log10(1e3 / t.shear_rate[0])))
    lo = [lmax - 0.05, 0.0, gspan[0]]
    hi = [lmax + 6.0, 0.999, gspan[1]]
    base = [[np.log10(eta0), 0.05, np.log10(lam)] for lam in lams]
    return lmax, emin, base, lo, hi, m0


@TABLE_FITS.register("cross", "Cross model, least squares in log viscosity", "Cross (1965)")
def cross_fit(data) -> FitResult:
    """Cross model η = η∞ + (η₀ − η∞)/[1 + (λγ̇)^m] fitted in log η."""
    t = _table(data)
    method = "cross"
    _need(t, 5, method)
    _, emin, base, lo, hi, m0 = _plateau_fit(t)

    def pack(p):
        return 10.0 ** p[0], p[1] * emin, 10.0 ** p[2], p[3]

    x0s = [[*b, m0] for b in base]
    eta0, einf, lam, m = _fit_log_eta(t, Cross.formula, pack, x0s, [*lo, 0.05], [*hi, 3.0])
    model = Cross(eta0, einf, lam, m)
    notes, inter = _plateau_notes(t, method)
    inter.update(
        {
            "eta0_Pa_s": eta0,
            "eta_inf_Pa_s": einf,
            "lambda_s": lam,
            "m": m,
            "characteristic_rate_1_s": 1.0 / lam,
        }
    )
    q = quality_of(model, t.shear_rate, t.stress, LOG_SPACE, 4)
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        t.shear_rate_range,
        "Cross model, least squares in log viscosity",
        "Cross (1965); " + _SRC_LOG,
        inter,
    )


@TABLE_FITS.register(
    "carreau_yasuda",
    "Carreau-Yasuda model (a fitted with ≥ 7 points, else "
    "Carreau a = 2), least squares in log viscosity",
    "Carreau (1972); Yasuda, Armstrong & Cohen (1981)",
)
def carreau_yasuda_fit(data) -> FitResult:
    """Carreau–Yasuda η = η∞ + (η₀ − η∞)[1 + (λγ̇)^a]^((n−1)/a) fitted in log η."""
    t = _table(data)
    method = "carreau_yasuda"
    _need(t, 5, method)
    _, emin, base, lo, hi, m0 = _plateau_fit(t)
    notes, inter = _plateau_notes(t, method)
    n0 = 1.0 - m0
    free_a = t.shear_rate.size >= 7
    if free_a:

        def pack(p):
            return 10.0 ** p[0], p[1] * emin, 10.0 ** p[2], p[3], p[4]

        x0s = [[*b, n0, a] for b in base for a in (2.0, 0.7)]
        lo_, hi_ = [*lo, 0.01, 0.2], [*hi, 1.5, 10.0]
    else:

        def pack(p):
            return 10.0 ** p[0], p[1] * emin, 10.0 ** p[2], p[3], 2.0

        x0s = [[*b, n0] for b in base]
        lo_, hi_ = [*lo, 0.01], [*hi, 1.5]
        notes.append(
            Note("info", "carreau_a_fixed", "fewer than 7 points: a held at 2 (Carreau)", method)
        )
    eta0, einf, lam, n, a = _fit_log_eta(t, CarreauYasuda.formula, pack, x0s, lo_, hi_)
    model = CarreauYasuda(eta0, einf, lam, n, a)
    inter.update(
        {
            "eta0_Pa_s": eta0,
            "eta_inf_Pa_s": einf,
            "lambda_s": lam,
            "n": n,
            "a": a,
            "characteristic_rate_1_s": 1.0 / lam,
        }
    )
    q = quality_of(model, t.shear_rate, t.stress, LOG_SPACE, 5 if free_a else 4)
    return FitResult(
        model,
        method,
        q,
        tuple(notes),
        t.shear_rate_range,
        "Carreau-Yasuda model, least squares in log viscosity",
        "Carreau (1972); Yasuda et al. (1981); " + _SRC_LOG,
        inter,
    )
